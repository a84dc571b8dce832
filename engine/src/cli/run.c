/* equipoise run: execute an experiment script with the module preloaded. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include "../lua/lua_impl.h"
#include <lualib.h>
#include <stdio.h>
#include <string.h>

#define EXITKEY "equipoise.exitcode"

/* Message handler: classify the error while its message is still the one the
** engine raised, then add a stack trace if asked. */
static int on_error(lua_State *L)
{
  const char *msg = lua_tostring(L, 1);
  if (!msg) msg = luaL_tolstring(L, 1, NULL);
  int code = EXIT_SCRIPT;
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_LASTERR) == LUA_TTABLE) {
    lua_rawgeti(L, -1, 1);
    lua_rawgeti(L, -2, 2);
    if (lua_isstring(L, -2) && strcmp(lua_tostring(L, -2), msg) == 0)
      code = cli_exit_code((int)lua_tointeger(L, -1));
    lua_pop(L, 2);
  }
  lua_pop(L, 1);
  lua_pushinteger(L, code);
  lua_setfield(L, LUA_REGISTRYINDEX, EXITKEY);
  lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.verbose");
  int verbose = lua_toboolean(L, -1);
  lua_pop(L, 1);
  if (verbose) luaL_traceback(L, L, msg, 1);
  else lua_pushstring(L, msg);
  return 1;
}

/* In --json mode print() lines are kept for the document. */
static int captured_print(lua_State *L)
{
  int n = lua_gettop(L);
  luaL_Buffer b;
  luaL_buffinit(L, &b);
  for (int i = 1; i <= n; i++) {
    size_t len;
    const char *s = luaL_tolstring(L, i, &len);
    if (i > 1) luaL_addchar(&b, '\t');
    luaL_addlstring(&b, s, len);
    lua_pop(L, 1);
  }
  luaL_pushresult(&b);
  lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.output");
  lua_pushvalue(L, -2);
  lua_rawseti(L, -2, (lua_Integer)lua_rawlen(L, -2) + 1);
  return 0;
}

static void set_params(lua_State *L, const cli_run *run)
{
  lua_createtable(L, 0, run->nparams);
  for (int i = 0; i < run->nparams; i++) {
    lua_pushstring(L, run->param_values[i]);
    lua_setfield(L, -2, run->param_names[i]);
  }
  lua_setglobal(L, "params");
}

int cli_run_script(const cli_run *run)
{
  lua_State *L = luaL_newstate();
  if (!L) return EXIT_NOMEM;
  luaL_openlibs(L);
  luaL_getsubtable(L, LUA_REGISTRYINDEX, LUA_PRELOAD_TABLE);
  lua_pushcfunction(L, luaopen_equipoise);
  lua_setfield(L, -2, "equipoise");
  lua_pop(L, 1);
  lua_pushboolean(L, run->verbose);
  lua_setfield(L, LUA_REGISTRYINDEX, "equipoise.verbose");
  lua_newtable(L);
  lua_setfield(L, LUA_REGISTRYINDEX, "equipoise.output");
  int code = EXIT_OK;
  const char *err = NULL;
  lua_pushcfunction(L, on_error);
  int handler = lua_gettop(L);
  lua_getglobal(L, "require");
  lua_pushstring(L, "equipoise");
  if (lua_pcall(L, 1, 1, handler) != LUA_OK) {
    err = lua_tostring(L, -1);
    code = EXIT_NOMEM;
    goto report;
  }
  lua_setglobal(L, "eq");
  set_params(L, run);
  if (run->json) {
    lua_pushcfunction(L, captured_print);
    lua_setglobal(L, "print");
  }
  cli_progress_attach(L);
  if (run->report) cli_journal_install(L);
  int lrc = luaL_loadfilex(L, run->script, "t");
  if (lrc != LUA_OK) {
    err = lua_tostring(L, -1);
    code = lrc == LUA_ERRFILE ? EXIT_USAGE : EXIT_SCRIPT;
    goto report;
  }
  if (lua_pcall(L, 0, 0, handler) != LUA_OK) {
    err = lua_tostring(L, -1);
    lua_getfield(L, LUA_REGISTRYINDEX, EXITKEY);
    code = lua_isinteger(L, -1) ? (int)lua_tointeger(L, -1) : EXIT_SCRIPT;
    lua_pop(L, 1);
  }
report:
  fflush(stdout);   /* whatever the script printed stays printed */
  if (run->json) {
    cli_write_json(L, run, code, err, NULL);
  } else {
    if (err) fprintf(stderr, "equipoise: %s\n", err);
    cli_report_text(L);
  }
  if (run->report && cli_write_report(L, run, code, err) < 0 && code == EXIT_OK)
    code = EXIT_DATA;
  fflush(stdout);
  lua_close(L);
  return code;
}
