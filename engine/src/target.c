/* Adjusting a solution to targets: the pH, the activity or free molality of
** a species, the ionic strength; each met by the amount of a reagent or a
** stock, all in one solve (adjust.c). And holding a component's activity
** with a counter-ion balancing the charge. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

/* One target's direction: what a unit of v adds (components into a, water
** into *w) and its bounds. */
typedef struct leg {
  double *a;
  const eqpi_reagent *reagent;
  double L_per_unit;    /* litres per unit: a stock, or a liquid reagent (NaN: a solid) */
  char what[128], limit[128];
} leg;

static int check_target(eqp_solution *s, const eqp_target *t, int *species)
{
  eqp_ctx *ctx = s->ctx;
  char hint[256];
  *species = -1;
  if (!t->reagent == !t->stock)
    return eqpi_fail(ctx, EQP_E_ARG, "a target needs one reagent or one stock to reach it");
  switch (t->kind) {
  case EQP_TARGET_PH:
    if (!isfinite(t->value) || t->value < -2 || t->value > 16)
      return eqpi_fail(ctx, EQP_E_INPUT, "target pH %g is outside -2..16", t->value);
    return EQP_OK;
  case EQP_TARGET_IONIC_STRENGTH:
    if (!(t->value > 0 && t->value <= EQPI_MAX_MOLALITY))
      return eqpi_fail(ctx, EQP_E_INPUT, "target ionic strength %g mol/kg is outside (0, %g]",
                       t->value, EQPI_MAX_MOLALITY);
    return EQP_OK;
  case EQP_TARGET_ACTIVITY:
  case EQP_TARGET_FREE:
    if (!t->species) return eqpi_fail(ctx, EQP_E_ARG, "an activity target names its species");
    *species = eqpi_db_find_species(s->db, t->species);
    if (*species < 0)
      return eqpi_fail(ctx, EQP_E_UNKNOWN, "unknown species '%s'%s", t->species,
                       eqpi_name_hint(t->species, hint, sizeof hint));
    if (*species == s->db->water)
      return eqpi_fail(ctx, EQP_E_INPUT, "the activity of water is not a target");
    if (!(t->value > 0 && t->value <= EQPI_MAX_MOLALITY))
      return eqpi_fail(ctx, EQP_E_INPUT, "target %s of %s, %g, is outside (0, %g]",
                       t->kind == EQP_TARGET_FREE ? "free molality" : "activity", t->species,
                       t->value, EQPI_MAX_MOLALITY);
    return EQP_OK;
  }
  return eqpi_fail(ctx, EQP_E_ARG, "unknown target kind %d", (int)t->kind);
}

/* The direction of target t into leg g and adjustment aj. */
static int make_leg(eqp_solution *s, const eqp_target *t, int species, leg *g, eqpi_adjust *aj)
{
  int rc;
  static const int kinds[] = {EQPI_ADJ_PH, EQPI_ADJ_ACTIVITY, EQPI_ADJ_FREE, EQPI_ADJ_IONIC};
  *aj = (eqpi_adjust){.N0 = s->total, .a = g->a, .W0 = s->water_kg, .T = s->T,
                      .model = &s->model, .pH = t->value, .kind = kinds[t->kind],
                      .species = species, .value = t->value};
  if (t->stock) {
    const eqp_solution *k = t->stock;
    for (int c = 0; c < k->ntotal && c < s->ntotal; c++) g->a[c] = k->total[c] / k->water_kg;
    aj->w = 1;                                 /* v: kg of the stock's water */
    aj->vmax = 20 * s->water_kg;
    g->L_per_unit = 1 / eqpi_water_density(k->T);
    snprintf(g->what, sizeof g->what, "the stock solution");
    snprintf(g->limit, sizeof g->limit, "20 times the solution's own water");
  } else {
    if ((rc = eqpi_find_reagent(s, t->reagent, &g->reagent)) < 0) return rc;
    eqpi_reagent_dir(s, g->reagent, g->a, &aj->w, 1.0);          /* v: mol of the reagent */
    aj->vmax = 5 * s->water_kg;
    g->L_per_unit = g->reagent->molar_mass / (1e3 * g->reagent->density); /* NaN: a solid */
    snprintf(g->what, sizeof g->what, "%s", t->reagent);
    snprintf(g->limit, sizeof g->limit, "5 mol of %s per kg of water", t->reagent);
  }
  aj->what = g->what;
  aj->vmax_text = g->limit;
  aj->v0 = aj->vmin = aj->vmax * 1e-12;   /* a trace: every component of the reagent is present */
  return EQP_OK;
}

/* "pH adjustment to 7.40 with NaOH", or the list of the targets. */
static void describe(char *buf, size_t len, const eqp_target *t, const leg *g, size_t n)
{
  if (n == 1 && t[0].kind == EQP_TARGET_PH) {
    snprintf(buf, len, "pH adjustment to %.2f with %s", t[0].value, g[0].what);
    return;
  }
  size_t used = (size_t)snprintf(buf, len, "adjustment of");
  for (size_t k = 0; k < n && used < len; k++) {
    const char *sep = k ? "," : "";
    if (t[k].kind == EQP_TARGET_PH)
      used += (size_t)snprintf(buf + used, len - used, "%s the pH to %.2f with %s", sep,
                               t[k].value, g[k].what);
    else if (t[k].kind == EQP_TARGET_IONIC_STRENGTH)
      used += (size_t)snprintf(buf + used, len - used, "%s the ionic strength to %.4g mol/kg with "
                               "%s", sep, t[k].value, g[k].what);
    else
      used += (size_t)snprintf(buf + used, len - used, "%s %s %s to %.4g%s with %s", sep,
                               t[k].kind == EQP_TARGET_FREE ? "free" : "the activity of",
                               t[k].species, t[k].value,
                               t[k].kind == EQP_TARGET_FREE ? " mol/kg" : "", g[k].what);
  }
}

/* The species a target fixes: H+ for a pH, the species of an activity or
** free molality, -1 for the ionic strength. */
static int fixes(const eqp_solution *s, const eqp_target *t, int species)
{
  return t->kind == EQP_TARGET_PH ? s->db->h_plus
       : t->kind == EQP_TARGET_IONIC_STRENGTH ? -1 : species;
}

/* Targets that cannot hold together are refused as such, before the solve
** would fail with "the targets could not be met together": two on the same
** quantity (two pH values, a pH and the activity of H+), or one reagent or
** stock for two targets (one amount cannot meet two values). */
static int check_together(eqp_solution *s, const eqp_target *t, const int *species, size_t n)
{
  for (size_t k = 0; k < n; k++)
    for (size_t j = k + 1; j < n; j++) {
      int fk = fixes(s, &t[k], species[k]), fj = fixes(s, &t[j], species[j]);
      int both_ionic = t[k].kind == EQP_TARGET_IONIC_STRENGTH &&
                       t[j].kind == EQP_TARGET_IONIC_STRENGTH;
      if (both_ionic || (fk >= 0 && fk == fj))
        return eqpi_fail(s->ctx, EQP_E_INPUT, "targets %zu and %zu both set %s: a solution has "
                         "one value of it; keep one", k + 1, j + 1,
                         both_ionic ? "the ionic strength"
                         : fk == s->db->h_plus ? "the pH (the activity of H+)"
                         : s->db->sp[fk].name);
      int same = t[k].stock ? t[k].stock == t[j].stock
                 : t[j].reagent && eqpi_db_find_reagent(s->db, t[k].reagent) >= 0 &&
                   eqpi_db_find_reagent(s->db, t[k].reagent) ==
                   eqpi_db_find_reagent(s->db, t[j].reagent);
      if (same)
        return eqpi_fail(s->ctx, EQP_E_INPUT, "targets %zu and %zu both add %s: one amount "
                         "cannot meet two targets; give each target a reagent or stock of its "
                         "own", k + 1, j + 1, t[k].stock ? "the same stock" : t[k].reagent);
    }
  return EQP_OK;
}

int eqp_solution_adjust(eqp_solution *s, eqp_target *user, size_t n)
{
  if (!s || !user) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_ctx *ctx = s->ctx;
  if (n < 1 || n > EQP_MAX_TARGETS)
    return eqpi_fail(ctx, EQP_E_ARG, "an adjustment has 1 to %d targets", EQP_MAX_TARGETS);
  /* the caller's elements are as large as its headers made them */
  eqp_target targets[EQP_MAX_TARGETS];
  size_t stride = user->size;
  int rc = eqpi_solution_grow(s), species[EQP_MAX_TARGETS];
  for (size_t k = 0; k < n && rc == EQP_OK; k++) {
    eqp_target init = EQP_TARGET_INIT;
    targets[k] = init;
    rc = eqpi_opts_read(ctx, "eqp_target", (const char *)user + k * stride, &targets[k],
                        sizeof targets[k], EQPI_TARGET_FIRST);
  }
  for (size_t k = 0; k < n && rc == EQP_OK; k++)
    if (targets[k].stock == s)   /* as pour refuses it: no amount of itself changes it */
      rc = eqpi_fail(ctx, EQP_E_INPUT, "a solution cannot be adjusted with itself as the stock");
  for (size_t k = 0; k < n && rc == EQP_OK; k++) rc = check_target(s, &targets[k], &species[k]);
  if (rc == EQP_OK) rc = check_together(s, targets, species, n);
  if (rc < 0) return rc;
  size_t nb = (size_t)s->ntotal + 1;
  double *block = eqpi_calloc(ctx, nb * n, sizeof(double));
  if (!block) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  leg g[EQP_MAX_TARGETS];
  eqpi_adjust aj[EQP_MAX_TARGETS];
  double v[EQP_MAX_TARGETS];
  for (size_t k = 0; k < n && rc == EQP_OK; k++) {
    memset(&g[k], 0, sizeof g[k]);
    g[k].a = block + k * nb;
    rc = make_leg(s, &targets[k], species[k], &g[k], &aj[k]);
  }
  char what[512];
  if (rc == EQP_OK) describe(what, sizeof what, targets, g, n);
  eqpi_solve_stats st = {0};
  int model = 0;
  if (rc == EQP_OK) rc = eqpi_solution_adjust(s, aj, (int)n, v, &st, &model, what);
  for (size_t k = 0; k < n && rc == EQP_OK; k++)
    rc = targets[k].stock ? eqpi_use_stock(s, targets[k].stock) : eqpi_use_reagent(s, g[k].reagent);
  if (rc == EQP_OK) {
    for (size_t k = 0; k < n; k++) {
      for (int c = 0; c < s->ntotal; c++) s->total[c] += v[k] * g[k].a[c];
      s->water_kg += v[k] * aj[k].w;
      const eqp_solution *stock = targets[k].stock;
      if (stock) {
        s->solute_L += v[k] / stock->water_kg * stock->solute_L;
        s->unknown_g += v[k] / stock->water_kg * stock->unknown_g;
      } else {
        eqpi_solution_bulk(s, g[k].reagent, v[k]);
      }
      eqp_target *out = (eqp_target *)((char *)user + k * stride);
      out->mol = stock ? NAN : v[k];
      out->litres = v[k] * g[k].L_per_unit;
    }
    /* the adjusted state's warnings go to the observer: there is no result */
    st.solute_L = s->solute_L;
    st.unknown_g = s->unknown_g;
    st.replaced = model > 0 ? s->model.desc : NULL;
    eqpi_prefixed pw = {ctx, what};
    eqpi_state_warnings(aj[0].model, eqpi_system_ionic_strength(s->sys), s->T, s->water_kg, &st,
                        eqpi_warn_prefixed, &pw);
  }
  eqpi_free(ctx, block, nb * n * sizeof(double));
  return rc;
}

int eqp_solution_adjust_pH(eqp_solution *s, double pH, const char *reagent,
                           const eqp_solution *stock, double *mol, double *litres)
{
  if (!s || (!reagent && !stock)) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_target t = EQP_TARGET_INIT;
  t.value = pH;
  t.reagent = reagent;
  t.stock = stock;
  int rc = eqp_solution_adjust(s, &t, 1);
  if (rc == EQP_OK) {
    if (mol) *mol = t.mol;
    if (litres) *litres = t.litres;
  }
  return rc;
}

/* A component by the name of its species, or a message. */
static int component(eqp_solution *s, const char *name, const char *role, int *c)
{
  const eqpi_db *db = s->db;
  char hint[256];
  int sp = name ? eqpi_db_find_species(db, name) : -1;
  if (sp < 0)
    return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown %s '%s'%s", role, name ? name : "(null)",
                     name ? eqpi_name_hint(name, hint, sizeof hint) : "");
  if (db->sp[sp].component < 0 || sp == db->water)
    return eqpi_fail(s->ctx, EQP_E_INPUT, "%s '%s' is not a component (a free ion such as "
                     "'Ca^2+' or 'Cl-')", role, name);
  *c = db->sp[sp].component;
  return EQP_OK;
}

/* The fallback of a fixed activity: the amount of the neutral pair (one
** component, -z_c/z_q counter-ion) as an adjustment, solved by Brent's
** method on ordinary solves where the one solve failed; bounded by what the
** solution holds, so a target no positive total reaches is refused. */
static int fix_by_amount(eqp_solution *s, const char *name, double activity, int c, int q,
                         double *mol, double *mol_counter)
{
  eqp_ctx *ctx = s->ctx;
  const eqpi_db *db = s->db;
  int hplus = db->sp[db->h_plus].component;
  double *a = eqpi_calloc(ctx, (size_t)s->ntotal + 1, sizeof(double));
  if (!a) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  a[c] = 1;
  a[q] = -db->sp[db->comp_species[c]].comp.charge / db->sp[db->comp_species[q]].comp.charge;
  double lo = -5 * s->water_kg, hi = 5 * s->water_kg;
  for (int k = 0; k < s->ntotal; k++)
    if (k != hplus && a[k] > 0) lo = fmax(lo, -s->total[k] / a[k]);
    else if (k != hplus && a[k] < 0) hi = fmin(hi, s->total[k] / -a[k]);
  double trace = 1e-12 * s->water_kg;
  char limit[160];
  snprintf(limit, sizeof limit, "all the %s the solution holds", db->sp[db->comp_species[
           a[c] * a[q] < 0 ? q : c]].name);
  eqpi_adjust aj = {.N0 = s->total, .a = a, .W0 = s->water_kg, .T = s->T, .model = &s->model,
                    .vmin = lo + trace, .vmax = hi - trace, .what = "its counter-ion",
                    .vmax_text = limit, .kind = EQPI_ADJ_ACTIVITY,
                    .species = db->comp_species[c], .value = activity};
  aj.v0 = (c == hplus || s->total[c] > 0) && (q == hplus || s->total[q] > 0) && aj.vmin < 0 &&
          aj.vmax > 0 ? 0 : aj.vmin;
  int rc = aj.vmin < aj.vmax ? EQP_OK
           : eqpi_fail(ctx, EQP_E_INPUT, "activity %g of %s cannot be held: the counter-ion "
                       "would need a negative total (name one of the other charge)", activity,
                       name);
  double v = 0;
  eqpi_solve_stats st;
  int k = 0;
  if (rc == EQP_OK) rc = eqpi_solution_adjust(s, &aj, 1, &v, &st, &k, "fixed activity");
  if (rc == EQP_OK) {
    for (int j = 0; j < s->ntotal; j++) s->total[j] += v * a[j];
    if (mol) *mol = v;
    if (mol_counter) *mol_counter = v * a[q];
  }
  eqpi_free(ctx, a, sizeof(double) * ((size_t)s->ntotal + 1));
  return rc;
}

int eqp_solution_fix_activity(eqp_solution *s, const char *comp, double activity,
                              const char *counter_ion, double *mol, double *mol_counter)
{
  if (!s) return EQP_E_ARG;
  eqp_ctx *ctx = s->ctx;
  int c, q, rc = eqpi_solution_grow(s);
  if (rc < 0 || (rc = component(s, comp, "component", &c)) < 0 ||
      (rc = component(s, counter_ion, "counter-ion", &q)) < 0)
    return rc;
  const eqpi_db *db = s->db;
  if (c == q) return eqpi_fail(ctx, EQP_E_INPUT, "the counter-ion must differ from '%s'", comp);
  if (db->sp[db->comp_species[q]].comp.charge == 0)
    return eqpi_fail(ctx, EQP_E_INPUT, "counter-ion '%s' has no charge", counter_ion);
  if (!(activity > 0 && activity <= EQPI_MAX_MOLALITY))
    return eqpi_fail(ctx, EQP_E_INPUT, "activity of %s, %g, is outside (0, %g]", comp, activity,
                     EQPI_MAX_MOLALITY);
  /* with solids allowed, the amount of the neutral pair is solved with
  ** their amounts (an adjustment coupled to the active set) */
  if (eqpi_solution_any_solid(s)) return fix_by_amount(s, comp, activity, c, q, mol, mol_counter);
  double *tot = eqpi_malloc(ctx, sizeof(double) * ((size_t)s->ntotal + 1)), tc, tq;
  if (!tot) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (int k = 0; k < s->ntotal; k++) tot[k] = s->total[k] / s->water_kg;
  rc = eqpi_system_fix(ctx, s->db, &s->sys, tot, s->T, &s->model, c, log(activity), q, &tc, &tq);
  eqpi_free(ctx, tot, sizeof(double) * ((size_t)s->ntotal + 1));
  int hplus = db->sp[db->h_plus].component;
  if (rc == EQP_E_CONVERGE) return fix_by_amount(s, comp, activity, c, q, mol, mol_counter);
  if (rc < 0) return rc;
  if ((c != hplus && tc < 0) || (q != hplus && tq < 0)) {
    eqpi_system_forget(s->sys);
    return eqpi_fail(ctx, EQP_E_INPUT, "activity %g of %s would need a negative total of %s: "
                     "name a counter-ion of the other charge", activity, comp,
                     tc < 0 && c != hplus ? comp : counter_ion);
  }
  double dc = tc * s->water_kg - s->total[c], dq = tq * s->water_kg - s->total[q];
  s->total[c] = tc * s->water_kg;
  s->total[q] = tq * s->water_kg;
  if (mol) *mol = dc;
  if (mol_counter) *mol_counter = dq;
  return EQP_OK;
}
