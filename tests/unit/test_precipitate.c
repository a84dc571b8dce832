/* Solids that form or dissolve (precipitate.c): the active set of phases
** against independent closed forms of the same equations. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

static eqp_ctx *ctx;

/* Constants at 25 C from the published equations of L. N. Plummer,
** E. Busenberg, Geochim. Cosmochim. Acta 46, 1011 (1982), evaluated here
** (log10 T and all): carbonic K1, K2, calcite Ksp, and the ion pairs
** CaHCO3+ and CaCO3(aq); Kw from IAPWS R11-07 (test_water.c checks it);
** CaOH+ log K 1.30 at 25 C (F. G. R. Gimblett, C. B. Monk, Trans. Faraday
** Soc. 50, 965 (1954), as species/metals.lua cites it). */
typedef struct consts { double K1, K2, Ksp, Kch, Kcc, Kco, Kw; } consts;

static consts at(double T)
{
  consts k;
  double l = log10(T);
  k.K1 = pow(10, -356.3094 - 0.06091964 * T + 21834.37 / T + 126.8339 * l - 1684915 / (T * T));
  k.K2 = pow(10, -107.8871 - 0.03252849 * T + 5151.79 / T + 38.92561 * l - 563713.9 / (T * T));
  k.Ksp = pow(10, -171.9065 - 0.077993 * T + 2839.319 / T + 71.595 * l);
  k.Kch = pow(10, 1209.120 + 0.31294 * T - 34765.05 / T - 478.782 * l);
  k.Kcc = pow(10, -1228.732 - 0.299444 * T + 35512.75 / T + 485.818 * l);
  k.Kco = pow(10, 1.30);
  k.Kw = pow(10, -eqpi_water_pKw(T));
  return k;
}

/* Calcite saturated, ideal activities, with Ca0 and C0 mol/kg of calcium
** and carbonate put in (besides spectator charge q = [Na+] - [Cl-]):
** c x = Ksp; the calcium and carbon balances differ by Ca0 - C0 =
** (Ksp/x)(1 + e) - x alpha (alpha = 1 + h/K2 + h^2/(K1 K2), e = [CaOH+]/c),
** a quadratic in x for each h;
** the charge balance fixes h (bisection). Returns h, *n the precipitate. */
static double calcite_closed(consts k, double Ca0, double C0, double q, double *n)
{
  double lo = 1e-13, hi = 1e-3, D = Ca0 - C0, h = 0, x = 0, c = 0, a = 0;
  for (int it = 0; it < 400; it++) {
    h = sqrt(lo * hi);
    a = 1 + h / k.K2 + h * h / (k.K1 * k.K2);
    double e = k.Kco * k.Kw / h;
    x = (-D + sqrt(D * D + 4 * a * k.Ksp * (1 + e))) / (2 * a);
    c = k.Ksp / x;
    double hco3 = h * x / k.K2, cahco3 = k.Kch * c * hco3;
    double f = q + h + 2 * c + cahco3 + c * e - hco3 - 2 * x - k.Kw / h;
    if (f > 0) hi = h; else lo = h;
  }
  double pairs = k.Kch * c * h * x / k.K2 + k.Kcc * c * x;
  *n = C0 - x * a - pairs;
  return h;
}

static eqp_solution *make(const char *model, const char *solid)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = model;
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  if (solid) assert_int_equal(eqp_solution_allow_solids(s, &solid, 1), EQP_OK);
  return s;
}

/* Calcite in CO2-free water, closed: 10 mmol CaCO3 in 1 kg, most stays
** solid. Checked against the closed form above to 1e-8; the pH (9.90) is
** the textbook figure for calcite in CO2-free water at 25 C (W. Stumm,
** J. J. Morgan, Aquatic Chemistry, 3rd ed., Wiley 1996: pH about
** 9.9) [from memory]. */
static void test_calcite_in_water(void **state)
{
  (void)state;
  consts k = at(298.15);
  double n;
  double h = calcite_closed(k, 0.010, 0.010, 0, &n);
  eqp_solution *s = make("ideal", "calcite");
  assert_int_equal(eqp_solution_add_str(s, "CaCO3", "10 mmol"), EQP_OK);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  double mol, si, caT = 0, m;
  assert_int_equal(eqp_result_solid(r, "calcite", &mol), EQP_OK);
  assert_int_equal(eqp_result_saturation(r, "calcite", &si), EQP_OK);
  printf("  calcite in CO2-free water (ideal): pH %.4f (closed form %.4f), dissolved %.4g "
         "mol/kg, solid %.6g mol\n", eqp_result_pH(r), -log10(h), 0.010 - mol, mol);
  assert_rel(pow(10, -eqp_result_pH(r)), h, 1e-8);
  assert_rel(mol, n, 1e-8);
  assert_close(si, 0, 1e-9);
  assert_close(eqp_result_pH(r), 9.9, 0.1);
  /* the calcium balance closes with the solid in it */
  eqp_result_molality(r, "Ca^2+", &m); caT += m;
  eqp_result_molality(r, "CaHCO3+", &m); caT += m;
  eqp_result_molality(r, "CaCO3(aq)", &m); caT += m;
  eqp_result_molality(r, "CaOH+", &m); caT += m;
  assert_rel(caT + mol, 0.010, 1e-10);
  /* aragonite is less stable: it does not join */
  assert_int_equal(eqp_result_solid(r, "aragonite", &mol), EQP_OK);
  assert_close(mol, 0, 0);
  eqp_result_free(r);
  eqp_solution_free(s);
}

/* 10 mmol CaCl2 + 5 mmol Na2CO3 in 1 kg: supersaturated (SI > 2 without
** solids); with calcite allowed it precipitates what the mass balances and
** Ksp give, closed form above with q = [Na+] - [Cl-] = -10 mmol/kg. */
static void test_supersaturated_mixture(void **state)
{
  (void)state;
  consts k = at(298.15);
  double n;
  double h = calcite_closed(k, 0.010, 0.005, 0.010 - 0.020, &n);
  for (int allow = 0; allow < 2; allow++) {
    eqp_solution *s = make("ideal", allow ? "calcite" : NULL);
    assert_int_equal(eqp_solution_add_str(s, "CaCl2", "10 mmol"), EQP_OK);
    assert_int_equal(eqp_solution_add_str(s, "Na2CO3", "5 mmol"), EQP_OK);
    eqp_result *r;
    assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
    double mol, si;
    assert_int_equal(eqp_result_solid(r, "calcite", &mol), EQP_OK);
    assert_int_equal(eqp_result_saturation(r, "calcite", &si), EQP_OK);
    if (!allow) {
      assert_true(si > 2);           /* the default: no precipitation */
      assert_close(mol, 0, 0);
    } else {
      printf("  10 mM CaCl2 + 5 mM Na2CO3: %.6g mol calcite (closed form %.6g), pH %.4f\n",
             mol, n, eqp_result_pH(r));
      assert_rel(mol, n, 1e-8);
      assert_rel(pow(10, -eqp_result_pH(r)), h, 1e-8);
      assert_close(si, 0, 1e-9);
    }
    eqp_result_free(r);
    eqp_solution_free(s);
  }
}

/* Undersaturated: nothing forms; a solid that is not present reads 0. */
static void test_undersaturated(void **state)
{
  (void)state;
  eqp_solution *s = make("davies", "calcite");
  assert_int_equal(eqp_solution_add_str(s, "CaCl2", "1 mmol"), EQP_OK);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  double mol;
  assert_int_equal(eqp_result_solid(r, "calcite", &mol), EQP_OK);
  assert_close(mol, 0, 0);
  assert_int_equal(eqp_result_solid_count(r), 0);
  assert_int_equal(eqp_result_solid(r, "quartz", &mol), EQP_E_UNKNOWN);
  eqp_result_free(r);
  eqp_solution_free(s);
}

/* Unknown names are refused; all solids of the library at once keep to
** the phase rule (calcite and aragonite fix the same product: only the
** less soluble, calcite, forms). */
static void test_choice(void **state)
{
  (void)state;
  eqp_solution *s = make("davies", NULL);
  const char *bad = "calcit";
  assert_int_equal(eqp_solution_allow_solids(s, &bad, 1), EQP_E_UNKNOWN);
  assert_contains(eqp_ctx_errmsg(ctx), "calcite");
  assert_int_equal(eqp_solution_allow_all_solids(s, 1), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "CaCO3", "10 mmol"), EQP_OK);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  double cal, ara;
  eqp_result_solid(r, "calcite", &cal);
  eqp_result_solid(r, "aragonite", &ara);
  printf("  calcite in CO2-free water (Davies): dissolved %.4g mol/kg, pH %.4f\n",
         0.010 - cal, eqp_result_pH(r));
  assert_true(cal > 0.0098 && cal < 0.010);
  assert_close(ara, 0, 0);
  /* a copy keeps the choice */
  eqp_solution *c;
  assert_int_equal(eqp_solution_copy(s, &c), EQP_OK);
  eqp_result *r2;
  assert_int_equal(eqp_solution_equilibrate(c, &r2), EQP_OK);
  eqp_result_solid(r2, "calcite", &ara);
  assert_rel(ara, cal, 1e-9);
  eqp_result_free(r2);
  eqp_solution_free(c);
  /* and switched off, the default comes back: everything dissolved */
  assert_int_equal(eqp_solution_allow_all_solids(s, 0), EQP_OK);
  eqp_result_free(r);
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  assert_int_equal(eqp_result_solid_count(r), 0);
  eqp_result_free(r);
  eqp_solution_free(s);
}

int main(void)
{
  ctx = test_ctx();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_calcite_in_water),
    cmocka_unit_test(test_supersaturated_mixture),
    cmocka_unit_test(test_undersaturated),
    cmocka_unit_test(test_choice),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
