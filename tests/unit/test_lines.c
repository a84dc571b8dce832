/* Line numbers of species files, as Lua itself records them while a file
** runs (sandbox.c): the same places the loader once found with a lexer of
** its own, and the places of entries a file makes with code. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "stage_impl.h"

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

static int line_of(eqp_ctx *ctx, const char *t, const char *const *path, int depth)
{
  return eqpi_lines_of_text(ctx, t, strlen(t), path, depth);
}

static void test_paths_and_lines(void **state)
{
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  const char *p1[] = {"species", "1"};
  assert_int_equal(line_of(ctx, text, p1, 2), 7);
  const char *p2[] = {"species", "2", "size"};
  assert_int_equal(line_of(ctx, text, p2, 3), 11);
  const char *p3[] = {"species", "2"};
  assert_int_equal(line_of(ctx, text, p3, 2), 10);
  const char *p4[] = {"reactions", "1", "from", "H+"};
  assert_int_equal(line_of(ctx, text, p4, 4), 13);
  const char *p5[] = {"species", "9"};           /* unknown: nearest prefix */
  assert_int_equal(line_of(ctx, text, p5, 2), 6);
  const char *p6[] = {"nothing"};                /* no prefix: the return line */
  assert_int_equal(line_of(ctx, text, p6, 1), 3);
  eqp_ctx_free(ctx);
}

/* Entries a file builds with code carry the line of the code that made
** them: a lexer of the text could only give the line of 'return'. */
static const char built[] =
  "local sp = {}\n"                                          /* 1 */
  "for i = 1, 3 do\n"                                        /* 2 */
  "  sp[i] = { 'X' .. i, formula = 'H2O' }\n"                 /* 3 */
  "end\n"                                                    /* 4 */
  "sp[4] = { 'Y',\n"                                         /* 5 */
  "  size = 'big' }\n"                                       /* 6 */
  "local t = { species = sp }\n"                             /* 7 */
  "t.sources =\n"                                            /* 8 */
  "  { s = 'x' }\n"                                          /* 9 */
  "return t\n";                                              /* 10 */

static void test_tables_built_with_code(void **state)
{
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  const char *p1[] = {"species", "2"};
  assert_int_equal(line_of(ctx, built, p1, 2), 3);
  const char *p2[] = {"species", "4", "size"};
  assert_int_equal(line_of(ctx, built, p2, 3), 6);
  const char *p3[] = {"species", "4"};
  assert_int_equal(line_of(ctx, built, p3, 2), 5);
  const char *p4[] = {"sources"};
  assert_int_equal(line_of(ctx, built, p4, 1), 9);
  /* and the loader reports them there */
  assert_int_equal(eqp_ctx_load_species_text(ctx, built, sizeof built - 1, "b.lua"),
                   EQP_E_DATA);
  assert_contains(eqp_ctx_errmsg(ctx), "b.lua:6: species[4].size: expected a number");
  eqp_ctx_free(ctx);
}

/* A table behaves as without the recording: fields set, replaced, removed,
** counted and walked as Lua does. */
static void test_tables_unchanged(void **state)
{
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  const char *t =
    "local t = { a = 1 }\n"
    "t.b = 2; t.a = nil; t.a = 3\n"
    "local n = 0\n"
    "for k, v in pairs(t) do n = n + v end\n"
    "assert(n == 5 and rawget(t, 'b') == 2 and #{ 1, 2, 3 } == 3)\n"
    "local l = {}; table.insert(l, 'x'); l[#l + 1] = 'y'\n"
    "assert(#l == 2 and l[2] == 'y')\n"
    "return {\n species = { { 'Z' .. n, formula = 'H2O' } } }\n";
  const char *p[] = {"species", "1"};
  assert_int_equal(line_of(ctx, t, p, 2), 9);
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_paths_and_lines),
    cmocka_unit_test(test_tables_built_with_code),
    cmocka_unit_test(test_tables_unchanged),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
