/* Warnings a user sees: a result beyond its model's range carries a warning
** in the result and through the context's observer (also for results made
** inside recipes, comparisons, titrations and adjustments); the default
** model gives way beyond its range or refuses; a recipe whose solids take
** part of its volume says so and computes with the water that is left.
** Ranges are those docs/activity-models.md states; crystal densities from
** D. R. Lide (ed.), CRC Handbook of Chemistry and Physics, 85th ed. (2004)
** [values from memory]. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"

static eqp_ctx *ctx;

/* What the observer saw. */
static struct seen { int n; char kind[64][32]; char text[64][512]; } seen;

static void observe(void *ud, const char *kind, const char *text)
{
  struct seen *s = ud;
  if (s->n >= 64) return;
  snprintf(s->kind[s->n], sizeof s->kind[0], "%s", kind);
  snprintf(s->text[s->n++], sizeof s->text[0], "%s", text);
}

static int saw(const char *kind, const char *part)
{
  for (int i = 0; i < seen.n; i++)
    if (strcmp(seen.kind[i], kind) == 0 && (!part || strstr(seen.text[i], part))) return 1;
  return 0;
}

static int setup(void **state)
{
  ctx = test_ctx();
  eqp_ctx_set_warning_fn(ctx, observe, &seen);
  return 0;
}

static int teardown(void **state)
{
  eqp_ctx_free(ctx);
  return 0;
}

static eqp_solution *solution(const char *model, double T)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1.0;
  o.temperature_K = T;
  o.activity = model;
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  return s;
}

static int result_says(const eqp_result *r, const char *part)
{
  for (size_t i = 0; i < eqp_result_warning_count(r); i++)
    if (strstr(eqp_result_warning(r, i), part)) return 1;
  return 0;
}

/* 1.16 M NaH2PO4 + 1.16 M Na2HPO4: I = 4.6 mol/kg. Davies gave pH 8.29 with
** status ok; the extended models give 6.2-6.4. Beyond the last model of
** the default's chain (sit, 3.5 mol/kg) the default refuses. */
static void test_default_refuses_beyond_its_chain(void **state)
{
  eqp_solution *s = solution(NULL, 298.15);
  assert_int_equal(eqp_solution_add_str(s, "NaH2PO4", "1.16 mol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "Na2HPO4", "1.16 mol"), EQP_OK);
  eqp_result *r = NULL;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_E_INPUT);
  assert_null(r);
  assert_contains(eqp_ctx_errmsg(ctx), "beyond the stated range of every activity model");
  /* named, a model gives its estimate with a range warning, in the result
  ** and to the observer */
  eqp_solution *n = solution("sit", 298.15);
  eqp_solution_add_str(n, "NaH2PO4", "1.16 mol");
  eqp_solution_add_str(n, "Na2HPO4", "1.16 mol");
  seen.n = 0;
  assert_int_equal(eqp_solution_equilibrate(n, &r), EQP_OK);
  assert_true(result_says(r, "beyond the stated range of the 'sit'"));
  assert_true(saw("ionic-strength", "'sit'"));
  assert_true(eqp_result_pH(r) > 5.5 && eqp_result_pH(r) < 7);
  eqp_result_free(r);
  eqp_solution_free(n);
  eqp_solution_free(s);
}

/* Between 0.5 and 1 mol/kg the default uses bdot, exactly as if named, and
** says so; before, Davies was used beyond its range. */
static void test_default_gives_way_with_a_notice(void **state)
{
  eqp_result *rd, *rb;
  eqp_solution *d = solution(NULL, 298.15), *b = solution("bdot", 298.15);
  for (int k = 0; k < 2; k++) {
    eqp_solution *s = k ? b : d;
    assert_int_equal(eqp_solution_add_str(s, "NaCl", "0.7 mol"), EQP_OK);
    assert_int_equal(eqp_solution_add_str(s, "CH3COOH", "50 mmol"), EQP_OK);
    assert_int_equal(eqp_solution_add_str(s, "CH3COONa", "50 mmol"), EQP_OK);
  }
  seen.n = 0;
  assert_int_equal(eqp_solution_equilibrate(d, &rd), EQP_OK);
  assert_int_equal(eqp_solution_equilibrate(b, &rb), EQP_OK);
  assert_string_equal(eqp_result_activity_model(rd), "bdot");
  assert_close(eqp_result_pH(rd), eqp_result_pH(rb), 1e-12);
  assert_true(result_says(rd, "default activity model 'davies'"));
  assert_true(saw("default-model", "uses 'bdot'"));
  assert_false(result_says(rb, "default activity model"));
  eqp_result_free(rd);
  eqp_result_free(rb);
  /* diluted back into Davies' range, the default is Davies again */
  assert_int_equal(eqp_solution_dilute(d, 10), EQP_OK);
  assert_int_equal(eqp_solution_equilibrate(d, &rd), EQP_OK);
  assert_string_equal(eqp_result_activity_model(rd), "davies");
  assert_int_equal(eqp_result_warning_count(rd), 0);
  eqp_result_free(rd);
  eqp_solution_free(d);
  eqp_solution_free(b);
}

/* 2 mol of NaCl in 1 kg of water: the crystal volume is 2 x 58.44 / 2.17 =
** 53.9 mL (CRC density), 5.4 % of the water's volume. Diluted tenfold it is
** 0.54 %, below the 2 % the engine warns at. */
static void test_concentration_scale(void **state)
{
  eqp_solution *s = solution("davies", 298.15);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "2 mol"), EQP_OK);
  eqp_result *r;
  seen.n = 0;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  assert_true(result_says(r, "about 5% of the volume"));
  assert_true(saw("concentration-scale", NULL));
  eqp_result_free(r);
  eqp_solution *d = solution("davies", 298.15);
  assert_int_equal(eqp_solution_pour(d, s, 0.1), EQP_OK);
  assert_int_equal(eqp_solution_equilibrate(d, &r), EQP_OK);
  assert_false(result_says(r, "of the volume"));
  eqp_result_free(r);
  eqp_solution_free(d);
  eqp_solution_free(s);
}

/* 3 M Tris, pH 8, 1 L: I = 1.7 mol/kg and 424 g of solids. Before: warnings
** [] and "about 1000.0 mL of water in all". */
static void test_concentrated_recipe(void **state)
{
  eqp_recipe_spec sp = EQP_RECIPE_SPEC_INIT;
  sp.buffer = "Tris";
  sp.pH = 8.0;
  sp.total = 3.0;
  sp.volume = 1.0;
  sp.T = 298.15;
  eqp_recipe *r;
  seen.n = 0;
  assert_int_equal(eqp_recipe_make(ctx, &sp, &r), EQP_OK);
  assert_true(eqp_recipe_warning_count(r) >= 2);
  assert_string_equal(eqp_recipe_activity_model(r), "sit");
  assert_true(saw("default-model", "recipe for TrisHCl and Tris"));
  assert_true(saw("recipe-volume", "no density for TrisHCl"));
  assert_contains(eqp_recipe_procedure(r), "Warning: ");
  /* the water: what Tris (1.353 g/mL) leaves of the litre, TrisHCl not counted */
  double tris_g = NAN, water_mL = NAN;
  for (size_t i = 0; i < eqp_recipe_item_count(r); i++) {
    const eqp_recipe_item *it = eqp_recipe_item_at(r, i);
    if (strcmp(it->reagent, "Tris") == 0) tris_g = it->grams;
    if (it->role == EQP_ROLE_WATER) water_mL = it->mL;
  }
  assert_close(water_mL, 1000 - tris_g / 1.353, 0.5);
  assert_true(water_mL < 950);
  /* the recipe still makes its pH, in the water it states */
  assert_close(eqp_recipe_pH(r), 8.0, 1e-6);
  eqp_recipe_free(r);
}

/* 20 M phosphate in 1 L: the solids alone, at CRC crystal densities (NaH2PO4
** 119.98 g/mol / 2.36, Na2HPO4 141.96 / 1.7 g/mL), take 1.0-1.7 L. */
static void test_impossible_recipe(void **state)
{
  eqp_recipe_spec sp = EQP_RECIPE_SPEC_INIT;
  sp.buffer = "phosphate";
  sp.pH = 7.0;
  sp.total = 20.0;
  sp.volume = 1.0;
  sp.T = 298.15;
  eqp_recipe *r = NULL;
  assert_int_equal(eqp_recipe_make(ctx, &sp, &r), EQP_E_INPUT);
  assert_null(r);
  assert_contains(eqp_ctx_errmsg(ctx), "cannot be made");
}

/* An adjustment has no result: its warnings go to the observer. */
static void test_adjustment_warns(void **state)
{
  eqp_solution *s = solution("davies", 298.15);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "0.6 mol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "CH3COOH", "0.1 mol"), EQP_OK);
  double mol, L;
  seen.n = 0;
  assert_int_equal(eqp_solution_adjust_pH(s, 4.7, "NaOH", NULL, &mol, &L), EQP_OK);
  assert_true(saw("ionic-strength", "pH adjustment to 4.70 with NaOH"));
  eqp_solution_free(s);
  /* the default model: the adjustment is made with the model it gives way to */
  s = solution(NULL, 298.15);
  eqp_solution_add_str(s, "NaCl", "0.6 mol");
  eqp_solution_add_str(s, "CH3COOH", "0.1 mol");
  seen.n = 0;
  assert_int_equal(eqp_solution_adjust_pH(s, 4.7, "NaOH", NULL, &mol, &L), EQP_OK);
  assert_true(saw("default-model", "uses 'bdot'"));
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  assert_close(eqp_result_pH(r), 4.7, 1e-8);
  assert_string_equal(eqp_result_activity_model(r), "bdot");
  eqp_result_free(r);
  eqp_solution_free(s);
}

/* The points of a titration that leave the model's range are seen. */
static void test_titration_warns(void **state)
{
  eqp_solution *s = solution("davies", 298.15);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "0.45 mol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "CH3COOH", "0.1 mol"), EQP_OK);
  eqp_titration t = EQP_TITRATION_INIT;
  t.reagent = "NaOH";
  t.step = 0.01;
  t.to = 0.2;
  eqp_curve *c;
  seen.n = 0;
  assert_int_equal(eqp_solution_titrate(s, &t, &c), EQP_OK);
  assert_true(saw("ionic-strength", "'davies'"));
  eqp_curve_free(c);
  eqp_solution_free(s);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_default_refuses_beyond_its_chain),
    cmocka_unit_test(test_default_gives_way_with_a_notice),
    cmocka_unit_test(test_concentration_scale),
    cmocka_unit_test(test_concentrated_recipe),
    cmocka_unit_test(test_impossible_recipe),
    cmocka_unit_test(test_adjustment_warns),
    cmocka_unit_test(test_titration_warns),
  };
  return cmocka_run_group_tests(tests, setup, teardown);
}
