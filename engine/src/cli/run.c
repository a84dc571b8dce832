/* equipoise run: the script in its environment and under its limits, run as
** a coroutine so that after any error its stack still says where it was;
** then the report, whatever happened. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <ctype.h>
#include <fcntl.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

/* JSON modes: the document goes to a copy of fd 1; fd 1 itself, where the
** script's libraries and any child process write, goes to a temporary file
** whose text joins the document's output. */
static void open_output(cli_state *st)
{
  st->doc = stdout;
  if (!st->run->json && !st->run->jsonl) {
    setvbuf(stdout, NULL, _IOLBF, 0);   /* printed lines survive a kill */
    return;
  }
  fflush(stdout);
  int fd = dup(1);
  FILE *doc = fd >= 0 ? fdopen(fd, "w") : NULL;
  if (!doc) {
    if (fd >= 0) close(fd);
    return;
  }
  st->doc = doc;
  st->stray = tmpfile();
  /* fd 1 and the stream share one file: both write at its end */
  if (st->stray) fcntl(fileno(st->stray), F_SETFL, fcntl(fileno(st->stray), F_GETFL) | O_APPEND);
  int target = st->stray ? fileno(st->stray) : open("/dev/null", O_WRONLY);
  if (target >= 0) dup2(target, 1);
  if (!st->stray && target >= 0) close(target);
}

static void close_output(cli_state *st)
{
  fflush(stdout);
  if (st->doc != stdout) fclose(st->doc);
  if (st->stray) fclose(st->stray);
}

/* The panic handler: nothing protected is running; say so and stop. */
static int on_panic(lua_State *L)
{
  (void)L;
  cli_state *st = cli_current;
  if (st && (st->run->json || st->run->jsonl))
    fprintf(st->doc, "{%s\"status\":\"error\",\"exit_code\":%d,\"error\":\"out of memory\"}\n",
            st->run->jsonl ? "\"type\":\"summary\"," : "", EXIT_NOMEM);
  else
    fputs("equipoise: out of memory\n", stderr);
  fflush(NULL);
  _exit(EXIT_NOMEM);
}

/* Under lua_pcall: the environment, the observer of what the engine makes,
** the script loaded as text, and the thread it will run in (left on the
** stack). */
static int setup(lua_State *L)
{
  cli_state *st = lua_touserdata(L, 1);
  cli_open_environment(L, st);
  eqp_ctx *ctx = eqp_lua_context(L);   /* the module's: its log on stderr */
  if (ctx) cli_configure(ctx, st->run->verbose, st->run->trace);
  cli_observe_attach(st, ctx);
  cli_progress_attach(L);
  if (st->run->report) cli_journal_install(L);
  lua_State *co = lua_newthread(L);
  int rc = luaL_loadfilex(co, st->run->script, "t");
  if (rc != LUA_OK) {
    lua_xmove(co, L, 1);
    lua_pushinteger(L, rc);
    lua_setfield(L, LUA_REGISTRYINDEX, "equipoise.loadstatus");
    return lua_error(L);
  }
  return 1;
}

/* Whether msg starts with "something:LINE:" (it says where it happened). */
static int has_location(const char *msg)
{
  for (const char *p = msg; *p && *p != '\n'; p++)
    if (p[0] == ':' && isdigit((unsigned char)p[1])) {
      const char *q = p + 1;
      while (isdigit((unsigned char)*q)) q++;
      if (*q == ':') return 1;
    }
  return 0;
}

static int registry_equals(lua_State *L, const char *key, const char *msg)
{
  lua_getfield(L, LUA_REGISTRYINDEX, key);
  int same = lua_isstring(L, -1) && strcmp(lua_tostring(L, -1), msg) == 0;
  lua_pop(L, 1);
  return same;
}

/* The engine status behind msg, if the bindings raised it. */
static int engine_status(lua_State *L, const char *msg)
{
  int status = 1;
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_LASTERR) == LUA_TTABLE) {
    lua_rawgeti(L, -1, 1);
    lua_rawgeti(L, -2, 2);
    if (lua_isstring(L, -2) && strcmp(lua_tostring(L, -2), msg) == 0)
      status = (int)lua_tointeger(L, -1);
    lua_pop(L, 2);
  }
  lua_pop(L, 1);
  return status;
}

/* Exit code and message of a script that failed in co with status. */
static int classify(cli_state *st, lua_State *co, int status, char *msg, size_t len)
{
  lua_State *L = st->L;
  eqpi_limits *lim = &st->lim;
  char where[300];
  eqpi_lua_where(co, where, sizeof where);
  const char *text = lua_type(co, -1) == LUA_TSTRING || lua_type(co, -1) == LUA_TNUMBER
                   ? lua_tostring(co, -1) : NULL;
  int memerr = status == LUA_ERRMEM || (text && strcmp(text, "not enough memory") == 0);
  if (!lim->tripped && memerr && lim->refusals && !lim->oom) lim->tripped = EQPI_TRIP_MEMORY;
  if (lim->tripped) {
    if (!lim->where[0]) snprintf(lim->where, sizeof lim->where, "%.255s", where);
    eqpi_limits_message(lim, msg, len);
    return lim->tripped == EQPI_TRIP_STEPS ? EXIT_STEPS : EXIT_MEMLIMIT;
  }
  int engine = text ? engine_status(L, text) : 1;
  if (memerr || engine == EQP_E_NOMEM) {
    snprintf(msg, len, "%s%sout of memory: the system refused an allocation (the script's "
             "memory limit was not reached)", where, where[0] ? ": " : "");
    return EXIT_NOMEM;
  }
  if (!text) {
    snprintf(msg, len, "%s%s(error object is a %s value)", where, where[0] ? ": " : "",
             luaL_typename(co, -1));
    return EXIT_SCRIPT;
  }
  if (has_location(text) || !where[0]) snprintf(msg, len, "%s", text);
  else snprintf(msg, len, "%s: %s", where, text);
  if (registry_equals(L, "equipoise.refused", text)) return EXIT_REFUSED;
  return engine < 0 ? cli_exit_code(engine) : EXIT_SCRIPT;
}

/* The script could not be loaded, or the environment not made. */
static int classify_setup(cli_state *st, int status, char *msg, size_t len)
{
  lua_State *L = st->L;
  const char *text = lua_tostring(L, -1);
  lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.loadstatus");
  int load = lua_isinteger(L, -1) ? (int)lua_tointeger(L, -1) : LUA_OK;
  lua_pop(L, 1);
  snprintf(msg, len, "%s", text ? text : "cannot start the script");
  if (status == LUA_ERRMEM || load == LUA_ERRMEM) {
    snprintf(msg, len, "%s: out of memory while loading the script", st->run->script);
    return st->lim.refusals && !st->lim.oom ? EXIT_MEMLIMIT : EXIT_NOMEM;
  }
  if (load == LUA_ERRFILE) return EXIT_USAGE;
  if (text && strstr(text, "binary chunk")) {
    snprintf(msg, len, "%s: a binary chunk is not accepted: run the Lua source text",
             st->run->script);
    return EXIT_REFUSED;
  }
  if (load != LUA_OK) return EXIT_SCRIPT;
  int engine = engine_status(L, text ? text : "");
  if (engine < 0) return cli_exit_code(engine);
  return text && strstr(text, "out of memory") ? EXIT_NOMEM : EXIT_SCRIPT;
}

static void report(cli_state *st, int code, const char *msg, const char *trace)
{
  if (st->run->jsonl) {
    cli_report_summary(st, code, msg);
  } else if (st->run->json) {
    cli_report_json(st, code, msg);
  } else {
    if (msg) fprintf(stderr, "equipoise: %s\n", trace ? trace : msg);
    cli_report_text(st);
  }
}

/* Run the script's thread; its exit code, the message in msg and, with
** --verbose, a stack trace. */
static int run_thread(cli_state *st, lua_State *co, char *msg, size_t len, const char **trace)
{
  lua_State *L = st->L;
  int nres, code = EXIT_OK;
  /* the count hook costs every instruction a check: none without a limit */
  if (st->run->max_steps) eqpi_limits_hook(co, eqpi_limits_hookfn, 0);
  st->lim.L = co;
  int status = lua_resume(co, L, 0, &nres);
  lua_sethook(co, NULL, 0, 0);
  if (status == LUA_YIELD) {
    snprintf(msg, len, "%s: the script yielded outside a coroutine", st->run->script);
    code = EXIT_SCRIPT;
  } else if (status != LUA_OK) {
    code = classify(st, co, status, msg, len);
    if (st->run->verbose) {
      static char tb[8192];
      luaL_traceback(L, co, msg, 0);
      snprintf(tb, sizeof tb, "%s", lua_tostring(L, -1));
      *trace = tb;
      lua_pop(L, 1);
    }
  }
  /* the script's own data goes before the report is made: out of memory,
  ** the report still needs some */
  lua_settop(L, 0);
  lua_gc(L, LUA_GCCOLLECT);
  return code;
}

static void init_state(cli_state *st, const cli_run *run)
{
  memset(st, 0, sizeof *st);
  st->run = run;
  eqpi_limits_init(&st->lim, NULL, NULL, run->max_memory, run->max_steps);
  st->lim.steps_hint = "raise it with --max-instructions N, or 0 for no limit";
  st->lim.mem_hint = "raise it with --max-memory SIZE such as 4G, or 0 for no limit";
  st->engine_alloc.fn = eqpi_limits_engine_alloc;
  st->engine_alloc.ud = &st->lim;
  const char *slash = run->script ? strrchr(run->script, '/') : NULL;   /* none: a usage error */
  if (slash && slash == run->script) snprintf(st->script_dir, sizeof st->script_dir, "/");
  else if (slash) snprintf(st->script_dir, sizeof st->script_dir, "%.*s",
                           (int)(slash - run->script), run->script);
  else snprintf(st->script_dir, sizeof st->script_dir, ".");
  cli_current = st;
}

void cli_report_usage(const cli_run *run, int code, const char *error)
{
  static cli_state st;
  init_state(&st, run);
  st.doc = stdout;
  if (run->jsonl) cli_report_start(&st);
  report(&st, code, error, NULL);
}

int cli_run_script(const cli_run *run)
{
  static cli_state st;   /* one run per process; the hooks find it through cli_current */
  static char msg[4096];
  init_state(&st, run);
  open_output(&st);
  cli_paths_init(&st);
  if (run->jsonl) cli_report_start(&st);
  lua_State *L = st.L = lua_newstate(eqpi_limits_lua_alloc, &st.lim);
  /* A script makes a result per solve and mostly drops it at once: the
  ** generational collector frees such young objects while their memory is
  ** still in the cache (a warm solve through the command: about 7 % less
  ** time than with the incremental collector, memory as flat) */
  if (L) lua_gc(L, LUA_GCGEN, 0, 0);
  if (!L) {   /* not even an empty Lua state fits */
    int code = st.lim.refusals && !st.lim.oom ? EXIT_MEMLIMIT : EXIT_NOMEM;
    if (code == EXIT_MEMLIMIT) {
      st.lim.tripped = EQPI_TRIP_MEMORY;
      eqpi_limits_message(&st.lim, msg, sizeof msg);
    }
    st.lim.max_mem = 0;
    report(&st, code, code == EXIT_MEMLIMIT ? msg : "out of memory", NULL);
    close_output(&st);
    return code;
  }
  lua_atpanic(L, on_panic);
  int code = EXIT_OK;
  const char *err = NULL, *trace = NULL;
  lua_pushcfunction(L, setup);
  lua_pushlightuserdata(L, &st);
  int status = lua_pcall(L, 1, 1, 0);
  if (status != LUA_OK) {
    code = classify_setup(&st, status, msg, sizeof msg);
    err = msg;
  } else {
    code = run_thread(&st, lua_tothread(L, -1), msg, sizeof msg, &trace);
    err = code == EXIT_OK ? NULL : msg;
  }
  st.lim.max_mem = 0;   /* the report is not the script: no cap on it */
  report(&st, code, err, trace);
  if (run->report && cli_write_report(&st, code, err) < 0 && code == EXIT_OK)
    code = EXIT_WRITE;
  cli_record_free(&st.rec);   /* its results belong to the context the state frees */
  lua_close(L);
  st.L = NULL;
  close_output(&st);
  return code;
}
