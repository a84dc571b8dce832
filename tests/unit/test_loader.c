/* Species loader: every kind of malformed entry gets file:line and nothing
** of a failed file is kept. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"
#include <lauxlib.h>
#include <lua.h>
#include <lualib.h>
#include <time.h>
#include <unistd.h>

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

/* A constant that is not a finite number is a data error at its line; it
** once passed as "absent" and the acid step was dropped without a word. */
static void test_non_finite_constants(void **state)
{
  const char *head = "return {\n sources = { s = 'x' },\n"
                     " species = { { 'HB', formula = 'HCl' }, { 'HC', formula = 'HCl' } },\n";
  char t[1024];
  snprintf(t, sizeof t, "%s acids = { { 'HB', 'Cl-', pKa = 0/0, source = 's' } },\n}\n", head);
  expect_bad(t, "t.lua:4:", "acids[1].pKa: NaN (0/0) is not a finite number");
  snprintf(t, sizeof t, "%s acids = { { 'HB', 'Cl-',\n  pKa = { 1/0 }, source = 's' } },\n}\n",
           head);
  expect_bad(t, "t.lua:5:", "acids[1].pKa[1]: inf is not a finite number");
  snprintf(t, sizeof t, "%s acids = { { 'HB', 'Cl-', pKa = 2, dH = -1/0, source = 's' } },\n}\n",
           head);
  expect_bad(t, "t.lua:4:", "dH: -inf is not a finite number");
  snprintf(t, sizeof t, "%s reactions = { { 'HC', from = { ['H+'] = 1, ['Cl-'] = 1 },\n"
           "  logK = 0/0, source = 's' } },\n}\n", head);
  expect_bad(t, "t.lua:5:", "logK: NaN (0/0) is not a finite number");
  expect_bad("return {\n reagents = {\n  { 'KCl', hydrates = { 0/0 },\n"
             "    gives = { ['Na+'] = 1, ['Cl-'] = 1 } },\n }\n}\n", "t.lua:3:",
             "not a finite number");
}

/* Hazard classes come from the fixed list of GHS keys. */
static void test_hazard_classes(void **state)
{
  expect_bad("return {\n reagents = {\n  { 'NaCl2', formula = 'NaCl', gives = { ['Na+'] = 1, "
             "['Cl-'] = 1 },\n    hazards = { 'eye-irritation', 'corossive' } },\n }\n}\n",
             "t.lua:4: reagents[1].hazards[2]: unknown hazard class 'corossive'", "did you mean");
  expect_bad("return {\n reagents = {\n  { 'NaCl2', formula = 'NaCl', gives = { ['Na+'] = 1, "
             "['Cl-'] = 1 }, hazards = { 'irritant' } },\n }\n}\n",
             "unknown hazard class 'irritant'", "skin-irritation or eye-irritation");
  eqp_ctx *ctx = base();
  const char *t = "return {\n reagents = {\n  { 'NaCl2', formula = 'NaCl', gives = { ['Na+'] = 1,"
                  " ['Cl-'] = 1 }, hazards = { 'skin-corrosion', 'metal-corrosive' } },\n }\n}\n";
  assert_int_equal(eqp_ctx_load_species_text(ctx, t, strlen(t), "t.lua"), EQP_OK);
  assert_int_equal(eqp_ctx_reagent_hazard_count(ctx, "NaCl2"), 2);
  assert_string_equal(eqp_ctx_reagent_hazard(ctx, "NaCl2", 1), "metal-corrosive");
  /* the keys are a fixed list, each naming its GHS class (UN GHS Rev. 9) */
  assert_true(eqp_hazard_key_count() >= 30);
  assert_contains(eqp_hazard_class("skin-corrosion"), "Skin corrosion/irritation, category 1");
  assert_contains(eqp_hazard_class("metal-corrosive"), "Corrosive to metals (GHS 2.16)");
  assert_null(eqp_hazard_class("corrosive"));
  for (size_t i = 0; i < eqp_hazard_key_count(); i++)
    assert_non_null(eqp_hazard_class(eqp_hazard_key(i)));
  eqp_ctx_free(ctx);
}

/* The text description of name: its status; *text freed here on the next
** call (and by free_text). */
static char *last_text;

static void free_text(void)
{
  eqp_free_string(last_text);
  last_text = NULL;
}

static int describe(eqp_ctx *ctx, const char *name, char **text)
{
  free_text();
  int rc = eqp_ctx_describe(ctx, name, 298.15, EQP_FORMAT_TEXT, &last_text);
  *text = last_text ? last_text : (char *)"";
  return rc;
}

static void write_file(const char *dir, const char *name, const char *text)
{
  char path[4096];
  snprintf(path, sizeof path, "%s/%s", dir, name);
  FILE *f = fopen(path, "w");
  assert_non_null(f);
  fputs(text, f);
  fclose(f);
}

static void remove_dir(const char *dir)
{
  char cmd[4200];
  snprintf(cmd, sizeof cmd, "rm -rf '%s'", dir);
  assert_int_equal(system(cmd), 0);
}

/* Loading the same file (or text, or folder) again is a no-op; it was a
** "duplicate species" error at the same file and line. */
static void test_load_twice(void **state)
{
  eqp_ctx *ctx = base();
  char dir[] = "/tmp/eqp-twice-XXXXXX", path[4096];
  assert_non_null(mkdtemp(dir));
  const char *t = "return {\n sources = { s = 'x' },\n species = { { 'HQ', formula = 'HCl' } },\n"
                  " acids = { { 'HQ', 'Cl-', pKa = -1, source = 's' } },\n}\n";
  write_file(dir, "q.lua", t);
  snprintf(path, sizeof path, "%s/q.lua", dir);
  assert_int_equal(eqp_ctx_load_species_file(ctx, path), EQP_OK);
  size_t n = eqp_ctx_species_count(ctx), nf = eqp_ctx_source_count(ctx);
  assert_int_equal(eqp_ctx_load_species_file(ctx, path), EQP_OK);
  snprintf(path, sizeof path, "%s/../%s/./q.lua", dir, strrchr(dir, '/') + 1);
  assert_int_equal(eqp_ctx_load_species_file(ctx, path), EQP_OK);   /* another spelling */
  assert_int_equal(eqp_ctx_load_species_dir(ctx, dir), EQP_OK);
  assert_int_equal(eqp_ctx_species_count(ctx), n);
  assert_int_equal(eqp_ctx_source_count(ctx), nf);
  /* the same text under the same name, too; different text is checked */
  assert_int_equal(eqp_ctx_load_species_text(ctx, water, sizeof water - 1, "water.lua"), EQP_OK);
  assert_int_equal(eqp_ctx_load_species_text(ctx, t, strlen(t), "other.lua"), EQP_E_DATA);
  assert_contains(eqp_ctx_errmsg(ctx), "duplicate species 'HQ'");
  remove_dir(dir);
  eqp_ctx_free(ctx);
}

/* An allocator for a Lua state that refuses to grow after `left` requests. */
typedef struct lua_budget {
  long left;
} lua_budget;

static void *budget_alloc(void *ud, void *p, size_t o, size_t n)
{
  lua_budget *b = ud;
  if (n == 0) {
    free(p);
    return NULL;
  }
  if ((!p || n > o) && b->left-- <= 0) return NULL;
  return realloc(p, n);
}

static const char inline_table[] =
  "local function strict(t)\n"
  "  return setmetatable(t, { __index = function(_, k) error('metamethod ran: ' .. k) end,\n"
  "                           __len = function() error('__len ran') end })\n"
  "end\n"
  "return strict{ sources = strict{ s = 'invented' },\n"
  "  species = strict{ strict{ 'HM', formula = 'C2H4O2' }, strict{ 'M-', formula = 'C2H3O2-' } },\n"
  "  acids = strict{ strict{ 'HM', 'M-', pKa = 4.5, dH = 0.1, source = 's' } },\n"
  "  reagents = strict{ strict{ 'NaM', formula = 'C2H3O2Na', gives = { ['Na+'] = 1, ['M-'] = 1 },\n"
  "                             hydrates = { 3 } } } }\n";

/* Load the inline table at idx into the context's library. */
static int load_table(eqp_ctx *ctx, lua_State *L, int idx, const char *where)
{
  eqpi_db *lib = NULL;
  int rc = eqpi_load_table(ctx, ctx->db, L, idx, where, &lib);
  if (rc == EQP_OK) eqpi_ctx_set_library(ctx, lib);
  return rc;
}

/* A script's inline table is read raw under lua_pcall: its metamethods
** never run, and a memory error at any point leaves nothing behind (the
** staging area once leaked when a metamethod raised). */
static void test_inline_table(void **state)
{
  lua_budget b = {1L << 40};
  lua_State *L = lua_newstate(budget_alloc, &b);
  assert_non_null(L);
  luaL_openlibs(L);
  assert_int_equal(luaL_dostring(L, inline_table), LUA_OK);
  eqp_ctx *ctx = base();
  assert_int_equal(load_table(ctx, L, -1, "t.lua:5 (inline species)"), EQP_OK);
  char *text;
  assert_int_equal(describe(ctx, "HM", &text), EQP_OK);
  assert_contains(text, "pKa 4.5");
  size_t n = eqp_ctx_species_count(ctx);
  assert_int_equal(load_table(ctx, L, -1, "t.lua:9 (inline species)"), EQP_OK);  /* no-op */
  assert_int_equal(eqp_ctx_species_count(ctx), n);
  eqp_ctx_free(ctx);
  /* memory runs out at each allocation in turn; the first budget that
  ** suffices loads the table */
  int ok = 0;
  for (long k = 0; k < 4000 && !ok; k++) {
    ctx = base();
    int top = lua_gettop(L);
    b.left = k;
    int rc = load_table(ctx, L, -1, "t.lua:5 (inline species)");
    b.left = 1L << 40;
    assert_int_equal(lua_gettop(L), top);
    if (rc == EQP_OK) ok = 1;
    else if (rc != EQP_E_NOMEM) fail_msg("budget %ld: %d %s", k, rc, eqp_ctx_errmsg(ctx));
    else assert_int_equal(eqp_ctx_species_count(ctx), 5);
    eqp_ctx_free(ctx);
  }
  assert_true(ok);
  lua_close(L);
  free_text();
}

/* The bound: generous, yet far below the quadratic load's minutes. An
** unoptimised sanitizer build runs this part about eight times slower. */
#if defined(__SANITIZE_ADDRESS__) || !defined(__OPTIMIZE__)
#define LOAD_BOUND 30.0
#else
#define LOAD_BOUND 5.0
#endif

/* Processor time of this process: the work done, which other programs on a
** busy machine do not inflate as they do the wall clock (9 s of wall clock
** for 1 s of work was seen with two cores shared by several builds). */
static double seconds(void)
{
  struct timespec t;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
  return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec;
}

/* A three-line file that makes 100,000 species (half of them formed from
** the other half, each neutral one also a reagent) loads in linear time:
** 68 s and more once (330 s on a busy machine), under a second now. */
static void test_many_species_timed(void **state)
{
  const char *t =
    "local sp, rx = {}, {}\n"
    "for i = 1, 50000 do sp[2*i-1] = { 'X' .. i, formula = 'H2O' }; sp[2*i] = { 'Y' .. i, "
    "formula = 'H2O' }; rx[i] = { 'Y' .. i, from = { ['X' .. i] = 1 }, logK = 0, source = 's' } end\n"
    "return { sources = { s = 'generated' }, species = sp, reactions = rx }\n";
  eqp_ctx *ctx = base();
  size_t n0 = eqp_ctx_species_count(ctx), r0 = eqp_ctx_reagent_count(ctx);
  double t0 = seconds();
  int rc = eqp_ctx_load_species_text(ctx, t, strlen(t), "many.lua");
  double dt = seconds() - t0;
  if (rc != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  print_message("100,000 species loaded in %.3f s of processor time\n", dt);
  assert_int_equal(eqp_ctx_species_count(ctx), n0 + 100000);
  assert_int_equal(eqp_ctx_reagent_count(ctx), r0 + 100000);
  char *text;
  assert_int_equal(describe(ctx, "Y49999", &text), EQP_OK);
  assert_contains(text, "X49999");
  eqp_ctx_free(ctx);
  if (dt > LOAD_BOUND)
    fail_msg("100,000 species took %.2f s of processor time (bound %g s)", dt, LOAD_BOUND);
  free_text();
}

/* The species path: the user's folders first, a file replacing the
** library's file of the same name with a notice; a broken file, and a file
** that needs it, left out with a notice, the rest loaded; a run that asks
** for what they define hears why. */
static void test_species_path(void **state)
{
  char dir[] = "/tmp/eqp-user-XXXXXX", edit[] = "/tmp/eqp-edit-XXXXXX", path[4096];
  assert_non_null(mkdtemp(dir));
  assert_non_null(mkdtemp(edit));
  const char *src = getenv("EQP_SOURCE_DIR");
  assert_non_null(src);
  /* a user's phthalate.lua: the library's with one more name for KHP */
  char *text;
  size_t len;
  {
    snprintf(path, sizeof path, "%s/species/phthalate.lua", src);
    FILE *f = fopen(path, "rb");
    assert_non_null(f);
    static char buf[65536];
    len = fread(buf, 1, sizeof buf - 1, f);
    fclose(f);
    buf[len] = '\0';
    char *p = strstr(buf, "\"KHP\" }");
    assert_non_null(p);
    static char edited[65600];
    snprintf(edited, sizeof edited, "%.*s\"KHP\", \"our KHP\" }%s", (int)(p - buf), buf,
             p + strlen("\"KHP\" }"));
    text = edited;
  }
  write_file(dir, "phthalate.lua", text);
  write_file(dir, "typo.lua", "return {\n species = { { 'Yq+', formula = 'K+' } }\n");
  const char *mine = "return {\n species = { { 'Zq+', formula = 'Na+' } },\n"
                     " reagents = { { 'ZqCl', formula = 'NaCl', gives = { ['Zq+'] = 1, ['Cl-'] = 1 },\n"
                     "   hazards = { 'corossive' } } },\n}\n";
  write_file(dir, "mine.lua", mine);
  write_file(dir, "needs.lua", "return {\n reagents = { { 'ZqOH', formula = 'NaOH',\n"
             "   gives = { ['Zq+'] = 1, ['OH-'] = 1 } } },\n"
             " species = { { 'Wq+', formula = 'K+' } },\n}\n");
  /* needs what needs.lua defines: left out in turn, for the same root */
  write_file(dir, "needs2.lua", "return {\n reagents = { { 'WqCl', formula = 'KCl',\n"
             "   gives = { ['Wq+'] = 1, ['Cl-'] = 1 } } },\n}\n");
  write_file(dir, "fine.lua", "return {\n reagents = { { 'NaKCl2', formula = 'NaKCl2',\n"
             "   gives = { ['Na+'] = 1, ['K+'] = 1, ['Cl-'] = 2 } } },\n}\n");

  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  assert_int_equal(eqp_ctx_add_species_dir(ctx, dir), EQP_OK);
  assert_int_equal(eqp_ctx_load_default_library(ctx), EQP_OK);
  assert_int_equal(eqp_ctx_errcode(ctx), EQP_OK);
  char all[8192] = "";
  for (size_t i = 0; i < eqp_ctx_notice_count(ctx); i++)
    snprintf(all + strlen(all), sizeof all - strlen(all), "%s\n", eqp_ctx_notice(ctx, i));
  assert_contains(all, "phthalate.lua replaces the built-in ");
  assert_contains(all, "typo.lua was left out");
  assert_contains(all, "mine.lua was left out");
  assert_contains(all, "unknown hazard class 'corossive'");
  /* one notice for the root cause, naming the files left out with it (a
  ** cascade of one notice per dependent file before) */
  assert_contains(all, "Left out with it, as they need what it defines: ");
  assert_contains(all, "needs.lua:2: reagent 'ZqOH' gives unknown species 'Zq+'");
  assert_contains(all, "needs2.lua:2: reagent 'WqCl' gives unknown species 'Wq+'");
  assert_null(strstr(all, "needs.lua was left out"));
  assert_null(strstr(all, "needs2.lua was left out"));
  assert_int_equal(eqp_ctx_notice_count(ctx), 3);
  assert_int_equal(describe(ctx, "our KHP", &text), EQP_OK);
  assert_contains(text, "KHC8H4O4");
  assert_int_equal(describe(ctx, "NaKCl2", &text), EQP_OK);   /* the rest */
  assert_int_equal(describe(ctx, "KH2PO4", &text), EQP_OK);
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1;
  o.temperature_K = 298.15;
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "ZqCl", "1 mmol"), EQP_E_UNKNOWN);
  assert_contains(eqp_ctx_errmsg(ctx), "defined in ");
  assert_contains(eqp_ctx_errmsg(ctx), "mine.lua, which was left out");
  assert_int_equal(eqp_solution_add_str(s, "ZqOH", "1 mmol"), EQP_E_UNKNOWN);
  assert_contains(eqp_ctx_errmsg(ctx), "needs.lua, which was left out");
  assert_int_equal(eqp_solution_add_str(s, "WqCl", "1 mmol"), EQP_E_UNKNOWN);
  assert_contains(eqp_ctx_errmsg(ctx), "needs2.lua, which was left out");
  assert_int_equal(eqp_solution_add_str(s, "NaKCl2", "1 mmol"), EQP_OK);
  eqp_solution_free(s);
  eqp_ctx_free(ctx);

  /* checking an edited copy: it replaces the user's file of the same name */
  write_file(edit, "mine.lua", "return {\n species = { { 'Zq+', formula = 'Na+' } },\n"
             " reagents = { { 'ZqCl', formula = 'NaCl', gives = { ['Zq+'] = 1, ['Cl-'] = 1 },\n"
             "   hazards = { 'eye-damage' } } },\n}\n");
  snprintf(path, sizeof path, "%s/mine.lua", edit);
  ctx = eqp_ctx_new(NULL, NULL);
  assert_int_equal(eqp_ctx_add_species_dir(ctx, dir), EQP_OK);
  size_t nsp = 99;
  int rc = eqp_ctx_check_species_file(ctx, path, &nsp);
  if (rc != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  assert_int_equal(nsp, 1);
  assert_int_equal(describe(ctx, "ZqOH", &text), EQP_OK);   /* needs.lua too */
  eqp_ctx_free(ctx);
  /* and the broken file itself is checked strictly, every problem at its line */
  ctx = eqp_ctx_new(NULL, NULL);
  assert_int_equal(eqp_ctx_add_species_dir(ctx, dir), EQP_OK);
  snprintf(path, sizeof path, "%s/mine.lua", dir);
  assert_int_equal(eqp_ctx_check_species_file(ctx, path, NULL), EQP_E_DATA);
  assert_contains(eqp_ctx_errmsg(ctx), "mine.lua:4: reagents[1].hazards[1]: unknown hazard class");
  eqp_ctx_free(ctx);
  remove_dir(dir);
  remove_dir(edit);
  free_text();
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
  for (size_t i = 0; i < eqp_ctx_notice_count(ctx); i++)
    print_message("notice: %s\n", eqp_ctx_notice(ctx, i));
  assert_int_equal(eqp_ctx_notice_count(ctx), 0);   /* every file of the library loads */
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_good_file),
    cmocka_unit_test(test_malformed_entries),
    cmocka_unit_test(test_non_finite_constants),
    cmocka_unit_test(test_hazard_classes),
    cmocka_unit_test(test_load_twice),
    cmocka_unit_test(test_inline_table),
    cmocka_unit_test(test_many_species_timed),
    cmocka_unit_test(test_species_path),
    cmocka_unit_test(test_multiple_problems_reported),
    cmocka_unit_test(test_library_loads),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
