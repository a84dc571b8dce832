/* Commit a staged species load: resolve names, check every reaction's and
** reagent's element and charge balance, resolve species onto components,
** and append to the database only if the whole load is correct. */
/* SPDX-License-Identifier: MIT */
#include "commit_impl.h"
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int eqpi_commit_constant(eqpi_stage *st, const st_const *k, const char *file, int line,
                         const char *what, eqpi_reaction *d)
{
  d->logK = k->logK;
  d->dH = k->dH;
  d->dCp = k->dCp;
  d->tmodel = k->tmodel;
  memcpy(d->fn, k->fn, sizeof d->fn);
  d->Tmin = k->Tmin;
  d->Tmax = k->Tmax;
  d->source = k->source;
  d->measured = k->measured;
  d->file = file;
  d->line = line;
  if (d->tmodel == EQPI_T_VANTHOFF) return 0;
  eqpi_tnotes notes = {0, 0};
  double at25 = eqpi_reaction_logK(d, EQPI_T25, &notes);
  if (fabs(at25 - d->logK) <= 0.02) return 0;
  eqpi_stage_error(st, file, line, "temperature function for %s gives %.4f at 298.15 K, but "
                   "its 25 C value is %.4f", what, at25, d->logK);
  return -1;
}

/* --------------------------------------------------------------- commit */

/* The committer and its name look-ups are shared with commit_extras.c. */

static void add_species(committer *c)
{
  eqpi_stage *st = c->st;
  for (int k = 0; k < st->nsp; k++) {
    const st_species *s = &st->sp[k];
    if (!s->name) continue;
    int prev = eqpi_commit_find_species(c, s->name);
    if (prev >= 0) {
      eqpi_stage_error(st, s->file, s->line, "duplicate species '%s' (first defined at %s:%d)",
                       s->name, c->sp[prev].file, c->sp[prev].line);
      continue;
    }
    eqpi_species *d = &c->sp[c->nsp];
    char err[256];
    double hyd;
    memset(d, 0, sizeof *d);
    if (eqpi_formula_parse(s->formula, &d->comp, &hyd, err, sizeof err) < 0) {
      eqpi_stage_error(st, s->file, s->line, "species '%s': %s", s->name, err);
      continue;
    }
    d->name = s->name;
    d->formula = s->formula;
    d->size = s->size;
    d->size_source = s->size_source;
    d->file = s->file;
    d->line = s->line;
    d->nparam = s->nparams;
    d->params_source = s->params_source;
    if (s->nparams) {
      d->pkey = eqpi_arena_alloc(c->ctx, &st->arena, sizeof(char *) * (size_t)s->nparams);
      d->pval = eqpi_arena_alloc(c->ctx, &st->arena, sizeof(double) * (size_t)s->nparams);
      if (!d->pkey || !d->pval) {
        eqpi_stage_error(st, NULL, 0, "out of memory");
        continue;
      }
      for (int q = 0; q < s->nparams; q++) {
        d->pkey[q] = s->params[q].name;
        d->pval[q] = s->params[q].nu;
      }
    }
    d->rxn = -1;
    d->component = -1;
    if (eqpi_index_put(c->ctx, &c->spnew, d->name, c->nsp, NULL) < 0) {
      eqpi_stage_error(st, NULL, 0, "out of memory");
      return;
    }
    c->nsp++;
  }
}

static void add_reactions(committer *c)
{
  char hint[256];
  eqpi_stage *st = c->st;
  for (int k = 0; k < st->nrx; k++) {
    const st_reaction *r = &st->rx[k];
    if (!r->product) continue;
    int p = eqpi_commit_find_species(c, r->product);
    if (p < 0) {
      eqpi_stage_error(st, r->file, r->line, "unknown species '%s'%s (declare it under 'species')",
                       r->product, eqpi_name_hint(r->product, hint, sizeof hint));
      continue;
    }
    if (p < c->db->nsp) {
      eqpi_stage_error(st, r->file, r->line, "species '%s' of %s:%d cannot be given a new "
                       "reaction here", r->product, c->sp[p].file, c->sp[p].line);
      continue;
    }
    if (c->sp[p].rxn >= 0) {
      const eqpi_reaction *o = &c->rx[c->sp[p].rxn];
      eqpi_stage_error(st, r->file, r->line, "duplicate reaction for '%s' (first at %s:%d)",
                       r->product, o->file, o->line);
      continue;
    }
    eqpi_reaction *d = &c->rx[c->nrx];
    memset(d, 0, sizeof *d);
    d->reactant = eqpi_arena_alloc(c->ctx, &st->arena, sizeof(int) * (size_t)(r->n + 1));
    d->nu = eqpi_arena_alloc(c->ctx, &st->arena, sizeof(double) * (size_t)(r->n + 1));
    if (!d->reactant || !d->nu) {
      eqpi_stage_error(st, NULL, 0, "out of memory");
      return;
    }
    eqpi_comp sum = {0};
    int bad = 0;
    for (int j = 0; j < r->n; j++) {
      int q = eqpi_commit_find_species(c, r->r[j].name);
      if (q < 0) {
        eqpi_stage_error(st, r->file, r->line, "reaction for '%s': unknown species '%s'%s",
                         r->product, r->r[j].name, eqpi_name_hint(r->r[j].name, hint, sizeof hint));
        bad = 1;
        continue;
      }
      if (q == p) {
        eqpi_stage_error(st, r->file, r->line, "reaction for '%s' uses '%s' itself",
                         r->product, r->product);
        bad = 1;
        continue;
      }
      d->reactant[j] = q;
      d->nu[j] = r->r[j].nu;
      eqpi_comp_add(&sum, &c->sp[q].comp, r->r[j].nu);
    }
    if (bad) continue;
    char diff[256];
    if (eqpi_comp_diff(&c->sp[p].comp, &sum, diff, sizeof diff)) {
      eqpi_stage_error(st, r->file, r->line, "unbalanced reaction for '%s' (%s minus "
                       "reactants: %s)", r->product, c->sp[p].formula, diff);
      continue;
    }
    d->product = p;
    d->n = r->n;
    char what[160];
    snprintf(what, sizeof what, "'%s'", r->product);
    if (eqpi_commit_constant(st, &r->k, r->file, r->line, what, d) < 0) continue;
    c->sp[p].rxn = c->nrx++;
  }
}

static int sparse_init(eqp_ctx *ctx, eqpi_sparse *a, int n)
{
  a->n = n;
  a->nidx = 0;
  a->v = eqpi_calloc(ctx, (size_t)n + 1, sizeof *a->v);
  a->idx = eqpi_malloc(ctx, sizeof *a->idx * ((size_t)n + 1));
  a->on = eqpi_calloc(ctx, (size_t)n + 1, 1);
  return a->v && a->idx && a->on ? 0 : -1;
}

static void sparse_free(eqp_ctx *ctx, eqpi_sparse *a)
{
  eqpi_free(ctx, a->v, sizeof *a->v * ((size_t)a->n + 1));
  eqpi_free(ctx, a->idx, sizeof *a->idx * ((size_t)a->n + 1));
  eqpi_free(ctx, a->on, (size_t)a->n + 1);
  memset(a, 0, sizeof *a);
}

static void sparse_add(eqpi_sparse *a, int i, double x)
{
  if (!a->on[i]) {
    a->on[i] = 1;
    a->idx[a->nidx++] = i;
  }
  a->v[i] += x;
}

static int cmp_int(const void *x, const void *y)
{
  int a = *(const int *)x, b = *(const int *)y;
  return (a > b) - (a < b);
}

/* The non-zero entries of a, in slot order, as arena arrays; a is reset.
** Returns their number, or -1 when out of memory. */
static int sparse_take(committer *c, eqpi_sparse *a, int **slot, double **val)
{
  qsort(a->idx, (size_t)a->nidx, sizeof *a->idx, cmp_int);
  int n = 0;
  for (int k = 0; k < a->nidx; k++) n += fabs(a->v[a->idx[k]]) > 1e-12;
  int *s = eqpi_arena_alloc(c->ctx, &c->st->arena, sizeof(int) * (size_t)(n + 1));
  double *v = eqpi_arena_alloc(c->ctx, &c->st->arena, sizeof(double) * (size_t)(n + 1));
  n = 0;
  for (int k = 0; k < a->nidx; k++) {
    int i = a->idx[k];
    if (s && v && fabs(a->v[i]) > 1e-12) {
      s[n] = i;
      v[n++] = a->v[i];
    }
    a->v[i] = 0;
    a->on[i] = 0;
  }
  a->nidx = 0;
  *slot = s;
  *val = v;
  return s && v ? n : -1;
}

/* Express species i on components, and its log K on reactions: its
** reactants first, then the sum of theirs. */
static int resolve(committer *c, int i, int depth)
{
  eqpi_species *s = &c->sp[i];
  if (c->state[i] == 2) return 0;
  if (c->state[i] == 1) {
    eqpi_stage_error(c->st, s->file, s->line, "reactions form a cycle through '%s'", s->name);
    return -1;
  }
  if (depth > 64) {
    eqpi_stage_error(c->st, s->file, s->line, "reactions nest more than 64 deep at '%s'",
                     s->name);
    return -1;
  }
  c->state[i] = 1;
  if (s->rxn < 0) {
    sparse_add(&c->comp, s->component, 1);
  } else {
    const eqpi_reaction *r = &c->rx[s->rxn];
    for (int j = 0; j < r->n; j++)
      if (resolve(c, r->reactant[j], depth + 1) < 0) return -1;
    sparse_add(&c->rxn, s->rxn, 1);
    for (int j = 0; j < r->n; j++) {
      const eqpi_species *q = &c->sp[r->reactant[j]];
      for (int t = 0; t < q->nterm; t++) sparse_add(&c->comp, q->term_comp[t], r->nu[j] * q->term_nu[t]);
      for (int t = 0; t < q->nrx; t++) sparse_add(&c->rxn, q->rx_idx[t], r->nu[j] * q->rx_c[t]);
    }
  }
  s->nterm = sparse_take(c, &c->comp, &s->term_comp, &s->term_nu);
  s->nrx = sparse_take(c, &c->rxn, &s->rx_idx, &s->rx_c);
  if (s->nterm < 0 || s->nrx < 0) {
    eqpi_stage_error(c->st, NULL, 0, "out of memory");
    return -1;
  }
  c->state[i] = 2;
  return 0;
}

/* A new reagent entry under name (indexed); its index, or -1. Room for a
** reagent per staged reagent and per staged species is reserved. */
static int push_reagent(committer *c, const char *name)
{
  memset(&c->rg[c->nrg], 0, sizeof c->rg[0]);
  c->rg[c->nrg].name = name;
  if (eqpi_index_put(c->ctx, &c->rgnew, name, c->nrg, NULL) < 0) return -1;
  return c->nrg++;
}

/* Resolve a reagent's release onto components; check its balance. */
static void finish_reagent(committer *c, eqpi_reagent *g, const st_pair *gives, int n)
{
  char hint[256];
  eqpi_stage *st = c->st;
  eqpi_comp f, sum = {0};
  char err[256];
  int water = eqpi_commit_find_species(c, "H2O");
  if (eqpi_formula_parse(g->formula, &f, &g->hydrate, err, sizeof err) < 0) {
    eqpi_stage_error(st, g->file, g->line, "reagent '%s': %s", g->name, err);
    return;
  }
  for (int i = 0; i < f.n; i++)
    if (eqpi_atomic_weight(f.el[i]) == 0)
      eqpi_stage_error(st, g->file, g->line, "reagent '%s': %s has no standard atomic weight",
                       g->name, eqpi_element_symbol(f.el[i]));
  g->molar_mass = eqpi_comp_mass(&f);
  g->sp = eqpi_arena_alloc(c->ctx, &st->arena, sizeof(int) * (size_t)(n + 1));
  g->nu = eqpi_arena_alloc(c->ctx, &st->arena, sizeof(double) * (size_t)(n + 1));
  if (!g->sp || !g->nu) {
    eqpi_stage_error(st, NULL, 0, "out of memory");
    return;
  }
  int bad = 0;
  for (int j = 0; j < n; j++) {
    int q = eqpi_commit_find_species(c, gives[j].name);
    if (q < 0) {
      eqpi_stage_error(st, g->file, g->line, "reagent '%s' gives unknown species '%s'%s",
                       g->name, gives[j].name, eqpi_name_hint(gives[j].name, hint, sizeof hint));
      bad = 1;
      continue;
    }
    g->sp[j] = q;
    g->nu[j] = gives[j].nu;
    eqpi_comp_add(&sum, &c->sp[q].comp, gives[j].nu);
    for (int t = 0; t < c->sp[q].nterm; t++)
      sparse_add(&c->comp, c->sp[q].term_comp[t], gives[j].nu * c->sp[q].term_nu[t]);
  }
  g->n = n;
  if (!bad && g->hydrate > 0) {
    if (water < 0) eqpi_stage_error(st, g->file, g->line, "hydrate needs species 'H2O'");
    else eqpi_comp_add(&sum, &c->sp[water].comp, g->hydrate);
  }
  char diff[256];
  if (!bad && eqpi_comp_diff(&f, &sum, diff, sizeof diff))
    eqpi_stage_error(st, g->file, g->line, "reagent '%s' is unbalanced (formula %s minus "
                     "what it gives: %s)", g->name, g->formula, diff);
  else if (!bad && fabs(f.charge) > 1e-9)
    eqpi_stage_error(st, g->file, g->line, "reagent '%s' is charged; reagents are neutral",
                     g->name);
  g->nterm = sparse_take(c, &c->comp, &g->term_comp, &g->term_nu);
  if (g->nterm < 0) {
    g->nterm = 0;
    eqpi_stage_error(st, NULL, 0, "out of memory");
  }
}

static void add_reagents(committer *c)
{
  eqpi_stage *st = c->st;
  for (int k = 0; k < st->nrg; k++) {
    const st_reagent *r = &st->rg[k];
    if (!r->name) continue;
    int prev = eqpi_commit_find_reagent(c, r->name);
    if (prev >= 0) {
      eqpi_stage_error(st, r->file, r->line, "duplicate reagent '%s' (first at %s:%d)",
                       r->name, c->rg[prev].file, c->rg[prev].line);
      continue;
    }
    for (int a = 0; a < r->naliases; a++)
      if (r->aliases[a] && (prev = eqpi_commit_find_reagent(c, r->aliases[a])) >= 0)
        eqpi_stage_error(st, r->file, r->line, "name '%s' is taken by reagent '%s' (%s:%d)",
                         r->aliases[a], c->rg[prev].name, c->rg[prev].file, c->rg[prev].line);
    int i = push_reagent(c, r->name);
    if (i < 0) { eqpi_stage_error(st, NULL, 0, "out of memory"); return; }
    for (int a = 0; a < r->naliases; a++)
      if (r->aliases[a] && eqpi_index_put(c->ctx, &c->rgnew, r->aliases[a], i, NULL) < 0) {
        eqpi_stage_error(st, NULL, 0, "out of memory");
        return;
      }
    eqpi_reagent *g = &c->rg[i];
    g->formula = r->formula;
    g->aliases = r->aliases;
    g->naliases = r->naliases;
    g->density = r->density;
    g->hazards = r->hazards;
    g->nhazards = r->nhazards;
    g->file = r->file;
    g->line = r->line;
    st_pair self = {r->name, 1};
    if (r->n == 0) {
      int q = eqpi_commit_find_species(c, r->name);
      if (q < 0 || fabs(c->sp[q].comp.charge) > 1e-9) {
        eqpi_stage_error(st, r->file, r->line, "reagent '%s' has no 'gives' and is not a "
                         "neutral species", r->name);
        continue;
      }
      g->formula = r->formula != r->name ? r->formula : c->sp[q].formula;
      finish_reagent(c, g, &self, 1);
    } else {
      finish_reagent(c, g, r->gives, r->n);
    }
  }
  /* Every new neutral solute is a reagent under its own name. */
  for (int i = c->db->nsp; i < c->nsp; i++) {
    const eqpi_species *s = &c->sp[i];
    if (fabs(s->comp.charge) > 1e-9 || strcmp(s->name, "H2O") == 0) continue;
    if (eqpi_commit_find_reagent(c, s->name) >= 0) continue;
    int k = push_reagent(c, s->name);
    if (k < 0) { eqpi_stage_error(st, NULL, 0, "out of memory"); return; }
    eqpi_reagent *g = &c->rg[k];
    g->formula = s->formula;
    g->density = NAN;
    g->file = s->file;
    g->line = s->line;
    st_pair self = {s->name, 1};
    finish_reagent(c, g, &self, 1);
  }
}

static void committer_free(committer *c)
{
  eqp_ctx *ctx = c->ctx;
  eqpi_free(ctx, c->state, (size_t)(c->db->nsp + c->st->nsp + 1));
  eqpi_index_free(ctx, &c->spnew);
  eqpi_index_free(ctx, &c->rgnew);
  sparse_free(ctx, &c->comp);
  sparse_free(ctx, &c->rxn);
}

/* What the stage can add at most, so that the library being made has room
** for it before anything is written (its arrays never move meanwhile). */
static void room_for(const eqpi_stage *st, int nrec, eqpi_room *r)
{
  memset(r, 0, sizeof *r);
  r->sp = st->nsp;
  r->rx = st->nrx;
  r->rg = st->nrg + st->nsp;        /* every new neutral species is a reagent too */
  r->comp = st->nsp;
  for (int k = 0; k < st->nin; k++) r->pairs += st->in[k].n;
  r->buffers = st->nbf;
  r->gases = st->ngs;
  r->solids = st->nso;
  r->files = st->nfiles;
  r->loaded = nrec;
}

/* Fill the new library's counts, lists of files and sources loaded. */
static int seal(committer *c, const eqpi_loaded *rec, int nrec)
{
  eqpi_db *out = c->out;
  eqpi_stage *st = c->st;
  out->nsp = c->nsp;
  out->nrx = c->nrx;
  out->nrg = c->nrg;
  out->ncomp = c->ncomp;
  out->npairs = c->npairs;
  out->nbuffers = c->nbuf;
  out->ngases = c->ngas;
  out->nsolids = c->nsol;
  for (int f = 0; f < st->nfiles; f++) out->files[out->nfiles++] = st->files[f];
  for (int k = 0; k < nrec; k++) {
    const char *key = eqpi_arena_strdup(c->ctx, &st->arena, rec[k].key);
    if (!key) return -1;
    out->loaded[out->nloaded].key = key;
    out->loaded[out->nloaded++].hash = rec[k].hash;
  }
  return eqpi_db_finish(out);
}

int eqpi_stage_commit(eqp_ctx *ctx, const eqpi_db *base, eqpi_stage *st, const eqpi_loaded *rec,
                      int nrec, eqpi_db **out)
{
  committer c;
  memset(&c, 0, sizeof c);
  *out = NULL;
  c.ctx = ctx;
  c.db = base;
  c.st = st;
  int rc = EQP_E_DATA;
  /* Shape errors found while staging do not stop the checks of names and
  ** balances below, so one run reports every problem; nothing is kept. */
  eqpi_room room;
  room_for(st, nrec, &room);
  c.out = eqpi_db_begin(ctx, base, &room, 0);
  c.state = eqpi_calloc(ctx, (size_t)(base->nsp + st->nsp + 1), 1);
  if (!c.out || !c.state) {
    rc = EQP_E_NOMEM;
    eqpi_stage_error(st, NULL, 0, "out of memory");
    goto fail;
  }
  c.sp = c.out->sp;
  c.nsp = base->nsp;
  c.rx = c.out->rx;
  c.nrx = base->nrx;
  c.rg = c.out->rg;
  c.nrg = base->nrg;
  c.comp_species = c.out->comp_species;
  c.ncomp = base->ncomp;
  c.pairs = c.out->pairs;
  c.npairs = base->npairs;
  c.buf = c.out->buffers;
  c.nbuf = base->nbuffers;
  c.gas = c.out->gases;
  c.ngas = base->ngases;
  c.sol = c.out->solids;
  c.nsol = base->nsolids;
  memset(c.state, 2, (size_t)base->nsp);
  add_species(&c);
  add_reactions(&c);
  for (int i = base->nsp; i < c.nsp; i++)
    if (c.sp[i].rxn < 0) {
      c.sp[i].component = c.ncomp;
      c.comp_species[c.ncomp++] = i;
    }
  if (st->nerr) goto fail;
  if (sparse_init(ctx, &c.comp, c.ncomp) < 0 || sparse_init(ctx, &c.rxn, c.nrx) < 0) {
    rc = EQP_E_NOMEM;
    eqpi_stage_error(st, NULL, 0, "out of memory");
    goto fail;
  }
  for (int i = base->nsp; i < c.nsp; i++)
    if (resolve(&c, i, 0) < 0) goto fail;
  add_reagents(&c);
  eqpi_commit_interactions(&c);
  eqpi_commit_buffers(&c);
  eqpi_commit_gases(&c);
  eqpi_commit_solids(&c);
  if (st->nerr) goto fail;
  if (seal(&c, rec, nrec) < 0) {
    rc = EQP_E_NOMEM;
    eqpi_stage_error(st, NULL, 0, "out of memory");
    goto fail;
  }
  /* the strings and arrays of the entries are the new library's now */
  eqpi_arena_splice(&c.out->arena, &st->arena);
  *out = c.out;
  c.out = NULL;
  committer_free(&c);
  return EQP_OK;
fail:
  eqpi_db_release(c.out);
  committer_free(&c);
  if (st->nerr > 1) {
    char tail[64];
    snprintf(tail, sizeof tail, "\n(%d problems)", st->nerr);
    if (st->errused + strlen(tail) < sizeof st->err) strcat(st->err, tail);
  }
  return eqpi_fail(ctx, rc, "%s", st->err);
}
