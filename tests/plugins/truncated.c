/* Fixture: a descriptor that claims to be shorter than ABI 1.0's. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include <stddef.h>

static int make(const eqp_host_api *h, void **s, char *e, size_t n) { *s = 0; return 0; }
static void drop(const eqp_host_api *h, void *s) {}
static int lg(void *s, const eqp_activity_in *in, double *out, char *e, size_t n) { return 0; }
static const eqp_activity_ops ops = {sizeof ops, make, drop, lg, 0, 0, 0, 0};
static const eqp_plugin_desc desc = {
  EQP_PLUGIN_ABI_VERSION, (uint32_t)offsetof(eqp_plugin_desc, ops), EQP_PLUGIN_SIZES,
  EQP_PLUGIN_ACTIVITY, "truncated", "1.0", "fixture with a truncated descriptor", &ops, 0};

EQP_PLUGIN_DEFINE(desc)
