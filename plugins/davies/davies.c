/* Davies activity model (C. W. Davies, Ion Association, Butterworths 1962):
** log10 g = -A z^2 ( sqrt(I)/(1+sqrt(I)) - c I ), c = 0.3 by default. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include "../common/host_mem.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

typedef struct davies_state {
  double c;              /* the linear coefficient; Davies 1962 gives 0.3 */
} davies_state;

static int davies_create(const eqp_host_api *host, void **state, char *err, size_t errlen)
{
  davies_state *st = eqp_plug_alloc(host, sizeof *st);
  if (!st) {
    snprintf(err, errlen, "davies: out of memory");
    return 1;
  }
  st->c = 0.3;
  *state = st;
  return 0;
}

static void davies_destroy(const eqp_host_api *host, void *state)
{
  eqp_plug_free(host, state, sizeof(davies_state));
}

static int davies_log_gamma(void *state, const eqp_activity_in *in, double *lg,
                            char *err, size_t errlen)
{
  const davies_state *st = state;
  double sI = sqrt(in->ionic_strength);
  double f = -in->A * (sI / (1.0 + sI) - st->c * in->ionic_strength);
  for (size_t i = 0; i < in->n; i++) {
    double z = in->charge[i];
    lg[i] = f * z * z;   /* neutral species: 0, i.e. gamma = 1 */
  }
  return 0;
}

/* d log10 g / dI = -A z^2 (1 / (2 sqrt(I) (1 + sqrt(I))^2) - c) */
static int davies_dI(void *state, const eqp_activity_in *in, double *dlg, char *err,
                     size_t errlen)
{
  const davies_state *st = state;
  double sI = sqrt(in->ionic_strength);
  double f = -in->A * (0.5 / (sI * (1.0 + sI) * (1.0 + sI)) - st->c);
  for (size_t i = 0; i < in->n; i++) dlg[i] = f * in->charge[i] * in->charge[i];
  return 0;
}

static int davies_set_param(void *state, const char *name, double value,
                            char *err, size_t errlen)
{
  davies_state *st = state;
  if (strcmp(name, "coefficient") == 0) {
    if (!(value >= 0.0 && value <= 1.0)) {
      snprintf(err, errlen, "davies: coefficient %g outside 0..1", value);
      return 1;
    }
    st->c = value;
    return 0;
  }
  snprintf(err, errlen, "davies: unknown parameter '%s' (known: coefficient)", name);
  return 1;
}

static const eqp_activity_ops davies_ops = {
  sizeof(eqp_activity_ops), davies_create, davies_destroy, davies_log_gamma,
  davies_set_param, NULL, davies_dI, NULL,
};

static const eqp_plugin_desc davies_desc = {
  EQP_PLUGIN_ABI_VERSION, sizeof(eqp_plugin_desc), EQP_PLUGIN_SIZES,
  EQP_PLUGIN_ACTIVITY, "davies", "1.0",
  "Davies equation, coefficient 0.3 (settable); usual range I <= 0.5 mol/kg",
  &davies_ops, 0.5,
};

EQP_PLUGIN_DEFINE(davies_desc)
