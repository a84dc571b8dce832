/* Status names, the context's error message, the library's version. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <stdio.h>

const char *eqp_status_name(int status)
{
  switch (status) {
#define EQP_X_NAME(name, value, text) case value: return #name;
    EQP_STATUS_LIST(EQP_X_NAME)
#undef EQP_X_NAME
  }
  return "EQP_UNKNOWN_STATUS";
}

const char *eqp_status_str(int status)
{
  switch (status) {
#define EQP_X_STR(name, value, text) case value: return text;
    EQP_STATUS_LIST(EQP_X_STR)
#undef EQP_X_STR
  }
  return "unknown status";
}

int eqpi_vfail(eqp_ctx *ctx, int status, const char *fmt, va_list ap)
{
  if (ctx) {
    vsnprintf(ctx->errmsg, sizeof ctx->errmsg, fmt, ap);
    ctx->errcode = status;
  }
  return status;
}

int eqpi_fail(eqp_ctx *ctx, int status, const char *fmt, ...)
{
  va_list ap;
  va_start(ap, fmt);
  eqpi_vfail(ctx, status, fmt, ap);
  va_end(ap);
  return status;
}

const char *eqp_ctx_errmsg(const eqp_ctx *ctx)
{
  return ctx ? ctx->errmsg : "no context";
}

int eqp_ctx_errcode(const eqp_ctx *ctx)
{
  return ctx ? ctx->errcode : EQP_E_ARG;
}

void eqp_ctx_clear_error(eqp_ctx *ctx)
{
  if (ctx) {
    ctx->errmsg[0] = '\0';
    ctx->errcode = EQP_OK;
  }
}

const char *eqp_version(void) { return EQP_VERSION_STRING; }

int eqp_version_number(void) { return EQP_VERSION_NUMBER; }
