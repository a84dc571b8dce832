/* Equivalence points of titration curves against an independent reference:
** the exact ideal titration curve written the other way round, V(pH), from
** the charge balance; its inflections (zeros of d2V/dpH2) and their
** sharpness; the stoichiometric volumes; and the closed forms of the pH of an
** amphiprotic salt, a weak acid and a weak base at their equivalence points.
**
** Constants, the same as the species files use, at 25 C and I = 0:
** - carbonic acid: log K1 and log K2 from the equations of L. N. Plummer,
**   E. Busenberg, Geochim. Cosmochim. Acta 46, 1011 (1982), evaluated here
**   in their published form;
** - phosphoric acid pK 2.148, 7.198, 12.35 and citric acid pK 3.128, 4.761,
**   6.396: R. N. Goldberg, N. Kishore, R. M. Lennen, J. Phys. Chem. Ref.
**   Data 31, 231 (2002) (the values are recalled from that compilation; the
**   species files carry the same flag);
** - Kw: IAPWS R11-07 (Bandura & Lvov 2006), the engine's water module, which
**   test_water.c checks against the published table. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

static eqp_ctx *ctx;
static double Kw, rho;

/* ---------------------------------------------------- the reference */

typedef struct acid {
  double n;             /* mol of the acid system in the sample */
  int np;               /* protons it can lose */
  double K[3];          /* stepwise acid constants */
} acid;

typedef struct ref {
  double W0;            /* kg of water in the sample */
  double net;           /* mol of strong cations minus strong anions in the sample */
  acid a[2];
  int na;
  double b;             /* mol of strong base per L of titrant (< 0: strong acid) */
} ref;

/* Mean number of protons lost per molecule at [H+] = h (ideal). */
static double lost(const acid *a, double h)
{
  double term = 1, num = 0, den = 1;
  for (int k = 0; k < a->np; k++) {
    term *= a->K[k] / h;
    num += (k + 1) * term;
    den += term;
  }
  return num / den;
}

/* Litres of titrant that bring the sample to pH x: the charge balance
** W (h - Kw/h) + net + b V - sum n F(h) = 0 with W = W0 + rho V, solved
** for V (the titrant is a stock of water density rho, as the engine's
** dilute-solution volumes are). */
static double ref_V(const ref *r, double x)
{
  double h = pow(10, -x), g = h - Kw / h, q = 0;
  for (int k = 0; k < r->na; k++) q += r->a[k].n * lost(&r->a[k], h);
  return -(r->W0 * g + r->net - q) / (rho * g + r->b);
}

static const double dx = 1e-4;    /* pH step of the central differences */
static double ref_dV(const ref *r, double x) { return (ref_V(r, x + dx) - ref_V(r, x - dx)) / (2 * dx); }
static double ref_d2V(const ref *r, double x)
{
  return (ref_V(r, x + dx) - 2 * ref_V(r, x) + ref_V(r, x - dx)) / (dx * dx);
}

/* The pH at which V(x) = V, by bisection (V is monotonic in x). */
static double ref_pH(const ref *r, double V, double lo, double hi)
{
  double flo = ref_V(r, lo) - V;
  for (int it = 0; it < 200; it++) {
    double mid = 0.5 * (lo + hi), f = ref_V(r, mid) - V;
    if ((f > 0) == (flo > 0)) { lo = mid; flo = f; } else hi = mid;
  }
  return 0.5 * (lo + hi);
}

typedef struct inflection { double V, pH, sharpness; } inflection;

/* Every maximum of |dpH/dV| = 1/|dV/dpH| between pH x0 and x1: on a grid,
** then by bisection on d2V/dpH2. Sharpness as the engine defines it: the
** slope there over the higher of the lowest slopes of its two flanks, each
** flank reaching to the next steeper point or the end of the range. */
static int ref_inflections(const ref *r, double x0, double x1, inflection *out, int max)
{
  enum { N = 4000 };
  static double s[N + 1];
  double lo = fmin(x0, x1), hi = fmax(x0, x1), step = (hi - lo) / N;
  for (int i = 0; i <= N; i++) s[i] = fabs(ref_dV(r, lo + i * step));
  int n = 0;
  for (int i = 1; i < N && n < max; i++) {
    if (!(s[i] < s[i - 1] && s[i] <= s[i + 1])) continue;
    double a = lo + (i - 1) * step, b = lo + (i + 1) * step, fa = ref_d2V(r, a);
    for (int it = 0; it < 100; it++) {
      double m = 0.5 * (a + b), fm = ref_d2V(r, m);
      if ((fm > 0) == (fa > 0)) { a = m; fa = fm; } else b = m;
    }
    double xp = 0.5 * (a + b), sp = fabs(ref_dV(r, xp)), left = 0, right = 0;
    for (int k = i - 1; k >= 0 && s[k] >= sp; k--) left = fmax(left, s[k]);
    for (int k = i + 1; k <= N && s[k] >= sp; k++) right = fmax(right, s[k]);
    out[n++] = (inflection){ref_V(r, xp), xp, fmin(left, right) / sp};
  }
  return n;
}

/* --------------------------------------------- closed forms at 25 C */

/* Amphiprotic salt HA of molality C between K1 and K2 (ideal):
** [H+] = sqrt((K1 K2 C + K1 Kw)/(K1 + C)), which takes [HA] = C. */
static double amphiprotic_pH(double K1, double K2, double C)
{
  return -log10(sqrt((K1 * K2 * C + K1 * Kw) / (K1 + C)));
}

/* Weak acid HA of molality C alone: h^2 + K h - K C = 0 (OH- and further
** dissociation neglected). */
static double weak_acid_pH(double K, double C) { return -log10((-K + sqrt(K * K + 4 * K * C)) / 2); }

/* Weak base A of molality C with Kb = Kw/Ka: [OH-]^2 + Kb [OH-] - Kb C = 0. */
static double weak_base_pH(double Ka, double C)
{
  double Kb = Kw / Ka, oh = (-Kb + sqrt(Kb * Kb + 4 * Kb * C)) / 2;
  return -log10(Kw / oh);
}

/* ------------------------------------------------------ the engine */

static eqp_solution *make(double litres)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = litres * rho;
  o.temperature_K = 298.15;
  o.activity = "ideal";
  eqp_solution *s;
  if (eqp_solution_new(ctx, &o, &s) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return s;
}

static double pH_after(const eqp_solution *s, eqp_solution *stock, double V)
{
  eqp_solution *e;
  eqp_solution_copy(s, &e);
  if (eqp_solution_pour(e, stock, V) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  eqp_result *r;
  if (eqp_solution_equilibrate(e, &r) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  double pH = eqp_result_pH(r);
  eqp_result_free(r);
  eqp_solution_free(e);
  return pH;
}

/* An expected end point: stoichiometric volume and the closed-form pH there. */
typedef struct expect { double V, pH; } expect;

/* Titrate s with stock to V_end; the points found must be exactly the
** reference inflections of sharpness >= EQP_EQ_MIN_SHARPNESS (none of which
** may sit near the threshold, where the case would prove nothing), at the
** reference's place and pH; each lies near its stoichiometric volume and
** the pH there matches the closed form. */
static void check(const char *label, eqp_solution *s, eqp_solution *stock, double step,
                  double V_end, const ref *r, const expect *want, int nwant)
{
  eqp_titration t = EQP_TITRATION_INIT;
  t.stock = stock;
  t.step = step;
  t.to = V_end;
  eqp_curve *c;
  if (eqp_solution_titrate(s, &t, &c) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  size_t nrows = eqp_curve_rows(c);
  double x0 = eqp_curve_value(c, 0, 3), x1 = eqp_curve_value(c, nrows - 1, 3);
  /* the reference curve passes through the engine's first and last rows */
  assert_close(ref_pH(r, 0, fmin(x0, x1) - 1, fmax(x0, x1) + 1), x0, 1e-8);
  assert_close(ref_pH(r, V_end, fmin(x0, x1) - 1, fmax(x0, x1) + 1), x1, 1e-8);
  inflection all[8], kept[8];
  int nall = ref_inflections(r, x0, x1, all, 8), nkept = 0;
  printf("  %s: %zu rows\n", label, nrows);
  for (int k = 0; k < nall; k++) {
    printf("    reference inflection at %.4f mL, pH %.4f, sharpness %.3f%s\n", all[k].V * 1e3,
           all[k].pH, all[k].sharpness,
           all[k].sharpness >= EQP_EQ_MIN_SHARPNESS ? "" : " (too weak: not reported)");
    assert_true(fabs(log(all[k].sharpness / EQP_EQ_MIN_SHARPNESS)) > log(1.25));
    if (all[k].sharpness >= EQP_EQ_MIN_SHARPNESS) kept[nkept++] = all[k];
  }
  /* kept are in pH order, the engine's in titration order */
  if (x0 > x1)
    for (int k = 0; k < nkept / 2; k++) {
      inflection tmp = kept[k];
      kept[k] = kept[nkept - 1 - k];
      kept[nkept - 1 - k] = tmp;
    }
  assert_int_equal(nkept, nwant);
  assert_int_equal(eqp_curve_equivalence_count(c), (size_t)nwant);
  for (int k = 0; k < nwant; k++) {
    double V, pH, amount, sh = eqp_curve_equivalence_sharpness(c, (size_t)k);
    assert_int_equal(eqp_curve_equivalence(c, (size_t)k, &amount, &V, &pH), EQP_OK);
    assert_true(isnan(amount));                         /* a stock: no amount */
    double pH_stoich = pH_after(s, stock, want[k].V);
    printf("    found %.4f mL (stoichiometric %.4f mL, reference inflection %.4f mL), "
           "pH %.4f (reference %.4f; at the stoichiometric volume %.4f, closed form %.4f), "
           "sharpness %.3f (reference %.3f)\n",
           V * 1e3, want[k].V * 1e3, kept[k].V * 1e3, pH, kept[k].pH, pH_stoich, want[k].pH,
           sh, kept[k].sharpness);
    /* the engine's maximum is the reference's, to 1e-7 of its volume (the
    ** golden-section search ends where the slope's rounding hides its
    ** curvature), and its pH is the reference curve's at that volume */
    printf("    engine - reference: %.2e mL, %.2e pH\n", (V - kept[k].V) * 1e3, pH - kept[k].pH);
    assert_close(V, kept[k].V, 1e-7 * kept[k].V);
    assert_close(pH, ref_pH(r, V, pH - 0.1, pH + 0.1), 1e-8);
    /* its sharpness is read on the rows, whose flank minima lie within a
    ** pH step of the true ones */
    assert_rel(sh, kept[k].sharpness, 0.03);
    /* the inflection of a weak system lies a little before the
    ** stoichiometric point: within 0.1 % of it here */
    assert_rel(V, want[k].V, 1e-3);
    /* the engine at the stoichiometric volume against the closed form, whose
    ** one approximation (the salt's own form at its total) costs < 0.002 */
    assert_close(pH_stoich, want[k].pH, 0.002);
  }
  eqp_curve_free(c);
}

/* 12.2 mmol NaHCO3 + 1.4 mmol Na2CO3 in 1 L against 0.1 M HCl: CO3^2- ->
** HCO3- at 1.4/0.1 = 14.0 mL (a weak inflection) and HCO3- -> CO2 at
** (12.2 + 2 x 1.4)/0.1 = 150 mL. */
static void test_carbonate_mixture(void **state)
{
  const double T = 298.15;
  double lK1 = -356.3094 - 0.06091964 * T + 21834.37 / T + 126.8339 * log10(T) - 1684915 / (T * T);
  double lK2 = -107.8871 - 0.03252849 * T + 5151.79 / T + 38.92561 * log10(T) - 563713.9 / (T * T);
  double K1 = pow(10, lK1), K2 = pow(10, lK2);
  eqp_solution *s = make(1.0), *hcl = make(1.0);
  eqp_solution_add(s, "NaHCO3", 12.2e-3, EQP_Q_AMOUNT);
  eqp_solution_add(s, "Na2CO3", 1.4e-3, EQP_Q_AMOUNT);
  eqp_solution_add(hcl, "HCl", 0.1, EQP_Q_AMOUNT);
  ref r = {rho, 15.0e-3, {{13.6e-3, 2, {K1, K2, 0}}}, 1, -0.1};
  /* 13.6 mmol of HCO3- in 1.014 L; 13.6 mmol of CO2 in 1.150 L */
  expect want[2] = {{0.014, amphiprotic_pH(K1, K2, 13.6e-3 / (1.014 * rho))},
                    {0.150, weak_acid_pH(K1, 13.6e-3 / (1.150 * rho))}};
  check("carbonate + bicarbonate with 0.1 M HCl", s, hcl, 1e-3, 0.2, &r, want, 2);
  eqp_solution_free(hcl);
  eqp_solution_free(s);
}

/* 50 mL of 0.1 M H3PO4 against 0.1 M NaOH: H3PO4 -> H2PO4- at 50 mL,
** H2PO4- -> HPO4^2- at 100 mL; HPO4^2- -> PO4^3- (150 mL) is no inflection
** at all at these concentrations (the reference finds none). */
static void test_phosphoric(void **state)
{
  double K1 = pow(10, -2.148), K2 = pow(10, -7.198), K3 = pow(10, -12.35);
  eqp_solution *s = make(0.05), *naoh = make(1.0);
  eqp_solution_add(s, "H3PO4", 5e-3, EQP_Q_AMOUNT);
  eqp_solution_add(naoh, "NaOH", 0.1, EQP_Q_AMOUNT);
  ref r = {0.05 * rho, 0, {{5e-3, 3, {K1, K2, K3}}}, 1, 0.1};
  expect want[2] = {{0.05, amphiprotic_pH(K1, K2, 5e-3 / (0.10 * rho))},
                    {0.10, amphiprotic_pH(K2, K3, 5e-3 / (0.15 * rho))}};
  check("phosphoric acid with 0.1 M NaOH", s, naoh, 1e-3, 0.18, &r, want, 2);
  eqp_solution_free(naoh);
  eqp_solution_free(s);
}

/* 50 mL of 0.1 M citric acid against 0.1 M NaOH: pK 3.128, 4.761, 6.396
** lie 1.6 apart, so the inflections at 50 and 100 mL are barely there
** (the reference's sharpness is near 1) and are not reported; the third, at
** 150 mL, is. */
static void test_citric(void **state)
{
  double K1 = pow(10, -3.128), K2 = pow(10, -4.761), K3 = pow(10, -6.396);
  eqp_solution *s = make(0.05), *naoh = make(1.0);
  eqp_solution_add(s, "H3Cit", 5e-3, EQP_Q_AMOUNT);
  eqp_solution_add(naoh, "NaOH", 0.1, EQP_Q_AMOUNT);
  ref r = {0.05 * rho, 0, {{5e-3, 3, {K1, K2, K3}}}, 1, 0.1};
  expect want[1] = {{0.15, weak_base_pH(K3, 5e-3 / (0.20 * rho))}};
  check("citric acid with 0.1 M NaOH", s, naoh, 1e-3, 0.18, &r, want, 1);
  eqp_solution_free(naoh);
  eqp_solution_free(s);
}

/* The points are the same whatever the largest step: the step control
** samples every peak. */
static void test_step_independence(void **state)
{
  double K1 = pow(10, -2.148), K2 = pow(10, -7.198), K3 = pow(10, -12.35);
  eqp_solution *s = make(0.05), *naoh = make(1.0);
  eqp_solution_add(s, "H3PO4", 5e-3, EQP_Q_AMOUNT);
  eqp_solution_add(naoh, "NaOH", 0.1, EQP_Q_AMOUNT);
  ref r = {0.05 * rho, 0, {{5e-3, 3, {K1, K2, K3}}}, 1, 0.1};
  expect want[2] = {{0.05, amphiprotic_pH(K1, K2, 5e-3 / (0.10 * rho))},
                    {0.10, amphiprotic_pH(K2, K3, 5e-3 / (0.15 * rho))}};
  check("phosphoric acid, largest step 20 mL", s, naoh, 20e-3, 0.18, &r, want, 2);
  eqp_solution_free(naoh);
  eqp_solution_free(s);
}

/* JSON and the accessors carry every point and its sharpness. */
static void test_outputs(void **state)
{
  eqp_solution *s = make(1.0), *hcl = make(1.0);
  eqp_solution_add(s, "NaHCO3", 12.2e-3, EQP_Q_AMOUNT);
  eqp_solution_add(s, "Na2CO3", 1.4e-3, EQP_Q_AMOUNT);
  eqp_solution_add(hcl, "HCl", 0.1, EQP_Q_AMOUNT);
  eqp_titration t = EQP_TITRATION_INIT;
  t.stock = hcl;
  t.step = 2e-3;
  t.to = 0.2;
  eqp_curve *c;
  assert_int_equal(eqp_solution_titrate(s, &t, &c), EQP_OK);
  char *j = eqp_curve_to_json(c);
  assert_non_null(j);
  const char *p = strstr(j, "\"equivalence_points\"");
  assert_non_null(p);
  int n = 0;
  for (const char *q = p; (q = strstr(q, "\"sharpness\"")); q++) n++;
  assert_int_equal(n, 2);
  eqp_free_string(j);
  assert_true(isnan(eqp_curve_equivalence_sharpness(c, 2)));
  assert_int_equal(eqp_curve_equivalence(c, 2, NULL, NULL, NULL), EQP_E_ARG);
  eqp_curve_free(c);
  eqp_solution_free(hcl);
  eqp_solution_free(s);
}

/* The slopes above come from the engine's LU solve; a system that needs a
** row interchange after the first column (as the H+ row near a dominant
** H2PO4- does) against x chosen here, b = A x. */
static void test_lu_interchange(void **state)
{
  double A[9] = {1, 2, 0, 1, 2.003, 0, 0.5, 0.5, -1}, x[3] = {1, -2, 3}, b[3];
  for (int i = 0; i < 3; i++) b[i] = A[3 * i] * x[0] + A[3 * i + 1] * x[1] + A[3 * i + 2] * x[2];
  int piv[3];
  assert_int_equal(eqpi_lu_factor(A, piv, 3), 0);
  assert_int_equal(piv[1], 2);                    /* the interchange at column 1 */
  eqpi_lu_solve(A, piv, 3, b);
  for (int i = 0; i < 3; i++) assert_close(b[i], x[i], 1e-11);
}

int main(void)
{
  ctx = test_ctx();
  Kw = pow(10, -eqpi_water_pKw(298.15));
  rho = eqp_water_density(298.15);
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_carbonate_mixture),
    cmocka_unit_test(test_phosphoric),
    cmocka_unit_test(test_citric),
    cmocka_unit_test(test_step_independence),
    cmocka_unit_test(test_outputs),
    cmocka_unit_test(test_lu_interchange),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
