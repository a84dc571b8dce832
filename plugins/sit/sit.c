/* Specific ion interaction theory (Broensted, Guggenheim, Scatchard; as
** used by I. Grenthe, A. V. Plyasunov, K. Spahiu, "Estimations of medium
** effects on thermodynamic data", in Modelling in Aquatic Chemistry,
** OECD/NEA 1997):
**   log10 g_i = -z_i^2 D + sum_j e(i,j) m_j,  D = A sqrt(I) / (1 + 1.5 sqrt(I))
** with the interaction coefficients e(i,j) of ions of opposite charge from
** the species files (parameter "sit"); pairs not listed count as 0.
** Neutral species: g = 1. Usual range I <= 3.5 mol/kg. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include "../common/host_mem.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

typedef struct sit_state {
  const eqp_host_api *host;
  double *eps;            /* n x n, symmetric */
  size_t n;
  size_t cap;             /* doubles allocated for eps */
} sit_state;

static int sit_create(const eqp_host_api *host, void **state, char *err, size_t errlen)
{
  sit_state *st = eqp_plug_alloc(host, sizeof *st);
  if (!st) {
    snprintf(err, errlen, "out of memory");
    return 1;
  }
  st->host = host;
  st->eps = NULL;
  st->n = st->cap = 0;
  *state = st;
  return 0;
}

static void sit_destroy(const eqp_host_api *host, void *state)
{
  sit_state *st = state;
  if (!st) return;
  eqp_plug_free(host, st->eps, sizeof(double) * st->cap);
  eqp_plug_free(host, st, sizeof *st);
}

static int sit_bind(void *state, const eqp_species_info *info, char *warn, size_t warnlen,
                    char *err, size_t errlen)
{
  sit_state *st = state;
  size_t n = info->n;
  eqp_plug_free(st->host, st->eps, sizeof(double) * st->cap);
  st->n = st->cap = 0;
  st->eps = eqp_plug_alloc(st->host, sizeof(double) * (n * n + 1));
  if (!st->eps) {
    snprintf(err, errlen, "out of memory");
    return 1;
  }
  st->cap = n * n + 1;
  st->n = n;
  warn[0] = '\0';
  for (size_t i = 0; i < n; i++)
    for (size_t j = 0; j < n; j++) {
      double e = 0;
      if (info->charge[i] * info->charge[j] < 0 && info->pair(info->ud, i, j, "sit", &e) != 0)
        e = 0;
      st->eps[i * n + j] = e;
    }
  return 0;
}

static int sit_log_gamma(void *state, const eqp_activity_in *in, double *lg, char *err,
                         size_t errlen)
{
  const sit_state *st = state;
  double s = sqrt(in->ionic_strength);
  double D = in->A * s / (1.0 + 1.5 * s);
  for (size_t i = 0; i < in->n; i++) {
    double z = in->charge[i];
    if (z == 0) {
      lg[i] = 0;
      continue;
    }
    double sum = 0;
    if (in->n == st->n)
      for (size_t j = 0; j < in->n; j++) sum += st->eps[i * st->n + j] * in->molality[j];
    lg[i] = -z * z * D + sum;
  }
  return 0;
}

/* The derivative along (dm, dI): -z_i^2 D'(I) dI + sum_j e(i,j) dm_j, with
** D'(I) = A / (2 sqrt(I) (1 + 1.5 sqrt(I))^2). */
static int sit_tangent(void *state, const eqp_activity_in *in, const double *dm, double dI,
                       double *dlg, char *err, size_t errlen)
{
  const sit_state *st = state;
  double s = sqrt(in->ionic_strength), d = 1.0 + 1.5 * s;
  double dD = in->A * 0.5 / (s * d * d) * dI;
  for (size_t i = 0; i < in->n; i++) {
    double z = in->charge[i];
    if (z == 0) {
      dlg[i] = 0;
      continue;
    }
    double sum = 0;
    if (dm && in->n == st->n)
      for (size_t j = 0; j < in->n; j++) sum += st->eps[i * st->n + j] * dm[j];
    dlg[i] = -z * z * dD + sum;
  }
  return 0;
}

static const eqp_activity_ops sit_ops = {
  sizeof(eqp_activity_ops), sit_create, sit_destroy, sit_log_gamma, NULL, sit_bind, NULL,
  sit_tangent,
};

static const eqp_plugin_desc sit_desc = {
  EQP_PLUGIN_ABI_VERSION, sizeof(eqp_plugin_desc), EQP_PLUGIN_SIZES,
  EQP_PLUGIN_ACTIVITY, "sit", "1.0",
  "specific ion interaction theory, coefficients from the species files; I <= 3.5 mol/kg",
  &sit_ops, 3.5,
};

EQP_PLUGIN_DEFINE(sit_desc)
