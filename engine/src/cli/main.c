/* equipoise: run experiments, explore the species library, list plugins. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <stdio.h>
#include <stdlib.h>
#include <limits.h>
#include <string.h>

const char cli_usage[] =
  "usage: equipoise run FILE.lua [--param NAME=VALUE ...] [--json] [--report OUT.html]\n"
  "                                [--verbose]\n"
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
  "    --verbose         show a Lua stack trace on errors\n"
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
  "exit codes: 0 ok, 1 script error, 2 usage, 3 bad input value, 4 species\n"
  "data error, 5 no convergence, 6 plugin error, 7 out of memory\n"
  "\n"
  "environment: EQUIPOISE_SPECIES_PATH (colon-separated species folders, before\n"
  "~/.local/share/equipoise/species and the built-in library), EQUIPOISE_PLUGIN_PATH\n"
  "(colon-separated plugin folders)\n"
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
  int n = 0;
  eqp_ctx_list_plugins(ctx, print_plugin, &n);
  eqp_ctx_free(ctx);
  if (n == 0) {
    fprintf(stderr, "equipoise: no activity-model plugins found (EQUIPOISE_PLUGIN_PATH)\n");
    return EXIT_PLUGIN;
  }
  return EXIT_OK;
}

static int cmd_run(int argc, char **argv)
{
  cli_run run = {0};
  const char *names[64], *values[64];
  char *owned[64];
  int nowned = 0, code;
  run.param_names = names;
  run.param_values = values;
  for (int i = 0; i < argc; i++) {
    const char *a = argv[i];
    if (strcmp(a, "--json") == 0) run.json = 1;
    else if (strcmp(a, "--verbose") == 0) run.verbose = 1;
    else if (strcmp(a, "--report") == 0 && i + 1 < argc) run.report = argv[++i];
    else if (strncmp(a, "--report=", 9) == 0 && a[9]) run.report = a + 9;
    else if (strcmp(a, "--param") == 0 || strncmp(a, "--param=", 8) == 0) {
      const char *kv = a[7] == '=' ? a + 8 : (i + 1 < argc ? argv[++i] : NULL);
      const char *eq = kv ? strchr(kv, '=') : NULL;
      if (!eq || eq == kv || run.nparams == 64) {
        fprintf(stderr, "equipoise: --param needs NAME=VALUE\n%s", cli_usage);
        code = EXIT_USAGE;
        goto out;
      }
      char *name = strndup(kv, (size_t)(eq - kv));
      if (!name) { code = EXIT_NOMEM; goto out; }
      owned[nowned++] = name;
      names[run.nparams] = name;
      values[run.nparams++] = eq + 1;
    } else if (a[0] == '-' && a[1]) {
      fprintf(stderr, "equipoise: unknown option '%s'\n%s", a, cli_usage);
      code = EXIT_USAGE;
      goto out;
    } else if (!run.script) {
      run.script = a;
    } else {
      fprintf(stderr, "equipoise: one script at a time ('%s' and '%s')\n", run.script, a);
      code = EXIT_USAGE;
      goto out;
    }
  }
  if (!run.script) {
    fprintf(stderr, "equipoise: run needs a script\n%s", cli_usage);
    code = EXIT_USAGE;
    goto out;
  }
  code = cli_run_script(&run);
out:
  for (int i = 0; i < nowned; i++) free(owned[i]);
  return code;
}

int main(int argc, char **argv)
{
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
    printf("equipoise %s (plugin ABI %d.%d)\n", EQP_VERSION_STRING, 1, 0);
    return EXIT_OK;
  }
  if (strcmp(cmd, "run") == 0) return cmd_run(argc - 2, argv + 2);
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
