/* Lua binding of eqp_solution: eq.solution{...}, s:add, s:equilibrate, s:copy. */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

/* Raise: what is at idx is not a solution. A method called with a dot
** instead of a colon gets the hint. */
static eqpl_solution *not_a_solution(lua_State *L, int idx)
{
  lua_Debug ar;
  memset(&ar, 0, sizeof ar);
  const char *fn = "?";
  if (lua_getstack(L, 0, &ar) && lua_getinfo(L, "n", &ar) && ar.name) fn = ar.name;
  char buf[96];
  if (idx == 1 && !(ar.namewhat && strcmp(ar.namewhat, "method") == 0))
    eqpl_input_error(L, "%s: call it on a solution, with a colon (s:%s(...)); got %s first", fn,
                     fn, eqpl_describe(L, idx, buf, sizeof buf));
  eqpl_input_error(L, "%s: argument %d must be a solution; got %s", fn, idx,
                   eqpl_describe(L, idx, buf, sizeof buf));
  return NULL;
}

eqpl_solution *eqpl_check_solution_in(lua_State *L, const eqpl_ctx *c, int idx)
{
  eqpl_solution *u = eqpl_handle_in(L, c, idx, EQPL_K_SOLUTION);
  if (!u) return not_a_solution(L, idx);
  if (!u->s) eqpl_input_error(L, "argument %d: the solution is closed", idx);
  return u;
}

eqpl_solution *eqpl_check_solution(lua_State *L, int idx)
{
  return eqpl_check_solution_in(L, eqpl_self(L), idx);
}

static const eqpl_opt solution_opts[] = {
  {"volume", EQPL_QUANTITY, EQP_Q_VOLUME, 0, EQPL_MAX_WATER, EQPL_ABOVE, NULL},
  {"water", EQPL_QUANTITY, EQP_Q_MASS, 0, EQPL_MAX_WATER, EQPL_ABOVE, NULL},
  {"temperature", EQPL_TEMPERATURE, 0, 0, 0, 0, NULL},
  {"activity", EQPL_ANY, 0, 0, 0, 0, NULL},
  {"species", EQPL_ANY, 0, 0, 0, 0, NULL},
  {"precipitate", EQPL_ANY, 0, 0, 0, 0, NULL},
  {"library", EQPL_ANY, 0, 0, 0, 0, NULL},
  {NULL, 0, 0, 0, 0, 0, NULL},
};
enum { O_VOLUME, O_WATER, O_TEMPERATURE, O_ACTIVITY, O_SPECIES, O_PRECIPITATE, O_LIBRARY, O_N };

static const eqpl_opt library_opts[] = {
  {"only", EQPL_NAMES, 0, 0, 1000, 0, NULL},
  {"without", EQPL_NAMES, 0, 0, 1000, 0, NULL},
  {NULL, 0, 0, 0, 0, 0, NULL},
};

/* precipitate = true (every solid of the library), false, or a list of
** solid names; an unknown name is refused with the nearest one. */
static void read_precipitate(lua_State *L, eqp_ctx *ctx, eqp_solution *s, const eqpl_val *v)
{
  char buf[96];
  if (!v->given) return;
  int rc = EQP_OK;
  if (lua_type(L, v->idx) == LUA_TBOOLEAN) {
    rc = eqp_solution_allow_all_solids(s, lua_toboolean(L, v->idx));
  } else if (lua_type(L, v->idx) == LUA_TTABLE) {
    const eqp_library *lib = eqp_solution_library(s);      /* its own solids */
    size_t n = lua_rawlen(L, v->idx), ns = eqp_library_solid_count(lib);
    const char **names = lua_newuserdatauv(L, sizeof(char *) * (n + 1), 0);  /* anchored */
    const char **all = lua_newuserdatauv(L, sizeof(char *) * (ns + 1), 0);
    for (size_t j = 0; j < ns; j++) all[j] = eqp_library_solid_name(lib, j);
    for (size_t i = 0; i < n; i++) {
      lua_rawgeti(L, v->idx, (lua_Integer)i + 1);   /* stays on the stack: anchors the name */
      names[i] = eqpl_check_name(L, -1, "eq.solution: precipitate, a solid's name,");
      int known = 0;
      for (size_t j = 0; j < ns && !known; j++) known = strcmp(all[j], names[i]) == 0;
      if (!known) {
        /* a formula naming one solid is fine too: the library decides */
        const char *near = eqpl_nearest(names[i], strlen(names[i]), all, ns);
        if (eqp_solution_allow_solids(s, &names[i], 1) < 0) {
          if (near)
            eqpl_input_error(L, "eq.solution: precipitate: unknown solid '%s' (did you mean "
                             "'%s'?)", names[i], near);
          eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
          return;
        }
      }
    }
    lua_pushnil(L);
    while (lua_next(L, v->idx)) {
      if (!lua_isinteger(L, -2) || lua_tointeger(L, -2) < 1 ||
          (size_t)lua_tointeger(L, -2) > n)
        eqpl_input_error(L, "eq.solution: precipitate is a list of solids' names, such as "
                         "{ 'calcite' }, or true for all");
      lua_pop(L, 1);
    }
    rc = eqp_solution_allow_solids(s, names, n);
  } else {
    eqpl_input_error(L, "eq.solution: precipitate must be true, false or a list of solids "
                     "such as { 'calcite' }; got %s", eqpl_describe(L, v->idx, buf, sizeof buf));
  }
  if (rc < 0) eqpl_fail(L, ctx, rc);
}

/* activity = "davies" or { "davies", coefficient = 0.2 }: the model's name;
** *params is the slot of a checked copy of the parameters (0: none), so
** that nothing the script does later can change what is passed on. */
static const char *read_activity(lua_State *L, const eqpl_val *v, int *params)
{
  *params = 0;
  if (!v->given) return NULL;
  if (lua_type(L, v->idx) == LUA_TSTRING)
    return eqpl_check_name(L, v->idx, "eq.solution: activity");
  if (lua_type(L, v->idx) != LUA_TTABLE) {
    char buf[96];
    eqpl_input_error(L, "eq.solution: activity must be a model name such as 'davies', or "
                     "{ 'davies', coefficient = 0.2 }; got %s",
                     eqpl_describe(L, v->idx, buf, sizeof buf));
  }
  lua_rawgeti(L, v->idx, 1);      /* stays on the stack: anchors the name */
  const char *name = eqpl_check_name(L, -1, "eq.solution: activity[1], the model name,");
  lua_newtable(L);
  int copy = lua_gettop(L);
  lua_pushnil(L);
  while (lua_next(L, v->idx)) {
    if (lua_type(L, -2) == LUA_TSTRING) {
      char what[128];
      size_t len;
      const char *k = lua_tolstring(L, -2, &len);
      if (strlen(k) != len)
        eqpl_input_error(L, "eq.solution: activity parameter '%s' is followed by a NUL "
                         "character", k);
      snprintf(what, sizeof what, "eq.solution: activity parameter '%s'", k);
      eqpl_check_number(L, -1, what, -HUGE_VAL, HUGE_VAL, 0);
      lua_pushvalue(L, -2);
      lua_pushvalue(L, -2);
      lua_rawset(L, copy);
    } else if (!(lua_isinteger(L, -2) && lua_tointeger(L, -2) == 1)) {
      char buf[96];
      eqpl_input_error(L, "eq.solution: activity parameters go by name, such as { 'davies', "
                       "coefficient = 0.2 }; got %s without a name",
                       eqpl_describe(L, -1, buf, sizeof buf));
    }
    lua_pop(L, 1);
  }
  *params = copy;
  return name;
}

/* library = { only = { "phosphate", ... } } or { without = { ... } }: the
** context's library restricted for this solution */
static void restrict_library(lua_State *L, eqp_ctx *ctx, const eqpl_val *v, eqpl_library *h)
{
  if (!v->given) return;
  if (!lua_istable(L, v->idx)) {
    char buf[96];
    eqpl_input_error(L, "eq.solution: library must be a table such as { only = { 'phosphate' "
                     "} } or { without = { 'metals' } }; got %s",
                     eqpl_describe(L, v->idx, buf, sizeof buf));
  }
  eqpl_val o[2];
  eqpl_options(L, v->idx, "eq.solution: library", library_opts, o, 0);
  if (o[0].given == o[1].given)
    eqpl_input_error(L, "eq.solution: library takes either 'only' or 'without', a list of "
                     "species file names");
  const eqp_library *out;
  int rc = o[0].given ? eqp_library_only(ctx, h->lib, o[0].names, o[0].count, &out)
                      : eqp_library_without(ctx, h->lib, o[1].names, o[1].count, &out);
  if (rc < 0) eqpl_fail(L, ctx, rc);
  eqp_library_free(h->lib);
  h->lib = out;
}

/* species = a species table, or a list of file names and species tables:
** for this solution only (read raw: a metamethod never runs) */
static void load_species(lua_State *L, eqp_ctx *ctx, const eqpl_val *v, eqpl_library *h)
{
  if (!v->given) return;
  int sp = v->idx;
  if (!lua_istable(L, sp))
    eqpl_input_error(L, "eq.solution: species must be a species table, or a list of file "
                     "names and species tables");
  static const char *const keys[] = {"species", "acids", "reactions", "reagents"};
  int single = 0;
  for (int k = 0; k < 4; k++) {
    lua_pushstring(L, keys[k]);
    single |= lua_rawget(L, sp) != LUA_TNIL;
    lua_pop(L, 1);
  }
  if (single) {
    eqpl_extend_library(L, ctx, h, sp);
    return;
  }
  lua_Integer n = (lua_Integer)lua_rawlen(L, sp);
  for (lua_Integer i = 1; i <= n; i++) {
    lua_rawgeti(L, sp, i);
    eqpl_extend_library(L, ctx, h, -1);
    lua_pop(L, 1);
  }
}

int eqpl_solution_new(lua_State *L);

int eqpl_solution_new(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.solution{ options }");
  eqp_ctx *ctx = eqpl_ctx_of(L);
  eqpl_val v[O_N];
  eqpl_options(L, 1, "eq.solution", solution_opts, v, 0);
  if (v[O_WATER].given && v[O_VOLUME].given)
    return eqpl_input_error(L, "eq.solution: give either 'water' (a mass) or 'volume', not both");
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.temperature_K = v[O_TEMPERATURE].given ? v[O_TEMPERATURE].num : 298.15;
  o.water = v[O_WATER].given ? v[O_WATER].num : 1.0;
  if (v[O_VOLUME].given) o.water = eqp_water_of_volume(v[O_VOLUME].num, o.temperature_K);
  int params;
  o.activity = read_activity(L, &v[O_ACTIVITY], &params);
  /* every option is checked before anything is loaded or made */
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  eqpl_library *h = eqpl_push_library(L, eqp_ctx_library(ctx));
  restrict_library(L, ctx, &v[O_LIBRARY], h);
  load_species(L, ctx, &v[O_SPECIES], h);
  eqp_solution *s;
  eqpl_solution *u = eqpl_new_handle(L, sizeof *u, EQPL_K_SOLUTION);
  int hidx = lua_gettop(L);
  int rc = eqp_solution_new_in(ctx, h->lib, &o, &s);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  u->s = s;
  if (params) {
    lua_pushnil(L);
    while (lua_next(L, params)) {
      rc = eqp_solution_set_activity_param(s, lua_tostring(L, -2), lua_tonumber(L, -1));
      if (rc < 0) return eqpl_fail(L, ctx, rc);
      lua_pop(L, 1);
    }
  }
  read_precipitate(L, ctx, s, &v[O_PRECIPITATE]);
  lua_pushvalue(L, hidx);
  return 1;
}

/* s:add(reagent, "12.5 mmol") -> s */
static int solution_add(lua_State *L)
{
  eqpl_check_nargs(L, 3, "s:add(reagent, amount)");
  eqpl_ctx *c = eqpl_self(L);
  eqpl_solution *u = eqpl_check_solution_in(L, c, 1);
  eqp_ctx *ctx = eqpl_ctx_in(L, c);
  const char *reagent = eqpl_check_name(L, 2, "add: the reagent");
  int type = lua_type(L, 3);
  if (type == LUA_TNUMBER) {
    lua_pushvalue(L, 3);     /* converted in a slot of its own, which anchors it */
    return eqpl_input_error(L, "amount of %s: %s has no unit (write it as a string with its "
                            "unit, such as '10 mmol' or '1.5 g')", reagent, lua_tostring(L, -1));
  }
  if (type != LUA_TSTRING)
    return eqpl_input_error(L, "amount of %s: expected a string such as '10 mmol'", reagent);
  size_t len;
  const char *amount = lua_tolstring(L, 3, &len);
  if (len == 0 || strlen(amount) != len) {   /* the message is written only when needed */
    char what[160];
    snprintf(what, sizeof what, "amount of %s", reagent);
    eqpl_check_name(L, 3, what);
  }
  int rc = eqp_solution_add_str(u->s, reagent, amount);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_settop(L, 1);
  return 1;
}

/* s:equilibrate() -> result */
static int solution_equilibrate(lua_State *L)
{
  eqpl_check_nargs(L, 1, "s:equilibrate()");
  eqpl_ctx *c = eqpl_self(L);
  eqpl_solution *u = eqpl_check_solution_in(L, c, 1);
  eqp_ctx *ctx = eqpl_ctx_in(L, c);
  eqp_result *r;
  int rc = eqp_solution_equilibrate(u->s, &r);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  eqpl_push_result(L, r);
  return 1;
}

static int solution_copy(lua_State *L)
{
  eqpl_check_nargs(L, 1, "s:copy()");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  eqpl_solution *c = eqpl_new_handle(L, sizeof *c, EQPL_K_SOLUTION);
  int rc = eqp_solution_copy(u->s, &c->s);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  return 1;
}

/* s:set_temperature(37) or ("310.15 K"): same composition, new temperature */
static int solution_set_temperature(lua_State *L)
{
  eqpl_check_nargs(L, 2, "s:set_temperature(t)");
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  double T = eqpl_check_temperature(L, 2, "set_temperature: temperature");
  int rc = eqp_solution_set_temperature(u->s, T);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  lua_settop(L, 1);
  return 1;
}

static int solution_water(lua_State *L)
{
  eqpl_check_nargs(L, 1, "s:water()");
  lua_pushnumber(L, eqp_solution_water(eqpl_check_solution(L, 1)->s));
  return 1;
}

static int solution_volume(lua_State *L)
{
  eqpl_check_nargs(L, 1, "s:volume()");
  lua_pushnumber(L, eqp_solution_volume(eqpl_check_solution(L, 1)->s));
  return 1;
}

static int solution_temperature(lua_State *L)
{
  eqpl_check_nargs(L, 1, "s:temperature()");
  lua_pushnumber(L, eqp_solution_temperature_K(eqpl_check_solution(L, 1)->s) - 273.15);
  return 1;
}

static int solution_close(lua_State *L)
{
  eqpl_solution *u = eqpl_check_handle(L, 1, EQPL_K_SOLUTION);
  eqp_solution_free(u->s);
  u->s = NULL;
  return 0;
}

static int solution_tostring(lua_State *L)
{
  eqpl_solution *u = eqpl_check_handle(L, 1, EQPL_K_SOLUTION);
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
  lua_pushstring(L, EQPL_SOLUTION);   /* getmetatable(s) gives the name, not the table */
  lua_setfield(L, -2, "__metatable");
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, solution_meta, 1);
  luaL_newlibtable(L, solution_methods);
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, solution_methods, 1);
  lua_setfield(L, -2, "__index");
  lua_settop(L, ctx);
}
