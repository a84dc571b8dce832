/* string.find, match, gmatch and gsub for sandboxes, with every matching
** step charged to the instruction budget: a pattern that would backtrack for
** hours stops at the limit like any loop. The patterns are Lua 5.4's
** (reference manual, section 6.4.1), implemented here from the manual. */
/* SPDX-License-Identifier: MIT */
#define _GNU_SOURCE 1   /* memmem */
#include "limits_impl.h"
#include <ctype.h>
#include <lauxlib.h>
#include <string.h>

#define MAXCAPTURES 32
#define MAXDEPTH 200            /* nested pattern items before "too complex" */
#define CAP_UNFINISHED (-1)
#define CAP_POSITION (-2)
#define ESC '%'
#define SPECIALS "^$*+?.([%-"
#define STEP_BATCH 4096         /* steps between charges */

#define uchar(c) ((unsigned char)(c))

typedef struct mstate {
  const char *src, *src_end, *pat_end;
  lua_State *L;
  eqpi_limits *lim;
  long long steps;              /* not yet charged */
  int depth;
  int level;
  struct { const char *init; ptrdiff_t len; } cap[MAXCAPTURES];
} mstate;

static void tick(mstate *ms, long long n)
{
  ms->steps += n;
  if (ms->steps >= STEP_BATCH) {
    long long s = ms->steps;
    ms->steps = 0;
    eqpi_limits_charge(ms->L, ms->lim, s);
  }
}

static void settle(mstate *ms)
{
  long long s = ms->steps;
  ms->steps = 0;
  if (s) eqpi_limits_charge(ms->L, ms->lim, s);
}

static const char *class_end(mstate *ms, const char *p)
{
  char c = *p++;
  if (c == ESC) {
    if (p == ms->pat_end) luaL_error(ms->L, "malformed pattern (ends with '%%')");
    return p + 1;
  }
  if (c == '[') {
    if (*p == '^') p++;
    do {   /* the first character of a set is literal, even ']' */
      if (p == ms->pat_end) luaL_error(ms->L, "malformed pattern (missing ']')");
      c = *p++;
      if (c == ESC && p < ms->pat_end) p++;
    } while (*p != ']');
    return p + 1;
  }
  return p;
}

static int match_class(int c, int cl)
{
  int r;
  switch (tolower(cl)) {
  case 'a': r = isalpha(c); break;
  case 'c': r = iscntrl(c); break;
  case 'd': r = isdigit(c); break;
  case 'g': r = isgraph(c); break;
  case 'l': r = islower(c); break;
  case 'p': r = ispunct(c); break;
  case 's': r = isspace(c); break;
  case 'u': r = isupper(c); break;
  case 'w': r = isalnum(c); break;
  case 'x': r = isxdigit(c); break;
  default: return cl == c;
  }
  if (isupper(cl)) r = !r;
  return r != 0;
}

/* p at '[', ec at the closing ']' */
static int match_set(int c, const char *p, const char *ec)
{
  int yes = 1;
  if (*(p + 1) == '^') {
    yes = 0;
    p++;
  }
  while (++p < ec) {
    if (*p == ESC) {
      p++;
      if (match_class(c, uchar(*p))) return yes;
    } else if (*(p + 1) == '-' && p + 2 < ec) {
      p += 2;
      if (uchar(*(p - 2)) <= c && c <= uchar(*p)) return yes;
    } else if (uchar(*p) == c) {
      return yes;
    }
  }
  return !yes;
}

static int single(const mstate *ms, const char *s, const char *p, const char *ep)
{
  if (s >= ms->src_end) return 0;
  int c = uchar(*s);
  switch (*p) {
  case '.': return 1;
  case ESC: return match_class(c, uchar(*(p + 1)));
  case '[': return match_set(c, p, ep - 1);
  default: return uchar(*p) == c;
  }
}

static const char *match(mstate *ms, const char *s, const char *p);

static const char *balance(mstate *ms, const char *s, const char *p)
{
  if (p >= ms->pat_end - 1) luaL_error(ms->L, "malformed pattern (missing arguments to '%%b')");
  if (s >= ms->src_end || *s != *p) return NULL;
  int open = *p, close = *(p + 1), depth = 1;
  while (++s < ms->src_end) {
    tick(ms, 1);
    if (*s == close) {
      if (--depth == 0) return s + 1;
    } else if (*s == open) {
      depth++;
    }
  }
  return NULL;
}

static const char *expand_max(mstate *ms, const char *s, const char *p, const char *ep)
{
  ptrdiff_t i = 0;
  while (single(ms, s + i, p, ep)) {
    i++;
    tick(ms, 1);
  }
  for (; i >= 0; i--) {
    const char *r = match(ms, s + i, ep + 1);
    if (r) return r;
  }
  return NULL;
}

static const char *expand_min(mstate *ms, const char *s, const char *p, const char *ep)
{
  for (;;) {
    const char *r = match(ms, s, ep + 1);
    if (r) return r;
    if (!single(ms, s, p, ep)) return NULL;
    s++;
  }
}

static const char *open_capture(mstate *ms, const char *s, const char *p, ptrdiff_t what)
{
  if (ms->level >= MAXCAPTURES) luaL_error(ms->L, "too many captures");
  ms->cap[ms->level].init = s;
  ms->cap[ms->level].len = what;
  ms->level++;
  const char *r = match(ms, s, p);
  if (!r) ms->level--;
  return r;
}

static const char *close_capture(mstate *ms, const char *s, const char *p)
{
  int l = ms->level - 1;
  while (l >= 0 && ms->cap[l].len != CAP_UNFINISHED) l--;
  if (l < 0) luaL_error(ms->L, "invalid pattern capture");
  ms->cap[l].len = s - ms->cap[l].init;
  const char *r = match(ms, s, p);
  if (!r) ms->cap[l].len = CAP_UNFINISHED;
  return r;
}

static const char *back_reference(mstate *ms, const char *s, int digit)
{
  int l = digit - '1';
  if (l < 0 || l >= ms->level || ms->cap[l].len == CAP_UNFINISHED)
    luaL_error(ms->L, "invalid capture index %%%d", l + 1);
  size_t len = (size_t)ms->cap[l].len;
  if ((size_t)(ms->src_end - s) < len) return NULL;
  tick(ms, (long long)(len / 16));
  return memcmp(ms->cap[l].init, s, len) == 0 ? s + len : NULL;
}

static const char *frontier(mstate *ms, const char *s, const char **pp)
{
  const char *p = *pp + 2;
  if (*p != '[') luaL_error(ms->L, "missing '[' after '%%f' in pattern");
  const char *ep = class_end(ms, p);
  int prev = s == ms->src ? '\0' : uchar(*(s - 1));
  int cur = s < ms->src_end ? uchar(*s) : '\0';
  if (match_set(prev, p, ep - 1) || !match_set(cur, p, ep - 1)) return NULL;
  *pp = ep;
  return s;
}

/* One pattern item after another; the end of the match, or NULL. */
static const char *match(mstate *ms, const char *s, const char *p)
{
  if (ms->depth-- == 0) luaL_error(ms->L, "pattern too complex");
  while (s && p != ms->pat_end) {
    tick(ms, 1);
    if (*p == '(') {
      s = p[1] == ')' ? open_capture(ms, s, p + 2, CAP_POSITION)
                      : open_capture(ms, s, p + 1, CAP_UNFINISHED);
      break;
    }
    if (*p == ')') {
      s = close_capture(ms, s, p + 1);
      break;
    }
    if (*p == '$' && p + 1 == ms->pat_end) {
      s = s == ms->src_end ? s : NULL;
      break;
    }
    if (*p == ESC && p[1] == 'b') {
      if ((s = balance(ms, s, p + 2))) p += 4;
      continue;
    }
    if (*p == ESC && p[1] == 'f') {
      s = frontier(ms, s, &p);
      continue;
    }
    if (*p == ESC && isdigit(uchar(p[1]))) {
      if ((s = back_reference(ms, s, uchar(p[1])))) p += 2;
      continue;
    }
    const char *ep = class_end(ms, p);
    if (!single(ms, s, p, ep)) {
      if (*ep == '*' || *ep == '?' || *ep == '-') p = ep + 1;   /* zero repetitions */
      else s = NULL;
      continue;
    }
    if (*ep == '?') {
      const char *r = match(ms, s + 1, ep + 1);
      if (r) {
        s = r;
        break;
      }
      p = ep + 1;
    } else if (*ep == '+' || *ep == '*') {
      s = expand_max(ms, *ep == '+' ? s + 1 : s, p, ep);
      break;
    } else if (*ep == '-') {
      s = expand_min(ms, s, p, ep);
      break;
    } else {
      s++;
      p = ep;
    }
  }
  ms->depth++;
  return s;
}

static void push_capture(mstate *ms, int i, const char *s, const char *e)
{
  if (i >= ms->level) {
    if (i != 0) luaL_error(ms->L, "invalid capture index %%%d", i + 1);
    lua_pushlstring(ms->L, s, (size_t)(e - s));   /* no captures: the whole match */
    return;
  }
  ptrdiff_t l = ms->cap[i].len;
  if (l == CAP_UNFINISHED) luaL_error(ms->L, "unfinished capture");
  if (l == CAP_POSITION) lua_pushinteger(ms->L, (ms->cap[i].init - ms->src) + 1);
  else lua_pushlstring(ms->L, ms->cap[i].init, (size_t)l);
}

/* s NULL: only the explicit captures (find). */
static int push_captures(mstate *ms, const char *s, const char *e)
{
  int n = ms->level == 0 && s ? 1 : ms->level;
  luaL_checkstack(ms->L, n, "too many captures");
  for (int i = 0; i < n; i++) push_capture(ms, i, s, e);
  return n;
}

static void prepare(mstate *ms, lua_State *L, const char *s, size_t ls, const char *p, size_t lp)
{
  ms->L = L;
  ms->lim = lua_touserdata(L, lua_upvalueindex(1));
  ms->steps = 0;
  ms->src = s;
  ms->src_end = s + ls;
  ms->pat_end = p + lp;
}

static void restart(mstate *ms)
{
  ms->level = 0;
  ms->depth = MAXDEPTH;
}

/* A position argument: negative counts from the end; clamped to 1.. */
static size_t start_index(lua_State *L, int arg, size_t len)
{
  lua_Integer pos = luaL_optinteger(L, arg, 1);
  if (pos > 0) return (size_t)pos;
  if (pos == 0 || pos < -(lua_Integer)len) return 1;
  return len + (size_t)pos + 1;
}

static int no_specials(const char *p, size_t l)
{
  for (size_t i = 0; i < l; i++)
    if (p[i] && strchr(SPECIALS, p[i])) return 0;
  return 1;
}

static int find_or_match(lua_State *L, int find)
{
  size_t ls, lp;
  const char *s = luaL_checklstring(L, 1, &ls);
  const char *p = luaL_checklstring(L, 2, &lp);
  size_t init = start_index(L, 3, ls) - 1;
  mstate ms;
  prepare(&ms, L, s, ls, p, lp);
  if (init > ls) {
    luaL_pushfail(L);
    return 1;
  }
  if (find && (lua_toboolean(L, 4) || no_specials(p, lp))) {
    tick(&ms, (long long)((ls - init + lp) / 16));
    settle(&ms);
    const char *at = lp == 0 ? s + init : memmem(s + init, ls - init, p, lp);
    if (at) {
      lua_pushinteger(L, (at - s) + 1);
      lua_pushinteger(L, (lua_Integer)((size_t)(at - s) + lp));
      return 2;
    }
  } else {
    const char *s1 = s + init;
    int anchor = *p == '^';
    if (anchor) p++;   /* the end of the pattern stays where it was */
    do {
      restart(&ms);
      const char *e = match(&ms, s1, p);
      if (e) {
        settle(&ms);
        if (!find) return push_captures(&ms, s1, e);
        lua_pushinteger(L, (s1 - s) + 1);
        lua_pushinteger(L, e - s);
        return push_captures(&ms, NULL, NULL) + 2;
      }
    } while (s1++ < ms.src_end && !anchor);
    settle(&ms);
  }
  luaL_pushfail(L);
  return 1;
}

static int p_find(lua_State *L) { return find_or_match(L, 1); }
static int p_match(lua_State *L) { return find_or_match(L, 0); }

typedef struct gmatch_state {
  const char *src, *p, *last;
  mstate ms;
} gmatch_state;

/* Upvalues: the limits, the subject, the pattern, the state. */
static int gmatch_next(lua_State *L)
{
  gmatch_state *gm = lua_touserdata(L, lua_upvalueindex(4));
  gm->ms.L = L;
  for (const char *src = gm->src; src <= gm->ms.src_end; src++) {
    restart(&gm->ms);
    const char *e = match(&gm->ms, src, gm->p);
    if (e && e != gm->last) {
      settle(&gm->ms);
      gm->src = gm->last = e;
      return push_captures(&gm->ms, src, e);
    }
  }
  settle(&gm->ms);
  return 0;
}

static int p_gmatch(lua_State *L)
{
  size_t ls, lp;
  const char *s = luaL_checklstring(L, 1, &ls);
  const char *p = luaL_checklstring(L, 2, &lp);
  size_t init = start_index(L, 3, ls) - 1;
  if (init > ls) init = ls + 1;   /* past the end: no match */
  lua_settop(L, 2);
  gmatch_state *gm = lua_newuserdatauv(L, sizeof *gm, 0);
  prepare(&gm->ms, L, s, ls, p, lp);
  gm->src = s + init;
  gm->p = p;
  gm->last = NULL;
  lua_pushvalue(L, lua_upvalueindex(1));
  lua_insert(L, 1);
  lua_pushcclosure(L, gmatch_next, 4);
  return 1;
}

static void add_replacement_string(mstate *ms, luaL_Buffer *b, const char *s, const char *e)
{
  lua_State *L = ms->L;
  size_t l;
  const char *r = lua_tolstring(L, 3, &l), *p;
  while ((p = memchr(r, ESC, l)) != NULL) {
    luaL_addlstring(b, r, (size_t)(p - r));
    p++;
    if (*p == ESC) {
      luaL_addchar(b, *p);
    } else if (*p == '0') {
      luaL_addlstring(b, s, (size_t)(e - s));
    } else if (isdigit(uchar(*p))) {
      push_capture(ms, *p - '1', s, e);
      luaL_tolstring(L, -1, NULL);
      lua_remove(L, -2);
      luaL_addvalue(b);
    } else {
      luaL_error(L, "invalid use of '%c' in replacement string", ESC);
    }
    l -= (size_t)(p + 1 - r);
    r = p + 1;
  }
  luaL_addlstring(b, r, l);
}

/* Returns whether the match was replaced by something else. */
static int add_replacement(mstate *ms, luaL_Buffer *b, const char *s, const char *e, int type)
{
  lua_State *L = ms->L;
  if (type == LUA_TFUNCTION) {
    lua_pushvalue(L, 3);
    int n = push_captures(ms, s, e);
    lua_call(L, n, 1);
  } else if (type == LUA_TTABLE) {
    push_capture(ms, 0, s, e);
    lua_gettable(L, 3);
  } else {
    add_replacement_string(ms, b, s, e);
    return 1;
  }
  if (!lua_toboolean(L, -1)) {   /* nil or false: keep the original */
    lua_pop(L, 1);
    luaL_addlstring(b, s, (size_t)(e - s));
    return 0;
  }
  if (!lua_isstring(L, -1))
    return luaL_error(L, "invalid replacement value (a %s)", luaL_typename(L, -1));
  luaL_addvalue(b);
  return 1;
}

static int p_gsub(lua_State *L)
{
  size_t ls, lp;
  const char *src = luaL_checklstring(L, 1, &ls);
  const char *p = luaL_checklstring(L, 2, &lp);
  const char *last = NULL;
  int type = lua_type(L, 3);
  lua_Integer max_n = luaL_optinteger(L, 4, (lua_Integer)ls + 1), n = 0;
  int anchor = *p == '^', changed = 0;
  luaL_argexpected(L, type == LUA_TNUMBER || type == LUA_TSTRING || type == LUA_TFUNCTION ||
                   type == LUA_TTABLE, 3, "string/function/table");
  mstate ms;
  luaL_Buffer b;
  luaL_buffinit(L, &b);
  if (anchor) {
    p++;
    lp--;
  }
  prepare(&ms, L, src, ls, p, lp);
  while (n < max_n) {
    restart(&ms);
    const char *e = match(&ms, src, p);
    if (e && e != last) {
      n++;
      changed = add_replacement(&ms, &b, src, e, type) | changed;
      src = last = e;
    } else if (src < ms.src_end) {
      luaL_addchar(&b, *src++);
    } else {
      break;
    }
    if (anchor) break;
  }
  settle(&ms);
  if (!changed) {
    lua_pushvalue(L, 1);
  } else {
    luaL_addlstring(&b, src, (size_t)(ms.src_end - src));
    luaL_pushresult(&b);
  }
  lua_pushinteger(L, n);
  return 2;
}

void eqpi_patterns_register(lua_State *L, eqpi_limits *lim)
{
  static const luaL_Reg fns[] = {
    {"find", p_find}, {"match", p_match}, {"gmatch", p_gmatch}, {"gsub", p_gsub}, {NULL, NULL},
  };
  lua_pushlightuserdata(L, lim);
  luaL_setfuncs(L, fns, 1);
}
