/* equipoise species list | show NAME | check FILE: explore and check the
** species library. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct opts {
  int json;
  const char *temperature;   /* as given, NULL if not */
  const char *args[2];       /* positional arguments after the subcommand */
  int nargs;
} opts;

/* Parse the options of a subcommand; `allow_T` enables --temperature.
** 0, or an exit code after a message. */
static int parse(int argc, char **argv, const char *sub, int allow_T, opts *o)
{
  memset(o, 0, sizeof *o);
  for (int i = 0; i < argc; i++) {
    const char *a = argv[i];
    if (strcmp(a, "--json") == 0) {
      o->json = 1;
    } else if (allow_T && (strcmp(a, "--temperature") == 0 || strncmp(a, "--temperature=", 14) == 0)) {
      o->temperature = a[13] == '=' ? a + 14 : (i + 1 < argc ? argv[++i] : NULL);
      if (!o->temperature || !o->temperature[0]) {
        fprintf(stderr, "equipoise: --temperature needs a value: 37 (in C) or '310.15 K'\n");
        return EXIT_USAGE;
      }
    } else if (a[0] == '-' && a[1]) {
      fprintf(stderr, "equipoise: unknown option '%s' for 'species %s' (known: --json%s)\n%s", a,
              sub, allow_T ? ", --temperature" : "", cli_usage);
      return EXIT_USAGE;
    } else if (o->nargs < 2) {
      o->args[o->nargs++] = a;
    } else {
      fprintf(stderr, "equipoise: too many arguments for 'species %s'\n%s", sub, cli_usage);
      return EXIT_USAGE;
    }
  }
  return 0;
}

/* A temperature as a number in C or a string with its unit, in K. */
static int read_temperature(eqp_ctx *ctx, const char *text, double *T)
{
  char *end;
  double c = strtod(text, &end);
  if (end != text && *end == '\0') {
    *T = c + 273.15;
    return EQP_OK;
  }
  eqp_quantity k;
  return eqp_parse_quantity(ctx, text, EQP_Q_TEMPERATURE, T, &k);
}

static int load_library(eqp_ctx *ctx)
{
  int rc = eqp_ctx_load_default_library(ctx);
  if (rc < 0) fprintf(stderr, "equipoise: %s\n", eqp_ctx_errmsg(ctx));
  return rc;
}

static int emit(eqp_ctx *ctx, int rc, char *const *textp)
{
  char *text = *textp;
  if (rc < 0) {
    fprintf(stderr, "equipoise: %s\n", eqp_ctx_errmsg(ctx));
    return cli_exit_code(rc);
  }
  fputs(text, stdout);
  if (text[0] && text[strlen(text) - 1] != '\n') fputc('\n', stdout);
  eqp_free_string(text);
  return EXIT_OK;
}

/* A file left out of the library, a file replaced: said on stderr. */
static void print_notices(const eqp_ctx *ctx)
{
  for (size_t i = 0; i < eqp_ctx_notice_count(ctx); i++)
    fprintf(stderr, "warning: %s\n", eqp_ctx_notice(ctx, i));
}

/* The file goes first on the species path, so that an edited copy of a
** library file is checked in place of the original. */
static int check(eqp_ctx *ctx, const char *path)
{
  size_t n;
  int rc = eqp_ctx_check_species_file(ctx, path, &n);
  print_notices(ctx);
  if (rc < 0) {
    fprintf(stderr, "%s\n", eqp_ctx_errmsg(ctx));
    return cli_exit_code(rc);
  }
  printf("%s: ok, %zu species added\n", path, n);
  return EXIT_OK;
}

static int run(eqp_ctx *ctx, const char *sub, const opts *o)
{
  eqp_format fmt = o->json ? EQP_FORMAT_JSON : EQP_FORMAT_TEXT;
  char *text = NULL;
  if (strcmp(sub, "list") == 0) return emit(ctx, eqp_ctx_list(ctx, fmt, &text), &text);
  double T = 298.15;
  if (o->temperature && read_temperature(ctx, o->temperature, &T) < 0) {
    fprintf(stderr, "equipoise: --temperature: %s\n", eqp_ctx_errmsg(ctx));
    return EXIT_INPUT;
  }
  return emit(ctx, eqp_ctx_describe(ctx, o->args[0], T, fmt, &text), &text);
}

int cli_species(int argc, char **argv)
{
  static const struct { const char *name; int nargs, allow_T, allow_json; } subs[] = {
    {"list", 0, 0, 1}, {"show", 1, 1, 1}, {"check", 1, 0, 0},
  };
  int k = -1;
  for (int i = 0; argc > 0 && i < 3; i++)
    if (strcmp(argv[0], subs[i].name) == 0) k = i;
  if (k < 0) {
    if (argc > 0) fprintf(stderr, "equipoise: unknown species command '%s'\n", argv[0]);
    fputs(cli_usage, stderr);
    return EXIT_USAGE;
  }
  opts o;
  int code = parse(argc - 1, argv + 1, subs[k].name, subs[k].allow_T, &o);
  if (code) return code;
  if (o.json && !subs[k].allow_json) {
    fprintf(stderr, "equipoise: unknown option '--json' for 'species %s'\n%s", subs[k].name,
            cli_usage);
    return EXIT_USAGE;
  }
  if (o.nargs != subs[k].nargs) {
    fprintf(stderr, "equipoise: 'species %s' takes %s\n%s", subs[k].name,
            subs[k].nargs ? "one argument" : "no argument", cli_usage);
    return EXIT_USAGE;
  }
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  if (!ctx) return EXIT_NOMEM;
  if (cli_configure(ctx, 0, 0) < 0) {
    eqp_ctx_free(ctx);
    return EXIT_NOMEM;
  }
  if (strcmp(subs[k].name, "check") == 0) {
    code = check(ctx, o.args[0]);
  } else {
    int rc = load_library(ctx);
    print_notices(ctx);
    code = rc < 0 ? cli_exit_code(rc) : run(ctx, subs[k].name, &o);
  }
  eqp_ctx_free(ctx);
  return code;
}
