/* What a script prints and what a run makes, as it happens: print and
** io.write to stdout, into the document (--json) or as records (--jsonl);
** each new result and curve (the module tells us, eqpl_log) located at the
** script's line, its warnings shown once, and, when streaming, written and
** flushed at once. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <cjson/cJSON.h>
#include <string.h>

#define OUTPUT "equipoise.output"   /* registry: chunks printed, --json */

cli_state *cli_current;

/* One piece of the script's output, wherever this run sends it. */
static void put_output(lua_State *L, const char *s, size_t len)
{
  cli_state *st = cli_current;
  if (st->run->jsonl) {
    cJSON *o = cJSON_CreateObject();
    cJSON_AddStringToObject(o, "type", "output");
    cJSON_AddItemToObject(o, "text", cli_json_bytes(s, len));
    cli_emit(st, o);
  } else if (st->run->json) {
    luaL_getsubtable(L, LUA_REGISTRYINDEX, OUTPUT);
    lua_pushlstring(L, s, len);
    lua_rawseti(L, -2, (lua_Integer)lua_rawlen(L, -2) + 1);
    lua_pop(L, 1);
  } else {
    fwrite(s, 1, len, stdout);
  }
}

int cli_print(lua_State *L)
{
  int n = lua_gettop(L);
  luaL_Buffer b;
  luaL_buffinit(L, &b);
  for (int i = 1; i <= n; i++) {
    if (i > 1) luaL_addchar(&b, '\t');
    luaL_tolstring(L, i, NULL);
    luaL_addvalue(&b);
  }
  luaL_addchar(&b, '\n');
  luaL_pushresult(&b);
  size_t len;
  const char *s = lua_tolstring(L, -1, &len);
  put_output(L, s, len);
  return 0;
}

/* Strings and numbers from index first on, as io.write writes them. */
static void write_args(lua_State *L, int first)
{
  int n = lua_gettop(L);
  for (int i = first; i <= n; i++) {
    size_t len;
    const char *s;
    char num[64];
    if (lua_type(L, i) == LUA_TNUMBER) {
      len = lua_isinteger(L, i)
          ? (size_t)snprintf(num, sizeof num, LUA_INTEGER_FMT, (LUAI_UACINT)lua_tointeger(L, i))
          : (size_t)snprintf(num, sizeof num, LUA_NUMBER_FMT, (LUAI_UACNUMBER)lua_tonumber(L, i));
      s = num;
    } else {
      s = luaL_checklstring(L, i, &len);
    }
    put_output(L, s, len);
  }
}

int cli_write(lua_State *L)
{
  write_args(L, 1);
  if (lua_type(L, lua_upvalueindex(1)) == LUA_TNONE) return 0;
  lua_pushvalue(L, lua_upvalueindex(1));
  return 1;
}

int cli_write_method(lua_State *L)
{
  write_args(L, 2);
  lua_settop(L, 1);
  return 1;
}

void cli_emit(cli_state *st, void *object)
{
  cJSON *o = object;
  char *text = o ? cJSON_PrintUnformatted(o) : NULL;
  cli_put_json_line(st->doc, text ? text : "{\"type\":\"error\",\"text\":\"out of memory\"}");
  cJSON_free(text);
  cJSON_Delete(o);
}

/* A new record {type, index, where, ...fields of body}. */
static void emit_entry(cli_state *st, const char *type, size_t index, const char *where,
                       cJSON *body)
{
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "type", type);
  cJSON_AddNumberToObject(o, "index", (double)index);
  cJSON_AddStringToObject(o, "where", where);
  while (body && body->child) {
    cJSON *item = body->child;
    const char *key = item->string;
    cJSON_DetachItemViaPointer(body, item);
    cJSON_AddItemToObject(o, key, item);   /* copies key, then frees the item's old one */
  }
  cJSON_Delete(body);
  cli_emit(st, o);
}

static void warn_once(lua_State *L, cli_state *st, const char *where, const char *text)
{
  lua_rawgeti(L, LUA_REGISTRYINDEX, st->seen_ref);
  lua_pushfstring(L, "%s\n%s", where, text);
  if (lua_rawget(L, -2) == LUA_TNIL) {
    lua_pushfstring(L, "%s\n%s", where, text);
    lua_pushboolean(L, 1);
    lua_rawset(L, -4);
    if (st->run->jsonl) {
      cJSON *o = cJSON_CreateObject();
      cJSON_AddStringToObject(o, "type", "warning");
      cJSON_AddStringToObject(o, "where", where);
      cJSON_AddStringToObject(o, "text", text);
      cli_emit(st, o);
    } else if (!st->run->json) {
      fprintf(stderr, "warning: %s%s%s\n", where, *where ? ": " : "", text);
    }
  }
  lua_pop(L, 2);
}

/* Where a result was made is looked up (it costs a walk of the stack) only
** when something needs it: the JSON modes, or a warning to show. */
static void observe_results(lua_State *L, cli_state *st, size_t n)
{
  eqp_ctx *ctx = st->run->jsonl ? cli_ctx(L) : NULL;
  int record = st->run->json || st->run->jsonl, located = 0;
  char where[300] = "";
  for (size_t i = st->nresults + 1; i <= n; i++) {
    lua_rawgeti(L, -1, (lua_Integer)i);
    eqpl_result *u = luaL_testudata(L, -1, EQPL_RESULT);
    lua_pop(L, 1);
    size_t nwarn = u && u->r ? eqp_result_warning_count(u->r) : 0;
    if (!record && nwarn == 0) continue;
    if (!located++) eqpi_lua_where(L, where, sizeof where);
    if (record) {
      lua_rawgeti(L, LUA_REGISTRYINDEX, st->where_ref);
      lua_pushstring(L, where);
      lua_rawseti(L, -2, (lua_Integer)i);
      lua_pop(L, 1);
    }
    if (st->run->jsonl && u && u->r)
      emit_entry(st, "result", i, where, cli_result_json(u->r, ctx));
    for (size_t w = 0; w < nwarn; w++) warn_once(L, st, where, eqp_result_warning(u->r, w));
  }
  st->nresults = n;
}

static void observe_curves(lua_State *L, cli_state *st, size_t n)
{
  char where[300];
  if (st->run->json || st->run->jsonl) eqpi_lua_where(L, where, sizeof where);
  for (size_t i = st->ncurves + 1; i <= n && (st->run->json || st->run->jsonl); i++) {
    lua_rawgeti(L, LUA_REGISTRYINDEX, st->cwhere_ref);
    lua_pushstring(L, where);
    lua_rawseti(L, -2, (lua_Integer)i);
    lua_pop(L, 1);
    if (!st->run->jsonl) continue;
    lua_rawgeti(L, -1, (lua_Integer)i);
    eqpl_curve *u = luaL_testudata(L, -1, EQPL_CURVE);
    lua_pop(L, 1);
    char *text = u && u->c ? eqp_curve_to_json(u->c) : NULL;
    cJSON *body = text ? cJSON_Parse(text) : NULL;
    eqp_free_string(text);
    if (body) emit_entry(st, "curve", i, where, body);
  }
  st->ncurves = n;
}

void cli_observe(lua_State *L, cli_state *st)
{
  if (st->log_ref == LUA_NOREF) return;
  lua_rawgeti(L, LUA_REGISTRYINDEX, st->log_ref);
  size_t n = lua_rawlen(L, -1);
  if (n > st->nresults) observe_results(L, st, n);
  lua_pop(L, 1);
  lua_rawgeti(L, LUA_REGISTRYINDEX, st->curves_ref);
  n = lua_rawlen(L, -1);
  if (n > st->ncurves) observe_curves(L, st, n);
  lua_pop(L, 1);
}
/* EQPL_HOOKS.logged: the module has just logged a result or a curve. */
int cli_logged(lua_State *L)
{
  cli_observe(L, cli_current);
  eqpi_limits_collect(L, &cli_current->lim);
  return 0;
}
