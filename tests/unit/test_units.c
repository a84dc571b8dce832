/* Units: amounts, masses, concentrations, volumes, temperatures. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"

static eqp_ctx *ctx;

static double parse(const char *text, unsigned allowed, eqp_quantity *kind)
{
  double v = NAN;
  if (eqp_parse_quantity(ctx, text, allowed, &v, kind) != EQP_OK)
    fail_msg("'%s': %s", text, eqp_ctx_errmsg(ctx));
  return v;
}

static void test_base_units(void **state)
{
  eqp_quantity k;
  const unsigned all = 0xff;
  assert_close(parse("12.5 mmol", all, &k), 12.5e-3, 1e-18);
  assert_int_equal(k, EQP_Q_AMOUNT);
  assert_close(parse("3 umol", all, &k), 3e-6, 1e-20);
  assert_close(parse("3 \xc2\xb5mol", all, &k), 3e-6, 1e-20);   /* micro sign U+00B5 */
  assert_close(parse("3 \xce\xbcmol", all, &k), 3e-6, 1e-20);   /* Greek mu U+03BC */
  assert_close(parse("1.42 g", all, &k), 1.42e-3, 1e-18);
  assert_int_equal(k, EQP_Q_MASS);
  assert_close(parse("250 mg", all, &k), 250e-6, 1e-18);
  assert_close(parse("5 ug", all, &k), 5e-9, 1e-22);
  assert_close(parse("2 kg", all, &k), 2.0, 0);
  assert_close(parse("25 mM", all, &k), 25e-3, 1e-18);
  assert_int_equal(k, EQP_Q_MOLARITY);
  assert_close(parse("0.1 M", all, &k), 0.1, 0);
  assert_close(parse("7 uM", all, &k), 7e-6, 1e-20);
  assert_close(parse("0.05 mol/kg", all, &k), 0.05, 0);
  assert_int_equal(k, EQP_Q_MOLALITY);
  assert_close(parse("20 mmol/kg", all, &k), 0.02, 1e-17);
  assert_close(parse("1 L", all, &k), 1.0, 0);
  assert_int_equal(k, EQP_Q_VOLUME);
  assert_close(parse("250 mL", all, &k), 0.25, 1e-16);
  assert_close(parse("10 uL", all, &k), 1e-5, 1e-20);
  assert_close(parse("37 C", all, &k), 310.15, 1e-12);
  assert_int_equal(k, EQP_Q_TEMPERATURE);
  assert_close(parse("310.15 K", all, &k), 310.15, 0);
  assert_close(parse("25mM", all, &k), 25e-3, 1e-18);        /* no space */
  assert_close(parse("  1e-3 mol ", all, &k), 1e-3, 1e-18);
  assert_close(parse("0 mol", all, &k), 0.0, 0);
}

/* The litre's two symbols, L and l, are both accepted (16th CGPM, 1979,
** Resolution 6; SI Brochure, 9th ed., 2019, Table 8); lower case is common
** practice on labels and in lab notebooks. 1 mL = 1e-3 L by definition. */
static void test_litre_symbols(void **state)
{
  eqp_quantity k;
  const unsigned all = 0xff;
  assert_close(parse("250 ml", all, &k), 0.25, 1e-16);
  assert_int_equal(k, EQP_Q_VOLUME);
  assert_close(parse("2 l", all, &k), 2.0, 0);
  assert_int_equal(k, EQP_Q_VOLUME);
  assert_close(parse("10 ul", all, &k), 1e-5, 1e-20);
  assert_close(parse("10 \xc2\xb5l", all, &k), 1e-5, 1e-20);   /* micro sign */
  assert_close(parse("0.1 mol/l", all, &k), 0.1, 0);
  assert_int_equal(k, EQP_Q_MOLARITY);
  assert_close(parse("20 mmol/l", all, &k), 0.02, 1e-17);
  assert_close(parse("5 umol/L", all, &k), 5e-6, 1e-21);
  /* the amount units that end in 'l' are not litres */
  assert_close(parse("2 mol", all, &k), 2.0, 0);
  assert_int_equal(k, EQP_Q_AMOUNT);
  assert_close(parse("2 mmol", all, &k), 2e-3, 1e-18);
  assert_int_equal(k, EQP_Q_AMOUNT);
  double v;
  assert_int_equal(eqp_parse_quantity(ctx, "2 dl", all, &v, &k), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "unknown unit 'dl'");
}

static void expect_error(const char *text, unsigned allowed, const char *needle)
{
  double v;
  eqp_quantity k;
  assert_int_equal(eqp_parse_quantity(ctx, text, allowed, &v, &k), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), needle);
}

static void test_errors_name_the_value(void **state)
{
  const unsigned amounts = EQP_Q_AMOUNT | EQP_Q_MASS;
  expect_error("12", amounts, "'12' has no unit");
  expect_error("12 parsecs", amounts, "unknown unit 'parsecs'");
  expect_error("-3 mmol", amounts, "'-3 mmol' is negative");
  expect_error("ten mmol", amounts, "'ten mmol' is not a number");
  expect_error("inf mol", amounts, "not a");
  expect_error("nan mol", amounts, "not a");
  expect_error("0x10 mol", amounts, "not a plain decimal");
  /* a number beyond a double is out of range, not "not a number" */
  expect_error("1e999 mol", amounts, "'1e999 mol' is out of range (too large)");
  expect_error("1e-999 mol", amounts, "'1e-999 mol' is out of range (too small");
  expect_error("1e-310 mol", amounts, "out of range");    /* subnormal: precision lost */
  expect_error("10 mL", amounts, "'10 mL' is a volume");
  expect_error("1 mol", EQP_Q_VOLUME, "expected a volume");
  expect_error("", amounts, "not a number");
  expect_error("-300 C", EQP_Q_TEMPERATURE, "negative on the kelvin scale");
}

int main(void)
{
  ctx = eqp_ctx_new(NULL, NULL);
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_base_units),
    cmocka_unit_test(test_litre_symbols),
    cmocka_unit_test(test_errors_name_the_value),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
