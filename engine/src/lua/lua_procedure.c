/* Lua binding of the bench operations on a solution: pouring, mixing,
** dilution, buffer capacity, pH adjustment, load budget and titration. */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <math.h>
#include <string.h>

double eqpl_check_volume(lua_State *L, int idx, const char *what)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  if (lua_type(L, idx) != LUA_TSTRING)
    return eqpl_input_error(L, "%s: a volume with its unit, such as '10 mL'", what);
  double v;
  eqp_quantity k;
  if (eqp_parse_quantity(ctx, lua_tostring(L, idx), EQP_Q_VOLUME, &v, &k) < 0)
    return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  return v;
}

/* An amount of a reagent ("2 mmol", "0.5 g") in mol. */
static double check_amount(lua_State *L, int idx, const char *reagent, const char *what)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  if (lua_type(L, idx) != LUA_TSTRING)
    return eqpl_input_error(L, "%s: an amount with its unit, such as '0.1 mmol'", what);
  double v, M;
  eqp_quantity k;
  if (eqp_parse_quantity(ctx, lua_tostring(L, idx), EQP_Q_AMOUNT | EQP_Q_MASS, &v, &k) < 0)
    return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  if (k == EQP_Q_MASS) {
    if (eqp_ctx_reagent_molar_mass(ctx, reagent, &M) < 0) return eqpl_fail(L, ctx, EQP_E_UNKNOWN);
    v = v * 1e3 / M;
  }
  return v;
}

/* s:pour(stock, "10 mL") -> s */
static int sol_pour(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqpl_solution *k = eqpl_check_solution(L, 2);
  double V = eqpl_check_volume(L, 3, "pour");
  int rc = eqp_solution_pour(u->s, k->s, V);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_settop(L, 1);
  return 1;
}

/* s:dilute(2) doubles the volume; s:dilute{ to = "1 L" } makes it up to 1 L */
static int sol_dilute(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  double f;
  if (lua_type(L, 2) == LUA_TNUMBER) {
    f = lua_tonumber(L, 2);
  } else if (lua_type(L, 2) == LUA_TTABLE) {
    lua_getfield(L, 2, "to");
    f = eqpl_check_volume(L, -1, "dilute{ to = ... }") / eqp_solution_volume(u->s);
  } else {
    return eqpl_input_error(L, "dilute: a factor (2) or { to = '500 mL' }");
  }
  int rc = eqp_solution_dilute(u->s, f);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_settop(L, 1);
  return 1;
}

/* s:buffer_capacity() -> beta in mol/(L pH), beta in mol/(kg pH), the C order */
static int sol_buffer_capacity(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  double bkg, bL;
  int rc = eqp_solution_buffer_capacity(u->s, &bL, &bkg);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_pushnumber(L, bL);
  lua_pushnumber(L, bkg);
  return 2;
}

/* s:adjust_pH(7.4, "NaOH" | stock) -> mol (nil for a stock), litres (nil for a solid) */
static int sol_adjust(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  double pH = luaL_checknumber(L, 2), mol, litres;
  const char *reagent = NULL;
  const eqp_solution *stock = NULL;
  if (lua_type(L, 3) == LUA_TSTRING) reagent = lua_tostring(L, 3);
  else stock = eqpl_check_solution(L, 3)->s;
  int rc = eqp_solution_adjust_pH(u->s, pH, reagent, stock, &mol, &litres);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  if (isnan(mol)) lua_pushnil(L);
  else lua_pushnumber(L, mol);
  if (isnan(litres)) lua_pushnil(L);
  else lua_pushnumber(L, litres);
  return 2;
}

/* s:load_budget{ window = 0.1, acid = "HCl", base = "NaOH" } -> table */
static int sol_load_budget(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  double window = 0.1;
  const char *acid = "HCl", *base = "NaOH";
  if (lua_istable(L, 2)) {
    if (lua_getfield(L, 2, "window") == LUA_TNUMBER) window = lua_tonumber(L, -1);
    if (lua_getfield(L, 2, "acid") == LUA_TSTRING) acid = lua_tostring(L, -1);
    if (lua_getfield(L, 2, "base") == LUA_TSTRING) base = lua_tostring(L, -1);
  }
  if (!(window > 0 && window < 7)) return eqpl_input_error(L, "load_budget: window must be > 0");
  eqp_result *r;
  int rc = eqp_solution_equilibrate(u->s, &r);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  double pH = eqp_result_pH(r), amount[2], litres;
  eqp_result_free(r);
  const char *reagent[2] = {acid, base};
  for (int k = 0; k < 2; k++) {
    eqp_solution *c;
    if ((rc = eqp_solution_copy(u->s, &c)) < 0) return eqpl_fail(L, ctx, rc);
    rc = eqp_solution_adjust_pH(c, pH + (k ? window : -window), reagent[k], NULL, &amount[k],
                                &litres);
    eqp_solution_free(c);
    if (rc < 0) return eqpl_fail(L, ctx, rc);
  }
  double V = eqp_solution_volume(u->s);
  lua_createtable(L, 0, 7);
  lua_pushnumber(L, pH);
  lua_setfield(L, -2, "pH");
  lua_pushnumber(L, window);
  lua_setfield(L, -2, "window");
  lua_pushnumber(L, amount[0] * 1e3);
  lua_setfield(L, -2, "acid_mmol");
  lua_pushnumber(L, amount[1] * 1e3);
  lua_setfield(L, -2, "base_mmol");
  lua_pushnumber(L, amount[0] * 1e3 / V);
  lua_setfield(L, -2, "acid_mM");
  lua_pushnumber(L, amount[1] * 1e3 / V);
  lua_setfield(L, -2, "base_mM");
  return 1;
}

/* s:expose("CO2(g)", "427 uatm") -> mol taken up (negative: released) */
static int sol_expose(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  const char *gas = luaL_checkstring(L, 2);
  if (lua_type(L, 3) != LUA_TSTRING)
    return eqpl_input_error(L, "expose: a partial pressure with its unit, such as '427 uatm'");
  double p, mol;
  eqp_quantity k;
  if (eqp_parse_quantity(ctx, lua_tostring(L, 3), EQP_Q_PRESSURE, &p, &k) < 0)
    return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  int rc = eqp_solution_expose(u->s, gas, p, &mol);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_pushnumber(L, mol);
  return 1;
}

/* s:total("Na+") -> mol of a component */
static int sol_total(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  double mol;
  int rc = eqp_solution_total(u->s, luaL_checkstring(L, 2), &mol);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_pushnumber(L, mol);
  return 1;
}

/* s:titrate{ with = ..., step = ..., to = ... | until_pH = ..., species = {...} } */
static int sol_titrate(lua_State *L)
{
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  luaL_checktype(L, 2, LUA_TTABLE);
  eqp_titration t = {NULL, NULL, 0, 0, NAN, 0, NULL, 0};
  lua_getfield(L, 2, "with");
  if (lua_type(L, -1) == LUA_TSTRING) t.reagent = lua_tostring(L, -1);
  else if (luaL_testudata(L, -1, EQPL_SOLUTION)) t.stock = eqpl_check_solution(L, -1)->s;
  else return eqpl_input_error(L, "titrate: 'with' is a reagent name or a stock solution");
  const char *what = t.reagent ? t.reagent : "stock";
  lua_getfield(L, 2, "step");
  t.step = t.stock ? eqpl_check_volume(L, -1, "titrate step")
                   : check_amount(L, lua_gettop(L), what, "titrate step");
  if (lua_getfield(L, 2, "to") != LUA_TNIL)
    t.to = t.stock ? eqpl_check_volume(L, -1, "titrate to")
                   : check_amount(L, lua_gettop(L), what, "titrate to");
  if (lua_getfield(L, 2, "until_pH") != LUA_TNIL) t.until_pH = luaL_checknumber(L, -1);
  if (lua_getfield(L, 2, "max_dpH") != LUA_TNIL) t.max_dpH = luaL_checknumber(L, -1);
  const char *names[24];
  if (lua_getfield(L, 2, "species") == LUA_TTABLE) {
    size_t n = lua_rawlen(L, -1);
    if (n > 24) return eqpl_input_error(L, "titrate: at most 24 species");
    for (size_t i = 0; i < n; i++) {
      lua_rawgeti(L, -1, (lua_Integer)i + 1);
      names[i] = luaL_checkstring(L, -1);   /* kept alive by the table */
      lua_pop(L, 1);
    }
    t.species = names;
    t.nspecies = n;
  }
  eqp_curve *c;
  int rc = eqp_solution_titrate(u->s, &t, &c);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  eqpl_push_curve(L, c);
  lua_getfield(L, LUA_REGISTRYINDEX, EQPL_CURVES);
  lua_pushvalue(L, -2);
  lua_rawseti(L, -2, (lua_Integer)lua_rawlen(L, -2) + 1);
  lua_pop(L, 1);
  return 1;
}

static const luaL_Reg procedure_methods[] = {
  {"pour", sol_pour},
  {"dilute", sol_dilute},
  {"buffer_capacity", sol_buffer_capacity},
  {"adjust_pH", sol_adjust},
  {"load_budget", sol_load_budget},
  {"total", sol_total},
  {"expose", sol_expose},
  {"titrate", sol_titrate},
  {NULL, NULL},
};

/* eq.mix{ a, b } or eq.mix{ { a, "10 mL" }, { b, "90 mL" } } -> new solution */
int eqpl_mix(lua_State *L)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  luaL_checktype(L, 1, LUA_TTABLE);
  size_t n = lua_rawlen(L, 1);
  if (n == 0 || n > 64) return eqpl_input_error(L, "mix: a list of 1 to 64 solutions");
  eqp_solution *parts[64];
  double litres[64];
  for (size_t i = 0; i < n; i++) {
    lua_rawgeti(L, 1, (lua_Integer)i + 1);
    if (lua_istable(L, -1)) {
      lua_rawgeti(L, -1, 1);
      parts[i] = eqpl_check_solution(L, -1)->s;
      lua_rawgeti(L, -2, 2);
      litres[i] = eqpl_check_volume(L, -1, "mix");
      lua_pop(L, 2);
    } else {
      parts[i] = eqpl_check_solution(L, -1)->s;
      litres[i] = eqp_solution_volume(parts[i]);
    }
    lua_pop(L, 1);
  }
  eqpl_solution *u = eqpl_new_handle(L, sizeof *u, EQPL_SOLUTION);
  int rc = eqp_solution_mix(n, parts, litres, &u->s);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  return 1;
}

/* Adds the methods above to the solution's method table. */
void eqpl_open_procedure(lua_State *L)
{
  int ctx = lua_gettop(L);
  luaL_getmetatable(L, EQPL_SOLUTION);
  lua_getfield(L, -1, "__index");
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, procedure_methods, 1);
  lua_settop(L, ctx);
}
