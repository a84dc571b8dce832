/* The equipoise command: shared declarations. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_CLI_IMPL_H
#define EQP_CLI_IMPL_H

#include <equipoise/equipoise.h>
#include "../limits_impl.h"
#include "../lua/lua_impl.h"
#include <lua.h>
#include <stdio.h>

/* Documented exit codes (docs/equipoise.1, docs/user-guide.md). */
enum {
  EXIT_OK = 0,
  EXIT_SCRIPT = 1,     /* Lua syntax or runtime error in the script */
  EXIT_USAGE = 2,      /* bad command line, unreadable script */
  EXIT_INPUT = 3,      /* bad value: unknown reagent or species, unit, amount */
  EXIT_DATA = 4,       /* malformed or unreadable species data */
  EXIT_CONVERGE = 5,   /* no convergence, or balances that did not close */
  EXIT_PLUGIN = 6,     /* activity model missing or refused */
  EXIT_NOMEM = 7,      /* the system ran out of memory */
  EXIT_STEPS = 8,      /* the script's instruction limit was reached */
  EXIT_MEMLIMIT = 9,   /* the script's memory limit was reached */
  EXIT_REFUSED = 10,   /* the sandbox refused a call, a module or a path */
  EXIT_WRITE = 11      /* an output file could not be written */
};

#define CLI_DEFAULT_STEPS 1000000000LL          /* instructions */
#define CLI_DEFAULT_MEMORY ((size_t)1 << 30)    /* bytes */
#define CLI_MAX_DIRS 16

/* Version of the --json document's layout (docs/json-output.md): bumped
** when a key changes meaning or goes away. */
#define CLI_JSON_SCHEMA_VERSION 1

int cli_exit_code(int status);
/* The engine's log on stderr: warnings, plus what was loaded with verbose
** (or EQUIPOISE_VERBOSE), plus the solver's trace with trace (or
** EQUIPOISE_TRACE); and the default configuration (the environment's
** species and plugin paths). Returns its status (config.c). */
int cli_configure(eqp_ctx *ctx, int verbose, int trace);
/* The usage lines, printed with every usage error. */
extern const char cli_usage[];
/* equipoise species list | show | check (species_cmd.c). */
int cli_species(int argc, char **argv);

typedef struct cli_run {
  const char *script;
  int json, jsonl;             /* one document at the end / one line per event */
  int verbose, trusted;
  long long max_steps;         /* 0: no limit */
  size_t max_memory;           /* bytes; 0: no limit */
  int trace;                   /* --trace: the solver's progress on stderr */
  const char **param_names, **param_values;
  int nparams;
  const char *write_dirs[CLI_MAX_DIRS];   /* --allow-write */
  int nwrite_dirs;
  const char *report;          /* --report FILE.html, or NULL */
} cli_run;

/* A set of strings (copies), in order of insertion. */
typedef struct cli_strings {
  char **item;                    /* in order */
  size_t n, cap;
  char **slot;                    /* open addressing over item's strings */
  size_t nslot;
} cli_strings;

/* Add s (copied) unless present: 1 added, 0 present, -1 out of memory. */
int cli_strings_add(cli_strings *set, const char *s);
void cli_strings_free(cli_strings *set);

#define CLI_KEEP_RESULTS 256      /* results kept for the provenance of their constants */

/* What the run made, as the engine's observer tells of it (observe.c):
** only what this run's output needs is kept. */
typedef struct cli_record {
  /* --json: each result and curve as text, written as it is made (with its
  ** "where"), so that the document costs no memory however many there are;
  ** each a temporary file, or NULL (then kept in results, curves) */
  FILE *spill[2];
  size_t nspill[2];
  void *results, *curves;         /* cJSON arrays (--json) when no file could be made */
  size_t nresults, ncurves;       /* made so far */
  eqp_result *kept[CLI_KEEP_RESULTS];   /* copies, for the provenance (--json, --jsonl) */
  size_t nkept;
  cli_strings species;            /* names of every species a result held (provenance) */
  cli_strings reagents;           /* library names of the reagents used (--report) */
  double temps[16];               /* distinct temperatures of the results, K (provenance) */
  size_t ntemps;
  cli_strings seen;               /* "where\nkind\nskeleton" of warnings shown */
  cli_strings warnings;           /* "where: text", each kind once per line */
  cli_strings cautions;           /* texts, once per reagent */
} cli_record;

/* Everything one run of a script needs; there is one per process. */
typedef struct cli_state {
  const cli_run *run;
  lua_State *L;
  eqpi_limits lim;
  eqpl_host_alloc engine_alloc;   /* the engine's memory goes through lim too */
  FILE *doc;                      /* the document: the real stdout */
  FILE *stray;                    /* JSON modes: what others wrote to fd 1 */
  eqp_ctx *ctx;                   /* the module's context, once it is open */
  cli_record rec;
  char script_dir[4096];
  char read_roots[CLI_MAX_DIRS + 6][4096];
  char write_roots[CLI_MAX_DIRS + 1][4096];
  int nread, nwrite;
} cli_state;

extern cli_state *cli_current;

/* run.c: run the script, report, return the exit code. */
int cli_run_script(const cli_run *run);
/* The document of a run that could not start (usage error), in JSON modes. */
void cli_report_usage(const cli_run *run, int code, const char *error);

/* sandbox.c: the script's environment (sandboxed, or the full library with
** --trusted); runs under lua_pcall. */
void cli_open_environment(lua_State *L, cli_state *st);
/* Raise a refusal of the sandbox, remembered for the exit code. */
int cli_refuse(lua_State *L, const char *fmt, ...);

/* paths.c: which folders a sandboxed script may read and write. */
void cli_paths_init(cli_state *st);
/* A C function (path, "r"|"w") -> path to use; raises a refusal. */
int cli_path_check(lua_State *L);
/* Whether path (resolved) lies in one of the roots; for require. */
int cli_path_inside(const char *path, const char *root);

/* output.c: what the script prints, and what the run makes, as it happens. */
int cli_print(lua_State *L);
/* io.write (returns its upvalue, io.stdout, if any) and io.stdout:write. */
int cli_write(lua_State *L);
int cli_write_method(lua_State *L);
/* Write one JSON Lines record (takes ownership of o) and flush it. */
void cli_emit(cli_state *st, void *cjson_object);

/* observe.c: register the run's observer on the module's context ctx. */
void cli_observe_attach(cli_state *st, eqp_ctx *ctx);
/* Free what the observer kept. */
void cli_record_free(cli_record *rec);

/* report.c: warnings, cautions, the JSON document and the closing record. */
void cli_report_text(cli_state *st);
void cli_report_json(cli_state *st, int code, const char *error);
void cli_report_summary(cli_state *st, int code, const char *error);
/* The start record of a streamed run. */
void cli_report_start(cli_state *st);
/* A result or a curve as a JSON object (cJSON *), for the document and the
** stream; NULL when memory is exhausted. */
void *cli_result_json(const eqp_result *r);
void *cli_curve_json(const eqp_curve *c);
/* A JSON string (cJSON *) of len bytes: NUL and invalid UTF-8 become U+FFFD. */
void *cli_json_bytes(const char *s, size_t len);
/* Write the JSON text and a newline to f in one write(2), with any invalid
** UTF-8 replaced by U+FFFD. */
void cli_put_json_line(FILE *f, const char *text);

/* s (len bytes) to f with invalid UTF-8 replaced by U+FFFD, and indent
** (if not NULL) after each newline. */
void cli_put_clean(FILE *f, const char *s, size_t len, const char *indent);

/* The caution of each hazardous reagent the run used, in order; calls f. */
void cli_each_caution(cli_state *st, void (*f)(void *, const char *), void *ud);

/* Record every call of the module and of solution and curve methods, and
** printed lines, for the report (journal.c). */
void cli_journal_install(lua_State *L);
/* A progress line on stderr for long operations, when stderr is a terminal. */
void cli_progress_attach(lua_State *L);
/* Write the HTML report of a finished run to run->report (report_html.c). */
int cli_write_report(cli_state *st, int exit_code, const char *error);
/* equipoise plot ... (plot_cmd.c) */
int cli_plot(int argc, char **argv);

#endif
