/* Species loader: every kind of malformed entry gets file:line and nothing
** of a failed file is kept. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"

static const char water[] =
  "return {\n"
  "  sources = { w = 'test constants (invented for this test)' },\n"
  "  species = { { 'H2O' }, { 'H+' }, { 'OH-' }, { 'Na+' }, { 'Cl-' } },\n"
  "  reactions = { { 'OH-', from = { H2O = 1, ['H+'] = -1 }, logK = -14, source = 'w' } },\n"
  "  reagents = { { 'NaCl', gives = { ['Na+'] = 1, ['Cl-'] = 1 } } },\n"
  "}\n";

static eqp_ctx *base(void)
{
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  if (eqp_ctx_load_species_text(ctx, water, sizeof water - 1, "water.lua") != EQP_OK)
    fail_msg("%s", eqp_ctx_errmsg(ctx));
  return ctx;
}

/* Load text as "t.lua", expect failure with each needle in the message, and
** check nothing was added. */
static void expect_bad(const char *text, const char *n1, const char *n2)
{
  eqp_ctx *ctx = base();
  size_t ns = eqp_ctx_species_count(ctx), nr = eqp_ctx_reagent_count(ctx);
  int rc = eqp_ctx_load_species_text(ctx, text, strlen(text), "t.lua");
  if (rc != EQP_E_DATA) fail_msg("expected EQP_E_DATA, got %d (%s)", rc, eqp_ctx_errmsg(ctx));
  assert_contains(eqp_ctx_errmsg(ctx), n1);
  if (n2) assert_contains(eqp_ctx_errmsg(ctx), n2);
  assert_int_equal(eqp_ctx_species_count(ctx), ns);
  assert_int_equal(eqp_ctx_reagent_count(ctx), nr);
  eqp_ctx_free(ctx);
}

static void test_good_file(void **state)
{
  eqp_ctx *ctx = base();
  const char *t =
    "return {\n"
    "  sources = { s = 'test (invented)' },\n"
    "  species = { { 'HA' , formula = 'CH3COOH' }, { 'A-', formula = 'CH3COO-' } },\n"
    "  acids = { { 'HA', 'A-', pKa = 4.756, source = 's' } },\n"
    "  reagents = { { 'NaA', formula = 'CH3COONa', gives = { ['Na+'] = 1, ['A-'] = 1 },\n"
    "                 hydrates = { 3 }, names = { 'sodium acetate' } } },\n"
    "}\n";
  assert_int_equal(eqp_ctx_load_species_text(ctx, t, strlen(t), "t.lua"), EQP_OK);
  char *buf;
  assert_int_equal(eqp_ctx_describe(ctx, "NaA.3H2O", 298.15, EQP_FORMAT_TEXT, &buf), EQP_OK);
  assert_contains(buf, "136.0");                  /* molar mass of the trihydrate */
  eqp_free_string(buf);
  assert_int_equal(eqp_ctx_describe(ctx, "sodium acetate", 298.15, EQP_FORMAT_TEXT, &buf), EQP_OK);
  eqp_free_string(buf);
  assert_int_equal(eqp_ctx_describe(ctx, "HA", 298.15, EQP_FORMAT_TEXT, &buf), EQP_OK);
  assert_contains(buf, "pKa 4.756");
  eqp_free_string(buf);
  eqp_ctx_free(ctx);
}

static void test_malformed_entries(void **state)
{
  expect_bad("return {\n species = {\n { 'X+', size = 'big' },\n },\n}\n",
             "t.lua:3:", "expected a number");
  expect_bad("return {\n sources = { s = 'x' },\n species = { { 'Y' , formula = 'H2O2' } },\n"
             " reactions = {\n  { 'Y', from = { H2O = 1 }, logK = 1, source = 's' },\n }\n}\n",
             "t.lua:5:", "unbalanced reaction for 'Y'");
  expect_bad("return {\n sources = { s = 'x' },\n species = { { 'Z-', formula = 'OH-' } },\n"
             " reactions = { { 'Z-', from = { H2O = 1, ['H+'] = 1 }, logK = 1, source = 's' } }\n}\n",
             "t.lua:4:", "charge");
  expect_bad("return {\n species = { { 'H+' } },\n}\n", "t.lua:2:", "duplicate species 'H+'");
  expect_bad("return {\n sources = { s = 'x' },\n species = { { 'Q' , formula = 'H2O' } },\n"
             " reactions = { { 'Q', from = { Nope = 1 }, logK = 1, source = 's' } }\n}\n",
             "t.lua:4:", "unknown species 'Nope'");
  expect_bad("return {\n species = { { 'Q', formula = 'H2O' } },\n"
             " reactions = { { 'Q', from = { H2O = 1 }, logK = 1 } }\n}\n",
             "t.lua:3:", "names its source");
  expect_bad("return {\n sources = { s = 'x' },\n species = { { 'Q', formula = 'H2O' } },\n"
             " reactions = { { 'Q', from = { H2O = 1 }, logK = 1, source = 'zz' } }\n}\n",
             "t.lua:4:", "unknown source 'zz'");
  expect_bad("return {\n speceis = {},\n}\n", "t.lua:2:", "unknown field 'speceis'");
  expect_bad("return {\n sources = { s = 'x' },\n species = { { 'Q', formula = 'H2O' } },\n"
             " reactions = { { 'Q', from = { H2O = 1 }, logK = 1, logK_T = { a = 5 }, source = 's' } }\n}\n",
             "t.lua:4:", "temperature function for 'Q' gives 5.0000");
  expect_bad("return {\n reagents = {\n  { 'KCl', gives = { ['Na+'] = 1, ['Cl-'] = 1 } },\n }\n}\n",
             "t.lua:3:", "reagent 'KCl' is unbalanced");
  expect_bad("return {\n reagents = {\n  { 'NaCl', gives = { ['Na+'] = 1, ['Cl-'] = 1 } },\n }\n}\n",
             "t.lua:3:", "duplicate reagent 'NaCl'");
  expect_bad("return {\n reagents = {\n  { 'Na2O', gives = { ['Na+'] = 2 } },\n }\n}\n",
             "t.lua:3:", "unbalanced");
  expect_bad("return {\n sources = { s = 'x' },\n species = { { 'B', formula = 'C' } },\n"
             " acids = { { 'B', 'Cl-', pKa = 3, source = 's' } },\n}\n",
             "t.lua:4:", "unbalanced reaction for 'B'");
  expect_bad("return {\n sources = { s = 'x' },\n species = { { 'HB', formula = 'HCl' } },\n"
             " acids = { { 'HB', 'Cl-', pKa = { 3, 4 }, source = 's' } },\n}\n",
             "t.lua:4:", "2 values for 1 steps");
  expect_bad("return {\n species = { { 'Cu^2+', size = 6 } },\n}\n", "t.lua:2:", "needs a source");
  expect_bad("return {\n species = { { 'Xq' } },\n}\n", "t.lua:2:", "unknown element");
  expect_bad("return 42\n", "t.lua", "must return a table");
  expect_bad("return {\n species = { { 'A' }\n", "t.lua:", "expected");      /* syntax */
  expect_bad("while true do end\n", "instruction limit", NULL);
  expect_bad("local s = string.rep('x', 1 << 27)\nreturn {}\n", "t.lua", "memory");
  expect_bad("return { species = { { os.exit() } } }\n", "t.lua:1:", "os");   /* no os library */
}

static void test_multiple_problems_reported(void **state)
{
  eqp_ctx *ctx = base();
  const char *t = "return {\n species = {\n  { 'Li+', size = {} },\n  { 'Rb+', size = 'a' },\n }\n}\n";
  assert_int_equal(eqp_ctx_load_species_text(ctx, t, strlen(t), "t.lua"), EQP_E_DATA);
  assert_contains(eqp_ctx_errmsg(ctx), "t.lua:3:");
  assert_contains(eqp_ctx_errmsg(ctx), "t.lua:4:");
  assert_contains(eqp_ctx_errmsg(ctx), "(2 problems)");
  eqp_ctx_free(ctx);
}

static void test_library_loads(void **state)
{
  eqp_ctx *ctx = test_ctx();
  assert_true(eqp_ctx_species_count(ctx) >= 18);
  char *buf;
  assert_int_equal(eqp_ctx_describe(ctx, "H3PO4", 298.15, EQP_FORMAT_TEXT, &buf), EQP_OK);
  assert_contains(buf, "pKa 2.148");              /* Goldberg et al. (2002) */
  eqp_free_string(buf);
  assert_int_equal(eqp_ctx_describe(ctx, "nope", 298.15, EQP_FORMAT_TEXT, &buf), EQP_E_UNKNOWN);
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_good_file),
    cmocka_unit_test(test_malformed_entries),
    cmocka_unit_test(test_multiple_problems_reported),
    cmocka_unit_test(test_library_loads),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
