/* What a run did, step by step, for the report: every call of the
** module's functions and of solution and curve methods is recorded with
** its script line, its arguments and what it returned; printed lines too.
** Also the progress line of long operations on a terminal. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include "../lua/lua_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <time.h>
#include <unistd.h>

#define JOURNAL "equipoise.journal"
#define JOURNAL_IDS "equipoise.journal.ids"   /* object -> "solution 2" (weak keys) */
#define JOURNAL_MAX 400                       /* entries kept in full */

/* ---------------------------------------------------------- progress */

typedef struct progress {
  struct timespec start, last;
  int shown;
  char what[64];
} progress;

static double seconds(const struct timespec *a, const struct timespec *b)
{
  return (double)(b->tv_sec - a->tv_sec) + 1e-9 * (double)(b->tv_nsec - a->tv_nsec);
}

/* One line, rewritten in place: only for runs longer than half a second,
** at most ten times a second, erased when the operation ends. */
static void show_progress(void *ud, const char *what, size_t done, size_t total)
{
  progress *p = ud;
  struct timespec now;
  clock_gettime(CLOCK_MONOTONIC, &now);
  if (strncmp(p->what, what, sizeof p->what - 1) != 0 || (total && done <= 1)) {
    snprintf(p->what, sizeof p->what, "%s", what);
    p->start = now;
    p->last = now;
    p->shown = 0;
  }
  int end = total && done >= total;
  if (end) {
    if (p->shown) fputs("\r\033[K", stderr);
    p->shown = 0;
    p->what[0] = '\0';
    return;
  }
  if (seconds(&p->start, &now) < 0.5 || (p->shown && seconds(&p->last, &now) < 0.1)) return;
  if (total) fprintf(stderr, "\r\033[K%s: %3.0f %%", what, 100.0 * (double)done / (double)total);
  else fprintf(stderr, "\r\033[K%s: %zu points", what, done);
  fflush(stderr);
  p->last = now;
  p->shown = 1;
}

static progress the_progress;

void cli_progress_attach(lua_State *L)
{
  if (!isatty(STDERR_FILENO)) return;   /* silent when piped or redirected */
  eqp_ctx *ctx = eqp_lua_context(L);
  if (ctx) eqp_ctx_set_progress(ctx, show_progress, &the_progress);
}

/* ----------------------------------------------------------- journal */

/* A growing line of text, cut at its capacity. */
typedef struct text { char s[1024]; size_t n; } text;

static void put(text *t, const char *s, size_t len)
{
  if (len > sizeof t->s - 1 - t->n) len = sizeof t->s - 1 - t->n;
  memcpy(t->s + t->n, s, len);
  t->n += len;
  t->s[t->n] = '\0';
}

static void puts_(text *t, const char *s) { put(t, s, strlen(s)); }

/* A short name for an object: "solution 2", "curve 1", ... */
static void object_name(lua_State *L, int idx, text *t)
{
  static const char *const kinds[][2] = {{EQPL_SOLUTION, "solution"}, {EQPL_RESULT, "result"},
                                         {EQPL_CURVE, "curve"}, {EQPL_PLOT, "plot"}};
  idx = lua_absindex(L, idx);
  lua_getfield(L, LUA_REGISTRYINDEX, JOURNAL_IDS);
  lua_pushvalue(L, idx);
  if (lua_rawget(L, -2) != LUA_TSTRING) {
    lua_pop(L, 1);
    const char *kind = "object";
    for (size_t k = 0; k < sizeof kinds / sizeof kinds[0]; k++)
      if (luaL_testudata(L, idx, kinds[k][0])) kind = kinds[k][1];
    lua_getfield(L, -1, kind);    /* counter per kind */
    lua_Integer n = lua_tointeger(L, -1) + 1;
    lua_pop(L, 1);
    lua_pushinteger(L, n);
    lua_setfield(L, -2, kind);
    lua_pushfstring(L, "%s %d", kind, (int)n);
    lua_pushvalue(L, idx);
    lua_pushvalue(L, -2);
    lua_rawset(L, -4);
  }
  puts_(t, lua_tostring(L, -1));
  lua_pop(L, 2);
}

static void describe(lua_State *L, int idx, text *t, int depth);

static void describe_table(lua_State *L, int idx, text *t, int depth)
{
  if (depth > 1) {
    puts_(t, "{...}");
    return;
  }
  puts_(t, "{");
  int n = 0;
  lua_Integer len = (lua_Integer)lua_rawlen(L, idx);
  for (lua_Integer i = 1; i <= len && n < 12; i++, n++) {
    if (n) puts_(t, ", ");
    lua_rawgeti(L, idx, i);
    describe(L, lua_gettop(L), t, depth + 1);
    lua_pop(L, 1);
  }
  lua_pushnil(L);
  while (lua_next(L, idx)) {
    if (lua_type(L, -2) == LUA_TSTRING && n < 12) {
      if (n++) puts_(t, ", ");
      puts_(t, lua_tostring(L, -2));
      puts_(t, " = ");
      describe(L, lua_gettop(L), t, depth + 1);
    }
    lua_pop(L, 1);
  }
  if (n >= 12) puts_(t, ", ...");
  puts_(t, "}");
}

/* The argument at idx as the script would have written it, shortened. */
static void describe(lua_State *L, int idx, text *t, int depth)
{
  char num[64];
  switch (lua_type(L, idx)) {
  case LUA_TSTRING: {
    size_t len;
    const char *s = lua_tolstring(L, idx, &len);
    puts_(t, "\"");
    put(t, s, len > 80 ? 80 : len);
    if (len > 80) puts_(t, "...");
    puts_(t, "\"");
    break;
  }
  case LUA_TNUMBER:
    snprintf(num, sizeof num, "%.10g", lua_tonumber(L, idx));
    puts_(t, num);
    break;
  case LUA_TBOOLEAN: puts_(t, lua_toboolean(L, idx) ? "true" : "false"); break;
  case LUA_TNIL: puts_(t, "nil"); break;
  case LUA_TTABLE: describe_table(L, idx, t, depth); break;
  case LUA_TUSERDATA: object_name(L, idx, t); break;
  default: puts_(t, luaL_typename(L, idx)); break;
  }
}

/* Append t (at the top, popped) to the journal, unless it is full. */
static void append(lua_State *L)
{
  lua_getfield(L, LUA_REGISTRYINDEX, JOURNAL);
  lua_Integer n = (lua_Integer)lua_rawlen(L, -1);
  if (n < JOURNAL_MAX) {
    lua_pushvalue(L, -2);
    lua_rawseti(L, -2, n + 1);
  } else {
    lua_getfield(L, -1, "dropped");
    lua_Integer d = lua_tointeger(L, -1);
    lua_pop(L, 1);
    lua_pushinteger(L, d + 1);
    lua_setfield(L, -2, "dropped");
  }
  lua_pop(L, 2);
}

static int script_line(lua_State *L)
{
  lua_Debug ar;
  for (int level = 1; lua_getstack(L, level, &ar); level++)
    if (lua_getinfo(L, "Sl", &ar) && ar.currentline > 0 && ar.source[0] == '@')
      return ar.currentline;
  return 0;
}

/* Upvalues: the original function, its name as written ("s:add"). */
static int journal_call(lua_State *L)
{
  int n = lua_gettop(L);
  int method = lua_toboolean(L, lua_upvalueindex(3));
  lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.journal.off");
  int off = lua_toboolean(L, -1);
  lua_pop(L, 1);
  if (off) {
    lua_pushvalue(L, lua_upvalueindex(1));
    lua_insert(L, 1);
    lua_call(L, n, LUA_MULTRET);
    return lua_gettop(L);
  }
  lua_createtable(L, 0, 5);
  int entry = lua_gettop(L);
  lua_pushstring(L, "step");
  lua_setfield(L, entry, "kind");
  lua_pushinteger(L, script_line(L));
  lua_setfield(L, entry, "line");
  text t = {{0}, 0};
  if (method && n >= 1) {
    describe(L, 1, &t, 0);
    puts_(&t, ":");
  }
  puts_(&t, lua_tostring(L, lua_upvalueindex(2)));
  puts_(&t, "(");
  for (int i = method ? 2 : 1; i <= n; i++) {
    if (i > (method ? 2 : 1)) puts_(&t, ", ");
    describe(L, i, &t, 0);
  }
  puts_(&t, ")");
  lua_pushstring(L, t.s);
  lua_setfield(L, entry, "call");
  const char *name = lua_tostring(L, lua_upvalueindex(2));
  const char *dot = strrchr(name, '.');
  lua_pushstring(L, dot ? dot + 1 : name);
  lua_setfield(L, entry, "name");
  if (method && n >= 1) {
    lua_pushvalue(L, 1);
    lua_setfield(L, entry, "self");
  }
  lua_pushvalue(L, entry);
  append(L);
  /* call the original with the same arguments */
  lua_pushvalue(L, lua_upvalueindex(1));
  for (int i = 1; i <= n; i++) lua_pushvalue(L, i);
  if (lua_pcall(L, n, LUA_MULTRET, 0) != LUA_OK) {
    lua_pushboolean(L, 1);
    lua_setfield(L, entry, "failed");
    return lua_error(L);     /* the same error value, so the command still classifies it */
  }
  int nres = lua_gettop(L) - entry;
  lua_createtable(L, nres, 0);
  for (int i = 1; i <= nres; i++) {
    lua_pushvalue(L, entry + i);
    lua_rawseti(L, -2, i);
  }
  lua_setfield(L, entry, "results");
  return nres;
}

/* Replace every function of the table at t by its journalled wrapper. */
static void wrap_table(lua_State *L, int t, const char *prefix, int method)
{
  t = lua_absindex(L, t);
  lua_pushnil(L);
  while (lua_next(L, t)) {
    if (lua_type(L, -2) == LUA_TSTRING && lua_type(L, -1) == LUA_TFUNCTION) {
      lua_pushvalue(L, -2);     /* key */
      lua_pushvalue(L, -2);     /* original */
      lua_pushfstring(L, "%s%s", prefix, lua_tostring(L, -2));
      lua_pushboolean(L, method);
      lua_pushcclosure(L, journal_call, 3);
      lua_rawset(L, t);         /* replacing an existing key keeps next() valid */
    }
    lua_pop(L, 1);
  }
}

/* Printed lines join the journal; they still go to stdout. */
static int journal_print(lua_State *L)
{
  int n = lua_gettop(L);
  luaL_Buffer b;
  luaL_buffinit(L, &b);
  for (int i = 1; i <= n; i++) {
    if (i > 1) luaL_addchar(&b, '\t');
    luaL_tolstring(L, i, NULL);
    luaL_addvalue(&b);
  }
  luaL_pushresult(&b);
  lua_createtable(L, 0, 3);
  lua_pushstring(L, "print");
  lua_setfield(L, -2, "kind");
  lua_pushvalue(L, -2);
  lua_setfield(L, -2, "text");
  lua_pushinteger(L, script_line(L));
  lua_setfield(L, -2, "line");
  append(L);
  lua_pushvalue(L, lua_upvalueindex(1));
  lua_insert(L, 1);
  lua_settop(L, n + 1);
  lua_call(L, n, 0);
  return 0;
}

void cli_journal_install(lua_State *L)
{
  int top = lua_gettop(L);
  lua_newtable(L);
  lua_setfield(L, LUA_REGISTRYINDEX, JOURNAL);
  lua_newtable(L);
  lua_createtable(L, 0, 1);
  lua_pushstring(L, "k");
  lua_setfield(L, -2, "__mode");
  lua_setmetatable(L, -2);
  lua_setfield(L, LUA_REGISTRYINDEX, JOURNAL_IDS);
  /* eq.* */
  lua_getglobal(L, "eq");
  if (lua_istable(L, -1)) wrap_table(L, -1, "eq.", 0);
  /* solution methods */
  if (luaL_getmetatable(L, EQPL_SOLUTION) == LUA_TTABLE &&
      lua_getfield(L, -1, "__index") == LUA_TTABLE)
    wrap_table(L, -1, "", 1);
  lua_settop(L, top);
  /* curve methods: the table behind the curve's __index */
  if (luaL_getmetatable(L, EQPL_CURVE) == LUA_TTABLE &&
      lua_getfield(L, -1, "__index") == LUA_TFUNCTION &&
      lua_getupvalue(L, -1, 2) && lua_istable(L, -1))
    wrap_table(L, -1, "", 1);
  lua_settop(L, top);
  lua_getglobal(L, "print");
  lua_pushcclosure(L, journal_print, 1);
  lua_setglobal(L, "print");
}
