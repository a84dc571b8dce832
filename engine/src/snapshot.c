/* Species libraries as immutable, reference-counted snapshots.
**
** A library never changes once made: loading species makes a new one, and
** whoever holds the old one (a solution, a result) keeps seeing it. The
** entry arrays of a library live in a store it may share: the library made
** from the newest library of a store appends to that store, beyond what any
** holder sees, so a chain of loads costs what it adds. A library made from
** an older one, or that does not fit, gets a store of its own holding a
** copy of the older one's entry structs (their strings and arrays are not
** copied: each library keeps the one it was made from, and its strings,
** alive). When the newest library of a store goes, the store forgets what
** it added, so that making and dropping a library over and over (a library
** of its own for each solution of a loop) stays flat in memory. */
/* SPDX-License-Identifier: MIT */
#include "snapshot_impl.h"
#include <string.h>

enum { A_SP, A_RX, A_RG, A_COMP, A_PAIR, A_BUF, A_GAS, A_SOL, A_FILE, A_LOADED, A_N };

static const size_t elem_size[A_N] = {
  sizeof(eqpi_species), sizeof(eqpi_reaction), sizeof(eqpi_reagent), sizeof(int),
  sizeof(eqpi_pairparam), sizeof(eqpi_buffer), sizeof(eqpi_gas), sizeof(eqpi_solid),
  sizeof(const char *), sizeof(eqpi_loaded),
};

struct eqpi_store {
  void *arr[A_N];
  int cap[A_N];
  int used[A_N];        /* entries the newest library sees */
  eqpi_index spidx;     /* species by name */
  eqpi_index rgidx;     /* reagents by name and by alias */
  int views;            /* libraries whose arrays these are */
  eqpi_db *tip;         /* the library that sees all of it, or NULL */
};

static int *count_of(eqpi_db *db, int a)
{
  switch (a) {
  case A_SP: return &db->nsp;
  case A_RX: return &db->nrx;
  case A_RG: return &db->nrg;
  case A_COMP: return &db->ncomp;
  case A_PAIR: return &db->npairs;
  case A_BUF: return &db->nbuffers;
  case A_GAS: return &db->ngases;
  case A_SOL: return &db->nsolids;
  case A_FILE: return &db->nfiles;
  default: return &db->nloaded;
  }
}

static int room_of(const eqpi_room *r, int a)
{
  const int v[A_N] = {r->sp, r->rx, r->rg, r->comp, r->pairs, r->buffers, r->gases,
                      r->solids, r->files, r->loaded};
  return v[a];
}

/* Point the library's arrays at its store's. */
static void view(eqpi_db *db)
{
  eqpi_store *s = db->store;
  db->sp = s->arr[A_SP];
  db->rx = s->arr[A_RX];
  db->rg = s->arr[A_RG];
  db->comp_species = s->arr[A_COMP];
  db->pairs = s->arr[A_PAIR];
  db->buffers = s->arr[A_BUF];
  db->gases = s->arr[A_GAS];
  db->solids = s->arr[A_SOL];
  db->files = s->arr[A_FILE];
  db->loaded = s->arr[A_LOADED];
}

static void store_free(eqp_ctx *ctx, eqpi_store *s)
{
  for (int a = 0; a < A_N; a++) eqpi_free(ctx, s->arr[a], elem_size[a] * (size_t)s->cap[a]);
  eqpi_index_free(ctx, &s->spidx);
  eqpi_index_free(ctx, &s->rgidx);
  eqpi_free(ctx, s, sizeof *s);
}

/* Index the names of the species and reagents of db from the counts in
** from on; -1 when out of memory (the names put so far stay). */
static int index_names(eqp_ctx *ctx, eqpi_store *s, const eqpi_db *db, int sp0, int rg0)
{
  for (int i = sp0; i < db->nsp; i++)
    if (eqpi_index_put(ctx, &s->spidx, db->sp[i].name, i, NULL) < 0) return -1;
  for (int i = rg0; i < db->nrg; i++) {
    if (eqpi_index_put(ctx, &s->rgidx, db->rg[i].name, i, NULL) < 0) return -1;
    for (int k = 0; k < db->rg[i].naliases; k++)
      if (eqpi_index_put(ctx, &s->rgidx, db->rg[i].aliases[k], i, NULL) < 0) return -1;
  }
  return 0;
}

/* Take back from the index the names of db's entries from sp0 and rg0 on
** (each only where it points at that entry: the first holder keeps a name). */
static void unindex_names(eqp_ctx *ctx, eqpi_store *s, const eqpi_db *db, int sp0, int rg0)
{
  for (int i = sp0; i < db->nsp; i++)
    if (eqpi_index_get(&s->spidx, db->sp[i].name) == i)
      eqpi_index_del(ctx, &s->spidx, db->sp[i].name);
  for (int i = rg0; i < db->nrg; i++) {
    const eqpi_reagent *g = &db->rg[i];
    if (eqpi_index_get(&s->rgidx, g->name) == i) eqpi_index_del(ctx, &s->rgidx, g->name);
    for (int k = 0; k < g->naliases; k++)
      if (eqpi_index_get(&s->rgidx, g->aliases[k]) == i) eqpi_index_del(ctx, &s->rgidx, g->aliases[k]);
  }
}

/* A store with room for need[a] entries of each kind, holding a copy of
** the first n[a] entries of base's (n all 0 without base) and their names. */
static eqpi_store *store_new(eqp_ctx *ctx, const eqpi_db *base, const int *n, const int *need)
{
  eqpi_store *s = eqpi_calloc(ctx, 1, sizeof *s);
  if (!s) return NULL;
  for (int a = 0; a < A_N; a++) {
    if (eqpi_grow(ctx, &s->arr[a], &s->cap[a], need[a], elem_size[a]) < 0) goto nomem;
    if (n[a]) {
      const void *src[A_N] = {base->sp, base->rx, base->rg, base->comp_species, base->pairs,
                              base->buffers, base->gases, base->solids, base->files,
                              base->loaded};
      memcpy(s->arr[a], src[a], elem_size[a] * (size_t)n[a]);
    }
    s->used[a] = n[a];
  }
  if (base && index_names(ctx, s, base, 0, 0) < 0) goto nomem;
  return s;
nomem:
  store_free(ctx, s);
  return NULL;
}

eqpi_db *eqpi_db_begin(eqp_ctx *ctx, const eqpi_db *base, const eqpi_room *room, int fresh)
{
  eqpi_db *db = eqpi_calloc(ctx, 1, sizeof *db);
  if (!db) return NULL;
  db->ctx = ctx;
  db->refs = 1;
  db->h_plus = db->water = -1;
  eqpi_db *b = (eqpi_db *)base;
  int n[A_N], need[A_N], fits = b && !fresh && b->store && b->store->tip == b;
  for (int a = 0; a < A_N; a++) {
    n[a] = b && !fresh ? *count_of(b, a) : 0;
    need[a] = n[a] + room_of(room, a);
    if (need[a] < n[a]) {               /* overflow */
      eqpi_free(ctx, db, sizeof *db);
      return NULL;
    }
    if (fits && need[a] > b->store->cap[a]) fits = 0;
  }
  if (fits) {
    db->store = b->store;
  } else {
    /* a store of its own: twice what it needs now, so that the libraries
    ** made from it in turn append for a while */
    for (int a = 0; a < A_N; a++) need[a] += need[a] < (1 << 29) ? need[a] : 0;
    if (!(db->store = store_new(ctx, b && !fresh ? b : NULL, n, need))) {
      eqpi_free(ctx, db, sizeof *db);
      return NULL;
    }
  }
  db->live_next = ctx->live;
  if (ctx->live) ctx->live->live_prev = db;
  ctx->live = db;
  db->store->views++;
  db->store->tip = db;      /* a second draft on base now gets a store of its own */
  view(db);
  for (int a = 0; a < A_N; a++) *count_of(db, a) = n[a];
  if (b && !fresh) {
    db->h_plus = b->h_plus;
    db->water = b->water;
  }
  if (b) {
    db->parent = b;
    b->kids++;
  }
  return db;
}

int eqpi_db_finish(eqpi_db *db)
{
  eqpi_store *s = db->store;
  /* the store's index holds the names of what it held before this draft */
  int sp0 = s->used[A_SP], rg0 = s->used[A_RG];
  if (index_names(db->ctx, s, db, sp0, rg0) < 0) {
    unindex_names(db->ctx, s, db, sp0, rg0);
    return -1;
  }
  for (int a = 0; a < A_N; a++) s->used[a] = *count_of(db, a);
  db->h_plus = eqpi_db_find_species(db, "H+");
  db->water = eqpi_db_find_species(db, "H2O");
  db->generation = ++db->ctx->next_generation;
  return 0;
}

eqpi_db *eqpi_db_new_empty(eqp_ctx *ctx)
{
  eqpi_room none = {0};
  eqpi_db *db = eqpi_db_begin(ctx, NULL, &none, 1);
  if (db && eqpi_db_finish(db) < 0) {
    eqpi_db_release(db);
    return NULL;
  }
  return db;
}

eqpi_db *eqpi_db_ref(const eqpi_db *db)
{
  eqpi_db *d = (eqpi_db *)db;      /* the count is bookkeeping, not content */
  if (d) d->refs++;
  return d;
}

/* Free what is left of libraries nobody holds and nothing was made from. */
static void destroy(eqpi_db *db)
{
  while (db && db->refs == 0 && db->kids == 0) {
    eqpi_db *parent = db->parent;
    eqp_ctx *ctx = db->ctx;
    eqpi_arena_free(ctx, &db->arena);
    eqpi_free(ctx, db, sizeof *db);
    if (parent) parent->kids--;
    db = parent;
  }
}

static void forget_derived(eqpi_db *db)
{
  eqpi_db *p = db->parent;
  if (!p || !db->how) return;
  for (eqpi_db **q = &p->derived; *q; q = &(*q)->next_derived)
    if (*q == db) {
      *q = db->next_derived;
      break;
    }
  db->how = 0;
}

void eqpi_db_release(const eqpi_db *cdb)
{
  eqpi_db *db = (eqpi_db *)cdb;
  if (!db || --db->refs > 0) return;
  forget_derived(db);
  if (db->live_prev) db->live_prev->live_next = db->live_next;
  else db->ctx->live = db->live_next;
  if (db->live_next) db->live_next->live_prev = db->live_prev;
  eqpi_store *s = db->store;
  if (s) {
    if (s->tip == db) {
      /* the store forgets what this library added: its parent, if it
      ** still sees this store, is the newest again */
      eqpi_db *p = db->parent;
      if (p && p->store == s) {
        unindex_names(db->ctx, s, db, p->nsp, p->nrg);
        for (int a = 0; a < A_N; a++) s->used[a] = *count_of(p, a);
        s->tip = p;
      } else {
        s->tip = NULL;
      }
    }
    db->store = NULL;
    if (--s->views == 0) store_free(db->ctx, s);
  }
  destroy(db);
}

eqpi_db *eqpi_db_derived(const eqpi_db *base, unsigned long long how)
{
  for (eqpi_db *d = base ? base->derived : NULL; d; d = d->next_derived)
    if (d->how == how) return eqpi_db_ref(d);
  return NULL;
}

void eqpi_db_remember(eqpi_db *lib, unsigned long long how)
{
  eqpi_db *p = lib->parent;
  if (!p || !how || lib->how) return;
  lib->how = how;
  lib->next_derived = p->derived;
  p->derived = lib;
}

int eqpi_db_loaded(const eqpi_db *db, const char *key, unsigned long long hash)
{
  for (int i = 0; i < db->nloaded; i++)
    if (db->loaded[i].hash == hash && strcmp(db->loaded[i].key, key) == 0) return 1;
  return 0;
}

void eqpi_ctx_set_library(eqp_ctx *ctx, eqpi_db *lib)
{
  if (lib == ctx->db) {
    eqpi_db_release(lib);
    return;
  }
  eqpi_db_release(ctx->db);
  ctx->db = lib;
}

const eqpi_db *eqpi_ctx_libraries(const eqp_ctx *ctx) { return ctx->live; }

/* The index of a library's store, for the look-ups in db.c. */
int eqpi_db_index_species(const eqpi_db *db, const char *name)
{
  int i = db->store ? eqpi_index_get(&db->store->spidx, name) : -1;
  return i < db->nsp ? i : -1;
}

int eqpi_db_index_reagent(const eqpi_db *db, const char *name)
{
  int i = db->store ? eqpi_index_get(&db->store->rgidx, name) : -1;
  return i < db->nrg ? i : -1;
}
