/* The staging area: what a species load holds before its commit, its
** error list, and the operations the library loader needs (appending one
** file's entries to a load, fingerprinting a load). */
/* SPDX-License-Identifier: MIT */
#include "stage_impl.h"
#include <stdio.h>
#include <string.h>

static void note_error_file(eqpi_stage *st, const char *file)
{
  if (!file) {
    st->errnofile++;
    return;
  }
  for (int i = 0; i < st->nerrfile; i++)
    if (strcmp(st->errfile[i], file) == 0) return;
  if (st->nerrfile < (int)(sizeof st->errfile / sizeof st->errfile[0]))
    st->errfile[st->nerrfile++] = file;
  else
    st->errfile_full = 1;
}

void eqpi_stage_error(eqpi_stage *st, const char *file, int line, const char *fmt, ...)
{
  st->nerr++;
  note_error_file(st, file);
  if (st->errused + 2 >= sizeof st->err) return;
  char *p = st->err + st->errused;
  size_t left = sizeof st->err - st->errused;
  int k = 0;
  if (st->errused) k = snprintf(p, left, "\n");
  if (file && line > 0) k += snprintf(p + k, left - (size_t)k, "%s:%d: ", file, line);
  else if (file) k += snprintf(p + k, left - (size_t)k, "%s: ", file);
  va_list ap;
  va_start(ap, fmt);
  if ((size_t)k < left) k += vsnprintf(p + k, left - (size_t)k, fmt, ap);
  va_end(ap);
  st->errused += (size_t)k < left ? (size_t)k : left - 1;
}

void *eqpi_stage_push(eqp_ctx *ctx, eqpi_stage *st, void **arr, int *n, int *cap, size_t elem)
{
  if (*n == *cap) {
    int nc = *cap ? *cap * 2 : 16;
    void *p = eqpi_realloc(ctx, *arr, elem * (size_t)*cap, elem * (size_t)nc);
    if (!p) {
      eqpi_stage_error(st, NULL, 0, "out of memory");
      return NULL;
    }
    *arr = p;
    *cap = nc;
  }
  void *e = (char *)*arr + elem * (size_t)(*n)++;
  memset(e, 0, elem);
  return e;
}

eqpi_stage *eqpi_stage_new(eqp_ctx *ctx)
{
  return eqpi_calloc(ctx, 1, sizeof(eqpi_stage));
}

void eqpi_stage_free(eqp_ctx *ctx, eqpi_stage *st)
{
  if (!st) return;
  eqpi_arena_free(ctx, &st->arena);
  eqpi_free(ctx, st->sp, sizeof *st->sp * (size_t)st->capsp);
  eqpi_free(ctx, st->rx, sizeof *st->rx * (size_t)st->caprx);
  eqpi_free(ctx, st->rg, sizeof *st->rg * (size_t)st->caprg);
  eqpi_free(ctx, st->in, sizeof *st->in * (size_t)st->capin);
  eqpi_free(ctx, st->bf, sizeof *st->bf * (size_t)st->capbf);
  eqpi_free(ctx, st->gs, sizeof *st->gs * (size_t)st->capgs);
  eqpi_free(ctx, st->so, sizeof *st->so * (size_t)st->capso);
  eqpi_free(ctx, st->files, sizeof *st->files * (size_t)st->capfiles);
  eqpi_free(ctx, st, sizeof *st);
}


/* Append n elements of size elem from src to the array *arr. */
static int append(eqp_ctx *ctx, void **arr, int *n, int *cap, const void *src, int m,
                  size_t elem)
{
  if (m == 0) return 0;
  if (*n + m > *cap) {
    int nc = *cap ? *cap : 16;
    while (nc < *n + m) nc *= 2;
    void *p = eqpi_realloc(ctx, *arr, elem * (size_t)*cap, elem * (size_t)nc);
    if (!p) return -1;
    *arr = p;
    *cap = nc;
  }
  memcpy((char *)*arr + elem * (size_t)*n, src, elem * (size_t)m);
  *n += m;
  return 0;
}

#define APPEND_ARR(a, n, cap) \
  append(ctx, (void **)&dst->a, &dst->n, &dst->cap, src->a, src->n, sizeof *src->a)

int eqpi_stage_append(eqp_ctx *ctx, eqpi_stage *dst, const eqpi_stage *src)
{
  return APPEND_ARR(sp, nsp, capsp) | APPEND_ARR(rx, nrx, caprx) | APPEND_ARR(rg, nrg, caprg) |
         APPEND_ARR(in, nin, capin) | APPEND_ARR(bf, nbf, capbf) | APPEND_ARR(gs, ngs, capgs) |
         APPEND_ARR(so, nso, capso) | APPEND_ARR(files, nfiles, capfiles) ? -1 : 0;
}

/* ------------------------------------------------------------ fingerprint */

typedef unsigned long long u64;

static u64 h_str(u64 h, const char *s)
{
  return s ? eqpi_hash_bytes(s, strlen(s) + 1, h) : eqpi_hash_bytes("\1", 1, h);
}

static u64 h_num(u64 h, double v) { return eqpi_hash_bytes(&v, sizeof v, h); }

static u64 h_pairs(u64 h, const st_pair *p, int n)
{
  h = h_num(h, n);
  for (int i = 0; i < n && p; i++) h = h_num(h_str(h, p[i].name), p[i].nu);
  return h;
}

static u64 h_strs(u64 h, const char *const *v, int n)
{
  h = h_num(h, n);
  for (int i = 0; i < n && v; i++) h = h_str(h, v[i]);
  return h;
}

static u64 h_const(u64 h, const st_const *k)
{
  h = h_num(h_num(h_num(h_num(h, k->logK), k->dH), k->dCp), k->tmodel);
  for (int i = 0; i < 6; i++) h = h_num(h, k->fn[i]);
  return h_str(h_num(h_num(h, k->Tmin), k->Tmax), k->source);
}

u64 eqpi_stage_fingerprint(const eqpi_stage *st)
{
  u64 h = eqpi_hash_bytes("eqp-stage", 9, 0);
  for (int i = 0; i < st->nsp; i++) {
    const st_species *s = &st->sp[i];
    h = h_str(h_str(h_num(h_str(h_str(h, s->name), s->formula), s->size), s->size_source),
              s->params_source);
    h = h_pairs(h, s->params, s->nparams);
  }
  for (int i = 0; i < st->nrx; i++)
    h = h_const(h_pairs(h_str(h, st->rx[i].product), st->rx[i].r, st->rx[i].n), &st->rx[i].k);
  for (int i = 0; i < st->nrg; i++) {
    const st_reagent *r = &st->rg[i];
    h = h_strs(h_str(h_str(h, r->name), r->formula), r->aliases, r->naliases);
    h = h_num(h_num(h_pairs(h, r->gives, r->n), r->hydrate), r->density);
    h = h_strs(h, r->hazards, r->nhazards);
  }
  for (int i = 0; i < st->nin; i++) {
    const st_inter *in = &st->in[i];
    h = h_pairs(h_str(h_str(h_str(h, in->a), in->b), in->source), in->params, in->n);
  }
  for (int i = 0; i < st->nbf; i++) {
    const st_buffer *b = &st->bf[i];
    h = h_str(h_str(h_str(h_str(h_str(h, b->name), b->acid), b->base), b->free), b->titrant);
    h = h_strs(h, b->notes, b->nnotes);
  }
  for (int i = 0; i < st->ngs; i++)
    h = h_const(h_str(h_str(h, st->gs[i].name), st->gs[i].dissolves), &st->gs[i].k);
  for (int i = 0; i < st->nso; i++) {
    const st_solid *s = &st->so[i];
    h = h_const(h_pairs(h_str(h_str(h, s->name), s->formula), s->dissolves, s->n), &s->k);
  }
  return h;
}
