/* The host's observer: callbacks registered on the context, told of each
** result, curve, reagent, warning and caution as it is made. The engine
** keeps nothing for it: a host keeps what it copies. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <string.h>

int eqp_ctx_set_observer(eqp_ctx *ctx, const eqp_observer *obs, void *ud)
{
  if (!ctx) return EQP_E_ARG;
  memset(&ctx->obs, 0, sizeof ctx->obs);
  ctx->obs_ud = NULL;
  if (!obs) return EQP_OK;
  /* a smaller, older struct leaves the callbacks it does not have NULL */
  int rc = eqpi_opts_read(ctx, "eqp_observer", obs, &ctx->obs, sizeof ctx->obs,
                          EQPI_OBSERVER_0_1);
  if (rc < 0) {
    memset(&ctx->obs, 0, sizeof ctx->obs);
    return rc;
  }
  ctx->obs_ud = ud;
  return EQP_OK;
}

void eqpi_observe_result(eqp_ctx *ctx, const eqp_result *r)
{
  if (ctx->obs.on_result) ctx->obs.on_result(ctx->obs_ud, r);
}

void eqpi_observe_curve(eqp_ctx *ctx, const eqp_curve *c)
{
  if (ctx->obs.on_curve) ctx->obs.on_curve(ctx->obs_ud, c);
}

void eqpi_observe_reagent(eqp_ctx *ctx, const char *reagent)
{
  if (ctx->obs.on_reagent_used) ctx->obs.on_reagent_used(ctx->obs_ud, reagent);
}

void eqpi_observe_caution(eqp_ctx *ctx, const char *reagent, const char *text)
{
  if (ctx->obs.on_caution) ctx->obs.on_caution(ctx->obs_ud, reagent, text);
}
