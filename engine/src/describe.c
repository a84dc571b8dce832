/* Library entries as a chemist reads them: acid steps as dissociations with
** pKa, complexes as formations with log β, solids with log Ksp, gases with
** log K_H, each with its source and its value at a chosen temperature; the
** listing of the library; and the constants a set of results used. */
/* SPDX-License-Identifier: MIT */
#include "describe_impl.h"
#include "result_impl.h"
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define MAX_T 16

void eqpi_text_printf(eqpi_text *t, const char *fmt, ...)
{
  if (t->oom) return;
  for (;;) {
    va_list ap;
    va_start(ap, fmt);
    int k = vsnprintf(t->p ? t->p + t->n : NULL, t->p ? t->cap - t->n : 0, fmt, ap);
    va_end(ap);
    if (k < 0) return;
    if (t->p && t->n + (size_t)k < t->cap) {
      t->n += (size_t)k;
      return;
    }
    size_t cap = t->cap ? t->cap : 1024;
    while (cap <= t->n + (size_t)k) cap *= 2;
    char *p = cJSON_malloc(cap);
    if (!p) {
      t->oom = 1;
      return;
    }
    if (t->p) memcpy(p, t->p, t->n + 1);
    else p[0] = '\0';
    cJSON_free(t->p);
    t->p = p;
    t->cap = cap;
  }
}

/* -0 reads as 0; a temperature in C without the noise of 273.15. */
static double nz(double x) { return x + 0.0; }
static double celsius(double T) { return round((T - 273.15) * 1e6) / 1e6; }

/* How a stored formation reaction reads. Its product P and reactants R_j
** with coefficients nu_j stand for sum nu_j R_j -> P with log10 K. An acid
** step is shown in the direction that releases H+, with pKa; anything else
** as the formation with log β. */
typedef struct view {
  const char *constant;   /* "pKa", "pKw", "log β", "log Ksp", "log K_H" */
  double sign;            /* shown constant = sign x stored log10 K */
  double dsign;           /* shown ΔrH°, ΔrCp° = dsign x stored (+1, or -1 reversed) */
  int acid, base;         /* species of an acid step, else -1 */
  char equation[384];
} view;

static void term(char *buf, size_t len, int *first, double nu, const char *name)
{
  size_t used = strlen(buf);
  if (used >= len) return;
  if (fabs(nu - 1) < 1e-12) snprintf(buf + used, len - used, "%s%s", *first ? "" : " + ", name);
  else snprintf(buf + used, len - used, "%s%g %s", *first ? "" : " + ", nu, name);
  *first = 0;
}

static void arrow(char *buf, size_t len)
{
  size_t used = strlen(buf);
  if (used < len) snprintf(buf + used, len - used, " \u21cc ");
}

/* Cations before neutral species before anions, then by name. */
static int before(const eqpi_db *db, int a, int b)
{
  double za = db->sp[a].comp.charge, zb = db->sp[b].comp.charge;
  int ca = za > 0 ? 0 : za == 0 ? 1 : 2, cb = zb > 0 ? 0 : zb == 0 ? 1 : 2;
  return ca != cb ? ca < cb : strcmp(db->sp[a].name, db->sp[b].name) < 0;
}

/* Write the participants of one side (coefficient sgn x s > 0 after dir),
** `lead` first when it is there, `skip` never. */
static void side(const eqpi_db *db, const eqpi_reaction *r, double dir, int right, int lead,
                 int skip, char *buf, size_t len, int *first)
{
  double want = right ? 1 : -1;
  int n = r->n + 1;
  if (lead >= 0) {
    for (int j = 0; j < n; j++) {
      int sp = j < r->n ? r->reactant[j] : r->product;
      double s = dir * (j < r->n ? -r->nu[j] : 1);
      if (sp == lead && s * want > 0) term(buf, len, first, fabs(s), db->sp[sp].name);
    }
  }
  /* the rest as the ions of a salt are written, cations first, then by
  ** name: the order of a species file's table is not kept */
  unsigned done = 0;
  for (int k = 0; k < n && k < 32; k++) {
    int best = -1;
    for (int j = 0; j < n && j < 32; j++) {
      int sp = j < r->n ? r->reactant[j] : r->product;
      double s = dir * (j < r->n ? -r->nu[j] : 1);
      if ((done >> j & 1) || sp == lead || sp == skip || s * want <= 0) continue;
      if (best < 0 || before(db, sp, best < r->n ? r->reactant[best] : r->product)) best = j;
    }
    if (best < 0) break;
    done |= 1u << best;
    int sp = best < r->n ? r->reactant[best] : r->product;
    term(buf, len, first, fabs(dir * (best < r->n ? -r->nu[best] : 1)), db->sp[sp].name);
  }
}

/* The one species on a side of the dissociation other than H+ and water
** with coefficient 1 (water itself when it stands alone); -1 if none. */
static int single(const eqpi_db *db, const eqpi_reaction *r, double dir, int right)
{
  int found = -1, count = 0, water = 0;
  for (int j = 0; j <= r->n; j++) {
    int sp = j < r->n ? r->reactant[j] : r->product;
    double s = dir * (j < r->n ? -r->nu[j] : 1);
    if ((right ? s : -s) <= 0 || sp == db->h_plus) continue;
    if (sp == db->water) { water = 1; continue; }
    count++;
    if (fabs(fabs(s) - 1) < 1e-12) found = sp;
  }
  if (count == 0 && water && !right) return db->water;
  return count == 1 ? found : -1;
}

static void view_reaction(const eqpi_db *db, const eqpi_reaction *r, view *v)
{
  double h = 0;
  for (int j = 0; j < r->n; j++)
    if (r->reactant[j] == db->h_plus) h = r->nu[j];
  v->acid = v->base = -1;
  v->equation[0] = '\0';
  int first = 1;
  /* as stored, H+ is consumed when h = +1: the dissociation is the reverse */
  double dir = h == 1 ? -1 : 1;
  if (fabs(h) == 1) {
    v->acid = single(db, r, dir, 0);
    v->base = single(db, r, dir, 1);
  }
  if (v->acid >= 0 && v->base >= 0) {
    v->constant = v->acid == db->water ? "pKw" : "pKa";
    v->sign = -dir;
    v->dsign = dir;
    side(db, r, dir, 0, v->acid, -1, v->equation, sizeof v->equation, &first);
    arrow(v->equation, sizeof v->equation);
    first = 1;
    term(v->equation, sizeof v->equation, &first, 1, db->sp[db->h_plus].name);
    side(db, r, dir, 1, v->base, db->h_plus, v->equation, sizeof v->equation, &first);
    return;
  }
  v->acid = v->base = -1;
  v->constant = "log \u03b2";
  v->sign = v->dsign = 1;
  side(db, r, 1, 0, -1, -1, v->equation, sizeof v->equation, &first);
  arrow(v->equation, sizeof v->equation);
  first = 1;
  side(db, r, 1, 1, r->product, -1, v->equation, sizeof v->equation, &first);
}

/* A solid dissolves, a gas dissolves: written as such. */
static void view_phase(const eqpi_db *db, const char *phase, const char *state, int n,
                       const int *sp, const double *nu, const char *constant, view *v)
{
  int first = 1;
  v->constant = constant;
  v->sign = v->dsign = 1;
  v->acid = v->base = -1;
  snprintf(v->equation, sizeof v->equation, "%s(%s)", phase, state);
  first = 0;
  for (int j = 0; j < n; j++)
    if (nu[j] < 0) term(v->equation, sizeof v->equation, &first, -nu[j], db->sp[sp[j]].name);
  arrow(v->equation, sizeof v->equation);
  first = 1;
  /* cations first, as the ions of a salt are written */
  unsigned done = 0;
  for (int k = 0; k < n && k < 32; k++) {
    int best = -1;
    for (int j = 0; j < n && j < 32; j++)
      if (!(done >> j & 1) && nu[j] > 0 && (best < 0 || before(db, sp[j], sp[best]))) best = j;
    if (best < 0) break;
    done |= 1u << best;
    term(v->equation, sizeof v->equation, &first, nu[best], db->sp[sp[best]].name);
  }
}

static const char *dependence(const eqpi_reaction *r)
{
  if (r->tmodel == EQPI_T_WATER) return "IAPWS R11-07";
  if (r->tmodel == EQPI_T_FUNCTION) return "function of temperature";
  return isnan(r->dH) ? "none" : "van't Hoff";
}

static void add_defined(cJSON *o, const char *file, int line)
{
  char where[1200];
  snprintf(where, sizeof where, "%s:%d", file ? file : "?", line);
  cJSON_AddStringToObject(o, "defined", where);
}

/* One constant: what it is, its value at 25 C as its source gives it, its
** values at the temperatures T (K) as the engine uses them, how it follows
** temperature, and its source. */
static cJSON *constant_json(const eqpi_reaction *r, const view *v, const double *T, int nT)
{
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "equation", v->equation);
  cJSON_AddStringToObject(o, "constant", v->constant);
  cJSON_AddNumberToObject(o, "value", nz(v->sign * r->logK));
  cJSON *vals = cJSON_AddArrayToObject(o, "values");
  eqpi_tnotes notes = {0, 0};
  for (int k = 0; k < nT; k++) {
    cJSON *e = cJSON_CreateObject();
    cJSON_AddNumberToObject(e, "temperature", celsius(T[k]));
    cJSON_AddNumberToObject(e, "value", nz(v->sign * eqpi_reaction_logK(r, T[k], &notes)));
    cJSON_AddItemToArray(vals, e);
  }
  if (!isnan(r->dH)) cJSON_AddNumberToObject(o, "enthalpy", nz(v->dsign * r->dH));
  if (!isnan(r->dCp)) cJSON_AddNumberToObject(o, "heat_capacity", nz(v->dsign * r->dCp));
  cJSON_AddStringToObject(o, "temperature_dependence", dependence(r));
  if (!isnan(r->Tmin)) {
    cJSON *range = cJSON_AddArrayToObject(o, "temperature_range");
    cJSON_AddItemToArray(range, cJSON_CreateNumber(celsius(r->Tmin)));
    cJSON_AddItemToArray(range, cJSON_CreateNumber(celsius(r->Tmax)));
  }
  if (r->measured.given) {
    cJSON *m = cJSON_AddObjectToObject(o, "measured");
    cJSON_AddNumberToObject(m, "ionic_strength", r->measured.I);
    cJSON_AddNumberToObject(m, "temperature", r->measured.t);
    if (r->measured.medium) cJSON_AddStringToObject(m, "medium", r->measured.medium);
    if (r->measured.to_I0) cJSON_AddStringToObject(m, "to_I0", r->measured.to_I0);
  }
  cJSON_AddStringToObject(o, "source", r->source ? r->source : "");
  add_defined(o, r->file, r->line);
  if (notes.outside || notes.missing) {
    cJSON *w = cJSON_AddArrayToObject(o, "warnings");
    if (notes.outside)
      cJSON_AddItemToArray(w, cJSON_CreateString("used outside the temperature range its "
                                                 "source states"));
    if (notes.missing)
      cJSON_AddItemToArray(w, cJSON_CreateString("no temperature data: the 25 \u00b0C value "
                                                 "is used at every temperature"));
  }
  return o;
}

int eqpi_describe_reaction(const eqpi_db *db, const eqpi_reaction *r, char *eq, size_t len,
                           const char **constant, double *sign, double *dsign)
{
  view v;
  view_reaction(db, r, &v);
  snprintf(eq, len, "%s", v.equation);
  *constant = v.constant;
  *sign = v.sign;
  *dsign = v.dsign;
  return 0;
}

static cJSON *reaction_json(const eqpi_db *db, int k, const double *T, int nT)
{
  view v;
  view_reaction(db, &db->rx[k], &v);
  return constant_json(&db->rx[k], &v, T, nT);
}

static cJSON *solid_constant(const eqpi_db *db, const eqpi_solid *s, const double *T, int nT)
{
  view v;
  view_phase(db, s->formula, "s", s->n, s->sp, s->nu, "log Ksp", &v);
  return constant_json(&s->ksp, &v, T, nT);
}

static cJSON *gas_constant(const eqpi_db *db, const eqpi_gas *g, const double *T, int nT)
{
  view v;
  double one = 1;
  char phase[256];
  snprintf(phase, sizeof phase, "%s", g->name);
  char *paren = strstr(phase, "(g)");
  if (paren) *paren = '\0';
  view_phase(db, phase, "g", 1, &g->species, &one, "log K_H", &v);
  return constant_json(&g->kh, &v, T, nT);
}

static void add_charge(cJSON *o, double z) { cJSON_AddNumberToObject(o, "charge", nz(z)); }

/* Reactions a species takes part in: its own, the acid steps it is the
** acid or base of, and the complexes it forms (not for H+ and water, which
** take part in nearly everything). */
static int involves(const eqpi_db *db, int k, int i)
{
  const eqpi_reaction *r = &db->rx[k];
  if (r->product == i) return 1;
  view v;
  view_reaction(db, r, &v);
  if (v.acid >= 0) return v.acid == i || v.base == i;
  if (i == db->h_plus || i == db->water) return 0;
  for (int j = 0; j < r->n; j++)
    if (r->reactant[j] == i) return 1;
  return 0;
}

/* Reaction k is the species' own: its formation, or an acid step it is
** part of (rather than a complex it enters as a ligand or metal). */
static int own(const eqpi_db *db, int k, int i)
{
  const eqpi_reaction *r = &db->rx[k];
  if (r->product == i) return 1;
  view v;
  view_reaction(db, r, &v);
  return v.acid >= 0 && (v.acid == i || v.base == i);
}

static cJSON *species_json(const eqpi_db *db, int i, const double *T, int nT)
{
  const eqpi_species *s = &db->sp[i];
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "kind", "species");
  cJSON_AddStringToObject(o, "name", s->name);
  cJSON_AddStringToObject(o, "formula", s->formula);
  add_charge(o, s->comp.charge);
  add_defined(o, s->file, s->line);
  if (!isnan(s->size)) {
    cJSON_AddNumberToObject(o, "ion_size", s->size);
    cJSON_AddStringToObject(o, "ion_size_source", s->size_source ? s->size_source : "");
  }
  cJSON *par = cJSON_AddArrayToObject(o, "parameters");
  for (int k = 0; k < s->nparam; k++) {
    cJSON *e = cJSON_CreateObject();
    cJSON_AddStringToObject(e, "name", s->pkey[k]);
    cJSON_AddNumberToObject(e, "value", s->pval[k]);
    cJSON_AddStringToObject(e, "source", s->params_source ? s->params_source : "");
    cJSON_AddItemToArray(par, e);
  }
  for (int k = 0; k < db->npairs; k++) {
    const eqpi_pairparam *p = &db->pairs[k];
    if (p->a != i && p->b != i) continue;
    cJSON *e = cJSON_CreateObject();
    cJSON_AddStringToObject(e, "name", p->key);
    cJSON_AddStringToObject(e, "with", db->sp[p->a == i ? p->b : p->a].name);
    cJSON_AddNumberToObject(e, "value", p->value);
    cJSON_AddStringToObject(e, "source", p->source ? p->source : "");
    cJSON_AddItemToArray(par, e);
  }
  cJSON *rx = cJSON_AddArrayToObject(o, "reactions");
  /* its own acid steps and formation first, then the complexes it enters */
  for (int pass = 0; pass < 2; pass++)
    for (int k = 0; k < db->nrx; k++)
      if (involves(db, k, i) && own(db, k, i) == !pass)
        cJSON_AddItemToArray(rx, reaction_json(db, k, T, nT));
  for (int k = 0; k < db->nsolids; k++)
    for (int j = 0; j < db->solids[k].n; j++)
      if (db->solids[k].sp[j] == i && i != db->water && i != db->h_plus)
        cJSON_AddItemToArray(rx, solid_constant(db, &db->solids[k], T, nT));
  for (int k = 0; k < db->ngases; k++)
    if (db->gases[k].species == i)
      cJSON_AddItemToArray(rx, gas_constant(db, &db->gases[k], T, nT));
  return o;
}

static cJSON *strings(cJSON *o, const char *key, const char *const *v, int n)
{
  cJSON *a = cJSON_AddArrayToObject(o, key);
  for (int k = 0; k < n; k++) cJSON_AddItemToArray(a, cJSON_CreateString(v[k]));
  return a;
}

static cJSON *reagent_json(const eqpi_db *db, int i)
{
  const eqpi_reagent *g = &db->rg[i];
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "kind", "reagent");
  cJSON_AddStringToObject(o, "name", g->name);
  cJSON_AddStringToObject(o, "formula", g->formula);
  cJSON_AddNumberToObject(o, "molar_mass", g->molar_mass);
  cJSON_AddStringToObject(o, "molar_mass_source", "T. Prohaska et al. (IUPAC CIAAW), 'Standard "
                          "atomic weights of the elements 2021', Pure Appl. Chem. 94, 573-600 "
                          "(2022), abridged values [from memory, high confidence]");
  strings(o, "aliases", g->aliases, g->naliases);
  cJSON *gives = cJSON_AddArrayToObject(o, "gives");
  unsigned done = 0;   /* cations first, as a salt's ions are written */
  for (int k = 0; k < g->n && k < 32; k++) {
    int j = -1;
    for (int q = 0; q < g->n && q < 32; q++)
      if (!(done >> q & 1) && (j < 0 || before(db, g->sp[q], g->sp[j]))) j = q;
    done |= 1u << j;
    cJSON *e = cJSON_CreateObject();
    cJSON_AddStringToObject(e, "species", db->sp[g->sp[j]].name);
    cJSON_AddNumberToObject(e, "count", g->nu[j]);
    cJSON_AddItemToArray(gives, e);
  }
  if (g->hydrate > 0) cJSON_AddNumberToObject(o, "water_of_crystallisation", g->hydrate);
  if (!isnan(g->density)) cJSON_AddNumberToObject(o, "density", g->density);
  strings(o, "hazards", g->hazards, g->nhazards);
  add_defined(o, g->file, g->line);
  return o;
}

static void add_reagent_name(const eqpi_db *db, cJSON *o, const char *key, int g)
{
  if (g >= 0) cJSON_AddStringToObject(o, key, db->rg[g].name);
}

/* The acid step whose acid (as_acid) or base is species x; -1 if none. */
static int step_of(const eqpi_db *db, int x, int as_acid, view *v)
{
  for (int k = 0; k < db->nrx; k++) {
    view_reaction(db, &db->rx[k], v);
    if (v->acid >= 0 && (as_acid ? v->acid : v->base) == x) return k;
  }
  return -1;
}

/* The species a reagent gives that takes part in an acid step; -1 if none. */
static int buffering_species(const eqpi_db *db, int g)
{
  view v;
  for (int j = 0; g >= 0 && j < db->rg[g].n; j++) {
    int sp = db->rg[g].sp[j];
    if (sp != db->water && sp != db->h_plus && (step_of(db, sp, 1, &v) >= 0 ||
                                                 step_of(db, sp, 0, &v) >= 0))
      return sp;
  }
  return -1;
}

/* The acid steps a buffer system works on: those from its acid form down
** the ladder to its base form; for a substance with a titrant, the step
** the titrant drives (a strong base takes the substance's proton, a strong
** acid gives it one). */
static void buffer_steps(const eqpi_db *db, const eqpi_buffer *b, cJSON *rx, const double *T,
                         int nT)
{
  view v;
  int x = buffering_species(db, b->acid), y = buffering_species(db, b->base), k;
  for (int n = 0; x >= 0 && y >= 0 && x != y && n < 16; n++) {
    if ((k = step_of(db, x, 1, &v)) < 0) break;
    cJSON_AddItemToArray(rx, constant_json(&db->rx[k], &v, T, nT));
    x = v.base;
  }
  int s = buffering_species(db, b->free), acidic = 0;
  if (s < 0 || b->titrant < 0) return;
  for (int j = 0; j < db->rg[b->titrant].n; j++) acidic |= db->rg[b->titrant].sp[j] == db->h_plus;
  if ((k = step_of(db, s, !acidic, &v)) < 0) return;
  /* the same step as the pair's is not written twice */
  const cJSON *e;
  cJSON_ArrayForEach(e, rx)
    if (strcmp(cJSON_GetObjectItemCaseSensitive(e, "equation")->valuestring, v.equation) == 0)
      return;
  cJSON_AddItemToArray(rx, constant_json(&db->rx[k], &v, T, nT));
}

static cJSON *buffer_json(const eqpi_db *db, int i, const double *T, int nT)
{
  const eqpi_buffer *b = &db->buffers[i];
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "kind", "buffer_system");
  cJSON_AddStringToObject(o, "name", b->name);
  add_reagent_name(db, o, "acid_form", b->acid);
  add_reagent_name(db, o, "base_form", b->base);
  add_reagent_name(db, o, "substance", b->free);
  add_reagent_name(db, o, "titrant", b->titrant);
  strings(o, "notes", b->notes, b->nnotes);
  add_defined(o, b->file, b->line);
  buffer_steps(db, b, cJSON_AddArrayToObject(o, "reactions"), T, nT);
  return o;
}

static cJSON *solid_json(const eqpi_db *db, int i, const double *T, int nT)
{
  const eqpi_solid *s = &db->solids[i];
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "kind", "solid");
  cJSON_AddStringToObject(o, "name", s->name);
  cJSON_AddStringToObject(o, "formula", s->formula);
  add_defined(o, s->ksp.file, s->ksp.line);
  cJSON_AddItemToArray(cJSON_AddArrayToObject(o, "reactions"), solid_constant(db, s, T, nT));
  return o;
}

static cJSON *gas_json(const eqpi_db *db, int i, const double *T, int nT)
{
  const eqpi_gas *g = &db->gases[i];
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "kind", "gas");
  cJSON_AddStringToObject(o, "name", g->name);
  cJSON_AddStringToObject(o, "dissolves", db->sp[g->species].name);
  add_defined(o, g->kh.file, g->kh.line);
  cJSON_AddItemToArray(cJSON_AddArrayToObject(o, "reactions"), gas_constant(db, g, T, nT));
  return o;
}

/* Print the tree as JSON or as text into *out (eqp_free_string). */
static int finish(eqp_ctx *ctx, cJSON *doc, eqp_format fmt,
                  void (*text)(eqpi_text *, const cJSON *), char **out)
{
  char *s = NULL;
  if (fmt == EQP_FORMAT_JSON) {
    s = cJSON_Print(doc);
  } else {
    eqpi_text t = {NULL, 0, 0, 0};
    text(&t, doc);
    if (t.oom) cJSON_free(t.p);
    else s = t.p ? t.p : cJSON_malloc(1);
    if (s && !t.p) s[0] = '\0';
  }
  cJSON_Delete(doc);
  if (!s) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  *out = s;
  return EQP_OK;
}

int eqp_ctx_describe(eqp_ctx *ctx, const char *name, double T, eqp_format fmt, char **out)
{
  if (!ctx || !name || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  if (!(T >= 273.15 && T <= 373.15))
    return eqpi_fail(ctx, EQP_E_INPUT, "temperature %g C is outside 0..100 C", T - 273.15);
  const eqpi_db *db = ctx->db;
  double Ts[2] = {EQPI_T25, T};
  int nT = fabs(T - EQPI_T25) < 1e-9 ? 1 : 2;
  cJSON *doc = cJSON_CreateObject();
  cJSON_AddStringToObject(doc, "name", name);
  cJSON_AddNumberToObject(doc, "temperature", celsius(T));
  cJSON *e = cJSON_AddArrayToObject(doc, "entries");
  int s = eqpi_db_find_species(db, name), g = eqpi_db_find_reagent(db, name);
  /* buffer systems, solids and gases by the same folded name ("CO₂(g)") */
  char folded[256];
  const char *key = eqpi_name_normalize(name, folded, sizeof folded) == 1 ? folded : name;
  if (s >= 0) cJSON_AddItemToArray(e, species_json(db, s, Ts, nT));
  if (g >= 0) cJSON_AddItemToArray(e, reagent_json(db, g));
  for (int i = 0; i < db->nbuffers; i++)
    if (strcmp(db->buffers[i].name, key) == 0) cJSON_AddItemToArray(e, buffer_json(db, i, Ts, nT));
  /* a solid by name, or "CaCO3(s)": every solid of that formula */
  for (int i = 0; i < db->nsolids; i++) {
    size_t fl = strlen(db->solids[i].formula);
    if (strcmp(db->solids[i].name, key) == 0 ||
        (strlen(key) == fl + 3 && strncmp(key, db->solids[i].formula, fl) == 0 &&
         strcmp(key + fl, "(s)") == 0))
      cJSON_AddItemToArray(e, solid_json(db, i, Ts, nT));
  }
  for (int i = 0; i < db->ngases; i++)
    if (strcmp(db->gases[i].name, key) == 0) cJSON_AddItemToArray(e, gas_json(db, i, Ts, nT));
  if (cJSON_GetArraySize(e) == 0) {
    cJSON_Delete(doc);
    const char *left_out = eqpi_library_note(ctx, name);
    char hint[256];
    if (left_out)
      return eqpi_fail(ctx, EQP_E_UNKNOWN, "no species, reagent, buffer system, solid or gas "
                       "named '%s': %s", name, left_out);
    if (*eqpi_name_hint(name, hint, sizeof hint))
      return eqpi_fail(ctx, EQP_E_UNKNOWN, "no species, reagent, buffer system, solid or gas "
                       "named '%s'%s", name, hint);
    return eqpi_fail(ctx, EQP_E_UNKNOWN, "no species, reagent, buffer system, solid or gas "
                     "named '%s' (equipoise species list shows them all)", name);
  }
  return finish(ctx, doc, fmt, eqpi_describe_text, out);
}

int eqp_ctx_list(eqp_ctx *ctx, eqp_format fmt, char **out)
{
  if (!ctx || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  const eqpi_db *db = ctx->db;
  cJSON *doc = cJSON_CreateObject();
  cJSON *a = cJSON_AddArrayToObject(doc, "species");
  for (int i = 0; i < db->nsp; i++) {
    cJSON *o = cJSON_CreateObject();
    cJSON_AddStringToObject(o, "name", db->sp[i].name);
    cJSON_AddStringToObject(o, "formula", db->sp[i].formula);
    add_charge(o, db->sp[i].comp.charge);
    add_defined(o, db->sp[i].file, db->sp[i].line);
    cJSON_AddItemToArray(a, o);
  }
  a = cJSON_AddArrayToObject(doc, "reagents");
  for (int i = 0; i < db->nrg; i++) {
    cJSON *o = cJSON_CreateObject();
    cJSON_AddStringToObject(o, "name", db->rg[i].name);
    cJSON_AddStringToObject(o, "formula", db->rg[i].formula);
    strings(o, "aliases", db->rg[i].aliases, db->rg[i].naliases);
    cJSON_AddItemToArray(a, o);
  }
  a = cJSON_AddArrayToObject(doc, "buffer_systems");
  for (int i = 0; i < db->nbuffers; i++) {
    const eqpi_buffer *b = &db->buffers[i];
    cJSON *o = cJSON_CreateObject();
    cJSON_AddStringToObject(o, "name", b->name);
    add_reagent_name(db, o, "acid_form", b->acid);
    add_reagent_name(db, o, "base_form", b->base);
    add_reagent_name(db, o, "substance", b->free);
    add_reagent_name(db, o, "titrant", b->titrant);
    cJSON_AddItemToArray(a, o);
  }
  a = cJSON_AddArrayToObject(doc, "solids");
  for (int i = 0; i < db->nsolids; i++) {
    cJSON *o = cJSON_CreateObject();
    cJSON_AddStringToObject(o, "name", db->solids[i].name);
    cJSON_AddStringToObject(o, "formula", db->solids[i].formula);
    cJSON_AddItemToArray(a, o);
  }
  a = cJSON_AddArrayToObject(doc, "gases");
  for (int i = 0; i < db->ngases; i++) {
    cJSON *o = cJSON_CreateObject();
    cJSON_AddStringToObject(o, "name", db->gases[i].name);
    cJSON_AddStringToObject(o, "dissolves", db->sp[db->gases[i].species].name);
    cJSON_AddItemToArray(a, o);
  }
  strings(doc, "species_files", db->files, db->nfiles);
  return finish(ctx, doc, fmt, eqpi_list_text, out);
}

/* The distinct temperatures of the results, 25 C first. */
static int result_temperatures(const eqp_result *const *res, size_t n, double *T)
{
  int nT = 1;
  T[0] = EQPI_T25;
  for (size_t i = 0; i < n; i++) {
    double t = eqp_result_temperature_K(res[i]);
    int seen = 0;
    for (int k = 0; k < nT; k++) seen |= fabs(T[k] - t) < 1e-6;
    if (!seen && nT < MAX_T && isfinite(t)) T[nT++] = t;
  }
  return nT;
}

/* Add to a the constants of db that the results made with db depend on:
** each reaction of a species present and each solid with a saturation
** index, once over every library (seen: by where it is written). */
static int library_constants(eqp_ctx *ctx, const eqpi_db *db, const eqp_result *const *res,
                             size_t n, const double *T, int nT, eqpi_index *seen,
                             eqpi_arena **keys, cJSON *a)
{
  unsigned char *rx = eqpi_calloc(ctx, (size_t)db->nrx + 1, 1);
  unsigned char *so = eqpi_calloc(ctx, (size_t)db->nsolids + 1, 1);
  int rc = rx && so ? 0 : -1;
  for (size_t i = 0; rc == 0 && i < n; i++) {
    if (eqpi_result_library(res[i]) != db) continue;
    for (size_t k = 0; k < eqp_result_species_count(res[i]); k++) {
      int s = eqpi_db_find_species(db, eqp_result_species_name(res[i], k));
      for (int q = 0; s >= 0 && q < db->sp[s].nrx; q++) rx[db->sp[s].rx_idx[q]] = 1;
    }
    for (int k = 0; k < db->nsolids; k++) {
      double si;
      if (eqp_result_saturation(res[i], db->solids[k].name, &si) == EQP_OK && isfinite(si))
        so[k] = 1;
    }
  }
  for (int k = 0; rc == 0 && k < db->nrx + db->nsolids; k++) {
    const eqpi_reaction *r = k < db->nrx ? &db->rx[k] : &db->solids[k - db->nrx].ksp;
    if (!(k < db->nrx ? rx[k] : so[k - db->nrx])) continue;
    char key[4200];
    snprintf(key, sizeof key, "%s:%d:%d", r->file ? r->file : "", r->line,
             k < db->nrx ? db->rx[k].product : -1 - (k - db->nrx));
    const char *kk = eqpi_arena_strdup(ctx, keys, key);
    int put = kk ? eqpi_index_put(ctx, seen, kk, k, NULL) : -1;
    if (put < 0) rc = -1;
    else if (put == 0)
      cJSON_AddItemToArray(a, k < db->nrx ? reaction_json(db, k, T, nT)
                                          : solid_constant(db, &db->solids[k - db->nrx], T, nT));
  }
  eqpi_free(ctx, rx, (size_t)db->nrx + 1);
  eqpi_free(ctx, so, (size_t)db->nsolids + 1);
  return rc;
}

char *eqp_ctx_constants_to_json(eqp_ctx *ctx, const eqp_result *const *res, size_t n)
{
  if (!ctx) return NULL;
  double T[MAX_T];
  int nT = result_temperatures(res, n, T);
  cJSON *a = cJSON_CreateArray();
  eqpi_index seen = {0};
  eqpi_arena *keys = NULL;
  /* each library the results were made with, in the order first met */
  for (size_t i = 0; a && i < n; i++) {
    const eqpi_db *db = eqpi_result_library(res[i]);
    int first = 1;
    for (size_t j = 0; j < i && first; j++) first = eqpi_result_library(res[j]) != db;
    if (first && library_constants(ctx, db, res, n, T, nT, &seen, &keys, a) < 0) {
      cJSON_Delete(a);
      a = NULL;
    }
  }
  /* the gases solutions were opened to, as the first library that has them gives them */
  for (int g = 0; a && g < ctx->ngases_used; g++) {
    const eqpi_db *db = ctx->db;
    int k = eqpi_db_find_gas(db, ctx->gases_used[g]);
    for (size_t i = 0; k < 0 && i < n; i++)
      k = eqpi_db_find_gas(db = eqpi_result_library(res[i]), ctx->gases_used[g]);
    if (k >= 0) cJSON_AddItemToArray(a, gas_constant(db, &db->gases[k], T, nT));
  }
  eqpi_index_free(ctx, &seen);
  eqpi_arena_free(ctx, &keys);
  char *text = a ? cJSON_PrintUnformatted(a) : NULL;
  cJSON_Delete(a);
  return text;
}

/* Whether the entry written at file:line under what is new to the document
** (libraries share entries: each is listed once). */
static int first_time(eqp_ctx *ctx, eqpi_index *seen, eqpi_arena **keys, const char *what,
                      const char *file, int line)
{
  char key[4400];
  snprintf(key, sizeof key, "%s|%s:%d", what, file ? file : "", line);
  const char *k = eqpi_arena_strdup(ctx, keys, key);
  return !k || eqpi_index_put(ctx, seen, k, 0, NULL) == 0;
}

static cJSON *parameter(const char *name, const char *species, double value, const char *source,
                        const char *file, int line)
{
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "name", name);
  cJSON_AddStringToObject(o, "species", species);
  cJSON_AddNumberToObject(o, "value", value);
  cJSON_AddStringToObject(o, "source", source ? source : "");
  add_defined(o, file, line);
  return o;
}

/* The constants and parameters of the species sp marks in db. */
static int library_json(eqp_ctx *ctx, const eqpi_db *db, const unsigned char *sp,
                        const double *T, int nT, cJSON *a, cJSON *par, eqpi_index *seen,
                        eqpi_arena **keys)
{
  unsigned char *rx = eqpi_calloc(ctx, (size_t)db->nrx + 1, 1);
  if (!rx) return -1;
  for (int i = 0; i < db->nsp; i++)
    for (int q = 0; sp[i] && q < db->sp[i].nrx; q++) rx[db->sp[i].rx_idx[q]] = 1;
  for (int k = 0; k < db->nrx; k++)
    if (rx[k] && first_time(ctx, seen, keys, db->sp[db->rx[k].product].name, db->rx[k].file,
                            db->rx[k].line))
      cJSON_AddItemToArray(a, reaction_json(db, k, T, nT));
  for (int k = 0; k < db->nsolids; k++) {
    int all = 1;
    for (int j = 0; j < db->solids[k].n; j++) all &= sp[db->solids[k].sp[j]];
    if (all && first_time(ctx, seen, keys, db->solids[k].name, db->solids[k].ksp.file,
                          db->solids[k].ksp.line))
      cJSON_AddItemToArray(a, solid_constant(db, &db->solids[k], T, nT));
  }
  for (int k = 0; k < db->ngases; k++)
    if (sp[db->gases[k].species] && first_time(ctx, seen, keys, db->gases[k].name,
                                               db->gases[k].kh.file, db->gases[k].kh.line))
      cJSON_AddItemToArray(a, gas_constant(db, &db->gases[k], T, nT));
  /* the activity models' parameters of the same species */
  for (int i = 0; i < db->nsp; i++) {
    const eqpi_species *s = &db->sp[i];
    if (!sp[i] || !first_time(ctx, seen, keys, s->name, s->file, s->line)) continue;
    if (!isnan(s->size))
      cJSON_AddItemToArray(par, parameter("ion_size", s->name, s->size, s->size_source, s->file,
                                          s->line));
    for (int k = 0; k < s->nparam; k++)
      cJSON_AddItemToArray(par, parameter(s->pkey[k], s->name, s->pval[k], s->params_source,
                                          s->file, s->line));
  }
  for (int k = 0; k < db->npairs; k++) {
    const eqpi_pairparam *p = &db->pairs[k];
    if (!sp[p->a] || !sp[p->b] || !first_time(ctx, seen, keys, p->key, p->file, p->line))
      continue;
    cJSON *o = parameter(p->key, db->sp[p->a].name, p->value, p->source, p->file, p->line);
    cJSON_AddStringToObject(o, "with", db->sp[p->b].name);
    cJSON_AddItemToArray(par, o);
  }
  eqpi_free(ctx, rx, (size_t)db->nrx + 1);
  return 0;
}

char *eqp_ctx_constants_of_json(eqp_ctx *ctx, const char *const *names, size_t n,
                                const double *T_K, size_t nT_K)
{
  if (!ctx || (n && !names) || eqp_ctx_load_default_library(ctx) < 0) return NULL;
  double T[MAX_T];
  int nT = 1;
  T[0] = EQPI_T25;
  for (size_t i = 0; i < nT_K; i++) {
    int seen = 0;
    for (int k = 0; k < nT; k++) seen |= fabs(T[k] - T_K[i]) < 1e-6;
    if (!seen && nT < MAX_T && isfinite(T_K[i])) T[nT++] = T_K[i];
  }
  char *found = eqpi_calloc(ctx, n + 1, 1);
  cJSON *doc = found ? cJSON_CreateObject() : NULL;
  cJSON *a = doc ? cJSON_AddArrayToObject(doc, "constants") : NULL;
  cJSON *par = doc ? cJSON_AddArrayToObject(doc, "parameters") : NULL;
  eqpi_index seen = {0};
  eqpi_arena *keys = NULL;
  int ok = a && par;
  /* the context's library, then the libraries of solutions of their own
  ** for the names only those define */
  for (const eqpi_db *db = NULL; ok;) {
    if (!(db = eqpi_constants_library(ctx, db, names, n, found))) break;
    unsigned char *sp;
    ok = eqpi_constants_mark(ctx, db, names, n, found, &sp) == EQP_OK &&
         library_json(ctx, db, sp, T, nT, a, par, &seen, &keys) == 0;
    eqpi_free(ctx, sp, (size_t)db->nsp + 1);
  }
  for (size_t i = 0; ok && i < n; i++)
    if (!found[i]) ok = eqpi_fail(ctx, EQP_E_UNKNOWN, "no species or reagent '%s'", names[i]) == 0;
  eqpi_index_free(ctx, &seen);
  eqpi_arena_free(ctx, &keys);
  eqpi_free(ctx, found, n + 1);
  char *text = ok ? cJSON_PrintUnformatted(doc) : NULL;
  cJSON_Delete(doc);
  return text;
}
