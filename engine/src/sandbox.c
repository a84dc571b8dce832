/* Species files run as Lua text in an empty sandbox: base, math, string,
** table and utf8 only; an instruction limit in a count hook and a memory
** cap in the allocator (the hook does not see work inside C functions). */
/* SPDX-License-Identifier: MIT */
#include "stage_impl.h"
#include <lauxlib.h>
#include <lua.h>
#include <lualib.h>
#include <stdio.h>
#include <string.h>

#define SANDBOX_MEM (32u << 20)       /* bytes a species file may allocate */
#define SANDBOX_STEPS 20000000L       /* VM instructions before we give up */

typedef struct sandbox {
  eqp_ctx *ctx;
  size_t used;
  long steps;
} sandbox;

static void *sandbox_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  sandbox *sb = ud;
  if (!ptr) osize = 0;
  if (nsize == 0) {
    if (ptr) sb->ctx->alloc(sb->ctx->ud, ptr, osize, 0);
    sb->used -= osize;
    return NULL;
  }
  if (sb->used - osize + nsize > SANDBOX_MEM) return NULL;
  void *p = sb->ctx->alloc(sb->ctx->ud, ptr, osize, nsize);
  if (p) sb->used = sb->used - osize + nsize;
  return p;
}

static void sandbox_hook(lua_State *L, lua_Debug *ar)
{
  sandbox *sb;
  lua_getallocf(L, (void **)&sb);
  sb->steps += 1000;
  if (sb->steps > SANDBOX_STEPS) luaL_error(L, "instruction limit exceeded");
}

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
  char chunk[512];
  snprintf(chunk, sizeof chunk, "@%s", a->source);
  if (luaL_loadbufferx(L, a->text, a->len, chunk, "t") != LUA_OK) return lua_error(L);
  sandbox_env(L);
  lua_setupvalue(L, -2, 1);
  lua_sethook(L, sandbox_hook, LUA_MASKCOUNT, 1000);
  lua_call(L, 0, 1);
  lua_sethook(L, NULL, 0, 0);
  a->rc = eqpi_stage_from_table(a->ctx, a->st, L, -1, a->lm, a->source);
  return 0;
}

int eqpi_load_text(eqp_ctx *ctx, eqpi_stage *st, const char *text, size_t len,
                   const char *source)
{
  sandbox sb = {ctx, 0, 0};
  lua_State *L = lua_newstate(sandbox_alloc, &sb);
  if (!L) {
    eqpi_stage_error(st, source, 0, "out of memory");
    return EQP_E_NOMEM;
  }
  eqpi_linemap *lm = eqpi_linemap_build(ctx, text, len);
  run_args a = {ctx, st, text, source, len, lm, EQP_E_DATA};
  lua_pushcfunction(L, sandbox_run);
  lua_pushlightuserdata(L, &a);
  if (lua_pcall(L, 1, 0, 0) != LUA_OK) {
    const char *msg = lua_tostring(L, -1);
    if (!msg) msg = "error while running the file";
    /* Lua prefixes most errors with "file:line:"; memory errors it does not */
    if (strncmp(msg, source, strlen(source)) == 0) eqpi_stage_error(st, NULL, 0, "%s", msg);
    else eqpi_stage_error(st, source, 0, "%s", msg);
    a.rc = EQP_E_DATA;
  }
  eqpi_linemap_free(ctx, lm);
  lua_close(L);
  return a.rc;
}
