/* Results: per-species molality, activity and activity coefficient. */
/* SPDX-License-Identifier: MIT */
#include "result_impl.h"
#include "system_impl.h"
#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <string.h>

/* the state's own warnings (few) and one per supersaturated solid */
#define MAX_WARN 64
#define MAX_GASES 16      /* gases of a headspace reported */
#define P_WARN 2.0        /* atm: a headspace beyond it is warned of */
#define SPARE_MAX 4096    /* bytes: the largest result block kept for the next */

struct eqp_result {
  eqp_ctx *ctx;
  const eqpi_db *db;      /* the library of its solution, held */
  size_t bytes;           /* whole block, for the allocator */
  int ns, ndb;
  int *sp;                /* global species */
  double *m, *lg;
  double pH, I, T, water_kg, rho, residual;
  long iters;
  const char *model;
  int nwarn;
  const char **warn;            /* nwarn, into the end of the block */
  struct phases *ph;            /* in the block when the solve could have them, else NULL */
  int placed;                   /* the block is its holder's memory (eqpi_result_place) */
};

/* Solids present and a closed headspace: most results have neither, and
** without this part a result is less than half the size. */
typedef struct phases {
  int nsolid;                   /* solids present (precipitate.c) */
  int solid_k[EQPI_MAX_SOLIDS_PRESENT];
  double solid_mol[EQPI_MAX_SOLIDS_PRESENT];
  int sealed, ngas;             /* a closed headspace (headspace.c) */
  double head_L, head_pw;
  int gas_k[MAX_GASES];
  double gas_p[MAX_GASES], gas_mol[MAX_GASES];
} phases;

static const phases no_phases;
#define PH(r) ((r)->ph ? (r)->ph : &no_phases)

/* The warnings of a state are written twice: once to size the result's
** block, once into it (few results have any). */
typedef struct wlist {
  int n;
  size_t bytes;
  eqp_result *r;          /* NULL while sizing */
  char *text;             /* next free byte of the block */
} wlist;

static void gather(void *ud, const char *kind, const char *text)
{
  wlist *w = ud;
  if (w->n >= MAX_WARN) return;
  size_t len = strlen(text) + 1;
  if (w->r) {
    memcpy(w->text, text, len);
    w->r->warn[w->n] = w->text;
    w->text += len;
    eqpi_warn(w->r->ctx, kind, text);   /* shown to the observer as it is made */
  }
  w->bytes += len;
  w->n++;
}

/* Species of a state, ascending by global index (a result's, or those of
** a system before its result is made). */
typedef struct view { const eqpi_db *db; int ns; const int *sp; const double *m, *lg; double T; } view;

/* Saturation index of solid k, log10(IAP/Ksp); -inf when a species of it
** is absent. */
static double sat_index(const view *v, int k)
{
  const eqpi_db *db = v->db;
  const eqpi_solid *s = &db->solids[k];
  /* most solids of a library miss an ion of the solution: find that out
  ** before any logarithm is taken */
  for (int j = 0; j < s->n; j++) {
    if (s->sp[j] == db->water) continue;           /* unit activity */
    int i = eqpi_find_sorted(v->sp, v->ns, s->sp[j]);
    if (i < 0 || !(v->m[i] > 0)) return -INFINITY;
  }
  double iap = 0;
  for (int j = 0; j < s->n; j++) {
    if (s->sp[j] == db->water) continue;
    int i = eqpi_find_sorted(v->sp, v->ns, s->sp[j]);
    iap += s->nu[j] * (log10(v->m[i]) + v->lg[i]);
  }
  eqpi_tnotes notes = {0, 0};
  return iap - eqpi_reaction_logK(&s->ksp, v->T, &notes);
}

/* Saturation index of the tableau's solid j in the solved state: its
** terms are local already (tableau.c). */
static double tableau_sat_index(const eqpi_db *db, const eqpi_tableau *t, const double *m,
                                const double *lg, double T, int j)
{
  for (int q = t->srow[j]; q < t->srow[j + 1]; q++)
    if (!(m[t->ssp[q]] > 0)) return -INFINITY;
  double iap = 0;
  for (int q = t->srow[j]; q < t->srow[j + 1]; q++) {
    int i = t->ssp[q];
    iap += t->snu[q] * (log10(m[i]) + lg[i]);
  }
  if (t->T == T) return iap - t->slogK[j];
  eqpi_tnotes notes = {0, 0};          /* a state at another temperature than its tableau */
  return iap - eqpi_reaction_logK(&db->solids[t->sol[j]].ksp, T, &notes);
}

/* A solid the state is supersaturated in (si: the index of each of the
** tableau's solids): said, not formed (docs/user-guide.md); a warning of
** the result like those of the state. */
static void supersaturation_notes(const eqpi_db *db, const eqpi_tableau *t, const double *si_of,
                                  double T, void (*fn)(void *, const char *, const char *),
                                  void *ud)
{
  for (int j = 0; j < t->nsol; j++) {
    double si = si_of[j];
    if (!(si > 1e-6)) continue;
    int k = t->sol[j];
    /* an index from a 25 C constant, or from a function beyond its range, says so */
    eqpi_tnotes notes = {0, 0};
    (void)eqpi_reaction_logK(&db->solids[k].ksp, T, &notes);
    const char *how = notes.missing ? "; its log Ksp has no temperature data, the 25 C value "
                                      "was used"
                    : notes.outside ? "; its log Ksp function was used outside its stated "
                                      "temperature range" : "";
    char w[420];
    snprintf(w, sizeof w, "%s (%s) is supersaturated, saturation index %.2f: it may "
             "precipitate; a solid forms only where precipitate = {...} allows it (many "
             "supersaturated media stay metastable for days)%s", db->solids[k].name,
             db->solids[k].formula, si, how);
    fn(ud, "supersaturated", w);
  }
}

/* Results come and go at the rate of solves, mostly of one size: the
** block of the last one freed is kept (one, of at most SPARE_MAX bytes)
** and taken by the next that fits it without wasting half of it. */
static eqp_result *result_alloc(eqp_ctx *ctx, size_t *bytes)
{
  if (ctx->spare_result && ctx->spare_bytes >= *bytes && ctx->spare_bytes / 2 <= *bytes) {
    eqp_result *r = ctx->spare_result;
    *bytes = ctx->spare_bytes;
    ctx->spare_result = NULL;
    return r;
  }
  return eqpi_malloc(ctx, *bytes);
}

void eqpi_result_spare_free(eqp_ctx *ctx)
{
  eqpi_free(ctx, ctx->spare_result, ctx->spare_bytes);
  ctx->spare_result = NULL;
}

int eqpi_result_make(eqp_ctx *ctx, const eqpi_db *db, const eqpi_system *sys,
                     const eqpi_model *model, double T, double water_kg,
                     const eqpi_solve_stats *st, int with_phases, eqp_result **out)
{
  int ns = eqpi_system_nspecies(sys), ndb = db->nsp;
  double I = eqpi_system_ionic_strength(sys);
  if (!(I <= EQPI_MAX_MOLALITY))
    return eqpi_fail(ctx, EQP_E_VERIFY, "refusing the result: ionic strength %g mol/kg (at "
                     "most %g mol/kg is a solution)", I, EQPI_MAX_MOLALITY);
  /* the saturation index of each solid the tableau can form, once: the
  ** notes are sized from them and then written from them (the others
  ** miss a species, so their index is -inf) */
  const eqpi_tableau *tab = sys->tab;
  double si_stack[32], *si = si_stack;
  size_t si_bytes = sizeof(double) * (size_t)tab->nsol;
  if (tab->nsol > 32 && !(si = eqpi_malloc(ctx, si_bytes)))
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (int j = 0; j < tab->nsol; j++)
    si[j] = tableau_sat_index(db, tab, sys->prob->m, sys->prob->lg, T, j);
  wlist w = {0, 0, NULL, NULL};
  eqpi_state_warnings(model, I, T, water_kg, st, gather, &w);
  supersaturation_notes(db, tab, si, T, gather, &w);
  size_t fixed = sizeof(eqp_result) + (with_phases ? sizeof(phases) : 0) +
                 sizeof(double) * (size_t)(2 * ns) + sizeof(const char *) * (size_t)w.n +
                 sizeof(int) * (size_t)ns + 16;
  size_t bytes = fixed + w.bytes;
  eqp_result *r = result_alloc(ctx, &bytes);
  if (!r) {
    if (si != si_stack) eqpi_free(ctx, si, si_bytes);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  r->ctx = ctx;
  r->db = eqpi_db_ref(db);
  r->bytes = bytes;
  r->ns = ns;
  r->ndb = ndb;
  r->placed = 0;
  r->ph = with_phases ? (phases *)(r + 1) : NULL;
  r->m = (double *)((char *)(r + 1) + (with_phases ? sizeof(phases) : 0));
  r->lg = r->m + ns;
  r->warn = (const char **)(r->lg + ns);
  r->sp = (int *)(r->warn + w.n);
  memcpy(r->m, sys->prob->m, sizeof(double) * (size_t)ns);
  memcpy(r->lg, sys->prob->lg, sizeof(double) * (size_t)ns);
  memcpy(r->sp, tab->sp, sizeof(int) * (size_t)ns);        /* ascending */
  int h = tab->hloc >= 0 ? tab->comp_sp[tab->hloc] : -1;     /* H+ is a component */
  r->pH = h >= 0 ? -(log10(r->m[h]) + r->lg[h]) : NAN;
  r->I = I;
  if (!isfinite(r->pH)) {
    eqpi_db_release(r->db);
    eqpi_free(ctx, r, bytes);
    if (si != si_stack) eqpi_free(ctx, si, si_bytes);
    return eqpi_fail(ctx, EQP_E_VERIFY, "refusing the result: the pH is not a finite number");
  }
  r->T = T;
  r->water_kg = water_kg;
  r->rho = tab->T == T ? tab->rho : eqpi_water_density(T);
  r->residual = st->residual;
  r->iters = st->iterations;
  if (r->ph) memset(r->ph, 0, sizeof *r->ph);
  r->model = model->desc->name;
  r->nwarn = w.n;
  if (w.n) {
    /* the same warnings again, into the block (and to the observer); a
    ** result cut short by the cap keeps the ones it sized */
    wlist fill = {0, 0, r, (char *)r + fixed};
    eqpi_state_warnings(model, I, T, water_kg, st, gather, &fill);
    supersaturation_notes(db, tab, si, T, gather, &fill);
    r->nwarn = fill.n;
  }
  if (si != si_stack) eqpi_free(ctx, si, si_bytes);
  *out = r;
  return EQP_OK;
}

/* The block back to the context: kept for the next result, or freed. */
static void block_free(eqp_ctx *ctx, eqp_result *r)
{
  if (!ctx->spare_result && r->bytes <= SPARE_MAX) {
    ctx->spare_result = r;
    ctx->spare_bytes = r->bytes;
  } else {
    eqpi_free(ctx, r, r->bytes);
  }
}

void eqp_result_free(eqp_result *r)
{
  if (!r || r->placed) return;     /* a placed result is its holder's, library and all */
  eqpi_db_release(r->db);
  block_free(r->ctx, r);
}

/* r's block copied whole to c, its pointers moved to the copy. */
static void relocate(eqp_result *c, const eqp_result *r)
{
  memcpy(c, r, r->bytes);
  ptrdiff_t d = (char *)c - (const char *)r;
  c->m = (double *)((char *)r->m + d);
  c->lg = (double *)((char *)r->lg + d);
  c->sp = (int *)((char *)r->sp + d);
  c->warn = (const char **)((char *)r->warn + d);
  for (int i = 0; i < c->nwarn; i++) c->warn[i] = r->warn[i] + d;
  if (r->ph) c->ph = (struct phases *)((char *)r->ph + d);
}

int eqp_result_copy(const eqp_result *r, eqp_result **out)
{
  if (!r || !out) return EQP_E_ARG;
  *out = NULL;
  eqp_result *c = eqpi_malloc(r->ctx, r->bytes);
  if (!c) return eqpi_fail(r->ctx, EQP_E_NOMEM, "out of memory");
  relocate(c, r);
  c->placed = 0;
  c->db = eqpi_db_ref(r->db);       /* the copy holds the library too */
  *out = c;
  return EQP_OK;
}

size_t eqpi_result_bytes(const eqp_result *r) { return r->bytes; }

eqp_result *eqpi_result_place(eqp_result *r, void *mem)
{
  eqp_result *c = mem;
  relocate(c, r);
  c->placed = 1;
  eqpi_db_release(r->db);           /* the holder keeps the library now */
  block_free(r->ctx, r);
  return c;
}

eqp_ctx *eqpi_result_ctx(const eqp_result *r) { return r->ctx; }

double eqp_result_pH(const eqp_result *r) { return r ? r->pH : NAN; }
double eqp_result_ionic_strength(const eqp_result *r) { return r ? r->I : NAN; }
double eqp_result_temperature_K(const eqp_result *r) { return r ? r->T : NAN; }
double eqp_result_water(const eqp_result *r) { return r ? r->water_kg : NAN; }
double eqp_result_water_density(const eqp_result *r) { return r ? r->rho : NAN; }
double eqp_result_residual(const eqp_result *r) { return r ? r->residual : NAN; }
long eqp_result_iterations(const eqp_result *r) { return r ? r->iters : 0; }
const char *eqp_result_activity_model(const eqp_result *r) { return r ? r->model : NULL; }
size_t eqp_result_species_count(const eqp_result *r) { return r ? (size_t)r->ns : 0; }
size_t eqp_result_warning_count(const eqp_result *r) { return r ? (size_t)r->nwarn : 0; }

const char *eqp_result_warning(const eqp_result *r, size_t i)
{
  return r && i < (size_t)r->nwarn ? r->warn[i] : NULL;
}

const char *eqp_result_species_name(const eqp_result *r, size_t i)
{
  return r && i < (size_t)r->ns ? r->db->sp[r->sp[i]].name : NULL;
}

double eqp_result_species_molality(const eqp_result *r, size_t i)
{
  return r && i < (size_t)r->ns ? r->m[i] : NAN;
}

double eqp_result_species_log_gamma(const eqp_result *r, size_t i)
{
  return r && i < (size_t)r->ns ? r->lg[i] : NAN;
}

/* Local index of a species name: >= 0 present, -1 in the library but absent
** from this solution, < -1 unknown (message recorded). */
static int lookup(const eqp_result *r, const char *sp)
{
  char hint[256];
  if (!r || !sp) return -2;
  int g = eqpi_db_find_species(r->db, sp);
  if (g < 0) {
    eqpi_fail(r->ctx, EQP_E_UNKNOWN, "unknown species '%s'%s", sp, eqpi_name_hint(sp, hint, sizeof hint));
    return -2;
  }
  return eqpi_find_sorted(r->sp, r->ns, g);    /* the species are in library order */
}

int eqp_result_molality(const eqp_result *r, const char *sp, double *out)
{
  int i = lookup(r, sp);
  if (i < -1) return EQP_E_UNKNOWN;
  /* the solvent has no molality: 0 (what an absent species gets) would be
  ** a wrong number, not a missing one */
  if (i < 0 && eqpi_db_find_species(r->db, sp) == r->db->water)
    return eqpi_fail(r->ctx, EQP_E_INPUT, "%s is the solvent: it has no molality or molarity "
                     "(its amount is r.water kg; its activity, r:activity('%s'), is 1 unless "
                     "the model says otherwise)", sp, sp);
  *out = i < 0 ? 0.0 : r->m[i];
  return EQP_OK;
}

int eqp_result_molarity(const eqp_result *r, const char *sp, double *out)
{
  int rc = eqp_result_molality(r, sp, out);
  /* dilute-solution approximation: solution volume = volume of its water */
  if (rc == EQP_OK) *out *= r->rho;
  return rc;
}

int eqp_result_gamma(const eqp_result *r, const char *sp, double *out)
{
  int i = lookup(r, sp);
  if (i < -1) return EQP_E_UNKNOWN;
  *out = i < 0 ? 1.0 : pow(10.0, r->lg[i]);
  return EQP_OK;
}

int eqp_result_activity(const eqp_result *r, const char *sp, double *out)
{
  int i = lookup(r, sp);
  if (i < -1) return EQP_E_UNKNOWN;
  if (i >= 0 || eqpi_db_find_species(r->db, sp) != r->db->water)
    *out = i < 0 ? 0.0 : r->m[i] * pow(10.0, r->lg[i]);
  else
    *out = 1.0;   /* the solvent */
  return EQP_OK;
}

/* A solid of the result's library by name or formula(s); a status if none. */
static int find_solid(const eqp_result *r, const char *solid)
{
  int k = eqpi_db_find_solid(r->db, solid);
  if (k == -2) {
    char which[256];
    eqpi_db_solids_with_formula(r->db, solid, which, sizeof which);
    return eqpi_fail(r->ctx, EQP_E_UNKNOWN, "'%s' names several solids (%s): name the one "
                     "you mean", solid, which);
  }
  if (k < 0) return eqpi_fail(r->ctx, EQP_E_UNKNOWN, "unknown solid '%s'", solid);
  return k;
}

/* Saturation index log10(IAP/Ksp) at the result's temperature; -inf when a
** species of the solid is absent. */
int eqp_result_saturation(const eqp_result *r, const char *solid, double *si)
{
  if (!r || !solid || !si) return EQP_E_ARG;
  int k = find_solid(r, solid);
  if (k < 0) return k;
  const eqpi_db *db = r->db;
  view v = {db, r->ns, r->sp, r->m, r->lg, r->T};
  *si = sat_index(&v, k);
  return EQP_OK;
}

int eqpi_result_set_solids(eqp_result *r, const double *amounts, int n, double water_kg)
{
  phases *ph = r->ph;
  if (!ph) return eqpi_fail(r->ctx, EQP_E_ARG, "a result made without room for solids");
  ph->nsolid = 0;
  for (int k = 0; k < n; k++) {
    if (!(amounts[k] > 0)) continue;
    if (ph->nsolid >= EQPI_MAX_SOLIDS_PRESENT)
      return eqpi_fail(r->ctx, EQP_E_INPUT, "more than %d solids at once",
                       EQPI_MAX_SOLIDS_PRESENT);
    ph->solid_k[ph->nsolid] = k;
    ph->solid_mol[ph->nsolid++] = amounts[k] * water_kg;
  }
  return EQP_OK;
}

/* mol of a solid present (0 when it is not). */
int eqp_result_solid(const eqp_result *r, const char *solid, double *mol)
{
  if (!r || !solid || !mol) return EQP_E_ARG;
  int k = find_solid(r, solid);
  if (k < 0) return k;
  *mol = 0;
  const phases *ph = PH(r);
  for (int q = 0; q < ph->nsolid; q++)
    if (ph->solid_k[q] == k) *mol = ph->solid_mol[q];
  return EQP_OK;
}

size_t eqp_result_solid_count(const eqp_result *r) { return r ? (size_t)PH(r)->nsolid : 0; }

const char *eqp_result_solid_name(const eqp_result *r, size_t i, double *mol)
{
  if (!r || i >= (size_t)PH(r)->nsolid) return NULL;
  if (mol) *mol = r->ph->solid_mol[i];
  return r->db->solids[r->ph->solid_k[i]].name;
}

int eqpi_result_set_gases(eqp_result *r, double litres, double p_water, int n,
                          const unsigned char *on, const double *p, const double *mol,
                          const char *note)
{
  phases *ph = r->ph;
  if (!ph) return eqpi_fail(r->ctx, EQP_E_ARG, "a result made without room for gases");
  if (note) eqpi_warn(r->ctx, "temperature", note);
  ph->sealed = 1;
  ph->head_L = litres;
  ph->head_pw = p_water;
  ph->ngas = 0;
  double total = p_water;
  for (int g = 0; g < n; g++) {
    if (!on[g]) continue;
    if (ph->ngas >= MAX_GASES)
      return eqpi_fail(r->ctx, EQP_E_INPUT, "more than %d gases in a headspace", MAX_GASES);
    ph->gas_k[ph->ngas] = g;
    ph->gas_p[ph->ngas] = p[g];
    ph->gas_mol[ph->ngas++] = mol[g];
    total += p[g];
  }
  if (total > P_WARN) {
    /* Henry's law and the ideal gas are low-pressure laws; a vessel has a rating */
    char w[512];
    snprintf(w, sizeof w, "the sealed headspace is at %.3g atm (its gases and %.3g atm of water "
             "vapour) at %.1f C: beyond %g atm Henry's law and the ideal gas lose accuracy, and "
             "the vessel may not hold the pressure; check its rating, vent slowly, and follow "
             "the safety data sheets and local practice", total, p_water, r->T - 273.15, P_WARN);
    eqpi_warn(r->ctx, "pressure", w);
  }
  return EQP_OK;
}

int eqp_result_headspace(const eqp_result *r, double *litres, double *p_total_atm,
                         double *p_water_atm)
{
  if (!r) return EQP_E_ARG;
  const phases *ph = PH(r);
  if (!ph->sealed) return 0;
  double total = ph->head_pw;
  for (int q = 0; q < ph->ngas; q++) total += ph->gas_p[q];
  if (litres) *litres = ph->head_L;
  if (p_total_atm) *p_total_atm = total;
  if (p_water_atm) *p_water_atm = ph->head_pw;
  return 1;
}

int eqp_result_gas(const eqp_result *r, const char *gas, double *p_atm, double *mol)
{
  if (!r || !gas) return EQP_E_ARG;
  int g = eqpi_db_find_gas(r->db, gas);
  if (g < 0) {
    char list[256] = "";
    size_t m = 0;
    for (int j = 0; j < r->db->ngases && m < sizeof list; j++)
      m += (size_t)snprintf(list + m, sizeof list - m, "%s%s", j ? ", " : "", r->db->gases[j].name);
    return eqpi_fail(r->ctx, EQP_E_UNKNOWN, "unknown gas '%s' (the library's gases: %s)", gas,
                     r->db->ngases ? list : "none");
  }
  double pv = 0, nv = 0;
  const phases *ph = PH(r);
  for (int q = 0; q < ph->ngas; q++)
    if (ph->gas_k[q] == g) { pv = ph->gas_p[q]; nv = ph->gas_mol[q]; }
  if (p_atm) *p_atm = pv;
  if (mol) *mol = nv;
  return EQP_OK;
}

size_t eqp_result_gas_count(const eqp_result *r) { return r ? (size_t)PH(r)->ngas : 0; }

const char *eqp_result_gas_name(const eqp_result *r, size_t i, double *p_atm, double *mol)
{
  if (!r || i >= (size_t)PH(r)->ngas) return NULL;
  if (p_atm) *p_atm = r->ph->gas_p[i];
  if (mol) *mol = r->ph->gas_mol[i];
  return r->db->gases[r->ph->gas_k[i]].name;
}

size_t eqp_ctx_solid_count(const eqp_ctx *ctx) { return ctx ? (size_t)ctx->db->nsolids : 0; }

const char *eqp_ctx_solid_name(const eqp_ctx *ctx, size_t i)
{
  return ctx && i < (size_t)ctx->db->nsolids ? ctx->db->solids[i].name : NULL;
}

const char *eqp_ctx_formula(const eqp_ctx *ctx, const char *name)
{
  if (!ctx || !name) return NULL;
  int i = eqpi_db_find_species(ctx->db, name);
  if (i >= 0) return ctx->db->sp[i].formula;
  i = eqpi_db_find_reagent(ctx->db, name);
  return i >= 0 ? ctx->db->rg[i].formula : NULL;
}

/* The library the result was made with (borrowed, valid while r lives). */
const eqpi_db *eqpi_result_library(const eqp_result *r) { return r ? r->db : NULL; }
