/* Solutions: composition, additions with units, equilibration. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <strings.h>



int eqpi_solution_grow(eqp_solution *s)
{
  int need = s->db->ncomp;
  if (s->ntotal >= need) return EQP_OK;
  double *t = eqpi_realloc(s->ctx, s->total, sizeof(double) * (size_t)s->ntotal,
                           sizeof(double) * (size_t)need);
  if (!t) return eqpi_fail(s->ctx, EQP_E_NOMEM, "out of memory");
  for (int i = s->ntotal; i < need; i++) t[i] = 0;
  s->total = t;
  s->ntotal = need;
  return EQP_OK;
}

/* A solution's water stays in [0, EQPI_MAX_WATER] kg and each total a
** finite number of moles per kg of it: an overflowing amount is an input
** error, never an infinite total. verb and name say what was being done. */
static int check_water(eqp_solution *s, double W, const char *verb, const char *name)
{
  if (W >= 0 && W <= EQPI_MAX_WATER) return EQP_OK;
  return eqpi_fail(s->ctx, EQP_E_INPUT, "%s%s%s would leave %g kg of water; a solution holds "
                   "at most %g kg", verb, name ? " " : "", name ? name : "", W, EQPI_MAX_WATER);
}

static int check_total(eqp_solution *s, int c, double t, double W, const char *verb,
                       const char *name)
{
  if (isfinite(t) && (W == 0 || isfinite(t / W))) return EQP_OK;
  return eqpi_fail(s->ctx, EQP_E_INPUT, "%s%s%s: the total of %s overflows (not a finite "
                   "number of moles per kg of water)", verb, name ? " " : "", name ? name : "",
                   s->db->sp[s->db->comp_species[c]].name);
}

/* Add k times (delta over the components, dw kg of water) to s, or refuse
** with s unchanged. */
static int apply(eqp_solution *s, const double *delta, int nd, double dw, double k,
                 const char *verb)
{
  double W = s->water_kg + k * dw;
  int rc = check_water(s, W, verb, NULL);
  for (int c = 0; rc == EQP_OK && c < nd && c < s->ntotal; c++)
    if (delta[c] != 0) rc = check_total(s, c, s->total[c] + k * delta[c], W, verb, NULL);
  if (rc < 0) return rc;
  for (int c = 0; c < nd && c < s->ntotal; c++) s->total[c] += k * delta[c];
  s->water_kg = W;
  return EQP_OK;
}

static int check_opts(eqp_ctx *ctx, const eqp_solution_opts *o)
{
  if (!(o->water > 0) || !isfinite(o->water) || o->water > EQPI_MAX_WATER)
    return eqpi_fail(ctx, EQP_E_INPUT, "mass of water %g kg must be positive", o->water);
  if (!(o->temperature_K >= 273.15 && o->temperature_K <= 373.15))
    return eqpi_fail(ctx, EQP_E_INPUT, "temperature %.2f C is outside 0..100 C (liquid water "
                     "at about 1 bar)", o->temperature_K - 273.15);
  return EQP_OK;
}

int eqp_solution_new_in(eqp_ctx *ctx, const eqp_library *lib, const eqp_solution_opts *user,
                        eqp_solution **out)
{
  if (!ctx || !user || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT, *opts = &o;
  int rc = eqpi_opts_read(ctx, "eqp_solution_opts", user, &o, sizeof o, EQPI_SOLUTION_OPTS_0_1);
  if (rc == EQP_OK) rc = check_opts(ctx, opts);
  if (rc < 0) return rc;
  if (lib && lib->ctx != ctx)
    return eqpi_fail(ctx, EQP_E_ARG, "the library belongs to another context");
  if (!lib && ctx->db->nsp == 0 && (rc = eqp_ctx_load_default_library(ctx)) < 0) return rc;
  eqp_solution *s = eqpi_calloc(ctx, 1, sizeof *s);
  if (!s) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  s->ctx = ctx;
  s->db = eqpi_db_ref(lib ? lib : ctx->db);
  s->water_kg = opts->water;
  s->T = opts->temperature_K;
  s->model_default = opts->activity == NULL;
  rc = eqpi_model_open(ctx, opts->activity ? opts->activity : "davies", &s->model);
  if (rc == EQP_OK) rc = eqpi_solution_grow(s);
  if (rc < 0) {
    eqp_solution_free(s);
    return rc;
  }
  *out = s;
  return EQP_OK;
}

int eqp_solution_new(eqp_ctx *ctx, const eqp_solution_opts *opts, eqp_solution **out)
{
  return eqp_solution_new_in(ctx, NULL, opts, out);
}

void eqp_solution_free(eqp_solution *s)
{
  if (!s) return;
  eqp_ctx *ctx = s->ctx;
  eqpi_system_free(ctx, s->sys);
  eqpi_chain_close(s);
  eqpi_model_close(ctx, &s->model);
  eqpi_free(ctx, s->total, sizeof(double) * (size_t)s->ntotal);
  eqpi_solution_hazards_free(s);
  eqpi_free(ctx, s->allow, (size_t)(s->nallow > 0 ? s->nallow : 1));
  eqpi_head_free(s);
  eqpi_db_release(s->db);
  eqpi_free(ctx, s, sizeof *s);
}

int eqp_solution_copy(const eqp_solution *s, eqp_solution **out)
{
  if (!s || !out) return EQP_E_ARG;
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = s->water_kg;
  o.temperature_K = s->T;
  o.activity = s->model.desc->name;
  int rc = eqp_solution_new_in(s->ctx, s->db, &o, out);
  if (rc < 0) return rc;
  eqp_solution *c = *out;
  if ((rc = eqpi_solution_grow(c)) < 0) {
    eqp_solution_free(c);
    *out = NULL;
    return rc;
  }
  memcpy(c->total, s->total, sizeof(double) * (size_t)s->ntotal);
  if ((rc = eqpi_copy_hazards(c, s)) < 0) {
    eqp_solution_free(c);
    *out = NULL;
    return rc;
  }
  c->model_default = s->model_default;
  c->allow_all = s->allow_all;
  if (s->nallow) {
    if (!(c->allow = eqpi_malloc(c->ctx, (size_t)s->nallow))) {
      eqp_solution_free(c);
      *out = NULL;
      return eqpi_fail(s->ctx, EQP_E_NOMEM, "out of memory");
    }
    memcpy(c->allow, s->allow, (size_t)s->nallow);
    c->nallow = s->nallow;
  }
  c->solute_L = s->solute_L;
  c->unknown_g = s->unknown_g;
  if ((rc = eqpi_head_copy(c, s)) < 0) {
    eqp_solution_free(c);
    *out = NULL;
    return rc;
  }
  for (int i = 0; i < s->nparams; i++)
    if ((rc = eqp_solution_set_activity_param(c, s->pname[i], s->pvalue[i])) < 0) {
      eqp_solution_free(c);
      *out = NULL;
      return rc;
    }
  /* the last solution as the copy's warm start (without it, a cold one),
  ** when it was solved with the solution's own model */
  if (eqpi_system_current(s->sys, s->total, s->water_kg, s->T) &&
      eqpi_system_model(s->sys) == &s->model)
    c->sys = eqpi_system_clone(c->ctx, s->sys, &c->model);
  return EQP_OK;
}

int eqp_solution_set_activity_param(eqp_solution *s, const char *name, double value)
{
  if (!s || !name) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  const eqp_activity_ops *ops = s->model.ops;
  char err[256] = "";
  if (!ops->set_param)
    return eqpi_fail(s->ctx, EQP_E_PLUGIN, "activity model '%s' takes no parameters",
                     s->model.desc->name);
  if (eqpi_model_set_param(&s->model, name, value, err, sizeof err) != 0)
    return eqpi_fail(s->ctx, EQP_E_PLUGIN, "activity model '%s': %s", s->model.desc->name,
                     err[0] ? err : "parameter refused");
  s->model_default = false;   /* a model given parameters is chosen, not defaulted */
  eqpi_system_forget(s->sys); /* its last solution was for the old parameters */
  /* the parameters are part of the copy's model too */
  if (s->nparams < (int)(sizeof s->pname / sizeof s->pname[0])) {
    snprintf(s->pname[s->nparams], sizeof s->pname[0], "%s", name);
    s->pvalue[s->nparams++] = value;
  }
  return EQP_OK;
}

int eqp_solution_set_temperature(eqp_solution *s, double T)
{
  if (!s) return EQP_E_ARG;
  if (!(T >= 273.15 && T <= 373.15))
    return eqpi_fail(s->ctx, EQP_E_INPUT, "temperature %.2f C is outside 0..100 C (liquid "
                     "water at about 1 bar)", T - 273.15);
  s->T = T;
  return EQP_OK;
}

double eqp_solution_water(const eqp_solution *s) { return s ? s->water_kg : NAN; }
double eqp_solution_temperature_K(const eqp_solution *s) { return s ? s->T : NAN; }

double eqp_solution_volume(const eqp_solution *s)
{
  return s ? s->water_kg / eqpi_water_density(s->T) : NAN;
}

/* Name a close match for an unknown reagent: same letters, other case. */
static const char *suggest(const eqpi_db *db, const char *name)
{
  for (int i = 0; i < db->nrg; i++) {
    if (strcasecmp(db->rg[i].name, name) == 0) return db->rg[i].name;
    for (int a = 0; a < db->rg[i].naliases; a++)
      if (strcasecmp(db->rg[i].aliases[a], name) == 0) return db->rg[i].aliases[a];
  }
  return NULL;
}

static int unknown_reagent(eqp_solution *s, const char *name)
{
  const eqpi_db *db = s->db;
  const char *alt = suggest(db, name);
  if (alt)
    return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown reagent '%s' (did you mean '%s'?)",
                     name, alt);
  const char *left_out = eqpi_library_note(s->ctx, name);
  if (left_out) return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown reagent '%s': %s", name, left_out);
  if (db != s->ctx->db && eqpi_db_find_reagent(s->ctx->db, name) >= 0)
    return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown reagent '%s': the species library of this "
                     "solution does not have it (the run's library does: the solution was made "
                     "with a library of its own, or before '%s' was loaded)", name, name);
  int sp = eqpi_db_find_species(db, name);
  if (sp >= 0)
    return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "'%s' is a charged species, not a reagent: add a "
                     "neutral salt, acid or base that releases it", name);
  char hint[256];
  if (*eqpi_name_hint(name, hint, sizeof hint))
    return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown reagent '%s'%s", name, hint);
  return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown reagent '%s' (see 'equipoise species "
                   "list')", name);
}

/* kg of solvent water per mol of reagent: the water it releases as such
** (water itself, water of crystallisation, H2O in its release); the water
** component of other species (OH- = H2O - H+) is not tracked */
static double reagent_water(const eqpi_db *db, const eqpi_reagent *r)
{
  double h2o = r->hydrate;
  for (int j = 0; j < r->n; j++)
    if (r->sp[j] == db->water) h2o += r->nu[j];
  return h2o * EQPI_M_WATER * 1e-3;
}

/* What one mol of a reagent adds: components into a (scaled by k, added
** to a), and kg of solvent water into *w. */
void eqpi_reagent_dir(const eqp_solution *s, const eqpi_reagent *r, double *a, double *w,
                      double k)
{
  const eqpi_db *db = s->db;
  int water = db->water >= 0 ? db->sp[db->water].component : -1;
  for (int t = 0; t < r->nterm; t++)
    if (r->term_comp[t] != water) a[r->term_comp[t]] += k * r->term_nu[t];
  *w = reagent_water(db, r);
}


static int is_water(const eqp_solution *s, const eqpi_reagent *r)
{
  return r->n == 1 && r->sp[0] == s->db->water;
}

int eqp_solution_add(eqp_solution *s, const char *reagent, double value, eqp_quantity kind)
{
  if (!s || !reagent) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_ctx *ctx = s->ctx;
  if (!isfinite(value) || value < 0)
    return eqpi_fail(ctx, EQP_E_INPUT, "amount of %s must be a non-negative number, got %g",
                     reagent, value);
  const eqpi_reagent *r;
  int rc = eqpi_find_reagent(s, reagent, &r);
  if (rc < 0) return rc;
  double mol;
  switch (kind) {
  case EQP_Q_AMOUNT: mol = value; break;
  case EQP_Q_MASS: mol = value * 1e3 / r->molar_mass; break;
  case EQP_Q_MOLARITY: mol = value * eqp_solution_volume(s); break;
  case EQP_Q_MOLALITY: mol = value * s->water_kg; break;
  case EQP_Q_VOLUME:
    if (is_water(s, r)) {
      mol = value * eqpi_water_density(s->T) * 1e3 / r->molar_mass;
      break;
    }
    if (isnan(r->density))
      return eqpi_fail(ctx, EQP_E_INPUT, "%s has no density in the library, so it cannot be "
                       "measured by volume; give a mass or an amount", reagent);
    mol = value * 1e3 * r->density / r->molar_mass;
    break;
  default:
    return eqpi_fail(ctx, EQP_E_INPUT, "an amount of %s must be an amount, mass, "
                     "concentration or molality", reagent);
  }
  if (!isfinite(mol))
    return eqpi_fail(ctx, EQP_E_INPUT, "amount of %s overflows (not a finite number of "
                     "moles)", reagent);
  rc = eqpi_solution_grow(s);
  if (rc < 0) return rc;
  /* check every total the reagent changes before changing any */
  double W = s->water_kg + mol * reagent_water(s->db, r), w;
  rc = check_water(s, W, "adding", reagent);
  int water = s->db->water >= 0 ? s->db->sp[s->db->water].component : -1;
  for (int t = 0; rc == EQP_OK && t < r->nterm; t++) {
    int c = r->term_comp[t];
    if (c != water) rc = check_total(s, c, s->total[c] + mol * r->term_nu[t], W, "adding", reagent);
  }
  if (rc < 0 || (rc = eqpi_use_reagent(s, r)) < 0) return rc;   /* recorded once it goes in */
  eqpi_reagent_dir(s, r, s->total, &w, mol);
  s->water_kg = W;
  eqpi_solution_bulk(s, r, mol);
  return EQP_OK;
}

void eqpi_reagent_bulk(const eqpi_reagent *r, double k, double *L, double *g)
{
  double per_mol;
  if (eqpi_reagent_volume(r, &per_mol)) *L += k * per_mol;
  else *g += k * r->molar_mass;
}

/* The same for s, remembering the last reagent: one titrant added again and
** again is common. */
void eqpi_solution_bulk(eqp_solution *s, const eqpi_reagent *r, double k)
{
  if (r != s->vol_r || s->vol_gen != s->db->generation) {
    s->vol_known = eqpi_reagent_volume(r, &s->vol_L);
    s->vol_r = r;
    s->vol_gen = s->db->generation;
  }
  if (s->vol_known) s->solute_L += k * s->vol_L;
  else s->unknown_g += k * r->molar_mass;
}

int eqp_solution_add_str(eqp_solution *s, const char *reagent, const char *amount)
{
  if (!s || !reagent || !amount) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  double v;
  eqp_quantity k;
  char err[EQPI_ERRLEN];
  unsigned allowed = EQP_Q_AMOUNT | EQP_Q_MASS | EQP_Q_MOLARITY | EQP_Q_MOLALITY | EQP_Q_VOLUME;
  if (eqpi_parse_quantity(amount, allowed, &v, &k, err, sizeof err) < 0)
    return eqpi_fail(s->ctx, EQP_E_INPUT, "amount of %s: %s", reagent, err);
  return eqp_solution_add(s, reagent, v, k);
}

int eqp_ctx_reagent_mol(eqp_ctx *ctx, const char *reagent, double value, eqp_quantity kind,
                        double *mol)
{
  if (!ctx || !reagent || !mol) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  if (!(value >= 0) || !isfinite(value))
    return eqpi_fail(ctx, EQP_E_INPUT, "amount of %s: %g is not a finite, positive amount",
                     reagent, value);
  if (kind == EQP_Q_AMOUNT) {
    *mol = value;
    return EQP_OK;
  }
  if (kind != EQP_Q_MASS)
    return eqpi_fail(ctx, EQP_E_INPUT, "amount of %s: an amount (mol) or a mass", reagent);
  double M;
  int rc = eqp_ctx_reagent_molar_mass(ctx, reagent, &M);
  if (rc < 0) return rc;
  *mol = value * 1e3 / M;     /* kg -> g, over g/mol */
  return EQP_OK;
}

int eqpi_solution_equilibrate(eqp_solution *s, eqp_result **out)
{
  if (!s || !out) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  *out = NULL;
  int rc = eqpi_solution_grow(s), k = 0;
  if (rc < 0) return rc;
  return eqpi_solution_equilibrate_from(s, &k, 1, out, NULL);
}

/* The caller's own result: the observer hears of it. */
int eqp_solution_equilibrate(eqp_solution *s, eqp_result **out)
{
  int rc = eqpi_solution_equilibrate(s, out);
  if (rc == EQP_OK) eqpi_observe_result(s->ctx, *out);
  return rc;
}

/* ------------------------------------------------------------ volumes */

const eqp_library *eqp_solution_library(const eqp_solution *s) { return s ? s->db : NULL; }

int eqpi_add_stock(const eqp_solution *s, const eqp_solution *stock, double k, double *a)
{
  const eqpi_db *from = stock->db, *to = s->db;
  for (int c = 0; c < stock->ntotal; c++) {
    if (stock->total[c] == 0) continue;
    int t = c;
    if (from != to) {
      /* the same component under its name: a library made from another
      ** keeps its numbering, a restricted one has its own */
      const char *name = from->sp[from->comp_species[c]].name;
      if (!(c < to->ncomp && strcmp(to->sp[to->comp_species[c]].name, name) == 0)) {
        int sp = eqpi_db_find_species(to, name);
        t = sp >= 0 ? to->sp[sp].component : -1;
      }
      if (t < 0 || t >= s->ntotal)
        return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "the stock holds %s, which the species library "
                         "of this solution does not define", name);
    }
    a[t] += k * stock->total[c];
  }
  return EQP_OK;
}

int eqp_solution_pour(eqp_solution *s, const eqp_solution *stock, double litres)
{
  if (!s || !stock) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  if (!isfinite(litres) || litres < 0)
    return eqpi_fail(s->ctx, EQP_E_INPUT, "volume to pour must be a non-negative number");
  if (stock == s) return eqpi_fail(s->ctx, EQP_E_INPUT, "a solution cannot be poured into itself");
  if (stock->head) return eqpi_head_refuse((eqp_solution *)stock, "pouring from it");
  int rc = eqpi_solution_grow(s);
  if (rc < 0 || (litres > 0 && (rc = eqpi_use_stock(s, stock)) < 0)) return rc;
  /* the stock is a reservoir: a portion of its composition, by volume of
  ** its water at its own temperature, is added; the stock is unchanged */
  double f = litres / eqp_solution_volume(stock);
  if (stock->db == s->db) {
    rc = apply(s, stock->total, stock->ntotal, stock->water_kg, f, "pouring");
  } else {
    /* another library: its totals by component name (eqpi_add_stock) */
    double *d = eqpi_calloc(s->ctx, (size_t)s->ntotal + 1, sizeof(double));
    if (!d) return eqpi_fail(s->ctx, EQP_E_NOMEM, "out of memory");
    rc = eqpi_add_stock(s, stock, 1, d);
    if (rc == EQP_OK) rc = apply(s, d, s->ntotal, stock->water_kg, f, "pouring");
    eqpi_free(s->ctx, d, sizeof(double) * ((size_t)s->ntotal + 1));
  }
  if (rc == EQP_OK) {
    s->solute_L += f * stock->solute_L;
    s->unknown_g += f * stock->unknown_g;
  }
  return rc;
}

int eqp_solution_dilute(eqp_solution *s, double factor)
{
  if (!s) return EQP_E_ARG;
  if (!isfinite(factor) || factor < 1)
    return eqpi_fail(s->ctx, EQP_E_INPUT, "a dilution factor must be at least 1, got %g", factor);
  return apply(s, NULL, 0, s->water_kg, factor - 1, "diluting");
}

int eqp_solution_dilute_to(eqp_solution *s, double litres)
{
  if (!s) return EQP_E_ARG;
  double V = eqp_solution_volume(s);
  if (!(litres > 0) || !isfinite(litres))
    return eqpi_fail(s->ctx, EQP_E_INPUT, "dilute to %g L: a positive volume", litres);
  if (litres < V)
    return eqpi_fail(s->ctx, EQP_E_INPUT, "dilute to %.6g mL: less than the solution's volume, "
                     "%.6g mL (water cannot be taken away)", litres * 1e3, V * 1e3);
  return eqp_solution_dilute(s, litres / V);
}

int eqp_solution_total(const eqp_solution *s, const char *component, double *mol)
{
  if (!s || !component || !mol) return EQP_E_ARG;
  const eqpi_db *db = s->db;
  int sp = eqpi_db_find_species(db, component);
  if (sp < 0 || db->sp[sp].component < 0)
  {
    char hint[256];
    return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "'%s' is not a component%s", component,
                     eqpi_name_hint(component, hint, sizeof hint));
  }
  int c = db->sp[sp].component;
  *mol = c < s->ntotal ? s->total[c] : 0;
  return EQP_OK;
}

/* ------------------------------------------------------------ derivatives */

/* The solved system of s, solving first if needed. */
int eqpi_solution_solved(eqp_solution *s)
{
  if (eqpi_system_current(s->sys, s->total, s->water_kg, s->T)) return EQP_OK;
  eqp_result *r;
  s->ctx->quiet++;           /* a solve for a derivative: its result is not shown */
  int rc = eqpi_solution_equilibrate(s, &r);
  s->ctx->quiet--;
  eqp_result_free(r);
  return rc;
}

/* The last reagent found is remembered by the name it was given: a
** titration or a loop adds one reagent over and over. */
int eqpi_find_reagent(eqp_solution *s, const char *name, const eqpi_reagent **r)
{
  if (s->rg_name[0] && s->rg_gen == s->db->generation && strcmp(s->rg_name, name) == 0) {
    *r = &s->db->rg[s->rg_index];
    return EQP_OK;
  }
  int g = eqpi_db_find_reagent(s->db, name);
  if (g < 0) return unknown_reagent(s, name);
  size_t len = strlen(name);
  s->rg_name[0] = '\0';
  if (len < sizeof s->rg_name) {
    memcpy(s->rg_name, name, len + 1);
    s->rg_index = g;
    s->rg_gen = s->db->generation;
  }
  *r = &s->db->rg[g];
  return EQP_OK;
}

int eqp_solution_dpH(eqp_solution *s, const char *reagent, double *dpH_dmol)
{
  if (!s || !reagent || !dpH_dmol) return EQP_E_ARG;
  const eqpi_reagent *r = NULL;
  int rc = eqpi_find_reagent(s, reagent, &r);
  if (rc < 0 || (rc = eqpi_solution_solved(s)) < 0) return rc;
  if (eqpi_solution_any_solid(s)) {
    /* the derivative is that of the solution alone: refused with a solid present */
    eqp_result *res;
    s->ctx->quiet++;
    rc = eqpi_solution_equilibrate(s, &res);
    s->ctx->quiet--;
    if (rc < 0) return rc;
    double mol;
    const char *name = eqp_result_solid_count(res) ? eqp_result_solid_name(res, 0, &mol) : NULL;
    char keep[128];
    if (name) snprintf(keep, sizeof keep, "%s", name);
    eqp_result_free(res);
    if (name)
      return eqpi_fail(s->ctx, EQP_E_INPUT, "dpH/d(%s) and the buffer capacity are not computed "
                       "with a solid present (%s): use s:adjust_pH at two pH values, or a "
                       "solution without precipitate = {...}", reagent, keep);
  }
  double *a = eqpi_calloc(s->ctx, (size_t)s->ntotal + 1, sizeof(double)), w;
  if (!a) return eqpi_fail(s->ctx, EQP_E_NOMEM, "out of memory");
  eqpi_reagent_dir(s, r, a, &w, 1.0);
  rc = eqpi_solution_dpH_dir(s, a, w, dpH_dmol);
  eqpi_free(s->ctx, a, sizeof(double) * ((size_t)s->ntotal + 1));
  return rc;
}

int eqp_solution_buffer_capacity(eqp_solution *s, double *per_L, double *per_kg)
{
  if (!s) return EQP_E_ARG;
  double d;
  /* beta = dC_b/dpH with C_b in mol per kg of water: d(mol)/W per pH */
  int rc = eqp_solution_dpH(s, "NaOH", &d);
  if (rc < 0) return rc;
  double b = 1.0 / (d * s->water_kg);
  if (!isfinite(b))
    return eqpi_fail(s->ctx, EQP_E_CONVERGE, "the buffer capacity is not a finite number here "
                     "(dpH/dC = %g)", d);
  if (per_L) *per_L = b * eqpi_water_density(s->T);
  if (per_kg) *per_kg = b;
  return EQP_OK;
}

/* ------------------------------------------------------------ adjustment */

int eqp_solution_mix(size_t n, eqp_solution *const *parts, const double *litres,
                     eqp_solution **out)
{
  if (!out || n == 0 || !parts || !parts[0]) return EQP_E_ARG;
  eqp_ctx *ctx = parts[0]->ctx;
  *out = NULL;
  double water = 0, heat = 0;
  for (size_t i = 0; i < n; i++) {
    if (!parts[i] || parts[i]->ctx != ctx) return eqpi_fail(ctx, EQP_E_ARG, "mix: bad part");
    double f = litres ? litres[i] / eqp_solution_volume(parts[i]) : 1;
    if (!(f >= 0) || !isfinite(f)) return eqpi_fail(ctx, EQP_E_INPUT, "mix: bad volume");
    water += f * parts[i]->water_kg;
    heat += f * parts[i]->water_kg * parts[i]->T;   /* no heat of mixing: mass-weighted T */
  }
  if (!(water > 0)) return eqpi_fail(ctx, EQP_E_INPUT, "mix: nothing to mix");
  if (!(water <= EQPI_MAX_WATER))
    return eqpi_fail(ctx, EQP_E_INPUT, "mix: %g kg of water is beyond %g kg", water,
                     EQPI_MAX_WATER);
  eqp_solution *m;
  int rc = eqp_solution_copy(parts[0], &m);
  if (rc < 0) return rc;
  memset(m->total, 0, sizeof(double) * (size_t)m->ntotal);
  m->water_kg = 0;
  m->nhazard = 0;              /* what each part brings is recorded as it is poured */
  m->solute_L = m->unknown_g = 0;
  for (size_t i = 0; i < n && rc == EQP_OK; i++)
    rc = eqp_solution_pour(m, parts[i], litres ? litres[i] : eqp_solution_volume(parts[i]));
  if (rc < 0) {
    eqp_solution_free(m);
    return rc;
  }
  m->water_kg = water;
  m->T = heat / water;
  *out = m;
  return EQP_OK;
}
