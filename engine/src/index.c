/* A string index: names of species, reagents and the other entries of the
** library, looked up in constant time while loading and while running.
** uthash (Debian uthash-dev) holds the table; its memory comes from the
** context's allocator, and running out of it is an error, never an exit. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <string.h>

/* uthash allocates through these, with ix_ctx and ix_oom in scope */
#define uthash_malloc(sz) eqpi_malloc(ix_ctx, sz)
#define uthash_free(ptr, sz) eqpi_free(ix_ctx, ptr, sz)
#define HASH_NONFATAL_OOM 1
#define uthash_nonfatal_oom(obj) (ix_oom = 1)
#define HASH_FUNCTION(keyptr, keylen, hashv) HASH_FNV(keyptr, keylen, hashv)
#include <uthash.h>
/* Chains of a few entries, not ten: names are looked up far more often
** than added (every s:add, every r:molality). */
#undef HASH_BKT_CAPACITY_THRESH
#define HASH_BKT_CAPACITY_THRESH 4U

struct eqpi_index_item {
  const char *key;      /* borrowed */
  int val;
  UT_hash_handle hh;
};

int eqpi_index_put(eqp_ctx *ctx, eqpi_index *ix, const char *key, int val, int *old)
{
  eqpi_index_item *it = NULL;
  size_t len = strlen(key);
  HASH_FIND(hh, ix->head, key, len, it);
  if (it) {
    if (old) *old = it->val;
    return 1;
  }
  eqp_ctx *ix_ctx = ctx;
  int ix_oom = 0;
  if (!(it = eqpi_malloc(ctx, sizeof *it))) return -1;
  it->key = key;
  it->val = val;
  HASH_ADD_KEYPTR(hh, ix->head, it->key, len, it);
  if (ix_oom) {
    eqpi_free(ctx, it, sizeof *it);
    return -1;
  }
  return 0;
}

int eqpi_index_get(const eqpi_index *ix, const char *key)
{
  if (!key) return -1;
  eqpi_index_item *it = NULL;
  HASH_FIND(hh, ix->head, key, strlen(key), it);
  return it ? it->val : -1;
}

void eqpi_index_del(eqp_ctx *ctx, eqpi_index *ix, const char *key)
{
  eqpi_index_item *it = NULL;
  HASH_FIND(hh, ix->head, key, strlen(key), it);
  if (!it) return;
  eqp_ctx *ix_ctx = ctx;
  HASH_DELETE(hh, ix->head, it);
  eqpi_free(ctx, it, sizeof *it);
  (void)ix_ctx;
}

size_t eqpi_index_count(const eqpi_index *ix)
{
  return HASH_COUNT(ix->head);
}

void eqpi_index_free(eqp_ctx *ctx, eqpi_index *ix)
{
  eqpi_index_item *it, *tmp;
  eqp_ctx *ix_ctx = ctx;
  HASH_ITER(hh, ix->head, it, tmp) {
    HASH_DELETE(hh, ix->head, it);
    eqpi_free(ctx, it, sizeof *it);
  }
  (void)ix_ctx;
  ix->head = NULL;
}
