/* What the host running the module decides: which files a script may read
** and write, and where the engine's memory comes from. The command's
** sandbox registers both in the registry table EQPL_HOOKS; a stock lua5.4
** registers nothing, and then every path is allowed and memory comes from
** the Lua state's own allocator. What a script makes is not kept here: a
** host that wants to hear of it registers an observer on the context
** (eqp_lua_context, eqp_ctx_set_observer). */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"

const char *eqpl_host_path(lua_State *L, int idx, int mode)
{
  idx = lua_absindex(L, idx);
  const char *path = luaL_checkstring(L, idx);
  int top = lua_gettop(L);
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_HOOKS) != LUA_TTABLE ||
      lua_getfield(L, -1, "path") != LUA_TFUNCTION) {
    lua_settop(L, top);
    return path;
  }
  lua_remove(L, -2);
  lua_pushvalue(L, idx);
  lua_pushstring(L, mode == 'w' ? "w" : "r");
  lua_call(L, 2, 1);   /* raises when the path is refused */
  lua_replace(L, idx);
  return lua_tostring(L, idx);
}

/* The engine's allocator: the host's, counting what the engine holds on
** to, so that the collector can be told (eqpl_account). */
static void *counting_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  eqpl_ctx *c = ud;
  void *p = c->alloc(c->alloc_ud, ptr, osize, nsize);
  if (p || nsize == 0) c->grown += (long long)nsize - (long long)(ptr ? osize : 0);
  return p;
}

eqp_ctx *eqpl_host_ctx_new(lua_State *L, eqpl_ctx *c)
{
  const eqpl_host_alloc *a = NULL;
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_HOOKS) == LUA_TTABLE) {
    lua_getfield(L, -1, "alloc");
    a = lua_touserdata(L, -1);
    lua_pop(L, 1);
  }
  lua_pop(L, 1);
  if (a) {
    c->alloc = a->fn;
    c->alloc_ud = a->ud;
  } else {
    c->alloc = lua_getallocf(L, &c->alloc_ud);
  }
  c->grown = 0;
  return eqp_ctx_new(counting_alloc, c);
}

/* The collector sees a handle of a few bytes, not the kilobytes of engine
** memory behind it: a loop that makes and drops results would run far
** ahead of it. Each KiB the engine has grown by is charged to it as if Lua
** had allocated it (LUA_GCSTEP: the debt grows, the size estimate does
** not), so dead handles are collected at the pace they are made. */
void eqpl_account(lua_State *L, eqpl_ctx *c)
{
  if (c->grown < 1024) return;
  long long kb = c->grown / 1024;
  c->grown -= kb * 1024;
  lua_gc(L, LUA_GCSTEP, kb > 1 << 20 ? 1 << 20 : (int)kb);
}
