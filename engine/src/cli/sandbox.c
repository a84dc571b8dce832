/* The environment of an experiment script. Sandboxed (the default): the
** base, string, table, math and utf8 libraries, a few harmless os calls,
** print and io.write, the engine's module, require of Lua files beside the
** script; text chunks only; the calls that do bulk work inside C charged to
** the instruction budget. With --trusted: the full standard library. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <lualib.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>

#define REFUSED "equipoise.refused"   /* registry: message of the last refusal */
#define REQUIRED "equipoise.required" /* registry: modules loaded beside the script */

int cli_refuse(lua_State *L, const char *fmt, ...)
{
  char where[300], msg[1536];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(msg, sizeof msg, fmt, ap);
  va_end(ap);
  eqpi_lua_where(L, where, sizeof where);
  if (where[0]) lua_pushfstring(L, "%s: %s", where, msg);
  else lua_pushstring(L, msg);
  lua_pushvalue(L, -1);
  lua_setfield(L, LUA_REGISTRYINDEX, REFUSED);
  return lua_error(L);
}

static const char hint[] = "run a script you trust with --trusted to allow it";

/* __index of the os, io, package, debug and coroutine tables: a clear refusal. */
static int refuse_field(lua_State *L)
{
  const char *lib = lua_tostring(L, lua_upvalueindex(1));
  const char *key = lua_type(L, 2) == LUA_TSTRING ? lua_tostring(L, 2) : "?";
  if (strcmp(lib, "os") == 0 && strcmp(key, "exit") == 0)
    return cli_refuse(L, "os.exit is not available to a sandboxed script: return from the "
                      "script, or raise an error with error()");
  return cli_refuse(L, "%s.%s is not available to a sandboxed script (%s)", lib, key, hint);
}

static int refuse_global(lua_State *L)
{
  return cli_refuse(L, "%s is not available to a sandboxed script (%s)",
                    lua_tostring(L, lua_upvalueindex(1)), hint);
}

/* Leaves at the top a table whose missing fields are refused. */
static void refusing_table(lua_State *L, const char *lib)
{
  lua_newtable(L);
  lua_createtable(L, 0, 2);
  lua_pushstring(L, lib);
  lua_pushcclosure(L, refuse_field, 1);
  lua_setfield(L, -2, "__index");
  lua_pushliteral(L, "locked");
  lua_setfield(L, -2, "__metatable");
  lua_setmetatable(L, -2);
}

static void set_refusal(lua_State *L, const char *name)
{
  lua_pushstring(L, name);
  lua_pushcclosure(L, refuse_global, 1);
  lua_setglobal(L, name);
}

/* load(chunk [, name [, mode [, env]]]): text only. Upvalue: the original. */
static int sandbox_load(lua_State *L)
{
  const char *mode = luaL_optstring(L, 3, "t");
  if (strchr(mode, 'b'))
    return cli_refuse(L, "load: binary chunks are not accepted from a sandboxed script");
  int n = lua_gettop(L) < 4 ? 3 : 4;
  lua_settop(L, n);
  lua_pushliteral(L, "t");
  lua_replace(L, 3);
  lua_pushvalue(L, lua_upvalueindex(1));
  lua_insert(L, 1);
  lua_call(L, n, LUA_MULTRET);
  return lua_gettop(L);
}

/* setmetatable without __gc: a finalizer runs where no limit can stop it. */
static int sandbox_setmetatable(lua_State *L)
{
  if (lua_type(L, 2) == LUA_TTABLE) {
    lua_pushliteral(L, "__gc");
    if (lua_rawget(L, 2) != LUA_TNIL)
      return cli_refuse(L, "setmetatable: __gc metamethods are not available to a sandboxed "
                        "script (%s)", hint);
    lua_pop(L, 1);
  }
  return lua_tocfunction(L, lua_upvalueindex(1))(L);
}

static int valid_module_name(const char *s)
{
  int part = 0;
  for (; *s; s++) {
    if (*s == '.') {
      if (!part) return 0;
      part = 0;
    } else if ((*s >= 'a' && *s <= 'z') || (*s >= 'A' && *s <= 'Z') || (*s >= '0' && *s <= '9') ||
               *s == '_' || *s == '-') {
      part++;
    } else {
      return 0;
    }
  }
  return part > 0;
}

/* require "equipoise", or a Lua file beside the script ("util" is util.lua,
** "lib.util" lib/util.lua), run as text in the same sandbox. */
static int sandbox_require(lua_State *L)
{
  cli_state *st = cli_current;
  const char *name = luaL_checkstring(L, 1);
  if (strcmp(name, "equipoise") == 0) {
    lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.module");
    return 1;
  }
  static const char *const std_ok[] = {"string", "table", "math", "utf8", NULL};
  static const char *const std_no[] = {"os", "io", "debug", "package", "coroutine", NULL};
  for (int i = 0; std_ok[i]; i++)
    if (strcmp(name, std_ok[i]) == 0) {
      lua_getglobal(L, name);
      return 1;
    }
  for (int i = 0; std_no[i]; i++)
    if (strcmp(name, std_no[i]) == 0)
      return cli_refuse(L, "require '%s': the %s library is not available to a sandboxed script "
                        "(%s)", name, name, hint);
  if (!valid_module_name(name))
    return cli_refuse(L, "require '%s': a sandboxed script may require only \"equipoise\" and "
                      "Lua files beside it, by name (%s)", name, hint);
  luaL_getsubtable(L, LUA_REGISTRYINDEX, REQUIRED);
  if (lua_getfield(L, -1, name) != LUA_TNIL) return 1;
  lua_pop(L, 1);
  luaL_Buffer b;
  luaL_buffinit(L, &b);
  luaL_addstring(&b, st->script_dir);
  luaL_addchar(&b, '/');
  for (const char *p = name; *p; p++) luaL_addchar(&b, *p == '.' ? '/' : *p);
  luaL_addstring(&b, ".lua");
  luaL_pushresult(&b);
  const char *path = lua_tostring(L, -1);
  char real[4096], root[4096];
  if (!realpath(path, real))
    return luaL_error(L, "module '%s' not found: no file %s beside the script (a sandboxed "
                      "script may require only Lua files beside it; C modules need --trusted)",
                      name, path);
  if (!realpath(st->script_dir, root) || !cli_path_inside(real, root))
    return cli_refuse(L, "require '%s': %s leads outside the script's folder (%s)", name, path,
                      hint);
  if (luaL_loadfilex(L, real, "t") != LUA_OK) return lua_error(L);
  lua_pushstring(L, name);
  lua_pushvalue(L, -3);
  lua_call(L, 2, 1);
  if (lua_isnil(L, -1)) {
    lua_pop(L, 1);
    lua_pushboolean(L, 1);
  }
  lua_pushvalue(L, -1);
  lua_setfield(L, -4, name);
  return 1;
}

/* Under --trusted os.exit still ends the run with its report: the document
** is written before the process exits with the script's code. */
static int trusted_exit(lua_State *L)
{
  int code = lua_isboolean(L, 1) ? (lua_toboolean(L, 1) ? EXIT_SUCCESS : EXIT_FAILURE)
                                 : (int)luaL_optinteger(L, 1, EXIT_SUCCESS);
  cli_state *st = cli_current;
  char msg[400];
  char where[300];
  eqpi_lua_where(L, where, sizeof where);
  snprintf(msg, sizeof msg, "%s%sthe script called os.exit(%d)", where, where[0] ? ": " : "", code);
  lua_sethook(L, NULL, 0, 0);
  lua_sethook(st->L, NULL, 0, 0);
  st->lim.max_mem = 0;
  if (st->run->jsonl) cli_report_summary(st, code, code ? msg : NULL);
  else if (st->run->json) cli_report_json(st, code, code ? msg : NULL);
  else cli_report_text(st);
  fflush(NULL);
  exit(code);
}

static void open_trusted(lua_State *L, cli_state *st)
{
  luaL_openlibs(L);
  luaL_getsubtable(L, LUA_REGISTRYINDEX, LUA_PRELOAD_TABLE);
  lua_pushcfunction(L, luaopen_equipoise);
  lua_setfield(L, -2, "equipoise");
  lua_pop(L, 1);
  lua_getglobal(L, "package");
  lua_pushfstring(L, "%s/?.lua;", st->script_dir);
  lua_getfield(L, -2, "path");
  lua_concat(L, 2);
  lua_setfield(L, -2, "path");
  lua_pop(L, 1);
  lua_getglobal(L, "os");
  lua_pushcfunction(L, trusted_exit);
  lua_setfield(L, -2, "exit");
  lua_pop(L, 1);
  if (st->run->json || st->run->jsonl) {   /* what the script prints goes into the document */
    lua_pushcfunction(L, cli_print);
    lua_setglobal(L, "print");
    lua_getglobal(L, "io");
    lua_pushcfunction(L, cli_write);
    lua_setfield(L, -2, "write");
    lua_pop(L, 1);
  }
}

static void copy_field(lua_State *L, int from, const char *name)
{
  lua_getfield(L, from, name);
  lua_setfield(L, -2, name);
}

/* io: write, and stdout:write, flush; nothing that opens a file. */
static int no_op(lua_State *L) { (void)L; return 0; }

static void open_io(lua_State *L)
{
  refusing_table(L, "io");
  refusing_table(L, "io.stdout");
  lua_pushcfunction(L, cli_write_method);
  lua_setfield(L, -2, "write");
  lua_pushcfunction(L, no_op);
  lua_setfield(L, -2, "flush");
  lua_pushvalue(L, -1);
  lua_setfield(L, -3, "stdout");
  lua_pushcclosure(L, cli_write, 1);   /* io.write returns io.stdout, as in Lua */
  lua_setfield(L, -2, "write");
  lua_pushcfunction(L, no_op);
  lua_setfield(L, -2, "flush");
  lua_setglobal(L, "io");
}

static void open_os(lua_State *L)
{
  luaopen_os(L);
  int os = lua_gettop(L);
  refusing_table(L, "os");
  copy_field(L, os, "clock");
  copy_field(L, os, "time");
  copy_field(L, os, "date");
  copy_field(L, os, "difftime");
  lua_setglobal(L, "os");
  lua_settop(L, os - 1);
}

static void wrap_global(lua_State *L, const char *name, lua_CFunction f)
{
  lua_getglobal(L, name);
  lua_pushcclosure(L, f, 1);
  lua_setglobal(L, name);
}

static void open_sandbox(lua_State *L)
{
  luaL_requiref(L, LUA_GNAME, luaopen_base, 1);
  luaL_requiref(L, LUA_STRLIBNAME, luaopen_string, 1);
  luaL_requiref(L, LUA_TABLIBNAME, luaopen_table, 1);
  luaL_requiref(L, LUA_MATHLIBNAME, luaopen_math, 1);
  luaL_requiref(L, LUA_UTF8LIBNAME, luaopen_utf8, 1);
  lua_pop(L, 5);
  eqpi_limits_wrap_libs(L, eqpi_limits_of(L));
  lua_getglobal(L, "string");
  lua_pushnil(L);
  lua_setfield(L, -2, "dump");   /* binary chunks are refused anyway */
  lua_pop(L, 1);
  wrap_global(L, "load", sandbox_load);
  wrap_global(L, "setmetatable", sandbox_setmetatable);
  set_refusal(L, "dofile");
  set_refusal(L, "loadfile");
  lua_pushcfunction(L, cli_print);
  lua_setglobal(L, "print");
  lua_pushcfunction(L, sandbox_require);
  lua_setglobal(L, "require");
  open_io(L);
  open_os(L);
  static const char *const absent[] = {"package", "debug", "coroutine", NULL};
  for (int i = 0; absent[i]; i++) {
    refusing_table(L, absent[i]);
    lua_setglobal(L, absent[i]);
  }
  /* the command decides which files the module may read and write */
  lua_getfield(L, LUA_REGISTRYINDEX, EQPL_HOOKS);
  lua_pushcfunction(L, cli_path_check);
  lua_setfield(L, -2, "path");
  lua_pop(L, 1);
}

void cli_open_environment(lua_State *L, cli_state *st)
{
  lua_newtable(L);
  lua_pushlightuserdata(L, &st->engine_alloc);
  lua_setfield(L, -2, "alloc");
  lua_setfield(L, LUA_REGISTRYINDEX, EQPL_HOOKS);
  if (st->run->trusted) open_trusted(L, st);
  else open_sandbox(L);
  luaL_requiref(L, "equipoise", luaopen_equipoise, 0);
  lua_setglobal(L, "eq");
  lua_createtable(L, 0, st->run->nparams);
  for (int i = 0; i < st->run->nparams; i++) {
    lua_pushstring(L, st->run->param_values[i]);
    lua_setfield(L, -2, st->run->param_names[i]);
  }
  lua_setglobal(L, "params");
}
