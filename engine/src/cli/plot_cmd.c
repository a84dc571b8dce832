/* equipoise plot: figures without a script, through the same C API as
** curve:plot and eq.plot. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include "../eqp_impl.h"
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static const char plot_usage[] =
  "usage: equipoise plot distribution SYSTEM [--ionic-strength I] [--temperature C]\n"
  "                      [--activity MODEL] [--medium SALT] [--pH LO:HI] -o OUT\n"
  "       equipoise plot capacity BUFFER [BUFFER ...] --total CONC [--temperature C]\n"
  "                      [--activity MODEL] [--pH LO:HI] [--window LO:HI] -o OUT\n"
  "       equipoise plot csv FILE.csv [--x COLUMN] [--y COLUMN[,COLUMN...]]\n"
  "                      [--title TEXT] -o OUT\n"
  "OUT ends in .svg, .png or .pdf; it is written atomically.\n"
  "  SYSTEM   a buffer system, reagent or species: phosphate, citric acid, HPO4^2-\n"
  "  I        ionic strength in mol/kg (default 0: infinite dilution)\n"
  "  CONC     buffer total with its unit, such as 50mM or '50 mM'\n";

typedef struct opts {
  const char *out, *activity, *medium, *total, *x, *y, *title;
  double I, T, lo, hi, wlo, whi;
  const char *pos[32];
  int npos;
} opts;

static int pair(const char *s, double *a, double *b)
{
  char *end;
  *a = strtod(s, &end);
  if (*end != ':') return -1;
  *b = strtod(end + 1, &end);
  return *end || !(*a < *b) ? -1 : 0;
}

static int number(const char *s, double *v)
{
  char *end;
  *v = strtod(s, &end);
  return *end || end == s || !isfinite(*v) ? -1 : 0;
}

static int parse(int argc, char **argv, opts *o)
{
  memset(o, 0, sizeof *o);
  o->T = 25;
  o->lo = o->hi = o->wlo = o->whi = NAN;
  for (int i = 0; i < argc; i++) {
    const char *a = argv[i], *v = i + 1 < argc ? argv[i + 1] : NULL;
    int bad = 0, takes = 1;
    if (strcmp(a, "-o") == 0 || strcmp(a, "--output") == 0) o->out = v;
    else if (strcmp(a, "--ionic-strength") == 0) bad = !v || number(v, &o->I) < 0 || o->I < 0;
    else if (strcmp(a, "--temperature") == 0) bad = !v || number(v, &o->T) < 0;
    else if (strcmp(a, "--activity") == 0) o->activity = v;
    else if (strcmp(a, "--medium") == 0) o->medium = v;
    else if (strcmp(a, "--total") == 0) o->total = v;
    else if (strcmp(a, "--pH") == 0) bad = !v || pair(v, &o->lo, &o->hi) < 0;
    else if (strcmp(a, "--window") == 0) bad = !v || pair(v, &o->wlo, &o->whi) < 0;
    else if (strcmp(a, "--x") == 0) o->x = v;
    else if (strcmp(a, "--y") == 0) o->y = v;
    else if (strcmp(a, "--title") == 0) o->title = v;
    else if (a[0] == '-' && a[1]) {
      fprintf(stderr, "equipoise plot: unknown option '%s'\n%s", a, plot_usage);
      return -1;
    } else {
      takes = 0;
      if (o->npos == 32) return -1;
      o->pos[o->npos++] = a;
    }
    if (takes && (!v || bad)) {
      fprintf(stderr, "equipoise plot: %s needs a %s\n%s", a, v ? "valid value" : "value",
              plot_usage);
      return -1;
    }
    i += takes;
  }
  if (!o->out) {
    fprintf(stderr, "equipoise plot: -o OUT.svg|.png|.pdf is required\n%s", plot_usage);
    return -1;
  }
  return 0;
}

/* The next field of *s up to one of seps (strsep's contract, which POSIX lacks). */
static char *next_field(char **s, const char *seps)
{
  char *start = *s;
  if (!start) return NULL;
  char *end = start + strcspn(start, seps);
  *s = *end ? end + 1 : NULL;
  *end = '\0';
  return start;
}

/* Read a CSV of numbers with a header line (empty field: a gap). */
static int read_csv(eqp_ctx *ctx, const char *path, eqp_curve **out)
{
  FILE *f = eqpi_fopen_regular(path);
  if (!f) {
    fprintf(stderr, "equipoise plot: cannot read '%s'\n", path);
    return EXIT_USAGE;
  }
  char *line = NULL, *names[256];
  size_t cap = 0, ncols = 0, nrows = 0, vcap = 0;
  double *v = NULL;
  int code = EXIT_OK;
  if (getline(&line, &cap, f) < 0) code = EXIT_INPUT;
  for (char *s = line, *tok; code == EXIT_OK && (tok = next_field(&s, ",\n\r")) && ncols < 256;)
    if (*tok || s) names[ncols++] = strdup(tok);
  while (ncols && !names[ncols - 1][0]) free(names[--ncols]);   /* trailing separator */
  for (long lineno = 2; code == EXIT_OK && getline(&line, &cap, f) > 0; lineno++) {
    if (line[0] == '\n' || line[0] == '\0') continue;
    if ((nrows + 1) * ncols > vcap) {
      vcap = vcap ? vcap * 2 : 1024 * ncols;
      double *nv = realloc(v, sizeof(double) * vcap);
      if (!nv) { code = EXIT_NOMEM; break; }
      v = nv;
    }
    char *s = line, *tok;
    for (size_t j = 0; j < ncols; j++) {
      tok = next_field(&s, ",\n\r");
      double x = NAN;
      if (tok && *tok && number(tok, &x) < 0) {
        fprintf(stderr, "equipoise plot: %s:%ld: '%s' is not a number\n", path, lineno, tok);
        code = EXIT_INPUT;
        break;
      }
      v[nrows * ncols + j] = x;
    }
    nrows++;
  }
  fclose(f);
  free(line);
  if (code == EXIT_OK && (ncols < 2 || nrows == 0)) {
    fprintf(stderr, "equipoise plot: '%s' needs a header and rows of two or more columns\n",
            path);
    code = EXIT_INPUT;
  }
  if (code == EXIT_OK && eqp_curve_from_table(ctx, ncols, (const char *const *)names, nrows, v,
                                              out) < 0) {
    fprintf(stderr, "equipoise plot: %s: %s\n", path, eqp_ctx_errmsg(ctx));
    code = EXIT_INPUT;
  }
  for (size_t j = 0; j < ncols; j++) free(names[j]);
  free(v);
  return code;
}

static int csv_plot(eqp_ctx *ctx, const opts *o, eqp_plot **p)
{
  eqp_curve *c = NULL;
  int code = read_csv(ctx, o->pos[1], &c);
  if (code != EXIT_OK) return code;
  /* a saved titration: pH against the volume added, unless told otherwise */
  const char *x = o->x ? o->x : eqp_curve_col_name(c, 0);
  const char *ys[64];
  size_t ny = 0;
  int titration = strcmp(eqp_curve_col_name(c, 0), "amount") == 0;
  if (!o->x && titration) x = "volume";
  char ybuf[1024];
  if (o->y) {
    snprintf(ybuf, sizeof ybuf, "%s", o->y);
    for (char *s = ybuf, *tok; (tok = next_field(&s, ",")) && ny < 64;) ys[ny++] = tok;
  } else if (titration) {
    ys[ny++] = "pH";
  }
  int rc = eqp_plot_columns(c, x, ny ? ys : NULL, ny, o->title, p);
  eqp_curve_free(c);
  if (rc < 0) fprintf(stderr, "equipoise plot: %s\n", eqp_ctx_errmsg(ctx));
  return rc < 0 ? cli_exit_code(rc) : EXIT_OK;
}

int cli_plot(int argc, char **argv)
{
  if (argc >= 1 && (strcmp(argv[0], "--help") == 0 || strcmp(argv[0], "-h") == 0)) {
    fputs(plot_usage, stdout);
    return EXIT_OK;
  }
  opts o;
  if (argc < 2 || parse(argc, argv, &o) < 0) {
    if (argc < 2) fputs(plot_usage, stderr);
    return EXIT_USAGE;
  }
  if (o.npos < 2) {
    fprintf(stderr, "equipoise plot: which figure, of what?\n%s", plot_usage);
    return EXIT_USAGE;
  }
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  if (!ctx) return EXIT_NOMEM;
  if (cli_configure(ctx, 0, 0) < 0) {
    eqp_ctx_free(ctx);
    return EXIT_NOMEM;
  }
  eqp_plot *p = NULL;
  eqp_curve *c = NULL;
  int rc = eqp_ctx_load_default_library(ctx), code = EXIT_OK;
  const char *kind = o.pos[0];
  if (rc < 0) {
    code = cli_exit_code(rc);
  } else if (strcmp(kind, "distribution") == 0 && o.npos == 2) {
    eqp_distribution_spec d = EQP_DISTRIBUTION_SPEC_INIT;
    d.system = o.pos[1];
    if (!isnan(o.lo)) d.pH_lo = o.lo;
    if (!isnan(o.hi)) d.pH_hi = o.hi;
    d.T = o.T + 273.15;
    d.ionic_strength = o.I;
    d.activity = o.activity;
    d.medium = o.medium;
    rc = eqp_distribution(ctx, &d, &c);
    if (rc == EQP_OK) rc = eqp_plot_distribution(c, &d, &p);
  } else if (strcmp(kind, "capacity") == 0) {
    eqp_capacity_spec s = EQP_CAPACITY_SPEC_INIT;
    eqp_quantity k;
    s.buffers = (const char *const *)o.pos + 1;
    s.nbuffers = (size_t)o.npos - 1;
    s.T = o.T + 273.15;
    s.activity = o.activity;
    s.pH_lo = isnan(o.lo) ? 3 : o.lo;
    s.pH_hi = isnan(o.hi) ? 11 : o.hi;
    s.window_lo = o.wlo;
    s.window_hi = o.whi;
    if (!o.total) {
      fprintf(stderr, "equipoise plot capacity: --total is required (such as 50mM)\n");
      code = EXIT_USAGE;
    } else if ((rc = eqp_parse_quantity(ctx, o.total, EQP_Q_MOLARITY, &s.total, &k)) == EQP_OK &&
               (rc = eqp_capacity_sweep(ctx, &s, &c)) == EQP_OK) {
      rc = eqp_plot_capacity(c, &s, &p);
    }
  } else if (strcmp(kind, "csv") == 0 && o.npos == 2) {
    code = csv_plot(ctx, &o, &p);
  } else {
    fprintf(stderr, "equipoise plot: unknown figure '%s' or wrong arguments\n%s", kind,
            plot_usage);
    code = EXIT_USAGE;
  }
  if (code == EXIT_OK && rc == EQP_OK && p) rc = eqp_plot_write(p, o.out);
  if (code == EXIT_OK && rc < 0) {
    fprintf(stderr, "equipoise plot: %s\n", eqp_ctx_errmsg(ctx));
    code = cli_exit_code(rc);
  }
  if (code == EXIT_OK && !p) code = EXIT_INPUT;
  eqp_plot_free(p);
  eqp_curve_free(c);
  eqp_ctx_free(ctx);
  return code;
}
