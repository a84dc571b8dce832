/* The command's side of the configuration: the engine's log on stderr at
** the level the options and the environment ask for, and the library's
** default configuration (the documented environment variables). */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <stdio.h>
#include <stdlib.h>

static void log_stderr(void *ud, int level, const char *msg)
{
  (void)ud;
  fprintf(stderr, "equipoise: %s%s\n", level == EQP_LOG_WARN ? "warning: " : "", msg);
}

/* --trace or EQUIPOISE_TRACE: every line down to the solver's trace;
** --verbose or EQUIPOISE_VERBOSE: what was loaded and the plugins' lines;
** otherwise warnings and errors. */
int cli_configure(eqp_ctx *ctx, int verbose, int trace)
{
  const char *t = getenv("EQUIPOISE_TRACE"), *v = getenv("EQUIPOISE_VERBOSE");
  int level = EQP_LOG_WARN;
  if (verbose || (v && *v)) level = EQP_LOG_INFO;
  if (trace || (t && *t)) level = EQP_LOG_TRACE;
  eqp_ctx_set_log(ctx, log_stderr, NULL, level);
  return eqp_ctx_default_config(ctx);
}
