/* Units: amounts, masses, concentrations, volumes, temperatures. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

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

/* The fast path of the number reader against glibc's strtod (the
** reference): the same value to the bit and the same characters read, for
** every string it takes; what it leaves to strtod is strtod's anyway. */
static void check_decimal(const char *text, int *fast)
{
  double a, b;
  const char *end = eqpi_fast_decimal(text, &a);
  char *send;
  b = strtod(text, &send);
  if (!end) return;
  (*fast)++;
  if (end != send) fail_msg("'%s': read %d characters, strtod %d", text, (int)(end - text),
                            (int)(send - text));
  if (memcmp(&a, &b, sizeof a) != 0) fail_msg("'%s': %.17g, strtod %.17g", text, a, b);
}

static void test_fast_decimal(void **state)
{
  static const char *const cases[] = {
    "0", "-0", "+0", "1", "25", "0.07", ".5", "+.5", "1.", "-1.", "007", "1e5", "1E-5",
    "2.5e+3", "1e", "1e-", "1e+", "3ex", "0x1p3", "inf", "nan", ".", "-", "", "1.5.3",
    "9007199254740992", "9007199254740993", "9007199254740991.5", "123456789012345678",
    "1e22", "1e23", "1e-22", "1e-23", "0.1", "0.2", "0.3", "4.35", "1234.5678e-3",
    "1 umol", "10 mmol", "0.000001", "1e-2147483649", "99999999999999999999"};
  int fast = 0;
  for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) check_decimal(cases[i], &fast);
  /* random decimals of up to 17 digits, a point anywhere, exponents to +-30 */
  uint64_t x = 0x9E3779B97F4A7C15ull;
  char buf[64];
  for (int k = 0; k < 200000; k++) {
    x ^= x << 13; x ^= x >> 7; x ^= x << 17;
    int nd = 1 + (int)(x % 17), dot = (int)((x >> 8) % (uint64_t)(nd + 2)), n = 0;
    if ((x >> 20) & 1) buf[n++] = '-';
    uint64_t y = x;
    for (int d = 0; d < nd; d++) {
      if (d == dot) buf[n++] = '.';
      y = y * 6364136223846793005ull + 1442695040888963407ull;
      buf[n++] = (char)('0' + (y >> 60) % 10);
    }
    if ((x >> 24) % 3 == 0) n += snprintf(buf + n, sizeof buf - (size_t)n, "e%d",
                                          (int)((x >> 32) % 61) - 30);
    buf[n] = '\0';
    check_decimal(buf, &fast);
  }
  assert_true(fast > 100000);      /* most of them went the fast way */
}

int main(void)
{
  ctx = eqp_ctx_new(NULL, NULL);
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_base_units),
    cmocka_unit_test(test_litre_symbols),
    cmocka_unit_test(test_errors_name_the_value),
    cmocka_unit_test(test_fast_decimal),
  };
  int rc = cmocka_run_group_tests(tests, NULL, NULL);
  eqp_ctx_free(ctx);
  return rc;
}
