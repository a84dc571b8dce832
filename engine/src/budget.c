/* The load budget of a solution: how much acid and how much base it takes
** before its pH leaves a window around the pH it has now. Each side is an
** exact pH adjustment (eqp_solution_adjust_pH) of a copy. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include <math.h>
#include <string.h>

static int read_spec(eqp_ctx *ctx, const eqp_budget_spec *user, eqp_budget_spec *sp)
{
  const eqp_budget_spec dflt = EQP_BUDGET_SPEC_INIT;
  *sp = dflt;
  if (!user) return EQP_OK;
  int rc = eqpi_opts_read(ctx, "eqp_budget_spec", user, sp, sizeof *sp, EQPI_BUDGET_SPEC_0_1);
  if (rc < 0) return rc;
  if (!(sp->window > 0 && sp->window <= 7))
    return eqpi_fail(ctx, EQP_E_INPUT, "load budget: the window %g must be above 0 and at most "
                     "7 pH units", sp->window);
  if (!sp->acid || !sp->base) return eqpi_fail(ctx, EQP_E_ARG, "load budget: NULL reagent");
  return EQP_OK;
}

int eqp_solution_load_budget(eqp_solution *s, const eqp_budget_spec *spec, eqp_budget *out)
{
  if (!s || !out) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_ctx *ctx = s->ctx;
  eqp_budget_spec sp;
  int rc = read_spec(ctx, spec, &sp);
  if (rc < 0) return rc;
  eqp_result *r;
  if ((rc = eqpi_solution_equilibrate(s, &r)) < 0) return rc;
  double pH = eqp_result_pH(r), amount[2], litres;
  eqp_result_free(r);
  const char *reagent[2] = {sp.acid, sp.base};
  /* the first message is about the reagent, not a pH out of its reach */
  for (int k = 0; k < 2; k++) {
    int g = eqpi_db_find_reagent(s->db, reagent[k]), kind;
    if (g < 0) continue;                       /* unknown: said when it is added */
    kind = eqpi_reagent_kind(s->db, &s->db->rg[g], NULL);
    if (kind == EQPI_RG_NEUTRAL || kind == (k ? EQPI_RG_ACID : EQPI_RG_BASE))
      return eqpi_fail(ctx, EQP_E_INPUT, "load budget: %s = '%s' is %s; name %s, such as %s",
                       k ? "base" : "acid", reagent[k],
                       kind == EQPI_RG_NEUTRAL ? "neither an acid nor a base"
                       : k ? "an acid" : "a base", k ? "a base" : "an acid", k ? "NaOH" : "HCl");
  }
  for (int k = 0; k < 2; k++) {
    eqp_solution *c;
    if ((rc = eqp_solution_copy(s, &c)) < 0) return rc;
    rc = eqp_solution_adjust_pH(c, pH + (k ? sp.window : -sp.window), reagent[k], NULL,
                                &amount[k], &litres);
    eqp_solution_free(c);
    if (rc < 0) return rc;
  }
  double V = eqp_solution_volume(s);
  out->pH = pH;
  out->window = sp.window;
  out->acid_mol = amount[0];
  out->base_mol = amount[1];
  out->acid_molar = amount[0] / V;
  out->base_molar = amount[1] / V;
  return EQP_OK;
}
