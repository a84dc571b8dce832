/* Formulas: parsing, element balance, molar masses from the IUPAC standard
** atomic weights. The expected molar masses are the values printed in the
** CRC Handbook of Chemistry and Physics (section "Physical constants of
** inorganic/organic compounds", to 0.01 g/mol) [from memory]; tolerance
** 0.015 g/mol covers the rounding of those tables and the IUPAC 2021
** abridged weights. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

static eqp_ctx *ctx;

static double mm(const char *f)
{
  double v;
  if (eqp_formula_molar_mass(ctx, f, &v) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return v;
}

static void test_molar_masses_against_handbook(void **state)
{
  assert_close(mm("NaCl"), 58.44, 0.015);
  assert_close(mm("KCl"), 74.55, 0.015);
  assert_close(mm("NaOH"), 40.00, 0.015);
  assert_close(mm("KH2PO4"), 136.09, 0.015);
  assert_close(mm("Na2HPO4"), 141.96, 0.015);
  assert_close(mm("Na2HPO4.7H2O"), 268.07, 0.015);
  assert_close(mm("Na2HPO4.12H2O"), 358.14, 0.015);
  assert_close(mm("NaH2PO4.H2O"), 137.99, 0.015);
  assert_close(mm("C4H11NO3"), 121.14, 0.015);        /* Tris */
  assert_close(mm("C4H11NO3.HCl"), 157.60, 0.015);    /* Tris hydrochloride */
  assert_close(mm("KHC8H4O4"), 204.22, 0.015);        /* potassium hydrogen phthalate */
  assert_close(mm("CH3COONa.3H2O"), 136.08, 0.015);
  assert_close(mm("Ca(OH)2"), 74.09, 0.015);
  assert_close(mm("CuSO4\xc2\xb7" "5H2O"), 249.69, 0.015);  /* middle dot */
  assert_close(mm("CaSO4.0.5H2O"), 145.15, 0.015);
}

static void test_composition_and_charge(void **state)
{
  eqpi_comp c;
  double hyd;
  char err[128];
  assert_int_equal(eqpi_formula_parse("HPO4^2-", &c, &hyd, err, sizeof err), 0);
  assert_close(c.charge, -2, 0);
  assert_int_equal(c.n, 3);
  assert_int_equal(eqpi_formula_parse("NH4+", &c, &hyd, err, sizeof err), 0);
  assert_close(c.charge, 1, 0);
  assert_int_equal(eqpi_formula_parse("Fe^3+", &c, &hyd, err, sizeof err), 0);
  assert_close(c.charge, 3, 0);
  assert_int_equal(eqpi_formula_parse("Na2HPO4.7H2O", &c, &hyd, err, sizeof err), 0);
  assert_close(hyd, 7, 0);
  /* element balance of H3PO4 = PO4^3- + 3 H+ */
  eqpi_comp a, b, h;
  eqpi_formula_parse("H3PO4", &a, NULL, err, sizeof err);
  eqpi_formula_parse("PO4^3-", &b, NULL, err, sizeof err);
  eqpi_formula_parse("H+", &h, NULL, err, sizeof err);
  eqpi_comp_add(&b, &h, 3);
  char diff[128];
  assert_int_equal(eqpi_comp_diff(&a, &b, diff, sizeof diff), 0);
  eqpi_comp_add(&b, &h, 1);
  assert_int_equal(eqpi_comp_diff(&a, &b, diff, sizeof diff), 1);
  assert_contains(diff, "H -1");
  assert_contains(diff, "charge -1");
}

static void bad(const char *f, const char *needle)
{
  double v;
  assert_int_equal(eqp_formula_molar_mass(ctx, f, &v), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), needle);
}

static void test_bad_formulas(void **state)
{
  bad("Xx2O", "unknown element");
  bad("nacl", "expected an element");
  bad("Na(Cl", "unclosed bracket");
  bad("NaCl$", "unexpected character");
  bad("H2O0", "count must be positive");
  bad("", "expected an element");
  bad("Na+1.5", "unexpected character");
  bad("Ca^0+", "2 or more");
  bad("Ca^1+", "2 or more");
  bad("Ca^2", "sign after the number");
  bad("Ca^99999999+", "2 or more");
  bad("C99999999", "count too large");
  /* the sign-first spelling is refused with the IUPAC one suggested */
  bad("HPO4-2", "write 'HPO4^2-'");
  bad("Ca+2", "write 'Ca^2+'");
  bad("Tc2O7", "no standard atomic weight");
}

/* IUPAC charge notation (IUPAC Red Book 2005, IR-3.4: charge number then
** sign as a right superscript), typed in ASCII after a caret, or in Unicode. */
static void test_notation(void **state)
{
  (void)state;
  char buf[64];
  static const char *const folded[][2] = {
    {"HPO\xE2\x82\x84\xC2\xB2\xE2\x81\xBB", "HPO4^2-"},       /* HPO₄²⁻ */
    {"Ca\xC2\xB2\xE2\x81\xBA", "Ca^2+"},                         /* Ca²⁺ */
    {"Na\xE2\x81\xBA", "Na+"},                                     /* Na⁺ */
    {"H\xE2\x82\x82PO\xE2\x82\x84\xE2\x81\xBB", "H2PO4-"},   /* H₂PO₄⁻ */
    {"PO\xE2\x82\x84\xC2\xB3\xE2\x88\x92", "PO4^3-"},         /* PO₄³− (minus sign) */
    {"Na^+", "Na+"}, {"Cl^1-", "Cl-"},
    {"Na2HPO4\xC2\xB7" "7H2O", "Na2HPO4.7H2O"},                     /* Na2HPO4·7H2O */
  };
  for (size_t i = 0; i < sizeof folded / sizeof folded[0]; i++) {
    assert_int_equal(eqpi_name_normalize(folded[i][0], buf, sizeof buf), 1);
    assert_string_equal(buf, folded[i][1]);
  }
  assert_int_equal(eqpi_name_normalize("HPO4^2-", buf, sizeof buf), 0);
  assert_string_equal(buf, "HPO4^2-");
  assert_int_equal(eqpi_name_normalize("HPO4^2-", buf, 4), -1);

  assert_int_equal(eqpi_name_old_style("HPO4-2", buf, sizeof buf), 1);
  assert_string_equal(buf, "HPO4^2-");
  assert_int_equal(eqpi_name_old_style("Fe+3", buf, sizeof buf), 1);
  assert_string_equal(buf, "Fe^3+");
  assert_int_equal(eqpi_name_old_style("Na+1", buf, sizeof buf), 1);
  assert_string_equal(buf, "Na+");
  assert_int_equal(eqpi_name_old_style("HPO4^2-", buf, sizeof buf), 0);
  assert_int_equal(eqpi_name_old_style("Na2HPO4", buf, sizeof buf), 0);

  assert_int_equal(eqpi_name_pretty("HPO4^2-", buf, sizeof buf), 0);
  assert_string_equal(buf, "HPO\xE2\x82\x84\xC2\xB2\xE2\x81\xBB");
  assert_int_equal(eqpi_name_pretty("Na2HPO4.7H2O", buf, sizeof buf), 0);
  assert_string_equal(buf, "Na\xE2\x82\x82HPO\xE2\x82\x84\xC2\xB7" "7H\xE2\x82\x82O");
  assert_int_equal(eqpi_name_pretty("Bis-Tris", buf, sizeof buf), 0);
  assert_string_equal(buf, "Bis-Tris");

  /* a pretty name reads back as the canonical one */
  static const char *const names[] = {"HPO4^2-", "Ca^2+", "Na+", "H2PO4-", "PO4^3-", "CO2(g)"};
  for (size_t i = 0; i < sizeof names / sizeof names[0]; i++) {
    char pretty[64];
    assert_int_equal(eqpi_name_pretty(names[i], pretty, sizeof pretty), 0);
    assert_true(eqpi_name_normalize(pretty, buf, sizeof buf) >= 0);
    assert_string_equal(buf, names[i]);
  }
}

int main(void)
{
  ctx = eqp_ctx_new(NULL, NULL);
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_molar_masses_against_handbook),
    cmocka_unit_test(test_composition_and_charge),
    cmocka_unit_test(test_bad_formulas),
    cmocka_unit_test(test_notation),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
