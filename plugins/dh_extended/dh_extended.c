/* Extended Debye-Hueckel equation with ion-size parameters:
** log10 g = -A z^2 sqrt(I) / (1 + B a sqrt(I)), a from the species files
** (J. Kielland, J. Am. Chem. Soc. 59, 1675 (1937)). Usual range I <= 0.1
** mol/kg. An ion without a size uses 4 A (the middle of Kielland's range
** for singly charged ions; common practice), and the result says so. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include "../common/host_mem.h"
#include "../common/ion_sizes.h"
#include <math.h>
#include <stdio.h>
#include <string.h>


typedef struct ext_state {
  const eqp_host_api *host;
  double *a;              /* size per bound species, Angstrom */
  size_t n;
  size_t cap;             /* doubles allocated for a */
} ext_state;

static int ext_create(const eqp_host_api *host, void **state, char *err, size_t errlen)
{
  ext_state *st = eqp_plug_alloc(host, sizeof *st);
  if (!st) {
    snprintf(err, errlen, "out of memory");
    return 1;
  }
  st->host = host;
  st->a = NULL;
  st->n = st->cap = 0;
  *state = st;
  return 0;
}

static void ext_destroy(const eqp_host_api *host, void *state)
{
  ext_state *st = state;
  if (!st) return;
  eqp_plug_free(host, st->a, sizeof(double) * st->cap);
  eqp_plug_free(host, st, sizeof *st);
}

static int ext_bind(void *state, const eqp_species_info *info, char *warn, size_t warnlen,
                    char *err, size_t errlen)
{
  ext_state *st = state;
  eqp_plug_free(st->host, st->a, sizeof(double) * st->cap);
  st->n = st->cap = 0;
  st->a = eqp_plug_alloc(st->host, sizeof(double) * (info->n + 1));
  if (!st->a) {
    snprintf(err, errlen, "out of memory");
    return 1;
  }
  st->cap = info->n + 1;
  st->n = info->n;
  for (size_t i = 0; i < info->n; i++) st->a[i] = info->size[i];
  eqp_default_ion_sizes(info, st->a, warn, warnlen, "dh-extended");
  return 0;
}

static int ext_log_gamma(void *state, const eqp_activity_in *in, double *lg, char *err,
                         size_t errlen)
{
  const ext_state *st = state;
  double s = sqrt(in->ionic_strength);
  for (size_t i = 0; i < in->n; i++) {
    double z = in->charge[i];
    double a = i < st->n ? st->a[i] : EQP_DEFAULT_ION_SIZE;
    lg[i] = z == 0 ? 0.0 : -in->A * z * z * s / (1.0 + in->B * a * s);
  }
  return 0;
}

/* d log10 g / dI = -A z^2 / (2 sqrt(I) (1 + B a sqrt(I))^2) */
static int ext_dI(void *state, const eqp_activity_in *in, double *dlg, char *err, size_t errlen)
{
  const ext_state *st = state;
  double s = sqrt(in->ionic_strength);
  for (size_t i = 0; i < in->n; i++) {
    double z = in->charge[i];
    double a = i < st->n ? st->a[i] : EQP_DEFAULT_ION_SIZE, d = 1.0 + in->B * a * s;
    dlg[i] = z == 0 ? 0.0 : -in->A * z * z * 0.5 / (s * d * d);
  }
  return 0;
}

static const eqp_activity_ops ext_ops = {
  sizeof(eqp_activity_ops), ext_create, ext_destroy, ext_log_gamma, NULL, ext_bind, ext_dI,
  NULL,
};

static const eqp_plugin_desc ext_desc = {
  EQP_PLUGIN_ABI_VERSION, sizeof(eqp_plugin_desc), EQP_PLUGIN_SIZES,
  EQP_PLUGIN_ACTIVITY, "dh-extended", "1.0",
  "extended Debye-Hueckel with Kielland ion sizes; usual range I <= 0.1 mol/kg",
  &ext_ops, 0.1,
};

EQP_PLUGIN_DEFINE(ext_desc)
