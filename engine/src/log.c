/* The context's log: diagnostics go to a callback the program sets, never
** to stderr from inside the library. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <stdio.h>

void eqp_ctx_set_log(eqp_ctx *ctx, eqp_log_fn fn, void *ud, int max_level)
{
  if (!ctx) return;
  ctx->log_fn = fn;
  ctx->log_ud = ud;
  ctx->log_level = fn ? max_level : 0;
}

const char *eqp_log_level_name(int level)
{
  static const char *const names[] = {"error", "warn", "info", "debug", "trace"};
  return level >= EQP_LOG_ERROR && level <= EQP_LOG_TRACE ? names[level - 1] : "?";
}

void eqpi_vlog(eqp_ctx *ctx, int level, const char *fmt, va_list ap)
{
  if (!eqpi_log_on(ctx, level)) return;
  char buf[1024];
  vsnprintf(buf, sizeof buf, fmt, ap);
  ctx->log_fn(ctx->log_ud, level, buf);
}

void eqpi_log(eqp_ctx *ctx, int level, const char *fmt, ...)
{
  va_list ap;
  va_start(ap, fmt);
  eqpi_vlog(ctx, level, fmt, ap);
  va_end(ap);
}
