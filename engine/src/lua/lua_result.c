/* Lua binding of eqp_result: r.pH, r.ionic_strength, r:molality(sp), ... */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include "../result_impl.h"
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static eqp_result *check_result(lua_State *L, int idx)
{
  eqpl_result *u = eqpl_check_handle(L, idx, EQPL_K_RESULT);
  if (!u->r || !u->hold || !u->hold->lib || !u->c || !u->c->ctx)
    luaL_argerror(L, idx, "result is closed");
  return u->r;
}

/* The result moves into its handle's memory, and the handle's second user
** value is a holder of its library (the context keeps the last one made):
** a result is then plain memory that the collector frees without a
** finalizer, seeing its true size, and the engine's block is reused by the
** next result. */
void eqpl_push_result(lua_State *L, eqp_result *r)
{
  eqpl_ctx *c = eqpl_self(L);
  if (!c || !c->ctx) {
    eqp_result_free(r);
    luaL_error(L, "equipoise: context is closed");
  }
  /* the allocations below may raise (a memory limit): until it is placed
  ** the context owns r, and frees one left over by such an error (an
  ** eqpl_hold would do the same at the cost of a finalized object per
  ** result, which is what placing the result saves) */
  if (c->pending) eqp_result_free(c->pending);
  c->pending = r;
  const size_t at = (sizeof(eqpl_result) + 15) / 16 * 16;
  eqpl_result *u = eqpl_new_handle_uv(L, at + eqpi_result_bytes(r), EQPL_K_RESULT, 2);
  const eqp_library *lib = eqpi_result_library(r);
  if (c->held_lib != lib) {
    eqpl_push_library(L, lib);
    lua_setiuservalue(L, lua_upvalueindex(1), EQPL_UV_HOLDER);
    c->held_lib = lib;
  }
  lua_getiuservalue(L, lua_upvalueindex(1), EQPL_UV_HOLDER);
  u->hold = lua_touserdata(L, -1);
  u->c = c;
  lua_setiuservalue(L, -2, 2);
  u->r = eqpi_result_place(r, (char *)u + at);
  c->pending = NULL;
}

typedef int (*per_species_fn)(const eqp_result *, const char *, double *);

static int per_species(lua_State *L, per_species_fn f, const char *signature)
{
  eqpl_check_nargs(L, 2, signature);
  eqp_result *r = check_result(L, 1);
  double v;
  int rc = f(r, eqpl_check_name(L, 2, "species"), &v);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_pushnumber(L, v);
  return 1;
}

static int result_molality(lua_State *L)
{
  return per_species(L, eqp_result_molality, "r:molality(species)");
}
static int result_molarity(lua_State *L)
{
  return per_species(L, eqp_result_molarity, "r:molarity(species)");
}
static int result_activity(lua_State *L)
{
  return per_species(L, eqp_result_activity, "r:activity(species)");
}
static int result_gamma(lua_State *L)
{
  return per_species(L, eqp_result_gamma, "r:gamma(species)");
}
static int result_saturation(lua_State *L)
{
  return per_species(L, eqp_result_saturation, "r:saturation(solid)");
}
static int result_solid(lua_State *L)
{
  return per_species(L, eqp_result_solid, "r:solid(name)");
}

/* r:gas("CO2(g)") -> partial pressure in the headspace (atm), mol in the gas phase */
static int result_gas(lua_State *L)
{
  eqpl_check_nargs(L, 2, "r:gas(name)");
  eqp_result *r = check_result(L, 1);
  double p, mol;
  int rc = eqp_result_gas(r, eqpl_check_name(L, 2, "gas"), &p, &mol);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_pushnumber(L, p);
  lua_pushnumber(L, mol);
  return 2;
}

/* r.headspace: { volume = L, pressure = atm, water_vapour = atm, gases = { [name] = { pressure
** = atm, mol = mol } } }, or nil for an open solution */
static void push_headspace(lua_State *L, const eqp_result *r)
{
  double V, pt, pw;
  if (eqp_result_headspace(r, &V, &pt, &pw) != 1) {
    lua_pushnil(L);
    return;
  }
  lua_createtable(L, 0, 4);
  lua_pushnumber(L, V);
  lua_setfield(L, -2, "volume");
  lua_pushnumber(L, pt);
  lua_setfield(L, -2, "pressure");
  lua_pushnumber(L, pw);
  lua_setfield(L, -2, "water_vapour");
  size_t n = eqp_result_gas_count(r);
  lua_createtable(L, 0, (int)n);
  for (size_t i = 0; i < n; i++) {
    double p, mol;
    const char *name = eqp_result_gas_name(r, i, &p, &mol);
    lua_createtable(L, 0, 2);
    lua_pushnumber(L, p);
    lua_setfield(L, -2, "pressure");
    lua_pushnumber(L, mol);
    lua_setfield(L, -2, "mol");
    lua_setfield(L, -2, name);
  }
  lua_setfield(L, -2, "gases");
}

/* r:species() -> { {name=, molality=, gamma=}, ... } by decreasing molality */
typedef struct row { const char *name; double m, lg; } row;

static int by_molality(const void *a, const void *b)
{
  double x = ((const row *)a)->m, y = ((const row *)b)->m;
  return x < y ? 1 : x > y ? -1 : strcmp(((const row *)a)->name, ((const row *)b)->name);
}

static row *sorted_rows(lua_State *L, const eqp_result *r, size_t *n)
{
  *n = eqp_result_species_count(r);
  row *rows = lua_newuserdatauv(L, sizeof(row) * (*n + 1), 0);   /* collected with the stack */
  for (size_t i = 0; i < *n; i++) {
    rows[i].name = eqp_result_species_name(r, i);
    rows[i].m = eqp_result_species_molality(r, i);
    rows[i].lg = eqp_result_species_log_gamma(r, i);
  }
  qsort(rows, *n, sizeof *rows, by_molality);
  return rows;
}

static int result_species(lua_State *L)
{
  eqpl_check_nargs(L, 1, "r:species()");
  eqp_result *r = check_result(L, 1);
  size_t n;
  row *rows = sorted_rows(L, r, &n);
  lua_createtable(L, (int)n, 0);
  for (size_t i = 0; i < n; i++) {
    lua_createtable(L, 0, 3);
    lua_pushstring(L, rows[i].name);
    lua_setfield(L, -2, "name");
    lua_pushnumber(L, rows[i].m);
    lua_setfield(L, -2, "molality");
    lua_pushnumber(L, pow(10.0, rows[i].lg));
    lua_setfield(L, -2, "gamma");
    lua_rawseti(L, -2, (lua_Integer)i + 1);
  }
  return 1;
}

static int result_tostring(lua_State *L)
{
  char *text = eqp_result_to_text(check_result(L, 1));
  if (!text) return luaL_error(L, "out of memory");
  lua_pushstring(L, text);
  eqp_free_string(text);
  return 1;
}

static const luaL_Reg result_methods[] = {
  {"molality", result_molality},
  {"molarity", result_molarity},
  {"activity", result_activity},
  {"gamma", result_gamma},
  {"saturation", result_saturation},
  {"solid", result_solid},
  {"gas", result_gas},
  {"species", result_species},
  {NULL, NULL},
};

/* Fields first, then methods from the table in upvalue 2. */
static int result_index(lua_State *L)
{
  eqp_result *r = check_result(L, 1);
  size_t len;
  const char *k = luaL_checklstring(L, 2, &len);
  if (strlen(k) != len) return 0;    /* no field has a NUL in its name */
  if (strcmp(k, "pH") == 0) lua_pushnumber(L, eqp_result_pH(r));
  else if (strcmp(k, "ionic_strength") == 0) lua_pushnumber(L, eqp_result_ionic_strength(r));
  else if (strcmp(k, "temperature") == 0) lua_pushnumber(L, eqp_result_temperature_K(r) - 273.15);
  else if (strcmp(k, "water") == 0) lua_pushnumber(L, eqp_result_water(r));
  else if (strcmp(k, "activity_model") == 0) lua_pushstring(L, eqp_result_activity_model(r));
  else if (strcmp(k, "residual") == 0) lua_pushnumber(L, eqp_result_residual(r));
  else if (strcmp(k, "iterations") == 0) lua_pushinteger(L, eqp_result_iterations(r));
  else if (strcmp(k, "headspace") == 0) push_headspace(L, r);
  else if (strcmp(k, "warnings") == 0) {
    size_t n = eqp_result_warning_count(r);
    lua_createtable(L, (int)n, 0);
    for (size_t i = 0; i < n; i++) {
      lua_pushstring(L, eqp_result_warning(r, i));
      lua_rawseti(L, -2, (lua_Integer)i + 1);
    }
  } else {
    lua_getfield(L, lua_upvalueindex(2), k);
  }
  return 1;
}

/* No __gc: a result is plain memory (eqpl_push_result). */
static const luaL_Reg result_meta[] = {
  {"__tostring", result_tostring},
  {NULL, NULL},
};

void eqpl_open_result(lua_State *L)
{
  eqpl_create_meta(L, lua_gettop(L), EQPL_RESULT, result_methods, result_index, result_meta);
}
