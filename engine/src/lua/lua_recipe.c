/* Lua binding of recipes (eq.recipe) and of the buffer comparison
** (eq.compare_buffers). */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_TOTAL 5.0        /* mol/L: the engine is tested to 5 mol/kg */
#define MAX_IONIC 10.0       /* mol/kg (or mol/L) */
#define MAX_TITRANT 20.0     /* mol/L: 50 % NaOH is about 19 M */

/* The options of eq.recipe; eq.compare_buffers takes those from pH on, and
** its own. The two tables share their order so that one reader fills both. */
#define COMMON_OPTS                                                                         \
  {"pH", EQPL_NUMBER, 0, EQPL_PH_MIN, EQPL_PH_MAX, EQPL_REQUIRED, "a number, such as 7.4"},  \
  {"total", EQPL_QUANTITY, EQP_Q_MOLARITY, 0, MAX_TOTAL, EQPL_ABOVE | EQPL_REQUIRED,         \
   "the buffer concentration, such as '50 mM'"},                                           \
  {"volume", EQPL_QUANTITY, EQP_Q_VOLUME, 0, EQPL_MAX_WATER, EQPL_ABOVE, NULL},             \
  {"temperature", EQPL_TEMPERATURE, 0, 0, 0, 0, NULL},                                     \
  {"ionic_strength", EQPL_QUANTITY, EQP_Q_MOLALITY | EQP_Q_MOLARITY, 0, MAX_IONIC, 0, NULL}, \
  {"salt", EQPL_NAME, 0, 0, 0, 0, "a reagent name, such as 'NaCl'"},                       \
  {"titrant", EQPL_QUANTITY, EQP_Q_MOLARITY, 0, MAX_TITRANT, EQPL_ABOVE, NULL},            \
  {"activity", EQPL_NAME, 0, 0, 0, 0,                                                       \
   "a model name, such as 'davies' (eq.recipe takes no model parameters)"},                \
  {"quiet", EQPL_BOOLEAN, 0, 0, 0, 0, NULL}

enum { R_PH, R_TOTAL, R_VOLUME, R_T, R_I, R_SALT, R_TITRANT, R_ACTIVITY, R_QUIET, R_COMMON };

static const eqpl_opt recipe_opts[] = {
  COMMON_OPTS,
  {"buffer", EQPL_NAME, 0, 0, 0, 0, "the name of a buffer system, such as 'phosphate'"},
  {"using", EQPL_NAMES, 0, 0, 2, 0, NULL},
  {NULL, 0, 0, 0, 0, 0, NULL},
};
enum { R_BUFFER = R_COMMON, R_USING, R_RECIPE_N };

static const eqpl_opt compare_opts[] = {
  COMMON_OPTS,
  {"load", EQPL_QUANTITY, EQP_Q_MOLARITY, 0, MAX_TOTAL, EQPL_ABOVE | EQPL_REQUIRED,
   "the acid or base load as a concentration, such as '2 mM'"},
  {"load_with", EQPL_NAME, 0, 0, 0, 0, "a reagent name, such as 'HCl'"},
  {"window", EQPL_NUMBER, 0, 0, 7, EQPL_ABOVE, NULL},
  {NULL, 0, 0, 0, 0, 0, NULL},
};
enum { C_LOAD = R_COMMON, C_LOAD_WITH, C_WINDOW, C_COMPARE_N };

/* Fill sp from the checked options v (the common part). */
static void fill_spec(lua_State *L, const char *call, const eqpl_val *v, eqp_recipe_spec *sp)
{
  *sp = (eqp_recipe_spec)EQP_RECIPE_SPEC_INIT;
  sp->pH = v[R_PH].num;
  sp->total = v[R_TOTAL].num;
  sp->volume = v[R_VOLUME].given ? v[R_VOLUME].num : 1.0;
  sp->T = v[R_T].given ? v[R_T].num : 298.15;
  sp->ionic_strength = NAN;
  if (v[R_I].given) {
    /* I on the molar scale converts to molal through the density of water */
    double I = v[R_I].num;
    sp->ionic_strength = v[R_I].unit == EQP_Q_MOLARITY ? I / eqp_water_density(sp->T) : I;
  } else if (v[R_SALT].given) {
    eqpl_input_error(L, "%s: salt = '%s' needs an ionic_strength to reach, such as '0.15 M'",
                     call, v[R_SALT].str);
  }
  sp->salt = v[R_SALT].str;
  sp->titrant_molar = v[R_TITRANT].given ? v[R_TITRANT].num : 1.0;
  sp->activity = v[R_ACTIVITY].str;
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

/* The recipe's warnings as a list of strings. */
static void push_warnings(lua_State *L, const eqp_recipe *r)
{
  lua_createtable(L, (int)eqp_recipe_warning_count(r), 0);
  for (size_t i = 0; i < eqp_recipe_warning_count(r); i++) {
    lua_pushstring(L, eqp_recipe_warning(r, i));
    lua_rawseti(L, -2, (lua_Integer)i + 1);
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
  eqpl_val v[R_RECIPE_N];
  if (!lua_istable(L, 1))
    return eqpl_input_error(L, "eq.recipe: a table of options, such as { buffer = 'phosphate', "
                            "pH = 7.4, total = '50 mM' }");
  eqpl_options(L, 1, "eq.recipe", recipe_opts, v, 0);
  eqp_recipe_spec sp;
  fill_spec(L, "eq.recipe", v, &sp);
  sp.buffer = v[R_BUFFER].str;
  if (v[R_USING].given) {
    if (v[R_USING].count != 2)
      return eqpl_input_error(L, "eq.recipe: using lists two reagents: the acid and base forms, "
                              "or the buffer substance and a strong acid or base; got %zu",
                              v[R_USING].count);
    sp.reagents = v[R_USING].names;   /* anchored in v[R_USING].idx */
    sp.nreagents = 2;
  }
  if (!sp.buffer && !sp.reagents)
    return eqpl_input_error(L, "eq.recipe: name a buffer (buffer = 'phosphate') or the reagents "
                            "(using = { 'Tris', 'HCl' })");
  int quiet = v[R_QUIET].given && v[R_QUIET].num != 0;
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
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
  lua_pushstring(L, eqp_recipe_activity_model(r));
  lua_setfield(L, -2, "activity");
  push_warnings(L, r);
  lua_setfield(L, -2, "warnings");
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
  if (!quiet) {
    lua_getfield(L, -1, "procedure");
    lua_getglobal(L, "print");     /* through print, so --json captures it */
    lua_insert(L, -2);
    lua_call(L, 1, 0);
  }
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
    lua_newtable(L);
    return rc;
  }
  push_warnings(L, r);       /* the row's warnings: the recipe's, then the loaded solution's */
  eqp_solution *s = NULL;
  eqp_result *res = NULL;
  double bkg, bL, pH0 = eqp_recipe_pH(r);
  rc = eqp_solution_copy(eqp_recipe_solution(r), &s);
  if (rc == EQP_OK) rc = eqp_solution_buffer_capacity(s, &bL, &bkg);
  if (rc == EQP_OK) rc = eqp_solution_add(s, load_with, load_mol, EQP_Q_AMOUNT);
  if (rc == EQP_OK) rc = eqp_solution_equilibrate(s, &res);
  for (size_t i = 0; res && i < eqp_result_warning_count(res); i++) {
    lua_pushfstring(L, "under the load: %s", eqp_result_warning(res, i));
    lua_rawseti(L, -2, (lua_Integer)lua_rawlen(L, -2) + 1);
  }
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
  eqpl_val v[C_COMPARE_N];
  if (!lua_istable(L, 1))
    return eqpl_input_error(L, "eq.compare_buffers: a table of options, such as { pH = 7.2, "
                            "total = '50 mM', load = '2 mM' }");
  eqpl_options(L, 1, "eq.compare_buffers", compare_opts, v, 0);
  eqp_recipe_spec base;
  fill_spec(L, "eq.compare_buffers", v, &base);
  double load = v[C_LOAD].num;
  const char *load_with = v[C_LOAD_WITH].given ? v[C_LOAD_WITH].str : "HCl";
  double window = v[C_WINDOW].given ? v[C_WINDOW].num : 0.1;
  int quiet = v[R_QUIET].given && v[R_QUIET].num != 0;
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
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
    lua_createtable(L, 0, 9);
    lua_insert(L, -2);
    lua_setfield(L, -2, "warnings");
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
