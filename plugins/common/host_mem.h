/* Memory for a plugin's state: the context's allocator where the host
** offers it (ABI 1.1), so that the state counts against the program's
** allocator; the 1.0 malloc-like pair from an older host. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_PLUGIN_HOST_MEM_H
#define EQP_PLUGIN_HOST_MEM_H

#include <equipoise/plugin.h>

static inline void *eqp_plug_alloc(const eqp_host_api *h, size_t n)
{
  return EQP_PLUGIN_HAS_OP(h, ctx_alloc) ? h->ctx_alloc(h->ud, NULL, 0, n) : h->alloc(n);
}

/* Free p, which eqp_plug_alloc gave with size n; NULL is a no-op. */
static inline void eqp_plug_free(const eqp_host_api *h, void *p, size_t n)
{
  if (!p) return;
  if (EQP_PLUGIN_HAS_OP(h, ctx_alloc)) h->ctx_alloc(h->ud, p, n, 0);
  else h->free(p);
}

#endif
