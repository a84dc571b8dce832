/* The default activity model, safe beyond its range: a solution that names
** no model is solved with Davies; when its ionic strength is beyond the
** range Davies is stated for, the next model of the chain whose stated range
** covers it is used instead, with a notice in the result; beyond the last,
** the solve is refused (docs/activity-models.md). */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

const char *const eqpi_default_chain[EQPI_DEFAULT_CHAIN] = {"davies", "bdot", "sit"};

/* A missing plugin leaves the chain shorter, not an error: the message of
** the failed open is not the caller's. */
static void chain_open(eqp_solution *s, int k)
{
  char *keep = eqpi_malloc(s->ctx, EQPI_ERRLEN);
  int code = s->ctx->errcode;
  if (keep) memcpy(keep, s->ctx->errmsg, EQPI_ERRLEN);
  s->chain_state[k] = eqpi_model_open(s->ctx, eqpi_default_chain[k], &s->chain[k]) == EQP_OK
                        ? 1 : -1;
  if (keep) memcpy(s->ctx->errmsg, keep, EQPI_ERRLEN);
  s->ctx->errcode = code;
  eqpi_free(s->ctx, keep, EQPI_ERRLEN);
}

eqpi_model *eqpi_chain_model(eqp_solution *s, int k)
{
  if (k == 0) return &s->model;
  if (k < 0 || k >= EQPI_DEFAULT_CHAIN) return NULL;
  if (s->chain_state[k] == 0) chain_open(s, k);
  return s->chain_state[k] > 0 ? &s->chain[k] : NULL;
}

void eqpi_chain_close(eqp_solution *s)
{
  for (int k = 1; k < EQPI_DEFAULT_CHAIN; k++)
    if (s->chain_state[k] > 0) eqpi_model_close(s->ctx, &s->chain[k]);
  memset(s->chain_state, 0, sizeof s->chain_state);
}

int eqpi_chain_choice(eqp_solution *s, double I, int k)
{
  for (; k >= 0 && k < EQPI_DEFAULT_CHAIN; k++) {
    const eqpi_model *m = eqpi_chain_model(s, k);
    if (!m) continue;
    double Imax = m->desc->max_ionic_strength;
    if (!(Imax > 0) || I <= Imax * (1 + 1e-6)) return k;
  }
  return -1;
}

int eqpi_chain_refuse(eqp_solution *s, double I, const char *what)
{
  char ranges[160];
  size_t used = 0;
  ranges[0] = '\0';
  for (int k = 0; k < EQPI_DEFAULT_CHAIN && used < sizeof ranges; k++) {
    const eqpi_model *m = eqpi_chain_model(s, k);
    if (m)
      used += (size_t)snprintf(ranges + used, sizeof ranges - used, "%s%s <= %g", k ? ", " : "",
                               m->desc->name, m->desc->max_ionic_strength);
  }
  eqpi_system_forget(s->sys);
  return eqpi_fail(s->ctx, EQP_E_INPUT, "%s: the ionic strength, %.3g mol/kg, is beyond the "
                   "stated range of every activity model the default may use (%s mol/kg); "
                   "name a model with activity = \"...\" to get an extrapolated estimate, "
                   "which then carries a range warning", what, I, ranges);
}

/* Totals in mol/kg of water and the mask of the components present,
** refusing amounts no model here describes. */
static int molalities(eqp_solution *s, double *mol, unsigned char *mask)
{
  eqp_ctx *ctx = s->ctx;
  int bad = 0;                       /* one pass without exits, then the message */
  int rc = eqpi_system_molalities(ctx, s->db, s->total, s->water_kg, mol, mask, &bad);
  for (int c = 0; bad && c < s->ntotal; c++) {
    if (!(fabs(mol[c]) <= EQPI_MAX_MOLALITY))
      return eqpi_fail(ctx, EQP_E_INPUT, "the total of %s is %g mol per kg of water, beyond "
                       "%g mol/kg: not an aqueous solution any activity model here describes",
                       s->db->sp[s->db->comp_species[c]].name, mol[c], EQPI_MAX_MOLALITY);
  }
  return rc;
}

/* One adjustment with the model of aj: with the solids s allows, when any,
** coupled to the targets in each solve (precipitate.c). */
static int adjust_once(eqp_solution *s, eqpi_adjust *aj, int n, double *v, eqpi_solve_stats *st,
                       const char *what)
{
  if (eqpi_solution_any_solid(s)) return eqpi_precipitate_adjust(s, aj, n, v, st, what);
  return eqpi_system_adjust(s->ctx, s->db, &s->sys, aj, n, v, st);
}

int eqpi_solution_adjust(eqp_solution *s, eqpi_adjust *aj, int n, double *v, eqpi_solve_stats *st,
                         int *k, const char *what)
{
  if (s->head) return eqpi_head_refuse(s, what);
  int rc = adjust_once(s, aj, n, v, st, what);
  while (rc == EQP_OK && s->model_default) {
    double I = eqpi_system_ionic_strength(s->sys);
    int next = eqpi_chain_choice(s, I, *k);
    if (next == *k) break;
    if (next < 0) {
      char msg[160];
      snprintf(msg, sizeof msg, "%s with the default activity model", what);
      return eqpi_chain_refuse(s, I, msg);
    }
    eqpi_model *m = eqpi_chain_model(s, *k = next);
    for (int j = 0; j < n; j++) aj[j].model = m;
    rc = adjust_once(s, aj, n, v, st, what);
  }
  return rc;
}

int eqpi_solution_equilibrate_from(eqp_solution *s, int *kp, int follow, eqp_result **out,
                                   eqpi_solve_stats *stout)
{
  eqp_ctx *ctx = s->ctx;
  if (eqpi_solution_grow(s) < 0) return eqp_ctx_errcode(ctx);   /* a total per component */
  double stack[128];
  unsigned char maskstack[128];
  size_t bytes = (sizeof(double) + 1) * (size_t)s->ntotal;
  double *mol = s->ntotal <= 128 ? stack : eqpi_malloc(ctx, bytes);
  if (!mol) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  unsigned char *mask = mol == stack ? maskstack : (unsigned char *)(mol + s->ntotal);
  eqpi_solve_stats st = {0};
  int k = *kp, rc = molalities(s, mol, mask);
  eqpi_model *model = eqpi_chain_model(s, k);
  if (rc == EQP_OK && !model)
    rc = eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s' is not available",
                   eqpi_default_chain[k]);
  /* solids allowed to form: the active set over the totals (the default
  ** is none, so nothing of it runs); a sealed vessel's gases partition
  ** around it (headspace.c) */
  double *amt = NULL;
  size_t amt_bytes = sizeof(double) * (size_t)(s->db->nsolids > 0 ? s->db->nsolids : 1);
  int any = eqpi_solution_any_solid(s);
  double wfrac = 1;      /* the water the solids leave in solution */
  if (rc == EQP_OK && any && !(amt = eqpi_malloc(ctx, amt_bytes)))
    rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  if (rc == EQP_OK)
    rc = s->head ? eqpi_headspace_solve(s, mol, model, &st, amt, &wfrac)
                 : eqpi_system_solve_mask(ctx, s->db, &s->sys, mol, mask, s->T, model, &st);
  while (rc == EQP_OK && s->model_default && follow) {
    double I = eqpi_system_ionic_strength(s->sys);
    int next = eqpi_chain_choice(s, I, k);
    if (next == k) break;
    if (next < 0) {
      rc = eqpi_chain_refuse(s, I, "default activity model");
      break;
    }
    k = next;
    model = eqpi_chain_model(s, k);
    rc = s->head ? eqpi_headspace_solve(s, mol, model, &st, amt, &wfrac)
                 : eqpi_system_solve(ctx, s->db, &s->sys, mol, s->T, model, &st);
  }
  if (rc == EQP_OK && any && !s->head) rc = eqpi_precipitate(s, mol, model, &st, amt, &wfrac);
  if (mol != stack) eqpi_free(ctx, mol, bytes);
  if (rc == EQP_OK) {
    st.solute_L = s->solute_L;
    st.unknown_g = s->unknown_g;
    st.replaced = k > 0 && s->model_default ? s->model.desc : NULL;
    *kp = k;
    if (stout) *stout = st;
    rc = eqpi_result_make(ctx, s->db, s->sys, model, s->T, s->water_kg * wfrac, &st,
                          any || s->head != NULL, out);
    if (rc == EQP_OK && amt &&
        (rc = eqpi_result_set_solids(*out, amt, s->db->nsolids, s->water_kg)) < 0) {
      eqp_result_free(*out);
      *out = NULL;
    }
    if (rc == EQP_OK && s->head && (rc = eqpi_headspace_result(s, *out)) < 0) {
      eqp_result_free(*out);
      *out = NULL;
    }
  }
  eqpi_free(ctx, amt, amt_bytes);
  return rc;
}
