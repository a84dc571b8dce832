/* Lua binding of eqp_curve: rows by index, columns, equivalence points,
** CSV and JSON. */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static eqp_curve *check_curve(lua_State *L, int idx)
{
  eqpl_curve *u = eqpl_check_handle(L, idx, EQPL_K_CURVE);
  if (!u->c) luaL_argerror(L, idx, "curve is closed");
  return u->c;
}

void eqpl_push_curve(lua_State *L, eqp_curve *c)
{
  eqpl_curve *u = eqpl_new_handle(L, sizeof *u, EQPL_K_CURVE);
  u->c = c;
}

static void push_row(lua_State *L, const eqp_curve *c, size_t i)
{
  lua_createtable(L, 0, (int)eqp_curve_cols(c));
  for (size_t j = 0; j < eqp_curve_cols(c); j++) {
    double v = eqp_curve_value(c, i, j);
    if (isnan(v)) continue;
    lua_pushnumber(L, v);
    lua_setfield(L, -2, eqp_curve_col_name(c, j));
  }
}

static int curve_len(lua_State *L)
{
  lua_pushinteger(L, (lua_Integer)eqp_curve_rows(check_curve(L, 1)));
  return 1;
}

static int curve_csv(lua_State *L)
{
  eqpl_check_nargs(L, 1, "curve:csv()");
  eqp_curve *c = check_curve(L, 1);
  char *buf = NULL;
  size_t len = 0;
  FILE *f = open_memstream(&buf, &len);
  if (!f) return luaL_error(L, "out of memory");
  eqp_curve_write_csv(c, f);
  fclose(f);
  lua_pushlstring(L, buf, len);
  free(buf);
  return 1;
}

static int curve_write_csv(lua_State *L)
{
  eqpl_check_nargs(L, 2, "curve:write_csv(path)");
  eqp_curve *c = check_curve(L, 1);
  eqpl_check_name(L, 2, "write_csv: path");
  int rc = eqp_curve_save_csv(c, eqpl_host_path(L, 2, 'w'));
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_settop(L, 1);
  return 1;
}

static int curve_json(lua_State *L)
{
  eqpl_check_nargs(L, 1, "curve:json()");
  char *text = eqp_curve_to_json(check_curve(L, 1));
  if (!text) return luaL_error(L, "out of memory");
  lua_pushstring(L, text);
  eqp_free_string(text);
  return 1;
}

static int curve_write_json(lua_State *L)
{
  eqpl_check_nargs(L, 2, "curve:write_json(path)");
  eqp_curve *c = check_curve(L, 1);
  eqpl_check_name(L, 2, "write_json: path");
  int rc = eqp_curve_save_json(c, eqpl_host_path(L, 2, 'w'));
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_settop(L, 1);
  return 1;
}

static int curve_tostring(lua_State *L)
{
  eqp_curve *c = check_curve(L, 1);
  char *buf = NULL;
  size_t len = 0;
  FILE *f = open_memstream(&buf, &len);
  if (!f) return luaL_error(L, "out of memory");
  eqp_curve_write_text(c, f);
  fclose(f);
  lua_pushlstring(L, buf, len);
  free(buf);
  return 1;
}

static const luaL_Reg curve_methods[] = {
  {"csv", curve_csv},
  {"write_csv", curve_write_csv},
  {"json", curve_json},
  {"write_json", curve_write_json},
  {"plot", eqpl_curve_plot},
  {NULL, NULL},
};

static int curve_index(lua_State *L)
{
  eqp_curve *c = check_curve(L, 1);
  if (lua_type(L, 2) == LUA_TNUMBER) {
    lua_Integer i = lua_tointeger(L, 2);
    if (i < 1 || (size_t)i > eqp_curve_rows(c)) return 0;
    push_row(L, c, (size_t)i - 1);
    return 1;
  }
  size_t len;
  const char *k = luaL_checklstring(L, 2, &len);
  if (strlen(k) != len) return 0;    /* no field has a NUL in its name */
  if (strcmp(k, "equivalence_points") == 0) {
    size_t n = eqp_curve_equivalence_count(c);
    lua_createtable(L, (int)n, 0);
    for (size_t e = 0; e < n; e++) {
      double a, v, pH;
      eqp_curve_equivalence(c, e, &a, &v, &pH);
      lua_createtable(L, 0, 4);
      if (!isnan(a)) { lua_pushnumber(L, a); lua_setfield(L, -2, "amount"); }
      if (!isnan(v)) { lua_pushnumber(L, v); lua_setfield(L, -2, "volume"); }
      lua_pushnumber(L, pH);
      lua_setfield(L, -2, "pH");
      lua_pushnumber(L, eqp_curve_equivalence_sharpness(c, e));
      lua_setfield(L, -2, "sharpness");
      lua_rawseti(L, -2, (lua_Integer)e + 1);
    }
    return 1;
  }
  if (strcmp(k, "columns") == 0) {
    lua_createtable(L, (int)eqp_curve_cols(c), 0);
    for (size_t j = 0; j < eqp_curve_cols(c); j++) {
      lua_pushstring(L, eqp_curve_col_name(c, j));
      lua_rawseti(L, -2, (lua_Integer)j + 1);
    }
    return 1;
  }
  lua_getfield(L, lua_upvalueindex(2), k);
  return 1;
}

static int curve_close(lua_State *L)
{
  eqpl_curve *u = eqpl_check_handle(L, 1, EQPL_K_CURVE);
  eqp_curve_free(u->c);
  u->c = NULL;
  return 0;
}

static const luaL_Reg curve_meta[] = {
  {"__len", curve_len},
  {"__gc", curve_close},
  {"__tostring", curve_tostring},
  {NULL, NULL},
};

void eqpl_open_curve(lua_State *L)
{
  eqpl_create_meta(L, lua_gettop(L), EQPL_CURVE, curve_methods, curve_index, curve_meta);
}
