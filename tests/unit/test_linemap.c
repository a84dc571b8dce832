/* Line map of species-file table constructors. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

static const char text[] =
  "-- comment with { braces }\n"                 /* 1 */
  "local x = { 1, 2 }\n"                         /* 2 */
  "return {\n"                                   /* 3 */
  "  about = [[long\n"                           /* 4 */
  "string { }]],\n"                              /* 5 */
  "  species = {\n"                              /* 6 */
  "    { \"H+\", size = 9 },\n"                  /* 7 */
  "    --[[ block\n"                             /* 8 */
  "    comment ]]\n"                             /* 9 */
  "    { 'OH-',\n"                               /* 10 */
  "      size = 3.5 },\n"                        /* 11 */
  "  },\n"                                       /* 12 */
  "  [\"reactions\"] = { { \"OH-\", from = { H2O = 1, [\"H+\"] = -1 } } },\n" /* 13 */
  "}\n";

static void test_paths_and_lines(void **state)
{
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  eqpi_linemap *lm = eqpi_linemap_build(ctx, text, sizeof text - 1);
  assert_non_null(lm);
  const char *p1[] = {"species", "1"};
  assert_int_equal(eqpi_linemap_line(lm, p1, 2), 7);
  const char *p2[] = {"species", "2", "size"};
  assert_int_equal(eqpi_linemap_line(lm, p2, 3), 11);
  const char *p3[] = {"species", "2"};
  assert_int_equal(eqpi_linemap_line(lm, p3, 2), 10);
  const char *p4[] = {"reactions", "1", "from", "H+"};
  assert_int_equal(eqpi_linemap_line(lm, p4, 4), 13);
  const char *p5[] = {"species", "9"};           /* unknown: nearest prefix */
  assert_int_equal(eqpi_linemap_line(lm, p5, 2), 6);
  const char *p6[] = {"nothing"};                /* no prefix: the return line */
  assert_int_equal(eqpi_linemap_line(lm, p6, 1), 3);
  eqpi_linemap_free(ctx, lm);
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {cmocka_unit_test(test_paths_and_lines)};
  return cmocka_run_group_tests(tests, NULL, NULL);
}
