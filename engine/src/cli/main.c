/* equipoise: run experiments, explore the species library, list plugins. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <equipoise/plugin.h>
#include <errno.h>
#include <getopt.h>
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <limits.h>
#include <string.h>

const char cli_usage[] =
  "usage: equipoise run FILE.lua [--param NAME=VALUE ...] [--json | --jsonl]\n"
  "                 [--report OUT.html] [--verbose] [--trace] [--allow-write DIR ...]\n"
  "                 [--max-instructions N] [--max-memory SIZE] [--trusted]\n"
  "       equipoise plot distribution|capacity|csv ... -o OUT.svg|.png|.pdf\n"
  "       equipoise species list [--json] | show NAME [--temperature T] [--json]\n"
  "       equipoise species check FILE\n"
  "       equipoise plugins\n"
  "       equipoise --help | --version\n";

static const char help[] =
  "\n"
  "Aqueous chemical equilibrium: pH, speciation and ionic strength of solutions\n"
  "described by small Lua programs, with species from data files.\n"
  "\n"
  "  run FILE.lua        run an experiment; the module is preloaded as 'eq'\n"
  "    --param N=V       set params.N = \"V\" in the script (repeatable)\n"
  "    --json            print one JSON document (results, warnings, cautions,\n"
  "                      provenance) instead of the script's text output\n"
  "    --report OUT.html write one self-contained HTML page of the run: each\n"
  "                      step with its results, tables, figures, warnings,\n"
  "                      cautions and the provenance of every constant\n"
  "    --verbose         show a Lua stack trace on errors, and what the engine\n"
  "                      and its plugins report as they load\n"
  "    --trace           also the solver's progress, one line per Newton solve\n"
  "    --allow-write DIR let the script write files in DIR too (repeatable)\n"
  "    --max-instructions N   stop the script after N instructions (default\n"
  "                      1000000000; 0: no limit); suffixes k, M, G\n"
  "    --max-memory SIZE stop the script beyond SIZE bytes of memory (default 1G;\n"
  "                      0: no limit); suffixes K, M, G\n"
  "    --trusted         give a script you trust the full Lua standard library\n"
  "                      (files, processes, modules); never the default\n"
  "  plot distribution SYSTEM  fractions of each form against pH\n"
  "  plot capacity BUFFER ...  buffer capacity against pH at one total\n"
  "  plot csv FILE.csv         columns of a saved curve or table\n"
  "                      (equipoise plot --help for the options)\n"
  "  species list        species, reagents (with their other names), buffer\n"
  "                      systems, solids and gases of the library\n"
  "  species show NAME   one entry: its reactions as a chemist writes them (pKa,\n"
  "                      log beta, log Ksp, log K_H) with their sources\n"
  "    --temperature T   also each constant at T: 37 (C) or '310.15 K'\n"
  "    --json            a JSON document instead of text (docs/json-output.md)\n"
  "  species check FILE  validate a species file against the library\n"
  "  plugins             list activity models found on the plugin path\n"
  "\n"
  "Scripts run sandboxed: no files except through the engine's calls (reading\n"
  "from the script's folder, the working folder and the species folders,\n"
  "writing in the working folder and --allow-write folders), no processes, no C\n"
  "modules, no binary chunks, no debug library.\n"
  "\n"
  "exit codes: 0 ok, 1 script error, 2 usage, 3 bad input value, 4 species\n"
  "data error, 5 no convergence, 6 plugin error, 7 out of memory, 8 instruction\n"
  "limit, 9 memory limit, 10 refused by the sandbox, 11 output file not written\n"
  "\n"
  "environment: EQUIPOISE_SPECIES_PATH (colon-separated species folders, before\n"
  "~/.local/share/equipoise/species and the built-in library), EQUIPOISE_PLUGIN_PATH\n"
  "(colon-separated plugin folders), EQUIPOISE_VERBOSE and EQUIPOISE_TRACE (as\n"
  "--verbose and --trace)\n"
  "\n"
  "Results are estimates: confirm pH with a calibrated meter. Strong acids and\n"
  "bases and concentrated stocks are hazardous: follow the safety data sheet\n"
  "and local rules.\n";

int cli_exit_code(int status)
{
  switch (status) {
  case EQP_OK: return EXIT_OK;
  case EQP_E_NOMEM: return EXIT_NOMEM;
  case EQP_E_ARG: case EQP_E_INPUT: case EQP_E_UNKNOWN: return EXIT_INPUT;
  case EQP_E_DATA: case EQP_E_IO: return EXIT_DATA;
  case EQP_E_PLUGIN: return EXIT_PLUGIN;
  case EQP_E_CONVERGE: case EQP_E_VERIFY: return EXIT_CONVERGE;
  case EQP_E_WRITE: return EXIT_WRITE;
  }
  return EXIT_SCRIPT;
}

static void print_plugin(void *ud, const char *name, const char *version, const char *summary,
                         const char *path)
{
  int *n = ud;
  if (name) {
    printf("%-10s %-6s %s\n           from %s\n", name, version, summary, path);
    (*n)++;
  } else {
    printf("(refused)  %s\n", summary);
  }
}

static int cmd_plugins(void)
{
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  if (!ctx) return EXIT_NOMEM;
  if (cli_configure(ctx, 0, 0) < 0) {
    eqp_ctx_free(ctx);
    return EXIT_NOMEM;
  }
  int n = 0;
  eqp_ctx_list_plugins(ctx, print_plugin, &n);
  eqp_ctx_free(ctx);
  if (n == 0) {
    fprintf(stderr, "equipoise: no activity-model plugins found (EQUIPOISE_PLUGIN_PATH)\n");
    return EXIT_PLUGIN;
  }
  return EXIT_OK;
}

/* "1000", "5M", "2G" (k/M/G: powers of 1000 for counts, of 1024 for sizes). */
static int parse_amount(const char *s, int binary, unsigned long long *out)
{
  char *end;
  if (!s || !*s || *s == '-') return -1;
  errno = 0;
  unsigned long long v = strtoull(s, &end, 10);
  unsigned long long unit = 1, k = binary ? 1024 : 1000;
  switch (*end) {
  case 'k': case 'K': unit = k; end++; break;
  case 'm': case 'M': unit = k * k; end++; break;
  case 'g': case 'G': unit = k * k * k; end++; break;
  }
  if (binary && (*end == 'B' || *end == 'b')) end++;
  if (errno || *end || end == s || (v && unit > ULLONG_MAX / v)) return -1;
  *out = v * unit;
  return 0;
}

/* A usage error: in the JSON modes, the same document shape with its status. */
static int usage_error(const cli_run *run, const char *fmt, const char *arg)
{
  char msg[512];
  snprintf(msg, sizeof msg, fmt, arg);
  if (run->json || run->jsonl) cli_report_usage(run, EXIT_USAGE, msg);
  else fprintf(stderr, "equipoise: %s\n%s", msg, cli_usage);
  return EXIT_USAGE;
}

typedef struct run_args {
  cli_run run;
  const char *names[64], *values[64];
  char *owned[64];
  int nowned;
} run_args;

/* A limit: --max-instructions N or --max-memory SIZE. */
static int limit_option(run_args *ra, int mem, const char *v)
{
  unsigned long long amount;
  if (parse_amount(v, mem, &amount) < 0 || amount > (unsigned long long)LLONG_MAX)
    return usage_error(&ra->run, mem ? "--max-memory needs a size such as 512M or 4G, not '%s'"
                                     : "--max-instructions needs a count such as 5G, not '%s'",
                       v ? v : "");
  if (mem) ra->run.max_memory = (size_t)amount;
  else ra->run.max_steps = (long long)amount;
  return 0;
}

static int param_option(run_args *ra, const char *kv)
{
  const char *eq = kv ? strchr(kv, '=') : NULL;
  if (!eq || eq == kv)
    return usage_error(&ra->run, "--param needs NAME=VALUE%s", kv ? "" : " (none given)");
  if (ra->run.nparams == 64) return usage_error(&ra->run, "at most 64 --param options%s", "");
  char *name = strndup(kv, (size_t)(eq - kv));
  if (!name) return EXIT_NOMEM;
  for (int i = 0; i < ra->run.nparams; i++)
    if (strcmp(ra->names[i], name) == 0) {   /* which one the script sees is not obvious */
      char msg[400];
      snprintf(msg, sizeof msg, "--param %.100s is given twice ('%.100s' and '%.100s')", name,
               ra->values[i], eq + 1);
      free(name);
      return usage_error(&ra->run, "%s", msg);
    }
  ra->owned[ra->nowned++] = name;
  ra->names[ra->run.nparams] = name;
  ra->values[ra->run.nparams++] = eq + 1;
  return 0;
}

enum { O_JSON = 256, O_JSONL, O_VERBOSE, O_TRACE, O_TRUSTED, O_REPORT, O_ALLOW_WRITE,
       O_MAX_STEPS, O_MAX_MEMORY, O_PARAM };

static const struct option run_options[] = {
  {"json", no_argument, NULL, O_JSON},
  {"jsonl", no_argument, NULL, O_JSONL},
  {"verbose", no_argument, NULL, O_VERBOSE},
  {"trace", no_argument, NULL, O_TRACE},
  {"trusted", no_argument, NULL, O_TRUSTED},
  {"report", required_argument, NULL, O_REPORT},
  {"allow-write", required_argument, NULL, O_ALLOW_WRITE},
  {"max-instructions", required_argument, NULL, O_MAX_STEPS},
  {"max-memory", required_argument, NULL, O_MAX_MEMORY},
  {"param", required_argument, NULL, O_PARAM},
  {NULL, 0, NULL, 0},
};

/* The option word as written ("--verbose" of "--verbose", "--param" of
** "--param=x"): getopt_long would take a prefix ("--tr") for the whole name,
** and an option that widens what a script may do is spelled out. */
static int spelled_out(const char *word, int index)
{
  const char *name = run_options[index].name;
  size_t n = strlen(name);
  return word[0] == '-' && word[1] == '-' && strncmp(word + 2, name, n) == 0 &&
         (word[2 + n] == '\0' || word[2 + n] == '=');
}

/* One option (or, as 1, the script) from getopt_long; 0 or an exit code. */
static int run_option(run_args *ra, int opt, const char *word, const char *arg)
{
  cli_run *run = &ra->run;
  switch (opt) {
  case O_JSON: case O_JSONL: return 0;    /* read first, in cmd_run */
  case O_VERBOSE: run->verbose = 1; return 0;
  case O_TRACE: run->trace = 1; return 0;
  case O_TRUSTED: run->trusted = 1; return 0;
  case O_REPORT:
    if (!*arg) return usage_error(run, "unknown option '%s'", word);
    run->report = arg;
    return 0;
  case O_ALLOW_WRITE:
    if (run->nwrite_dirs == CLI_MAX_DIRS)
      return usage_error(run, "%s needs a folder (at most 16)", "--allow-write");
    run->write_dirs[run->nwrite_dirs++] = arg;
    return 0;
  case O_MAX_STEPS: case O_MAX_MEMORY: return limit_option(ra, opt == O_MAX_MEMORY, arg);
  case O_PARAM: return param_option(ra, arg);
  case 1:
    if (run->script) return usage_error(run, "one script at a time (also '%s')", arg);
    run->script = arg;
    return 0;
  }
  return usage_error(run, "unknown option '%s'", word);
}

/* An option that needs a value and has none, as the command has always said. */
static int missing_value(run_args *ra, int opt, const char *word)
{
  switch (opt) {
  case O_ALLOW_WRITE: return usage_error(&ra->run, "%s needs a folder (at most 16)", word);
  case O_MAX_STEPS: case O_MAX_MEMORY: return limit_option(ra, opt == O_MAX_MEMORY, NULL);
  case O_PARAM: return param_option(ra, NULL);
  }
  return usage_error(&ra->run, "unknown option '%s'", word);
}

/* The words after "run", parsed with getopt_long in order ("-" first in the
** option string: the script comes back as option 1 where it stands; ":"
** next: a missing value is told apart from an unknown option). */
static int parse_run(run_args *ra, int argc, char **argv)
{
  optind = 0;          /* a fresh scan */
  opterr = 0;          /* our messages, in the output form asked for */
  int code = 0, opt, index, prev = 1;
  while (code == 0 && (opt = getopt_long(argc, argv, "-:", run_options, &index)) != -1) {
    /* the word just read; a cluster of short options ("-xy") is read in place */
    const char *word = optind > prev ? argv[optind - 1] : argv[optind];
    if (opt != 1 && opt != '?' && opt != ':' && optarg && optarg == argv[optind - 1])
      word = argv[optind - 2];                  /* "--report FILE": the option before it */
    prev = optind;
    if (opt == ':') code = missing_value(ra, optopt, word);
    else if (opt == '?') code = usage_error(&ra->run, "unknown option '%s'", word);
    else if (opt != 1 && !spelled_out(word, index))
      code = usage_error(&ra->run, "unknown option '%s'", word);
    else code = run_option(ra, opt, word, optarg);
  }
  for (int i = optind; code == 0 && i < argc; i++)   /* after "--": only scripts */
    code = run_option(ra, 1, argv[i], argv[i]);
  return code;
}

static int cmd_run(int argc, char **argv)
{
  static run_args ra;
  int code = 0;
  ra.run.param_names = ra.names;
  ra.run.param_values = ra.values;
  ra.run.max_steps = CLI_DEFAULT_STEPS;
  ra.run.max_memory = CLI_DEFAULT_MEMORY;
  for (int i = 1; i < argc; i++) {   /* first the output form, so that errors take it */
    if (strcmp(argv[i], "--json") == 0) ra.run.json = 1;
    if (strcmp(argv[i], "--jsonl") == 0) ra.run.jsonl = 1;
  }
  if (ra.run.json && ra.run.jsonl) {
    ra.run.json = 0;
    code = usage_error(&ra.run, "%s", "--json and --jsonl: choose one");
  }
  if (code == 0) code = parse_run(&ra, argc, argv);
  if (code == 0 && !ra.run.script) code = usage_error(&ra.run, "%s", "run needs a script");
  if (code == 0) code = cli_run_script(&ra.run);
  for (int i = 0; i < ra.nowned; i++) free(ra.owned[i]);
  return code;
}

int main(int argc, char **argv)
{
  /* a write beyond a file-size limit fails with EFBIG (and the atomic writer
  ** keeps the old file) instead of killing the process */
  signal(SIGXFSZ, SIG_IGN);
  if (argc < 2) {
    fputs(cli_usage, stderr);
    return EXIT_USAGE;
  }
  const char *cmd = argv[1];
  if (strcmp(cmd, "--help") == 0 || strcmp(cmd, "-h") == 0 || strcmp(cmd, "help") == 0) {
    fputs(cli_usage, stdout);
    fputs(help, stdout);
    return EXIT_OK;
  }
  if (strcmp(cmd, "--version") == 0) {
    printf("equipoise %s (plugin ABI %d.%d)\n", eqp_version(), EQP_PLUGIN_ABI_MAJOR,
           EQP_PLUGIN_ABI_MINOR);
    return EXIT_OK;
  }
  if (strcmp(cmd, "run") == 0) return cmd_run(argc - 1, argv + 1);   /* argv[0] is "run" */
  if (strcmp(cmd, "species") == 0) return cli_species(argc - 2, argv + 2);
  if (strcmp(cmd, "plot") == 0) return cli_plot(argc - 2, argv + 2);
  if (strcmp(cmd, "plugins") == 0) {
    if (argc == 2) return cmd_plugins();
    fprintf(stderr, "equipoise: 'plugins' takes no arguments ('%s')\n%s", argv[2], cli_usage);
    return EXIT_USAGE;
  }
  fprintf(stderr, "equipoise: unknown command '%s'\n%s", cmd, cli_usage);
  return EXIT_USAGE;
}
