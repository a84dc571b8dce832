/* What a script prints, as it happens: print and io.write to stdout, into
** the document (--json) or as records (--jsonl), each record written and
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
  } else if (st->run->json && st->stray) {
    /* where fd 1 goes too: the lines keep their order with what child
    ** processes write, and cost no memory until the document is written */
    fflush(stdout);
    fwrite(s, 1, len, st->stray);
    fflush(st->stray);
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
