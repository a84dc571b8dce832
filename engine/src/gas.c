/* Open to a gas: the amount of a gas that dissolves (or leaves) until its
** dissolved species X has the activity Henry's law gives at the partial
** pressure, a(X) = K_H p: one solve with the amount of X an unknown and
** a(X) held fixed (adjust.c), the amount an output. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define EQPI_GAS_P_WARN 2.0   /* atm, as for a sealed headspace (result.c) */

static const eqpi_gas *find_gas(const eqpi_db *db, const char *name)
{
  int i = eqpi_db_find_gas(db, name);
  return i < 0 ? NULL : &db->gases[i];
}

int eqp_solution_expose(eqp_solution *s, const char *gas, double p_atm, double *mol)
{
  if (!s || !gas) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_ctx *ctx = s->ctx;
  if (s->head) return eqpi_head_refuse(s, "exposure to a gas");
  const eqpi_db *db = s->db;
  const eqpi_gas *g = find_gas(db, gas);
  if (!g) return eqpi_fail(ctx, EQP_E_UNKNOWN, "unknown gas '%s'", gas);
  if (!(p_atm > 0) || !isfinite(p_atm) || p_atm > 100)
    return eqpi_fail(ctx, EQP_E_INPUT, "partial pressure of %s must be above 0 and at most 100 "
                     "atm", gas);
  eqpi_gas_used(ctx, g->name);   /* its K_H joins the provenance of the run */
  eqpi_tnotes notes = {0, 0};
  double lnKH = EQPI_LN10 * eqpi_reaction_logK(&g->kh, s->T, &notes);
  int rc = EQP_OK;
  size_t n = (size_t)s->ntotal + 1;
  double *a = eqpi_calloc(ctx, n, sizeof(double));
  if (!a) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  int hplus = db->sp[db->h_plus].component;
  eqpi_db_add_composition(db, g->species, 1, a, s->ntotal);
  /* the gas can leave only what the solution holds: no total but H+'s may
  ** go negative, and a trace stays, so every species exists */
  double lo = -INFINITY;
  int holds = 1;
  for (int c = 0; c < s->ntotal; c++)
    if (c != hplus && a[c] > 0) {
      lo = fmax(lo, -s->total[c] / a[c]);
      holds &= s->total[c] > 0;
    }
  if (!isfinite(lo)) lo = 0;
  double trace = fmax(1e-9 * s->water_kg, fabs(lo) * 1e-12);
  char limit[96];
  snprintf(limit, sizeof limit, "20 mol per kg of water");
  eqpi_adjust aj = {.N0 = s->total, .a = a, .W0 = s->water_kg, .T = s->T, .model = &s->model,
                    .vmin = lo + trace, .vmax = 20 * s->water_kg, .what = gas,
                    .vmax_text = limit, .kind = EQPI_ADJ_ACTIVITY, .species = g->species,
                    .value = exp(lnKH) * p_atm, .floor_ok = 1};
  aj.v0 = holds && lo + trace < 0 ? 0 : aj.vmin;
  double v;
  eqpi_solve_stats st = {0};
  int k = 0;
  char what[160];
  snprintf(what, sizeof what, "exposure to %s", gas);
  ctx->quiet++;
  rc = eqpi_solution_adjust(s, &aj, 1, &v, &st, &k, what);
  ctx->quiet--;
  if (rc == EQP_E_INPUT && strstr(eqp_ctx_errmsg(ctx), "out of reach"))
    rc = eqpi_fail(ctx, EQP_E_INPUT, "%s at %g atm would need more than 20 mol per kg of water",
                   gas, p_atm);
  if (rc == EQP_OK) {
    for (int c = 0; c < s->ntotal; c++) s->total[c] += v * a[c];
    if (mol) *mol = v;
    /* Henry's law is a low-pressure law, and a constant has the
    ** temperatures its source measured: beyond either, say so */
    char w[400];
    if (p_atm > EQPI_GAS_P_WARN) {
      snprintf(w, sizeof w, "%s at %.3g atm: beyond %g atm Henry's law with an ideal gas loses "
               "accuracy (no fugacity or pressure correction here; CO2 liquefies near 64 atm at "
               "25 C); work under pressure needs a rated vessel and local practice", gas, p_atm,
               EQPI_GAS_P_WARN);
      eqpi_warn(ctx, "pressure", w);
    }
    if (notes.outside || notes.missing) {
      snprintf(w, sizeof w, "Henry's law constant of %s used %s, at %.2f C", gas,
               notes.missing ? "without temperature data (its 25 C value)"
                             : "outside the temperature range its source states", s->T - 273.15);
      eqpi_warn(ctx, "temperature", w);
    }
    /* the state the solution is left in: its warnings reach the observer */
    eqp_result *r;
    rc = eqpi_solution_equilibrate_from(s, &k, 1, &r, NULL);
    eqp_result_free(r);
  }
  eqpi_free(ctx, a, n * sizeof(double));
  return rc;
}
