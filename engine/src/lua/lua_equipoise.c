/* The "equipoise" Lua module: luaopen_equipoise and module-level functions. */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include "../eqp_impl.h"
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

const char *const eqpl_handle_name[EQPL_K_N] = {EQPL_SOLUTION, EQPL_RESULT, EQPL_CURVE,
                                                 EQPL_PLOT, EQPL_LIBHOLD};

void *eqpl_new_handle(lua_State *L, size_t size, int kind)
{
  return eqpl_new_handle_uv(L, size, kind, 1);
}

void *eqpl_new_handle_uv(lua_State *L, size_t size, int kind, int nuv)
{
  eqpl_ctx *c = lua_touserdata(L, lua_upvalueindex(1));
  if (c) eqpl_account(L, c);    /* a new object: the engine has likely grown */
  void *u = lua_newuserdatauv(L, size, nuv);
  memset(u, 0, size);
  if (c && c->meta[kind]) {
    lua_getiuservalue(L, lua_upvalueindex(1), kind + 1);
    lua_setmetatable(L, -2);
  } else {
    luaL_setmetatable(L, eqpl_handle_name[kind]);
  }
  lua_pushvalue(L, lua_upvalueindex(1));
  lua_setiuservalue(L, -2, 1);
  return u;
}

/* The handle at idx when its metatable is c's for kind: the answer of
** luaL_testudata without its registry look-up. NULL sends the caller to the
** auxiliary library, whose answers and messages stay the only ones. */
static void *fast_handle(lua_State *L, const eqpl_ctx *c, int idx, int kind)
{
  void *u = lua_touserdata(L, idx);
  if (!u || !c || !c->meta[kind] || !lua_getmetatable(L, idx)) return NULL;
  const void *mt = lua_topointer(L, -1);
  lua_pop(L, 1);
  return mt == c->meta[kind] ? u : NULL;
}

void *eqpl_handle_in(lua_State *L, const eqpl_ctx *c, int idx, int kind)
{
  void *u = fast_handle(L, c, idx, kind);
  return u ? u : luaL_testudata(L, idx, eqpl_handle_name[kind]);
}

void *eqpl_test_handle(lua_State *L, int idx, int kind)
{
  return eqpl_handle_in(L, lua_touserdata(L, lua_upvalueindex(1)), idx, kind);
}

void *eqpl_check_handle(lua_State *L, int idx, int kind)
{
  void *u = fast_handle(L, lua_touserdata(L, lua_upvalueindex(1)), idx, kind);
  return u ? u : luaL_checkudata(L, idx, eqpl_handle_name[kind]);
}

static int hold_gc(lua_State *L)
{
  eqpl_hold_free(lua_touserdata(L, 1));
  return 0;
}

eqpl_hold *eqpl_hold_new(lua_State *L, void (*free_fn)(void *p))
{
  eqpl_hold *h = lua_newuserdatauv(L, sizeof *h, 0);
  h->p = NULL;
  h->free_fn = free_fn;
  if (luaL_newmetatable(L, "equipoise.hold")) {
    lua_pushcfunction(L, hold_gc);
    lua_setfield(L, -2, "__gc");
  }
  lua_setmetatable(L, -2);
  return h;
}

void eqpl_hold_free(eqpl_hold *h)
{
  if (h && h->p) h->free_fn(h->p);
  if (h) h->p = NULL;
}

void eqpl_create_meta(lua_State *L, int ctx, const char *name, const luaL_Reg *methods,
                      lua_CFunction index, const luaL_Reg *meta)
{
  luaL_newmetatable(L, name);
  lua_pushstring(L, name);   /* getmetatable(handle) gives the name, not the table */
  lua_setfield(L, -2, "__metatable");
  lua_pushvalue(L, ctx);
  lua_newtable(L);
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, methods, 1);
  lua_pushcclosure(L, index, 2);
  lua_setfield(L, -2, "__index");
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, meta, 1);
  lua_pop(L, 1);
}

/* The script's file and line: the nearest Lua function on the stack, so
** that a binding reached through pcall or a tail call still names it. */
static void where(lua_State *L)
{
  lua_Debug ar;
  for (int level = 1; lua_getstack(L, level, &ar); level++) {
    if (lua_getinfo(L, "Sl", &ar) && ar.currentline > 0) {
      lua_pushfstring(L, "%s:%d: ", ar.short_src, ar.currentline);
      return;
    }
  }
  lua_pushliteral(L, "");
}

static int raise_with(lua_State *L, int status, const char *msg)
{
  where(L);
  lua_pushstring(L, msg);
  lua_concat(L, 2);
  /* remember {message, status} so the command knows what kind of error
  ** ended the script, even through error() re-raises of the same string */
  lua_createtable(L, 2, 0);
  lua_pushvalue(L, -2);
  lua_rawseti(L, -2, 1);
  lua_pushinteger(L, status);
  lua_rawseti(L, -2, 2);
  lua_setfield(L, LUA_REGISTRYINDEX, EQPL_LASTERR);
  return lua_error(L);
}

int eqpl_fail(lua_State *L, eqp_ctx *ctx, int status)
{
  return raise_with(L, status, eqp_ctx_errmsg(ctx));
}

int eqpl_input_error(lua_State *L, const char *fmt, ...)
{
  char buf[1024];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(buf, sizeof buf, fmt, ap);
  va_end(ap);
  return raise_with(L, EQP_E_INPUT, buf);
}

static int ctx_gc(lua_State *L)
{
  eqpl_ctx *c = luaL_checkudata(L, 1, EQPL_CTX);
  eqp_result_free(c->pending);      /* a push cut short by an error */
  c->pending = NULL;
  eqp_ctx_free(c->ctx);
  c->ctx = NULL;
  return 0;
}

static int library_gc(lua_State *L)
{
  eqpl_library *h = eqpl_check_handle(L, 1, EQPL_K_LIBRARY);
  eqp_library_free(h->lib);
  h->lib = NULL;
  return 0;
}

eqpl_library *eqpl_push_library(lua_State *L, const eqp_library *lib)
{
  eqpl_library *h = eqpl_new_handle(L, sizeof *h, EQPL_K_LIBRARY);
  h->lib = eqp_library_ref(lib);
  return h;
}

/* A table loaded inline goes through the same checks as a file. */
void eqpl_extend_library(lua_State *L, eqp_ctx *ctx, eqpl_library *h, int idx)
{
  idx = lua_absindex(L, idx);
  int rc;
  eqpi_db *out = NULL;
  if (lua_type(L, idx) == LUA_TSTRING) {
    eqpl_check_name(L, idx, "species file");
    rc = eqpi_load_file(ctx, h->lib, eqpl_host_path(L, idx, 'r'), &out);
  } else if (lua_type(L, idx) == LUA_TTABLE) {
    lua_Debug ar;
    char where[512] = "inline species";
    if (lua_getstack(L, 1, &ar) && lua_getinfo(L, "Sl", &ar) && ar.currentline > 0)
      snprintf(where, sizeof where, "%s:%d (inline species)", ar.short_src, ar.currentline);
    rc = eqpi_load_table(ctx, h->lib, L, idx, where, &out);
  } else {
    char buf[64];
    snprintf(buf, sizeof buf, "%s", luaL_typename(L, idx));
    eqpl_input_error(L, "species must be a file name or a species table; got a %s", buf);
    return;
  }
  if (rc < 0) eqpl_fail(L, ctx, rc);
  eqp_library_free(h->lib);
  h->lib = out;
}

/* eq.load_species(path_or_table): add species to the library of this run
** (solutions made from now on see them). */
static int eq_load_species(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.load_species(path_or_table)");
  eqp_ctx *ctx = eqpl_ctx_of(L);
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  eqpl_library *h = eqpl_push_library(L, eqp_ctx_library(ctx));
  eqpl_extend_library(L, ctx, h, 1);
  eqpi_ctx_set_library(ctx, eqpi_db_ref(h->lib));
  return 0;
}

/* eq.molar_mass("Na2HPO4.7H2O") -> g/mol */
static int eq_molar_mass(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.molar_mass(formula)");
  eqp_ctx *ctx = eqpl_ctx_of(L);
  double m;
  int rc = eqp_formula_molar_mass(ctx, eqpl_check_name(L, 1, "molar_mass: formula"), &m);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_pushnumber(L, m);
  return 1;
}

/* eq.quantity("25 mM") -> value in base units, kind name */
static int eq_quantity(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.quantity(text)");
  eqp_ctx *ctx = eqpl_ctx_of(L);
  double v;
  eqp_quantity k;
  int rc = eqp_parse_quantity(ctx, eqpl_check_name(L, 1, "quantity: text"), 0xff, &v, &k);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  static const char *const kinds[] = {"amount", "mass", "molarity", "molality", "volume",
                                      "temperature", "pressure"};
  int bit = 0;
  while ((1u << bit) != (unsigned)k) bit++;
  lua_pushnumber(L, v);
  lua_pushstring(L, kinds[bit]);
  return 2;
}

/* eq.describe(name [, { temperature = 37 }]) -> text about every library
** entry of that name, its constants at 25 C and at the temperature */
static const eqpl_opt describe_opts[] = {
  {"temperature", EQPL_TEMPERATURE, 0, 0, 0, 0, NULL},
  {NULL, 0, 0, 0, 0, 0, NULL},
};

static int eq_describe(lua_State *L)
{
  eqpl_check_nargs(L, 2, "eq.describe(name [, options])");
  eqp_ctx *ctx = eqpl_ctx_of(L);
  const char *name = eqpl_check_name(L, 1, "describe: name");
  eqpl_val v[1];
  eqpl_options(L, 2, "eq.describe", describe_opts, v, 0);
  double T = v[0].given ? v[0].num : 298.15;
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  char *text;
  int rc = eqp_ctx_describe(ctx, name, T, EQP_FORMAT_TEXT, &text);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_pushstring(L, text);
  eqp_free_string(text);
  return 1;
}

int eqpl_solution_new(lua_State *L);

static const luaL_Reg eq_funcs[] = {
  {"solution", eqpl_solution_new},
  {"mix", eqpl_mix},
  {"load_species", eq_load_species},
  {"molar_mass", eq_molar_mass},
  {"quantity", eq_quantity},
  {"describe", eq_describe},
  {NULL, NULL},
};

int luaopen_equipoise(lua_State *L)
{
  return eqp_lua_open(L);
}

eqp_ctx *eqp_lua_context(lua_State *L)
{
  eqp_ctx *ctx = NULL;
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_CTX ".ptr") == LUA_TLIGHTUSERDATA)
    ctx = lua_touserdata(L, -1);
  lua_pop(L, 1);
  return ctx;
}

void eqpl_push_print(lua_State *L)
{
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_PRINT) == LUA_TFUNCTION) return;
  lua_pop(L, 1);
  if (lua_getglobal(L, "print") != LUA_TFUNCTION)
    luaL_error(L, "there is no print function to write the text through (pass quiet = true)");
}

int eqp_lua_open(lua_State *L)
{
  luaL_checkversion(L);
  /* one context per Lua state, shared by every require */
  if (lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.module") == LUA_TTABLE) return 1;
  lua_pop(L, 1);
  eqpl_ctx *c = lua_newuserdatauv(L, sizeof *c, EQPL_UV_HOLDER);
  memset(c, 0, sizeof *c);
  if (luaL_newmetatable(L, EQPL_CTX)) {
    lua_pushcfunction(L, ctx_gc);
    lua_setfield(L, -2, "__gc");
  }
  lua_setmetatable(L, -2);
  if (luaL_newmetatable(L, EQPL_LIBHOLD)) {
    lua_pushcfunction(L, library_gc);
    lua_setfield(L, -2, "__gc");
  }
  lua_pop(L, 1);
  c->ctx = eqpl_host_ctx_new(L, c);

  /* a script's module reads the documented environment, as the command does */
  if (!c->ctx || eqp_ctx_default_config(c->ctx) < 0)
    return luaL_error(L, "equipoise: out of memory");
  lua_pushlightuserdata(L, c->ctx);   /* for eqp_lua_context */
  lua_setfield(L, LUA_REGISTRYINDEX, EQPL_CTX ".ptr");
  int ctxidx = lua_gettop(L);
  eqpl_open_solution(L);
  eqpl_open_result(L);
  eqpl_open_curve(L);
  eqpl_open_procedure(L);
  luaL_newlibtable(L, eq_funcs);
  lua_pushvalue(L, ctxidx);
  luaL_setfuncs(L, eq_funcs, 1);
  eqpl_open_recipe(L, ctxidx);
  eqpl_open_plot(L, ctxidx);
  for (int k = 0; k < EQPL_K_N; k++) {
    luaL_getmetatable(L, eqpl_handle_name[k]);
    c->meta[k] = lua_topointer(L, -1);
    lua_setiuservalue(L, ctxidx, k + 1);
  }
  lua_pushstring(L, EQP_VERSION_STRING);
  lua_setfield(L, -2, "version");
  lua_pushvalue(L, -1);
  lua_setfield(L, LUA_REGISTRYINDEX, "equipoise.module");
  /* the host's print as the module found it: a script that replaces or
  ** removes its own print does not break what the module writes */
  if (lua_getglobal(L, "print") == LUA_TFUNCTION) lua_setfield(L, LUA_REGISTRYINDEX, EQPL_PRINT);
  else lua_pop(L, 1);
  lua_remove(L, ctxidx);
  return 1;
}
