/* equipoise: run experiments, explore the species library, list plugins. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <stdio.h>
#include <stdlib.h>
#include <limits.h>
#include <string.h>

static const char usage[] =
  "usage: equipoise run FILE.lua [--param NAME=VALUE ...] [--json] [--verbose]\n"
  "       equipoise species list | show NAME | check FILE\n"
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
  "    --verbose         show a Lua stack trace on errors\n"
  "  species list        list the species and reagents of the library\n"
  "  species show NAME   formula, reaction, constants and sources of one entry\n"
  "  species check FILE  validate a species file against the library\n"
  "  plugins             list activity models found on the plugin path\n"
  "\n"
  "exit codes: 0 ok, 1 script error, 2 usage, 3 bad input value, 4 species\n"
  "data error, 5 no convergence, 6 plugin error, 7 out of memory\n"
  "\n"
  "environment: EQUIPOISE_SPECIES_PATH (library folder), EQUIPOISE_PLUGIN_PATH\n"
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

static int load_library(eqp_ctx *ctx)
{
  int rc = eqp_ctx_load_default_library(ctx);
  if (rc < 0) fprintf(stderr, "equipoise: %s\n", eqp_ctx_errmsg(ctx));
  return rc;
}

static int in_library(const eqp_ctx *ctx, const char *path)
{
  char a[PATH_MAX], b[PATH_MAX];
  if (!realpath(path, a)) return 0;
  for (size_t i = 0; i < eqp_ctx_source_count(ctx); i++)
    if (realpath(eqp_ctx_source_path(ctx, i), b) && strcmp(a, b) == 0) return 1;
  return 0;
}

static int cmd_species(int argc, char **argv)
{
  if (argc < 1) {
    fputs(usage, stderr);
    return EXIT_USAGE;
  }
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  if (!ctx) return EXIT_NOMEM;
  int code = EXIT_OK, rc = load_library(ctx);
  if (rc < 0) {
    code = cli_exit_code(rc);
  } else if (strcmp(argv[0], "list") == 0) {
    printf("species (%zu):\n", eqp_ctx_species_count(ctx));
    for (size_t i = 0; i < eqp_ctx_species_count(ctx); i++)
      printf("  %s\n", eqp_ctx_species_name(ctx, i));
    printf("reagents (%zu):\n", eqp_ctx_reagent_count(ctx));
    for (size_t i = 0; i < eqp_ctx_reagent_count(ctx); i++)
      printf("  %s\n", eqp_ctx_reagent_name(ctx, i));
    printf("buffer systems (%zu):\n", eqp_ctx_buffer_count(ctx));
    for (size_t i = 0; i < eqp_ctx_buffer_count(ctx); i++)
      printf("  %s\n", eqp_ctx_buffer_name(ctx, i));
    printf("from:\n");
    for (size_t i = 0; i < eqp_ctx_source_count(ctx); i++)
      printf("  %s\n", eqp_ctx_source_path(ctx, i));
  } else if (strcmp(argv[0], "show") == 0 && argc == 2) {
    static char buf[8192];
    rc = eqp_ctx_describe(ctx, argv[1], buf, sizeof buf);
    if (rc < 0) {
      fprintf(stderr, "equipoise: %s\n", eqp_ctx_errmsg(ctx));
      code = EXIT_INPUT;
    } else {
      fputs(buf, stdout);
    }
  } else if (strcmp(argv[0], "check") == 0 && argc == 2 && in_library(ctx, argv[1])) {
    /* the library loaded, and with it this file: it has passed every check */
    printf("%s: ok (part of the loaded library)\n", argv[1]);
  } else if (strcmp(argv[0], "check") == 0 && argc == 2) {
    size_t before = eqp_ctx_species_count(ctx);
    rc = eqp_ctx_load_species_file(ctx, argv[1]);
    if (rc < 0) {
      fprintf(stderr, "%s\n", eqp_ctx_errmsg(ctx));
      code = cli_exit_code(rc);
    } else {
      printf("%s: ok, %zu species added\n", argv[1], eqp_ctx_species_count(ctx) - before);
    }
  } else {
    fputs(usage, stderr);
    code = EXIT_USAGE;
  }
  eqp_ctx_free(ctx);
  return code;
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
    else if (strcmp(a, "--param") == 0 || strncmp(a, "--param=", 8) == 0) {
      const char *kv = a[7] == '=' ? a + 8 : (i + 1 < argc ? argv[++i] : NULL);
      const char *eq = kv ? strchr(kv, '=') : NULL;
      if (!eq || eq == kv || run.nparams == 64) {
        fprintf(stderr, "equipoise: --param needs NAME=VALUE\n%s", usage);
        code = EXIT_USAGE;
        goto out;
      }
      char *name = strndup(kv, (size_t)(eq - kv));
      if (!name) { code = EXIT_NOMEM; goto out; }
      owned[nowned++] = name;
      names[run.nparams] = name;
      values[run.nparams++] = eq + 1;
    } else if (a[0] == '-' && a[1]) {
      fprintf(stderr, "equipoise: unknown option '%s'\n%s", a, usage);
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
    fprintf(stderr, "equipoise: run needs a script\n%s", usage);
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
    fputs(usage, stderr);
    return EXIT_USAGE;
  }
  const char *cmd = argv[1];
  if (strcmp(cmd, "--help") == 0 || strcmp(cmd, "-h") == 0 || strcmp(cmd, "help") == 0) {
    fputs(usage, stdout);
    fputs(help, stdout);
    return EXIT_OK;
  }
  if (strcmp(cmd, "--version") == 0) {
    printf("equipoise %s (plugin ABI %d.%d)\n", EQP_VERSION_STRING, 1, 0);
    return EXIT_OK;
  }
  if (strcmp(cmd, "run") == 0) return cmd_run(argc - 2, argv + 2);
  if (strcmp(cmd, "species") == 0) return cmd_species(argc - 2, argv + 2);
  if (strcmp(cmd, "plugins") == 0) return argc == 2 ? cmd_plugins() : EXIT_USAGE;
  fprintf(stderr, "equipoise: unknown command '%s'\n%s", cmd, usage);
  return EXIT_USAGE;
}
