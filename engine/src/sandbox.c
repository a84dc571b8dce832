/* Species files run as Lua text in an empty sandbox: base, math, string,
** table and utf8 only, under the limits of limits.c: an instruction budget
** that also counts work inside C functions (pattern matching, string.rep)
** and that pcall cannot catch, and a memory cap. */
/* SPDX-License-Identifier: MIT */
#include "stage_impl.h"
#include "limits_impl.h"
#include <lauxlib.h>
#include <lua.h>
#include <lualib.h>
#include <stdio.h>
#include <string.h>

#define SANDBOX_MEM (32u << 20)       /* bytes a species file may allocate */
#define SANDBOX_STEPS 20000000L       /* VM instructions (and work charged) before we give up */
#define SANDBOX_CPU 5.0               /* seconds: a backstop for work nothing counts */

/* An environment with only harmless functions: no I/O, no loading, no os. */
static void sandbox_env(lua_State *L)
{
  static const char *const base[] = {"assert", "error", "ipairs", "next", "pairs",
                                     "select", "tonumber", "tostring", "type",
                                     "rawequal", "rawget", "rawlen", "pcall", NULL};
  static const char *const libs[] = {"math", "string", "table", "utf8", NULL};
  lua_newtable(L);
  for (int i = 0; base[i]; i++) {
    lua_getglobal(L, base[i]);
    lua_setfield(L, -2, base[i]);
  }
  for (int i = 0; libs[i]; i++) {
    lua_getglobal(L, libs[i]);
    lua_setfield(L, -2, libs[i]);
  }
}

typedef struct run_args {
  eqp_ctx *ctx;
  eqpi_stage *st;
  const char *text, *source;
  size_t len;
  const eqpi_linemap *lm;
  int rc;
} run_args;

/* Everything that touches the Lua state runs here, under lua_pcall, so an
** allocation failure or a limit becomes an error message, never a panic. */
static int sandbox_run(lua_State *L)
{
  run_args *a = lua_touserdata(L, 1);
  luaL_requiref(L, "_G", luaopen_base, 1);
  luaL_requiref(L, "math", luaopen_math, 1);
  luaL_requiref(L, "string", luaopen_string, 1);
  luaL_requiref(L, "table", luaopen_table, 1);
  luaL_requiref(L, "utf8", luaopen_utf8, 1);
  lua_settop(L, 0);
  eqpi_limits_wrap_libs(L, eqpi_limits_of(L));
  char chunk[512];
  snprintf(chunk, sizeof chunk, "@%s", a->source);
  if (luaL_loadbufferx(L, a->text, a->len, chunk, "t") != LUA_OK) return lua_error(L);
  sandbox_env(L);
  lua_setupvalue(L, -2, 1);
  eqpi_limits_hook(L, eqpi_limits_hookfn, 0);
  eqpi_limits_of(L)->L = L;
  lua_call(L, 0, 1);
  lua_sethook(L, NULL, 0, 0);
  a->rc = eqpi_stage_from_table(a->ctx, a->st, L, -1, a->lm, a->source);
  return 0;
}

int eqpi_load_text(eqp_ctx *ctx, eqpi_stage *st, const char *text, size_t len,
                   const char *source)
{
  eqpi_limits lim;
  eqpi_limits_init(&lim, ctx->alloc, ctx->ud, SANDBOX_MEM, SANDBOX_STEPS);
  lim.steps_hint = "the limit for a species file: a species file only returns a table";
  lim.mem_hint = "the limit for a species file";
  lim.max_cpu = SANDBOX_CPU;
  lua_State *L = lua_newstate(eqpi_limits_lua_alloc, &lim);
  if (!L) {
    eqpi_stage_error(st, source, 0, "out of memory");
    return EQP_E_NOMEM;
  }
  eqpi_linemap *lm = eqpi_linemap_build(ctx, text, len);
  run_args a = {ctx, st, text, source, len, lm, EQP_E_DATA};
  lua_pushcfunction(L, sandbox_run);
  lua_pushlightuserdata(L, &a);
  int status = lua_pcall(L, 1, 0, 0);
  if (status != LUA_OK) {
    const char *msg = lua_tostring(L, -1);
    char buf[600];
    if (!lim.tripped && status == LUA_ERRMEM && lim.refusals && !lim.oom)
      lim.tripped = EQPI_TRIP_MEMORY;
    if (lim.tripped) {
      eqpi_limits_message(&lim, buf, sizeof buf);
      msg = buf;
    }
    if (!msg) msg = "error while running the file";
    /* Lua prefixes most errors with "file:line:"; memory errors it does not */
    if (strncmp(msg, source, strlen(source)) == 0) eqpi_stage_error(st, NULL, 0, "%s", msg);
    else eqpi_stage_error(st, source, 0, "%s", msg);
    a.rc = status == LUA_ERRMEM && lim.oom && !lim.tripped ? EQP_E_NOMEM : EQP_E_DATA;
  }
  eqpi_linemap_free(ctx, lm);
  lua_close(L);
  return a.rc;
}
