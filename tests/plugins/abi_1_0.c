/* Fixture: a plugin as ABI 1.0 built it, with the 1.0 structs written out
** here instead of taken from today's header: a 1.0 descriptor, only the
** required operations (no set_param, no bind), and a host table read no
** further than 1.0's log. The engine must load it and never read beyond
** what it gave. The model is Davies's equation (C. W. Davies, Ion
** Association, Butterworths 1962) with its coefficient 0.3. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include <math.h>
#include <stdint.h>

typedef struct host_1_0 {
  uint32_t abi_version, struct_size;
  void *(*alloc)(size_t n);
  void (*free)(void *p);
  void (*log)(const char *msg);
} host_1_0;

typedef struct ops_required {
  uint32_t struct_size;
  int (*create)(const eqp_host_api *host, void **state, char *err, size_t errlen);
  void (*destroy)(const eqp_host_api *host, void *state);
  int (*log_gamma)(void *state, const eqp_activity_in *in, double *lg, char *err, size_t errlen);
} ops_required;

typedef struct desc_1_0 {
  uint32_t abi_version, struct_size, sizes, kind;
  const char *name, *version, *summary;
  const void *ops;
  double max_ionic_strength;
} desc_1_0;

static int make(const eqp_host_api *h, void **s, char *e, size_t n)
{
  const host_1_0 *host = (const host_1_0 *)h;
  host->log("abi_1_0: created from a 1.0 descriptor");
  *s = NULL;
  return 0;
}

static void drop(const eqp_host_api *h, void *s) {}

static int davies(void *s, const eqp_activity_in *in, double *lg, char *e, size_t n)
{
  double r = sqrt(in->ionic_strength);
  double f = -in->A * (r / (1.0 + r) - 0.3 * in->ionic_strength);
  for (size_t i = 0; i < in->n; i++) lg[i] = f * in->charge[i] * in->charge[i];
  return 0;
}

static const ops_required ops = {sizeof ops, make, drop, davies};
static const desc_1_0 desc = {
  (uint32_t)1 << 16, sizeof desc, EQP_PLUGIN_SIZES, EQP_PLUGIN_ACTIVITY, "abi_1_0", "1.0",
  "fixture built with the ABI 1.0 structs", &ops, 0.5};

EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *h, char *e, size_t n);
EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *h, char *e, size_t n)
{
  return (const eqp_plugin_desc *)(const void *)&desc;
}
