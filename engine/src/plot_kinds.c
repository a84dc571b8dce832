/* Ready-made figures from curves: titrations, distribution diagrams,
** buffer capacity, and any columns of a curve. */
/* SPDX-License-Identifier: MIT */
#include "curve_impl.h"
#include "plot_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

typedef struct colunit {
  const char *col, *label, *unit;
  double scale;
} colunit;

static const colunit known[] = {
  {"volume", "titrant volume", "mL", 1e3},
  {"total_volume", "total volume", "mL", 1e3},
  {"amount", "titrant amount", "mmol", 1e3},
  {"temperature", "temperature", "\xC2\xB0" "C", 1},
  {"pH", "pH", NULL, 1},
  {"ionic_strength", "ionic strength", "mol/kg", 1},
  {"slope", "slope dpH/d(added)", "pH/mol or pH/L", 1},
};

/* Label, unit and scale of a column; species columns are molalities. */
static colunit column_unit(const char *name)
{
  for (size_t i = 0; i < sizeof known / sizeof known[0]; i++)
    if (strcmp(known[i].col, name) == 0) return known[i];
  return (colunit){name, name, "mol/kg", 1};
}

static long column_index(const eqp_curve *c, const char *name)
{
  for (size_t j = 0; j < eqp_curve_cols(c); j++)
    if (strcmp(eqp_curve_col_name(c, j), name) == 0) return (long)j;
  return -1;
}

/* Add column j of c (times scale) against column x (times xscale). */
static int add_column(eqp_plot *p, const eqp_curve *c, long x, double xscale, long j,
                      double scale, const char *label)
{
  size_t n = eqp_curve_rows(c);
  double *xs = eqpi_malloc(p->ctx, sizeof(double) * (n ? n : 1));
  double *ys = eqpi_malloc(p->ctx, sizeof(double) * (n ? n : 1));
  int rc = EQP_OK;
  if (!xs || !ys) rc = eqpi_fail(p->ctx, EQP_E_NOMEM, "out of memory");
  for (size_t i = 0; rc == EQP_OK && i < n; i++) {
    xs[i] = eqp_curve_value(c, i, (size_t)x) * xscale;
    ys[i] = eqp_curve_value(c, i, (size_t)j) * scale;
  }
  if (rc == EQP_OK) rc = eqp_plot_add_line(p, label, n, xs, ys);
  eqpi_free(p->ctx, xs, sizeof(double) * (n ? n : 1));
  eqpi_free(p->ctx, ys, sizeof(double) * (n ? n : 1));
  return rc;
}

static int finish(eqp_plot *p, int rc, eqp_plot **out)
{
  if (rc < 0) {
    eqp_plot_free(p);
    return rc;
  }
  *out = p;
  return EQP_OK;
}

int eqp_plot_titration(const eqp_curve *c, const char *title, eqp_plot **out)
{
  if (!c || !out) return EQP_E_ARG;
  *out = NULL;
  eqp_plot *p;
  int rc = eqp_plot_new(c->ctx, &p);
  if (rc < 0) return rc;
  long am = column_index(c, "amount"), vol = column_index(c, "volume");
  long ph = column_index(c, "pH");
  if (am < 0 || vol < 0 || ph < 0)
    return finish(p, eqpi_fail(c->ctx, EQP_E_INPUT, "not a titration curve (no amount, volume "
                               "and pH columns)"), out);
  /* millilitres when the titrant is a liquid (a stock, or a reagent with a
  ** density), millimoles of a solid */
  int by_volume = 0;
  for (size_t i = 0; i < eqp_curve_rows(c); i++)
    if (isnan(eqp_curve_value(c, i, (size_t)am)) || eqp_curve_value(c, i, (size_t)vol) > 0)
      by_volume = 1;
  long x = by_volume ? vol : am;
  rc = eqp_plot_set_title(p, title ? title : "Titration curve");
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 0, "titrant added", by_volume ? "mL" : "mmol",
                                           NAN, NAN);
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 1, "pH", NULL, NAN, NAN);
  if (rc == EQP_OK) rc = add_column(p, c, x, 1e3, ph, 1, NULL);
  for (size_t k = 0; rc == EQP_OK && k < eqp_curve_equivalence_count(c); k++) {
    double a, v, pH;
    eqp_curve_equivalence(c, k, &a, &v, &pH);
    double at = (by_volume ? v : a) * 1e3;
    if (!isfinite(at)) continue;
    char label[EQPI_PLOT_TEXT];
    snprintf(label, sizeof label, "equivalence: %.3f %s, pH %.2f", at, by_volume ? "mL" : "mmol",
             pH);
    rc = eqp_plot_add_marker(p, at, pH, label);
  }
  return finish(p, rc, out);
}

static void conditions(char *buf, size_t len, double T, double I, const char *model)
{
  if (I > 0)
    snprintf(buf, len, "I = %.3g mol/kg (%s), %.1f \xC2\xB0" "C", I, model ? model : "davies",
             T - 273.15);
  else
    snprintf(buf, len, "infinite dilution, %.1f \xC2\xB0" "C", T - 273.15);
}

int eqp_plot_distribution(const eqp_curve *c, const eqp_distribution_spec *user, eqp_plot **out)
{
  if (!c || !user || !out) return EQP_E_ARG;
  *out = NULL;
  eqp_distribution_spec opts = EQP_DISTRIBUTION_SPEC_INIT;
  const eqp_distribution_spec *d = &opts;
  int rc = eqpi_opts_read(c->ctx, "eqp_distribution_spec", user, &opts, sizeof opts,
                          EQPI_DISTRIBUTION_SPEC_0_1);
  if (rc < 0) return rc;
  if (!d->system) return eqpi_fail(c->ctx, EQP_E_ARG, "NULL argument");
  eqp_plot *p;
  rc = eqp_plot_new(c->ctx, &p);
  if (rc < 0) return rc;
  long ph = column_index(c, "pH");
  if (ph != 0) return finish(p, eqpi_fail(c->ctx, EQP_E_INPUT, "not a distribution (pH is "
                                          "not its first column)"), out);
  char cond[96], title[EQPI_PLOT_TEXT * 2], sys[64];
  conditions(cond, sizeof cond, d->T > 0 ? d->T : EQPI_T25, d->ionic_strength, d->activity);
  /* a formula (NaHCO3) with its subscripts; a name (phosphate) as it is */
  if (eqpi_db_find_reagent(c->ctx->db, d->system) < 0 &&
      eqpi_db_find_species(c->ctx->db, d->system) < 0)
    snprintf(sys, sizeof sys, "%s", d->system);
  else if (eqpi_name_pretty(d->system, sys, sizeof sys) != 0)
    snprintf(sys, sizeof sys, "%s", d->system);
  snprintf(title, sizeof title, "Distribution of the %s system\n%s", sys, cond);
  rc = eqp_plot_set_title(p, title);
  double lo = eqp_curve_value(c, 0, 0), hi = eqp_curve_value(c, eqp_curve_rows(c) - 1, 0);
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 0, "pH", NULL, lo < hi ? lo : NAN,
                                           lo < hi ? hi : NAN);
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 1, "fraction of the total", "%", 0, 100);
  for (size_t j = 1; rc == EQP_OK && j < eqp_curve_cols(c); j++)
    rc = add_column(p, c, 0, 1, (long)j, 100, eqp_curve_col_name(c, j));
  if (rc == EQP_OK) rc = eqp_plot_add_hline(p, 50, "50 %");
  return finish(p, rc, out);
}

int eqp_plot_capacity(const eqp_curve *c, const eqp_capacity_spec *user, eqp_plot **out)
{
  if (!c || !user || !out) return EQP_E_ARG;
  *out = NULL;
  eqp_capacity_spec opts = EQP_CAPACITY_SPEC_INIT;
  const eqp_capacity_spec *s = &opts;
  int rc = eqpi_opts_read(c->ctx, "eqp_capacity_spec", user, &opts, sizeof opts,
                          EQPI_CAPACITY_SPEC_0_1);
  if (rc < 0) return rc;
  eqp_plot *p;
  rc = eqp_plot_new(c->ctx, &p);
  if (rc < 0) return rc;
  if (column_index(c, "pH") != 0)
    return finish(p, eqpi_fail(c->ctx, EQP_E_INPUT, "not a capacity sweep (pH is not its "
                               "first column)"), out);
  char title[EQPI_PLOT_TEXT];
  snprintf(title, sizeof title, "Buffer capacity at %.4g mM total\n%.1f \xC2\xB0" "C, %s activity model",
           s->total * 1e3, (s->T > 0 ? s->T : EQPI_T25) - 273.15,
           s->activity ? s->activity : "davies");
  rc = eqp_plot_set_title(p, title);
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 0, "pH", NULL, NAN, NAN);
  if (rc == EQP_OK)
    rc = eqp_plot_set_axis(p, 1, "buffer capacity \xCE\xB2", "mmol L\xE2\x81\xBB\xC2\xB9 "
                           "pH\xE2\x81\xBB\xC2\xB9", NAN, NAN);
  if (rc == EQP_OK && !isnan(s->window_lo) && !isnan(s->window_hi)) {
    char label[EQPI_PLOT_TEXT];
    snprintf(label, sizeof label, "window pH %.2f\xE2\x80\x93%.2f", s->window_lo,
             s->window_hi);
    rc = eqp_plot_add_band(p, s->window_lo, s->window_hi, label);
  }
  for (size_t j = 1; rc == EQP_OK && j < eqp_curve_cols(c); j++)
    rc = add_column(p, c, 0, 1, (long)j, 1e3, eqp_curve_col_name(c, j));
  return finish(p, rc, out);
}

int eqp_plot_columns(const eqp_curve *c, const char *xcol, const char *const *ycols, size_t ny,
                     const char *title, eqp_plot **out)
{
  if (!c || !xcol || !out || (ny && !ycols)) return EQP_E_ARG;
  *out = NULL;
  eqp_plot *p;
  int rc = eqp_plot_new(c->ctx, &p);
  if (rc < 0) return rc;
  long x = column_index(c, xcol);
  if (x < 0) return finish(p, eqpi_fail(c->ctx, EQP_E_UNKNOWN, "no column '%s'", xcol), out);
  colunit xu = column_unit(xcol);
  rc = eqp_plot_set_title(p, title);
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 0, xu.label, xu.unit, NAN, NAN);
  long cols[EQPI_PLOT_MAX_ITEMS];
  size_t n = 0;
  for (size_t j = 0; rc == EQP_OK && j < (ny ? ny : eqp_curve_cols(c)); j++) {
    long k = ny ? column_index(c, ycols[j]) : (long)j;
    if (k < 0) rc = eqpi_fail(c->ctx, EQP_E_UNKNOWN, "no column '%s'", ycols[j]);
    else if (k != x && n < EQPI_PLOT_MAX_ITEMS) cols[n++] = k;
  }
  if (rc == EQP_OK && n == 0) rc = eqpi_fail(c->ctx, EQP_E_INPUT, "nothing to plot against '%s'",
                                             xcol);
  /* one column: its own label; several: their common unit if they share one */
  colunit y0 = n ? column_unit(eqp_curve_col_name(c, (size_t)cols[0])) : xu;
  int same = 1;
  for (size_t j = 1; j < n; j++) {
    colunit yj = column_unit(eqp_curve_col_name(c, (size_t)cols[j]));
    same &= (!yj.unit && !y0.unit) || (yj.unit && y0.unit && strcmp(yj.unit, y0.unit) == 0);
  }
  if (rc == EQP_OK)
    rc = eqp_plot_set_axis(p, 1, n == 1 ? y0.label : same && y0.unit &&
                           strcmp(y0.unit, "mol/kg") == 0 ? "molality" : "value",
                           same ? y0.unit : NULL, NAN, NAN);
  for (size_t j = 0; rc == EQP_OK && j < n; j++) {
    colunit yu = column_unit(eqp_curve_col_name(c, (size_t)cols[j]));
    rc = add_column(p, c, x, xu.scale, cols[j], same ? yu.scale : 1, n > 1 ?
                    eqp_curve_col_name(c, (size_t)cols[j]) : NULL);
  }
  return finish(p, rc, out);
}

int eqp_curve_from_table(eqp_ctx *ctx, size_t ncols, const char *const *names, size_t nrows,
                         const double *values, eqp_curve **out)
{
  if (!ctx || !names || !out || (nrows && !values)) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  if (ncols < 1 || ncols > 1000) return eqpi_fail(ctx, EQP_E_INPUT, "1 to 1000 columns");
  for (size_t j = 0; j < ncols; j++)
    if (!names[j] || !names[j][0]) return eqpi_fail(ctx, EQP_E_INPUT, "column %zu has no name",
                                                    j + 1);
  for (size_t i = 0; i < nrows * ncols; i++)
    if (isinf(values[i])) return eqpi_fail(ctx, EQP_E_INPUT, "row %zu holds an infinite value",
                                           i / ncols + 1);
  eqp_curve *c = eqpi_curve_new(ctx, (int)ncols, names);
  if (!c) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (size_t i = 0; i < nrows; i++)
    if (eqpi_curve_push(c, values + i * ncols) < 0) {
      eqp_curve_free(c);
      return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
    }
  *out = c;
  return EQP_OK;
}
