/* Adjustments to targets (pH, activity, free molality, ionic strength) in
** one solve, and a component held at a fixed activity with a counter-ion
** balancing the charge, against closed forms of the same equations. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

static eqp_ctx *ctx;
static double Kw;                     /* IAPWS R11-07 at 25 C (test_water.c) */

static eqp_solution *make(const char *model)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = model;
  eqp_solution *s;
  if (eqp_solution_new(ctx, &o, &s) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return s;
}

static eqp_result *solve(eqp_solution *s)
{
  eqp_result *r;
  if (eqp_solution_equilibrate(s, &r) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return r;
}

/* EGTA at I = 0 from the constants at I = 0.1 mol/L of R. M. Smith, A. E.
** Martell, NIST Critically Selected Stability Constants of Metal Complexes
** (NIST SRD 46): pK 9.40, 8.79, 2.70, 2.00 and log K(CaL) 10.86, converted
** with the Davies equation at I = 0.1, A = 0.5108 (the conversion
** species/chelators.lua states); Ca^2+ + OH- = CaOH+, log K 1.30 (F. G. R.
** Gimblett, C. B. Monk, Trans. Faraday Soc. 50, 965 (1954)). */
static double davies_f(void) { double r = sqrt(0.1); return r / (1 + r) - 0.3 * 0.1; }
static double pK0(double pK, double z) { return pK + 0.5108 * davies_f() * ((z - 1) * (z - 1) + 1 - z * z); }

/* How much CaCl2 gives 1 umol/kg of free Ca^2+ in 10 mmol/kg EGTA at pH 7.2
** with 100 mmol/kg KCl, the pH held with KOH: both amounts in one solve.
** Ideal activities, so that the closed form below is the same model: with
** h and the free Ca fixed, L = T_L / (sum_j beta_j h^j + K_CaL Ca), and the
** totals of Ca and of the protons follow. */
static void test_free_calcium_in_egta(void **state)
{
  eqp_solution *s = make("ideal");
  assert_int_equal(eqp_solution_add_str(s, "H4EGTA", "10 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "KCl", "100 mmol"), EQP_OK);
  eqp_target t[2] = {EQP_TARGET_INIT, EQP_TARGET_INIT};
  t[0].value = 7.2;
  t[0].reagent = "KOH";
  t[1].kind = EQP_TARGET_FREE;
  t[1].species = "Ca^2+";
  t[1].value = 1e-6;
  t[1].reagent = "CaCl2";
  assert_int_equal(eqp_solution_adjust(s, t, 2), EQP_OK);
  /* the closed form */
  double pK[4] = {pK0(9.40, -3), pK0(8.79, -2), pK0(2.70, -1), pK0(2.00, 0)};
  double h = pow(10, -7.2), Ca = 1e-6, TL = 0.01, beta = 1, sum = 1, protons = 0;
  double KCaL = pow(10, 10.86 + 0.5108 * davies_f() * (4 + 16 - 4));
  double hj[5] = {1};
  for (int j = 1; j <= 4; j++) {
    beta *= pow(10, pK[j - 1]);
    hj[j] = beta * pow(h, j);
    sum += hj[j];
  }
  double L = TL / (sum + KCaL * Ca), CaOH = pow(10, 1.30) * Ca * Kw / h;
  for (int j = 1; j <= 4; j++) protons += j * hj[j] * L;
  double TCa = Ca + KCaL * Ca * L + CaOH;
  /* protons: 4 per H4EGTA, less one per KOH, equal those of the species */
  double KOH = 4 * TL - (h - Kw / h + protons - CaOH);
  printf("  CaCl2 %.9g mol (closed form %.9g), KOH %.9g mol (closed form %.9g)\n", t[1].mol,
         TCa, t[0].mol, KOH);
  assert_rel(t[1].mol, TCa, 1e-9);
  assert_rel(t[0].mol, KOH, 1e-9);
  eqp_result *r = solve(s);
  assert_close(eqp_result_pH(r), 7.2, 1e-9);
  assert_rel(test_m(r, "Ca^2+"), 1e-6, 1e-9);
  eqp_result_free(r);
  eqp_solution_free(s);
  /* Davies: a fresh solve of what was added meets both targets */
  s = make("davies");
  eqp_solution_add_str(s, "H4EGTA", "10 mmol");
  eqp_solution_add_str(s, "KCl", "100 mmol");
  assert_int_equal(eqp_solution_adjust(s, t, 2), EQP_OK);
  r = solve(s);
  assert_close(eqp_result_pH(r), 7.2, 1e-9);
  assert_rel(test_m(r, "Ca^2+"), 1e-6, 1e-9);
  eqp_result_free(r);
  eqp_solution_free(s);
}

/* NaCl to an ionic strength in water (ideal): I = x + sqrt(Kw) with x the
** molality of the salt, closed form. And an activity target: a(Na+) by
** NaCl, a = x (ideal). */
static void test_ionic_strength_and_activity(void **state)
{
  eqp_solution *s = make("ideal");
  eqp_target t = EQP_TARGET_INIT;
  t.kind = EQP_TARGET_IONIC_STRENGTH;
  t.value = 0.05;
  t.reagent = "NaCl";
  assert_int_equal(eqp_solution_adjust(s, &t, 1), EQP_OK);
  assert_rel(t.mol, 0.05 - sqrt(Kw), 1e-10);
  assert_true(isnan(t.litres));                     /* a solid */
  eqp_solution_free(s);
  s = make("ideal");
  eqp_target a = EQP_TARGET_INIT;
  a.kind = EQP_TARGET_ACTIVITY;
  a.species = "Na+";
  a.value = 0.02;
  a.reagent = "NaCl";
  assert_int_equal(eqp_solution_adjust(s, &a, 1), EQP_OK);
  assert_rel(a.mol, 0.02, 1e-10);
  /* a target the reagent moves the wrong way, and one too far */
  a.value = 0.01;
  assert_int_equal(eqp_solution_adjust(s, &a, 1), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "out of reach with NaCl");
  eqp_target bad = a;
  bad.kind = EQP_TARGET_FREE;
  bad.value = 0.1;
  eqp_target two[2] = {bad, bad};
  two[1].reagent = NULL;
  assert_int_equal(eqp_solution_adjust(s, two, 2), EQP_E_ARG);
  bad.species = "Xx+";
  assert_int_equal(eqp_solution_adjust(s, &bad, 1), EQP_E_UNKNOWN);
  eqp_target zero = {0};
  assert_int_equal(eqp_solution_adjust(s, &zero, 1), EQP_E_ARG);   /* not from INIT */
  eqp_solution_free(s);
}

/* pH 3 held in pure water with Cl- balancing the charge (ideal): the
** totals of H+ and Cl- are h - Kw/h each (charge balance h = Cl + Kw/h).
** The same with HCl as an adjustment gives the same amount. */
static void test_fixed_activity(void **state)
{
  eqp_solution *s = make("ideal");
  double dH, dCl, h = 1e-3;
  assert_int_equal(eqp_solution_fix_activity(s, "H+", h, "Cl-", &dH, &dCl), EQP_OK);
  assert_rel(dCl, h - Kw / h, 1e-12);
  assert_rel(dH, h - Kw / h, 1e-12);
  eqp_result *r = solve(s);
  assert_close(eqp_result_pH(r), 3, 1e-10);
  eqp_result_free(r);
  eqp_solution_free(s);
  s = make("ideal");
  double mol, L;
  assert_int_equal(eqp_solution_adjust_pH(s, 3, "HCl", NULL, &mol, &L), EQP_OK);
  assert_rel(mol, h - Kw / h, 1e-10);
  eqp_solution_free(s);
  /* lowering the pH of water with Na+ as the counter-ion would need a
  ** negative total of Na+: refused */
  s = make("ideal");
  assert_int_equal(eqp_solution_fix_activity(s, "H+", 1e-3, "Na+", NULL, NULL), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "Na+");
  assert_int_equal(eqp_solution_fix_activity(s, "CH3COOH", 1e-3, "Na+", NULL, NULL),
                   EQP_E_INPUT);
  eqp_solution_free(s);
}

/* Free Ca^2+ held in an EDTA solution (Davies) two ways: its row a fixed
** activity with Cl- balancing the charge, or CaCl2 as an adjustment to the
** same activity; the same composition either way. */
static void test_fixed_activity_two_ways(void **state)
{
  eqp_solution *s = make("davies"), *t = make("davies");
  eqp_solution_add_str(s, "Na2H2EDTA", "10 mmol");
  eqp_solution_add_str(t, "Na2H2EDTA", "10 mmol");
  double dCa, dCl;
  assert_int_equal(eqp_solution_fix_activity(s, "Ca^2+", 1e-6, "Cl-", &dCa, &dCl), EQP_OK);
  assert_rel(dCl, 2 * dCa, 1e-10);
  eqp_target a = EQP_TARGET_INIT;
  a.kind = EQP_TARGET_ACTIVITY;
  a.species = "Ca^2+";
  a.value = 1e-6;
  a.reagent = "CaCl2";
  assert_int_equal(eqp_solution_adjust(t, &a, 1), EQP_OK);
  printf("  CaCl2 %.10g mol, fixed activity %.10g mol\n", a.mol, dCa);
  assert_rel(a.mol, dCa, 1e-8);
  eqp_result *r = solve(s);
  double act;
  eqp_result_activity(r, "Ca^2+", &act);
  assert_rel(act, 1e-6, 1e-9);
  eqp_result_free(r);
  eqp_solution_free(s);
  eqp_solution_free(t);
}

int main(void)
{
  ctx = test_ctx();
  Kw = pow(10, -eqpi_water_pKw(298.15));
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_free_calcium_in_egta),
    cmocka_unit_test(test_ionic_strength_and_activity),
    cmocka_unit_test(test_fixed_activity),
    cmocka_unit_test(test_fixed_activity_two_ways),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
