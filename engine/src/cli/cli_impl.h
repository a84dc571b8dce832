/* The equipoise command: shared declarations. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_CLI_IMPL_H
#define EQP_CLI_IMPL_H

#include <equipoise/equipoise.h>
#include <lua.h>

/* Documented exit codes (docs/equipoise.1, docs/user-guide.md). */
enum {
  EXIT_OK = 0,
  EXIT_SCRIPT = 1,     /* Lua syntax or runtime error in the script */
  EXIT_USAGE = 2,      /* bad command line, unreadable script */
  EXIT_INPUT = 3,      /* bad value: unknown reagent or species, unit, amount */
  EXIT_DATA = 4,       /* malformed or unreadable species data */
  EXIT_CONVERGE = 5,   /* no convergence, or balances that did not close */
  EXIT_PLUGIN = 6,     /* activity model missing or refused */
  EXIT_NOMEM = 7
};

/* Version of the --json document's layout (docs/json-output.md): bumped
** when a key changes meaning or goes away. */
#define CLI_JSON_SCHEMA_VERSION 1

int cli_exit_code(int status);
/* The usage lines, printed with every usage error. */
extern const char cli_usage[];
/* equipoise species list | show | check (species_cmd.c). */
int cli_species(int argc, char **argv);

typedef struct cli_run {
  const char *script;
  int json;
  int verbose;
  const char **param_names, **param_values;
  int nparams;
  const char *report;  /* --report FILE.html, or NULL */
} cli_run;

int cli_run_script(const cli_run *run);
/* Write the JSON document of a run (results in the registry log). */
void cli_write_json(lua_State *L, const cli_run *run, int exit_code, const char *error,
                    lua_State *printed);
/* Print cautions and warnings of a finished run to stderr (text mode). */
void cli_report_text(lua_State *L);
/* Collect a standard caution for each hazardous reagent used; calls f. */
void cli_each_caution(lua_State *L, void (*f)(void *, const char *), void *ud);

/* Record every call of the module and of solution and curve methods, and
** printed lines, for the report (journal.c). */
void cli_journal_install(lua_State *L);
/* A progress line on stderr for long operations, when stderr is a terminal. */
void cli_progress_attach(lua_State *L);
/* Write the HTML report of a finished run to run->report (report_html.c). */
int cli_write_report(lua_State *L, const cli_run *run, int exit_code, const char *error);
/* equipoise plot ... (plot_cmd.c) */
int cli_plot(int argc, char **argv);

#endif
