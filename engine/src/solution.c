/* Solutions: composition, additions with units, equilibration. */
/* SPDX-License-Identifier: MIT */
#include "result_impl.h"
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <strings.h>

struct eqp_solution {
  eqp_ctx *ctx;
  double water_kg;
  double T;               /* K */
  eqpi_model model;
  double *total;          /* mol per component of the database */
  int ntotal;
  eqpi_system *sys;
  char pname[8][32];      /* activity-model parameters set, for copies */
  double pvalue[8];
  int nparams;
};

static int grow_totals(eqp_solution *s)
{
  int need = s->ctx->db.ncomp;
  if (s->ntotal >= need) return EQP_OK;
  double *t = eqpi_realloc(s->ctx, s->total, sizeof(double) * (size_t)s->ntotal,
                           sizeof(double) * (size_t)need);
  if (!t) return eqpi_fail(s->ctx, EQP_E_NOMEM, "out of memory");
  for (int i = s->ntotal; i < need; i++) t[i] = 0;
  s->total = t;
  s->ntotal = need;
  return EQP_OK;
}

static int check_opts(eqp_ctx *ctx, const eqp_solution_opts *o)
{
  if (!(o->water_kg > 0) || !isfinite(o->water_kg) || o->water_kg > 1e6)
    return eqpi_fail(ctx, EQP_E_INPUT, "mass of water %g kg must be positive", o->water_kg);
  if (!(o->temperature_K >= 273.15 && o->temperature_K <= 373.15))
    return eqpi_fail(ctx, EQP_E_INPUT, "temperature %.2f C is outside 0..100 C (liquid water "
                     "at about 1 bar)", o->temperature_K - 273.15);
  return EQP_OK;
}

int eqp_solution_new(eqp_ctx *ctx, const eqp_solution_opts *opts, eqp_solution **out)
{
  if (!ctx || !opts || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  int rc = check_opts(ctx, opts);
  if (rc < 0) return rc;
  if (ctx->db.nsp == 0 && (rc = eqp_ctx_load_default_library(ctx)) < 0) return rc;
  eqp_solution *s = eqpi_calloc(ctx, 1, sizeof *s);
  if (!s) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  s->ctx = ctx;
  s->water_kg = opts->water_kg;
  s->T = opts->temperature_K;
  rc = eqpi_model_open(ctx, opts->activity ? opts->activity : "davies", &s->model);
  if (rc == EQP_OK) rc = grow_totals(s);
  if (rc < 0) {
    eqp_solution_free(s);
    return rc;
  }
  *out = s;
  return EQP_OK;
}

void eqp_solution_free(eqp_solution *s)
{
  if (!s) return;
  eqp_ctx *ctx = s->ctx;
  eqpi_system_free(ctx, s->sys);
  eqpi_model_close(ctx, &s->model);
  eqpi_free(ctx, s->total, sizeof(double) * (size_t)s->ntotal);
  eqpi_free(ctx, s, sizeof *s);
}

int eqp_solution_copy(const eqp_solution *s, eqp_solution **out)
{
  if (!s || !out) return EQP_E_ARG;
  eqp_solution_opts o = {s->water_kg, s->T, s->model.desc->name};
  int rc = eqp_solution_new(s->ctx, &o, out);
  if (rc < 0) return rc;
  eqp_solution *c = *out;
  if ((rc = grow_totals(c)) < 0) {
    eqp_solution_free(c);
    *out = NULL;
    return rc;
  }
  memcpy(c->total, s->total, sizeof(double) * (size_t)s->ntotal);
  for (int i = 0; i < s->nparams; i++)
    if ((rc = eqp_solution_set_activity_param(c, s->pname[i], s->pvalue[i])) < 0) {
      eqp_solution_free(c);
      *out = NULL;
      return rc;
    }
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
  if (ops->set_param(s->model.state, name, value, err, sizeof err) != 0)
    return eqpi_fail(s->ctx, EQP_E_PLUGIN, "activity model '%s': %s", s->model.desc->name,
                     err[0] ? err : "parameter refused");
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

double eqp_solution_water_kg(const eqp_solution *s) { return s ? s->water_kg : NAN; }
double eqp_solution_temperature(const eqp_solution *s) { return s ? s->T : NAN; }

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
  const eqpi_db *db = &s->ctx->db;
  const char *alt = suggest(db, name);
  if (alt)
    return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown reagent '%s' (did you mean '%s'?)",
                     name, alt);
  int sp = eqpi_db_find_species(db, name);
  if (sp >= 0)
    return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "'%s' is a charged species, not a reagent: add a "
                     "neutral salt, acid or base that releases it", name);
  return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown reagent '%s' (see 'equipoise species "
                   "list')", name);
}

int eqp_solution_add(eqp_solution *s, const char *reagent, double value, eqp_quantity kind)
{
  if (!s || !reagent) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_ctx *ctx = s->ctx;
  if (!isfinite(value) || value < 0)
    return eqpi_fail(ctx, EQP_E_INPUT, "amount of %s must be a non-negative number, got %g",
                     reagent, value);
  int g = eqpi_db_find_reagent(&ctx->db, reagent);
  if (g < 0) return unknown_reagent(s, reagent);
  const eqpi_reagent *r = &ctx->db.rg[g];
  double mol;
  switch (kind) {
  case EQP_Q_AMOUNT: mol = value; break;
  case EQP_Q_MASS: mol = value * 1e3 / r->molar_mass; break;
  case EQP_Q_MOLARITY: mol = value * eqp_solution_volume(s); break;
  case EQP_Q_MOLALITY: mol = value * s->water_kg; break;
  case EQP_Q_VOLUME:
    if (isnan(r->density))
      return eqpi_fail(ctx, EQP_E_INPUT, "%s has no density in the library, so it cannot be "
                       "measured by volume; give a mass or an amount", reagent);
    mol = value * 1e3 * r->density / r->molar_mass;
    break;
  default:
    return eqpi_fail(ctx, EQP_E_INPUT, "an amount of %s must be an amount, mass, "
                     "concentration or molality", reagent);
  }
  int rc = grow_totals(s);
  if (rc < 0) return rc;
  for (int t = 0; t < r->nterm; t++) s->total[r->term_comp[t]] += mol * r->term_nu[t];
  s->water_kg += mol * r->hydrate * EQPI_M_WATER * 1e-3;
  return EQP_OK;
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

int eqp_solution_equilibrate(eqp_solution *s, eqp_result **out)
{
  if (!s || !out) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  *out = NULL;
  eqp_ctx *ctx = s->ctx;
  int rc = grow_totals(s);
  if (rc < 0) return rc;
  double stack[128];
  double *mol = s->ntotal <= 128 ? stack : eqpi_malloc(ctx, sizeof(double) * (size_t)s->ntotal);
  if (!mol) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (int c = 0; c < s->ntotal; c++) mol[c] = s->total[c] / s->water_kg;
  eqpi_solve_stats st = {0};
  rc = eqpi_system_solve(ctx, &s->sys, mol, s->T, &s->model, &st);
  if (mol != stack) eqpi_free(ctx, mol, sizeof(double) * (size_t)s->ntotal);
  if (rc < 0) return rc;
  return eqpi_result_make(ctx, s->sys, &s->model, s->T, s->water_kg, &st, out);
}
