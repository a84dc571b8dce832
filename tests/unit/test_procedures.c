/* Bench operations against closed forms: buffer capacity (Van Slyke),
** titration curves, pH adjustment, conservation through a procedure. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

static eqp_ctx *ctx;
static double Kw;                     /* IAPWS R11-07 at 25 C (test_water.c) */
static const double Ka = 1.7538805018417602e-05;   /* 10^-4.756, species/acetate.lua */

static eqp_solution *make(const char *model, double water)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = water;
  o.temperature_K = 298.15;
  o.activity = model;
  eqp_solution *s;
  if (eqp_solution_new(ctx, &o, &s) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return s;
}

static double pH_of(eqp_solution *s)
{
  eqp_result *r;
  if (eqp_solution_equilibrate(s, &r) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  double pH = eqp_result_pH(r);
  eqp_result_free(r);
  return pH;
}

/* Van Slyke (D. D. Van Slyke, J. Biol. Chem. 52, 525 (1922)), ideal
** solution, monoprotic acid of total C: beta = ln10 (h + Kw/h + C Ka h/(Ka + h)^2). */
static void test_van_slyke(void **state)
{
  static const double ratio[] = {0.01, 0.1, 0.5, 1, 2, 10, 100};
  for (size_t i = 0; i < sizeof ratio / sizeof ratio[0]; i++) {
    eqp_solution *s = make("ideal", 1);
    double C = 0.05, ca = C / (1 + ratio[i]), cb = C - ca;
    eqp_solution_add(s, "CH3COOH", ca, EQP_Q_AMOUNT);
    eqp_solution_add(s, "CH3COONa", cb, EQP_Q_AMOUNT);
    double h = pow(10, -pH_of(s)), bkg, bL;
    assert_int_equal(eqp_solution_buffer_capacity(s, &bL, &bkg), EQP_OK);
    double vs = log(10) * (h + Kw / h + C * Ka * h / ((Ka + h) * (Ka + h)));
    assert_rel(bkg, vs, 1e-6);
    assert_rel(bL, bkg * eqp_water_density(298.15), 1e-12);
    eqp_solution_free(s);
  }
}

/* Phosphate with Davies: the implicit derivative against an independent
** central difference of two full solves. */
static void beta_vs_difference(const char *acid, const char *base)
{
  eqp_solution *s = make("davies", 1);
  eqp_solution_add_str(s, acid, "25 mmol");
  eqp_solution_add_str(s, base, "25 mmol");
  double bkg;
  assert_int_equal(eqp_solution_buffer_capacity(s, NULL, &bkg), EQP_OK);
  /* one-sided, second order: NaOH cannot be taken away, and HCl would
  ** add a salt effect of its own */
  const double d = 1e-6;
  eqp_solution *p, *m;
  eqp_solution_copy(s, &p);
  eqp_solution_copy(s, &m);
  eqp_solution_add(p, "NaOH", d, EQP_Q_AMOUNT);
  eqp_solution_add(m, "NaOH", 2 * d, EQP_Q_AMOUNT);
  double fd = 2 * d / (-3 * pH_of(s) + 4 * pH_of(p) - pH_of(m));
  printf("  %s/%s, Davies: beta %.8f (implicit) vs %.8f (difference) mol/(kg pH)\n", acid,
         base, bkg, fd);
  assert_rel(bkg, fd, 1e-5);
  eqp_solution_free(p);
  eqp_solution_free(m);
  eqp_solution_free(s);
}

static void test_phosphate_beta_vs_difference(void **state)
{
  beta_vs_difference("KH2PO4", "Na2HPO4");
  beta_vs_difference("KH2PO4", "K2HPO4");   /* no Na+ yet: NaOH brings a new ion */
}

/* Exact [H+] of a monoprotic acid system, total C, with strong cation Na and
** strong anion Cl (mol/kg), ideal: bisection on the charge balance. */
static double exact_h(double C, double Na, double Cl)
{
  double lo = 1e-15, hi = 10;
  for (int it = 0; it < 400; it++) {
    double h = sqrt(lo * hi);
    double q = h + Na - Cl - Kw / h - C * Ka / (Ka + h);
    if (q > 0) hi = h; else lo = h;
  }
  return sqrt(lo * hi);
}

/* 50 mL (as water) of 0.1 mol/kg acetic acid titrated with 0.1 mol/kg NaOH. */
static void test_weak_acid_titration(void **state)
{
  double rho = eqp_water_density(298.15), W0 = 0.05 * rho;
  eqp_solution *s = make("ideal", W0), *naoh = make("ideal", 1);
  eqp_solution_add(s, "CH3COOH", 0.1 * W0, EQP_Q_AMOUNT);
  eqp_solution_add(naoh, "NaOH", 0.1, EQP_Q_AMOUNT);
  eqp_titration t = EQP_TITRATION_INIT;
  t.stock = naoh;
  t.step = 0.5e-3;
  t.to = 80e-3;
  eqp_curve *c;
  assert_int_equal(eqp_solution_titrate(s, &t, &c), EQP_OK);
  /* every row against the exact charge balance */
  for (size_t i = 0; i < eqp_curve_rows(c); i++) {
    double V = eqp_curve_value(c, i, 1), w = V * rho, W = W0 + w;
    double h = exact_h(0.1 * W0 / W, 0.1 * w / W, 0);
    assert_rel(pow(10, -eqp_curve_value(c, i, 3)), h, 1e-9);
  }
  /* equivalence: 50 mL of 0.1 against 0.1 mol/kg is at 50 mL; within one
  ** adaptive step of the curve there */
  assert_int_equal(eqp_curve_equivalence_count(c), 1);
  double Veq, pHeq;
  eqp_curve_equivalence(c, 0, NULL, &Veq, &pHeq);
  double step = INFINITY;
  for (size_t i = 1; i < eqp_curve_rows(c); i++)
    if (eqp_curve_value(c, i, 1) >= Veq) {
      step = eqp_curve_value(c, i, 1) - eqp_curve_value(c, i - 1, 1);
      break;
    }
  printf("  equivalence at %.6f mL (stoichiometric 50 mL), local step %.4f mL, pH %.4f\n",
         Veq * 1e3, step * 1e3, pHeq);
  assert_true(fabs(Veq - 0.05) <= step);
  /* pH at equivalence: the closed form for the salt, C = 0.05 mol/kg */
  double heq = exact_h(0.05, 0.05, 0);
  assert_close(pHeq, -log10(heq), 0.01);
  eqp_solution *e;
  eqp_solution_copy(s, &e);
  eqp_solution_pour(e, naoh, 0.05);
  assert_rel(pow(10, -pH_of(e)), heq, 1e-9);
  /* half-equivalence: pH = pKa, exactly so up to the H+ and OH- terms */
  eqp_solution *hf;
  eqp_solution_copy(s, &hf);
  eqp_solution_pour(hf, naoh, 0.025);
  double hh = exact_h(0.1 * W0 / (W0 + 0.025 * rho), 0.1 * 0.025 * rho / (W0 + 0.025 * rho), 0);
  assert_rel(pow(10, -pH_of(hf)), hh, 1e-9);
  assert_close(pH_of(hf), 4.756, 0.002);
  eqp_solution_free(hf);
  eqp_solution_free(e);
  eqp_curve_free(c);
  eqp_solution_free(naoh);
  eqp_solution_free(s);
}

/* Strong acid against strong base: h - Kw/h = (Ca W0 - Cb w)/(W0 + w). */
static void test_strong_titration_closed_form(void **state)
{
  double rho = eqp_water_density(298.15), W0 = 0.025 * rho;
  eqp_solution *s = make("ideal", W0), *naoh = make("ideal", 1);
  eqp_solution_add(s, "HCl", 0.01 * W0, EQP_Q_AMOUNT);
  eqp_solution_add(naoh, "NaOH", 0.01, EQP_Q_AMOUNT);
  eqp_titration t = EQP_TITRATION_INIT;
  t.stock = naoh;
  t.step = 1e-3;
  t.to = 50e-3;
  eqp_curve *c;
  assert_int_equal(eqp_solution_titrate(s, &t, &c), EQP_OK);
  for (size_t i = 0; i < eqp_curve_rows(c); i++) {
    double w = eqp_curve_value(c, i, 1) * rho, W = W0 + w, D = (0.01 * W0 - 0.01 * w) / W;
    /* the root of h^2 - D h - Kw = 0 without cancellation on either side */
    double q = sqrt(D * D / 4 + Kw), h = D >= 0 ? D / 2 + q : Kw / (q - D / 2);
    assert_rel(pow(10, -eqp_curve_value(c, i, 3)), h, 1e-9);
  }
  double Veq;
  eqp_curve_equivalence(c, 0, NULL, &Veq, NULL);
  assert_close(Veq, 0.025, 1e-6);    /* the symmetric curve peaks at the stoichiometric point */
  eqp_curve_free(c);
  eqp_solution_free(naoh);
  eqp_solution_free(s);
}

/* adjust_pH with HCl on sodium acetate, ideal: the amount follows from the
** charge balance n = h + C - Kw/h - C Ka/(Ka + h) (per kg), to 1e-9. */
static void test_adjust_closed_form(void **state)
{
  static const double target[] = {3.5, 4.756, 6.0, 8.0};
  for (size_t i = 0; i < sizeof target / sizeof target[0]; i++) {
    eqp_solution *s = make("ideal", 1);
    eqp_solution_add(s, "CH3COONa", 0.02, EQP_Q_AMOUNT);
    double mol, L, h = pow(10, -target[i]);
    assert_int_equal(eqp_solution_adjust_pH(s, target[i], "HCl", NULL, &mol, &L), EQP_OK);
    assert_rel(mol, h + 0.02 - Kw / h - 0.02 * Ka / (Ka + h), 1e-9);
    assert_close(pH_of(s), target[i], 1e-10);      /* the addition was made */
    eqp_solution_free(s);
  }
  /* refusals: the wrong direction, and a target beyond the reagent */
  eqp_solution *s = make("ideal", 1);
  eqp_solution_add(s, "CH3COONa", 0.02, EQP_Q_AMOUNT);
  double mol, L;
  assert_int_equal(eqp_solution_adjust_pH(s, 10, "HCl", NULL, &mol, &L), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "out of reach with HCl: adding it lowers the pH");
  assert_int_equal(eqp_solution_adjust_pH(s, 1.0, "CH3COOH", NULL, &mol, &L), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "even 5 mol of CH3COOH per kg of water");
  eqp_solution_free(s);
}

/* Every component total after a chain of operations equals the sum of what
** went in, to rounding. */
static void test_conservation(void **state)
{
  double rho = eqp_water_density(298.15);
  eqp_solution *stock = make("davies", 1), *s = make("davies", 0.5);
  eqp_solution_add(stock, "Na2HPO4", 0.2, EQP_Q_AMOUNT);              /* 0.2 mol/kg */
  eqp_solution_add_str(s, "KH2PO4", "10 mmol");
  eqp_solution_pour(s, stock, 0.1);                                  /* 0.1 L of stock */
  double f = 0.1 * rho;                                              /* kg of stock water */
  eqp_solution_add_str(s, "water", "100 mL");
  eqp_solution_dilute(s, 1.5);
  double mol, L;
  assert_int_equal(eqp_solution_adjust_pH(s, 7.0, "HCl", NULL, &mol, &L), EQP_OK);
  eqp_solution *parts[2] = {s, stock};
  double litres[2] = {eqp_solution_volume(s), 0.05};
  eqp_solution *m;
  assert_int_equal(eqp_solution_mix(2, parts, litres, &m), EQP_OK);
  double g = 0.05 * rho;
  double P, Na, K, Cl, H;
  eqp_solution_total(m, "PO4^3-", &P);
  eqp_solution_total(m, "Na+", &Na);
  eqp_solution_total(m, "K+", &K);
  eqp_solution_total(m, "Cl-", &Cl);
  eqp_solution_total(m, "H+", &H);
  assert_rel(P, 0.010 + 0.2 * f + 0.2 * g, 1e-14);
  assert_rel(Na, 0.4 * f + 0.4 * g, 1e-14);
  assert_rel(K, 0.010, 1e-14);
  assert_rel(Cl, mol, 1e-14);
  assert_rel(H, 0.020 + 0.2 * f + mol + 0.2 * g, 1e-14);
  double water = (0.5 + f + 0.1 * rho) * 1.5 + g;
  assert_rel(eqp_solution_water(m), water, 1e-14);
  eqp_solution_free(m);
  eqp_solution_free(s);
  eqp_solution_free(stock);
}

/* Pure water open to air: Henry's law and the carbonic-acid constants from
** the equations of L. N. Plummer, E. Busenberg, Geochim. Cosmochim. Acta 46,
** 1011 (1982) (evaluated here from their published form, log10 T and all),
** and the charge balance h^3 - (K1 a + Kw) h - 2 K1 K2 a = 0 with
** a = K_H p, ideal activities; to 1e-9 in [H+]. pCO2 = 426.9 uatm: the
** Mauna Loa monthly mean of May 2024, 426.9 umol/mol of dry air (NOAA
** Global Monitoring Laboratory and Scripps Institution of Oceanography). */
static void test_water_open_to_air(void **state)
{
  const double T = 298.15, p = 426.9e-6;
  double lKH = 108.3865 + 0.01985076 * T - 6919.53 / T - 40.45154 * log10(T) + 669365 / (T * T);
  double lK1 = -356.3094 - 0.06091964 * T + 21834.37 / T + 126.8339 * log10(T) - 1684915 / (T * T);
  double lK2 = -107.8871 - 0.03252849 * T + 5151.79 / T + 38.92561 * log10(T) - 563713.9 / (T * T);
  double a = pow(10, lKH) * p, K1 = pow(10, lK1), K2 = pow(10, lK2);
  double lo = 1e-9, hi = 1e-3;
  for (int it = 0; it < 300; it++) {
    double h = sqrt(lo * hi), f = h * h * h - (K1 * a + Kw) * h - 2 * K1 * K2 * a;
    if (f > 0) hi = h; else lo = h;
  }
  eqp_solution *s = make("ideal", 1);
  double mol;
  assert_int_equal(eqp_solution_expose(s, "CO2(g)", p, &mol), EQP_OK);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  printf("  pure water under %.1f uatm CO2: pH %.4f, %.3g mol/kg taken up\n", p * 1e6,
         eqp_result_pH(r), mol);
  assert_rel(pow(10, -eqp_result_pH(r)), sqrt(lo * hi), 1e-9);
  double act;
  eqp_result_activity(r, "CO2", &act);
  assert_rel(act, a, 1e-9);
  eqp_result_free(r);
  eqp_solution_free(s);
  /* a bicarbonate solution opened to air loses CO2 and its pH rises */
  s = make("davies", 1);
  eqp_solution_add_str(s, "NaHCO3", "10 mmol");
  double pH0 = pH_of(s);
  assert_int_equal(eqp_solution_expose(s, "CO2(g)", p, &mol), EQP_OK);
  assert_true(mol < 0);
  assert_true(pH_of(s) > pH0 + 0.5);
  assert_int_equal(eqp_solution_expose(s, "N2O(g)", p, &mol), EQP_E_UNKNOWN);
  eqp_solution_free(s);
}

/* Saturation index of calcite: log10(a(Ca^2+) a(CO3^2-)) - log Ksp(T), with
** log Ksp from the published equation of Plummer & Busenberg (1982),
** evaluated here: -171.9065 - 0.077993 T + 2839.319/T + 71.595 log10 T. */
static void test_saturation_index(void **state)
{
  static const double Ts[] = {298.15, 323.15};
  for (int k = 0; k < 2; k++) {
    double T = Ts[k];
    eqp_result *r = test_solve(ctx, "davies", T, "CaCl2", "2 mmol", "NaHCO3", "4 mmol",
                               "NaOH", "1 mmol", NULL);
    double aCa, aCO3, si;
    eqp_result_activity(r, "Ca^2+", &aCa);
    eqp_result_activity(r, "CO3^2-", &aCO3);
    assert_int_equal(eqp_result_saturation(r, "calcite", &si), EQP_OK);
    double lKsp = -171.9065 - 0.077993 * T + 2839.319 / T + 71.595 * log10(T);
    assert_close(si, log10(aCa * aCO3) - lKsp, 1e-10);
    eqp_result_free(r);
  }
  eqp_result *r = test_solve(ctx, "ideal", 298.15, "NaCl", "1 mmol", NULL);
  double si;
  assert_int_equal(eqp_result_saturation(r, "calcite", &si), EQP_OK);
  assert_true(isinf(si) && si < 0);           /* no calcium: -inf */
  assert_int_equal(eqp_result_saturation(r, "quartz", &si), EQP_E_UNKNOWN);
  eqp_result_free(r);
}

int main(void)
{
  ctx = test_ctx();
  Kw = pow(10, -eqpi_water_pKw(298.15));
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_van_slyke),
    cmocka_unit_test(test_phosphate_beta_vs_difference),
    cmocka_unit_test(test_weak_acid_titration),
    cmocka_unit_test(test_strong_titration_closed_form),
    cmocka_unit_test(test_adjust_closed_form),
    cmocka_unit_test(test_conservation),
    cmocka_unit_test(test_water_open_to_air),
    cmocka_unit_test(test_saturation_index),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
