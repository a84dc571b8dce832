/* species check: a metal complex's log K without the conditions it was
** measured at (ionic strength, temperature) is a warning at its line, not a
** load error; a malformed 'measured' field is an error. The constants here
** are invented for the test: only the checks are under test. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

/* Builds on the library: Ca^2+, OH-, H+ from it; a ligand of our own. */
#define HEAD \
  "return {\n" \
  "  sources = { s = 'test constants (invented for this test)' },\n"
#define BODY \
  "  species = { { 'Lq^2-', formula = 'C2O4^2-' }, { 'HLq-', formula = 'HC2O4-' },\n" \
  "              { 'CaLq(aq)', formula = 'CaC2O4' }, { 'CaHLq+', formula = 'CaHC2O4+' } },\n" \
  "  acids = { { 'HLq-', 'Lq^2-', pKa = 4.2, source = 's' } },\n" \
  "  reactions = {\n" \
  "    { 'CaLq(aq)', from = { ['Ca^2+'] = 1, ['Lq^2-'] = 1 }, logK = 3.0, source = 's' },\n" \
  "    { 'CaHLq+', from = { ['Ca^2+'] = 1, ['HLq-'] = 1 }, logK = 1.0, source = 's',\n" \
  "      measured = { I = 0.1, t = 25, medium = 'KCl', to_I0 = 'davies' } },\n" \
  "  },\n" \
  "}\n"

/* Check text as file name in a folder of its own; returns the status and
** the notices joined into out. */
static int check_text(const char *name, const char *text, char *out, size_t len)
{
  char dir[] = "/tmp/eqp-check-XXXXXX", path[4096], cmd[4200];
  assert_non_null(mkdtemp(dir));
  snprintf(path, sizeof path, "%s/%s", dir, name);
  FILE *f = fopen(path, "w");
  assert_non_null(f);
  fputs(text, f);
  fclose(f);
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  assert_non_null(ctx);
  int rc = eqp_ctx_check_species_file(ctx, path, NULL);
  out[0] = '\0';
  if (rc < 0) snprintf(out, len, "%s", eqp_ctx_errmsg(ctx));
  for (size_t i = 0; i < eqp_ctx_notice_count(ctx); i++) {
    size_t used = strlen(out);
    snprintf(out + used, len - used, "%s\n", eqp_ctx_notice(ctx, i));
  }
  eqp_ctx_free(ctx);
  snprintf(cmd, sizeof cmd, "rm -rf '%s'", dir);
  assert_int_equal(system(cmd), 0);
  return rc;
}

static void test_complex_without_conditions(void **state)
{
  (void)state;
  char out[4096];
  assert_int_equal(check_text("cx.lua", HEAD BODY, out, sizeof out), EQP_OK);
  /* the complex at line 7 says nothing; the one at line 8 does; the acid
  ** step is no metal complex */
  assert_contains(out, "cx.lua:7: log K of CaLq(aq) has no conditions (measured = { I =, t = })");
  assert_null(strstr(out, "CaHLq+"));
  assert_null(strstr(out, "HLq-"));
}

static void test_file_default_conditions(void **state)
{
  (void)state;
  char out[4096];
  assert_int_equal(check_text("cy.lua", HEAD "  measured = { I = 0, t = 25 },\n" BODY, out,
                              sizeof out), EQP_OK);
  assert_null(strstr(out, "no conditions"));
}

/* A hydroxo complex is a metal complex too (formed from water or OH-). */
static void test_hydroxo_complex(void **state)
{
  (void)state;
  char out[4096];
  const char *t = HEAD
    "  species = { { 'CaOHq+', formula = 'CaOH+' } },\n"
    "  reactions = { { 'CaOHq+', from = { ['Ca^2+'] = 1, H2O = 1, ['H+'] = -1 }, logK = -12.8,\n"
    "                  source = 's' } },\n"
    "}\n";
  assert_int_equal(check_text("cz.lua", t, out, sizeof out), EQP_OK);
  assert_contains(out, "cz.lua:4: log K of CaOHq+ has no conditions");
}

static void expect_bad(const char *measured, const char *needle)
{
  char text[2048], out[4096];
  snprintf(text, sizeof text, HEAD "  measured = %s,\n" BODY, measured);
  assert_int_equal(check_text("bad.lua", text, out, sizeof out), EQP_E_DATA);
  assert_contains(out, "bad.lua:3:");
  assert_contains(out, needle);
}

static void test_bad_measured(void **state)
{
  (void)state;
  expect_bad("{ I = 0.1, t = 25, to_I0 = 'davies', tmp = 1 }", "unknown field 'tmp'");
  expect_bad("{ I = 20, t = 25, to_I0 = 'davies' }", "20 is outside 0..10");
  expect_bad("{ I = 0, t = 150 }", "150 is outside 0..100");
  expect_bad("{ I = 0 }", "measured.t: missing");
  expect_bad("{ I = 0.1, t = 25 }", "needs to_I0");
  expect_bad("{ I = 0.1, t = 25, to_I0 = 'guess' }", "unknown method 'guess'");
  expect_bad("{ I = 0, t = 25, to_I0 = 'davies' }", "to_I0 is for a constant measured at I > 0");
  expect_bad("{ I = 0, t = 25, medium = 3 }", "expected a string");
  expect_bad("0.1", "expected a table");
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_complex_without_conditions),
    cmocka_unit_test(test_file_default_conditions),
    cmocka_unit_test(test_hydroxo_complex),
    cmocka_unit_test(test_bad_measured),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
