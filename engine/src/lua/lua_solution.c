/* Lua binding of eqp_solution: eq.solution{...}, s:add, s:equilibrate, s:copy. */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <math.h>
#include <string.h>

eqpl_solution *eqpl_check_solution(lua_State *L, int idx)
{
  eqpl_solution *u = luaL_checkudata(L, idx, EQPL_SOLUTION);
  if (!u->s) luaL_argerror(L, idx, "solution is closed");
  return u;
}

static double opt_temperature(lua_State *L, int t, eqp_ctx *ctx)
{
  double T = 298.15;
  int ty = lua_getfield(L, t, "temperature");
  if (ty == LUA_TNUMBER) {
    T = lua_tonumber(L, -1) + 273.15;
  } else if (ty == LUA_TSTRING) {
    eqp_quantity k;
    if (eqp_parse_quantity(ctx, lua_tostring(L, -1), EQP_Q_TEMPERATURE, &T, &k) < 0)
      eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  } else if (ty != LUA_TNIL) {
    eqpl_input_error(L, "temperature: a number in C or a string such as '310.15 K'");
  }
  lua_pop(L, 1);
  return T;
}

static double opt_water(lua_State *L, int t, eqp_ctx *ctx, double T)
{
  int tw = lua_getfield(L, t, "water");
  int tv = lua_getfield(L, t, "volume");
  double kg = 1.0, v;
  eqp_quantity k;
  if (tw != LUA_TNIL && tv != LUA_TNIL)
    eqpl_input_error(L, "give either 'water' (a mass) or 'volume', not both");
  if (tw == LUA_TSTRING) {
    if (eqp_parse_quantity(ctx, lua_tostring(L, -2), EQP_Q_MASS, &kg, &k) < 0)
      eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  } else if (tw != LUA_TNIL) {
    eqpl_input_error(L, "water: a mass with its unit, such as '1 kg'");
  }
  if (tv == LUA_TSTRING) {
    if (eqp_parse_quantity(ctx, lua_tostring(L, -1), EQP_Q_VOLUME, &v, &k) < 0)
      eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
    kg = v * eqp_water_density(T);   /* volume of water at T, dilute approximation */
  } else if (tv != LUA_TNIL) {
    eqpl_input_error(L, "volume: a volume with its unit, such as '500 mL'");
  }
  lua_pop(L, 2);
  if (!(kg > 0)) eqpl_input_error(L, "the amount of water must be positive");
  return kg;
}

static void opt_species(lua_State *L, int t, eqp_ctx *ctx)
{
  if (lua_getfield(L, t, "species") == LUA_TTABLE) {
    int sp = lua_gettop(L);
    lua_getfield(L, sp, "species");
    lua_getfield(L, sp, "acids");
    lua_getfield(L, sp, "reactions");
    lua_getfield(L, sp, "reagents");
    int single = !lua_isnil(L, -1) || !lua_isnil(L, -2) || !lua_isnil(L, -3) || !lua_isnil(L, -4);
    lua_settop(L, sp);
    if (single) {
      eqpl_load_species(L, ctx, sp);
    } else {
      lua_Integer n = (lua_Integer)lua_rawlen(L, sp);
      for (lua_Integer i = 1; i <= n; i++) {
        lua_geti(L, sp, i);
        eqpl_load_species(L, ctx, -1);
        lua_pop(L, 1);
      }
    }
  } else if (!lua_isnil(L, -1)) {
    eqpl_input_error(L, "species: a species table, or a list of file names and tables");
  }
  lua_pop(L, 1);
}

int eqpl_solution_new(lua_State *L);

int eqpl_solution_new(lua_State *L)
{
  static const char *const keys[] = {"volume", "water", "temperature", "activity", "species",
                                     NULL};
  eqp_ctx *ctx = eqpl_ctx_of(L);
  if (lua_isnoneornil(L, 1)) lua_newtable(L);
  luaL_checktype(L, 1, LUA_TTABLE);
  lua_pushnil(L);
  while (lua_next(L, 1)) {
    lua_pop(L, 1);
    int ok = 0;
    if (lua_type(L, -1) == LUA_TSTRING)
      for (int i = 0; keys[i]; i++) ok |= strcmp(keys[i], lua_tostring(L, -1)) == 0;
    if (!ok)
      eqpl_input_error(L, "eq.solution: unknown option '%s' (known: volume, water, "
                       "temperature, activity, species)", luaL_tolstring(L, -1, NULL));
  }
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  opt_species(L, 1, ctx);
  eqp_solution_opts o;
  o.temperature_K = opt_temperature(L, 1, ctx);
  o.water = opt_water(L, 1, ctx, o.temperature_K);
  /* activity = "davies" or { "davies", coefficient = 0.2 } */
  int act = lua_getfield(L, 1, "activity");
  int params = 0;
  if (act == LUA_TTABLE) {
    params = lua_gettop(L);
    lua_geti(L, params, 1);
    if (lua_type(L, -1) != LUA_TSTRING)
      return eqpl_input_error(L, "activity = { 'model name', parameter = value, ... }");
    o.activity = lua_tostring(L, -1);
  } else if (act == LUA_TSTRING) {
    o.activity = lua_tostring(L, -1);
  } else if (act == LUA_TNIL) {
    o.activity = NULL;
  } else {
    return eqpl_input_error(L, "activity: a model name such as 'davies'");
  }
  eqp_solution *s;
  eqpl_solution *u = eqpl_new_handle(L, sizeof *u, EQPL_SOLUTION);
  int rc = eqp_solution_new(ctx, &o, &s);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  u->s = s;
  if (params) {
    lua_pushnil(L);
    while (lua_next(L, params)) {
      if (lua_type(L, -2) == LUA_TSTRING) {
        if (lua_type(L, -1) != LUA_TNUMBER)
          return eqpl_input_error(L, "activity parameter '%s' must be a number",
                                  lua_tostring(L, -2));
        rc = eqp_solution_set_activity_param(s, lua_tostring(L, -2), lua_tonumber(L, -1));
        if (rc < 0) return eqpl_fail(L, ctx, rc);
      }
      lua_pop(L, 1);
    }
  }
  return 1;
}

/* s:add(reagent, "12.5 mmol") -> s */
static int solution_add(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  const char *reagent = luaL_checkstring(L, 2);
  if (lua_type(L, 3) == LUA_TNUMBER)
    return eqpl_input_error(L, "amount of %s: %s has no unit (write it as a string with its "
                            "unit, such as '10 mmol' or '1.5 g')", reagent, lua_tostring(L, 3));
  if (lua_type(L, 3) != LUA_TSTRING)
    return eqpl_input_error(L, "amount of %s: expected a string such as '10 mmol'", reagent);
  int rc = eqp_solution_add_str(u->s, reagent, lua_tostring(L, 3));
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_getfield(L, LUA_REGISTRYINDEX, EQPL_USED);
  lua_pushboolean(L, 1);
  lua_setfield(L, -2, reagent);
  lua_pop(L, 1);
  lua_settop(L, 1);
  return 1;
}

/* s:equilibrate() -> result */
static int solution_equilibrate(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  eqp_result *r;
  int rc = eqp_solution_equilibrate(u->s, &r);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  eqpl_push_result(L, r);
  lua_getfield(L, LUA_REGISTRYINDEX, EQPL_LOG);
  lua_pushvalue(L, -2);
  lua_rawseti(L, -2, (lua_Integer)lua_rawlen(L, -2) + 1);
  lua_pop(L, 1);
  return 1;
}

static int solution_copy(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  eqpl_solution *c = eqpl_new_handle(L, sizeof *c, EQPL_SOLUTION);
  int rc = eqp_solution_copy(u->s, &c->s);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  return 1;
}

/* s:set_temperature(37) or ("310.15 K"): same composition, new temperature */
static int solution_set_temperature(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  double T;
  if (lua_type(L, 2) == LUA_TNUMBER) {
    T = lua_tonumber(L, 2) + 273.15;
  } else if (lua_type(L, 2) == LUA_TSTRING) {
    eqp_quantity k;
    if (eqp_parse_quantity(ctx, lua_tostring(L, 2), EQP_Q_TEMPERATURE, &T, &k) < 0)
      return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  } else {
    return eqpl_input_error(L, "set_temperature: a number in C or a string such as '37 C'");
  }
  int rc = eqp_solution_set_temperature(u->s, T);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_settop(L, 1);
  return 1;
}

static int solution_water(lua_State *L)
{
  lua_pushnumber(L, eqp_solution_water(eqpl_check_solution(L, 1)->s));
  return 1;
}

static int solution_volume(lua_State *L)
{
  lua_pushnumber(L, eqp_solution_volume(eqpl_check_solution(L, 1)->s));
  return 1;
}

static int solution_temperature(lua_State *L)
{
  lua_pushnumber(L, eqp_solution_temperature_K(eqpl_check_solution(L, 1)->s) - 273.15);
  return 1;
}

static int solution_close(lua_State *L)
{
  eqpl_solution *u = luaL_checkudata(L, 1, EQPL_SOLUTION);
  eqp_solution_free(u->s);
  u->s = NULL;
  return 0;
}

static int solution_tostring(lua_State *L)
{
  eqpl_solution *u = luaL_checkudata(L, 1, EQPL_SOLUTION);
  if (!u->s) lua_pushstring(L, "solution (closed)");
  else
    lua_pushfstring(L, "solution (%f kg water, %f C)", eqp_solution_water(u->s),
                    eqp_solution_temperature_K(u->s) - 273.15);
  return 1;
}

static const luaL_Reg solution_methods[] = {
  {"add", solution_add},
  {"equilibrate", solution_equilibrate},
  {"copy", solution_copy},
  {"set_temperature", solution_set_temperature},
  {"water", solution_water},
  {"volume", solution_volume},
  {"temperature", solution_temperature},
  {NULL, NULL},
};

static const luaL_Reg solution_meta[] = {
  {"__index", NULL},  /* placeholder */
  {"__gc", solution_close},
  {"__close", solution_close},
  {"__tostring", solution_tostring},
  {NULL, NULL},
};

/* Expects the context userdata at the top of the stack; leaves it there. */
void eqpl_open_solution(lua_State *L)
{
  int ctx = lua_gettop(L);
  luaL_newmetatable(L, EQPL_SOLUTION);
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, solution_meta, 1);
  luaL_newlibtable(L, solution_methods);
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, solution_methods, 1);
  lua_setfield(L, -2, "__index");
  lua_settop(L, ctx);
}
