/* Fixture: a plugin whose entry refuses to load, with a reason. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include <stdio.h>

EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *h, char *e, size_t n);
EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *h, char *e, size_t n)
{
  snprintf(e, n, "licence file missing (fixture)");
  return NULL;
}
