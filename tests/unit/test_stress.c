/* Random recipes, 1e-10 to 5 mol/kg, strong acid to strong base: every
** solve converges with closed balances or fails with a message; never a
** crash, never a result that does not verify. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"

static unsigned long long rng = 0x9e3779b97f4a7c15ULL;

static double uniform(void)
{
  rng ^= rng << 13;
  rng ^= rng >> 7;
  rng ^= rng << 17;
  return (double)(rng >> 11) / 9007199254740992.0;
}

static void test_random_recipes(void **state)
{
  static const char *const reagents[] = {
    "HCl", "HNO3", "NaOH", "KOH", "NaCl", "KCl", "CH3COOH", "CH3COONa", "H3PO4", "NaH2PO4",
    "Na2HPO4", "Na3PO4", "KH2PO4", "K2HPO4", "Tris", "TrisHCl", "KHP", "NaHCO3", "Na2CO3",
    "CO2", "HEPES", "MESNa", "CaCl2", "MgCl2", "Na3Cit", "H3BO3", "Gly", "Im",
  };
  const int nr = (int)(sizeof reagents / sizeof reagents[0]);
  eqp_ctx *ctx = test_ctx();
  int ok = 0, failed = 0, N = getenv("EQP_STRESS_N") ? atoi(getenv("EQP_STRESS_N")) : 3000;
  for (int t = 0; t < N; t++) {
    eqp_solution_opts o = {1, 298.15, uniform() < 0.5 ? "ideal" : "davies"};
    eqp_solution *s;
    assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
    int k = 1 + (int)(uniform() * 3);
    double total = 0;
    char recipe[512];
    size_t used = (size_t)snprintf(recipe, sizeof recipe, "%s:", o.activity);
    for (int j = 0; j < k; j++) {
      double mol = pow(10, -10 + uniform() * 10.7);   /* 1e-10 .. 5 */
      if (total + mol > 5) mol = 5 - total;
      total += mol;
      const char *g = reagents[(int)(uniform() * nr)];
      assert_int_equal(eqp_solution_add(s, g, mol, EQP_Q_AMOUNT), EQP_OK);
      if (used < sizeof recipe)
        used += (size_t)snprintf(recipe + used, sizeof recipe - used, " %s %.17g mol", g, mol);
    }
    eqp_result *r;
    int rc = eqp_solution_equilibrate(s, &r);
    if (rc == EQP_OK) {
      ok++;
      if (!(eqp_result_residual(r) <= 1e-10) || !isfinite(eqp_result_pH(r)))
        fail_msg("recipe %d: residual %g pH %g", t, eqp_result_residual(r), eqp_result_pH(r));
      eqp_result_free(r);
    } else {
      failed++;
      assert_true(rc == EQP_E_CONVERGE || rc == EQP_E_VERIFY);
      assert_true(strlen(eqp_ctx_errmsg(ctx)) > 20);
      printf("  recipe %d (%s) refused: %s\n", t, recipe, eqp_ctx_errmsg(ctx));
    }
    eqp_solution_free(s);
  }
  printf("  %d random recipes: %d solved and verified, %d refused with a message\n", N, ok,
         failed);
  /* refusals are allowed, but should be rare */
  assert_true(failed <= N / 100);
  eqp_ctx_free(ctx);
}

/* Random pH adjustments: each either reaches its target exactly (checked by
** a fresh solve) or is refused as out of reach, with a message. */
static void test_random_adjustments(void **state)
{
  static const char *const start[] = {"CH3COONa", "NaH2PO4", "TrisHCl", "KHP", "HCl", "NaOH",
                                      "Na2HPO4", "Tris"};
  static const char *const titrant[] = {"HCl", "NaOH", "KOH", "HNO3", "CH3COOH", "Tris"};
  eqp_ctx *ctx = test_ctx();
  int reached = 0, refused = 0, N = getenv("EQP_STRESS_N") ? atoi(getenv("EQP_STRESS_N")) / 8 : 400;
  for (int t = 0; t < N; t++) {
    eqp_solution_opts o = {1, 278.15 + 40 * uniform(), uniform() < 0.5 ? "ideal" : "davies"};
    eqp_solution *s;
    assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
    eqp_solution_add(s, start[(int)(uniform() * 8)], pow(10, -4 + 3.5 * uniform()), EQP_Q_AMOUNT);
    double target = 2 + 10 * uniform(), mol, L;
    const char *g = titrant[(int)(uniform() * 6)];
    int rc = eqp_solution_adjust_pH(s, target, g, NULL, &mol, &L);
    if (rc == EQP_OK) {
      eqp_result *r;
      assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
      if (!(fabs(eqp_result_pH(r) - target) < 1e-8))
        fail_msg("adjust %d with %s to %.3f gave %.10f", t, g, target, eqp_result_pH(r));
      assert_true(mol >= 0);
      eqp_result_free(r);
      reached++;
    } else {
      if (rc != EQP_E_INPUT) fail_msg("adjust %d: %s", t, eqp_ctx_errmsg(ctx));
      assert_contains(eqp_ctx_errmsg(ctx), "out of reach");
      refused++;
    }
    eqp_solution_free(s);
  }
  printf("  %d random adjustments: %d reached their pH, %d refused as out of reach\n", N,
         reached, refused);
  eqp_ctx_free(ctx);
}

int main(void)
{
  if (getenv("EQP_STRESS_SEED")) rng ^= strtoull(getenv("EQP_STRESS_SEED"), NULL, 10) * 0x2545F4914F6CDD1DULL;
  const struct CMUnitTest tests[] = {cmocka_unit_test(test_random_recipes),
                                     cmocka_unit_test(test_random_adjustments)};
  return cmocka_run_group_tests(tests, NULL, NULL);
}
