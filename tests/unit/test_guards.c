/* No non-finite number reaches a user as a result: overflowing amounts,
** non-finite constants and dilutions are refused with the solution left as
** it was, and the verification of a solve treats any non-finite residual
** as a failure. (Guards of the engine itself: no published values.) */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "solution_impl.h"
#include "system_impl.h"

static eqp_ctx *ctx;

static int setup(void **state)
{
  ctx = test_ctx();
  return 0;
}

static int teardown(void **state)
{
  eqp_ctx_free(ctx);
  return 0;
}

static eqp_solution *new_solution(double water_kg)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = water_kg;
  o.temperature_K = 298.15;
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  return s;
}

/* 1e308 mol of NaCl in 100 g: the molality overflows. Before the guard the
** solve reported pH nan with status ok. */
static void test_overflowing_amount_is_refused(void **state)
{
  eqp_solution *s = new_solution(0.1);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "0.1 mol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "1e308 mol"), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "overflows");
  /* nothing already there is lost: the 0.1 mol stays, the water too */
  double na;
  assert_int_equal(eqp_solution_total(s, "Na+", &na), EQP_OK);
  assert_close(na, 0.1, 1e-15);
  assert_close(eqp_solution_water(s), 0.1, 1e-15);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  assert_true(isfinite(eqp_result_pH(r)));
  eqp_result_free(r);
  /* a finite total whose sum overflows: two halves of DBL_MAX */
  assert_int_equal(eqp_solution_add(s, "NaCl", 1.7e308, EQP_Q_AMOUNT), EQP_E_INPUT);
  eqp_solution_free(s);
}

/* A finite but absurd total (1e6 mol NaCl per kg) is not a solution. */
static void test_absurd_molality_is_refused(void **state)
{
  eqp_solution *s = new_solution(1.0);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "1e6 mol"), EQP_OK);
  eqp_result *r = NULL;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_E_INPUT);
  assert_null(r);
  assert_contains(eqp_ctx_errmsg(ctx), "mol per kg of water");
  eqp_solution_free(s);
}

static void test_dilute_and_pour_stay_finite(void **state)
{
  eqp_solution *s = new_solution(1.0), *stock = new_solution(1.0);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "0.1 mol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(stock, "HCl", "0.1 mol"), EQP_OK);
  assert_int_equal(eqp_solution_dilute(s, 1e308), EQP_E_INPUT);
  assert_int_equal(eqp_solution_dilute(s, INFINITY), EQP_E_INPUT);
  assert_int_equal(eqp_solution_dilute(s, NAN), EQP_E_INPUT);
  assert_close(eqp_solution_water(s), 1.0, 0);
  assert_int_equal(eqp_solution_pour(s, stock, 1e308), EQP_E_INPUT);
  assert_int_equal(eqp_solution_pour(s, stock, INFINITY), EQP_E_INPUT);
  assert_close(eqp_solution_water(s), 1.0, 0);
  double cl;
  assert_int_equal(eqp_solution_total(s, "Cl-", &cl), EQP_OK);
  assert_close(cl, 0.1, 1e-15);
  /* an ordinary dilution and pour still work */
  assert_int_equal(eqp_solution_dilute(s, 2), EQP_OK);
  assert_int_equal(eqp_solution_pour(s, stock, 0.01), EQP_OK);
  assert_true(isfinite(eqp_solution_water(s)));
  eqp_solution_free(s);
  eqp_solution_free(stock);
}

/* pKa = 0/0 in a species file is a data error naming the file and line;
** before, the acid was dropped silently. */
static void test_nan_constant_is_a_data_error(void **state)
{
  static const char text[] =
    "return {\n"
    "  sources = { x = 'invented for the test' },\n"
    "  species = { { 'HQq', formula = 'C2H2O2' }, { 'Qq-', formula = 'C2HO2-' } },\n"
    "  acids = { { 'HQq', 'Qq-', pKa = 0/0, source = 'x' } },\n"
    "}\n";
  eqp_ctx *c = eqp_ctx_new(NULL, NULL);
  assert_int_equal(eqp_ctx_load_species_dir(c, getenv("EQUIPOISE_SPECIES_PATH")), EQP_OK);
  assert_int_equal(eqp_ctx_load_species_text(c, text, sizeof text - 1, "nan.lua"), EQP_E_DATA);
  assert_contains(eqp_ctx_errmsg(c), "nan.lua:4");
  assert_contains(eqp_ctx_errmsg(c), "pKa");
  /* also in a ladder of several steps */
  static const char text2[] =
    "return {\n"
    "  sources = { x = 'invented for the test' },\n"
    "  species = { { 'H2Qq', formula = 'C2H3O2+' }, { 'HQq', formula = 'C2H2O2' },\n"
    "              { 'Qq-', formula = 'C2HO2-' } },\n"
    "  acids = { { 'H2Qq', 'HQq', 'Qq-', pKa = { 2, 0/0 }, source = 'x' } },\n"
    "}\n";
  assert_int_equal(eqp_ctx_load_species_text(c, text2, sizeof text2 - 1, "nan2.lua"),
                   EQP_E_DATA);
  assert_contains(eqp_ctx_errmsg(c), "not a number");
  eqp_ctx_free(c);
}

/* White box: a NaN residual in the first row must not be hidden by the
** finite rows after it (the running maximum used !(r <= w)). */
static void test_verify_sees_nan_in_any_row(void **state)
{
  eqp_solution *s = new_solution(1.0);
  assert_int_equal(eqp_solution_add_str(s, "CH3COOH", "0.01 mol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "NaOH", "0.005 mol"), EQP_OK);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  eqp_result_free(r);
  eqpi_system *sys = s->sys;
  int worst;
  double ok = eqpi_sys_verify(sys, sys->u_last, &worst);
  assert_true(ok <= EQPI_VERIFY_TOL);
  for (int k = 0; k < sys->prob->nx; k++) {
    double keep = sys->prob->tot[sys->prob->xcomp[k]];
    sys->prob->tot[sys->prob->xcomp[k]] = NAN;
    double bad = eqpi_sys_verify(sys, sys->u_last, &worst);
    if (!(bad > EQPI_VERIFY_TOL)) fail_msg("row %d: NaN total verified as %g", k, bad);
    assert_int_equal(worst, k);
    sys->prob->tot[sys->prob->xcomp[k]] = keep;
  }
  eqp_solution_free(s);
}

/* The limiting law's gamma falls without bound, so its equations also have
** a root near I = 350 mol/kg made of water's own ions. An adjustment once
** landed there (pH "reached" at 0.00977 mol HNO3 for 0.00704 mol NaOH);
** the physical answer is the equivalence amount, and a fresh solve must
** agree with the adjustment. */
static void test_no_root_beyond_100_mol_kg(void **state)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1;
  o.temperature_K = 295.37880888942414;
  o.activity = "dh-limiting";
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_add(s, "NaOH", 0.007037991967981886, EQP_Q_AMOUNT), EQP_OK);
  double mol, L;
  assert_int_equal(eqp_solution_adjust_pH(s, 6.8943157391050782, "HNO3", NULL, &mol, &L),
                   EQP_OK);
  /* near neutral the acid matches the base (independent: charge balance
  ** with m(H+) and m(OH-) below 1e-6 mol/kg) */
  assert_close(mol, 0.007037991967981886, 2e-6);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  assert_close(eqp_result_pH(r), 6.8943157391050782, 1e-8);
  assert_true(eqp_result_ionic_strength(r) < 0.01);
  eqp_result_free(r);
  eqp_solution_free(s);
}

/* A buffer and the reagents on the shelf name one system. buffer =
** "phosphate" with using = { "Tris", "HCl" } printed a Tris recipe, the
** phosphate silently dropped. Forms of the same system from other salts or
** as hydrates (the documented example) are the same buffer. */
static void test_recipe_using_must_make_its_buffer(void **state)
{
  const char *tris[] = {"Tris", "HCl"}, *potassium[] = {"KH2PO4", "K2HPO4"},
             *hydrates[] = {"NaH2PO4.H2O", "Na2HPO4.7H2O"}, *salts[] = {"NaCl", "KCl"};
  eqp_recipe_spec sp = EQP_RECIPE_SPEC_INIT;
  sp.buffer = "phosphate";
  sp.reagents = tris;
  sp.nreagents = 2;
  sp.pH = 7.2;
  sp.total = 0.05;
  eqp_recipe *r = NULL;
  assert_int_equal(eqp_recipe_make(ctx, &sp, &r), EQP_E_INPUT);
  assert_null(r);
  assert_non_null(strstr(eqp_ctx_errmsg(ctx), "does not make the buffer 'phosphate'"));
  sp.reagents = salts;   /* Na+ is no acid or base: the sodium salts share no system */
  assert_int_equal(eqp_recipe_make(ctx, &sp, &r), EQP_E_INPUT);
  sp.reagents = potassium;
  assert_int_equal(eqp_recipe_make(ctx, &sp, &r), EQP_OK);
  eqp_recipe_free(r);
  sp.reagents = hydrates;
  assert_int_equal(eqp_recipe_make(ctx, &sp, &r), EQP_OK);
  eqp_recipe_free(r);
  sp.buffer = "Tris";
  sp.reagents = tris;
  sp.pH = 8.0;
  assert_int_equal(eqp_recipe_make(ctx, &sp, &r), EQP_OK);
  eqp_recipe_free(r);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_overflowing_amount_is_refused),
    cmocka_unit_test(test_absurd_molality_is_refused),
    cmocka_unit_test(test_dilute_and_pour_stay_finite),
    cmocka_unit_test(test_nan_constant_is_a_data_error),
    cmocka_unit_test(test_verify_sees_nan_in_any_row),
    cmocka_unit_test(test_no_root_beyond_100_mol_kg),
    cmocka_unit_test(test_recipe_using_must_make_its_buffer),
  };
  return cmocka_run_group_tests(tests, setup, teardown);
}
