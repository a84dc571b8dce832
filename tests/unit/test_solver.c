/* Solver against independent solutions of the same equations.
**
** Each reference below is computed here, in long double, by bisection on
** the charge balance written with alpha fractions (the classical textbook
** derivation, e.g. W. Stumm, J. J. Morgan, Aquatic Chemistry, 3rd ed.,
** Wiley 1996, ch. 3), with a fixed-point loop on the ionic strength when an
** activity model is on. It shares no code with the engine. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

static eqp_ctx *ctx;
/* IAPWS R11-07 at 25 C, 0.1 MPa, as the engine evaluates it (13.9945; the
** formulation itself is checked against the release's values in
** test_water.c). */
static long double pKw;

typedef struct acid {
  int n;                 /* protons of the fully protonated form */
  long double pK[3];     /* stepwise, most protonated first */
  long double CT;        /* total of the acid system, mol/kg */
  long double cation;    /* Na+ + K+ */
  long double anion;     /* Cl- */
} acid;

/* log10 gamma of charge z from Davies at I; A from the engine's water
** module (checked against a table in test_water.c). */
static long double lg_davies(int z, long double I, int davies)
{
  if (!davies) return 0;
  double A;
  eqpi_debye_huckel_AB(298.15, &A, NULL);
  long double s = sqrtl(I);
  return -(long double)A * z * z * (s / (1 + s) - 0.3L * I);
}

/* Molalities of H_kA (k = 0..n) given the H+ activity and I. */
static void fractions(const acid *a, long double aH, long double I, int dv, long double *m)
{
  long double w[4], sum = 0;
  w[a->n] = 1;     /* fully protonated, relative weight */
  for (int k = a->n; k > 0; k--) {
    /* Ka = aH * g(k-1) m(k-1) / (g(k) m(k)), charges k-1-n and k-n */
    long double Ka = powl(10, -a->pK[a->n - k]);
    long double gk = powl(10, lg_davies(k - a->n, I, dv));
    long double gk1 = powl(10, lg_davies(k - 1 - a->n, I, dv));
    w[k - 1] = w[k] * Ka * gk / (aH * gk1);
  }
  for (int k = 0; k <= a->n; k++) sum += w[k];
  for (int k = 0; k <= a->n; k++) m[k] = a->CT * w[k] / sum;
}

static long double charge(const acid *a, long double aH, long double I, int dv, long double *Iout)
{
  long double g1 = powl(10, lg_davies(1, I, dv));
  long double h = aH / g1, oh = powl(10, -pKw) / (aH * g1), m[4];
  fractions(a, aH, I, dv, m);
  long double q = h - oh + a->cation - a->anion, Ic = h + oh + a->cation + a->anion;
  for (int k = 0; k <= a->n; k++) {
    q += (k - a->n) * m[k];
    Ic += (long double)(k - a->n) * (k - a->n) * m[k];
  }
  *Iout = Ic / 2;
  return q;
}

/* pH = -log10 a(H+) of the acid system; dv selects Davies. */
static double reference_pH(const acid *a, int dv)
{
  long double I = a->cation + a->anion + a->CT + 1e-7L, Inew = I;
  for (int outer = 0; outer < 200; outer++) {
    long double lo = -20, hi = 2;   /* log10 aH */
    for (int it = 0; it < 200; it++) {
      long double mid = (lo + hi) / 2;
      if (charge(a, powl(10, mid), I, dv, &Inew) > 0) hi = mid;
      else lo = mid;
    }
    charge(a, powl(10, (lo + hi) / 2), I, dv, &Inew);
    if (fabsl(Inew - I) <= 1e-19L * I) break;
    I = Inew;
  }
  long double lo = -20, hi = 2;
  for (int it = 0; it < 200; it++) {
    long double mid = (lo + hi) / 2;
    if (charge(a, powl(10, mid), I, dv, &Inew) > 0) hi = mid;
    else lo = mid;
  }
  return (double)-((lo + hi) / 2);
}

static void check_h(eqp_result *r, double pH_ref, double rtol)
{
  /* relative error in a(H+) from the pH difference */
  double rel = fabs(pow(10, -(eqp_result_pH(r) - pH_ref)) - 1);
  if (!(rel <= rtol))
    fail_msg("pH %.14f vs reference %.14f: relative error in a(H+) %.3g > %.3g", eqp_result_pH(r),
             pH_ref, rel, rtol);
  assert_true(eqp_result_residual(r) <= 1e-10);
}

static void test_pure_water(void **state)
{
  eqp_result *r = test_solve(ctx, "ideal", 298.15, NULL);
  check_h(r, (double)(pKw / 2), 1e-10);
  eqp_result_free(r);
}

/* Strong acid, exact: [H+] = C/2 + sqrt(C^2/4 + Kw); near 1e-8 mol/kg the
** water's own H+ dominates. */
static void test_strong_acid_closed_form(void **state)
{
  static const char *amt[] = {"1e-10 mol", "1e-8 mol", "3e-7 mol", "1e-4 mol", "0.1 mol"};
  static const long double C[] = {1e-10L, 1e-8L, 3e-7L, 1e-4L, 0.1L};
  for (int i = 0; i < 5; i++) {
    eqp_result *r = test_solve(ctx, "ideal", 298.15, "HCl", amt[i], NULL);
    long double h = C[i] / 2 + sqrtl(C[i] * C[i] / 4 + powl(10, -pKw));
    check_h(r, (double)-log10l(h), 1e-10);
    assert_rel(test_m(r, "H+"), (double)h, 1e-10);
    eqp_result_free(r);
    r = test_solve(ctx, "ideal", 298.15, "NaOH", amt[i], NULL);
    long double oh = C[i] / 2 + sqrtl(C[i] * C[i] / 4 + powl(10, -pKw));
    check_h(r, (double)-log10l(powl(10, -pKw) / oh), 1e-10);
    eqp_result_free(r);
  }
}

/* Monoprotic weak acid: the exact cubic h^3 + (Ka + Cb) h^2 - (Kw + Ka Ca) h
** - Ka Kw = 0, solved here by bisection. */
static void test_weak_acid_cubic(void **state)
{
  static const struct { const char *a, *b; long double Ca, Cb; } cases[] = {
    {"1e-4 mol", "0 mol", 1e-4L, 0}, {"0.1 mol", "0 mol", 0.1L, 0},
    {"1 mol", "0 mol", 1.0L, 0}, {"0.1 mol", "0.05 mol", 0.1L, 0.05L},
    {"1e-6 mol", "1e-6 mol", 1e-6L, 1e-6L},
  };
  const long double Ka = powl(10, -4.756L), Kw = powl(10, -pKw);
  for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
    eqp_result *r = test_solve(ctx, "ideal", 298.15, "CH3COOH", cases[i].a, "CH3COONa",
                               cases[i].b, NULL);
    long double lo = 1e-14L, hi = 10;
    for (int it = 0; it < 300; it++) {
      long double h = sqrtl(lo * hi);
      long double f = h * h * h + (Ka + cases[i].Cb) * h * h - (Kw + Ka * cases[i].Ca) * h - Ka * Kw;
      if (f > 0) hi = h; else lo = h;
    }
    long double h = sqrtl(lo * hi);
    assert_rel(test_m(r, "H+"), (double)h, 1e-10);
    eqp_result_free(r);
  }
}

static void test_phosphate_ideal_and_davies(void **state)
{
  acid a = {3, {2.148L, 7.198L, 12.35L}, 0.05L, 0.075L, 0};   /* 25 mmol KH2PO4 + 25 mmol Na2HPO4 */
  eqp_result *r = test_solve(ctx, "ideal", 298.15, "KH2PO4", "25 mmol", "Na2HPO4", "25 mmol", NULL);
  check_h(r, reference_pH(&a, 0), 1e-10);
  eqp_result_free(r);
  /* agreement with an independent solution to 1e-8 in pH */
  r = test_solve(ctx, "davies", 298.15, "KH2PO4", "25 mmol", "Na2HPO4", "25 mmol", NULL);
  assert_close(eqp_result_pH(r), reference_pH(&a, 1), 1e-8);
  eqp_result_free(r);
  acid b = {3, {2.148L, 7.198L, 12.35L}, 1.0L, 1.0L, 0.5L};    /* H3PO4 + NaOH + NaCl, strong */
  r = test_solve(ctx, "davies", 298.15, "H3PO4", "1 mol", "NaOH", "0.5 mol", "NaCl", "0.5 mol",
                 NULL);
  assert_close(eqp_result_pH(r), reference_pH(&b, 1), 1e-8);
  eqp_result_free(r);
}

/* Extremes converge and their balances close (checked here from the
** species, independently of the engine's own verification). */
static void test_extremes(void **state)
{
  static const char *const recipes[][4] = {
    {"HCl", "5 mol", NULL, NULL}, {"NaOH", "5 mol", NULL, NULL}, {"KOH", "5 mol", "KCl", "1 mol"},
    {"NaCl", "1e-10 mol", NULL, NULL}, {"Na2HPO4", "1e-10 mol", NULL, NULL},
    {"KH2PO4", "1 mol", "Na2HPO4", "1 mol"}, {"Tris", "1 mol", "TrisHCl", "1 mol"},
    {"CH3COOH", "1 mol", "CH3COONa", "1 mol"}, {"H3PO4", "5 mol", NULL, NULL},
    {"Na3PO4", "1 mol", NULL, NULL}, {"KHP", "1e-10 mol", "HCl", "5 mol"},
  };
  const char *models[] = {"ideal", "davies"};
  for (int mdl = 0; mdl < 2; mdl++)
    for (size_t i = 0; i < sizeof recipes / sizeof recipes[0]; i++) {
      eqp_result *r = recipes[i][2]
        ? test_solve(ctx, models[mdl], 298.15, recipes[i][0], recipes[i][1], recipes[i][2],
                     recipes[i][3], NULL)
        : test_solve(ctx, models[mdl], 298.15, recipes[i][0], recipes[i][1], NULL);
      double q = 0, qa = 0;
      for (size_t k = 0; k < eqp_result_species_count(r); k++) {
        double m = eqp_result_species_molality(r, k), z;
        char err[64];
        eqpi_comp c;
        eqpi_formula_parse(ctx->db->sp[eqpi_db_find_species(ctx->db,
                           eqp_result_species_name(r, k))].formula, &c, NULL, err, sizeof err);
        z = c.charge;
        q += z * m;
        qa += fabs(z) * m;
      }
      if (!(fabs(q) <= 1e-10 * qa)) fail_msg("%s %s: charge balance %.3g of %.3g", models[mdl],
                                             recipes[i][0], q, qa);
      assert_true(isfinite(eqp_result_pH(r)));
      eqp_result_free(r);
    }
}

/* Davies with a strong acid: pH = -log10(C) - log10 g(I = C), g from the
** Davies equation (C. W. Davies, Ion Association, 1962), OH- negligible. */
static void test_davies_strong_acid(void **state)
{
  eqp_result *r = test_solve(ctx, "davies", 298.15, "HCl", "10 mmol", NULL);
  long double I = 0.01L;
  assert_close(eqp_result_pH(r), (double)(2 - lg_davies(1, I, 1)), 1e-9);
  double g;
  eqp_result_gamma(r, "Cl-", &g);
  assert_close(g, (double)powl(10, lg_davies(1, I, 1)), 1e-9);
  eqp_result_free(r);
}

int main(void)
{
  ctx = test_ctx();
  pKw = eqpi_water_pKw(298.15);
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_pure_water),
    cmocka_unit_test(test_strong_acid_closed_form),
    cmocka_unit_test(test_weak_acid_cubic),
    cmocka_unit_test(test_phosphate_ideal_and_davies),
    cmocka_unit_test(test_davies_strong_acid),
    cmocka_unit_test(test_extremes),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
