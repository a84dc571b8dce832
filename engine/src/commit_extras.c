/* Committing the entries beyond species, reactions and reagents: pair
** interactions, buffer systems, gases and solids. */
/* SPDX-License-Identifier: MIT */
#include "commit_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

int eqpi_commit_find_species(const committer *c, const char *name)
{
  int i = eqpi_db_find_species(c->db, name);
  return i >= 0 ? i : eqpi_index_get(&c->spnew, name);
}

int eqpi_commit_find_reagent(const committer *c, const char *name)
{
  int i = eqpi_db_find_reagent(c->db, name);
  return i >= 0 ? i : eqpi_index_get(&c->rgnew, name);
}

/* "a b key" with a <= b: the name of a pair parameter in an index. */
static const char *pair_key(committer *c, eqpi_arena **tmp, int a, int b, const char *key)
{
  char buf[320];
  snprintf(buf, sizeof buf, "%d %d %s", a < b ? a : b, a < b ? b : a, key);
  return eqpi_arena_strdup(c->ctx, tmp, buf);
}

/* Resolve the names of each interaction; a pair and key given twice is an
** error. The new parameters go to c->pairs after the existing ones (room
** for all of them is reserved). */
void eqpi_commit_interactions(committer *c)
{
  char hint[256];
  eqpi_stage *st = c->st;
  if (!st->nin) return;
  eqpi_arena *tmp = NULL;
  eqpi_index seen = {0};
  for (int q = 0; q < c->npairs; q++) {
    const char *k = pair_key(c, &tmp, c->pairs[q].a, c->pairs[q].b, c->pairs[q].key);
    if (!k || eqpi_index_put(c->ctx, &seen, k, q, NULL) < 0) goto nomem;
  }
  for (int k = 0; k < st->nin; k++) {
    const st_inter *in = &st->in[k];
    if (!in->a || !in->b) continue;
    int a = eqpi_commit_find_species(c, in->a), b = eqpi_commit_find_species(c, in->b);
    if (a < 0 || b < 0) {
      eqpi_stage_error(st, in->file, in->line, "interaction: unknown species '%s'%s",
                       a < 0 ? in->a : in->b, eqpi_name_hint(a < 0 ? in->a : in->b, hint, sizeof hint));
      continue;
    }
    for (int p = 0; p < in->n; p++) {
      const char *pk = pair_key(c, &tmp, a, b, in->params[p].name);
      int q, put = pk ? eqpi_index_put(c->ctx, &seen, pk, c->npairs, &q) : -1;
      if (put < 0) goto nomem;
      if (put == 1) {
        const eqpi_pairparam *o = &c->pairs[q];
        eqpi_stage_error(st, in->file, in->line, "duplicate %s for %s and %s (first at %s:%d)",
                         o->key, in->a, in->b, o->file, o->line);
      }
      eqpi_pairparam *d = &c->pairs[c->npairs++];
      d->a = a;
      d->b = b;
      d->key = in->params[p].name;
      d->value = in->params[p].nu;
      d->source = in->source;
      d->file = in->file;
      d->line = in->line;
    }
  }
  goto out;
nomem:
  eqpi_stage_error(st, NULL, 0, "out of memory");
out:
  eqpi_index_free(c->ctx, &seen);
  eqpi_arena_free(c->ctx, &tmp);
}

/* An index of the names of n entries of size elem whose name is the
** first member; -1 when out of memory. */
static int index_names(committer *c, eqpi_index *ix, const void *arr, int n, size_t elem)
{
  for (int q = 0; q < n; q++) {
    const char *name = *(const char *const *)(const void *)((const char *)arr + elem * (size_t)q);
    if (eqpi_index_put(c->ctx, ix, name, q, NULL) < 0) return -1;
  }
  return 0;
}

/* Record name at position q in ix; 1 and *first set when it is taken. */
static int name_taken(committer *c, eqpi_index *ix, const char *name, int q, int *first)
{
  int put = eqpi_index_put(c->ctx, ix, name, q, first);
  if (put < 0) eqpi_stage_error(c->st, NULL, 0, "out of memory");
  return put == 1;
}

static int buffer_reagent(committer *c, const st_buffer *b, const char *name)
{
  if (!name) return -1;
  int g = eqpi_commit_find_reagent(c, name);
  if (g < 0)
    eqpi_stage_error(c->st, b->file, b->line, "buffer '%s': unknown reagent '%s'", b->name, name);
  return g;
}

void eqpi_commit_buffers(committer *c)
{
  eqpi_stage *st = c->st;
  eqpi_index seen = {0};
  if (!st->nbf) return;
  if (index_names(c, &seen, c->buf, c->nbuf, sizeof *c->buf) < 0) {
    eqpi_stage_error(st, NULL, 0, "out of memory");
    eqpi_index_free(c->ctx, &seen);
    return;
  }
  for (int k = 0; k < st->nbf; k++) {
    const st_buffer *b = &st->bf[k];
    if (!b->name) continue;
    int q;
    if (name_taken(c, &seen, b->name, c->nbuf, &q))
      eqpi_stage_error(st, b->file, b->line, "duplicate buffer '%s' (first at %s:%d)",
                       b->name, c->buf[q].file, c->buf[q].line);
    eqpi_buffer *d = &c->buf[c->nbuf++];
    d->name = b->name;
    d->acid = buffer_reagent(c, b, b->acid);
    d->base = buffer_reagent(c, b, b->base);
    d->free = buffer_reagent(c, b, b->free);
    d->titrant = buffer_reagent(c, b, b->titrant);
    d->notes = b->notes;
    d->nnotes = b->nnotes;
    d->file = b->file;
    d->line = b->line;
  }
  eqpi_index_free(c->ctx, &seen);
}

void eqpi_commit_gases(committer *c)
{
  char hint[256];
  eqpi_stage *st = c->st;
  eqpi_index seen = {0};
  if (!st->ngs) return;
  if (index_names(c, &seen, c->gas, c->ngas, sizeof *c->gas) < 0) {
    eqpi_stage_error(st, NULL, 0, "out of memory");
    eqpi_index_free(c->ctx, &seen);
    return;
  }
  for (int k = 0; k < st->ngs; k++) {
    const st_gas *g = &st->gs[k];
    if (!g->name || !g->dissolves) continue;
    int sp = eqpi_commit_find_species(c, g->dissolves);
    if (sp < 0) {
      eqpi_stage_error(st, g->file, g->line, "gas '%s' dissolves as unknown species '%s'%s",
                       g->name, g->dissolves, eqpi_name_hint(g->dissolves, hint, sizeof hint));
      continue;
    }
    if (fabs(c->sp[sp].comp.charge) > 1e-9) {
      eqpi_stage_error(st, g->file, g->line, "gas '%s' must dissolve as a neutral species",
                       g->name);
      continue;
    }
    int q;
    if (name_taken(c, &seen, g->name, c->ngas, &q))
      eqpi_stage_error(st, g->file, g->line, "duplicate gas '%s' (first at %s:%d)", g->name,
                       c->gas[q].kh.file, c->gas[q].kh.line);
    eqpi_gas *d = &c->gas[c->ngas++];
    memset(d, 0, sizeof *d);
    d->name = g->name;
    d->species = sp;
    d->kh.product = sp;
    char what[160];
    snprintf(what, sizeof what, "gas '%s'", g->name);
    eqpi_commit_constant(st, &g->k, g->file, g->line, what, &d->kh);
  }
  eqpi_index_free(c->ctx, &seen);
}

void eqpi_commit_solids(committer *c)
{
  char hint[256];
  eqpi_stage *st = c->st;
  eqpi_index seen = {0};
  if (!st->nso) return;
  if (index_names(c, &seen, c->sol, c->nsol, sizeof *c->sol) < 0) {
    eqpi_stage_error(st, NULL, 0, "out of memory");
    eqpi_index_free(c->ctx, &seen);
    return;
  }
  for (int k = 0; k < st->nso; k++) {
    const st_solid *g = &st->so[k];
    if (!g->name || !g->formula) continue;
    int q = eqpi_index_get(&seen, g->name);
    if (q >= 0) {
      eqpi_stage_error(st, g->file, g->line, "duplicate solid '%s' (first at %s:%d)", g->name,
                       c->sol[q].ksp.file, c->sol[q].ksp.line);
      continue;
    }
    eqpi_comp f, sum = {0};
    char err[256], diff[256];
    if (eqpi_formula_parse(g->formula, &f, NULL, err, sizeof err) < 0) {
      eqpi_stage_error(st, g->file, g->line, "solid '%s': %s", g->name, err);
      continue;
    }
    int *sp = eqpi_arena_alloc(c->ctx, &st->arena, sizeof(int) * (size_t)(g->n + 1));
    double *nu = eqpi_arena_alloc(c->ctx, &st->arena, sizeof(double) * (size_t)(g->n + 1));
    if (!sp || !nu) { eqpi_stage_error(st, NULL, 0, "out of memory"); break; }
    int bad = 0;
    for (int j = 0; j < g->n; j++) {
      sp[j] = eqpi_commit_find_species(c, g->dissolves[j].name);
      nu[j] = g->dissolves[j].nu;
      if (sp[j] < 0) {
        eqpi_stage_error(st, g->file, g->line, "solid '%s' dissolves to unknown species '%s'%s",
                         g->name, g->dissolves[j].name,
                         eqpi_name_hint(g->dissolves[j].name, hint, sizeof hint));
        bad = 1;
      } else {
        eqpi_comp_add(&sum, &c->sp[sp[j]].comp, nu[j]);
      }
    }
    if (bad) continue;
    if (eqpi_comp_diff(&f, &sum, diff, sizeof diff)) {
      eqpi_stage_error(st, g->file, g->line, "solid '%s' is unbalanced (%s minus what it "
                       "dissolves to: %s)", g->name, g->formula, diff);
      continue;
    }
    if (name_taken(c, &seen, g->name, c->nsol, &q)) break;   /* only out of memory */
    eqpi_solid *d = &c->sol[c->nsol++];
    memset(d, 0, sizeof *d);
    d->name = g->name;
    d->formula = g->formula;
    d->n = g->n;
    d->sp = sp;
    d->nu = nu;
    d->ksp.product = -1;
    char what[160];
    snprintf(what, sizeof what, "solid '%s'", g->name);
    eqpi_commit_constant(st, &g->k, g->file, g->line, what, &d->ksp);
  }
  eqpi_index_free(c->ctx, &seen);
}
