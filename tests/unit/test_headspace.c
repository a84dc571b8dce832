/* A closed headspace: the gases partition between the vessel's gas phase
** and the solution. Checked against an independent solution of the same
** equations (bisection, written here, from the published constants), the
** limits of a huge headspace (the open system at that partial pressure)
** and of a vanishing one (the closed solution), mass conservation, the
** derivative against differences of sealed equilibria, and refusals. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "pb1982.h"
#include "eqp_impl.h"

static eqp_ctx *ctx;
/* R = 8.314462618 J/(mol K) (CODATA 2018, exact), 1 atm = 101.325 J/L */
static const double R_ATM = 8.314462618 / 101.325;
/* pCO2 of the air: 426.9 umol/mol, the Mauna Loa monthly mean of May 2024
** (NOAA Global Monitoring Laboratory and Scripps Institution of Oceanography) */
static const double P_AIR = 426.9e-6;

static eqp_solution *make(const char *model, double water, double T)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = water;
  o.temperature_K = T;
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

static void seal(eqp_solution *s, double litres, const char *gas, double p)
{
  eqp_headspace h = EQP_HEADSPACE_INIT;
  const char *g[1] = {gas};
  double pp[1] = {p};
  h.litres = litres;
  h.ngases = gas ? 1 : 0;
  h.gases = g;
  h.p_atm = pp;
  if (eqp_solution_seal(s, &h) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
}

/* The carbonate constants of L. N. Plummer, E. Busenberg, Geochim.
** Cosmochim. Acta 46, 1011 (1982), evaluated here from their published
** equations (log10 T and all). */
static void pb1982(double T, double *KH, double *K1, double *K2)
{
  *KH = pow(10, pb1982_logKH(T));
  *K1 = pow(10, pb1982_logK1(T));
  *K2 = pow(10, pb1982_logK2(T));
}

/* n mol of CO2 into W kg of pure water, sealed under V L with no CO2 at
** first, ideal activities: for each h the carbon balance gives
**   a = n / (W (1 + K1/h + K1 K2/h^2) + V/(R T K_H)),
** and the charge balance h = K1 a/h + 2 K1 K2 a/h^2 + Kw/h fixes h
** (bisection on ln h, 400 halvings). Out: h, p = a/K_H. */
static void closed_form(double n, double W, double V, double T, double *h_out, double *p_out)
{
  double KH, K1, K2, Kw = pow(10, -eqpi_water_pKw(T));   /* IAPWS R11-07 (test_water.c) */
  pb1982(T, &KH, &K1, &K2);
  double lo = log(1e-12), hi = log(1), a = 0;
  for (int it = 0; it < 400; it++) {
    double x = 0.5 * (lo + hi), h = exp(x);
    a = n / (W * (1 + K1 / h + K1 * K2 / (h * h)) + V / (R_ATM * T * KH));
    double f = h - K1 * a / h - 2 * K1 * K2 * a / (h * h) - Kw / h;
    if (f > 0) hi = x; else lo = x;
  }
  double h = exp(0.5 * (lo + hi));
  a = n / (W * (1 + K1 / h + K1 * K2 / (h * h)) + V / (R_ATM * T * KH));
  *h_out = h;
  *p_out = a / KH;
}

/* (a) against the independent solution above, at 25 and 37 C, small and
** large headspaces */
static void test_closed_form(void **state)
{
  static const struct { double n, W, V, T; } c[] = {
    {1e-4, 0.010, 0.005, 298.15},   /* 10 mL of 10 mM CO2 under 5 mL */
    {1e-4, 0.010, 0.100, 298.15},   /* most of it leaves into 100 mL */
    {2e-3, 1.000, 0.250, 310.15},   /* a bottle at 37 C */
  };
  for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
    double h, p;
    closed_form(c[i].n, c[i].W, c[i].V, c[i].T, &h, &p);
    eqp_solution *s = make("ideal", c[i].W, c[i].T);
    assert_int_equal(eqp_solution_add(s, "CO2", c[i].n, EQP_Q_AMOUNT), EQP_OK);
    /* the headspace as the vessel has it: its volume at sealing */
    seal(s, c[i].V, NULL, 0);
    eqp_result *r = solve(s);
    double pg, mol;
    assert_int_equal(eqp_result_gas(r, "CO2(g)", &pg, &mol), EQP_OK);
    printf("  %g mol CO2, %g kg water, %g L headspace, %.2f C: pH %.6f (closed form %.6f), "
           "pCO2 %.6g atm (%.6g)\n", c[i].n, c[i].W, c[i].V, c[i].T - 273.15, eqp_result_pH(r),
           -log10(h), pg, p);
    assert_rel(pow(10, -eqp_result_pH(r)), h, 1e-9);
    assert_rel(pg, p, 1e-9);
    assert_rel(mol, p * c[i].V / (R_ATM * c[i].T), 1e-9);
    eqp_result_free(r);
    eqp_solution_free(s);
  }
}

/* (b) a huge headspace holding air's CO2 is the open system at that
** partial pressure (eqp_solution_expose): the difference falls as 1/V */
static void test_huge_headspace(void **state)
{
  eqp_solution *open = make("davies", 0.001, 298.15);
  eqp_solution_add_str(open, "NaHCO3", "10 umol");
  double mol;
  assert_int_equal(eqp_solution_expose(open, "CO2(g)", P_AIR, &mol), EQP_OK);
  eqp_result *ro = solve(open);
  double pH_open = eqp_result_pH(ro), last = HUGE_VAL;
  static const double Vs[] = {1e2, 1e4, 1e6};
  for (int k = 0; k < 3; k++) {
    eqp_solution *s = make("davies", 0.001, 298.15);
    eqp_solution_add_str(s, "NaHCO3", "10 umol");
    seal(s, Vs[k], "CO2(g)", P_AIR);
    eqp_result *r = solve(s);
    double d = fabs(eqp_result_pH(r) - pH_open), p;
    eqp_result_gas(r, "CO2(g)", &p, NULL);
    printf("  headspace %g L: pH %.9f, open %.9f, |diff| %.2e, pCO2 %.9g atm\n", Vs[k],
           eqp_result_pH(r), pH_open, d, p);
    assert_true(d < last / 30 || d < 1e-10);   /* about 1/V */
    last = d;
    eqp_result_free(r);
    eqp_solution_free(s);
  }
  assert_true(last < 1e-6);
  eqp_result_free(ro);
  eqp_solution_free(open);
}

/* (c) a vanishing headspace is the closed solution: the difference falls
** as V (the gas it takes, p V / R T, is first order in V) */
static void test_tiny_headspace(void **state)
{
  eqp_solution *s = make("davies", 1, 298.15);
  eqp_solution_add_str(s, "NaHCO3", "10 mmol");
  eqp_solution_add_str(s, "HCl", "5 mmol");
  eqp_result *rc = solve(s);
  double a, KH, K1, K2, last = HUGE_VAL;
  eqp_result_activity(rc, "CO2", &a);
  pb1982(298.15, &KH, &K1, &K2);
  static const double Vs[] = {1e-6, 1e-9, 1e-12};
  for (int k = 0; k < 3; k++) {
    eqp_solution *c;
    assert_int_equal(eqp_solution_copy(s, &c), EQP_OK);
    seal(c, Vs[k], NULL, 0);
    eqp_result *r = solve(c);
    double p, mol, d = fabs(eqp_result_pH(r) - eqp_result_pH(rc));
    eqp_result_gas(r, "CO2(g)", &p, &mol);
    printf("  %g L headspace: pH %.13f, closed %.13f, |diff| %.2e; pCO2 %.9g atm (a/K_H of the "
           "closed solution %.9g)\n", Vs[k], eqp_result_pH(r), eqp_result_pH(rc), d, p, a / KH);
    assert_true(d < last / 300 || d < 1e-12);
    assert_rel(p, a / KH, 1e-5);     /* what the closed solution is in equilibrium with */
    last = d;
    eqp_result_free(r);
    eqp_solution_free(c);
  }
  assert_true(last < 1e-12);
  eqp_result_free(rc);
  eqp_solution_free(s);
}

/* (d) conservation: every carbon and nitrogen added (and the headspace's
** own at sealing) is found dissolved or in the gas, to 1e-10; each gas's
** pressure is what Henry's law gives for its dissolved species. Ammonium
** bicarbonate under air (CO2, O2, N2: the gases swept together). */
static void test_conservation(void **state)
{
  eqp_solution *s = make("davies", 0.020, 298.15);
  eqp_solution_add_str(s, "NaHCO3", "0.4 mmol");
  eqp_solution_add_str(s, "NH4Cl", "0.5 mmol");
  eqp_solution_add_str(s, "NaOH", "0.3 mmol");
  /* dry air: O2 0.2095, N2 0.7808 mol/mol (common practice, rounded) */
  const char *g[3] = {"CO2(g)", "O2(g)", "N2(g)"};
  double p0[3] = {P_AIR, 0.2095, 0.7808}, V = 0.010, T = 298.15;
  eqp_headspace h = EQP_HEADSPACE_INIT;
  h.litres = V;
  h.ngases = 3;
  h.gases = g;
  h.p_atm = p0;
  assert_int_equal(eqp_solution_seal(s, &h), EQP_OK);
  for (int step = 0; step < 2; step++) {
    if (step) eqp_solution_add_str(s, "HCl", "0.6 mmol");   /* acidified through the septum */
    eqp_result *r = solve(s);
    double W = eqp_result_water(r), n0 = P_AIR * V / (R_ATM * T);
    double C = W * (test_m(r, "CO2") + test_m(r, "HCO3-") + test_m(r, "CO3^2-"));
    double N = W * (test_m(r, "NH4+") + test_m(r, "NH3"));
    double pc, mc, pn, mn, po, mo;
    eqp_result_gas(r, "CO2(g)", &pc, &mc);
    eqp_result_gas(r, "NH3(g)", &pn, &mn);
    eqp_result_gas(r, "O2(g)", &po, &mo);
    double Vnow, pt, pw;
    assert_int_equal(eqp_result_headspace(r, &Vnow, &pt, &pw), 1);
    printf("  step %d: pH %.4f, CO2 %.4g atm %.4g mol, NH3 %.4g atm %.4g mol, O2 %.4g atm, "
           "headspace %.6g mL at %.4g atm\n", step, eqp_result_pH(r), pc, mc, pn, mn, po,
           Vnow * 1e3, pt);
    assert_rel(C + mc, 0.4e-3 + n0, 1e-10);
    assert_rel(N + mn, 0.5e-3, 1e-10);
    assert_rel(W * test_m(r, "O2") + mo, 0.2095 * V / (R_ATM * T), 1e-10);
    /* Henry's law for each gas, from the library's own K_H (checked against
    ** the papers in test_procedures.c and the species files) */
    double KH, K1, K2, a;
    pb1982(T, &KH, &K1, &K2);
    eqp_result_activity(r, "CO2", &a);
    assert_rel(pc, a / KH, 1e-9);
    assert_rel(mc, pc * Vnow / (R_ATM * T), 1e-9);
    assert_true(pn > 0 && mn > 0);
    /* water vapour: W. Wagner, A. Pruss, J. Phys. Chem. Ref. Data 22, 783
    ** (1993): 3.1699 kPa at 25 C */
    assert_rel(pw, 3.1699 / 101.325, 1e-4);
    eqp_result_free(r);
  }
  eqp_solution_free(s);
}

/* The headspace follows a titration: dpH/dv from the coupled derivative
** against central differences of sealed equilibria (not a chemistry check:
** the implicit differentiation against the solves it differentiates). */
static void test_derivative(void **state)
{
  eqp_solution *s = make("davies", 0.010, 298.15);
  eqp_solution_add_str(s, "NaHCO3", "0.1 mmol");
  eqp_solution_add_str(s, "HCl", "0.05 mmol");
  seal(s, 0.005, "CO2(g)", P_AIR);
  double d, h = 1e-7, pHs[3];
  assert_int_equal(eqp_solution_dpH(s, "HCl", &d), EQP_OK);
  for (int k = 0; k < 3; k++) {
    eqp_solution *c;
    assert_int_equal(eqp_solution_copy(s, &c), EQP_OK);
    if (k) assert_int_equal(eqp_solution_add(c, "HCl", k * h, EQP_Q_AMOUNT), EQP_OK);
    eqp_result *r = solve(c);
    pHs[k] = eqp_result_pH(r);
    eqp_result_free(r);
    eqp_solution_free(c);
  }
  /* second-order one-sided difference */
  double fd = (-3 * pHs[0] + 4 * pHs[1] - pHs[2]) / (2 * h);
  /* without the headspace following, the closed liquid's slope */
  eqp_solution *o;
  assert_int_equal(eqp_solution_copy(s, &o), EQP_OK);
  assert_int_equal(eqp_solution_unseal(o), EQP_OK);
  double dclosed;
  assert_int_equal(eqp_solution_dpH(o, "HCl", &dclosed), EQP_OK);
  printf("  dpH/dmol HCl sealed %.6g, difference %.6g; the liquid alone %.6g\n", d, fd, dclosed);
  assert_rel(d, fd, 1e-3);
  assert_true(fabs(d - dclosed) > 1e-2 * fabs(d));   /* the headspace matters here */
  eqp_solution_free(o);
  eqp_solution_free(s);
}

/* A titration of a sealed vial that ends at a pH: the last row is at that
** pH, and the vial with that much acid added gives it again (each point
** partitions the CO2) */
static void test_titration_end(void **state)
{
  eqp_solution *s = make("davies", 0.010, 298.15);
  eqp_solution_add_str(s, "NaHCO3", "0.2 mmol");
  seal(s, 0.005, "CO2(g)", P_AIR);
  eqp_titration t = EQP_TITRATION_INIT;
  t.reagent = "HCl";
  t.step = 0.02e-3;
  t.until_pH = 6.0;
  eqp_curve *c;
  if (eqp_solution_titrate(s, &t, &c) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  size_t n = eqp_curve_rows(c);
  double v = eqp_curve_value(c, n - 1, 0), pH = eqp_curve_value(c, n - 1, 3);
  assert_string_equal(eqp_curve_col_name(c, 3), "pH");
  assert_close(pH, 6.0, 1e-9);
  assert_int_equal(eqp_solution_add(s, "HCl", v, EQP_Q_AMOUNT), EQP_OK);
  eqp_result *r = solve(s);
  printf("  sealed vial to pH 6: %.6g mol HCl in %zu rows; again %.10f\n", v, n, eqp_result_pH(r));
  assert_close(eqp_result_pH(r), 6.0, 1e-9);
  eqp_result_free(r);
  eqp_curve_free(c);
  eqp_solution_free(s);
}

/* Sealed operations: refusals, copies, venting, a full vessel, the warning */
static void test_rules(void **state)
{
  eqp_solution *s = make("davies", 0.010, 298.15), *c;
  eqp_solution_add_str(s, "NaHCO3", "0.1 mmol");
  eqp_headspace bad = EQP_HEADSPACE_INIT;
  assert_int_equal(eqp_solution_seal(s, &bad), EQP_E_INPUT);    /* no volume */
  const char *g[1] = {"CO3(g)"};
  double p[1] = {1e-3};
  bad.litres = 0.005;
  bad.ngases = 1;
  bad.gases = g;
  bad.p_atm = p;
  assert_int_equal(eqp_solution_seal(s, &bad), EQP_E_UNKNOWN);
  assert_contains(eqp_ctx_errmsg(ctx), "CO2(g)");                 /* the library's gases */
  eqp_headspace zero = {0};
  assert_int_equal(eqp_solution_seal(s, &zero), EQP_E_ARG);       /* size from the macro */
  assert_int_equal(eqp_solution_sealed(s), 0);
  seal(s, 0.005, NULL, 0);
  assert_int_equal(eqp_solution_sealed(s), 1);
  assert_int_equal(eqp_solution_seal(s, &bad), EQP_E_INPUT);    /* sealed already */
  double mol;
  assert_int_equal(eqp_solution_expose(s, "CO2(g)", P_AIR, &mol), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "sealed");
  assert_int_equal(eqp_solution_adjust_pH(s, 7, "HCl", NULL, &mol, NULL), EQP_E_INPUT);
  eqp_solution *t = make("davies", 0.010, 298.15);
  assert_int_equal(eqp_solution_pour(t, s, 0.001), EQP_E_INPUT);
  eqp_solution_free(t);
  /* a copy is a copy of the vessel */
  assert_int_equal(eqp_solution_copy(s, &c), EQP_OK);
  assert_int_equal(eqp_solution_sealed(c), 1);
  eqp_result *r1 = solve(s), *r2 = solve(c);
  assert_close(eqp_result_pH(r1), eqp_result_pH(r2), 1e-12);
  /* venting keeps what is dissolved: the open solution's pH is the sealed one's */
  double pco2;
  eqp_result_gas(r1, "CO2(g)", &pco2, &mol);
  assert_int_equal(eqp_solution_unseal(c), EQP_OK);
  eqp_result *r3 = solve(c);
  double C;
  eqp_solution_total(c, "CO3^2-", &C);
  assert_rel(C + mol, 1e-4, 1e-12);
  assert_close(eqp_result_pH(r3), eqp_result_pH(r1), 1e-9);
  assert_int_equal(eqp_result_headspace(r3, NULL, NULL, NULL), 0);
  eqp_result_free(r1);
  eqp_result_free(r2);
  eqp_result_free(r3);
  eqp_solution_free(c);
  /* 6 mL more into a 5 mL headspace: no room left */
  eqp_solution *w = make("davies", 0.006, 298.15);
  assert_int_equal(eqp_solution_pour(s, w, 0.006), EQP_OK);
  assert_int_equal(eqp_solution_equilibrate(s, &r1), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "fills the sealed vessel");
  eqp_solution_free(w);
  eqp_solution_free(s);
  /* strong acid on 0.5 M bicarbonate in a small headspace: well beyond 2 atm */
  s = make("davies", 0.010, 298.15);
  eqp_solution_add_str(s, "NaHCO3", "5 mmol");
  seal(s, 0.002, NULL, 0);
  eqp_solution_add_str(s, "HCl", "5 mmol");
  r1 = solve(s);
  double V, pt;
  eqp_result_headspace(r1, &V, &pt, NULL);
  printf("  5 mmol CO2 released into %.4g mL: %.3g atm\n", V * 1e3, pt);
  assert_true(pt > 2);
  eqp_result_free(r1);
  eqp_solution_free(s);
  size_t nc = eqp_ctx_caution_count(ctx);
  int found = 0;
  for (size_t i = 0; i < nc; i++) found |= strstr(eqp_ctx_caution(ctx, i), "sealed vessel") != NULL;
  assert_true(found);
}

static int warned, kh_range;
static void on_warning(void *ud, const char *kind, const char *text)
{
  (void)ud;
  if (strcmp(kind, "pressure") == 0 && strstr(text, "atm")) warned++;
  if (strcmp(kind, "temperature") == 0 && strstr(text, "Henry's law constant of CO2(g)")) kh_range++;
}

static void test_pressure_warning(void **state)
{
  eqp_observer o = EQP_OBSERVER_INIT;
  o.on_warning = on_warning;
  assert_int_equal(eqp_ctx_set_observer(ctx, &o, NULL), EQP_OK);
  eqp_solution *s = make("davies", 0.010, 298.15);
  eqp_solution_add_str(s, "NaHCO3", "0.1 mmol");
  seal(s, 0.005, NULL, 0);
  eqp_result *r = solve(s);
  eqp_result_free(r);
  assert_int_equal(warned, 0);
  eqp_solution_add_str(s, "NaHCO3", "5 mmol");
  eqp_solution_add_str(s, "HCl", "5 mmol");
  r = solve(s);
  eqp_result_free(r);
  assert_int_equal(warned, 1);
  assert_int_equal(kh_range, 0);
  /* Plummer & Busenberg's K_H is stated for 0-90 C: at 95 C, said */
  assert_int_equal(eqp_solution_set_temperature(s, 368.15), EQP_OK);
  r = solve(s);
  eqp_result_free(r);
  assert_int_equal(kh_range, 1);
  eqp_solution_free(s);
  eqp_ctx_set_observer(ctx, NULL, NULL);
}

int main(void)
{
  ctx = test_ctx();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_closed_form),
    cmocka_unit_test(test_huge_headspace),
    cmocka_unit_test(test_tiny_headspace),
    cmocka_unit_test(test_conservation),
    cmocka_unit_test(test_derivative),
    cmocka_unit_test(test_titration_end),
    cmocka_unit_test(test_rules),
    cmocka_unit_test(test_pressure_warning),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
