/* Lua binding of recipes (eq.recipe) and of the buffer comparison
** (eq.compare_buffers). */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

static double opt_quantity(lua_State *L, int t, const char *key, unsigned kinds, double dflt,
                           eqp_quantity *kind)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  double v = dflt;
  eqp_quantity k = EQP_Q_NONE;
  int ty = lua_getfield(L, t, key);
  if (ty == LUA_TSTRING) {
    if (eqp_parse_quantity(ctx, lua_tostring(L, -1), kinds, &v, &k) < 0)
      eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  } else if (ty != LUA_TNIL) {
    eqpl_input_error(L, "%s: a quantity with its unit, as a string", key);
  }
  lua_pop(L, 1);
  if (kind) *kind = k;
  return v;
}

static double opt_temperature(lua_State *L, int t)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  double T = 298.15;
  eqp_quantity k;
  int ty = lua_getfield(L, t, "temperature");
  if (ty == LUA_TNUMBER) T = lua_tonumber(L, -1) + 273.15;
  else if (ty == LUA_TSTRING &&
           eqp_parse_quantity(ctx, lua_tostring(L, -1), EQP_Q_TEMPERATURE, &T, &k) < 0)
    eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  lua_pop(L, 1);
  return T;
}

/* Fill spec from the options table at t. names holds the 'using' strings. */
static void read_spec(lua_State *L, int t, eqp_recipe_spec *sp, const char **names)
{
  memset(sp, 0, sizeof *sp);
  sp->ionic_strength = NAN;
  if (lua_getfield(L, t, "buffer") == LUA_TSTRING) sp->buffer = lua_tostring(L, -1);
  lua_pop(L, 1);
  if (lua_getfield(L, t, "using") == LUA_TTABLE) {
    sp->nreagents = lua_rawlen(L, -1) > 2 ? 3 : lua_rawlen(L, -1);
    for (size_t i = 0; i < sp->nreagents && i < 2; i++) {
      lua_rawgeti(L, -1, (lua_Integer)i + 1);
      names[i] = luaL_checkstring(L, -1);
      lua_pop(L, 1);
    }
    sp->reagents = names;
  }
  lua_pop(L, 1);    /* strings stay alive in the options table */
  if (lua_getfield(L, t, "pH") != LUA_TNUMBER) eqpl_input_error(L, "recipe: 'pH' is a number");
  sp->pH = lua_tonumber(L, -1);
  lua_pop(L, 1);
  eqp_quantity k;
  double total = opt_quantity(L, t, "total", EQP_Q_MOLARITY, NAN, &k);
  if (isnan(total)) eqpl_input_error(L, "recipe: 'total' is the buffer concentration ('50 mM')");
  sp->total = total;
  sp->volume = opt_quantity(L, t, "volume", EQP_Q_VOLUME, 1.0, &k);
  sp->T = opt_temperature(L, t);
  double I = opt_quantity(L, t, "ionic_strength", EQP_Q_MOLALITY | EQP_Q_MOLARITY, NAN, &k);
  /* I on the molar scale converts to molal through the density of water */
  sp->ionic_strength = k == EQP_Q_MOLARITY ? I / eqp_water_density(sp->T) : I;
  if (lua_getfield(L, t, "salt") == LUA_TSTRING) sp->salt = lua_tostring(L, -1);
  lua_pop(L, 1);
  if (lua_getfield(L, t, "activity") == LUA_TSTRING) sp->activity = lua_tostring(L, -1);
  lua_pop(L, 1);
  sp->titrant_molar = opt_quantity(L, t, "titrant", EQP_Q_MOLARITY, 1.0, &k);
}

static const char *role_name(int role)
{
  switch (role) {
  case EQP_ROLE_SOLID: return "solid";
  case EQP_ROLE_TITRANT: return "titrant";
  case EQP_ROLE_SALT: return "salt";
  default: return "water";
  }
}

static int recipe_tostring(lua_State *L)
{
  lua_getfield(L, 1, "procedure");
  return 1;
}

/* eq.recipe{ buffer =, pH =, total =, volume =, temperature =, ionic_strength =,
**            salt =, using = {...}, titrant = "1 M", activity =, quiet = false } */
static int eq_recipe(lua_State *L)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  luaL_checktype(L, 1, LUA_TTABLE);
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  eqp_recipe_spec sp;
  const char *names[2];
  read_spec(L, 1, &sp, names);
  eqp_recipe *r;
  int rc = eqp_recipe_make(ctx, &sp, &r);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_createtable(L, 0, 6);
  lua_createtable(L, (int)eqp_recipe_item_count(r), 0);
  for (size_t i = 0; i < eqp_recipe_item_count(r); i++) {
    const eqp_recipe_item *it = eqp_recipe_item_at(r, i);
    char printed[64];
    lua_createtable(L, 0, 6);
    lua_pushstring(L, it->reagent);
    lua_setfield(L, -2, "reagent");
    lua_pushstring(L, role_name(it->role));
    lua_setfield(L, -2, "role");
    lua_pushnumber(L, it->mol * 1e3);
    lua_setfield(L, -2, "mmol");
    if (!isnan(it->grams)) {
      lua_pushnumber(L, it->grams);
      lua_setfield(L, -2, "grams");
      snprintf(printed, sizeof printed, "%.4f g", it->grams);
    } else {
      lua_pushnumber(L, it->mL);
      lua_setfield(L, -2, "mL");
      snprintf(printed, sizeof printed, it->role == EQP_ROLE_WATER ? "%.1f mL" : "%.2f mL", it->mL);
    }
    lua_pushstring(L, printed);      /* the quantity as the procedure prints it */
    lua_setfield(L, -2, "printed");
    lua_rawseti(L, -2, (lua_Integer)i + 1);
  }
  lua_setfield(L, -2, "items");
  lua_pushnumber(L, eqp_recipe_pH(r));
  lua_setfield(L, -2, "pH");
  lua_pushnumber(L, eqp_recipe_ionic_strength(r));
  lua_setfield(L, -2, "ionic_strength");
  lua_pushnumber(L, sp.T - 273.15);
  lua_setfield(L, -2, "temperature");
  lua_pushnumber(L, sp.volume);
  lua_setfield(L, -2, "volume");
  lua_pushstring(L, eqp_recipe_procedure(r));
  lua_setfield(L, -2, "procedure");
  eqp_solution *copy;
  if ((rc = eqp_solution_copy(eqp_recipe_solution(r), &copy)) < 0) {
    eqp_recipe_free(r);
    return eqpl_fail(L, ctx, rc);
  }
  eqp_recipe_free(r);
  eqpl_solution *u = eqpl_new_handle(L, sizeof *u, EQPL_SOLUTION);
  u->s = copy;
  lua_setfield(L, -2, "solution");
  lua_createtable(L, 0, 1);
  lua_pushcfunction(L, recipe_tostring);
  lua_setfield(L, -2, "__tostring");
  lua_setmetatable(L, -2);
  if (lua_getfield(L, 1, "quiet"), !lua_toboolean(L, -1)) {
    lua_getfield(L, -2, "procedure");
    lua_getglobal(L, "print");     /* through print, so --json captures it */
    lua_insert(L, -2);
    lua_call(L, 1, 0);
  }
  lua_pop(L, 1);
  return 1;
}

/* One line through print, so that --json captures it. */
static void emit(lua_State *L, const char *line)
{
  lua_getglobal(L, "print");
  lua_pushstring(L, line);
  lua_call(L, 1, 0);
}

/* One candidate of eq.compare_buffers: make it, load it, measure it. */
static int candidate(lua_State *L, eqp_ctx *ctx, eqp_recipe_spec *sp, double load_mol,
                     const char *load_with, double window, double out[5], char *why, size_t len)
{
  eqp_recipe *r;
  int rc = eqp_recipe_make(ctx, sp, &r);
  if (rc < 0) {
    snprintf(why, len, "%s", eqp_ctx_errmsg(ctx));
    return rc;
  }
  eqp_solution *s = NULL;
  eqp_result *res = NULL;
  double bkg, bL, pH0 = eqp_recipe_pH(r);
  rc = eqp_solution_copy(eqp_recipe_solution(r), &s);
  if (rc == EQP_OK) rc = eqp_solution_buffer_capacity(s, &bL, &bkg);
  if (rc == EQP_OK) rc = eqp_solution_add(s, load_with, load_mol, EQP_Q_AMOUNT);
  if (rc == EQP_OK) rc = eqp_solution_equilibrate(s, &res);
  if (rc == EQP_OK) {
    out[0] = bL;
    out[1] = eqp_result_pH(res) - pH0;
    out[2] = fabs(out[1]) <= window;
    out[3] = pH0;
    out[4] = eqp_result_ionic_strength(res);
    /* the most a monoprotic buffer of total C gives, at its pKa: ln10 C / 4
    ** (Van Slyke 1922); far below that the system is not buffering here */
    double share = bL / (log(10) * sp->total / 4);
    snprintf(why, len, "%sbeta %.1f mM per pH; the load moves the pH by %+.3f",
             share < 0.2 ? "far from its pKa here; " : "", bL * 1e3, out[1]);
  } else {
    snprintf(why, len, "%s", eqp_ctx_errmsg(ctx));
  }
  eqp_result_free(res);
  eqp_solution_free(s);
  eqp_recipe_free(r);
  return rc;
}

/* eq.compare_buffers{ pH =, temperature =, total =, volume =, load = "2 mM",
**   load_with = "HCl", window = 0.1, activity =, quiet = false } -> ranked list */
static int eq_compare(lua_State *L)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  luaL_checktype(L, 1, LUA_TTABLE);
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  eqp_recipe_spec base;
  const char *names[2];
  read_spec(L, 1, &base, names);
  eqp_quantity k;
  double load = opt_quantity(L, 1, "load", EQP_Q_MOLARITY, NAN, &k);
  if (isnan(load)) return eqpl_input_error(L, "compare_buffers: 'load' is a concentration ('2 mM')");
  const char *load_with = "HCl";
  if (lua_getfield(L, 1, "load_with") == LUA_TSTRING) load_with = lua_tostring(L, -1);
  lua_pop(L, 1);
  double window = 0.1;
  if (lua_getfield(L, 1, "window") == LUA_TNUMBER) window = lua_tonumber(L, -1);
  lua_pop(L, 1);
  size_t nb = eqp_ctx_buffer_count(ctx);
  lua_createtable(L, (int)nb, 0);
  int list = lua_gettop(L), n = 0;
  for (size_t i = 0; i < nb; i++) {
    eqp_recipe_spec sp = base;
    sp.buffer = eqp_ctx_buffer_name(ctx, i);
    sp.reagents = NULL;
    sp.nreagents = 0;
    double m[5] = {0, 0, 0, 0, 0};
    char why[512];
    int rc = candidate(L, ctx, &sp, load * base.volume, load_with, window, m, why, sizeof why);
    lua_createtable(L, 0, 8);
    lua_pushstring(L, sp.buffer);
    lua_setfield(L, -2, "buffer");
    lua_pushboolean(L, rc == EQP_OK);
    lua_setfield(L, -2, "possible");
    if (rc == EQP_OK) {
      lua_pushnumber(L, m[0]); lua_setfield(L, -2, "beta");
      lua_pushnumber(L, m[1]); lua_setfield(L, -2, "shift");
      lua_pushboolean(L, m[2] != 0); lua_setfield(L, -2, "within_window");
    }
    lua_pushstring(L, why);
    lua_setfield(L, -2, "why");
    lua_createtable(L, (int)eqp_ctx_buffer_note_count(ctx, i), 0);
    for (size_t q = 0; q < eqp_ctx_buffer_note_count(ctx, i); q++) {
      lua_pushstring(L, eqp_ctx_buffer_note(ctx, i, q));
      lua_rawseti(L, -2, (lua_Integer)q + 1);
    }
    lua_setfield(L, -2, "notes");
    lua_rawseti(L, list, ++n);
  }
  /* rank: possible first, then by the size of the pH shift under the load */
  lua_getglobal(L, "table");
  lua_getfield(L, -1, "sort");
  lua_pushvalue(L, list);
  luaL_loadstring(L, "local a, b = ...\n"
                     "if a.possible ~= b.possible then return a.possible end\n"
                     "if not a.possible then return a.buffer < b.buffer end\n"
                     "return math.abs(a.shift) < math.abs(b.shift)");
  lua_call(L, 2, 0);
  lua_pop(L, 1);
  lua_getfield(L, 1, "quiet");
  int quiet = lua_toboolean(L, -1);
  lua_pop(L, 1);
  if (!quiet) {
    char line[768];
    snprintf(line, sizeof line, "Buffers for pH %.2f at %.1f C, %.4g mM, load %.4g mM %s, "
             "window +-%.2f:", base.pH, base.T - 273.15, base.total * 1e3, load * 1e3,
             load_with, window);
    emit(L, line);
    for (int i = 1; i <= n; i++) {
      lua_rawgeti(L, list, i);
      int row = lua_gettop(L);
      lua_getfield(L, row, "buffer");
      lua_getfield(L, row, "why");
      lua_getfield(L, row, "possible");
      lua_getfield(L, row, "within_window");
      snprintf(line, sizeof line, "%2d. %-20s %s%s", i, lua_tostring(L, row + 1),
               !lua_toboolean(L, row + 3) ? "cannot be made: "
               : lua_toboolean(L, row + 4) ? "" : "(leaves the window) ",
               lua_tostring(L, row + 2));
      lua_settop(L, row);
      emit(L, line);
      lua_getfield(L, row, "notes");
      for (lua_Integer q = 1; q <= (lua_Integer)lua_rawlen(L, row + 1); q++) {
        lua_rawgeti(L, row + 1, q);
        snprintf(line, sizeof line, "      note: %s", lua_tostring(L, -1));
        lua_pop(L, 1);
        emit(L, line);
      }
      lua_settop(L, row - 1);
    }
  }
  lua_settop(L, list);
  return 1;
}

static const luaL_Reg recipe_funcs[] = {
  {"recipe", eq_recipe},
  {"compare_buffers", eq_compare},
  {NULL, NULL},
};

/* Adds eq.recipe and eq.compare_buffers to the module table at the top. */
void eqpl_open_recipe(lua_State *L, int ctx)
{
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, recipe_funcs, 1);
}
