/* Ideal solution: every activity coefficient is 1. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>

static int ideal_create(const eqp_host_api *host, void **state, char *err, size_t errlen)
{
  *state = NULL;
  return 0;
}

static void ideal_destroy(const eqp_host_api *host, void *state) {}

static int ideal_log_gamma(void *state, const eqp_activity_in *in, double *lg,
                           char *err, size_t errlen)
{
  for (size_t i = 0; i < in->n; i++) lg[i] = 0.0;
  return 0;
}

static int ideal_dI(void *state, const eqp_activity_in *in, double *dlg, char *err,
                    size_t errlen)
{
  for (size_t i = 0; i < in->n; i++) dlg[i] = 0.0;
  return 0;
}

static const eqp_activity_ops ideal_ops = {
  sizeof(eqp_activity_ops), ideal_create, ideal_destroy, ideal_log_gamma, NULL, NULL, ideal_dI,
  NULL,
};

static const eqp_plugin_desc ideal_desc = {
  EQP_PLUGIN_ABI_VERSION, sizeof(eqp_plugin_desc), EQP_PLUGIN_SIZES,
  EQP_PLUGIN_ACTIVITY, "ideal", "1.0",
  "ideal solution: all activity coefficients 1 (exact only as I -> 0)",
  &ideal_ops, 0.0,
};

EQP_PLUGIN_DEFINE(ideal_desc)
