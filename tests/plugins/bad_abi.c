/* Fixture: a plugin built for a future major ABI; must be refused. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>

static int make(const eqp_host_api *h, void **s, char *e, size_t n) { *s = 0; return 0; }
static void drop(const eqp_host_api *h, void *s) {}
static int lg(void *s, const eqp_activity_in *in, double *out, char *e, size_t n) { return 0; }
static const eqp_activity_ops ops = {sizeof ops, make, drop, lg, 0, 0, 0, 0};
static const eqp_plugin_desc desc = {
  (uint32_t)(EQP_PLUGIN_ABI_MAJOR + 1) << 16, sizeof desc, EQP_PLUGIN_SIZES,
  EQP_PLUGIN_ACTIVITY, "bad_abi", "9.9", "fixture with a wrong ABI major", &ops, 0};

EQP_PLUGIN_DEFINE(desc)
