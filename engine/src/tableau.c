/* The tableau of the components present (Morel's tableau method: every
** species a product of components with a formation constant): species,
** stoichiometry by species and by component, charges, ion sizes, log K at
** the temperature, and each component's acid ladder. One allocation,
** immutable once built. */
/* SPDX-License-Identifier: MIT */
#include "tableau_impl.h"
#include <string.h>

static int species_present(const eqpi_db *db, int i, const unsigned char *mask)
{
  if (i == db->water) return 0;
  const eqpi_species *s = &db->sp[i];
  for (int t = 0; t < s->nterm; t++) {
    int c = s->term_comp[t];
    if (db->comp_species[c] != db->water && !mask[c]) return 0;
  }
  return 1;
}

/* Carve aligned arrays out of one block: a first pass (base NULL) sizes it. */
typedef struct carver { char *base; size_t used; } carver;

static void *carve(carver *k, size_t n, size_t align)
{
  k->used = (k->used + align - 1) / align * align;
  void *p = k->base ? k->base + k->used : NULL;
  k->used += n ? n : 1;
  return p;
}

#define CARVE(k, p, n) ((p) = carve((k), sizeof *(p) * (size_t)(n), _Alignof(__typeof__(*(p)))))

typedef struct layout {
  unsigned char *active, *closed;
  int *comp, *comp_sp, *sp, *row, *cmp, *col, *csp, *lad, *ladsp;
  const char **names;
  double *z, *z2, *size, *lnK, *nu, *cnu;
  int *sol, *srow, *ssp, *own, *ownsp;
  double *snu, *slogK, *ownc, *ownh;
} layout;

/* Whether every species of solid k but water is present. */
static int solid_present(const eqpi_db *db, int k, const unsigned char *mask)
{
  const eqpi_solid *s = &db->solids[k];
  for (int j = 0; j < s->n; j++)
    if (s->sp[j] != db->water && !species_present(db, s->sp[j], mask)) return 0;
  return 1;
}

/* The solids present with their terms over local species, once l->sp is
** filled. */
static void fill_solids(const eqpi_db *db, const unsigned char *mask, layout *l, int ns,
                        double T)
{
  int n = 0, t = 0;
  for (int k = 0; k < db->nsolids; k++) {
    if (!solid_present(db, k, mask)) continue;
    const eqpi_solid *s = &db->solids[k];
    l->sol[n] = k;
    l->srow[n] = t;
    eqpi_tnotes notes = {0, 0};
    l->slogK[n++] = eqpi_reaction_logK(&s->ksp, T, &notes);
    for (int j = 0; j < s->n; j++) {
      if (s->sp[j] == db->water) continue;      /* unit activity */
      l->ssp[t] = eqpi_find_sorted(l->sp, ns, s->sp[j]);
      l->snu[t++] = s->nu[j];
    }
  }
  l->srow[n] = t;
}

static void carve_all(carver *k, layout *l, int ncg, int nc, int ns, int nnz, int nlad,
                      int nsol, int nst)
{
  CARVE(k, l->ownc, nnz);
  CARVE(k, l->ownh, nnz);
  CARVE(k, l->own, nc + 1);
  CARVE(k, l->ownsp, nnz);
  CARVE(k, l->snu, nst);
  CARVE(k, l->slogK, nsol);
  CARVE(k, l->sol, nsol);
  CARVE(k, l->srow, nsol + 1);
  CARVE(k, l->ssp, nst);
  CARVE(k, l->z, ns);
  CARVE(k, l->z2, ns);
  CARVE(k, l->size, ns);
  CARVE(k, l->lnK, ns);
  CARVE(k, l->nu, nnz);
  CARVE(k, l->cnu, nnz);
  CARVE(k, l->names, ns);
  CARVE(k, l->comp, nc);
  CARVE(k, l->comp_sp, nc);
  CARVE(k, l->sp, ns);
  CARVE(k, l->row, ns + 1);
  CARVE(k, l->cmp, nnz);
  CARVE(k, l->col, nc + 1);
  CARVE(k, l->csp, nnz);
  CARVE(k, l->lad, nc + 1);
  CARVE(k, l->ladsp, nlad);
  CARVE(k, l->active, ncg);
  CARVE(k, l->closed, nc);
}

/* Acid ladders from the own species (fill_own): those with one c each
** are c's protonation states; closed[c] when they are all of c's species. */
static void fill_ladders(layout *l, int nc, int h, int *nlad)
{
  int n = 0;
  for (int c = 0; c < nc; c++) {
    l->lad[c] = n;
    for (int t = l->own[c]; t < l->own[c + 1]; t++)
      if (l->ownc[t] == 1) l->ladsp[n++] = l->ownsp[t];
    l->closed[c] = c != h && n - l->lad[c] == l->col[c + 1] - l->col[c];
  }
  l->lad[nc] = n;
  *nlad = n;
}

/* For each component but H+, the species of it and H+ alone. */
static void fill_own(layout *l, int nc, int h)
{
  int n = 0;
  for (int c = 0; c < nc; c++) {
    l->own[c] = n;
    for (int t = l->col[c]; t < l->col[c + 1] && c != h; t++) {
      int i = l->csp[t];
      if (l->cnu[t] <= 0) continue;
      int alone = 1;
      double nh = 0;
      for (int j = l->row[i]; j < l->row[i + 1] && alone; j++) {
        alone = l->cmp[j] == c || l->cmp[j] == h;
        if (l->cmp[j] == h) nh = l->nu[j];
      }
      if (!alone) continue;
      l->ownsp[n] = i;
      l->ownc[n] = l->cnu[t];
      l->ownh[n++] = nh;
    }
  }
  l->own[nc] = n;
}

/* Stoichiometry by species (CSR) and by component (CSC). */
static void fill_terms(const eqpi_db *db, layout *l, const int *loc, int nc, int ns)
{
  int t = 0;
  for (int i = 0; i < ns; i++) {
    const eqpi_species *s = &db->sp[l->sp[i]];
    l->row[i] = t;
    for (int k = 0; k < s->nterm; k++) {
      int c = loc[s->term_comp[k]];
      if (c < 0 || s->term_nu[k] == 0) continue;   /* water */
      l->cmp[t] = c;
      l->nu[t++] = s->term_nu[k];
    }
  }
  l->row[ns] = t;
  for (int c = 0; c <= nc; c++) l->col[c] = 0;
  for (int k = 0; k < t; k++) l->col[l->cmp[k] + 1]++;
  for (int c = 0; c < nc; c++) l->col[c + 1] += l->col[c];
  int *next = l->lad;   /* borrowed as a cursor before the ladders are made */
  for (int c = 0; c < nc; c++) next[c] = l->col[c];
  for (int i = 0; i < ns; i++)
    for (int k = l->row[i]; k < l->row[i + 1]; k++) {
      int p = next[l->cmp[k]]++;
      l->csp[p] = i;
      l->cnu[p] = l->nu[k];
    }
}

eqpi_tableau *eqpi_tableau_new(eqp_ctx *ctx, const eqpi_db *db, const unsigned char *mask,
                               double T)
{
  int ncg = db->ncomp, nc = 0, ns = 0, nnz = 0;
  int stack[256], *loc = ncg <= 256 ? stack : eqpi_malloc(ctx, sizeof(int) * (size_t)ncg);
  if (!loc) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"), NULL;
  for (int c = 0; c < ncg; c++)
    loc[c] = mask[c] && db->comp_species[c] != db->water ? nc++ : -1;
  for (int i = 0; i < db->nsp; i++)
    if (species_present(db, i, mask)) {
      ns++;
      nnz += db->sp[i].nterm;
    }
  int nsol = 0, nst = 0;
  for (int q = 0; q < db->nsolids; q++)
    if (solid_present(db, q, mask)) {
      nsol++;
      nst += db->solids[q].n;
    }
  /* ladders: at most one entry per species per component it holds */
  carver k = {NULL, sizeof(eqpi_tableau)};
  layout l = {0};
  carve_all(&k, &l, ncg, nc, ns, nnz, nnz, nsol, nst);
  eqpi_tableau *tb = eqpi_calloc(ctx, 1, k.used);
  if (!tb) {
    if (loc != stack) eqpi_free(ctx, loc, sizeof(int) * (size_t)ncg);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"), NULL;
  }
  tb->bytes = k.used;
  k.base = (char *)tb;
  k.used = sizeof(eqpi_tableau);
  carve_all(&k, &l, ncg, nc, ns, nnz, nnz, nsol, nst);
  memcpy(l.active, mask, (size_t)ncg);
  for (int c = 0; c < ncg; c++)
    if (loc[c] >= 0) l.comp[loc[c]] = c;
  int h = loc[db->sp[db->h_plus].component];
  eqpi_tnotes notes = {0, 0};
  for (int i = 0, j = 0; i < db->nsp; i++) {
    if (!species_present(db, i, mask)) continue;
    const eqpi_species *s = &db->sp[i];
    l.sp[j] = i;
    l.names[j] = s->name;
    l.z[j] = s->comp.charge;
    l.z2[j] = s->comp.charge * s->comp.charge;
    l.size[j] = s->size;
    l.lnK[j] = EQPI_LN10 * eqpi_species_logK(db, i, T, &notes);
    if (s->component >= 0 && loc[s->component] >= 0) l.comp_sp[loc[s->component]] = j;
    j++;
  }
  fill_terms(db, &l, loc, nc, ns);
  fill_solids(db, mask, &l, ns, T);
  fill_own(&l, nc, h);
  int nlad;
  fill_ladders(&l, nc, h, &nlad);
  if (loc != stack) eqpi_free(ctx, loc, sizeof(int) * (size_t)ncg);
  tb->db = db;
  tb->generation = db->generation;
  tb->ncg = ncg;
  tb->active = l.active;
  tb->T = T;
  tb->nc = nc;
  tb->comp = l.comp;
  tb->comp_sp = l.comp_sp;
  tb->hloc = h;
  tb->ns = ns;
  tb->sp = l.sp;
  tb->names = l.names;
  tb->z = l.z;
  tb->z2 = l.z2;
  tb->size = l.size;
  tb->lnK = l.lnK;
  tb->missing_T = notes.missing;
  tb->outside_T = notes.outside;
  eqpi_debye_huckel_AB(T, &tb->A, &tb->B);
  tb->rho = eqpi_water_density(T);
  tb->row = l.row;
  tb->cmp = l.cmp;
  tb->nu = l.nu;
  tb->col = l.col;
  tb->csp = l.csp;
  tb->cnu = l.cnu;
  tb->lad = l.lad;
  tb->ladsp = l.ladsp;
  tb->closed = l.closed;
  tb->own = l.own;
  tb->ownsp = l.ownsp;
  tb->ownc = l.ownc;
  tb->ownh = l.ownh;
  tb->nsol = nsol;
  tb->sol = l.sol;
  tb->srow = l.srow;
  tb->ssp = l.ssp;
  tb->snu = l.snu;
  tb->slogK = l.slogK;
  return tb;
}

void eqpi_tableau_free(eqp_ctx *ctx, eqpi_tableau *t)
{
  if (t) eqpi_free(ctx, t, t->bytes);
}

double eqpi_tableau_nu(const eqpi_tableau *t, int i, int c)
{
  for (int k = t->row[i]; k < t->row[i + 1]; k++)
    if (t->cmp[k] == c) return t->nu[k];
  return 0;
}

/* ------------------------------------------------------------ sharing */

/* The same library (generations are never reused), components and T. */
static int same(const eqpi_tableau *t, const eqpi_db *db, const unsigned char *mask, double T)
{
  return t->generation == db->generation && t->ncg == db->ncomp && t->T == T &&
         memcmp(t->active, mask, (size_t)t->ncg) == 0;
}

eqpi_tableau *eqpi_tableau_get(eqp_ctx *ctx, const eqpi_db *db, const unsigned char *mask,
                               double T)
{
  eqpi_tableau **cache = ctx->tableaux;
  for (int k = 0; k < EQPI_TABLEAU_CACHE; k++)
    if (cache[k] && same(cache[k], db, mask, T)) {
      cache[k]->refs++;
      return cache[k];
    }
  eqpi_tableau *t = eqpi_tableau_new(ctx, db, mask, T);
  if (!t) return NULL;
  t->refs = 1;
  /* a free slot, or one whose tableau no system uses (the oldest first) */
  for (int k = 0; k < EQPI_TABLEAU_CACHE; k++)
    if (!cache[k] || cache[k]->refs == 0) {
      if (cache[k]) eqpi_tableau_free(ctx, cache[k]);
      for (int j = k; j + 1 < EQPI_TABLEAU_CACHE; j++) cache[j] = cache[j + 1];
      cache[EQPI_TABLEAU_CACHE - 1] = t;
      t->cached = 1;
      break;
    }
  return t;
}

void eqpi_tableau_release(eqp_ctx *ctx, eqpi_tableau *t)
{
  if (!t) return;
  if (t->refs) t->refs--;
  if (t->refs == 0 && !t->cached) eqpi_tableau_free(ctx, t);
}

void eqpi_tableau_cache_free(eqp_ctx *ctx)
{
  for (int k = 0; k < EQPI_TABLEAU_CACHE; k++) {
    eqpi_tableau *t = ctx->tableaux[k];
    if (!t) continue;
    if (t->refs == 0) eqpi_tableau_free(ctx, t);
    else t->cached = 0;     /* its last system frees it */
    ctx->tableaux[k] = NULL;
  }
}
