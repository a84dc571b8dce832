/* Checks of the arguments and options tables of every binding: names,
** types, units and ranges, with the nearest known name for an unknown one.
** Every value a binding hands to the engine stays on the Lua stack (or in a
** table anchored there) until the binding returns, so no string is used
** after the collector could have freed it. */
/* SPDX-License-Identifier: MIT */
#include "lua_impl.h"
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define NAME_MAX_LEN 64   /* longer keys are never a near miss */

/* Optimal string alignment distance (Levenshtein's edit distance with
** Damerau's transposition of neighbours), case-insensitive; each case
** difference adds one, so 'ph' is nearer 'pH' than anything else. */
static size_t distance(const char *a, size_t la, const char *b, size_t lb)
{
  if (la > NAME_MAX_LEN || lb > NAME_MAX_LEN) return (size_t)-1;
  unsigned char d[NAME_MAX_LEN + 1][NAME_MAX_LEN + 1];   /* entries <= 64 */
  for (size_t i = 0; i <= la; i++) d[i][0] = (unsigned char)i;
  for (size_t j = 0; j <= lb; j++) d[0][j] = (unsigned char)j;
  for (size_t i = 1; i <= la; i++)
    for (size_t j = 1; j <= lb; j++) {
      int ca = tolower((unsigned char)a[i - 1]), cb = tolower((unsigned char)b[j - 1]);
      unsigned best = d[i - 1][j - 1] + (ca != cb);
      if (d[i - 1][j] + 1u < best) best = d[i - 1][j] + 1u;
      if (d[i][j - 1] + 1u < best) best = d[i][j - 1] + 1u;
      if (i > 1 && j > 1 && ca == tolower((unsigned char)b[j - 2]) &&
          tolower((unsigned char)a[i - 2]) == cb && d[i - 2][j - 2] + 1u < best)
        best = d[i - 2][j - 2] + 1u;
      d[i][j] = (unsigned char)best;
    }
  return d[la][lb];
}

static size_t case_misses(const char *a, const char *b, size_t n)
{
  size_t m = 0;
  for (size_t i = 0; i < n; i++) m += a[i] != b[i];
  return m;
}

const char *eqpl_nearest(const char *key, size_t len, const char *const *names, size_t n)
{
  const char *best = NULL;
  size_t bd = (size_t)-1;
  for (size_t i = 0; i < n; i++) {
    size_t nl = strlen(names[i]), d = distance(key, len, names[i], nl);
    if (d == 0 && nl == len) d = case_misses(key, names[i], len) ? 1 : 0;
    if (d < bd) { bd = d; best = names[i]; }
  }
  /* a near miss: one edit in a short name, two in a middling, three in a long one */
  size_t allowed = len <= 3 ? 1 : len <= 8 ? 2 : 3;
  return bd <= allowed ? best : NULL;
}

/* -------------------------------------------------------------- values */

/* A number as the script would read it: 0.2, 1e+06, nan (never -nan). */
const char *eqpl_fmt(double v, char *buf, size_t len)
{
  if (isnan(v)) snprintf(buf, len, "nan");
  else snprintf(buf, len, "%.14g", v);
  return buf;
}

/* How a value reads in a message: the number 3, the string 'x', a table. */
const char *eqpl_describe(lua_State *L, int idx, char *buf, size_t len)
{
  switch (lua_type(L, idx)) {
  case LUA_TNONE:
  case LUA_TNIL: return "nothing";
  case LUA_TBOOLEAN: return lua_toboolean(L, idx) ? "true" : "false";
  case LUA_TNUMBER:
    if (lua_isinteger(L, idx))
      snprintf(buf, len, "the number %lld", (long long)lua_tointeger(L, idx));
    else {
      char num[32];
      snprintf(buf, len, "the number %s", eqpl_fmt(lua_tonumber(L, idx), num, sizeof num));
    }
    return buf;
  case LUA_TSTRING: {
    size_t n;
    const char *s = lua_tolstring(L, idx, &n);   /* already a string: no conversion */
    snprintf(buf, len, "the string '%.48s%s'", s, n > 48 || strlen(s) != n ? "..." : "");
    return buf;
  }
  case LUA_TTABLE: return "a table";
  case LUA_TUSERDATA:
    if (eqpl_test_handle(L, idx, EQPL_K_SOLUTION)) return "a solution";
    if (eqpl_test_handle(L, idx, EQPL_K_RESULT)) return "a result";
    if (eqpl_test_handle(L, idx, EQPL_K_CURVE)) return "a curve";
    return "a userdata";
  default:
    snprintf(buf, len, "a %s", luaL_typename(L, idx));
    return buf;
  }
}

/* "1st", "2nd", "3rd", "4th", ... */
static const char *ordinal(int n, char *buf, size_t len)
{
  const char *suf = (n % 100 >= 11 && n % 100 <= 13) ? "th"
                  : n % 10 == 1 ? "st" : n % 10 == 2 ? "nd" : n % 10 == 3 ? "rd" : "th";
  snprintf(buf, len, "%d%s", n, suf);
  return buf;
}

void eqpl_nargs_error(lua_State *L, int max, const char *signature)
{
  int n = lua_gettop(L);
  /* a method's own object (s:, r:, curve:, plot:) is not counted for the user */
  int self = strchr(signature, ':') && strchr(signature, ':') < strchr(signature, '(') ? 1 : 0;
  int takes = max - self;
  char buf[96], nth[16], count[32];
  if (takes) snprintf(count, sizeof count, "%d argument%s", takes, takes == 1 ? "" : "s");
  else snprintf(count, sizeof count, "no arguments");
  eqpl_input_error(L, "%s takes %s; got %d (the %s is %s)", signature, count, n - self,
                   ordinal(max + 1 - self, nth, sizeof nth),
                   lua_isnil(L, max + 1) ? "nil" : eqpl_describe(L, max + 1, buf, sizeof buf));
}

static int wrong_type(lua_State *L, int idx, const char *what, const char *wanted)
{
  char buf[96];
  return eqpl_input_error(L, "%s must be %s; got %s", what, wanted,
                          eqpl_describe(L, idx, buf, sizeof buf));
}

const char *eqpl_check_name(lua_State *L, int idx, const char *what)
{
  if (lua_type(L, idx) != LUA_TSTRING) wrong_type(L, idx, what, "a string");
  size_t len;
  const char *s = lua_tolstring(L, idx, &len);
  if (len == 0) eqpl_input_error(L, "%s is an empty string", what);
  if (strlen(s) != len)
    eqpl_input_error(L, "%s: '%s' is followed by a NUL character (\\0) and more text", what, s);
  return s;
}

/* "between 0 and 14", "greater than 0", "greater than 0 and at most 2" */
static void range_text(char *buf, size_t len, double min, double max, unsigned flags,
                       const char *unit)
{
  const char *sp = *unit ? " " : "";
  if (isinf(max))
    snprintf(buf, len, "%s %g%s%s", flags & EQPL_ABOVE ? "greater than" : "at least", min, sp,
             unit);
  else if (flags & EQPL_ABOVE)
    snprintf(buf, len, "greater than %g%s%s and at most %g%s%s", min, sp, unit, max, sp, unit);
  else
    snprintf(buf, len, "between %g and %g%s%s", min, max, sp, unit);
}

static int in_range(double v, double min, double max, unsigned flags)
{
  return (flags & EQPL_ABOVE ? v > min : v >= min) && v <= max;
}

double eqpl_check_number(lua_State *L, int idx, const char *what, double min, double max,
                         unsigned flags)
{
  if (lua_type(L, idx) != LUA_TNUMBER) wrong_type(L, idx, what, "a number");
  double v = lua_tonumber(L, idx);
  char got[32];
  if (!isfinite(v))
    eqpl_input_error(L, "%s must be a finite number; got %s", what, eqpl_fmt(v, got, sizeof got));
  if (!in_range(v, min, max, flags)) {
    char r[128];
    range_text(r, sizeof r, min, max, flags, "");
    eqpl_input_error(L, "%s must be %s; got %s", what, r, eqpl_fmt(v, got, sizeof got));
  }
  return v;
}

int eqpl_check_boolean(lua_State *L, int idx, const char *what)
{
  if (!lua_isboolean(L, idx)) wrong_type(L, idx, what, "true or false");
  return lua_toboolean(L, idx);
}

static const struct { unsigned kind; const char *unit, *example; } kinds[] = {
  {EQP_Q_AMOUNT, "mol", "'10 mmol'"},       {EQP_Q_MASS, "kg", "'1.5 g'"},
  {EQP_Q_MOLARITY, "M", "'50 mM'"},         {EQP_Q_MOLALITY, "mol/kg", "'0.15 mol/kg'"},
  {EQP_Q_VOLUME, "L", "'500 mL'"},          {EQP_Q_TEMPERATURE, "K", "'310.15 K'"},
  {EQP_Q_PRESSURE, "atm", "'427 uatm'"},
};

static const char *example_of(unsigned mask)
{
  for (size_t i = 0; i < sizeof kinds / sizeof kinds[0]; i++)
    if (mask & kinds[i].kind) return kinds[i].example;
  return "'1 mol'";
}

static const char *unit_of(unsigned kind)
{
  for (size_t i = 0; i < sizeof kinds / sizeof kinds[0]; i++)
    if (kind == kinds[i].kind) return kinds[i].unit;
  return "";
}

double eqpl_check_quantity(lua_State *L, int idx, const char *what, unsigned units, double min,
                           double max, unsigned flags, eqp_quantity *kind)
{
  eqp_ctx *ctx = eqpl_ctx_of(L);
  char want[96];
  snprintf(want, sizeof want, "a string with its unit, such as %s", example_of(units));
  if (lua_type(L, idx) == LUA_TNUMBER) {
    char buf[96];
    eqpl_input_error(L, "%s: %s has no unit; write it as %s", what,
                     eqpl_describe(L, idx, buf, sizeof buf), want);
  }
  if (lua_type(L, idx) != LUA_TSTRING) wrong_type(L, idx, what, want);
  const char *text = eqpl_check_name(L, idx, what);
  double v;
  eqp_quantity k;
  if (eqp_parse_quantity(ctx, text, units, &v, &k) < 0)
    eqpl_input_error(L, "%s: %s", what, eqp_ctx_errmsg(ctx));
  if (!in_range(v, min, max, flags)) {
    char r[160];
    range_text(r, sizeof r, min, max, flags, unit_of(k));
    eqpl_input_error(L, "%s = '%s' is out of range (%s)", what, text, r);
  }
  if (kind) *kind = k;
  return v;
}

double eqpl_check_temperature(lua_State *L, int idx, const char *what)
{
  double T;
  if (lua_type(L, idx) == LUA_TNUMBER) {
    T = eqpl_check_number(L, idx, what, -HUGE_VAL, HUGE_VAL, 0) + 273.15;
  } else if (lua_type(L, idx) == LUA_TSTRING) {
    T = eqpl_check_quantity(L, idx, what, EQP_Q_TEMPERATURE, 0, HUGE_VAL, EQPL_ABOVE, NULL);
  } else {
    return wrong_type(L, idx, what, "a number in C or a string with its unit, such as '37 C' or "
                      "'310.15 K'");
  }
  if (!(T >= EQPL_T_MIN && T <= EQPL_T_MAX))
    eqpl_input_error(L, "%s %.6g C is outside 0..100 C (liquid water at about 1 bar)", what,
                     T - 273.15);   /* finite here: numbers and quantities were checked */
  return T;
}

const char *const *eqpl_check_names(lua_State *L, int idx, const char *what, size_t max,
                                    size_t *n)
{
  idx = lua_absindex(L, idx);
  if (!lua_istable(L, idx)) wrong_type(L, idx, what, "a list of names, such as { 'Na+', 'Cl-' }");
  size_t len = lua_rawlen(L, idx);
  lua_pushnil(L);
  while (lua_next(L, idx)) {
    lua_pop(L, 1);
    if (!lua_isinteger(L, -1) || lua_tointeger(L, -1) < 1 || (size_t)lua_tointeger(L, -1) > len) {
      char buf[96];
      eqpl_input_error(L, "%s must be a list of names; it has the key %s", what,
                       eqpl_describe(L, -1, buf, sizeof buf));
    }
  }
  if (len > max) eqpl_input_error(L, "%s: at most %zu names; got %zu", what, max, len);
  /* the strings are copied into a table of our own, anchored by the userdata
  ** that holds their pointers: no later change to the script's table, nor
  ** any collection, can free them before the binding returns */
  const char **v = lua_newuserdatauv(L, sizeof *v * (len + 1), 1);
  lua_createtable(L, (int)len, 0);
  for (size_t i = 0; i < len; i++) {
    lua_rawgeti(L, idx, (lua_Integer)i + 1);
    char item[160];
    snprintf(item, sizeof item, "%s[%zu]", what, i + 1);
    v[i] = eqpl_check_name(L, -1, item);
    lua_rawseti(L, -2, (lua_Integer)i + 1);
  }
  v[len] = NULL;
  lua_setiuservalue(L, -2, 1);
  *n = len;
  return v;
}

/* ------------------------------------------------------------- options */

static const eqpl_opt *find_opt(const eqpl_opt *spec, const char *k, size_t len)
{
  for (; spec->name; spec++)
    if (strlen(spec->name) == len && memcmp(spec->name, k, len) == 0) return spec;
  return NULL;
}

static int by_name(const void *a, const void *b)
{
  return strcmp(*(const char *const *)a, *(const char *const *)b);
}

/* One message for all the unknown keys, in alphabetical order, each with
** the nearest known option if one is near. */
static int unknown_options(lua_State *L, const char *call, const eqpl_opt *spec,
                           const char **keys, size_t nkeys)
{
  const char *names[48];
  size_t n = 0;
  char known[512], msg[1024];
  size_t used = 0, m = 0;
  known[0] = '\0';
  for (; spec->name && n < 48; spec++) {
    names[n++] = spec->name;
    if (used < sizeof known)
      used += (size_t)snprintf(known + used, sizeof known - used, "%s%s", used ? ", " : "",
                               spec->name);
  }
  qsort(keys, nkeys, sizeof *keys, by_name);
  int far = 0;
  m += (size_t)snprintf(msg + m, sizeof msg - m, "%s: unknown option%s ", call,
                        nkeys > 1 ? "s" : "");
  for (size_t i = 0; i < nkeys && m < sizeof msg; i++) {
    const char *near = n ? eqpl_nearest(keys[i], strlen(keys[i]), names, n) : NULL;
    far |= !near;
    m += (size_t)snprintf(msg + m, sizeof msg - m, "%s'%s'", i ? ", " : "", keys[i]);
    if (near && m < sizeof msg)
      m += (size_t)snprintf(msg + m, sizeof msg - m, " (did you mean '%s'?)", near);
  }
  if (far && m < sizeof msg) {
    if (n) snprintf(msg + m, sizeof msg - m, "; its options are %s", known);
    else snprintf(msg + m, sizeof msg - m, "; it takes no named options");
  }
  return eqpl_input_error(L, "%s", msg);
}

/* Every key of the table at t is a known option, or (list) a position 1..n. */
static void check_keys(lua_State *L, int t, const char *call, const eqpl_opt *spec, int list)
{
  const char *unknown[8];   /* keys of the table at t: anchored by it */
  size_t nu = 0, n = list ? lua_rawlen(L, t) : 0;
  lua_pushnil(L);
  while (lua_next(L, t)) {
    lua_pop(L, 1);
    if (lua_type(L, -1) == LUA_TSTRING) {   /* no conversion of the key: lua_next stays valid */
      size_t len;
      const char *k = lua_tolstring(L, -1, &len);
      if (strlen(k) != len)
        eqpl_input_error(L, "%s: unknown option '%s' followed by a NUL character (\\0)", call, k);
      if (!find_opt(spec, k, len) && nu < sizeof unknown / sizeof unknown[0]) unknown[nu++] = k;
    } else if (!(list && lua_isinteger(L, -1) && lua_tointeger(L, -1) >= 1 &&
                 (size_t)lua_tointeger(L, -1) <= n)) {
      char buf[96];
      if (lua_isinteger(L, -1))
        eqpl_input_error(L, "%s: options are given by name (name = value); got a value at "
                         "position %lld", call, (long long)lua_tointeger(L, -1));
      eqpl_input_error(L, "%s: options are given by name (name = value); got the key %s", call,
                       eqpl_describe(L, -1, buf, sizeof buf));
    }
  }
  if (nu) unknown_options(L, call, spec, unknown, nu);
}

size_t eqpl_options(lua_State *L, int idx, const char *call, const eqpl_opt *spec, eqpl_val *out,
                    unsigned flags)
{
  idx = lua_absindex(L, idx);
  size_t nspec = 0;
  while (spec[nspec].name) nspec++;
  luaL_checkstack(L, (int)nspec + 8, "too many options");
  int given = !lua_isnoneornil(L, idx);
  if (given && !lua_istable(L, idx)) {
    char want[96], what[96];
    snprintf(want, sizeof want, "a table, such as { %s = ... }",
             spec[0].name ? spec[0].name : "name");
    snprintf(what, sizeof what, "%s: the options", call);
    wrong_type(L, idx, what, want);
  }
  if (given) check_keys(L, idx, call, spec, flags & EQPL_LIST);
  for (size_t i = 0; i < nspec; i++) {
    const eqpl_opt *o = &spec[i];
    eqpl_val *v = &out[i];
    char what[128];
    snprintf(what, sizeof what, "%s: %s", call, o->name);
    memset(v, 0, sizeof *v);
    v->num = NAN;
    if (given) lua_getfield(L, idx, o->name);   /* through __index: defaults may be inherited */
    else lua_pushnil(L);
    v->idx = lua_gettop(L);
    v->given = !lua_isnil(L, -1);
    if (!v->given) {
      if (o->flags & EQPL_REQUIRED)
        eqpl_input_error(L, "%s is required%s%s", what, o->hint ? ": " : "",
                         o->hint ? o->hint : "");
      continue;
    }
    switch (o->type) {
    case EQPL_NUMBER: v->num = eqpl_check_number(L, -1, what, o->min, o->max, o->flags); break;
    case EQPL_NAME:
      if (o->hint && lua_type(L, -1) != LUA_TSTRING) wrong_type(L, -1, what, o->hint);
      v->str = eqpl_check_name(L, -1, what);
      break;
    case EQPL_BOOLEAN: v->num = eqpl_check_boolean(L, -1, what); break;
    case EQPL_TEMPERATURE: v->num = eqpl_check_temperature(L, -1, what); break;
    case EQPL_QUANTITY:
      v->num = eqpl_check_quantity(L, -1, what, o->units, o->min, o->max, o->flags, &v->unit);
      break;
    case EQPL_NAMES:
      v->names = eqpl_check_names(L, -1, what, (size_t)o->max, &v->count);
      lua_replace(L, v->idx);    /* the anchored copy takes the table's slot */
      break;
    default: break;              /* EQPL_ANY: checked by the binding */
    }
  }
  return given && (flags & EQPL_LIST) ? lua_rawlen(L, idx) : 0;
}
