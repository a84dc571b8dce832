/* Species files: convert the table a species file returns (sandbox.c runs
** it) into staged entries. Checks of names and balances happen on
** commit (commit.c); this file checks shape and types. */
/* SPDX-License-Identifier: MIT */
#include "stage_impl.h"
#include <lauxlib.h>
#include <lua.h>
#include <lualib.h>
#include <math.h>
#include <stdio.h>
#include <string.h>


typedef struct conv {
  eqp_ctx *ctx;
  eqpi_stage *st;
  lua_State *L;
  const eqpi_lines *lines;
  int root;             /* stack index of the table the file returned */
  const char *file;
  const char *path[8];
  char keys[8][64];
  int depth;
  int sources;          /* stack index of the sources table, 0 if none */
  const char *size_source; /* file-level source of ion sizes */
  const char *params_source; /* file-level source of species parameters */
  eqpi_measured measured;   /* file-level conditions of the constants */
} conv;

/* Keys are pushed for every field read: plain copies, no formatting. */
static void cv_push(conv *c, const char *key)
{
  if (c->depth < 8) {
    size_t l = strlen(key);
    if (l >= sizeof c->keys[0]) l = sizeof c->keys[0] - 1;
    memcpy(c->keys[c->depth], key, l);
    c->keys[c->depth][l] = '\0';
    c->path[c->depth] = c->keys[c->depth];
  }
  c->depth++;
}

static void cv_pushi(conv *c, lua_Integer i)
{
  char k[32], *p = k + sizeof k;
  unsigned long long u = i < 0 ? 0ull - (unsigned long long)i : (unsigned long long)i;
  *--p = '\0';
  do *--p = (char)('0' + u % 10); while ((u /= 10) && p > k + 1);
  if (i < 0) *--p = '-';
  cv_push(c, p);
}

static void cv_pop(conv *c) { c->depth--; }

static int cv_line(const conv *c)
{
  return eqpi_lines_at(c->lines, c->L, c->root, c->path, c->depth < 8 ? c->depth : 8);
}

static const char *cv_where(conv *c, char *buf, size_t len)
{
  size_t used = 0;
  buf[0] = '\0';
  for (int i = 0; i < c->depth && i < 8 && used < len; i++) {
    int isnum = c->keys[i][0] >= '0' && c->keys[i][0] <= '9';
    if (isnum) used += (size_t)snprintf(buf + used, len - used, "[%s]", c->keys[i]);
    else used += (size_t)snprintf(buf + used, len - used, "%s%s", i ? "." : "", c->keys[i]);
  }
  return buf;
}

#define CV_ERR(c, ...) do { char w_[256]; \
    char m_[512]; snprintf(m_, sizeof m_, __VA_ARGS__); \
    eqpi_stage_error((c)->st, (c)->file, cv_line(c), "%s: %s", cv_where(c, w_, sizeof w_), m_); \
  } while (0)

static const char *cv_str(conv *c, const char *s)
{
  return eqpi_arena_strdup(c->ctx, &c->st->arena, s);
}

/* A species or reagent name: Unicode and variant spellings fold to the
** canonical ASCII form; the sign-first charge ("HPO4-2") is refused. */
/* A name is looked up, printed, and becomes a CSV or JSON column: valid
** UTF-8, no control characters and none of the characters a shell or a
** markup language gives a meaning to. */
static int bad_text(const char *s, int name)
{
  const unsigned char *p = (const unsigned char *)s;
  while (*p) {
    if (*p < 0x20 || *p == 0x7f || (name && strchr("$`\"\\;|&<>{}", *p))) return 1;
    int n = *p < 0x80 ? 1 : (*p & 0xE0) == 0xC0 ? 2 : (*p & 0xF0) == 0xE0 ? 3
          : (*p & 0xF8) == 0xF0 ? 4 : 0;
    if (!n || (n == 2 && *p < 0xC2)) return 1;
    for (int k = 1; k < n; k++)
      if ((p[k] & 0xC0) != 0x80) return 1;
    p += n;
  }
  return 0;
}

static const char *cv_name(conv *c, const char *s)
{
  char buf[256], good[256];
  if (bad_text(s, 1)) {
    CV_ERR(c, "a name must be valid UTF-8 without control characters or any of "
           "$ ` \" \\ ; | & < > { }");
    return NULL;
  }
  if (eqpi_name_old_style(s, good, sizeof good)) {
    CV_ERR(c, "'%s': charge written sign first; write '%s' (number first, then the sign, "
           "after a caret)", s, good);
    return NULL;
  }
  if (eqpi_name_normalize(s, buf, sizeof buf) == 1) s = buf;
  return cv_str(c, s);
}

/* Field key of the table at idx, read raw: a metamethod of a script's
** table never runs while the staging area is open. Pushes it; returns its
** Lua type. */
static int raw_field(lua_State *L, int idx, const char *key)
{
  idx = lua_absindex(L, idx);
  lua_pushstring(L, key);
  return lua_rawget(L, idx);
}

/* Field of the table at top; leaves it pushed. Returns its Lua type. */
static int cv_field(conv *c, const char *key)
{
  return raw_field(c->L, -1, key);
}

/* A number given in the file: NaN after an error if it is not finite (0/0,
** 1/0 in the file) or outside lo..hi. A value given is never mistaken for
** one left out. */
static double cv_checked(conv *c, double v, double lo, double hi)
{
  if (!isfinite(v)) {
    CV_ERR(c, "%s is not a finite number", isnan(v) ? "NaN (0/0)" : v > 0 ? "inf" : "-inf");
    return NAN;
  }
  if (v < lo || v > hi) {
    CV_ERR(c, "%g is outside %g..%g", v, lo, hi);
    return NAN;
  }
  return v;
}

/* Optional number field; NaN when absent; error if not a finite number. */
static double cv_number(conv *c, const char *key, double lo, double hi, int required)
{
  double v = NAN;
  cv_push(c, key);
  int t = cv_field(c, key);
  if (t == LUA_TNUMBER) {
    v = cv_checked(c, lua_tonumber(c->L, -1), lo, hi);
  } else if (t != LUA_TNIL) {
    CV_ERR(c, "expected a number, got %s", lua_typename(c->L, t));
  } else if (required) {
    CV_ERR(c, "missing (a number is required)");
  }
  lua_pop(c->L, 1);
  cv_pop(c);
  return v;
}

static const char *cv_string(conv *c, const char *key, int required)
{
  const char *s = NULL;
  cv_push(c, key);
  int t = cv_field(c, key);
  if (t == LUA_TSTRING) s = cv_str(c, lua_tostring(c->L, -1));
  else if (t != LUA_TNIL) CV_ERR(c, "expected a string, got %s", lua_typename(c->L, t));
  else if (required) CV_ERR(c, "missing (a string is required)");
  lua_pop(c->L, 1);
  cv_pop(c);
  return s;
}

/* A source reference: the key of the file's sources table; returns the
** citation text. */
static const char *cv_source(conv *c, const char *key, int required)
{
  const char *ref = cv_string(c, key, 0);
  if (!ref) {
    if (required) {
      cv_push(c, key);
      CV_ERR(c, "missing: every constant names its source (a key of 'sources')");
      cv_pop(c);
    }
    return NULL;
  }
  if (c->sources) {
    raw_field(c->L, c->sources, ref);
    if (lua_type(c->L, -1) == LUA_TSTRING) {
      const char *txt = cv_str(c, lua_tostring(c->L, -1));
      lua_pop(c->L, 1);
      return txt;
    }
    lua_pop(c->L, 1);
  }
  cv_push(c, key);
  CV_ERR(c, "unknown source '%s' (not a key of 'sources')", ref);
  cv_pop(c);
  return NULL;
}

/* Check the table at top has only the given keys (and integer keys up to
** maxpos). */
static void cv_keys(conv *c, const char *const *allowed, lua_Integer maxpos)
{
  lua_pushnil(c->L);
  while (lua_next(c->L, -2)) {
    lua_pop(c->L, 1);
    if (lua_type(c->L, -1) == LUA_TSTRING) {
      const char *k = lua_tostring(c->L, -1);
      int ok = 0;
      for (int i = 0; allowed[i]; i++) ok |= strcmp(allowed[i], k) == 0;
      if (!ok) {
        cv_push(c, k);
        CV_ERR(c, "unknown field '%s'", k);
        cv_pop(c);
      }
    } else if (lua_isinteger(c->L, -1)) {
      lua_Integer i = lua_tointeger(c->L, -1);
      if (i < 1 || i > maxpos) {
        cv_pushi(c, i);
        CV_ERR(c, "unexpected positional value");
        cv_pop(c);
      }
    } else {
      CV_ERR(c, "keys must be names");
    }
  }
}

/* The positional string at index i of the table at top. */
static const char *cv_pos_string(conv *c, lua_Integer i)
{
  const char *s = NULL;
  cv_pushi(c, i);
  int t = lua_rawgeti(c->L, -1, i);
  if (t == LUA_TSTRING && lua_rawlen(c->L, -1) > 0) s = cv_name(c, lua_tostring(c->L, -1));
  else CV_ERR(c, "expected a name (non-empty string), got %s", lua_typename(c->L, t));
  lua_pop(c->L, 1);
  cv_pop(c);
  return s;
}

/* A map { name = number, ... } at key; returns count, -1 on error.
** Coefficients (the default) must be non-zero and modest; parameters
** (params != 0) may be any finite number. */
static int cv_map(conv *c, const char *key, st_pair **out, int params);

static int cv_pairs(conv *c, const char *key, st_pair **out)
{
  return cv_map(c, key, out, 0);
}

static int cv_map(conv *c, const char *key, st_pair **out, int params)
{
  cv_push(c, key);
  int t = cv_field(c, key);
  int n = 0;
  *out = NULL;
  if (t != LUA_TTABLE) {
    if (t == LUA_TNIL) CV_ERR(c, "missing (a table of name = coefficient)");
    else CV_ERR(c, "expected a table of name = coefficient, got %s", lua_typename(c->L, t));
    lua_pop(c->L, 1);
    cv_pop(c);
    return -1;
  }
  lua_pushnil(c->L);
  while (lua_next(c->L, -2)) { n++; lua_pop(c->L, 1); }
  st_pair *p = n ? eqpi_arena_alloc(c->ctx, &c->st->arena, sizeof *p * (size_t)n) : NULL;
  int k = 0, bad = 0;
  lua_pushnil(c->L);
  while (lua_next(c->L, -2)) {
    if (lua_type(c->L, -2) != LUA_TSTRING || lua_type(c->L, -1) != LUA_TNUMBER) {
      CV_ERR(c, "each entry must be name = number");
      bad = 1;
    } else {
      double v = lua_tonumber(c->L, -1);
      if (!isfinite(v) || (!params && (v == 0 || fabs(v) > 100)) || fabs(v) > 1e6) {
        CV_ERR(c, "%s of '%s' must be a %snumber", params ? "value" : "coefficient",
               lua_tostring(c->L, -2), params ? "finite " : "non-zero ");
        bad = 1;
      } else if (p) {
        p[k].name = params ? cv_str(c, lua_tostring(c->L, -2)) : cv_name(c, lua_tostring(c->L, -2));
        if (!p[k].name) bad = 1;
        p[k++].nu = v;
      }
    }
    lua_pop(c->L, 1);
  }
  if (n == 0) {
    CV_ERR(c, "empty");
    bad = 1;
  }
  lua_pop(c->L, 1);
  cv_pop(c);
  *out = p;
  return bad || (n && !p) ? -1 : k;
}

/* A number or a list of n numbers at key into v[0..n-1]; absent -> NaN. */
static void cv_ladder_numbers(conv *c, const char *key, int n, double *v, double lo,
                              double hi, int required)
{
  for (int i = 0; i < n; i++) v[i] = NAN;
  cv_push(c, key);
  int t = cv_field(c, key);
  if (t == LUA_TNUMBER && n == 1) {
    v[0] = cv_checked(c, lua_tonumber(c->L, -1), lo, hi);
  } else if (t == LUA_TTABLE) {
    if ((int)lua_rawlen(c->L, -1) != n)
      CV_ERR(c, "has %d values for %d steps", (int)lua_rawlen(c->L, -1), n);
    for (int i = 0; i < n; i++) {
      cv_pushi(c, i + 1);
      int ti = lua_rawgeti(c->L, -1, i + 1);
      if (ti == LUA_TNUMBER) v[i] = cv_checked(c, lua_tonumber(c->L, -1), lo, hi);
      else if (ti != LUA_TNIL || required) CV_ERR(c, "expected a number");
      if (ti == LUA_TNUMBER && isnan(v[i])) CV_ERR(c, "is not a number (NaN)");
      lua_pop(c->L, 1);
      cv_pop(c);
    }
  } else if (t != LUA_TNIL) {
    CV_ERR(c, "expected %s", n == 1 ? "a number" : "a list of numbers");
  } else if (required) {
    CV_ERR(c, "missing");
  }
  lua_pop(c->L, 1);
  cv_pop(c);
}

/* A list of strings at key; returns count. Names (text 0) are checked as
** names; text (notes) only for valid UTF-8 without control characters. */
static int cv_strings_as(conv *c, const char *key, const char ***out, int text);

static int cv_strings(conv *c, const char *key, const char ***out)
{
  return cv_strings_as(c, key, out, 0);
}

static int cv_strings_as(conv *c, const char *key, const char ***out, int text)
{
  cv_push(c, key);
  int t = cv_field(c, key);
  int n = 0;
  *out = NULL;
  if (t == LUA_TTABLE) {
    n = (int)lua_rawlen(c->L, -1);
    const char **v = n ? eqpi_arena_alloc(c->ctx, &c->st->arena, sizeof *v * (size_t)n) : NULL;
    for (int i = 0; i < n && v; i++) {
      if (!text) {
        v[i] = cv_pos_string(c, i + 1);
        continue;
      }
      cv_pushi(c, i + 1);
      int ti = lua_rawgeti(c->L, -1, i + 1);
      const char *str = ti == LUA_TSTRING ? lua_tostring(c->L, -1) : NULL;
      if (str && !bad_text(str, 0)) v[i] = cv_str(c, str);
      else CV_ERR(c, "expected text: valid UTF-8 without control characters");
      lua_pop(c->L, 1);
      cv_pop(c);
    }
    *out = v;
  } else if (t != LUA_TNIL) {
    CV_ERR(c, "expected a list of strings");
  }
  lua_pop(c->L, 1);
  cv_pop(c);
  return n;
}

/* A temperature function at key of the table at top: { a=, b=, c=, d=,
** e=, f= } (log10 K = a + bT + c/T + d lnT + e/T^2 + fT^2), or for
** reactions the name "water-iapws". Sets the model and coefficients. */
static void cv_tfunction(conv *c, int idx, int *tmodel, double *fn)
{
  static const char *const keys[] = {"a", "b", "c", "d", "e", "f", NULL};
  *tmodel = EQPI_T_VANTHOFF;
  if (lua_isnil(c->L, idx)) return;
  if (lua_type(c->L, idx) == LUA_TSTRING) {
    if (strcmp(lua_tostring(c->L, idx), "water-iapws") == 0) *tmodel = EQPI_T_WATER;
    else CV_ERR(c, "unknown temperature model '%s' (known: water-iapws)", lua_tostring(c->L, idx));
    return;
  }
  if (lua_type(c->L, idx) != LUA_TTABLE) {
    CV_ERR(c, "expected a table { a =, b =, c =, d =, e =, f = }");
    return;
  }
  lua_pushvalue(c->L, idx);
  cv_keys(c, keys, 0);
  int any = 0;
  for (int k = 0; k < 6; k++) {
    fn[k] = cv_number(c, keys[k], -1e9, 1e9, 0);
    if (isnan(fn[k])) fn[k] = 0;
    else any = 1;
  }
  lua_pop(c->L, 1);
  if (any) *tmodel = EQPI_T_FUNCTION;
  else CV_ERR(c, "a temperature function needs at least one of a..f");
}

/* T_range = { low, high } in K. */
static void cv_trange(conv *c, double *lo, double *hi)
{
  double v[2];
  *lo = *hi = NAN;
  raw_field(c->L, -1, "T_range");
  int present = !lua_isnil(c->L, -1);
  lua_pop(c->L, 1);
  if (!present) return;
  cv_ladder_numbers(c, "T_range", 2, v, 200, 700, 1);
  if (!(v[0] < v[1])) {
    cv_push(c, "T_range");
    CV_ERR(c, "expected { low, high } in K with low < high");
    cv_pop(c);
    return;
  }
  *lo = v[0];
  *hi = v[1];
}

/* measured = { I =, t =, medium =, to_I0 = } of the table at top: the
** conditions of the published constant. The library holds constants at
** I = 0, so a value published at I > 0 says how it was taken there. */
static void cv_measured(conv *c, eqpi_measured *m)
{
  static const char *const keys[] = {"I", "t", "medium", "to_I0", NULL};
  static const char *const methods[] = {"davies", "debye-huckel", "sit", NULL};
  cv_push(c, "measured");
  int t = cv_field(c, "measured");
  if (t == LUA_TTABLE) {
    cv_keys(c, keys, 0);
    eqpi_measured v = {1, NAN, NAN, NULL, NULL};
    v.I = cv_number(c, "I", 0, 10, 1);
    v.t = cv_number(c, "t", 0, 100, 1);
    v.medium = cv_string(c, "medium", 0);
    v.to_I0 = cv_string(c, "to_I0", 0);
    int known = !v.to_I0;
    for (int i = 0; v.to_I0 && methods[i]; i++) known |= strcmp(v.to_I0, methods[i]) == 0;
    cv_push(c, "to_I0");
    if (!known)
      CV_ERR(c, "unknown method '%s' (known: davies, debye-huckel, sit)", v.to_I0);
    else if (v.I > 0 && !v.to_I0)
      CV_ERR(c, "a constant measured at I = %g needs to_I0, the method that took it to I = 0 "
             "(the library holds constants at I = 0)", v.I);
    else if (v.I == 0 && v.to_I0)
      CV_ERR(c, "to_I0 is for a constant measured at I > 0");
    cv_pop(c);
    *m = v;
  } else if (t != LUA_TNIL) {
    CV_ERR(c, "expected a table { I =, t =, medium =, to_I0 = }");
  }
  lua_pop(c->L, 1);
  cv_pop(c);
}

#define STAGE_PUSH(c, arr, n, cap) \
  eqpi_stage_push((c)->ctx, (c)->st, (void **)&(c)->st->arr, &(c)->st->n, &(c)->st->cap, \
                  sizeof *(c)->st->arr)

static void cv_species(conv *c)
{
  const char *file_size_source = c->size_source;
  static const char *const keys[] = {"formula", "size", "size_source", "params",
                                     "params_source", "note", NULL};
  cv_keys(c, keys, 1);
  st_species *s = STAGE_PUSH(c, sp, nsp, capsp);
  if (!s) return;
  raw_field(c->L, -1, "params");
  int has_params = !lua_isnil(c->L, -1);
  lua_pop(c->L, 1);
  if (has_params) {
    s->nparams = cv_map(c, "params", &s->params, 1);
    if (s->nparams < 0) s->nparams = 0;
    s->params_source = cv_source(c, "params_source", 0);
    if (!s->params_source) s->params_source = c->params_source;
    if (!s->params_source) {
      cv_push(c, "params");
      CV_ERR(c, "parameters need a source: 'params_source' here or at the top of the file");
      cv_pop(c);
    }
  }
  s->name = cv_pos_string(c, 1);
  s->formula = cv_string(c, "formula", 0);
  if (!s->formula) s->formula = s->name;
  s->size = cv_number(c, "size", 0.5, 20, 0);
  s->size_source = cv_source(c, "size_source", 0);
  if (!s->size_source && !isnan(s->size)) {
    s->size_source = file_size_source;
    if (!s->size_source) {
      cv_push(c, "size");
      CV_ERR(c, "an ion size needs a source: 'size_source' here or at the top of the file");
      cv_pop(c);
    }
  }
  s->file = c->file;
  s->line = cv_line(c);
}

static void cv_acid(conv *c)
{
  static const char *const keys[] = {"pKa", "dH", "dCp", "pKa_T", "T_range", "source",
                                     "measured", "note", NULL};
  int nforms = (int)lua_rawlen(c->L, -1);
  cv_keys(c, keys, nforms);
  if (nforms < 2) {
    CV_ERR(c, "an acid lists at least two forms, most protonated first");
    return;
  }
  const char *forms[16];
  if (nforms > 16) { CV_ERR(c, "more than 16 forms"); return; }
  for (int i = 0; i < nforms; i++) forms[i] = cv_pos_string(c, i + 1);
  int nst = nforms - 1;
  double pKa[15], dH[15], dCp[15];
  cv_ladder_numbers(c, "pKa", nst, pKa, -5, 20, 1);
  cv_ladder_numbers(c, "dH", nst, dH, -200, 200, 0);
  cv_ladder_numbers(c, "dCp", nst, dCp, -2000, 2000, 0);
  const char *src = cv_source(c, "source", 1);
  eqpi_measured meas = c->measured;
  cv_measured(c, &meas);
  double Tmin, Tmax;
  cv_trange(c, &Tmin, &Tmax);
  int tm[15] = {0};
  double fns[15][6];
  cv_push(c, "pKa_T");
  int tt = cv_field(c, "pKa_T");
  if (tt == LUA_TTABLE) {
    if ((int)lua_rawlen(c->L, -1) != nst) CV_ERR(c, "has %d entries for %d steps (use false "
                                                  "for a step without one)", (int)lua_rawlen(c->L, -1), nst);
    for (int k = 0; k < nst; k++) {
      cv_pushi(c, k + 1);
      lua_rawgeti(c->L, -1, k + 1);
      if (lua_toboolean(c->L, -1)) cv_tfunction(c, lua_gettop(c->L), &tm[k], fns[k]);
      lua_pop(c->L, 1);
      cv_pop(c);
    }
  } else if (tt != LUA_TNIL) {
    CV_ERR(c, "expected a list with one temperature function (or false) per step");
  }
  lua_pop(c->L, 1);
  cv_pop(c);
  for (int k = 0; k < nst; k++) {
    if (!forms[k] || !forms[k + 1] || isnan(pKa[k])) continue;
    st_reaction *r = STAGE_PUSH(c, rx, nrx, caprx);
    if (!r) return;
    r->r = eqpi_arena_alloc(c->ctx, &c->st->arena, 2 * sizeof *r->r);
    if (!r->r) return;
    /* forms[k] = forms[k+1] + H+ with log K = pKa; the tabulated enthalpy
    ** and heat capacity are those of the ionization, the reverse reaction */
    r->product = forms[k];
    r->r[0].name = forms[k + 1];
    r->r[0].nu = 1;
    r->r[1].name = "H+";
    r->r[1].nu = 1;
    r->n = 2;
    r->k.logK = pKa[k];
    r->k.dH = -dH[k];
    r->k.dCp = -dCp[k];
    r->k.tmodel = tm[k];
    if (tm[k] == EQPI_T_FUNCTION) memcpy(r->k.fn, fns[k], sizeof r->k.fn);
    r->k.Tmin = Tmin;
    r->k.Tmax = Tmax;
    r->k.source = src;
    r->k.measured = meas;
    r->file = c->file;
    cv_push(c, "pKa");
    cv_pushi(c, k + 1);
    r->line = cv_line(c);
    cv_pop(c);
    cv_pop(c);
  }
}

/* The constant at logkey (required, lo..hi) of the entry at the top, with
** its dH, dCp, temperature function at fkey, T_range and source. */
static void cv_constant(conv *c, const char *logkey, double lo, double hi, const char *fkey,
                        st_const *k)
{
  k->logK = cv_number(c, logkey, lo, hi, 1);
  k->dH = cv_number(c, "dH", -500, 500, 0);
  k->dCp = cv_number(c, "dCp", -5000, 5000, 0);
  cv_push(c, fkey);
  raw_field(c->L, -1, fkey);
  cv_tfunction(c, lua_gettop(c->L), &k->tmodel, k->fn);
  lua_pop(c->L, 1);
  cv_pop(c);
  cv_trange(c, &k->Tmin, &k->Tmax);
  k->source = cv_source(c, "source", 1);
}

static void cv_reaction(conv *c)
{
  static const char *const keys[] = {"from", "logK", "dH", "dCp", "logK_T", "T_range",
                                     "source", "measured", "note", NULL};
  cv_keys(c, keys, 1);
  st_reaction *r = STAGE_PUSH(c, rx, nrx, caprx);
  if (!r) return;
  r->product = cv_pos_string(c, 1);
  r->n = cv_pairs(c, "from", &r->r);
  cv_constant(c, "logK", -100, 100, "logK_T", &r->k);
  r->k.measured = c->measured;
  cv_measured(c, &r->k.measured);
  r->file = c->file;
  r->line = cv_line(c);
  if (r->n < 0) r->n = 0;
}

static void cv_reagent(conv *c)
{
  static const char *const keys[] = {"formula", "gives", "name", "names", "hydrates",
                                     "hazards", "density", "note", NULL};
  cv_keys(c, keys, 1);
  st_reagent base = {0};
  base.name = cv_pos_string(c, 1);
  base.formula = cv_string(c, "formula", 0);
  if (!base.formula) base.formula = base.name;
  raw_field(c->L, -1, "gives");
  int has_gives = !lua_isnil(c->L, -1);
  lua_pop(c->L, 1);
  if (has_gives) {
    base.n = cv_pairs(c, "gives", &base.gives);
    if (base.n < 0) base.n = 0;
  }
  const char **names = NULL;
  int nnames = cv_strings(c, "names", &names);
  const char *one = cv_string(c, "name", 0);
  base.naliases = nnames + (one ? 1 : 0);
  if (base.naliases) {
    base.aliases = eqpi_arena_alloc(c->ctx, &c->st->arena, sizeof(char *) * (size_t)base.naliases);
    if (!base.aliases) return;
    for (int i = 0; i < nnames; i++) base.aliases[i] = names[i];
    if (one) base.aliases[nnames] = one;
  }
  base.nhazards = cv_strings(c, "hazards", &base.hazards);
  for (int i = 0; i < base.nhazards && base.hazards; i++)
    if (base.hazards[i] && eqpi_hazard_find(base.hazards[i]) < 0) {
      char hint[160];
      eqpi_hazard_hint(base.hazards[i], hint, sizeof hint);
      cv_push(c, "hazards");
      cv_pushi(c, i + 1);
      CV_ERR(c, "unknown hazard class '%s' (%s)", base.hazards[i], hint);
      cv_pop(c);
      cv_pop(c);
    }
  base.density = cv_number(c, "density", 0.5, 3.0, 0);
  base.file = c->file;
  base.line = cv_line(c);
  st_reagent *r = STAGE_PUSH(c, rg, nrg, caprg);
  if (!r) return;
  *r = base;
  /* Listed hydrates become reagents of their own: same release, plus water. */
  double hyd[8];
  cv_push(c, "hydrates");
  int t = cv_field(c, "hydrates");
  int nh = t == LUA_TTABLE ? (int)lua_rawlen(c->L, -1) : 0;
  if (t != LUA_TTABLE && t != LUA_TNIL) CV_ERR(c, "expected a list of numbers");
  lua_pop(c->L, 1);
  cv_pop(c);
  if (nh > 8) nh = 8;
  if (nh > 0) cv_ladder_numbers(c, "hydrates", nh, hyd, 0.5, 20, 1);
  for (int i = 0; i < nh; i++) {
    if (isnan(hyd[i])) continue;
    char name[256], formula[256];
    char k[32] = "";
    if (hyd[i] != 1) snprintf(k, sizeof k, "%g", hyd[i]);
    snprintf(name, sizeof name, "%s.%sH2O", base.name, k);
    snprintf(formula, sizeof formula, "%s.%sH2O", base.formula, k);
    st_reagent *h = STAGE_PUSH(c, rg, nrg, caprg);
    if (!h) return;
    *h = base;
    h->name = cv_str(c, name);
    h->formula = cv_str(c, formula);
    h->aliases = NULL;
    h->naliases = 0;
    h->density = NAN;
    h->hydrate = hyd[i];
    if (base.n == 0) {
      /* the hydrate of a neutral species releases that species */
      h->gives = eqpi_arena_alloc(c->ctx, &c->st->arena, sizeof *h->gives);
      if (!h->gives) return;
      h->gives[0].name = base.name;
      h->gives[0].nu = 1;
      h->n = 1;
    }
  }
}

/* { "Na+", "Cl-", sit = 0.03, source = "..." }: parameters of a pair. */
static void cv_interaction(conv *c)
{
  st_inter *in = STAGE_PUSH(c, in, nin, capin);
  if (!in) return;
  in->a = cv_pos_string(c, 1);
  in->b = cv_pos_string(c, 2);
  in->source = cv_source(c, "source", 1);
  in->file = c->file;
  in->line = cv_line(c);
  int n = 0;
  lua_pushnil(c->L);
  while (lua_next(c->L, -2)) {
    lua_pop(c->L, 1);
    if (lua_type(c->L, -1) == LUA_TSTRING && strcmp(lua_tostring(c->L, -1), "source") &&
        strcmp(lua_tostring(c->L, -1), "note"))
      n++;
    else if (lua_type(c->L, -1) != LUA_TSTRING &&
             !(lua_isinteger(c->L, -1) && lua_tointeger(c->L, -1) >= 1 &&
               lua_tointeger(c->L, -1) <= 2))
      CV_ERR(c, "an interaction is { species, species, name = value, source = ... }");
  }
  in->params = n ? eqpi_arena_alloc(c->ctx, &c->st->arena, sizeof *in->params * (size_t)n) : NULL;
  lua_pushnil(c->L);
  while (lua_next(c->L, -2) && in->params) {
    if (lua_type(c->L, -2) == LUA_TSTRING && strcmp(lua_tostring(c->L, -2), "source") &&
        strcmp(lua_tostring(c->L, -2), "note")) {
      const char *k = lua_tostring(c->L, -2);
      cv_push(c, k);
      if (lua_type(c->L, -1) != LUA_TNUMBER || !isfinite(lua_tonumber(c->L, -1)))
        CV_ERR(c, "expected a number");
      else {
        in->params[in->n].name = cv_str(c, k);
        in->params[in->n++].nu = lua_tonumber(c->L, -1);
      }
      cv_pop(c);
    }
    lua_pop(c->L, 1);
  }
  if (in->n == 0) CV_ERR(c, "an interaction names at least one parameter, e.g. sit = 0.03");
}

/* { "phosphate", pair = { acid form, base form }, free = ..., titrant = ...,
**   notes = { "metal: ...", ... } } */
static void cv_buffer(conv *c)
{
  static const char *const keys[] = {"pair", "free", "titrant", "notes", "note", NULL};
  cv_keys(c, keys, 1);
  st_buffer *b = STAGE_PUSH(c, bf, nbf, capbf);
  if (!b) return;
  b->name = cv_pos_string(c, 1);
  const char **pair = NULL;
  int np = cv_strings(c, "pair", &pair);
  if (np == 2) {
    b->acid = pair[0];
    b->base = pair[1];
  } else if (np != 0) {
    cv_push(c, "pair");
    CV_ERR(c, "a pair is { acid form, base form }");
    cv_pop(c);
  }
  b->free = cv_string(c, "free", 0);
  b->titrant = cv_string(c, "titrant", 0);
  if (!b->free != !b->titrant) CV_ERR(c, "'free' and 'titrant' go together");
  if (!np && !b->free) CV_ERR(c, "a buffer names a 'pair' of reagents or a 'free' reagent and its 'titrant'");
  b->nnotes = cv_strings_as(c, "notes", &b->notes, 1);
  b->file = c->file;
  b->line = cv_line(c);
}

/* { "CO2(g)", dissolves = "CO2", logKH = -1.468, logKH_T = {...}, source = } */
static void cv_gas(conv *c)
{
  static const char *const keys[] = {"dissolves", "logKH", "dH", "dCp", "logKH_T", "T_range",
                                     "source", "note", NULL};
  cv_keys(c, keys, 1);
  st_gas *g = STAGE_PUSH(c, gs, ngs, capgs);
  if (!g) return;
  g->name = cv_pos_string(c, 1);
  g->dissolves = cv_string(c, "dissolves", 1);
  cv_constant(c, "logKH", -20, 20, "logKH_T", &g->k);
  g->file = c->file;
  g->line = cv_line(c);
}

/* { "calcite", formula = "CaCO3", dissolves = { ["Ca^2+"] = 1, ["CO3^2-"] = 1 },
**   logKsp = -8.48, logKsp_T = {...}, T_range = {...}, source = } */
static void cv_solid(conv *c)
{
  static const char *const keys[] = {"formula", "dissolves", "logKsp", "dH", "dCp", "logKsp_T",
                                     "T_range", "source", "note", NULL};
  cv_keys(c, keys, 1);
  st_solid *s = STAGE_PUSH(c, so, nso, capso);
  if (!s) return;
  s->name = cv_pos_string(c, 1);
  s->formula = cv_string(c, "formula", 1);
  s->n = cv_pairs(c, "dissolves", &s->dissolves);
  if (s->n < 0) s->n = 0;
  cv_constant(c, "logKsp", -100, 20, "logKsp_T", &s->k);
  s->file = c->file;
  s->line = cv_line(c);
}

/* Run f on each element of the list at key. */
static void cv_list(conv *c, const char *key, void (*f)(conv *))
{
  cv_push(c, key);
  int t = cv_field(c, key);
  if (t == LUA_TTABLE) {
    lua_Integer n = (lua_Integer)lua_rawlen(c->L, -1);
    for (lua_Integer i = 1; i <= n; i++) {
      cv_pushi(c, i);
      if (lua_rawgeti(c->L, -1, i) == LUA_TTABLE) f(c);
      else CV_ERR(c, "expected a table");
      lua_pop(c->L, 1);
      cv_pop(c);
    }
  } else if (t != LUA_TNIL) {
    CV_ERR(c, "expected a list of tables");
  }
  lua_pop(c->L, 1);
  cv_pop(c);
}

int eqpi_stage_from_table(eqp_ctx *ctx, eqpi_stage *st, lua_State *L, int idx,
                          const eqpi_lines *lines, const char *file)
{
  static const char *const keys[] = {"system", "about", "sources", "size_source",
                                     "params_source", "species", "acids", "reactions",
                                     "reagents", "interactions", "buffers", "gases",
                                     "solids", "measured", NULL};
  idx = lua_absindex(L, idx);
  conv c = {ctx, st, L, lines, idx, NULL, {0}, {{0}}, 0, 0, NULL, NULL, {0, NAN, NAN, NULL, NULL}};
  int before = st->nerr;
  int top = lua_gettop(L);
  c.file = eqpi_arena_strdup(ctx, &st->arena, file);
  if (!c.file) return EQP_E_NOMEM;
  if (!lua_istable(L, idx)) {
    eqpi_stage_error(st, file, eqpi_lines_at(lines, L, idx, NULL, 0),
                     "the file must return a table");
    return EQP_E_DATA;
  }
  lua_pushvalue(L, idx);
  cv_keys(&c, keys, 0);
  if (raw_field(L, -1, "sources") == LUA_TTABLE) c.sources = lua_gettop(L);
  else if (!lua_isnil(L, -1)) { cv_push(&c, "sources"); CV_ERR(&c, "expected a table"); cv_pop(&c); }
  if (!c.sources) lua_pop(L, 1);
  lua_pushvalue(L, idx);
  cv_string(&c, "system", 0);
  c.size_source = cv_source(&c, "size_source", 0);
  c.params_source = cv_source(&c, "params_source", 0);
  cv_measured(&c, &c.measured);
  cv_list(&c, "species", cv_species);
  cv_list(&c, "acids", cv_acid);
  cv_list(&c, "reactions", cv_reaction);
  cv_list(&c, "reagents", cv_reagent);
  cv_list(&c, "interactions", cv_interaction);
  cv_list(&c, "buffers", cv_buffer);
  cv_list(&c, "gases", cv_gas);
  cv_list(&c, "solids", cv_solid);
  lua_settop(L, top);
  return st->nerr > before ? EQP_E_DATA : EQP_OK;
}
