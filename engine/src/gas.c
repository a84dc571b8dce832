/* Open to a gas: the amount of a gas that dissolves (or leaves) until its
** dissolved species has the activity Henry's law gives at the partial
** pressure, a(X) = K_H p. a(X) rises monotonically with the amount of X,
** so the amount is found by bracketing with ordinary solves. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include "system_impl.h"
#include <math.h>
#include <string.h>

static eqpi_gas *find_gas(eqpi_db *db, const char *name)
{
  int i = eqpi_db_find_gas(db, name);
  return i < 0 ? NULL : &db->gases[i];
}

/* ln a(X) of the solution with v mol of X added to the totals N0. The
** warnings of the bracketing's solves are not shown, those of the last
** (show) are: it is the state the solution is left in. */
static int lna_at(eqp_solution *s, const double *N0, const double *a, double v, int x,
                  double *lna, int show)
{
  for (int c = 0; c < s->ntotal; c++) s->total[c] = N0[c] + v * a[c];
  eqp_result *r;
  s->ctx->quiet += !show;
  int rc = eqpi_solution_equilibrate(s, &r);
  s->ctx->quiet -= !show;
  if (rc < 0) return rc;
  double act;
  eqp_result_activity(r, s->ctx->db.sp[x].name, &act);
  eqp_result_free(r);
  *lna = act > 0 ? log(act) : -INFINITY;
  return EQP_OK;
}

int eqp_solution_expose(eqp_solution *s, const char *gas, double p_atm, double *mol)
{
  if (!s || !gas) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_ctx *ctx = s->ctx;
  eqpi_db *db = &ctx->db;
  eqpi_gas *g = find_gas(db, gas);
  if (!g) return eqpi_fail(ctx, EQP_E_UNKNOWN, "unknown gas '%s'", gas);
  if (!(p_atm > 0) || !isfinite(p_atm) || p_atm > 100)
    return eqpi_fail(ctx, EQP_E_INPUT, "partial pressure of %s must be above 0 and at most 100 "
                     "atm", gas);
  g->used = 1;   /* its K_H joins the provenance of the run */
  eqpi_tnotes notes = {0, 0};
  double target = EQPI_LN10 * eqpi_reaction_logK(&g->kh, s->T, &notes) + log(p_atm);
  int rc = EQP_OK;
  size_t n = (size_t)s->ntotal + 1;
  double *a = eqpi_calloc(ctx, n, sizeof(double)), *N0 = eqpi_calloc(ctx, n, sizeof(double));
  if (!a || !N0) { rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"); goto out; }
  const eqpi_species *x = &db->sp[g->species];
  int water = db->sp[db->water].component, hplus = db->sp[db->h_plus].component;
  for (int t = 0; t < x->nterm; t++)
    if (x->term_comp[t] != water) a[x->term_comp[t]] = x->term_nu[t];
  memcpy(N0, s->total, sizeof(double) * (size_t)s->ntotal);
  /* the gas can leave only what the solution holds: no total but H+'s may
  ** go negative */
  double lo = -INFINITY;
  for (int c = 0; c < s->ntotal; c++)
    if (c != hplus && a[c] > 0) lo = fmax(lo, -N0[c] / a[c]);
  if (!isfinite(lo)) lo = 0;
  double scale = fmax(1e-9 * s->water_kg, fabs(lo) * 1e-12);
  lo += scale;                                 /* a trace stays, so every species exists */
  double flo, fhi, hi = fmax(1e-6 * s->water_kg, 2 * scale);
  if ((rc = lna_at(s, N0, a, lo, g->species, &flo, 0)) < 0) goto out;
  flo -= target;
  if ((rc = lna_at(s, N0, a, hi, g->species, &fhi, 0)) < 0) goto out;
  fhi -= target;
  for (int k = 0; fhi < 0 && k < 60; k++) {
    lo = hi;
    flo = fhi;
    hi *= 4;
    if (hi > 20 * s->water_kg) {
      rc = eqpi_fail(ctx, EQP_E_INPUT, "%s at %g atm would need more than 20 mol per kg of "
                     "water", gas, p_atm);
      goto out;
    }
    if ((rc = lna_at(s, N0, a, hi, g->species, &fhi, 0)) < 0) goto out;
    fhi -= target;
  }
  if (flo > 0) {      /* even the trace is above the target: nothing left to lose */
    hi = lo;
  } else {
    for (int it = 0; it < 200 && hi - lo > 1e-15 * fmax(fabs(hi), fabs(lo)); it++) {
      double mid = 0.5 * (lo + hi), f;
      if ((rc = lna_at(s, N0, a, mid, g->species, &f, 0)) < 0) goto out;
      if (f - target < 0) lo = mid;
      else hi = mid;
    }
  }
  double fend;
  if ((rc = lna_at(s, N0, a, hi, g->species, &fend, 1)) < 0) goto out;
  if (mol) *mol = hi;
out:
  if (rc < 0 && N0) memcpy(s->total, N0, sizeof(double) * (size_t)s->ntotal);
  eqpi_free(ctx, a, n * sizeof(double));
  eqpi_free(ctx, N0, n * sizeof(double));
  return rc;
}
