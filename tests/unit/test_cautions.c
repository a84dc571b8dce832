/* Safety cautions: a hazardous reagent is recorded once per context,
** whichever way it enters a solution, under its library name (an alias is
** the same reagent); a stock carries what it holds into what it is poured
** or mixed into. The caution names the GHS hazard classes of the species
** file and the usual precautions (common practice), and defers to the
** safety data sheet. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"

static eqp_solution *water(eqp_ctx *ctx)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 0.1;
  o.temperature_K = 298.15;
  eqp_solution *s;
  if (eqp_solution_new(ctx, &o, &s) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return s;
}

/* Exactly one caution, for reagent, mentioning needle. */
static void one_caution(const eqp_ctx *ctx, const char *reagent, const char *needle)
{
  for (size_t i = 0; i < eqp_ctx_caution_count(ctx); i++)
    print_message("caution: %s\n", eqp_ctx_caution(ctx, i));
  assert_int_equal(eqp_ctx_caution_count(ctx), 1);
  assert_string_equal(eqp_ctx_caution_reagent(ctx, 0), reagent);
  assert_contains(eqp_ctx_caution(ctx, 0), needle);
  assert_contains(eqp_ctx_caution(ctx, 0), "safety data sheet");
}

static void test_add_and_alias(void **state)
{
  eqp_ctx *ctx = test_ctx();
  eqp_solution *s = water(ctx);
  assert_int_equal(eqp_solution_add_str(s, "KCl", "1 mmol"), EQP_OK);     /* no hazard */
  assert_int_equal(eqp_ctx_caution_count(ctx), 0);
  assert_int_equal(eqp_solution_add_str(s, "HCl", "1 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "hydrochloric acid", "1 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "HCl", "1 mmol"), EQP_OK);
  one_caution(ctx, "HCl", "HCl (hydrochloric acid): skin corrosion, serious eye damage");
  /* a corrosive acid: the common-practice dilution rule */
  assert_contains(eqp_ctx_caution(ctx, 0), "add it slowly to water, never water to it");
  assert_int_equal(eqp_solution_hazard_count(s), 1);
  assert_string_equal(eqp_solution_hazard_reagent(s, 0), "HCl");
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
}

static void test_adjust(void **state)
{
  eqp_ctx *ctx = test_ctx();
  eqp_solution *s = water(ctx);
  assert_int_equal(eqp_solution_add_str(s, "KH2PO4", "5 mmol"), EQP_OK);
  double mol, L;
  assert_int_equal(eqp_solution_adjust_pH(s, 7.0, "sodium hydroxide", NULL, &mol, &L), EQP_OK);
  one_caution(ctx, "NaOH", "skin corrosion");
  assert_int_equal(eqp_solution_hazard_count(s), 1);
  /* an adjustment that cannot be made adds nothing and records nothing */
  assert_int_equal(eqp_solution_adjust_pH(s, 3.0, "KOH", NULL, &mol, &L), EQP_E_INPUT);
  assert_int_equal(eqp_ctx_caution_count(ctx), 1);
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
}

static void test_titrate(void **state)
{
  eqp_ctx *ctx = test_ctx();
  eqp_solution *s = water(ctx);
  assert_int_equal(eqp_solution_add_str(s, "KH2PO4", "5 mmol"), EQP_OK);
  eqp_titration t = EQP_TITRATION_INIT;
  t.reagent = "KOH";
  t.step = 0.5e-3;
  t.to = 2e-3;
  eqp_curve *c;
  assert_int_equal(eqp_solution_titrate(s, &t, &c), EQP_OK);
  eqp_curve_free(c);
  one_caution(ctx, "KOH", "toxic if swallowed");
  assert_int_equal(eqp_solution_hazard_count(s), 0);     /* s itself is not changed */
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
}

static void test_stock_pour_mix(void **state)
{
  eqp_ctx *ctx = test_ctx();
  eqp_solution *stock = water(ctx), *s = water(ctx), *m;
  assert_int_equal(eqp_solution_add_str(stock, "HNO3", "10 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "KH2PO4", "5 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_pour(s, stock, 0), EQP_OK);            /* nothing poured */
  assert_int_equal(eqp_solution_hazard_count(s), 0);
  assert_int_equal(eqp_solution_pour(s, stock, 1e-3), EQP_OK);
  assert_int_equal(eqp_solution_hazard_count(s), 1);
  assert_string_equal(eqp_solution_hazard_reagent(s, 0), "HNO3");
  eqp_solution *parts[2] = {s, stock};
  double litres[2] = {0.01, 0.001};
  assert_int_equal(eqp_solution_mix(2, parts, litres, &m), EQP_OK);
  assert_int_equal(eqp_solution_hazard_count(m), 1);
  eqp_solution *c;
  assert_int_equal(eqp_solution_copy(m, &c), EQP_OK);
  assert_int_equal(eqp_solution_hazard_count(c), 1);
  one_caution(ctx, "HNO3", "oxidizing liquid");
  assert_contains(eqp_ctx_caution(ctx, 0), "combustible");
  eqp_solution_free(c);
  eqp_solution_free(m);
  eqp_solution_free(s);
  eqp_solution_free(stock);
  eqp_ctx_free(ctx);
}

static void test_recipe(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const char *using[2] = {"Tris", "HCl"};
  eqp_recipe_spec sp = EQP_RECIPE_SPEC_INIT;
  sp.reagents = using;
  sp.nreagents = 2;
  sp.pH = 8.0;
  sp.total = 0.05;
  sp.volume = 0.1;
  sp.T = 298.15;
  sp.titrant_molar = 1.0;
  eqp_recipe *r;
  assert_int_equal(eqp_recipe_make(ctx, &sp, &r), EQP_OK);
  assert_int_equal(eqp_ctx_caution_count(ctx), 2);
  assert_string_equal(eqp_ctx_caution_reagent(ctx, 0), "Tris");
  assert_string_equal(eqp_ctx_caution_reagent(ctx, 1), "HCl");
  assert_contains(eqp_recipe_procedure(r), "Caution: HCl (hydrochloric acid): skin corrosion");
  assert_contains(eqp_recipe_procedure(r), "Caution: Tris (Tris base): skin irritation");
  assert_int_equal(eqp_solution_hazard_count(eqp_recipe_solution(r)), 2);
  eqp_recipe_free(r);
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_add_and_alias),
    cmocka_unit_test(test_adjust),
    cmocka_unit_test(test_titrate),
    cmocka_unit_test(test_stock_pour_mix),
    cmocka_unit_test(test_recipe),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
