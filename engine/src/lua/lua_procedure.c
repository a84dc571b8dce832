/* Lua binding of the bench operations on a solution: pouring, mixing,
** dilution, buffer capacity, pH adjustment, load budget and titration. */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

double eqpl_check_volume(lua_State *L, int idx, const char *what)
{
  return eqpl_check_quantity(L, idx, what, EQP_Q_VOLUME, 0, EQPL_MAX_WATER, 0, NULL);
}

/* An amount of a reagent ("2 mmol", "0.5 g") in mol. */
static double check_amount(lua_State *L, int idx, const char *reagent, const char *what)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  eqp_quantity k;
  double v = eqpl_check_quantity(L, idx, what, EQP_Q_AMOUNT | EQP_Q_MASS, 0, HUGE_VAL,
                                 EQPL_ABOVE, &k), mol;
  int rc = eqp_ctx_reagent_mol(ctx, reagent, v, k, &mol);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  return mol;
}

/* s:pour(stock, "10 mL") -> s */
static int sol_pour(lua_State *L)
{
  eqpl_check_nargs(L, 3, "s:pour(stock, volume)");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqpl_solution *k = eqpl_check_solution(L, 2);
  double V = eqpl_check_volume(L, 3, "pour: volume");
  int rc = eqp_solution_pour(u->s, k->s, V);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_settop(L, 1);
  return 1;
}

static const eqpl_opt dilute_opts[] = {
  {"to", EQPL_QUANTITY, EQP_Q_VOLUME, 0, EQPL_MAX_WATER, EQPL_ABOVE | EQPL_REQUIRED,
   "the final volume, such as '1 L'"},
  {NULL, 0, 0, 0, 0, 0, NULL},
};

/* s:dilute(2) doubles the volume; s:dilute{ to = "1 L" } makes it up to 1 L */
static int sol_dilute(lua_State *L)
{
  eqpl_check_nargs(L, 2, "s:dilute(factor | { to = volume })");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  double f;
  if (lua_type(L, 2) == LUA_TNUMBER) {
    f = eqpl_check_number(L, 2, "dilute: the factor", 1, 1e6, 0);
  } else if (lua_type(L, 2) == LUA_TTABLE) {
    eqpl_val to;
    eqpl_options(L, 2, "dilute", dilute_opts, &to, 0);
    double V = eqp_solution_volume(u->s);
    if (to.num < V)     /* the engine refuses too: here the message quotes the script */
      return eqpl_input_error(L, "dilute: to = '%s' is less than the solution's volume, %.6g mL "
                              "(water cannot be taken away)", lua_tostring(L, to.idx), V * 1e3);
    int rc = eqp_solution_dilute_to(u->s, to.num);
    if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
    lua_settop(L, 1);
    return 1;
  } else {
    char buf[96];
    return eqpl_input_error(L, "dilute: a factor (2) or { to = '500 mL' }; got %s",
                            eqpl_describe(L, 2, buf, sizeof buf));
  }
  int rc = eqp_solution_dilute(u->s, f);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_settop(L, 1);
  return 1;
}

/* s:buffer_capacity() -> beta in mol/(L pH), beta in mol/(kg pH), the C order */
static int sol_buffer_capacity(lua_State *L)
{
  eqpl_check_nargs(L, 1, "s:buffer_capacity()");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  double bkg, bL;
  int rc = eqp_solution_buffer_capacity(u->s, &bL, &bkg);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_pushnumber(L, bL);
  lua_pushnumber(L, bkg);
  return 2;
}

/* A reagent name or a stock solution at idx. */
static void reagent_or_stock(lua_State *L, int idx, const char *what, const char **reagent,
                             const eqp_solution **stock)
{
  *reagent = NULL;
  *stock = NULL;
  if (lua_type(L, idx) == LUA_TSTRING) {
    *reagent = eqpl_check_name(L, idx, what);
  } else if (eqpl_test_handle(L, idx, EQPL_K_SOLUTION)) {
    *stock = eqpl_check_solution(L, idx)->s;
  } else {
    char buf[96];
    eqpl_input_error(L, "%s must be a reagent name or a stock solution; got %s", what,
                     eqpl_describe(L, idx, buf, sizeof buf));
  }
}

/* s:adjust_pH(7.4, "NaOH" | stock) -> mol (nil for a stock), litres (nil for a solid) */
static int sol_adjust(lua_State *L)
{
  eqpl_check_nargs(L, 3, "s:adjust_pH(pH, reagent | stock)");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  double pH = eqpl_check_number(L, 2, "adjust_pH: the target pH", EQPL_PH_MIN, EQPL_PH_MAX, 0);
  double mol, litres;
  const char *reagent;
  const eqp_solution *stock;
  reagent_or_stock(L, 3, "adjust_pH: the reagent", &reagent, &stock);
  int rc = eqp_solution_adjust_pH(u->s, pH, reagent, stock, &mol, &litres);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  if (isnan(mol)) lua_pushnil(L);
  else lua_pushnumber(L, mol);
  if (isnan(litres)) lua_pushnil(L);
  else lua_pushnumber(L, litres);
  return 2;
}

static const eqpl_opt target_opts[] = {
  {"with", EQPL_ANY, 0, 0, 0, EQPL_REQUIRED, "a reagent name or a stock solution"},
  {"pH", EQPL_NUMBER, 0, EQPL_PH_MIN, EQPL_PH_MAX, 0, NULL},
  {"species", EQPL_NAME, 0, 0, 0, 0, "a species name, such as 'Ca^2+'"},
  {"activity", EQPL_NUMBER, 0, 0, 100, EQPL_ABOVE, NULL},
  {"free", EQPL_QUANTITY, EQP_Q_MOLALITY, 0, 100, EQPL_ABOVE, "a molality, such as '1 umol/kg'"},
  {"ionic_strength", EQPL_QUANTITY, EQP_Q_MOLALITY, 0, 100, EQPL_ABOVE,
   "a molality, such as '0.15 mol/kg'"},
  {NULL, 0, 0, 0, 0, 0, NULL},
};

/* One target table at idx into t: exactly one of pH, activity (with
** species), free (with species), ionic_strength. */
static void check_target(lua_State *L, int idx, int k, eqp_target *t)
{
  char call[40];
  snprintf(call, sizeof call, "adjust: target %d", k);
  luaL_checktype(L, idx, LUA_TTABLE);
  eqpl_val v[6];
  eqpl_options(L, idx, call, target_opts, v, 0);
  int n = v[1].given + v[3].given + v[4].given + v[5].given;
  if (n != 1)
    eqpl_input_error(L, "%s needs exactly one of pH, activity, free, ionic_strength", call);
  if ((v[3].given || v[4].given) != v[2].given)
    eqpl_input_error(L, "%s: species goes with activity or free, and only with them", call);
  eqp_target init = EQP_TARGET_INIT;
  *t = init;
  reagent_or_stock(L, v[0].idx, "adjust: with", &t->reagent, &t->stock);
  t->species = v[2].given ? v[2].str : NULL;
  if (v[1].given) { t->kind = EQP_TARGET_PH; t->value = v[1].num; }
  if (v[3].given) { t->kind = EQP_TARGET_ACTIVITY; t->value = v[3].num; }
  if (v[4].given) { t->kind = EQP_TARGET_FREE; t->value = v[4].num; }
  if (v[5].given) { t->kind = EQP_TARGET_IONIC_STRENGTH; t->value = v[5].num; }
}

/* s:adjust{ { pH = 7.2, with = "KOH" }, { species = "Ca^2+", free = "1 umol/kg",
** with = "CaCl2" } } -> { { mol = , litres = }, ... }: all targets at once */
static int sol_adjust_targets(lua_State *L)
{
  eqpl_check_nargs(L, 2, "s:adjust{ target, ... }");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  luaL_checktype(L, 2, LUA_TTABLE);
  lua_Integer n = luaL_len(L, 2);
  if (n < 1 || n > EQP_MAX_TARGETS)
    eqpl_input_error(L, "adjust: a list of 1 to %d targets", EQP_MAX_TARGETS);
  eqp_target t[EQP_MAX_TARGETS];
  for (int k = 0; k < (int)n; k++) {
    lua_rawgeti(L, 2, k + 1);            /* anchors the target's strings */
    check_target(L, lua_gettop(L), k + 1, &t[k]);
  }
  int rc = eqp_solution_adjust(u->s, t, (size_t)n);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_createtable(L, (int)n, 0);
  for (int k = 0; k < (int)n; k++) {
    lua_createtable(L, 0, 2);
    if (!isnan(t[k].mol)) {
      lua_pushnumber(L, t[k].mol);
      lua_setfield(L, -2, "mol");
    }
    if (!isnan(t[k].litres)) {
      lua_pushnumber(L, t[k].litres);
      lua_setfield(L, -2, "litres");
    }
    lua_rawseti(L, -2, k + 1);
  }
  return 1;
}

/* s:fix_activity("Ca^2+", 1e-6, "Cl-") -> mol of the component added, mol of
** the counter-ion added (negative: taken away) */
static int sol_fix_activity(lua_State *L)
{
  eqpl_check_nargs(L, 4, "s:fix_activity(component, activity, counter_ion)");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  const char *comp = eqpl_check_name(L, 2, "fix_activity: the component");
  double a = eqpl_check_number(L, 3, "fix_activity: the activity", 0, 100, EQPL_ABOVE);
  const char *counter = eqpl_check_name(L, 4, "fix_activity: the counter-ion");
  double mol, molq;
  int rc = eqp_solution_fix_activity(u->s, comp, a, counter, &mol, &molq);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_pushnumber(L, mol);
  lua_pushnumber(L, molq);
  return 2;
}

static const eqpl_opt budget_opts[] = {
  {"window", EQPL_NUMBER, 0, 0, 7, EQPL_ABOVE, NULL},
  {"acid", EQPL_NAME, 0, 0, 0, 0, "a reagent name, such as 'HCl'"},
  {"base", EQPL_NAME, 0, 0, 0, 0, "a reagent name, such as 'NaOH'"},
  {NULL, 0, 0, 0, 0, 0, NULL},
};

/* s:load_budget{ window = 0.1, acid = "HCl", base = "NaOH" } -> table */
static int sol_load_budget(lua_State *L)
{
  eqpl_check_nargs(L, 2, "s:load_budget([options])");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  eqpl_val v[3];
  eqpl_options(L, 2, "load_budget", budget_opts, v, 0);
  eqp_budget_spec sp = EQP_BUDGET_SPEC_INIT;
  if (v[0].given) sp.window = v[0].num;
  if (v[1].given) sp.acid = v[1].str;
  if (v[2].given) sp.base = v[2].str;
  eqp_budget b;
  int rc = eqp_solution_load_budget(u->s, &sp, &b);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_createtable(L, 0, 6);
  lua_pushnumber(L, b.pH);
  lua_setfield(L, -2, "pH");
  lua_pushnumber(L, b.window);
  lua_setfield(L, -2, "window");
  lua_pushnumber(L, b.acid_mol * 1e3);
  lua_setfield(L, -2, "acid_mmol");
  lua_pushnumber(L, b.base_mol * 1e3);
  lua_setfield(L, -2, "base_mmol");
  lua_pushnumber(L, b.acid_molar * 1e3);
  lua_setfield(L, -2, "acid_mM");
  lua_pushnumber(L, b.base_molar * 1e3);
  lua_setfield(L, -2, "base_mM");
  return 1;
}

/* s:expose("CO2(g)", "427 uatm") -> mol taken up (negative: released) */
static int sol_expose(lua_State *L)
{
  eqpl_check_nargs(L, 3, "s:expose(gas, pressure)");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  const char *gas = eqpl_check_name(L, 2, "expose: the gas");
  double mol, p = eqpl_check_quantity(L, 3, "expose: the partial pressure", EQP_Q_PRESSURE, 0,
                                      EQPL_MAX_PRESSURE, 0, NULL);
  int rc = eqp_solution_expose(u->s, gas, p, &mol);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_pushnumber(L, mol);
  return 1;
}

/* s:total("Na+") -> mol of a component */
static int sol_total(lua_State *L)
{
  eqpl_check_nargs(L, 2, "s:total(component)");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  double mol;
  int rc = eqp_solution_total(u->s, eqpl_check_name(L, 2, "total: the component"), &mol);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_pushnumber(L, mol);
  return 1;
}

static const eqpl_opt seal_opts[] = {
  {"headspace", EQPL_QUANTITY, EQP_Q_VOLUME, 0, EQPL_MAX_WATER, EQPL_ABOVE | EQPL_REQUIRED,
   "the volume of gas above the liquid, such as '5 mL'"},
  {"gases", EQPL_ANY, 0, 0, 0, 0, NULL},
  {NULL, 0, 0, 0, 0, 0, NULL},
};

/* s:seal{ headspace = "5 mL", gases = { ["CO2(g)"] = "426.9 uatm", ... } } */
static int sol_seal(lua_State *L)
{
  eqpl_check_nargs(L, 2, "s:seal{ headspace = ..., gases = { ... } }");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  char buf[96];
  if (!lua_istable(L, 2))
    return eqpl_input_error(L, "seal: a table of options, such as { headspace = '5 mL', gases = "
                            "{ ['CO2(g)'] = '426.9 uatm' } }; got %s",
                            eqpl_describe(L, 2, buf, sizeof buf));
  eqpl_val v[2];
  eqpl_options(L, 2, "seal", seal_opts, v, 0);
  eqp_headspace h = EQP_HEADSPACE_INIT;
  h.litres = v[0].num;
  const eqp_library *lib = eqp_solution_library(u->s);
  size_t nlib = eqp_library_gas_count(lib), n = 0;
  const char **all = lua_newuserdatauv(L, sizeof(char *) * (nlib + 1), 0);   /* anchored */
  for (size_t j = 0; j < nlib; j++) all[j] = eqp_library_gas_name(lib, j);
  const char **names = NULL;
  double *p = NULL;
  if (v[1].given) {
    if (!lua_istable(L, v[1].idx))
      return eqpl_input_error(L, "seal: gases must be a table of partial pressures, such as "
                              "{ ['CO2(g)'] = '426.9 uatm' }; got %s",
                              eqpl_describe(L, v[1].idx, buf, sizeof buf));
    size_t cap = 0;
    lua_pushnil(L);
    while (lua_next(L, v[1].idx)) { cap++; lua_pop(L, 1); }
    names = lua_newuserdatauv(L, sizeof(char *) * (cap + 1), 0);
    p = lua_newuserdatauv(L, sizeof(double) * (cap + 1), 0);
    lua_pushnil(L);
    while (lua_next(L, v[1].idx)) {
      if (lua_type(L, -2) != LUA_TSTRING || n >= cap)
        return eqpl_input_error(L, "seal: gases is keyed by the gases' names, such as "
                                "{ ['CO2(g)'] = '426.9 uatm' }; it has the key %s",
                                eqpl_describe(L, -2, buf, sizeof buf));
      size_t len;
      const char *g = lua_tolstring(L, -2, &len);   /* a string key: no conversion */
      int known = 0;
      for (size_t j = 0; j < nlib && !known; j++) known = strcmp(all[j], g) == 0;
      if (!known) {
        const char *near = eqpl_nearest(g, len, all, nlib);
        if (near) return eqpl_input_error(L, "seal: unknown gas '%s' (did you mean '%s'?)", g, near);
      }
      char what[160];
      snprintf(what, sizeof what, "seal: the partial pressure of %s", g);
      p[n] = eqpl_check_quantity(L, -1, what, EQP_Q_PRESSURE, 0, EQPL_MAX_PRESSURE, 0, NULL);
      names[n++] = g;          /* the key stays in the table, which the stack anchors */
      lua_pop(L, 1);
    }
  }
  h.ngases = n;
  h.gases = names;
  h.p_atm = p;
  int rc = eqp_solution_seal(u->s, &h);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  return 0;
}

/* s:unseal(): the headspace's gas let go */
static int sol_unseal(lua_State *L)
{
  eqpl_check_nargs(L, 1, "s:unseal()");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  int rc = eqp_solution_unseal(u->s);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  return 0;
}

/* s:sealed() -> true under a headspace */
static int sol_sealed(lua_State *L)
{
  eqpl_check_nargs(L, 1, "s:sealed()");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  lua_pushboolean(L, eqp_solution_sealed(u->s));
  return 1;
}

static const eqpl_opt titrate_opts[] = {
  {"with", EQPL_ANY, 0, 0, 0, EQPL_REQUIRED, "a reagent name or a stock solution"},
  {"step", EQPL_ANY, 0, 0, 0, EQPL_REQUIRED, "the largest step, such as '0.1 mL' or '0.05 mmol'"},
  {"to", EQPL_ANY, 0, 0, 0, 0, NULL},
  {"until_pH", EQPL_NUMBER, 0, EQPL_PH_MIN, EQPL_PH_MAX, 0, NULL},
  {"max_dpH", EQPL_NUMBER, 0, 0, 14, EQPL_ABOVE, NULL},
  {"species", EQPL_NAMES, 0, 0, EQPL_MAX_COLUMNS, 0, NULL},
  {NULL, 0, 0, 0, 0, 0, NULL},
};
enum { T_WITH, T_STEP, T_TO, T_UNTIL, T_MAXDPH, T_SPECIES, T_N };

/* s:titrate{ with = ..., step = ..., to = ... | until_pH = ..., species = {...} } */
static int sol_titrate(lua_State *L)
{
  eqpl_check_nargs(L, 2, "s:titrate{ options }");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  if (!lua_istable(L, 2)) {
    char buf[96];
    return eqpl_input_error(L, "titrate: a table of options, such as { with = 'NaOH', step = "
                            "'0.1 mmol', to = '5 mmol' }; got %s",
                            eqpl_describe(L, 2, buf, sizeof buf));
  }
  eqpl_val v[T_N];
  eqpl_options(L, 2, "titrate", titrate_opts, v, 0);
  eqp_titration t = EQP_TITRATION_INIT;
  reagent_or_stock(L, v[T_WITH].idx, "titrate: with", &t.reagent, &t.stock);
  const char *what = t.reagent ? t.reagent : "stock";
  if (t.stock) {
    t.step = eqpl_check_quantity(L, v[T_STEP].idx, "titrate: step", EQP_Q_VOLUME, 0,
                                 EQPL_MAX_WATER, EQPL_ABOVE, NULL);
    if (v[T_TO].given)
      t.to = eqpl_check_quantity(L, v[T_TO].idx, "titrate: to", EQP_Q_VOLUME, 0, EQPL_MAX_WATER,
                                 EQPL_ABOVE, NULL);
  } else {
    t.step = check_amount(L, v[T_STEP].idx, what, "titrate: step");
    if (v[T_TO].given) t.to = check_amount(L, v[T_TO].idx, what, "titrate: to");
  }
  if (v[T_UNTIL].given) t.until_pH = v[T_UNTIL].num;
  if (v[T_MAXDPH].given) t.max_dpH = v[T_MAXDPH].num;
  t.species = v[T_SPECIES].names;   /* anchored in v[T_SPECIES].idx */
  t.nspecies = v[T_SPECIES].count;
  eqp_curve *c;
  int rc = eqp_solution_titrate(u->s, &t, &c);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  eqpl_push_curve(L, c);
  return 1;
}

static const luaL_Reg procedure_methods[] = {
  {"pour", sol_pour},
  {"dilute", sol_dilute},
  {"buffer_capacity", sol_buffer_capacity},
  {"adjust_pH", sol_adjust},
  {"adjust", sol_adjust_targets},
  {"fix_activity", sol_fix_activity},
  {"load_budget", sol_load_budget},
  {"total", sol_total},
  {"expose", sol_expose},
  {"seal", sol_seal},
  {"unseal", sol_unseal},
  {"sealed", sol_sealed},
  {"titrate", sol_titrate},
  {NULL, NULL},
};

static const eqpl_opt no_opts[] = {{NULL, 0, 0, 0, 0, 0, NULL}};

/* eq.mix{ a, b } or eq.mix{ { a, "10 mL" }, { b, "90 mL" } } -> new solution */
int eqpl_mix(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.mix{ parts }");
  eqp_ctx *ctx = eqpl_ctx_of(L);
  if (!lua_istable(L, 1))
    return eqpl_input_error(L, "eq.mix: a list of solutions, or of { solution, volume } pairs");
  size_t n = eqpl_options(L, 1, "eq.mix", no_opts, NULL, EQPL_LIST);
  if (n == 0 || n > 64)
    return eqpl_input_error(L, "eq.mix: a list of 1 to 64 solutions; got %zu", n);
  eqp_solution *parts[64];
  double litres[64];
  for (size_t i = 0; i < n; i++) {
    char what[64];
    snprintf(what, sizeof what, "eq.mix: part %zu", i + 1);
    lua_rawgeti(L, 1, (lua_Integer)i + 1);
    int part = lua_gettop(L);
    if (lua_istable(L, part)) {
      if (eqpl_options(L, part, what, no_opts, NULL, EQPL_LIST) != 2)
        return eqpl_input_error(L, "%s must be a solution or a pair { solution, '10 mL' }", what);
      lua_rawgeti(L, part, 1);
      lua_rawgeti(L, part, 2);
    } else {
      lua_pushvalue(L, part);
      lua_pushnil(L);
    }
    eqpl_solution *s = eqpl_test_handle(L, -2, EQPL_K_SOLUTION);
    if (!s || !s->s) {
      char buf[96];
      return eqpl_input_error(L, "%s must be a solution or a pair { solution, '10 mL' }; got %s",
                              what, eqpl_describe(L, -2, buf, sizeof buf));
    }
    parts[i] = s->s;
    if (lua_isnil(L, -1)) {
      litres[i] = eqp_solution_volume(parts[i]);
    } else {
      strncat(what, ": volume", sizeof what - strlen(what) - 1);
      litres[i] = eqpl_check_quantity(L, -1, what, EQP_Q_VOLUME, 0, EQPL_MAX_WATER, EQPL_ABOVE,
                                      NULL);
    }
    lua_settop(L, part - 1);
  }
  eqpl_solution *u = eqpl_new_handle(L, sizeof *u, EQPL_K_SOLUTION);
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
