/* Tableau: species resolved onto components, active system assembly. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "system_impl.h"

static double term(const eqpi_db *db, const char *sp, const char *comp)
{
  int i = eqpi_db_find_species(db, sp), c = db->sp[eqpi_db_find_species(db, comp)].component;
  assert_true(i >= 0 && c >= 0);
  for (int t = 0; t < db->sp[i].nterm; t++)
    if (db->sp[i].term_comp[t] == c) return db->sp[i].term_nu[t];
  return 0;
}

static void test_resolution(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const eqpi_db *db = ctx->db;
  assert_close(term(db, "H3PO4", "PO4^3-"), 1, 0);
  assert_close(term(db, "H3PO4", "H+"), 3, 0);
  assert_close(term(db, "OH-", "H+"), -1, 0);
  assert_close(term(db, "OH-", "H2O"), 1, 0);
  assert_close(term(db, "TrisH+", "Tris"), 1, 0);
  assert_true(db->sp[eqpi_db_find_species(db, "PO4^3-")].component >= 0);
  assert_true(db->sp[eqpi_db_find_species(db, "HPO4^2-")].component < 0);
  eqpi_tnotes missing = {0, 0};
  /* overall constants: sums of the ladder (Goldberg et al. 2002 values in
  ** species/phosphate.lua) */
  assert_close(eqpi_species_logK(db, eqpi_db_find_species(db, "H2PO4-"), 298.15, &missing),
               12.35 + 7.198, 1e-12);
  /* reagents carry their release onto components */
  int g = eqpi_db_find_reagent(db, "NaOH");
  assert_true(g >= 0);
  assert_int_equal(db->rg[g].nterm, 3);           /* Na+ +1, H2O +1, H+ -1 */
  assert_int_equal(eqpi_db_find_reagent(db, "sodium hydroxide"), g);
  eqp_ctx_free(ctx);
}

/* Integrated van't Hoff equation against pK values computed independently
** of the engine, with the temperature equation of Goldberg, Kishore &
** Lennen, J. Phys. Chem. Ref. Data 31, 231 (2002), from their triples:
** Tris 7.753 at 37 C, phosphate pK2 7.183 at 37 C, acetic acid 4.779 at 0 C. */
static void test_vant_hoff(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const eqpi_db *db = ctx->db;
  eqpi_tnotes miss = {0, 0};
  assert_close(eqpi_species_logK(db, eqpi_db_find_species(db, "TrisH+"), 310.15, &miss), 7.753,
               0.0015);
  double k2 = eqpi_species_logK(db, eqpi_db_find_species(db, "H2PO4-"), 310.15, &miss) -
              eqpi_species_logK(db, eqpi_db_find_species(db, "HPO4^2-"), 310.15, &miss);
  assert_close(k2, 7.183, 0.0015);
  assert_close(eqpi_species_logK(db, eqpi_db_find_species(db, "CH3COOH"), 273.15, &miss), 4.779,
               0.0015);
  assert_int_equal(miss.missing, 0);
  /* both phthalic steps have temperature functions: nothing missing;
  ** cacodylic acid's pK has no temperature data: counted as missing */
  eqpi_species_logK(db, eqpi_db_find_species(db, "HPhthalate-"), 310.15, &miss);
  eqpi_species_logK(db, eqpi_db_find_species(db, "H2Phthalate"), 310.15, &miss);
  assert_int_equal(miss.missing, 0);
  eqpi_species_logK(db, eqpi_db_find_species(db, "HCacodylate"), 310.15, &miss);
  assert_int_equal(miss.missing, 1);
  eqp_ctx_free(ctx);
}

static void test_active_system(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const eqpi_db *db = ctx->db;
  double *tot = calloc((size_t)db->ncomp, sizeof *tot);
  int na = db->sp[eqpi_db_find_species(db, "Na+")].component;
  int po4 = db->sp[eqpi_db_find_species(db, "PO4^3-")].component;
  int h = db->sp[db->h_plus].component;
  tot[na] = 0.02;
  tot[po4] = 0.01;
  tot[h] = 0.01;            /* 10 mmol Na2HPO4 in 1 kg */
  eqpi_model model;
  assert_int_equal(eqpi_model_open(ctx, "ideal", &model), EQP_OK);
  eqpi_system *sys = NULL;
  eqpi_solve_stats st;
  assert_int_equal(eqpi_system_solve(ctx, db, &sys, tot, 298.15, &model, &st), EQP_OK);
  assert_int_equal(sys->tab->nc, 3);                   /* H+, PO4^3-, Na+ */
  assert_int_equal(sys->tab->ns, 7);                   /* water itself is not a solute */
  assert_int_equal(sys->prob->nx, 2);                   /* Na+ is a spectator */
  assert_int_equal(sys->prob->n, 3);                    /* plus ln I */
  /* same components again: the structure and KINSOL instance are reused */
  void *kmem = sys->ws->kmem;
  tot[na] = 0.021;          /* + 1 mmol NaOH: Na+ up, H+ down */
  tot[h] = 0.009;
  assert_int_equal(eqpi_system_solve(ctx, db, &sys, tot, 298.15, &model, &st), EQP_OK);
  assert_ptr_equal(sys->ws->kmem, kmem);
  /* a new component rebuilds it */
  tot[db->sp[eqpi_db_find_species(db, "Cl-")].component] = 0.001;   /* + 1 mmol HCl */
  tot[h] += 0.001;
  assert_int_equal(eqpi_system_solve(ctx, db, &sys, tot, 298.15, &model, &st), EQP_OK);
  assert_int_equal(sys->tab->nc, 4);
  /* a negative total is refused */
  tot[na] = -0.5;
  assert_int_equal(eqpi_system_solve(ctx, db, &sys, tot, 298.15, &model, &st), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "total of Na+ is negative");
  eqpi_system_free(ctx, sys);
  eqpi_model_close(ctx, &model);
  free(tot);
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_resolution),
    cmocka_unit_test(test_vant_hoff),
    cmocka_unit_test(test_active_system),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
