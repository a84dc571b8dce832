/* Debye-Hueckel limiting law (P. Debye, E. Hueckel, Phys. Z. 24, 185 (1923)):
** log10 g = -A z^2 sqrt(I). Valid only for very dilute solutions, I below
** about 0.005 mol/kg (W. Stumm, J. J. Morgan, Aquatic Chemistry, 3rd ed.,
** Wiley 1996: I < 10^-2.3). */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include <math.h>

static int ll_create(const eqp_host_api *host, void **state, char *err, size_t errlen)
{
  *state = NULL;
  return 0;
}

static void ll_destroy(const eqp_host_api *host, void *state) {}

static int ll_log_gamma(void *state, const eqp_activity_in *in, double *lg, char *err,
                        size_t errlen)
{
  double f = -in->A * sqrt(in->ionic_strength);
  for (size_t i = 0; i < in->n; i++) lg[i] = f * in->charge[i] * in->charge[i];
  return 0;
}

/* d log10 g / dI = -A z^2 / (2 sqrt(I)) */
static int ll_dI(void *state, const eqp_activity_in *in, double *dlg, char *err, size_t errlen)
{
  double f = -in->A * 0.5 / sqrt(in->ionic_strength);
  for (size_t i = 0; i < in->n; i++) dlg[i] = f * in->charge[i] * in->charge[i];
  return 0;
}

static const eqp_activity_ops ll_ops = {
  sizeof(eqp_activity_ops), ll_create, ll_destroy, ll_log_gamma, NULL, NULL, ll_dI, NULL,
};

static const eqp_plugin_desc ll_desc = {
  EQP_PLUGIN_ABI_VERSION, sizeof(eqp_plugin_desc), EQP_PLUGIN_SIZES,
  EQP_PLUGIN_ACTIVITY, "dh-limiting", "1.0",
  "Debye-Hueckel limiting law; usual range I <= 0.005 mol/kg",
  &ll_ops, 0.005,
};

EQP_PLUGIN_DEFINE(ll_desc)
