/* Species files run as Lua text in an empty sandbox: base, math, string,
** table and utf8 only, under the limits of limits.c: an instruction budget
** that also counts work inside C functions (pattern matching, string.rep)
** and that pcall cannot catch, and a memory cap.
**
** Line numbers come from Lua itself while the file runs. The allocator is
** told when Lua makes a table (its osize is LUA_TTABLE then; limits.c
** passes it on); the count hook,
** called before every instruction, takes the current line of the first
** instruction after that (lua_getinfo): the line of the table's first field,
** which is where an entry is written. The hook also gives the table a
** metatable whose __newindex records the line of each named field set on
** another line and then sets it raw, so a table behaves as without it. The
** loader asks for the line of a path (eqpi_lines_at). This works as well
** for tables a file builds with code as for a plain table constructor. */
/* SPDX-License-Identifier: MIT */
#include "stage_impl.h"
#include "limits_impl.h"
#include <lauxlib.h>
#include <lua.h>
#include <lualib.h>
#include <stdio.h>
#include <string.h>

#define uthash_malloc(sz) eqpi_malloc(ix_ctx, sz)
#define uthash_free(ptr, sz) eqpi_free(ix_ctx, ptr, sz)
#define HASH_NONFATAL_OOM 1
#define uthash_nonfatal_oom(obj) (ix_oom = 1)
#include <uthash.h>

#define SANDBOX_MEM (32u << 20)       /* bytes a species file may allocate */
#define SANDBOX_STEPS 20000000L       /* VM instructions (and work charged) before we give up */
#define SANDBOX_CPU 5.0               /* seconds: a backstop for work nothing counts */
#define COUNT_EVERY 1000              /* instructions between the limits' counts */
#define MAX_PENDING 16                /* tables made by one instruction */

/* A table the file made: its lines, and a generation that tells it from
** an earlier table at the same address. */
typedef struct tab_rec {
  const void *t;
  unsigned gen;
  int made;             /* line of the instruction that made it */
  int first;            /* line of the instruction after: its first field */
  UT_hash_handle hh;
} tab_rec;

/* A named field set on a line of its own: key is the table's generation,
** a type letter and the name or the integer. */
typedef struct field_rec {
  int line;
  size_t len;
  UT_hash_handle hh;
  char key[];
} field_rec;

struct eqpi_lines {
  eqp_ctx *ctx;
  tab_rec *tabs;
  field_rec *fields;
  unsigned gen;
  const void *pending[MAX_PENDING];
  int pending_made[MAX_PENDING];
  int npending;
};

typedef struct sandbox {
  eqpi_limits lim;      /* first: the allocator's ud is the sandbox */
  eqp_ctx *ctx;
  lua_State *L;
  int count;            /* instructions since the limits last counted */
  int tracking;         /* the file is running: record its tables */
  eqpi_lines lines;
} sandbox;

/* ------------------------------------------------------------ records */

static tab_rec *find_tab(const eqpi_lines *ln, const void *t)
{
  tab_rec *r = NULL;
  HASH_FIND_PTR(ln->tabs, &t, r);
  return r;
}

static void put_tab(eqpi_lines *ln, const void *t, int made, int first)
{
  eqp_ctx *ix_ctx = ln->ctx;
  int ix_oom = 0;
  tab_rec *r = find_tab(ln, t);
  if (!r) {
    if (!(r = eqpi_malloc(ln->ctx, sizeof *r))) return;    /* a line less, no more */
    r->t = t;
    HASH_ADD_PTR(ln->tabs, t, r);
    if (ix_oom) {
      eqpi_free(ln->ctx, r, sizeof *r);
      return;
    }
  }
  r->gen = ++ln->gen;      /* a new table, maybe where a collected one was */
  r->made = made;
  r->first = first;
}

/* The key of field k (a string or an integer) of the table of generation gen. */
static size_t field_key(char *buf, size_t len, unsigned gen, const char *s, lua_Integer i)
{
  memcpy(buf, &gen, sizeof gen);
  size_t n = sizeof gen;
  buf[n++] = s ? 's' : 'i';
  if (s) {
    size_t l = strlen(s);
    if (l > len - n) l = len - n;
    memcpy(buf + n, s, l);
    return n + l;
  }
  memcpy(buf + n, &i, sizeof i);
  return n + sizeof i;
}

static const field_rec *find_field(const eqpi_lines *ln, unsigned gen, const char *s,
                                   lua_Integer i)
{
  char key[256];
  size_t len = field_key(key, sizeof key, gen, s, i);
  field_rec *r = NULL;
  HASH_FIND(hh, ln->fields, key, len, r);
  return r;
}

static void put_field(eqpi_lines *ln, unsigned gen, const char *s, lua_Integer i, int line)
{
  char key[256];
  size_t len = field_key(key, sizeof key, gen, s, i);
  field_rec *r = NULL;
  HASH_FIND(hh, ln->fields, key, len, r);
  if (r) {
    r->line = line;
    return;
  }
  eqp_ctx *ix_ctx = ln->ctx;
  int ix_oom = 0;
  if (!(r = eqpi_malloc(ln->ctx, sizeof *r + len))) return;
  r->line = line;
  r->len = len;
  memcpy(r->key, key, len);
  HASH_ADD_KEYPTR(hh, ln->fields, r->key, len, r);
  if (ix_oom) eqpi_free(ln->ctx, r, sizeof *r + len);
}

static void lines_free(eqpi_lines *ln)
{
  eqp_ctx *ix_ctx = ln->ctx;
  tab_rec *t, *tt;
  HASH_ITER(hh, ln->tabs, t, tt) {
    HASH_DELETE(hh, ln->tabs, t);
    eqpi_free(ln->ctx, t, sizeof *t);
  }
  field_rec *f, *ft;
  HASH_ITER(hh, ln->fields, f, ft) {
    HASH_DELETE(hh, ln->fields, f);
    eqpi_free(ln->ctx, f, sizeof *f + f->len);
  }
  (void)ix_ctx;
}

int eqpi_lines_at(const eqpi_lines *ln, lua_State *L, int root, const char *const *path,
                  int depth)
{
  if (!ln || !lua_checkstack(L, 2)) return 0;
  int top = lua_gettop(L);
  lua_pushvalue(L, root);
  const tab_rec *t = lua_istable(L, -1) ? find_tab(ln, lua_topointer(L, -1)) : NULL;
  int best = t ? t->made : 0;           /* the returned table: the line of 'return' */
  for (int d = 0; d < depth && t && lua_istable(L, -1); d++) {
    const char *k = path[d], *e = k;
    while (*e >= '0' && *e <= '9') e++;
    int pos = *k && !*e;
    lua_Integer i = 0;
    for (e = k; pos && *e; e++) i = i * 10 + (*e - '0');
    const field_rec *f = pos ? find_field(ln, t->gen, NULL, i) : find_field(ln, t->gen, k, 0);
    if (pos) lua_rawgeti(L, -1, i);
    else {
      lua_pushstring(L, k);
      lua_rawget(L, -2);
    }
    lua_remove(L, -2);
    if (lua_isnil(L, -1)) break;        /* not there: the nearest part that is */
    const tab_rec *v = lua_istable(L, -1) ? find_tab(ln, lua_topointer(L, -1)) : NULL;
    int line = v ? v->first : f ? f->line : t->first;
    if (line > 0) best = line;
    t = v;
  }
  lua_settop(L, top);
  return best;
}

/* ------------------------------------------------------------ running */

/* Lua made an object: a table made while the file runs is noted, with the
** line of the instruction that made it (the running function's). */
static void on_object(void *ud, void *p, int type)
{
  sandbox *sb = ud;
  if (type != LUA_TTABLE || !sb->tracking || sb->lines.npending >= MAX_PENDING) return;
  lua_Debug ar;
  int line = 0;
  if (lua_getstack(sb->L, 0, &ar) && lua_getinfo(sb->L, "l", &ar)) line = ar.currentline;
  sb->lines.pending[sb->lines.npending] = p;
  sb->lines.pending_made[sb->lines.npending++] = line;
}

/* The tables made by the last instruction: their lines, and the metatable
** that records their fields (found among the registers of the running
** function; a table made by a C function is there by now too). */
static void resolve_pending(lua_State *L, lua_Debug *ar, sandbox *sb)
{
  eqpi_lines *ln = &sb->lines;
  int line = lua_getinfo(L, "l", ar) ? ar->currentline : 0;
  for (int k = 0; k < ln->npending; k++) {
    put_tab(ln, ln->pending[k], ln->pending_made[k], line);
    const char *name;
    for (int n = 1; (name = lua_getlocal(L, ar, n)); n++) {
      int found = lua_istable(L, -1) && lua_topointer(L, -1) == ln->pending[k];
      if (found && !lua_getmetatable(L, -1)) {
        lua_rawgetp(L, LUA_REGISTRYINDEX, sb);
        lua_setmetatable(L, -2);
      } else if (found) {
        lua_pop(L, 1);                  /* one of its own: left alone */
      }
      lua_pop(L, 1);
      if (found) break;
    }
  }
  ln->npending = 0;
}

/* Called before every instruction: the limits count every COUNT_EVERY of
** them (every one, once a limit is reached), the tables are resolved at
** once. */
static void sandbox_hook(lua_State *L, lua_Debug *ar)
{
  sandbox *sb = (sandbox *)eqpi_limits_of(L);
  if (ar->event == LUA_HOOKCOUNT && (sb->lim.tripped || ++sb->count >= COUNT_EVERY)) {
    sb->lim.steps += sb->count > 1 ? sb->count - 1 : 0;  /* on_count adds one: the hook's count */
    sb->count = 0;
    eqpi_limits_on_count(L, &sb->lim, ar);
  }
  if (sb->lines.npending) resolve_pending(L, ar, sb);
}

/* __newindex of the file's tables: the line of a field set on another line
** than its table's first field, then the field itself, raw. */
static int record_field(lua_State *L)
{
  sandbox *sb = lua_touserdata(L, lua_upvalueindex(1));
  lua_Debug ar;
  const tab_rec *t = find_tab(&sb->lines, lua_topointer(L, 1));
  int isname = lua_type(L, 2) == LUA_TSTRING, isint = lua_isinteger(L, 2) && !lua_istable(L, 3);
  if (t && (isname || isint) && lua_getstack(L, 1, &ar) && lua_getinfo(L, "l", &ar) &&
      ar.currentline > 0 && ar.currentline != t->first)
    put_field(&sb->lines, t->gen, isname ? lua_tostring(L, 2) : NULL,
              isint ? lua_tointeger(L, 2) : 0, ar.currentline);
  lua_settop(L, 3);
  lua_rawset(L, 1);
  return 0;
}

/* An environment with only harmless functions: no I/O, no loading, no os. */
static void sandbox_env(lua_State *L)
{
  static const char *const base[] = {"assert", "error", "ipairs", "next", "pairs",
                                     "select", "tonumber", "tostring", "type",
                                     "rawequal", "rawget", "rawlen", "pcall", NULL};
  static const char *const libs[] = {"math", "string", "table", "utf8", NULL};
  lua_newtable(L);
  for (int i = 0; base[i]; i++) {
    lua_getglobal(L, base[i]);
    lua_setfield(L, -2, base[i]);
  }
  for (int i = 0; libs[i]; i++) {
    lua_getglobal(L, libs[i]);
    lua_setfield(L, -2, libs[i]);
  }
}

typedef struct run_args {
  eqp_ctx *ctx;
  eqpi_stage *st;
  const char *text, *source;
  size_t len;
  sandbox *sb;
  int rc;
  const char *const *path;  /* for eqpi_lines_of_text: look this up instead of staging */
  int depth;
} run_args;

/* Everything that touches the Lua state runs here, under lua_pcall, so an
** allocation failure or a limit becomes an error message, never a panic. */
static int sandbox_run(lua_State *L)
{
  run_args *a = lua_touserdata(L, 1);
  luaL_requiref(L, "_G", luaopen_base, 1);
  luaL_requiref(L, "math", luaopen_math, 1);
  luaL_requiref(L, "string", luaopen_string, 1);
  luaL_requiref(L, "table", luaopen_table, 1);
  luaL_requiref(L, "utf8", luaopen_utf8, 1);
  lua_settop(L, 0);
  eqpi_limits_wrap_libs(L, eqpi_limits_of(L));
  lua_newtable(L);                              /* the metatable of the file's tables */
  lua_pushlightuserdata(L, a->sb);
  lua_pushcclosure(L, record_field, 1);
  lua_setfield(L, -2, "__newindex");
  lua_rawsetp(L, LUA_REGISTRYINDEX, a->sb);
  char chunk[512];
  snprintf(chunk, sizeof chunk, "@%s", a->source);
  if (luaL_loadbufferx(L, a->text, a->len, chunk, "t") != LUA_OK) return lua_error(L);
  sandbox_env(L);
  lua_setupvalue(L, -2, 1);
  lua_sethook(L, sandbox_hook, LUA_MASKCOUNT, 1);
  a->sb->lim.L = L;
  a->sb->tracking = 1;
  lua_call(L, 0, 1);
  a->sb->tracking = 0;
  a->sb->lines.npending = 0;
  lua_sethook(L, NULL, 0, 0);
  if (a->depth >= 0)
    a->rc = eqpi_lines_at(&a->sb->lines, L, lua_gettop(L), a->path, a->depth);
  else
    a->rc = eqpi_stage_from_table(a->ctx, a->st, L, -1, &a->sb->lines, a->source);
  return 0;
}

/* Run text; stage its table, or with depth >= 0 give the line of path. */
static int run(eqp_ctx *ctx, eqpi_stage *st, const char *text, size_t len, const char *source,
               const char *const *path, int depth)
{
  sandbox sb;
  memset(&sb, 0, sizeof sb);
  eqpi_limits_init(&sb.lim, ctx->alloc, ctx->ud, SANDBOX_MEM, SANDBOX_STEPS);
  sb.lim.steps_hint = "the limit for a species file: a species file only returns a table";
  sb.lim.mem_hint = "the limit for a species file";
  sb.lim.max_cpu = SANDBOX_CPU;
  sb.lim.on_object = on_object;
  sb.lim.on_object_ud = &sb;
  sb.ctx = ctx;
  sb.lines.ctx = ctx;
  lua_State *L = lua_newstate(eqpi_limits_lua_alloc, &sb.lim);
  if (!L) {
    if (st) eqpi_stage_error(st, source, 0, "out of memory");
    return st ? EQP_E_NOMEM : -1;
  }
  sb.L = L;
  run_args a = {ctx, st, text, source, len, &sb, EQP_E_DATA, path, depth};
  lua_pushcfunction(L, sandbox_run);
  lua_pushlightuserdata(L, &a);
  int status = lua_pcall(L, 1, 0, 0);
  if (status != LUA_OK) {
    const char *msg = lua_tostring(L, -1);
    char buf[600];
    eqpi_limits *lim = &sb.lim;
    if (!lim->tripped && status == LUA_ERRMEM && lim->refusals && !lim->oom)
      lim->tripped = EQPI_TRIP_MEMORY;
    if (lim->tripped) {
      eqpi_limits_message(lim, buf, sizeof buf);
      msg = buf;
    }
    if (!msg) msg = "error while running the file";
    if (!st) {
      lua_close(L);
      lines_free(&sb.lines);
      return -1;
    }
    /* Lua prefixes most errors with "file:line:"; memory errors it does not */
    if (strncmp(msg, source, strlen(source)) == 0) eqpi_stage_error(st, NULL, 0, "%s", msg);
    else eqpi_stage_error(st, source, 0, "%s", msg);
    a.rc = status == LUA_ERRMEM && lim->oom && !lim->tripped ? EQP_E_NOMEM : EQP_E_DATA;
  }
  sb.tracking = 0;
  lua_close(L);
  lines_free(&sb.lines);
  return a.rc;
}

int eqpi_stage_text(eqp_ctx *ctx, eqpi_stage *st, const char *text, size_t len,
                    const char *source)
{
  return run(ctx, st, text, len, source, NULL, -1);
}

int eqpi_lines_of_text(eqp_ctx *ctx, const char *text, size_t len, const char *const *path,
                       int depth)
{
  return run(ctx, NULL, text, len, "(text)", path, depth < 0 ? 0 : depth);
}
