/* What the host running the module decides: which files a script may read
** and write, where the engine's memory comes from, and what to do when a
** result or a curve is made. The command's
** sandbox registers both in the registry table EQPL_HOOKS; a stock lua5.4
** registers nothing, and then every path is allowed and memory comes from
** the Lua state's own allocator. */
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

eqp_ctx *eqpl_host_ctx_new(lua_State *L)
{
  const eqpl_host_alloc *a = NULL;
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_HOOKS) == LUA_TTABLE) {
    lua_getfield(L, -1, "alloc");
    a = lua_touserdata(L, -1);
    lua_pop(L, 1);
  }
  lua_pop(L, 1);
  if (a) return eqp_ctx_new(a->fn, a->ud);
  void *ud;
  lua_Alloc f = lua_getallocf(L, &ud);
  return eqp_ctx_new(f, ud);
}

void eqpl_log(lua_State *L, const char *log)
{
  lua_getfield(L, LUA_REGISTRYINDEX, log);
  lua_pushvalue(L, -2);
  lua_rawseti(L, -2, (lua_Integer)lua_rawlen(L, -2) + 1);
  lua_pop(L, 1);
  int top = lua_gettop(L);
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_HOOKS) == LUA_TTABLE &&
      lua_getfield(L, -1, "logged") == LUA_TFUNCTION) {
    lua_pushstring(L, log);
    lua_call(L, 1, 0);
  }
  lua_settop(L, top);
}
