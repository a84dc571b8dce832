/* Allocation through the context's allocator, and the arena for species data. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <limits.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

void *eqpi_malloc(eqp_ctx *ctx, size_t n)
{
  return ctx->alloc(ctx->ud, NULL, 0, n ? n : 1);
}

void *eqpi_calloc(eqp_ctx *ctx, size_t count, size_t n)
{
  if (n && count > (size_t)-1 / n) return NULL;
  void *p = eqpi_malloc(ctx, count * n);
  if (p) memset(p, 0, count * n > 0 ? count * n : 1);
  return p;
}

void *eqpi_realloc(eqp_ctx *ctx, void *p, size_t old, size_t n)
{
  return ctx->alloc(ctx->ud, p, old, n ? n : 1);
}

void eqpi_free(eqp_ctx *ctx, void *p, size_t n)
{
  if (p) ctx->alloc(ctx->ud, p, n, 0);
}

char *eqpi_strdup(eqp_ctx *ctx, const char *s)
{
  size_t n = strlen(s) + 1;
  char *d = eqpi_malloc(ctx, n);
  if (d) memcpy(d, s, n);
  return d;
}

void eqpi_strfree(eqp_ctx *ctx, char *s)
{
  if (s) eqpi_free(ctx, s, strlen(s) + 1);
}

/* The capacity after growing from cap to hold need: doubling, 8 at first. */
static size_t next_cap(size_t cap, size_t need, size_t max)
{
  size_t nc = cap ? cap : 8;
  while (nc < need) nc = nc > max / 2 ? max : nc * 2;
  return nc;
}

static int regrow(eqp_ctx *ctx, void *arrp, size_t cap, size_t nc, size_t elem)
{
  if (elem && nc > SIZE_MAX / elem) return -1;
  void *old;
  memcpy(&old, arrp, sizeof old);      /* arrp is the address of some T * */
  void *p = eqpi_realloc(ctx, old, elem * cap, elem * nc);
  if (!p) return -1;
  memcpy(arrp, &p, sizeof p);
  return 0;
}

int eqpi_grow_size(eqp_ctx *ctx, void *arrp, size_t *cap, size_t need, size_t elem)
{
  if (need <= *cap) return 0;
  size_t nc = next_cap(*cap, need, SIZE_MAX);
  if (regrow(ctx, arrp, *cap, nc, elem) < 0) return -1;
  *cap = nc;
  return 0;
}

int eqpi_grow(eqp_ctx *ctx, void *arrp, int *cap, int need, size_t elem)
{
  if (need <= *cap) return 0;
  if (need < 0 || *cap < 0) return -1;
  size_t nc = next_cap((size_t)*cap, (size_t)need, INT_MAX);
  if (regrow(ctx, arrp, (size_t)*cap, nc, elem) < 0) return -1;
  *cap = (int)nc;
  return 0;
}

/* Blocks chained newest first; payload follows the header. */
struct eqpi_arena {
  struct eqpi_arena *next;
  size_t size, used;
};

#define ARENA_BLOCK 16384
#define ARENA_ALIGN 16

void *eqpi_arena_alloc(eqp_ctx *ctx, eqpi_arena **a, size_t n)
{
  n = (n + ARENA_ALIGN - 1) & ~(size_t)(ARENA_ALIGN - 1);
  eqpi_arena *b = *a;
  if (!b || b->size - b->used < n) {
    size_t size = n > ARENA_BLOCK ? n : ARENA_BLOCK;
    size_t hdr = (sizeof(eqpi_arena) + ARENA_ALIGN - 1) & ~(size_t)(ARENA_ALIGN - 1);
    b = eqpi_malloc(ctx, hdr + size);
    if (!b) return NULL;
    b->next = *a;
    b->size = size;
    b->used = 0;
    *a = b;
  }
  size_t hdr = (sizeof(eqpi_arena) + ARENA_ALIGN - 1) & ~(size_t)(ARENA_ALIGN - 1);
  void *p = (char *)b + hdr + b->used;
  b->used += n;
  memset(p, 0, n);
  return p;
}

char *eqpi_arena_strdup(eqp_ctx *ctx, eqpi_arena **a, const char *s)
{
  size_t n = strlen(s) + 1;
  char *d = eqpi_arena_alloc(ctx, a, n);
  if (d) memcpy(d, s, n);
  return d;
}

void eqpi_arena_free(eqp_ctx *ctx, eqpi_arena **a)
{
  size_t hdr = (sizeof(eqpi_arena) + ARENA_ALIGN - 1) & ~(size_t)(ARENA_ALIGN - 1);
  eqpi_arena *b = *a;
  while (b) {
    eqpi_arena *next = b->next;
    eqpi_free(ctx, b, hdr + b->size);
    b = next;
  }
  *a = NULL;
}

/* Move every block of src in front of dst; src becomes empty. */
void eqpi_arena_splice(eqpi_arena **dst, eqpi_arena **src)
{
  eqpi_arena *b = *src;
  if (!b) return;
  while (b->next) b = b->next;
  b->next = *dst;
  *dst = *src;
  *src = NULL;
}
