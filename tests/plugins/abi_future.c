/* Fixture: a plugin from a later minor version of the ABI, whose
** descriptor and operations carry members today's engine does not know:
** it must load, with the unknown tail ignored. It uses what the host
** offers since 1.1 when the host table has it: the context's allocator
** for its state (an unusual 4104 bytes, so a test can see it pass) and
** the context's log. Davies's equation (C. W. Davies, Ion Association,
** Butterworths 1962), coefficient 0.3. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include <math.h>
#include <stdlib.h>

typedef struct future_state {
  double c;
  double scratch[512];
} future_state;

static int make(const eqp_host_api *h, void **s, char *e, size_t n)
{
  future_state *st;
  if (!EQP_PLUGIN_HAS_OP(h, ctx_alloc) || !EQP_PLUGIN_HAS_OP(h, ctx_log)) return 1;
  st = h->ctx_alloc(h->ud, NULL, 0, sizeof *st);
  if (!st) return 1;
  st->c = 0.3;
  h->ctx_log(h->ud, EQP_LOG_DEBUG, "abi_future: state from the context's allocator");
  *s = st;
  return 0;
}

static void drop(const eqp_host_api *h, void *s)
{
  h->ctx_alloc(h->ud, s, sizeof(future_state), 0);
}

static int davies(void *s, const eqp_activity_in *in, double *lg, char *e, size_t n)
{
  const future_state *st = s;
  double r = sqrt(in->ionic_strength);
  double f = -in->A * (r / (1.0 + r) - st->c * in->ionic_strength);
  for (size_t i = 0; i < in->n; i++) lg[i] = f * in->charge[i] * in->charge[i];
  return 0;
}

/* An operation of a future minor version: the host must not call it. */
static int future_op(void *s, double *x) { abort(); }

typedef struct ops_future {
  eqp_activity_ops now;
  int (*future_op)(void *state, double *x);
} ops_future;

typedef struct desc_future {
  eqp_plugin_desc now;
  double future_limit;
  const char *future_note;
} desc_future;

static const ops_future ops = {{sizeof ops, make, drop, davies, NULL, NULL, NULL, NULL}, future_op};
static const desc_future desc = {
  {(uint32_t)EQP_PLUGIN_ABI_MAJOR << 16 | (EQP_PLUGIN_ABI_MINOR + 7), sizeof desc,
   EQP_PLUGIN_SIZES, EQP_PLUGIN_ACTIVITY, "abi_future", "1.8",
   "fixture built against a later minor version", &ops, 0.5},
  -1.0, "a member this engine does not know"};

EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *h, char *e, size_t n);
EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *h, char *e, size_t n)
{
  return &desc.now;
}
