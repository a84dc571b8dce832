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
    double I = v[R_I].num;
    sp->ionic_strength = v[R_I].unit == EQP_Q_MOLARITY ? eqp_molal_of_molar(I, sp->T) : I;
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

/* A list of n strings at list[0..n). */
static void push_strings(lua_State *L, size_t n, const char *const *list)
{
  lua_createtable(L, (int)n, 0);
  for (size_t i = 0; i < n; i++) {
    lua_pushstring(L, list[i]);
    lua_rawseti(L, -2, (lua_Integer)i + 1);
  }
}

static void free_comparison(void *p) { eqp_comparison_free(p); }
static void free_recipe(void *p) { eqp_recipe_free(p); }

static int recipe_tostring(lua_State *L)
{
  lua_getfield(L, 1, "procedure");
  return 1;
}

/* eq.recipe{ buffer =, pH =, total =, volume =, temperature =, ionic_strength =,
**            salt =, using = {...}, titrant = "1 M", activity =, quiet = false } */
static int eq_recipe(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.recipe{ options }");
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
  eqpl_hold *h = eqpl_hold_new(L, free_recipe);
  int rc = eqp_recipe_make(ctx, &sp, &r);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  h->p = r;
  lua_createtable(L, 0, 6);
  lua_createtable(L, (int)eqp_recipe_item_count(r), 0);
  for (size_t i = 0; i < eqp_recipe_item_count(r); i++) {
    const eqp_recipe_item *it = eqp_recipe_item_at(r, i);
    lua_createtable(L, 0, 6);
    lua_pushstring(L, it->reagent);
    lua_setfield(L, -2, "reagent");
    lua_pushstring(L, role_name(it->role));
    lua_setfield(L, -2, "role");
    lua_pushnumber(L, it->mol * 1e3);
    lua_setfield(L, -2, "mmol");
    lua_pushnumber(L, isnan(it->grams) ? it->mL : it->grams);
    lua_setfield(L, -2, isnan(it->grams) ? "mL" : "grams");
    lua_pushstring(L, it->printed);      /* the quantity as the procedure prints it */
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
  lua_createtable(L, (int)eqp_recipe_warning_count(r), 0);
  for (size_t i = 0; i < eqp_recipe_warning_count(r); i++) {
    lua_pushstring(L, eqp_recipe_warning(r, i));
    lua_rawseti(L, -2, (lua_Integer)i + 1);
  }
  lua_setfield(L, -2, "warnings");
  eqpl_solution *u = eqpl_new_handle(L, sizeof *u, EQPL_K_SOLUTION);
  if ((rc = eqp_solution_copy(eqp_recipe_solution(r), &u->s)) < 0) return eqpl_fail(L, ctx, rc);
  eqpl_hold_free(h);
  lua_setfield(L, -2, "solution");
  lua_createtable(L, 0, 1);
  lua_pushcfunction(L, recipe_tostring);
  lua_setfield(L, -2, "__tostring");
  lua_setmetatable(L, -2);
  if (!quiet) {
    lua_getfield(L, -1, "procedure");
    eqpl_push_print(L);            /* through print, so --json captures it */
    lua_insert(L, -2);
    lua_call(L, 1, 0);
  }
  return 1;
}

/* Each line of text through print, so that --json captures it. */
static void emit_lines(lua_State *L, const char *text)
{
  for (const char *p = text; *p;) {
    const char *nl = strchr(p, '\n');
    size_t len = nl ? (size_t)(nl - p) : strlen(p);
    eqpl_push_print(L);
    lua_pushlstring(L, p, len);
    lua_call(L, 1, 0);
    p += len + (nl != NULL);
  }
}

/* eq.compare_buffers{ pH =, temperature =, total =, volume =, load = "2 mM",
**   load_with = "HCl", window = 0.1, activity =, quiet = false } -> ranked list */
static int eq_compare(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.compare_buffers{ options }");
  eqp_ctx *ctx = eqpl_ctx_of(L);
  eqpl_val v[C_COMPARE_N];
  if (!lua_istable(L, 1))
    return eqpl_input_error(L, "eq.compare_buffers: a table of options, such as { pH = 7.2, "
                            "total = '50 mM', load = '2 mM' }");
  eqpl_options(L, 1, "eq.compare_buffers", compare_opts, v, 0);
  eqp_recipe_spec base;
  fill_spec(L, "eq.compare_buffers", v, &base);
  eqp_compare_spec sp = EQP_COMPARE_SPEC_INIT;
  sp.recipe = &base;
  sp.load = v[C_LOAD].num;
  if (v[C_LOAD_WITH].given) sp.load_with = v[C_LOAD_WITH].str;
  if (v[C_WINDOW].given) sp.window = v[C_WINDOW].num;
  int quiet = v[R_QUIET].given && v[R_QUIET].num != 0;
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  eqp_comparison *cmp;
  eqpl_hold *h = eqpl_hold_new(L, free_comparison);
  int rc = eqp_compare_buffers(ctx, &sp, &cmp);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  h->p = cmp;
  size_t n = eqp_comparison_count(cmp);
  lua_createtable(L, (int)n, 0);
  int list = lua_gettop(L);
  for (size_t i = 0; i < n; i++) {
    const eqp_candidate *c = eqp_comparison_at(cmp, i);
    lua_createtable(L, 0, 9);
    push_strings(L, c->nwarnings, c->warnings);
    lua_setfield(L, -2, "warnings");
    lua_pushstring(L, c->buffer);
    lua_setfield(L, -2, "buffer");
    lua_pushboolean(L, c->possible);
    lua_setfield(L, -2, "possible");
    if (c->possible) {
      lua_pushnumber(L, c->beta); lua_setfield(L, -2, "beta");
      lua_pushnumber(L, c->shift); lua_setfield(L, -2, "shift");
      lua_pushboolean(L, c->within_window); lua_setfield(L, -2, "within_window");
    }
    lua_pushstring(L, c->why);
    lua_setfield(L, -2, "why");
    push_strings(L, c->nnotes, c->notes);
    lua_setfield(L, -2, "notes");
    lua_rawseti(L, list, (lua_Integer)i + 1);
  }
  /* the text is copied before the comparison goes: print may raise */
  lua_pushstring(L, eqp_comparison_text(cmp));
  eqpl_hold_free(h);
  if (!quiet) emit_lines(L, lua_tostring(L, -1));
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
