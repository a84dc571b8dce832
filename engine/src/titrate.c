/* Titrations: a curve of successive equilibria, with steps that shrink
** where the pH moves fast, an end exactly at a requested pH (the titrant's
** amount solved with the H+ activity fixed), and equivalence points located
** at the sharp maxima of |dpH/dV| (the derivative from implicit
** differentiation, the maximum found by Brent's minimiser). */
/* SPDX-License-Identifier: MIT */
#include "brent_impl.h"
#include "curve_impl.h"
#include "solution_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_ROWS 100000
#define MAX_COLS 32

typedef struct titrant {
  double *a;            /* components per unit (mol of reagent, or L of stock) */
  double w;             /* kg of water per unit */
  double litres;        /* L per unit (1 for a stock; liquid reagents; else NaN) */
  int stock;
} titrant;

enum { COL_AMOUNT, COL_VOLUME, COL_TOTAL, COL_PH, COL_DPH, COL_SPECIES };

/* Set w to base + v units of titrant and solve; pH and dpH/dunit out. */
static int state_at(eqp_solution *w, const eqp_solution *base, const titrant *t, double v,
                    double *pH, double *dpH, eqp_result **keep)
{
  for (int c = 0; c < w->ntotal; c++) w->total[c] = base->total[c] + v * t->a[c];
  w->water_kg = base->water_kg + v * t->w;
  eqp_result *r;
  int rc = eqpi_solution_equilibrate(w, &r);
  if (rc < 0) return rc;
  if (eqp_result_solid_count(r) > 0) {
    /* the slope and the equivalence points come from the solution alone */
    double mol;
    const char *name = eqp_result_solid_name(r, 0, &mol);
    eqp_result_free(r);
    return eqpi_fail(w->ctx, EQP_E_INPUT, "titration: %s forms after %.4g %s of titrant, and "
                     "the titration curve's slope is not computed with solids present; titrate "
                     "without precipitate = {...} (the saturation indices then show where a "
                     "solid may form), or find single points with s:adjust_pH", name, v,
                     t->stock ? "kg" : "mol");
  }
  *pH = eqp_result_pH(r);
  rc = eqpi_solution_dpH_dir(w, t->a, t->w, dpH);
  if (keep) *keep = r;
  else eqp_result_free(r);
  return rc;
}

static int push_row(eqp_curve *c, const eqp_solution *w, const titrant *t, double v, double pH,
                    double dpH, const eqp_result *r, const eqp_titration *spec)
{
  double row[MAX_COLS];
  row[COL_AMOUNT] = t->stock ? NAN : v;
  row[COL_VOLUME] = isnan(t->litres) ? 0 : v * t->litres;
  row[COL_TOTAL] = eqp_solution_volume(w);
  row[COL_PH] = pH;
  row[COL_DPH] = dpH;
  for (size_t k = 0; k < spec->nspecies; k++)
    eqp_result_molality(r, spec->species[k], &row[COL_SPECIES + k]);
  return eqpi_curve_push(c, row);
}

typedef struct slope_at { eqp_solution *w; const eqp_solution *base; const titrant *t; } slope_at;

/* -|dpH/dv| at v, for the minimiser. */
static int neg_slope(void *ud, double v, double *f)
{
  slope_at *a = ud;
  double pH, d;
  int rc = state_at(a->w, a->base, a->t, v, &pH, &d, NULL);
  *f = -fabs(d);
  return rc;
}

/* The largest |dpH/dv| in [lo, hi] by Brent's minimiser: its place, pH and
** slope. */
static int refine(eqp_solution *w, const eqp_solution *base, const titrant *t, double lo,
                  double hi, double *vbest, double *pHbest, double *dbest)
{
  slope_at a = {w, base, t};
  int rc = eqpi_brent_min(neg_slope, &a, lo, hi, 1e-11, 100, vbest, NULL);
  if (rc < 0) return rc;
  rc = state_at(w, base, t, *vbest, pHbest, dbest, NULL);
  *dbest = fabs(*dbest);
  return rc;
}

typedef struct until_ud {
  eqp_solution *w;
  const eqp_solution *base;
  const titrant *t;
  double target;
} until_ud;

/* pH - target at v units of titrant, the sealed headspace following. */
static int sealed_miss(void *ud, double v, double *f)
{
  until_ud *u = ud;
  for (int c = 0; c < u->w->ntotal; c++) u->w->total[c] = u->base->total[c] + v * u->t->a[c];
  u->w->water_kg = u->base->water_kg + v * u->t->w;
  eqp_result *r;
  int rc = eqpi_solution_equilibrate(u->w, &r);
  if (rc < 0) return rc;
  *f = eqp_result_pH(r) - u->target;
  eqp_result_free(r);
  return 0;
}

/* The amount of titrant in [v, v + h] that brings the pH to the target:
** one solve with the H+ activity fixed and the amount unknown; for a sealed
** solution (whose gases partition around each solve), Brent's method on
** its equilibria, the pH monotone in the titrant over the step. */
static int until_at(eqp_solution *w, const eqp_solution *base, const titrant *t, double v,
                    double h, double pH_target, double *vend)
{
  if (w->head) {
    until_ud u = {w, base, t, pH_target};
    double fa, fb;
    int rc = sealed_miss(&u, v, &fa);
    if (rc == EQP_OK) rc = sealed_miss(&u, v + h, &fb);
    if (rc == EQP_OK) rc = eqpi_brent_root(sealed_miss, &u, v, v + h, fa, fb, 0.0, 200, vend);
    if (rc == EQPI_BRENT_MAXIT) rc = EQP_OK;
    return rc > -1000 ? rc : eqpi_fail(w->ctx, EQP_E_CONVERGE, "titration: the end at pH %g "
                                       "was not found in the last step", pH_target);
  }
  eqpi_adjust aj = {.N0 = base->total, .a = t->a, .W0 = base->water_kg, .w = t->w, .T = base->T,
                    .model = &w->model, .pH = pH_target, .v0 = v, .vmin = v, .vmax = v + h,
                    .what = "the titrant", .vmax_text = "the last step", .kind = EQPI_ADJ_PH};
  eqpi_solve_stats st;
  int k = 0;
  return eqpi_solution_adjust(w, &aj, 1, vend, &st, &k, "titration");
}

/* The lowest |slope| of the rows on one side of row i (dir -1 or +1), up to
** the first row steeper than peak or the end of the curve. */
static double flank_min(const eqp_curve *c, size_t i, int dir, double peak)
{
  size_t nc = (size_t)c->ncols;
  double m = INFINITY;
  for (size_t k = dir < 0 ? i - 1 : i + 1; k < c->nrows; k = dir < 0 ? k - 1 : k + 1) {
    double d = fabs(c->v[k * nc + COL_DPH]);
    if (d > peak) break;
    m = fmin(m, d);
    if (k == 0) break;
  }
  return m;
}

/* Sharpness of a maximum: its slope over the higher of its two flank minima
** (the prominence of the peak, as a ratio). */
static double sharpness(const eqp_curve *c, size_t i, double peak)
{
  double col = fmax(flank_min(c, i, -1, peak), flank_min(c, i, +1, peak));
  return col > 0 ? peak / col : INFINITY;
}

/* Equivalence points: the interior maxima of |dpH/dv| on the rows, refined
** between their neighbours, kept when sharp enough. A row maximum whose
** sharpness on the rows is below 1.1 (solver noise on a flat slope, or
** inflections such as citric acid's that merge) is not refined: the step
** control samples every peak within about 2 max_dpH, so refining cannot lift
** it to EQP_EQ_MIN_SHARPNESS. */
static int find_equivalence(eqp_curve *c, eqp_solution *w, const eqp_solution *base,
                            const titrant *t)
{
  size_t n = c->nrows, nc = (size_t)c->ncols;
  const double *v = c->v;
  int col = t->stock ? COL_VOLUME : COL_AMOUNT;   /* the titrant's own unit */
  for (size_t i = 1; i + 1 < n; i++) {
    double di = fabs(v[i * nc + COL_DPH]);
    if (!(di > fabs(v[(i - 1) * nc + COL_DPH]) && di >= fabs(v[(i + 1) * nc + COL_DPH])))
      continue;
    if (!(sharpness(c, i, di) >= 1.1)) continue;
    double vb, pHb, db;
    int rc = refine(w, base, t, v[(i - 1) * nc + col], v[(i + 1) * nc + col], &vb, &pHb, &db);
    if (rc < 0) return rc;
    double peak = fmax(db, di), sh = sharpness(c, i, peak);
    if (!(sh >= EQP_EQ_MIN_SHARPNESS)) continue;
    eqpi_eqpoint e = {t->stock ? NAN : vb, isnan(t->litres) ? NAN : vb * t->litres, pHb, sh};
    if ((rc = eqpi_curve_push_eq(c, &e)) < 0) return rc;
  }
  return EQP_OK;
}

static int make_titrant(eqp_solution *s, const eqp_titration *spec, titrant *t)
{
  eqp_ctx *ctx = s->ctx;
  memset(t, 0, sizeof *t);
  t->a = eqpi_calloc(ctx, (size_t)s->ntotal + 1, sizeof(double));
  if (!t->a) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  if (spec->stock) {
    const eqp_solution *k = spec->stock;
    double V = eqp_solution_volume(k);
    int rc = eqpi_add_stock(s, k, 1 / V, t->a);
    if (rc < 0) return rc;
    t->w = k->water_kg / V;
    t->litres = 1;
    t->stock = 1;
    return eqpi_use_stock(s, k);          /* the titrant enters the run: its cautions */
  }
  const eqpi_reagent *r = NULL;
  int rc = eqpi_find_reagent(s, spec->reagent, &r);
  if (rc < 0 || (rc = eqpi_use_reagent(s, r)) < 0) return rc;
  eqpi_reagent_dir(s, r, t->a, &t->w, 1.0);
  t->litres = isnan(r->density) ? NAN : r->molar_mass / (1e3 * r->density);
  return EQP_OK;
}

static int check_spec(eqp_ctx *ctx, const eqp_titration *t)
{
  if (!t->reagent == !t->stock)
    return eqpi_fail(ctx, EQP_E_ARG, "a titration needs one titrant: a reagent or a stock");
  if (!(t->step > 0) || !isfinite(t->step))
    return eqpi_fail(ctx, EQP_E_INPUT, "the titration step must be positive");
  if (!(t->to > 0) && isnan(t->until_pH))
    return eqpi_fail(ctx, EQP_E_INPUT, "a titration needs an end: 'to' or 'until_pH'");
  if (t->nspecies > MAX_COLS - COL_SPECIES)
    return eqpi_fail(ctx, EQP_E_INPUT, "at most %d species columns", MAX_COLS - COL_SPECIES);
  return EQP_OK;
}

int eqp_solution_titrate(eqp_solution *s, const eqp_titration *user, eqp_curve **out)
{
  char hint[256];
  if (!s || !user || !out) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_ctx *ctx = s->ctx;
  *out = NULL;
  eqp_titration opts = EQP_TITRATION_INIT;
  const eqp_titration *spec = &opts;
  int rc = eqpi_opts_read(ctx, "eqp_titration", user, &opts, sizeof opts, EQPI_TITRATION_0_1);
  if (rc == EQP_OK) rc = check_spec(ctx, spec);
  if (rc < 0) return rc;
  if (spec->stock == s)         /* as pour refuses it: the pH would never move */
    return eqpi_fail(ctx, EQP_E_INPUT, "a solution cannot be titrated with itself");
  for (size_t k = 0; k < spec->nspecies; k++)
    if (eqpi_db_find_species(s->db, spec->species[k]) < 0)
      return eqpi_fail(ctx, EQP_E_UNKNOWN, "unknown species '%s'%s", spec->species[k],
                       eqpi_name_hint(spec->species[k], hint, sizeof hint));
  const char *names[MAX_COLS] = {"amount", "volume", "total_volume", "pH", "slope"};
  /* columns named in the ASCII form, however the species was asked for */
  for (size_t k = 0; k < spec->nspecies; k++)
    names[COL_SPECIES + k] = s->db->sp[eqpi_db_find_species(s->db, spec->species[k])].name;
  eqp_solution *base = NULL, *w = NULL;
  titrant t = {0};
  eqp_curve *c = NULL;
  if ((rc = eqp_solution_copy(s, &base)) < 0 || (rc = eqp_solution_copy(s, &w)) < 0) goto out;
  if ((rc = make_titrant(base, spec, &t)) < 0) goto out;
  c = eqpi_curve_new(ctx, COL_SPECIES + (int)spec->nspecies, names);
  if (!c) { rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"); goto out; }
  c->rho = eqpi_water_density(s->T);
  double v = 0, pH, dpH, max_dpH = spec->max_dpH > 0 ? spec->max_dpH : 0.1;
  eqp_result *r;
  if ((rc = state_at(w, base, &t, 0, &pH, &dpH, &r)) < 0) goto out;
  rc = push_row(c, w, &t, 0, pH, dpH, r, spec);
  eqp_result_free(r);
  double start = pH, end = spec->to > 0 ? spec->to : INFINITY;
  int until = !isnan(spec->until_pH);
  if (until && (spec->until_pH - start) * dpH <= 0) {
    rc = eqpi_fail(ctx, EQP_E_INPUT, "pH %.3f cannot be reached: the titrant moves the pH %s "
                   "from %.3f", spec->until_pH, dpH < 0 ? "down" : "up", start);
    goto out;
  }
  while (rc == EQP_OK && v < end * (1 - 1e-12) && c->nrows < MAX_ROWS) {
    /* at most max_dpH per step by the local slope, and never below 1/1000 of the step */
    double h = spec->step, hmin = spec->step * 1e-3;
    if (fabs(dpH) * h > max_dpH) h = fmax(max_dpH / fabs(dpH), hmin);
    if (v + h > end) h = end - v;
    double pH1, dpH1;
    if ((rc = state_at(w, base, &t, v + h, &pH1, &dpH1, &r)) < 0) break;
    /* the slope steepened within the step (a peak ahead): take it again,
    ** shorter, so that every maximum of the slope is sampled */
    while (fabs(pH1 - pH) > 2 * max_dpH && h > hmin) {
      eqp_result_free(r);
      h = fmax(h * max_dpH / fabs(pH1 - pH), hmin);
      if ((rc = state_at(w, base, &t, v + h, &pH1, &dpH1, &r)) < 0) goto out;
    }
    if (until && (pH1 - spec->until_pH) * (pH - spec->until_pH) <= 0) {
      /* crossed: finish exactly at the requested pH */
      eqp_result_free(r);
      double vend = v + h;
      if (pH1 != spec->until_pH && (rc = until_at(w, base, &t, v, h, spec->until_pH, &vend)) < 0)
        goto out;
      if ((rc = state_at(w, base, &t, vend, &pH1, &dpH1, &r)) < 0) break;
      rc = push_row(c, w, &t, vend, pH1, dpH1, r, spec);
      eqp_result_free(r);
      break;
    }
    rc = push_row(c, w, &t, v + h, pH1, dpH1, r, spec);
    eqp_result_free(r);
    eqpi_progress(ctx, "titration", isfinite(end) ? (size_t)(1000 * (v + h) / end) : c->nrows,
                  isfinite(end) ? 1000 : 0);
    v += h;
    pH = pH1;
    dpH = dpH1;
  }
  /* say what to change: the step, in the units it was given in */
  const char *unit = spec->stock ? "mL" : "mmol";
  if (rc == EQP_OK && until && c->nrows >= MAX_ROWS)
    rc = eqpi_fail(ctx, EQP_E_INPUT, "titration: pH %.3f not reached within %d rows (pH %.3f "
                   "after %.4g %s): give a larger step than %.4g %s", spec->until_pH, MAX_ROWS,
                   pH, v * 1e3, unit, spec->step * 1e3, unit);
  if (rc == EQP_OK && !until && v < end * (1 - 1e-12))
    rc = eqpi_fail(ctx, EQP_E_INPUT, "titration: %d rows reach only %.4g of the %.4g %s to add: "
                   "give a step of at least %.4g %s (it was %.4g %s)", MAX_ROWS, v * 1e3,
                   end * 1e3, unit, end * 1e3 / MAX_ROWS, unit, spec->step * 1e3, unit);
  if (rc == EQP_OK) rc = find_equivalence(c, w, base, &t);
out:
  if (t.a) eqpi_free(ctx, t.a, sizeof(double) * ((size_t)(base ? base->ntotal : 0) + 1));
  eqp_solution_free(base);
  eqp_solution_free(w);
  if (rc < 0) {
    eqp_curve_free(c);
    return rc;
  }
  *out = c;
  eqpi_observe_curve(ctx, c);
  return EQP_OK;
}
