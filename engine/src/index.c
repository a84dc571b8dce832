/* A string index: names of species, reagents and the other entries of the
** library, looked up in constant time while loading and while running. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <string.h>

static unsigned hash_str(const char *s)
{
  unsigned h = 2166136261u;           /* FNV-1a */
  while (*s) h = (h ^ (unsigned char)*s++) * 16777619u;
  return h;
}

/* The slot of key: where it is, or the empty slot where it would go. */
static int slot_of(const eqpi_index *ix, const char *key)
{
  unsigned mask = (unsigned)ix->cap - 1, i = hash_str(key) & mask;
  while (ix->key[i] && strcmp(ix->key[i], key) != 0) i = (i + 1) & mask;
  return (int)i;
}

static int grow(eqp_ctx *ctx, eqpi_index *ix)
{
  int cap = ix->cap ? ix->cap * 2 : 64;
  const char **key = eqpi_calloc(ctx, (size_t)cap, sizeof *key);
  int *val = eqpi_malloc(ctx, sizeof *val * (size_t)cap);
  if (!key || !val) {
    eqpi_free(ctx, key, sizeof *key * (size_t)cap);
    eqpi_free(ctx, val, sizeof *val * (size_t)cap);
    return -1;
  }
  eqpi_index next = {key, val, cap, ix->n};
  for (int i = 0; i < ix->cap; i++)
    if (ix->key[i]) {
      int k = slot_of(&next, ix->key[i]);
      key[k] = ix->key[i];
      val[k] = ix->val[i];
    }
  eqpi_index_free(ctx, ix);
  *ix = next;
  return 0;
}

int eqpi_index_put(eqp_ctx *ctx, eqpi_index *ix, const char *key, int val, int *old)
{
  if (ix->cap) {
    int k = slot_of(ix, key);
    if (ix->key[k]) {
      if (old) *old = ix->val[k];
      return 1;
    }
  }
  if (2 * (ix->n + 1) > ix->cap && grow(ctx, ix) < 0) return -1;
  int k = slot_of(ix, key);
  ix->key[k] = key;
  ix->val[k] = val;
  ix->n++;
  return 0;
}

int eqpi_index_get(const eqpi_index *ix, const char *key)
{
  if (!ix->cap || !key) return -1;
  int k = slot_of(ix, key);
  return ix->key[k] ? ix->val[k] : -1;
}

void eqpi_index_free(eqp_ctx *ctx, eqpi_index *ix)
{
  eqpi_free(ctx, ix->key, sizeof *ix->key * (size_t)ix->cap);
  eqpi_free(ctx, ix->val, sizeof *ix->val * (size_t)ix->cap);
  memset(ix, 0, sizeof *ix);
}
