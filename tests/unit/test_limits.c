/* The limits of Lua sandboxes (limits.c, patterns.c) and the atomic file
** writer (atomic.c). The counted pattern functions are checked against the
** reference: Lua 5.4's own string library (liblua5.4 from Debian), on random
** patterns and subjects, results and error messages alike. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "limits_impl.h"
#include "atomic_impl.h"
#include <lauxlib.h>
#include <lualib.h>
#include <signal.h>
#include <sys/resource.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

/* A Lua state on the limits allocator with the stock libraries, the counted
** pattern functions in the global table cs, and the count hook. */
static lua_State *limited_state(eqpi_limits *lim, size_t mem, long long steps)
{
  eqpi_limits_init(lim, NULL, NULL, mem, steps);
  lua_State *L = lua_newstate(eqpi_limits_lua_alloc, lim);
  assert_non_null(L);
  luaL_openlibs(L);
  lua_newtable(L);
  eqpi_patterns_register(L, lim);
  lua_setglobal(L, "cs");
  eqpi_limits_hook(L, eqpi_limits_hookfn, 0);
  lim->L = L;
  return L;
}

static const char differential[] =
  "local toks = {'a','b','.','%a','%d','%s','[ab]','[^a]','[a-c]','%%','%(','(',')','()',\n"
  "  '%b()','%f[%w]','%f[%s]','%1','%2','*','+','-','?','x','1',' ','[]]','[^]]','%w','%W'}\n"
  "local subj = {'a','b','(',')','1',' ','x','c'}\n"
  "local function gen(n, set)\n"
  "  local t = {}\n"
  "  for i = 1, math.random(0, n) do t[#t + 1] = set[math.random(#set)] end\n"
  "  return table.concat(t)\n"
  "end\n"
  "local function pack(ok, ...) return {ok = ok, n = select('#', ...), ...} end\n"
  "local function same(x, y)\n"
  "  if x.ok ~= y.ok or x.n ~= y.n then return false end\n"
  "  for i = 1, x.n do if tostring(x[i]) ~= tostring(y[i]) then return false end end\n"
  "  return true\n"
  "end\n"
  "local function show(r)\n"
  "  local t = {tostring(r.ok)}\n"
  "  for i = 1, r.n do t[#t + 1] = tostring(r[i]) end\n"
  "  return table.concat(t, ', ')\n"
  "end\n"
  "local function all(it) local t = {} for i = 1, 40 do\n"
  "  local r = table.pack(it()) if r[1] == nil then break end\n"
  "  for k = 1, r.n do t[#t + 1] = tostring(r[k]) end t[#t + 1] = '|' end\n"
  "  return table.concat(t, ' ') end\n"
  "math.randomseed(20240611)\n"
  "local cases, fails = 0, {}\n"
  "local repls = {'<%0>', '%1-%2', '%%', '', '%3', '%x', {a = 'A', ['('] = false}, 7,\n"
  "  function(a, b) return b and a .. b or (a == 'b' and 'B' or nil) end}\n"
  "for i = 1, 20000 do\n"
  "  local p = (math.random() < 0.2 and '^' or '') .. gen(6, toks) ..\n"
  "            (math.random() < 0.2 and '$' or '')\n"
  "  local s = gen(12, subj)\n"
  "  local init = math.random(-3, 14)\n"
  "  local r = repls[math.random(#repls)]\n"
  "  local pairs_ = {\n"
  "    {pack(pcall(string.find, s, p, init)), pack(pcall(cs.find, s, p, init))},\n"
  "    {pack(pcall(string.find, s, p, init, true)), pack(pcall(cs.find, s, p, init, true))},\n"
  "    {pack(pcall(string.match, s, p, init)), pack(pcall(cs.match, s, p, init))},\n"
  "    {pack(pcall(string.gsub, s, p, r)), pack(pcall(cs.gsub, s, p, r))},\n"
  "    {pack(pcall(string.gsub, s, p, r, 2)), pack(pcall(cs.gsub, s, p, r, 2))},\n"
  "    {pack(pcall(function() return all(string.gmatch(s, p, init)) end)),\n"
  "     pack(pcall(function() return all(cs.gmatch(s, p, init)) end))},\n"
  "  }\n"
  "  for k, pr in ipairs(pairs_) do\n"
  "    cases = cases + 1\n"
  "    if not same(pr[1], pr[2]) and #fails < 5 then\n"
  "      fails[#fails + 1] = string.format('fn %d s=%q p=%q init=%d: lua {%s} counted {%s}',\n"
  "                                        k, s, p, init, show(pr[1]), show(pr[2]))\n"
  "    end\n"
  "  end\n"
  "end\n"
  "return cases, table.concat(fails, '\\n')\n";

/* Reference: Lua 5.4's string library itself, on 120,000 calls. */
static void test_patterns_match_lua(void **state)
{
  (void)state;
  eqpi_limits lim;
  lua_State *L = limited_state(&lim, 0, 0);
  if (luaL_dostring(L, differential) != LUA_OK) fail_msg("%s", lua_tostring(L, -1));
  lua_Integer cases = lua_tointeger(L, -2);
  const char *fails = lua_tostring(L, -1);
  if (fails && *fails) fail_msg("counted patterns differ from Lua's:\n%s", fails);
  assert_int_equal(cases, 120000);
  lua_close(L);
}

/* Backtracking inside C is charged: a pattern that would run for hours stops
** at the budget (a few seconds at most, even on a slow machine). */
static void test_pattern_bomb_stops(void **state)
{
  (void)state;
  static const char *const bombs[] = {
    "return cs.find(string.rep('a', 40), string.rep('a?', 40) .. string.rep('a', 40) .. 'b')",
    "local s = string.rep('a', 200000) return cs.find(s, '.-.-b')",
    "local s = string.rep('(', 100000) for i = 1, 100 do cs.gsub(s, '%b()', '') end",
    "local s = string.rep('a', 100000) for w in cs.gmatch(s, 'a-b') do end",
  };
  for (size_t i = 0; i < sizeof bombs / sizeof bombs[0]; i++) {
    eqpi_limits lim;
    lua_State *L = limited_state(&lim, 64u << 20, 20000000);
    clock_t t0 = clock();   /* processor time: the work, whatever the load */
    int rc = luaL_dostring(L, bombs[i]);
    assert_int_not_equal(rc, LUA_OK);
    assert_int_equal(lim.tripped, EQPI_TRIP_STEPS);
    assert_contains(lua_tostring(L, -1), "instruction limit reached (20000000 instructions");
    assert_true((double)(clock() - t0) / CLOCKS_PER_SEC < 30);
    lua_close(L);
  }
}

/* pcall cannot catch a reached limit and carry on: it raises again at once. */
static void test_pcall_cannot_catch(void **state)
{
  (void)state;
  eqpi_limits lim;
  lua_State *L = limited_state(&lim, 64u << 20, 1000000);
  int rc = luaL_dostring(L, "local n = 0 while true do n = n + 1 pcall(function() while true do "
                            "end end) end");
  assert_int_not_equal(rc, LUA_OK);
  assert_int_equal(lim.tripped, EQPI_TRIP_STEPS);
  assert_true(lim.steps < 1100000);
  lua_close(L);
  /* the same for the memory cap, with a collection between each try */
  L = limited_state(&lim, 8u << 20, 0);
  rc = luaL_dostring(L, "local t = {} while true do pcall(function() while true do "
                        "t[#t + 1] = {} end end) end");
  assert_int_not_equal(rc, LUA_OK);
  assert_int_equal(lim.tripped, EQPI_TRIP_MEMORY);
  assert_true(lim.peak <= (8u << 20));
  lua_close(L);
}

/* The cap counts Lua and engine memory; a refusal that Lua's collection
** cures is not the limit; the system's refusal is out of memory. */
typedef struct fail_after { size_t left; } fail_after;

static void *failing(void *ud, void *ptr, size_t osize, size_t nsize)
{
  fail_after *f = ud;
  (void)osize;
  if (nsize == 0) {
    free(ptr);
    return NULL;
  }
  if (nsize > f->left) return NULL;
  f->left -= nsize;
  return realloc(ptr, nsize);
}

static void test_allocator_accounting(void **state)
{
  (void)state;
  eqpi_limits lim;
  eqpi_limits_init(&lim, NULL, NULL, 1000, 0);
  void *a = eqpi_limits_engine_alloc(&lim, NULL, 0, 600);
  assert_non_null(a);
  assert_null(eqpi_limits_lua_alloc(&lim, NULL, 5, 500));    /* over the cap: refused */
  assert_int_equal(lim.tripped, EQPI_TRIP_NONE);             /* Lua may still retry */
  eqpi_limits_engine_alloc(&lim, a, 600, 0);
  void *b = eqpi_limits_lua_alloc(&lim, NULL, 5, 500);       /* the retry, after a collection */
  assert_non_null(b);
  assert_int_equal(lim.tripped, EQPI_TRIP_NONE);
  assert_int_equal(lim.used, 500);
  assert_null(eqpi_limits_engine_alloc(&lim, NULL, 0, 600)); /* the engine does not retry */
  assert_int_equal(lim.tripped, EQPI_TRIP_MEMORY);
  eqpi_limits_lua_alloc(&lim, b, 500, 0);
  assert_int_equal(lim.used, 0);
  assert_int_equal(lim.peak, 600);

  fail_after f = {100};
  eqpi_limits_init(&lim, failing, &f, 0, 0);
  assert_null(eqpi_limits_lua_alloc(&lim, NULL, 0, 200));
  assert_true(lim.oom);
  assert_int_equal(lim.tripped, EQPI_TRIP_NONE);
  assert_int_equal(lim.refusals, 0);
}

/* string.rep, table.concat and friends charge the work they do in C. */
static void test_bulk_calls_charged(void **state)
{
  (void)state;
  eqpi_limits lim;
  lua_State *L = limited_state(&lim, 0, 5000000);
  eqpi_limits_wrap_libs(L, &lim);
  int rc = luaL_dostring(L, "for i = 1, 100 do local s = ('x'):rep(1e6) end");   /* 100 MB */
  assert_int_not_equal(rc, LUA_OK);
  assert_int_equal(lim.tripped, EQPI_TRIP_STEPS);
  lua_close(L);
  L = limited_state(&lim, 0, 5000000);
  eqpi_limits_wrap_libs(L, &lim);
  rc = luaL_dostring(L, "while true do local s = (''):rep(1e15) end");
  assert_int_not_equal(rc, LUA_OK);
  assert_int_equal(lim.tripped, EQPI_TRIP_STEPS);
  lua_close(L);
  L = limited_state(&lim, 0, 50000000);
  eqpi_limits_wrap_libs(L, &lim);
  rc = luaL_dostring(L, "local t = {} for i = 1, 1000 do t[i] = i end "
                        "return table.concat(t, ','):len(), select('#', table.unpack(t))");
  if (rc != LUA_OK) fail_msg("%s", lua_tostring(L, -1));
  assert_int_equal(lua_tointeger(L, -1), 1000);
  lua_close(L);
}

static int fill_text(void *ud, FILE *f)
{
  return fputs(ud, f) < 0 ? EQP_E_IO : EQP_OK;
}

static int fill_fails(void *ud, FILE *f)
{
  (void)ud;
  fputs("half a file", f);
  return EQP_E_NOMEM;
}

static void read_back(const char *path, char *buf, size_t len)
{
  FILE *f = fopen(path, "rb");
  assert_non_null(f);
  size_t n = fread(buf, 1, len - 1, f);
  buf[n] = '\0';
  fclose(f);
}

/* No temporary file is left in the folder. */
static int leftovers(const char *dir)
{
  char cmd[600];
  snprintf(cmd, sizeof cmd, "ls -a '%s' | grep -c '\\.tmp$'", dir);
  FILE *p = popen(cmd, "r");
  int n = -1;
  if (p && fscanf(p, "%d", &n) != 1) n = -1;
  if (p) pclose(p);
  return n;
}

static void test_atomic_write(void **state)
{
  (void)state;
  char dir[] = "/tmp/eqp_atomicXXXXXX", path[300], buf[4096];
  assert_non_null(mkdtemp(dir));
  snprintf(path, sizeof path, "%s/out.csv", dir);
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  assert_int_equal(eqpi_write_atomic(ctx, path, fill_text, "good\n"), EQP_OK);
  chmod(path, 0640);
  /* a failing writer leaves the old file as it was */
  assert_int_equal(eqpi_write_atomic(ctx, path, fill_fails, NULL), EQP_E_NOMEM);
  read_back(path, buf, sizeof buf);
  assert_string_equal(buf, "good\n");
  /* so does a file-size limit (ulimit -f): write fails with EFBIG */
  static char big[200000];
  memset(big, 'x', sizeof big - 1);
  struct rlimit old, small = {65536, 0};
  getrlimit(RLIMIT_FSIZE, &old);
  small.rlim_max = old.rlim_max;
  void (*prev)(int) = signal(SIGXFSZ, SIG_IGN);
  setrlimit(RLIMIT_FSIZE, &small);
  int rc = eqpi_write_atomic(ctx, path, fill_text, big);
  setrlimit(RLIMIT_FSIZE, &old);
  signal(SIGXFSZ, prev);
  assert_int_equal(rc, EQP_E_WRITE);
  assert_contains(eqp_ctx_errmsg(ctx), "File too large");
  read_back(path, buf, sizeof buf);
  assert_string_equal(buf, "good\n");
  /* a success replaces it whole and keeps its permissions */
  assert_int_equal(eqpi_write_atomic(ctx, path, fill_text, "new\n"), EQP_OK);
  read_back(path, buf, sizeof buf);
  assert_string_equal(buf, "new\n");
  struct stat sb;
  assert_int_equal(stat(path, &sb), 0);
  assert_int_equal(sb.st_mode & 0777, 0640);
  /* not over a folder, nor into one that does not exist */
  assert_int_equal(eqpi_write_atomic(ctx, dir, fill_text, "x"), EQP_E_WRITE);
  snprintf(path, sizeof path, "%s/none/out.csv", dir);
  assert_int_equal(eqpi_write_atomic(ctx, path, fill_text, "x"), EQP_E_WRITE);
  assert_int_equal(leftovers(dir), 0);
  eqp_ctx_free(ctx);
  snprintf(buf, sizeof buf, "rm -rf '%s'", dir);
  assert_int_equal(system(buf), 0);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_patterns_match_lua),
    cmocka_unit_test(test_pattern_bomb_stops),
    cmocka_unit_test(test_pcall_cannot_catch),
    cmocka_unit_test(test_allocator_accounting),
    cmocka_unit_test(test_bulk_calls_charged),
    cmocka_unit_test(test_atomic_write),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
