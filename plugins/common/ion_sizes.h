/* Shared by the plugins that need an ion-size parameter for every ion. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_PLUGIN_ION_SIZES_H
#define EQP_PLUGIN_ION_SIZES_H

#include <equipoise/plugin.h>
#include <stdio.h>

/* An ion without a size gets 4 A: the middle of Kielland's range for
** singly charged ions (common practice). */
#define EQP_DEFAULT_ION_SIZE 4.0

/* Give every charged species of a[] without a positive size the default,
** and name them in warn ("no ion size for X, Y; 4 A used (model)"). */
static inline void eqp_default_ion_sizes(const eqp_species_info *info, double *a, char *warn,
                                         size_t warnlen, const char *model)
{
  size_t used = 0;
  warn[0] = '\0';
  for (size_t i = 0; i < info->n; i++) {
    if (info->charge[i] == 0 || a[i] > 0) continue;
    a[i] = EQP_DEFAULT_ION_SIZE;
    if (used < warnlen)
      used += (size_t)snprintf(warn + used, warnlen - used, "%s%s",
                               used ? ", " : "no ion size for ", info->name[i]);
  }
  if (used && used < warnlen) snprintf(warn + used, warnlen - used, "; 4 A used (%s)", model);
}

#endif
