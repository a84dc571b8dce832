/* An activity model built outside the engine's tree by tests/e2e/run.sh, to
** prove the ABI from outside: the Guentelberg form of the Debye-Hueckel
** equation (E. Guentelberg, Z. phys. Chem. 123, 199 (1926)),
** log10 g = -A z^2 sqrt(I) / (1 + sqrt(I)). */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include <math.h>

static int make(const eqp_host_api *h, void **s, char *e, size_t n) { *s = 0; return 0; }
static void drop(const eqp_host_api *h, void *s) {}

static int lg(void *s, const eqp_activity_in *in, double *out, char *e, size_t n)
{
  double r = sqrt(in->ionic_strength), f = -in->A * r / (1 + r);
  for (size_t i = 0; i < in->n; i++) out[i] = f * in->charge[i] * in->charge[i];
  return 0;
}

static const eqp_activity_ops ops = {sizeof ops, make, drop, lg, 0, 0, 0, 0};
static const eqp_plugin_desc desc = {
  EQP_PLUGIN_ABI_VERSION, sizeof desc, EQP_PLUGIN_SIZES, EQP_PLUGIN_ACTIVITY, "guntelberg",
  "0.1", "Guentelberg equation (built out of tree)", &ops, 0.1};

EQP_PLUGIN_DEFINE(desc)
