/* Provenance: the constants a set of species and reagents depends on, each
** with its value, its temperature dependence and its source, as the
** species files give them. Acid steps are shown as dissociations with pKa,
** other reactions as formations with log K. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

typedef struct walk {
  eqp_ctx *ctx;
  const eqpi_db *db;        /* the library walked */
  eqpi_index *seen;         /* constants reported, over every library */
  eqpi_arena **keys;
  unsigned char *comp;      /* components involved */
  unsigned char *sp;        /* species that can form from them */
  unsigned char *rx;        /* reactions already reported */
  eqp_constant_fn fn;
  void *ud;
} walk;

static void mark_terms(walk *w, int nterm, const int *term_comp, const double *term_nu)
{
  for (int t = 0; t < nterm; t++)
    if (term_nu[t] != 0) w->comp[term_comp[t]] = 1;
}

static int formed(const walk *w, const eqpi_species *s)
{
  for (int t = 0; t < s->nterm; t++)
    if (s->term_nu[t] != 0 && !w->comp[s->term_comp[t]]) return 0;
  return 1;
}

/* Report k unless a library walked before reported it. */
static void emit(walk *w, const eqp_constant *k)
{
  char key[4400];
  snprintf(key, sizeof key, "%s:%d:%s", k->file, k->line, k->equation);
  const char *kk = eqpi_arena_strdup(w->ctx, w->keys, key);
  if (!kk || eqpi_index_put(w->ctx, w->seen, kk, 0, NULL) == 0) w->fn(w->ud, k);
}

static void temperature_words(const eqpi_reaction *r, char *buf, size_t len)
{
  if (r->tmodel == EQPI_T_WATER)
    snprintf(buf, len, "IAPWS R11-07 formulation of Kw (Bandura & Lvov 2006) at every temperature");
  else if (r->tmodel == EQPI_T_FUNCTION && !isnan(r->Tmin))
    snprintf(buf, len, "published function of T, %.2f to %.2f K", r->Tmin, r->Tmax);
  else if (r->tmodel == EQPI_T_FUNCTION)
    snprintf(buf, len, "published function of T");
  else if (!isnan(r->dH) && !isnan(r->dCp))
    snprintf(buf, len, "van't Hoff with dH and dCp");
  else if (!isnan(r->dH))
    snprintf(buf, len, "van't Hoff with dH (dCp taken as 0)");
  else
    snprintf(buf, len, "none given: the 25 C value is used at every temperature");
}

static void report_reaction(walk *w, const eqpi_reaction *r, const char *kind_hint,
                            const char *equation)
{
  const eqpi_db *db = w->db;
  char eq[512], tw[160];
  size_t used = 0;
  eqp_constant k = {0};
  double sign = 1, dsign = 1, value = r->logK;
  int acid = r->n == 2 && r->product >= 0 &&
             ((r->reactant[1] == db->h_plus && r->nu[1] == 1 && r->nu[0] == 1) ||
              (r->reactant[0] == db->h_plus && r->nu[0] == 1 && r->nu[1] == 1));
  if (equation) {
    snprintf(eq, sizeof eq, "%s", equation);
    k.kind = kind_hint;
    k.dH = r->dH;
    k.dCp = r->dCp;
  } else if (!kind_hint && eqpi_describe_reaction(db, r, eq, sizeof eq, &k.kind, &sign,
                                                  &dsign) == 0) {
    /* as `species show` writes it: dissociations with pKa, formations with log β */
    k.dH = dsign * r->dH;
    k.dCp = dsign * r->dCp;
    value = sign * r->logK;
  } else if (acid && !kind_hint) {
    /* HA = A + H+ with pKa: the formation constant of HA from A and H+ */
    int base = r->reactant[0] == db->h_plus ? r->reactant[1] : r->reactant[0];
    snprintf(eq, sizeof eq, "%s \xE2\x87\x8C H+ + %s", db->sp[r->product].name,
             db->sp[base].name);
    k.kind = "pKa";
    k.dH = -r->dH;
    k.dCp = -r->dCp;
  } else {
    const char *prod = r->product >= 0 ? db->sp[r->product].name : "?";
    used += (size_t)snprintf(eq, sizeof eq, "%s \xE2\x87\x8C", prod);
    /* H2O first where it appears, so that "OH- = H2O - H+" reads naturally */
    for (int pass = 0; pass < 2; pass++)
      for (int j = 0; j < r->n && used < sizeof eq; j++) {
        int first = used == strlen(prod) + 4;   /* "X ⇌" */
        if ((r->nu[j] > 0) != (pass == 0)) continue;
        char coef[32] = "";
        if (fabs(r->nu[j]) != 1) snprintf(coef, sizeof coef, "%g ", fabs(r->nu[j]));
        used += (size_t)snprintf(eq + used, sizeof eq - used, " %s%s%s",
                                 r->nu[j] < 0 ? "- " : first ? "" : "+ ", coef,
                                 db->sp[r->reactant[j]].name);
      }
    k.kind = kind_hint ? kind_hint : "log \xCE\xB2";
    k.dH = r->dH;
    k.dCp = r->dCp;
  }
  temperature_words(r, tw, sizeof tw);
  k.equation = eq;
  k.value = value;
  k.temperature = tw;
  k.source = r->source ? r->source : "";
  k.file = r->file ? r->file : "";
  k.line = r->line;
  emit(w, &k);
}

/* Mark what name forms in the library walked; 0 if it has no such name. */
static int add_name(walk *w, const char *name)
{
  const eqpi_db *db = w->db;
  int i = eqpi_db_find_species(db, name);
  if (i >= 0) {
    mark_terms(w, db->sp[i].nterm, db->sp[i].term_comp, db->sp[i].term_nu);
    return 1;
  }
  int g = eqpi_db_find_reagent(db, name);
  if (g < 0) return 0;
  mark_terms(w, db->rg[g].nterm, db->rg[g].term_comp, db->rg[g].term_nu);
  return 1;
}

static void report_all(walk *w)
{
  const eqpi_db *db = w->db;
  for (int i = 0; i < db->nsp; i++) w->sp[i] = formed(w, &db->sp[i]);
  for (int i = 0; i < db->nsp; i++) {
    if (!w->sp[i]) continue;
    const eqpi_species *s = &db->sp[i];
    for (int k = 0; k < s->nrx; k++)
      if (!w->rx[s->rx_idx[k]]) {
        w->rx[s->rx_idx[k]] = 1;
        report_reaction(w, &db->rx[s->rx_idx[k]], NULL, NULL);
      }
  }
  char eq[512];
  for (int g = 0; g < db->ngases; g++) {
    if (!w->sp[db->gases[g].species]) continue;
    snprintf(eq, sizeof eq, "%s \xE2\x87\x8C %s", db->gases[g].name,
             db->sp[db->gases[g].species].name);
    report_reaction(w, &db->gases[g].kh, "log K_H", eq);
  }
  for (int q = 0; q < db->nsolids; q++) {
    const eqpi_solid *so = &db->solids[q];
    int all = 1;
    size_t used = (size_t)snprintf(eq, sizeof eq, "%s \xE2\x87\x8C", so->name);
    for (int j = 0; j < so->n; j++) {
      all &= w->sp[so->sp[j]];
      if (used >= sizeof eq) continue;
      if (so->nu[j] == 1)   /* a coefficient of 1 is not written */
        used += (size_t)snprintf(eq + used, sizeof eq - used, "%s %s", j ? " +" : "",
                                 db->sp[so->sp[j]].name);
      else
        used += (size_t)snprintf(eq + used, sizeof eq - used, "%s %g %s", j ? " +" : "",
                                 so->nu[j], db->sp[so->sp[j]].name);
    }
    if (all) report_reaction(w, &so->ksp, "log Ksp", eq);
  }
  for (int i = 0; i < db->nsp; i++) {
    const eqpi_species *s = &db->sp[i];
    if (!w->sp[i] || isnan(s->size)) continue;
    eqp_constant k = {"ion size", s->name, s->size, NAN, NAN, "none", s->size_source ?
                      s->size_source : "", s->file ? s->file : "", s->line};
    emit(w, &k);
  }
  for (int p = 0; p < db->npairs; p++) {
    const eqpi_pairparam *pp = &db->pairs[p];
    if (!w->sp[pp->a] || !w->sp[pp->b]) continue;
    snprintf(eq, sizeof eq, "%s / %s (%s)", db->sp[pp->a].name, db->sp[pp->b].name, pp->key);
    eqp_constant k = {"interaction", eq, pp->value, NAN, NAN, "none", pp->source ? pp->source : "",
                      pp->file ? pp->file : "", pp->line};
    emit(w, &k);
  }
}

/* The library that defines the names not yet found, first among the
** context's and then the others in use (a solution's own library): the
** next one with any of them, or NULL. */
static const eqpi_db *next_library(eqp_ctx *ctx, const eqpi_db *after, const char *const *names,
                                   size_t n, const char *found)
{
  if (!after) return ctx->db;
  for (const eqpi_db *db = after == ctx->db ? eqpi_ctx_libraries(ctx) : after->live_next; db;
       db = db->live_next) {
    if (db == ctx->db) continue;
    for (size_t i = 0; i < n; i++)
      if (!found[i] && (eqpi_db_find_species(db, names[i]) >= 0 ||
                        eqpi_db_find_reagent(db, names[i]) >= 0))
        return db;
  }
  return NULL;
}

int eqpi_constants_mark(eqp_ctx *ctx, const eqpi_db *db, const char *const *names, size_t n,
                        char *found, unsigned char **spp)
{
  *spp = NULL;
  size_t nc = (size_t)db->ncomp + 1, ns = (size_t)db->nsp + 1;
  walk w = {ctx, db, NULL, NULL, eqpi_calloc(ctx, nc, 1), eqpi_calloc(ctx, ns, 1), NULL, NULL,
            NULL};
  int rc = w.comp && w.sp ? EQP_OK : eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (int c = 0; rc == EQP_OK && c < db->ncomp; c++)
    if (db->comp_species[c] == db->h_plus || db->comp_species[c] == db->water) w.comp[c] = 1;
  for (size_t i = 0; rc == EQP_OK && i < n; i++)
    if (!found[i] && add_name(&w, names[i])) found[i] = 1;
  for (int i = 0; rc == EQP_OK && i < db->nsp; i++) w.sp[i] = formed(&w, &db->sp[i]);
  eqpi_free(ctx, w.comp, nc);
  if (rc < 0) {
    eqpi_free(ctx, w.sp, ns);
    return rc;
  }
  *spp = w.sp;
  return EQP_OK;
}

const eqpi_db *eqpi_constants_library(eqp_ctx *ctx, const eqpi_db *after,
                                      const char *const *names, size_t n, const char *found)
{
  return next_library(ctx, after, names, n, found);
}

/* The constants of w->db that the names it defines (not yet found) depend on. */
static int walk_library(walk *w, const char *const *names, size_t n, char *found)
{
  eqp_ctx *ctx = w->ctx;
  const eqpi_db *db = w->db;
  size_t nc = (size_t)db->ncomp + 1, ns = (size_t)db->nsp + 1, nr = (size_t)db->nrx + 1;
  w->comp = eqpi_calloc(ctx, nc, 1);
  w->sp = eqpi_calloc(ctx, ns, 1);
  w->rx = eqpi_calloc(ctx, nr, 1);
  int rc = w->comp && w->sp && w->rx ? EQP_OK : eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  /* water and its ions are in every solution */
  for (int c = 0; rc == EQP_OK && c < db->ncomp; c++)
    if (db->comp_species[c] == db->h_plus || db->comp_species[c] == db->water) w->comp[c] = 1;
  for (size_t i = 0; rc == EQP_OK && i < n; i++)
    if (!found[i] && add_name(w, names[i])) found[i] = 1;
  if (rc == EQP_OK) report_all(w);
  eqpi_free(ctx, w->comp, nc);
  eqpi_free(ctx, w->sp, ns);
  eqpi_free(ctx, w->rx, nr);
  return rc;
}

int eqp_ctx_constants(eqp_ctx *ctx, const char *const *names, size_t n, eqp_constant_fn fn,
                      void *ud)
{
  if (!ctx || !fn || (n && !names)) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  int rc = eqp_ctx_load_default_library(ctx);
  if (rc < 0) return rc;
  char *found = eqpi_calloc(ctx, n + 1, 1);
  eqpi_index seen = {0};
  eqpi_arena *keys = NULL;
  walk w = {ctx, NULL, &seen, &keys, NULL, NULL, NULL, fn, ud};
  if (!found) rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  /* the context's library; then, for a name a solution's own library
  ** defines, every library in use, newest first */
  for (const eqpi_db *db = NULL; rc == EQP_OK;) {
    if (!(db = next_library(ctx, db, names, n, found))) break;
    w.db = db;
    rc = walk_library(&w, names, n, found);
  }
  for (size_t i = 0; rc == EQP_OK && i < n; i++)
    if (!found[i]) rc = eqpi_fail(ctx, EQP_E_UNKNOWN, "no species or reagent '%s'", names[i]);
  eqpi_free(ctx, found, n + 1);
  eqpi_index_free(ctx, &seen);
  eqpi_arena_free(ctx, &keys);
  return rc;
}
