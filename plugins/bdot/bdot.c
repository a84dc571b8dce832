/* B-dot / Truesdell-Jones activity model:
**   log10 g = -A z^2 sqrt(I) / (1 + B a sqrt(I)) + b I
** With the ion-specific a (ion size) and b (the extra linear term) of A. H.
** Truesdell, B. F. Jones, J. Res. U.S. Geol. Surv. 2, 233 (1974) where the
** species files give them (parameters tj_size in Angstrom and tj_linear in
** kg/mol); otherwise a is the ion size and b the B-dot of
** H. C. Helgeson, Am. J. Sci. 267, 729 (1969): 0.041 at 25 C (settable as
** "bdot"; its temperature dependence is not modelled). Neutral species:
** g = 1. Usual range I <= 1 mol/kg in NaCl-dominated solutions. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include "../common/host_mem.h"
#include "../common/ion_sizes.h"
#include <math.h>
#include <stdio.h>
#include <string.h>


typedef struct bdot_state {
  const eqp_host_api *host;
  double bdot;
  double *a, *b;          /* per bound species; b NaN: use bdot */
  size_t n;
  size_t cap;             /* doubles allocated for each of a and b */
} bdot_state;

static int bd_create(const eqp_host_api *host, void **state, char *err, size_t errlen)
{
  bdot_state *st = eqp_plug_alloc(host, sizeof *st);
  if (!st) {
    snprintf(err, errlen, "out of memory");
    return 1;
  }
  memset(st, 0, sizeof *st);
  st->host = host;
  st->bdot = 0.041;
  *state = st;
  return 0;
}

static void bd_destroy(const eqp_host_api *host, void *state)
{
  bdot_state *st = state;
  if (!st) return;
  eqp_plug_free(host, st->a, sizeof(double) * st->cap);
  eqp_plug_free(host, st->b, sizeof(double) * st->cap);
  eqp_plug_free(host, st, sizeof *st);
}

static int bd_bind(void *state, const eqp_species_info *info, char *warn, size_t warnlen,
                   char *err, size_t errlen)
{
  bdot_state *st = state;
  eqp_plug_free(st->host, st->a, sizeof(double) * st->cap);
  eqp_plug_free(st->host, st->b, sizeof(double) * st->cap);
  st->n = 0;
  st->cap = info->n + 1;
  st->a = eqp_plug_alloc(st->host, sizeof(double) * st->cap);
  st->b = eqp_plug_alloc(st->host, sizeof(double) * st->cap);
  if (!st->a || !st->b) {
    snprintf(err, errlen, "out of memory");
    return 1;
  }
  st->n = info->n;
  for (size_t i = 0; i < info->n; i++) {
    double a, b;
    st->a[i] = info->param(info->ud, i, "tj_size", &a) == 0 ? a : info->size[i];
    st->b[i] = info->param(info->ud, i, "tj_linear", &b) == 0 ? b : NAN;
  }
  eqp_default_ion_sizes(info, st->a, warn, warnlen, "bdot");
  return 0;
}

static int bd_log_gamma(void *state, const eqp_activity_in *in, double *lg, char *err,
                        size_t errlen)
{
  const bdot_state *st = state;
  double I = in->ionic_strength, s = sqrt(I);
  for (size_t i = 0; i < in->n; i++) {
    double z = in->charge[i];
    if (z == 0) {
      lg[i] = 0;
      continue;
    }
    double a = i < st->n ? st->a[i] : EQP_DEFAULT_ION_SIZE;
    double b = i < st->n && !isnan(st->b[i]) ? st->b[i] : st->bdot;
    lg[i] = -in->A * z * z * s / (1.0 + in->B * a * s) + b * I;
  }
  return 0;
}

/* d log10 g / dI = -A z^2 / (2 sqrt(I) (1 + B a sqrt(I))^2) + b */
static int bd_dI(void *state, const eqp_activity_in *in, double *dlg, char *err, size_t errlen)
{
  const bdot_state *st = state;
  double s = sqrt(in->ionic_strength);
  for (size_t i = 0; i < in->n; i++) {
    double z = in->charge[i];
    if (z == 0) {
      dlg[i] = 0;
      continue;
    }
    double a = i < st->n ? st->a[i] : EQP_DEFAULT_ION_SIZE, d = 1.0 + in->B * a * s;
    double b = i < st->n && !isnan(st->b[i]) ? st->b[i] : st->bdot;
    dlg[i] = -in->A * z * z * 0.5 / (s * d * d) + b;
  }
  return 0;
}

static int bd_set_param(void *state, const char *name, double value, char *err, size_t errlen)
{
  bdot_state *st = state;
  if (strcmp(name, "bdot") == 0 && value > -1 && value < 1) {
    st->bdot = value;
    return 0;
  }
  snprintf(err, errlen, "unknown or out-of-range parameter '%s' (known: bdot, -1..1)", name);
  return 1;
}

static const eqp_activity_ops bd_ops = {
  sizeof(eqp_activity_ops), bd_create, bd_destroy, bd_log_gamma, bd_set_param, bd_bind, bd_dI,
  NULL,
};

static const eqp_plugin_desc bd_desc = {
  EQP_PLUGIN_ABI_VERSION, sizeof(eqp_plugin_desc), EQP_PLUGIN_SIZES,
  EQP_PLUGIN_ACTIVITY, "bdot", "1.0",
  "B-dot / Truesdell-Jones: extended Debye-Hueckel plus b I; usual range I <= 1 mol/kg",
  &bd_ops, 1.0,
};

EQP_PLUGIN_DEFINE(bd_desc)
