/* Lua binding of plots and sweeps: curve:plot, eq.plot, eq.distribution,
** eq.capacity, s:temperature_sweep, eq.pretty. Argument checking only:
** the figures and the numbers come from the C API. */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>


#define EQP_PLOT_MAX_Y 64

/* ------------------------------------------------------------ options */

/* Every string key of the table at t must be one of keys; an unknown one
** is refused with the nearest known key, worded as lua_options.c words it. */
static void check_keys(lua_State *L, int t, const char *const *keys, const char *what)
{
  size_t n = 0;
  while (keys[n]) n++;
  lua_pushnil(L);
  while (lua_next(L, t)) {
    lua_pop(L, 1);
    if (lua_type(L, -1) != LUA_TSTRING) continue;   /* list part */
    size_t len;
    const char *k = lua_tolstring(L, -1, &len);
    int ok = 0;
    for (size_t i = 0; i < n; i++) ok |= strcmp(k, keys[i]) == 0;
    if (ok) continue;
    const char *near = eqpl_nearest(k, len, keys, n);
    if (near) eqpl_input_error(L, "%s: unknown option '%s' (did you mean '%s'?)", what, k, near);
    char known[512] = "";
    for (size_t i = 0; i < n; i++)
      snprintf(known + strlen(known), sizeof known - strlen(known), "%s%s", i ? ", " : "",
               keys[i]);
    eqpl_input_error(L, "%s: unknown option '%s'; its options are %s", what, k, known);
  }
}

static double opt_number(lua_State *L, int t, const char *key, double dflt, const char *what)
{
  int ty = lua_getfield(L, t, key);
  double v = dflt;
  if (ty == LUA_TNUMBER) v = lua_tonumber(L, -1);
  else if (ty != LUA_TNIL) eqpl_input_error(L, "%s: '%s' is a number", what, key);
  lua_pop(L, 1);
  if (ty != LUA_TNIL && !isfinite(v)) eqpl_input_error(L, "%s: '%s' is not finite", what, key);
  return v;
}

/* The string at key, or NULL. The value stays on the stack: it anchors the
** string (an __index may have made it) until the binding returns. */
static const char *opt_string(lua_State *L, int t, const char *key, const char *what)
{
  int ty = lua_getfield(L, t, key);
  const char *s = NULL;
  if (ty == LUA_TSTRING) {
    size_t len;
    s = lua_tolstring(L, -1, &len);
    if (strlen(s) != len)
      eqpl_input_error(L, "%s: '%s' = '%s' is followed by a NUL character (\\0) and more text",
                       what, key, s);
  } else if (ty != LUA_TNIL) {
    eqpl_input_error(L, "%s: '%s' is a string", what, key);
  }
  return s;
}

/* A temperature as a number in C or a string with its unit, in K: finite
** and within 0..100 C, checked as every other call checks it (a NaN was
** taken as 25 C, -40 C was used as given). */
static double opt_temperature(lua_State *L, int t, const char *key, double dflt,
                              const char *what)
{
  double T = dflt;
  if (lua_getfield(L, t, key) != LUA_TNIL) {
    char w[96];
    snprintf(w, sizeof w, "%s: %s", what, key);
    T = eqpl_check_temperature(L, -1, w);
  }
  lua_pop(L, 1);
  return T;
}

/* A count of points: a whole number from lo to hi (2.5 points was 2). */
static size_t opt_points(lua_State *L, int t, double dflt, double lo, double hi,
                         const char *what)
{
  double v = dflt;
  if (lua_getfield(L, t, "points") != LUA_TNIL) {
    char w[96];
    snprintf(w, sizeof w, "%s: points", what);
    v = eqpl_check_number(L, -1, w, lo, hi, 0);
    if (v != floor(v)) eqpl_input_error(L, "%s must be a whole number; got %g", w, v);
  }
  lua_pop(L, 1);
  return (size_t)v;
}

/* A pair {lo, hi} of numbers at key; returns 0 if absent. */
static int opt_range(lua_State *L, int t, const char *key, double *lo, double *hi,
                     const char *what)
{
  int ty = lua_getfield(L, t, key);
  if (ty == LUA_TNIL) {
    lua_pop(L, 1);
    return 0;
  }
  if (ty != LUA_TTABLE || lua_rawlen(L, -1) != 2)
    eqpl_input_error(L, "%s: '%s' is a pair of numbers { low, high }", what, key);
  lua_rawgeti(L, -1, 1);
  lua_rawgeti(L, -2, 2);
  if (!lua_isnumber(L, -2) || !lua_isnumber(L, -1))
    eqpl_input_error(L, "%s: '%s' is a pair of numbers { low, high }", what, key);
  *lo = lua_tonumber(L, -2);
  *hi = lua_tonumber(L, -1);
  lua_pop(L, 3);
  if (!(*lo < *hi)) eqpl_input_error(L, "%s: '%s' = { %g, %g }: low first", what, key, *lo, *hi);
  return 1;
}

/* ------------------------------------------------------------- plots */

static eqp_plot *check_plot(lua_State *L, int idx)
{
  eqpl_plot *u = eqpl_check_handle(L, idx, EQPL_K_PLOT);
  if (!u->p) luaL_argerror(L, idx, "plot is closed");
  return u->p;
}

/* Own p in a new plot object on the stack. */
static void push_plot(lua_State *L, eqp_plot *p)
{
  eqpl_plot *u = eqpl_new_handle(L, sizeof *u, EQPL_K_PLOT);
  u->p = p;
}

static int host_path(lua_State *L)
{
  eqpl_host_path(L, 1, 'w');
  return 1;
}

/* Write (when file is given, and the host allows it) and push the plot
** object; frees p on failure. */
static int finish_plot(lua_State *L, eqp_plot *p, int rc, const char *file)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  if (rc < 0) {
    eqp_plot_free(p);
    return eqpl_fail(L, ctx, rc);
  }
  if (file && !eqp_plot_format_of(file)) {   /* before the sandbox speaks of output files */
    eqp_plot_free(p);
    return eqpl_input_error(L, "plot file '%s': a figure is written as .svg, .png or .pdf (the "
                            "name's ending chooses the format)", file);
  }
  if (file) {
    lua_pushcfunction(L, host_path);
    lua_pushstring(L, file);
    if (lua_pcall(L, 1, 1, 0) != LUA_OK) {
      eqp_plot_free(p);
      return lua_error(L);
    }
  }
  if (file && (rc = eqp_plot_write(p, lua_tostring(L, -1))) < 0) {
    eqp_plot_free(p);
    return eqpl_fail(L, ctx, rc);
  }
  push_plot(L, p);
  return 1;
}

static int plot_write(lua_State *L)
{
  eqpl_check_nargs(L, 2, "plot:write(file)");
  eqp_plot *p = check_plot(L, 1);
  const char *file = eqpl_check_name(L, 2, "plot:write: file");
  if (!eqp_plot_format_of(file))
    return eqpl_input_error(L, "plot file '%s': a figure is written as .svg, .png or .pdf (the "
                            "name's ending chooses the format)", file);
  int rc = eqp_plot_write(p, eqpl_host_path(L, 2, 'w'));
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_settop(L, 1);
  return 1;
}

static int plot_svg(lua_State *L)
{
  eqpl_check_nargs(L, 1, "plot:svg()");
  char *data;
  size_t len;
  int rc = eqp_plot_render(check_plot(L, 1), EQP_PLOT_SVG, &data, &len);
  if (rc < 0) return eqpl_fail(L, eqpl_ctx_of(L), rc);
  lua_pushlstring(L, data, len);
  eqp_free_buffer(data);
  return 1;
}

static int plot_index(lua_State *L)
{
  check_plot(L, 1);
  lua_getfield(L, lua_upvalueindex(2), luaL_checkstring(L, 2));
  return 1;
}

static int plot_close(lua_State *L)
{
  eqpl_plot *u = eqpl_check_handle(L, 1, EQPL_K_PLOT);
  eqp_plot_free(u->p);
  u->p = NULL;
  return 0;
}

static int plot_tostring(lua_State *L)
{
  lua_pushstring(L, "plot");
  return 1;
}

/* Numbers of the Lua list at idx (absolute) into an array owned by a new
** userdata pushed on the stack; NaN for nil or false (a gap). */
static double *number_list(lua_State *L, int idx, size_t *n, const char *what)
{
  if (lua_type(L, idx) != LUA_TTABLE) eqpl_input_error(L, "%s: a list of numbers", what);
  *n = lua_rawlen(L, idx);
  double *v = lua_newuserdatauv(L, sizeof(double) * (*n ? *n : 1), 0);
  for (size_t i = 0; i < *n; i++) {
    int ty = lua_rawgeti(L, idx, (lua_Integer)i + 1);
    if (ty == LUA_TNUMBER) {
      v[i] = lua_tonumber(L, -1);
      /* a NaN or an infinity is a computation gone wrong, not a gap: a
      ** gap is asked for with nil or false */
      if (!isfinite(v[i])) {
        char num[32];
        eqpl_input_error(L, "%s: item %d is %s, not a finite number (leave a gap with nil or "
                         "false)", what, (int)i + 1, eqpl_fmt(v[i], num, sizeof num));
      }
    } else if (ty == LUA_TNIL || (ty == LUA_TBOOLEAN && !lua_toboolean(L, -1))) {
      v[i] = NAN;
    } else {
      eqpl_input_error(L, "%s: item %d is not a number", what, (int)i + 1);
    }
    lua_pop(L, 1);
  }
  return v;
}

static int set_axis(lua_State *L, eqp_plot *p, int t, const char *key, int axis)
{
  static const char *const keys[] = {"label", "unit", "range", NULL};
  int top = lua_gettop(L);
  int ty = lua_getfield(L, t, key);
  int rc = EQP_OK;
  if (ty == LUA_TSTRING) {
    rc = eqp_plot_set_axis(p, axis, eqpl_check_name(L, -1, "eq.plot: axis label"), NULL, NAN,
                           NAN);
  } else if (ty == LUA_TTABLE) {
    int a = lua_gettop(L);
    check_keys(L, a, keys, axis ? "eq.plot y" : "eq.plot x");
    double lo = NAN, hi = NAN;
    opt_range(L, a, "range", &lo, &hi, "eq.plot axis");
    rc = eqp_plot_set_axis(p, axis, opt_string(L, a, "label", "eq.plot axis"),
                           opt_string(L, a, "unit", "eq.plot axis"), lo, hi);
  } else if (ty != LUA_TNIL) {
    eqpl_input_error(L, "eq.plot: '%s' is a label or { label =, unit =, range = }", key);
  }
  lua_settop(L, top);
  return rc;
}

static int add_lines(lua_State *L, eqp_plot *p, int t)
{
  static const char *const keys[] = {"x", "y", "label", "points", NULL};
  int rc = EQP_OK;
  if (lua_getfield(L, t, "lines") != LUA_TTABLE) {
    lua_pop(L, 1);
    return eqpl_input_error(L, "eq.plot: 'lines' is a list of { x = {...}, y = {...}, label = }");
  }
  int lines = lua_gettop(L);
  for (lua_Integer i = 1; rc == EQP_OK && i <= (lua_Integer)lua_rawlen(L, lines); i++) {
    int base = lua_gettop(L);
    if (lua_rawgeti(L, lines, i) != LUA_TTABLE)
      return eqpl_input_error(L, "eq.plot: line %d is a table", (int)i);
    int l = lua_gettop(L);
    check_keys(L, l, keys, "eq.plot line");
    size_t nx, ny;
    lua_getfield(L, l, "x");
    double *x = number_list(L, lua_gettop(L), &nx, "eq.plot line x");
    lua_getfield(L, l, "y");
    double *y = number_list(L, lua_gettop(L), &ny, "eq.plot line y");
    if (nx != ny) return eqpl_input_error(L, "eq.plot: line %d has %d x and %d y values", (int)i,
                                          (int)nx, (int)ny);
    lua_getfield(L, l, "points");
    int dots = lua_toboolean(L, -1);
    lua_pop(L, 1);
    const char *label = opt_string(L, l, "label", "eq.plot line");
    rc = dots ? eqp_plot_add_points(p, label, nx, x, y) : eqp_plot_add_line(p, label, nx, x, y);
    lua_settop(L, base);
  }
  lua_pop(L, 1);
  return rc;
}

/* markers = { { x =, y =, label = } }, bands = { { from, to, label = } },
** hlines = { { y =, label = } } */
static int add_marks(lua_State *L, eqp_plot *p, int t)
{
  static const char *const mkeys[] = {"x", "y", "label", NULL};
  static const char *const hkeys[] = {"y", "label", NULL};
  static const char *const bkeys[] = {"label", NULL};
  static const char *const kinds[] = {"markers", "bands", "hlines"};
  int rc = EQP_OK;
  for (int kind = 0; kind < 3 && rc == EQP_OK; kind++) {
    int ty = lua_getfield(L, t, kinds[kind]);
    if (ty != LUA_TNIL && ty != LUA_TTABLE)
      return eqpl_input_error(L, "eq.plot: '%s' is a list of tables", kinds[kind]);
    int list = lua_gettop(L);
    for (lua_Integer i = 1; ty == LUA_TTABLE && rc == EQP_OK &&
                            i <= (lua_Integer)lua_rawlen(L, list); i++) {
      if (lua_rawgeti(L, list, i) != LUA_TTABLE)
        return eqpl_input_error(L, "eq.plot: %s item %d is a table", kinds[kind], (int)i);
      int m = lua_gettop(L);
      check_keys(L, m, kind == 0 ? mkeys : kind == 1 ? bkeys : hkeys, "eq.plot mark");
      const char *label = opt_string(L, m, "label", "eq.plot mark");
      if (kind == 0) {
        rc = eqp_plot_add_marker(p, opt_number(L, m, "x", NAN, "marker"),
                                 opt_number(L, m, "y", NAN, "marker"), label);
      } else if (kind == 2) {
        rc = eqp_plot_add_hline(p, opt_number(L, m, "y", NAN, "hline"), label);
      } else {
        lua_rawgeti(L, m, 1);
        lua_rawgeti(L, m, 2);
        if (lua_type(L, -2) != LUA_TNUMBER || lua_type(L, -1) != LUA_TNUMBER)
          return eqpl_input_error(L, "eq.plot: a band is { from, to, label = }");
        double from = eqpl_check_number(L, -2, "eq.plot: a band's from", -HUGE_VAL, HUGE_VAL, 0);
        double to = eqpl_check_number(L, -1, "eq.plot: a band's to", -HUGE_VAL, HUGE_VAL, 0);
        rc = eqp_plot_add_band(p, from, to, label);
      }
      lua_settop(L, list);
    }
    lua_pop(L, 1);
  }
  return rc;
}

/* eq.plot{ file =, title =, x =, y =, lines = {...}, markers =, bands =,
**          hlines =, width =, height = } -> plot */
static int eq_plot(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.plot{ options }");
  static const char *const keys[] = {"file", "title", "x", "y", "lines", "markers", "bands",
                                     "hlines", "width", "height", NULL};
  eqp_ctx *ctx = eqpl_ctx_of(L);
  luaL_checktype(L, 1, LUA_TTABLE);
  check_keys(L, 1, keys, "eq.plot");
  if (eqp_ctx_load_default_library(ctx) < 0) return eqpl_fail(L, ctx, eqp_ctx_errcode(ctx));
  const char *file = opt_string(L, 1, "file", "eq.plot");
  eqp_plot *p;
  int rc = eqp_plot_new(ctx, &p);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  /* p is not owned by Lua yet: park it so that an error frees it */
  eqpl_plot *hold = eqpl_new_handle(L, sizeof *hold, EQPL_K_PLOT);
  hold->p = p;
  rc = eqp_plot_set_title(p, opt_string(L, 1, "title", "eq.plot"));
  if (rc == EQP_OK) rc = set_axis(L, p, 1, "x", 0);
  if (rc == EQP_OK) rc = set_axis(L, p, 1, "y", 1);
  if (rc == EQP_OK) rc = add_lines(L, p, 1);
  if (rc == EQP_OK) rc = add_marks(L, p, 1);
  double w = opt_number(L, 1, "width", 720, "eq.plot"), h = opt_number(L, 1, "height", 480,
                                                                       "eq.plot");
  if (!(w >= 200 && w <= 4000 && h >= 150 && h <= 4000))   /* before the cast to int */
    return eqpl_input_error(L, "eq.plot: width %g and height %g: 200 to 4000 by 150 to 4000 "
                            "points", w, h);
  if (rc == EQP_OK) rc = eqp_plot_set_size(p, (int)w, (int)h);
  hold->p = NULL;
  return finish_plot(L, p, rc, file);
}

/* ------------------------------------------------- curves and sweeps */

/* Remember how a curve was made, for curve:plot. The spec table is at -1. */
static void set_kind(lua_State *L, int curve)
{
  lua_getfield(L, LUA_REGISTRYINDEX, EQPL_CURVEKIND);
  lua_pushvalue(L, curve);
  lua_pushvalue(L, -3);
  lua_rawset(L, -3);
  lua_pop(L, 2);
}

/* eq.distribution{ system =, ionic_strength =, temperature =, activity =,
**                  medium =, pH = { lo, hi }, points = } -> curve */
static int eq_distribution(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.distribution{ options }");
  static const char *const keys[] = {"system", "ionic_strength", "temperature", "activity",
                                     "medium", "pH", "points", NULL};
  eqp_ctx *ctx = eqpl_ctx_of(L);
  luaL_checktype(L, 1, LUA_TTABLE);
  check_keys(L, 1, keys, "eq.distribution");
  eqp_distribution_spec d = EQP_DISTRIBUTION_SPEC_INIT;
  d.system = opt_string(L, 1, "system", "eq.distribution");
  if (!d.system) return eqpl_input_error(L, "eq.distribution: 'system' names a species, reagent "
                                         "or buffer system ('phosphate', 'HPO4^2-')");
  int ty = lua_getfield(L, 1, "ionic_strength");
  if (ty == LUA_TNUMBER) {
    d.ionic_strength = eqpl_check_number(L, -1, "eq.distribution: ionic_strength (mol/kg)", 0,
                                         10, 0);
  } else if (ty == LUA_TSTRING) {
    d.ionic_strength = eqpl_check_quantity(L, -1, "eq.distribution: ionic_strength",
                                           EQP_Q_MOLALITY, 0, 10, 0, NULL);
  } else if (ty != LUA_TNIL) {
    return eqpl_input_error(L, "eq.distribution: 'ionic_strength' in mol/kg, a number or "
                            "'0.1 mol/kg'");
  }
  lua_pop(L, 1);
  d.T = opt_temperature(L, 1, "temperature", 298.15, "eq.distribution");
  d.activity = opt_string(L, 1, "activity", "eq.distribution");
  d.medium = opt_string(L, 1, "medium", "eq.distribution");
  opt_range(L, 1, "pH", &d.pH_lo, &d.pH_hi, "eq.distribution");
  d.points = opt_points(L, 1, 281, 2, 100000, "eq.distribution");
  eqp_curve *c;
  int rc = eqp_distribution(ctx, &d, &c);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  eqpl_push_curve(L, c);
  int curve = lua_gettop(L);
  lua_createtable(L, 0, 6);
  lua_pushstring(L, "distribution"); lua_setfield(L, -2, "kind");
  lua_pushstring(L, d.system); lua_setfield(L, -2, "system");
  lua_pushnumber(L, d.ionic_strength); lua_setfield(L, -2, "ionic_strength");
  lua_pushnumber(L, d.T); lua_setfield(L, -2, "T");
  if (d.activity) { lua_pushstring(L, d.activity); lua_setfield(L, -2, "activity"); }
  set_kind(L, curve);
  return 1;
}

/* eq.capacity{ buffers = {...}, total = "50 mM", temperature =, activity =,
**              pH = { lo, hi }, points =, window = { lo, hi } } -> curve */
static int eq_capacity(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.capacity{ options }");
  static const char *const keys[] = {"buffers", "total", "volume", "temperature", "activity",
                                     "pH", "points", "window", NULL};
  eqp_ctx *ctx = eqpl_ctx_of(L);
  luaL_checktype(L, 1, LUA_TTABLE);
  check_keys(L, 1, keys, "eq.capacity");
  eqp_capacity_spec s = EQP_CAPACITY_SPEC_INIT;
  const char *names[64];
  int ty = lua_getfield(L, 1, "buffers");
  if (ty == LUA_TTABLE) {
    s.nbuffers = lua_rawlen(L, -1);
    if (s.nbuffers == 0 || s.nbuffers > 64)
      return eqpl_input_error(L, "eq.capacity: 'buffers' lists 1 to 64 buffer systems");
    for (size_t i = 0; i < s.nbuffers; i++) {
      lua_rawgeti(L, -1, (lua_Integer)i + 1);
      if (lua_type(L, -1) != LUA_TSTRING)
        return eqpl_input_error(L, "eq.capacity: buffer %d is a name", (int)i + 1);
      names[i] = eqpl_check_name(L, -1, "eq.capacity: a buffer's name");
      lua_pop(L, 1);              /* kept alive by the list, which stays on the stack */
    }
    s.buffers = names;
  } else if (ty != LUA_TNIL) {
    return eqpl_input_error(L, "eq.capacity: 'buffers' is a list of buffer-system names");
  }
  if (lua_getfield(L, 1, "total") == LUA_TNIL)
    return eqpl_input_error(L, "eq.capacity: 'total' is the buffer concentration ('50 mM')");
  s.total = eqpl_check_quantity(L, -1, "eq.capacity: total", EQP_Q_MOLARITY, 0, 5, EQPL_ABOVE,
                                NULL);                     /* as eq.recipe's total */
  if (lua_getfield(L, 1, "volume") != LUA_TNIL)
    s.volume = eqpl_check_quantity(L, -1, "eq.capacity: volume", EQP_Q_VOLUME, 0,
                                   EQPL_MAX_WATER, EQPL_ABOVE, NULL);
  s.T = opt_temperature(L, 1, "temperature", 298.15, "eq.capacity");
  s.activity = opt_string(L, 1, "activity", "eq.capacity");
  s.pH_lo = 3;
  s.pH_hi = 11;
  opt_range(L, 1, "pH", &s.pH_lo, &s.pH_hi, "eq.capacity");
  opt_range(L, 1, "window", &s.window_lo, &s.window_hi, "eq.capacity");
  s.points = opt_points(L, 1, 61, 2, 2001, "eq.capacity");
  eqp_curve *c;
  int rc = eqp_capacity_sweep(ctx, &s, &c);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  eqpl_push_curve(L, c);
  int curve = lua_gettop(L);
  lua_createtable(L, 0, 6);
  lua_pushstring(L, "capacity"); lua_setfield(L, -2, "kind");
  lua_pushnumber(L, s.total); lua_setfield(L, -2, "total");
  lua_pushnumber(L, s.T); lua_setfield(L, -2, "T");
  lua_pushnumber(L, s.window_lo); lua_setfield(L, -2, "window_lo");
  lua_pushnumber(L, s.window_hi); lua_setfield(L, -2, "window_hi");
  if (s.activity) { lua_pushstring(L, s.activity); lua_setfield(L, -2, "activity"); }
  set_kind(L, curve);
  return 1;
}

/* s:temperature_sweep{ from = 4, to = 40, points = 37 } -> curve */
static int sol_temperature_sweep(lua_State *L)
{
  eqpl_check_nargs(L, 2, "s:temperature_sweep{ from =, to =, points = }");
  static const char *const keys[] = {"from", "to", "points", NULL};
  eqpl_solution *u = eqpl_check_solution(L, 1);
  eqp_ctx *ctx = eqpl_ctx_of(L);
  luaL_checktype(L, 2, LUA_TTABLE);
  check_keys(L, 2, keys, "temperature_sweep");
  double T0 = opt_temperature(L, 2, "from", NAN, "temperature_sweep"),
         T1 = opt_temperature(L, 2, "to", NAN, "temperature_sweep");
  if (isnan(T0) || isnan(T1))
    return eqpl_input_error(L, "temperature_sweep: 'from' and 'to' are temperatures in C");
  if (!(T0 < T1))
    return eqpl_input_error(L, "temperature_sweep: from = %.6g C must be below to = %.6g C",
                            T0 - 273.15, T1 - 273.15);
  double np = 0;                                        /* 0: one per degree */
  lua_getfield(L, 2, "points");
  int given = !lua_isnil(L, -1);
  lua_pop(L, 1);
  if (given) np = (double)opt_points(L, 2, 0, 2, 10001, "temperature_sweep");
  eqp_curve *c;
  int rc = eqp_solution_temperature_sweep(u->s, T0, T1, (size_t)np, &c);
  if (rc < 0) return eqpl_fail(L, ctx, rc);
  eqpl_push_curve(L, c);
  int curve = lua_gettop(L);
  lua_createtable(L, 0, 1);
  lua_pushstring(L, "temperature");
  lua_setfield(L, -2, "kind");
  set_kind(L, curve);
  return 1;
}

static double kind_number(lua_State *L, int spec, const char *key)
{
  lua_getfield(L, spec, key);
  double v = lua_isnumber(L, -1) ? lua_tonumber(L, -1) : NAN;
  lua_pop(L, 1);
  return v;
}

/* The figure a curve calls for: by how it was made, or by its columns. */
static int curve_figure(lua_State *L, int curve, eqp_curve *c, int opts, eqp_plot **p)
{
  const char *title = opts ? opt_string(L, opts, "title", "curve:plot") : NULL;
  const char *xcol = opts ? opt_string(L, opts, "x", "curve:plot") : NULL;
  lua_getfield(L, LUA_REGISTRYINDEX, EQPL_CURVEKIND);
  lua_pushvalue(L, curve);
  lua_rawget(L, -2);
  int spec = lua_gettop(L);
  const char *kind = NULL;
  if (lua_istable(L, spec)) {
    lua_getfield(L, spec, "kind");
    kind = lua_tostring(L, -1);   /* kept alive by the spec table */
    lua_pop(L, 1);
  }
  int has_y = 0;
  if (opts) {
    has_y = lua_getfield(L, opts, "y") != LUA_TNIL;
    lua_pop(L, 1);
  }
  if (xcol || has_y) kind = "columns";
  if (kind && strcmp(kind, "distribution") == 0) {
    eqp_distribution_spec d = EQP_DISTRIBUTION_SPEC_INIT;
    lua_getfield(L, spec, "system");
    d.system = lua_tostring(L, -1);
    lua_getfield(L, spec, "activity");
    d.activity = lua_tostring(L, -1);
    d.ionic_strength = kind_number(L, spec, "ionic_strength");
    d.T = kind_number(L, spec, "T");
    return eqp_plot_distribution(c, &d, p);
  }
  if (kind && strcmp(kind, "capacity") == 0) {
    eqp_capacity_spec s = EQP_CAPACITY_SPEC_INIT;
    s.total = kind_number(L, spec, "total");
    s.T = kind_number(L, spec, "T");
    s.window_lo = kind_number(L, spec, "window_lo");
    s.window_hi = kind_number(L, spec, "window_hi");
    lua_getfield(L, spec, "activity");
    s.activity = lua_tostring(L, -1);
    return eqp_plot_capacity(c, &s, p);
  }
  if (kind && strcmp(kind, "temperature") == 0) {
    const char *y[] = {"pH"};
    return eqp_plot_columns(c, "temperature", y, 1, title ? title : "pH against temperature",
                            p);
  }
  if (!kind && eqp_curve_cols(c) >= 4 && strcmp(eqp_curve_col_name(c, 0), "amount") == 0)
    return eqp_plot_titration(c, title, p);
  /* any other table: columns against x (default: the first) */
  const char *ys[EQP_PLOT_MAX_Y];
  size_t ny = 0;
  if (has_y) {
    lua_getfield(L, opts, "y");
    if (lua_type(L, -1) == LUA_TSTRING) {
      ys[ny++] = eqpl_check_name(L, -1, "curve:plot: y");
    } else if (lua_type(L, -1) == LUA_TTABLE) {
      for (lua_Integer i = 1; i <= (lua_Integer)lua_rawlen(L, -1) && ny < EQP_PLOT_MAX_Y; i++) {
        lua_rawgeti(L, -1, i);
        if (lua_type(L, -1) != LUA_TSTRING) eqpl_input_error(L, "curve:plot: 'y' lists columns");
        ys[ny++] = eqpl_check_name(L, -1, "curve:plot: y");
        lua_pop(L, 1);
      }
    } else {
      eqpl_input_error(L, "curve:plot: 'y' is a column name or a list of them");
    }
  }
  return eqp_plot_columns(c, xcol ? xcol : eqp_curve_col_name(c, 0), ny ? ys : NULL, ny, title, p);
}

/* curve:plot("file.svg" [, { title =, x =, y = }]) or curve:plot{ file =, ... } */
static int curve_plot(lua_State *L)
{
  eqpl_check_nargs(L, 3, "curve:plot(file [, options])");
  static const char *const keys[] = {"file", "title", "x", "y", NULL};
  eqpl_curve *u = eqpl_check_handle(L, 1, EQPL_K_CURVE);
  if (!u->c) return luaL_argerror(L, 1, "curve is closed");
  const char *file = NULL;
  int opts = 0;
  if (lua_type(L, 2) == LUA_TSTRING) {
    file = eqpl_check_name(L, 2, "curve:plot: file");
    if (lua_istable(L, 3)) opts = 3;
    else if (!lua_isnoneornil(L, 3)) return eqpl_input_error(L, "curve:plot: options are a table");
  } else if (lua_istable(L, 2)) {
    opts = 2;
  } else if (!lua_isnoneornil(L, 2)) {
    return eqpl_input_error(L, "curve:plot: a file name ('curve.svg') or an options table");
  }
  if (opts) {
    check_keys(L, opts, keys, "curve:plot");
    const char *f = opt_string(L, opts, "file", "curve:plot");
    if (f && file) return eqpl_input_error(L, "curve:plot: the file is given twice");
    if (f) file = f;
  }
  eqp_plot *p = NULL;
  int rc = curve_figure(L, 1, u->c, opts, &p);
  return finish_plot(L, p, rc, file);
}

int eqpl_curve_plot(lua_State *L) { return curve_plot(L); }

/* eq.pretty("HPO4^2-") -> "HPO₄²⁻" */
static int eq_pretty(lua_State *L)
{
  eqpl_check_nargs(L, 1, "eq.pretty(name)");
  char buf[512];
  const char *name = eqpl_check_name(L, 1, "eq.pretty: name");
  if (eqp_name_display(name, buf, sizeof buf) < 0)
    return eqpl_input_error(L, "eq.pretty: name too long");
  lua_pushstring(L, buf);
  return 1;
}

static const luaL_Reg plot_funcs[] = {
  {"plot", eq_plot},
  {"distribution", eq_distribution},
  {"capacity", eq_capacity},
  {"pretty", eq_pretty},
  {NULL, NULL},
};

static const luaL_Reg plot_methods[] = {
  {"write", plot_write},
  {"svg", plot_svg},
  {NULL, NULL},
};

static const luaL_Reg plot_meta[] = {
  {"__gc", plot_close},
  {"__close", plot_close},
  {"__tostring", plot_tostring},
  {NULL, NULL},
};

static const luaL_Reg sweep_methods[] = {
  {"temperature_sweep", sol_temperature_sweep},
  {NULL, NULL},
};

/* Adds the plot functions to the module table at the top; ctx is the
** context userdata's index. */
void eqpl_open_plot(lua_State *L, int ctx)
{
  eqpl_create_meta(L, ctx, EQPL_PLOT, plot_methods, plot_index, plot_meta);
  lua_newtable(L);                    /* curve -> how it was made; weak keys */
  lua_createtable(L, 0, 1);
  lua_pushstring(L, "k");
  lua_setfield(L, -2, "__mode");
  lua_setmetatable(L, -2);
  lua_setfield(L, LUA_REGISTRYINDEX, EQPL_CURVEKIND);
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, plot_funcs, 1);
  luaL_getmetatable(L, EQPL_SOLUTION);
  lua_getfield(L, -1, "__index");
  lua_pushvalue(L, ctx);
  luaL_setfuncs(L, sweep_methods, 1);
  lua_pop(L, 2);
}
