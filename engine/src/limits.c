/* Limits on Lua code: memory cap in the allocator, instruction budget in a
** count hook, and work done inside C functions charged to the same budget. */
/* SPDX-License-Identifier: MIT */
#include "limits_impl.h"
#include <lauxlib.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define HOOK_EVERY 1000          /* instructions between count events */
#define BYTES_PER_STEP 64        /* allocated bytes charged as one instruction */

static void *plain_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  (void)ud; (void)osize;
  if (nsize == 0) {
    free(ptr);
    return NULL;
  }
  return realloc(ptr, nsize);
}

void eqpi_limits_init(eqpi_limits *lim, eqp_alloc_fn base, void *base_ud, size_t max_mem,
                      long long max_steps)
{
  memset(lim, 0, sizeof *lim);
  lim->base = base ? base : plain_alloc;
  lim->base_ud = base_ud;
  lim->max_mem = max_mem;
  lim->max_steps = max_steps;
  lim->cpu_start = clock();
}

/*
** Lua answers a refused allocation with a full collection and one retry of
** the same request; only a refusal that survives the retry, or that nobody
** retries (the engine's, a string buffer's: the next request that grows is
** another one), is the limit really reached.
*/
/* The limit is reached: make the hook of the script's thread raise at its
** next instruction (lua_sethook may be called at any time, even from a
** signal handler, so it may be called from inside an allocation). */
static void trip_memory(eqpi_limits *lim)
{
  lim->pending = 0;
  if (lim->tripped) return;
  lim->tripped = EQPI_TRIP_MEMORY;
  if (lim->L) {
    lua_Hook h = lua_gethook(lim->L);
    lua_sethook(lim->L, h ? h : eqpi_limits_hookfn, lua_gethookmask(lim->L) | LUA_MASKCOUNT, 1);
  }
}

static void *limits_alloc(eqpi_limits *lim, void *ptr, size_t osize, size_t nsize, int engine)
{
  int type = ptr ? -1 : (int)osize;
  if (!ptr) osize = 0;   /* for a new block Lua passes the object type here */
  if (nsize == 0) {
    if (ptr) lim->base(lim->base_ud, ptr, osize, 0);
    lim->used -= osize;
    if (engine) lim->engine_live -= osize;
    return NULL;
  }
  if (lim->pending && nsize > osize && (lim->pend_ptr != ptr || lim->pend_size != nsize))
    trip_memory(lim);   /* nobody retried it */
  if (nsize > osize && lim->max_mem && (nsize - osize > lim->max_mem - lim->used)) {
    lim->refusals++;
    if (engine || (lim->pending && lim->pend_ptr == ptr && lim->pend_size == nsize)) {
      trip_memory(lim);
    } else {
      lim->pending = 1;
      lim->pend_ptr = ptr;
      lim->pend_size = nsize;
    }
    return NULL;
  }
  void *p = lim->base(lim->base_ud, ptr, osize, nsize);
  if (!p) {
    lim->oom = 1;
    return NULL;
  }
  lim->pending = 0;
  lim->used = lim->used - osize + nsize;
  if (lim->used > lim->peak) lim->peak = lim->used;
  if (engine) lim->engine_live = lim->engine_live - osize + nsize;
  else if (nsize > osize) lim->steps += (long long)((nsize - osize) / BYTES_PER_STEP);
  if (!engine && type > 0 && lim->on_object) lim->on_object(lim->on_object_ud, p, type);
  return p;
}

void *eqpi_limits_lua_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  return limits_alloc(ud, ptr, osize, nsize, 0);
}

void *eqpi_limits_engine_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  return limits_alloc(ud, ptr, osize, nsize, 1);
}

eqpi_limits *eqpi_limits_of(lua_State *L)
{
  void *ud;
  return lua_getallocf(L, &ud) == eqpi_limits_lua_alloc ? ud : NULL;
}

void eqpi_lua_where(lua_State *L, char *buf, size_t len)
{
  lua_Debug ar;
  buf[0] = '\0';
  for (int level = 0; lua_getstack(L, level, &ar); level++) {
    if (lua_getinfo(L, "Sl", &ar) && ar.currentline > 0) {
      snprintf(buf, len, "%s:%d", ar.short_src, ar.currentline);
      return;
    }
  }
}

/* 1073741824 -> "1 GiB", 33554432 -> "32 MiB", 1500 -> "1500 bytes" */
static const char *size_text(size_t n, char *buf, size_t len)
{
  static const char *const units[] = {"bytes", "KiB", "MiB", "GiB", "TiB"};
  int u = 0;
  while (u < 4 && n >= 1024 && n % 1024 == 0) {
    n /= 1024;
    u++;
  }
  snprintf(buf, len, "%zu %s", n, units[u]);
  return buf;
}

void eqpi_limits_message(const eqpi_limits *lim, char *buf, size_t len)
{
  char size[32];
  const char *sep = lim->where[0] ? ": " : "";
  if (lim->tripped == EQPI_TRIP_STEPS)
    snprintf(buf, len, "%s%sinstruction limit reached (%lld instructions%s%s)", lim->where, sep,
             lim->max_steps, lim->steps_hint ? "; " : "", lim->steps_hint ? lim->steps_hint : "");
  else if (lim->tripped == EQPI_TRIP_MEMORY)
    snprintf(buf, len, "%s%smemory limit reached (%s%s%s)", lim->where, sep,
             size_text(lim->max_mem, size, sizeof size), lim->mem_hint ? "; " : "",
             lim->mem_hint ? lim->mem_hint : "");
  else if (lim->tripped == EQPI_TRIP_CPU)
    snprintf(buf, len, "%s%stime limit reached (%g s of processor time%s%s)", lim->where, sep,
             lim->max_cpu, lim->mem_hint ? "; " : "", lim->mem_hint ? lim->mem_hint : "");
  else
    snprintf(buf, len, "%s%sno limit reached", lim->where, sep);
}

/* From now on every instruction raises again, in every pcall that catches it. */
static int raise_tripped(lua_State *L, eqpi_limits *lim, lua_Debug *ar)
{
  lua_Hook h = lua_gethook(L);
  lua_sethook(L, h ? h : eqpi_limits_hookfn, lua_gethookmask(L) | LUA_MASKCOUNT, 1);
  if (!lim->where[0]) {
    if (ar && lua_getinfo(L, "Sl", ar) && ar->currentline > 0)
      snprintf(lim->where, sizeof lim->where, "%s:%d", ar->short_src, ar->currentline);
    else
      eqpi_lua_where(L, lim->where, sizeof lim->where);
  }
  char msg[512];
  eqpi_limits_message(lim, msg, sizeof msg);
  lua_pushstring(L, msg);
  return lua_error(L);
}

void eqpi_limits_charge(lua_State *L, eqpi_limits *lim, long long n)
{
  if (lim->tripped) raise_tripped(L, lim, NULL);
  lim->steps += n > 0 ? n : 0;
  if (lim->max_steps && lim->steps > lim->max_steps) {
    lim->tripped = EQPI_TRIP_STEPS;
    raise_tripped(L, lim, NULL);
  }
}

void eqpi_limits_on_count(lua_State *L, eqpi_limits *lim, lua_Debug *ar)
{
  if (!lim->tripped) {
    lim->steps += lua_gethookcount(L);
    if (lim->max_steps && lim->steps > lim->max_steps) lim->tripped = EQPI_TRIP_STEPS;
    else if (lim->max_cpu > 0 &&
             (double)(clock() - lim->cpu_start) / CLOCKS_PER_SEC > lim->max_cpu)
      lim->tripped = EQPI_TRIP_CPU;
  }
  if (lim->tripped) raise_tripped(L, lim, ar);
  eqpi_limits_collect(L, lim);
}

/* The collector does not see engine memory: when the engine has grown by an
** eighth of the cap (or 64 MiB) since the last time, collect, so that the
** handles of dead solutions give their memory back. */
void eqpi_limits_collect(lua_State *L, eqpi_limits *lim)
{
  size_t slack = lim->max_mem ? lim->max_mem / 8 : (size_t)64 << 20;
  if (lim->engine_live > lim->engine_at_gc + slack) {
    lua_gc(L, LUA_GCCOLLECT);
    lim->engine_at_gc = lim->engine_live;
  }
}

void eqpi_limits_hookfn(lua_State *L, lua_Debug *ar)
{
  eqpi_limits *lim = eqpi_limits_of(L);
  if (lim && ar->event == LUA_HOOKCOUNT) eqpi_limits_on_count(L, lim, ar);
}

void eqpi_limits_hook(lua_State *L, lua_Hook hook, int extra_mask)
{
  /* a limit below the hook's interval is checked at the limit itself (a
  ** script of 400 instructions ran to its end under a limit of 10) */
  const eqpi_limits *lim = eqpi_limits_of(L);
  int every = lim && lim->max_steps > 0 && lim->max_steps < HOOK_EVERY ? (int)lim->max_steps
                                                                        : HOOK_EVERY;
  lua_sethook(L, hook, LUA_MASKCOUNT | extra_mask, every);
}

/* ------------------------------------------------------------ bulk calls */

enum { W_RANGE, W_COUNT_ARGS, W_TABLE, W_TABLE_LOG, W_MOVE, W_REP, W_LEN, W_GC };

static lua_Integer clampi(lua_Integer v, lua_Integer lo, lua_Integer hi)
{
  return v < lo ? lo : v > hi ? hi : v;
}

/* Elements from i to j (1-based, negative from the end) of something of length n. */
static long long range(lua_State *L, int ai, int aj, lua_Integer n, lua_Integer di, lua_Integer dj)
{
  lua_Integer i = lua_isinteger(L, ai) ? lua_tointeger(L, ai) : di;
  lua_Integer j = lua_isinteger(L, aj) ? lua_tointeger(L, aj) : dj;
  if (i < 0) i = n + i + 1;
  if (j < 0) j = n + j + 1;
  i = clampi(i, 1, n + 1);
  j = clampi(j, 0, n);
  return j >= i ? (long long)(j - i + 1) : 0;
}

/* The cost of a call, in instructions, judged from its arguments. */
static long long cost(lua_State *L, int kind)
{
  size_t len = 0;
  switch (kind) {
  case W_RANGE:     /* string.byte, utf8.codepoint (s, i, j) and table.unpack (t, i, j) */
    if (lua_type(L, 1) == LUA_TSTRING) {
      lua_tolstring(L, 1, &len);
      return range(L, 2, 3, (lua_Integer)len, 1, lua_isinteger(L, 2) ? lua_tointeger(L, 2) : 1);
    }
    if (lua_type(L, 1) == LUA_TTABLE) {
      lua_Integer n = (lua_Integer)lua_rawlen(L, 1);
      lua_Integer i = lua_isinteger(L, 2) ? lua_tointeger(L, 2) : 1;
      lua_Integer j = lua_isinteger(L, 3) ? lua_tointeger(L, 3) : n;
      return j >= i && (lua_Unsigned)j - (lua_Unsigned)i < (1ull << 62) ? (long long)(j - i) + 1 : 0;
    }
    return 1;
  case W_COUNT_ARGS: return lua_gettop(L);
  case W_TABLE:      /* table.insert / remove / concat: proportional to the length */
    return lua_type(L, 1) == LUA_TTABLE ? (long long)lua_rawlen(L, 1) + 1 : 1;
  case W_TABLE_LOG: {
    long long n = lua_type(L, 1) == LUA_TTABLE ? (long long)lua_rawlen(L, 1) : 0, lg = 1;
    while ((1ll << lg) < n && lg < 62) lg++;
    return n * lg + 1;
  }
  case W_MOVE: {    /* table.move(a1, f, e, t) */
    lua_Integer f = lua_isinteger(L, 2) ? lua_tointeger(L, 2) : 1;
    lua_Integer e = lua_isinteger(L, 3) ? lua_tointeger(L, 3) : 0;
    return e >= f && (lua_Unsigned)e - (lua_Unsigned)f < (1ull << 62) ? (long long)(e - f) + 1 : 1;
  }
  case W_REP: {     /* string.rep(s, n, sep): n copies, even of "" */
    size_t lsep = 0;
    if (lua_type(L, 1) == LUA_TSTRING) lua_tolstring(L, 1, &len);
    if (lua_type(L, 3) == LUA_TSTRING) lua_tolstring(L, 3, &lsep);
    lua_Integer n = lua_isinteger(L, 2) ? lua_tointeger(L, 2)
                  : lua_type(L, 2) == LUA_TNUMBER ? (lua_Integer)lua_tonumber(L, 2) : 0;
    if (n <= 0) return 1;
    /* a result that cannot fit is refused by the allocator: the memory limit */
    eqpi_limits *lim = lua_touserdata(L, lua_upvalueindex(2));
    double bytes = (double)n * (double)(len + lsep);
    if (lim->max_mem && bytes > (double)(lim->max_mem - lim->used)) return 1;
    double c = (double)n / 8 + bytes / BYTES_PER_STEP;
    return c > 4e18 ? (long long)4e18 : (long long)c;
  }
  case W_LEN:       /* utf8.len, utf8.offset, rawequal: proportional to string lengths */
    for (int i = 1; i <= lua_gettop(L) && i <= 2; i++)
      if (lua_type(L, i) == LUA_TSTRING) {
        size_t l;
        lua_tolstring(L, i, &l);
        len += l;
      }
    return (long long)(len / 16) + 1;
  case W_GC: {      /* a full collection walks the whole heap */
    const char *opt = luaL_optstring(L, 1, "collect");
    if (strcmp(opt, "count") == 0 || strcmp(opt, "isrunning") == 0) return 1;
    eqpi_limits *lim = lua_touserdata(L, lua_upvalueindex(2));
    return (long long)(lim->used / BYTES_PER_STEP) + 1;
  }
  }
  return 1;
}

/* Upvalues: the original C function, the limits, the kind of cost. The
** original runs in this call frame, so its error messages name the function
** the script called. */
static int counted_call(lua_State *L)
{
  lua_CFunction f = lua_tocfunction(L, lua_upvalueindex(1));
  eqpi_limits *lim = lua_touserdata(L, lua_upvalueindex(2));
  eqpi_limits_charge(L, lim, cost(L, (int)lua_tointeger(L, lua_upvalueindex(3))));
  return f(L);
}

static void wrap(lua_State *L, eqpi_limits *lim, const char *lib, const char *name, int kind)
{
  if (lib) {
    if (lua_getglobal(L, lib) != LUA_TTABLE) {
      lua_pop(L, 1);
      return;
    }
  } else {
    lua_pushglobaltable(L);
  }
  lua_getfield(L, -1, name);
  lua_CFunction f = lua_tocfunction(L, -1);
  lua_pop(L, 1);
  if (f) {
    lua_pushcfunction(L, f);
    lua_pushlightuserdata(L, lim);
    lua_pushinteger(L, kind);
    lua_pushcclosure(L, counted_call, 3);
    lua_setfield(L, -2, name);
  }
  lua_pop(L, 1);
}

void eqpi_limits_wrap_libs(lua_State *L, eqpi_limits *lim)
{
  static const struct { const char *lib, *name; int kind; } bulk[] = {
    {"string", "byte", W_RANGE}, {"string", "char", W_COUNT_ARGS}, {"string", "rep", W_REP},
    {"table", "unpack", W_RANGE}, {"table", "pack", W_COUNT_ARGS}, {"table", "insert", W_TABLE},
    {"table", "remove", W_TABLE}, {"table", "concat", W_TABLE}, {"table", "sort", W_TABLE_LOG},
    {"table", "move", W_MOVE}, {"utf8", "codepoint", W_RANGE}, {"utf8", "char", W_COUNT_ARGS},
    {"utf8", "len", W_LEN}, {"utf8", "offset", W_LEN}, {NULL, "select", W_COUNT_ARGS},
    {NULL, "rawequal", W_LEN}, {NULL, "collectgarbage", W_GC},
  };
  for (size_t i = 0; i < sizeof bulk / sizeof bulk[0]; i++)
    wrap(L, lim, bulk[i].lib, bulk[i].name, bulk[i].kind);
  if (lua_getglobal(L, "string") == LUA_TTABLE) eqpi_patterns_register(L, lim);
  lua_pop(L, 1);
}
