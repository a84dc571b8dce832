/* Recipes: the amounts of a buffer's reagents (two solid forms, or a free
** acid or base and a titrant stock), plus a neutral salt for a target
** ionic strength, that give a target pH at a working temperature. The pH
** condition is solved with the H+ activity held fixed (eqpi_system_adjust);
** the ionic strength by secant iteration around it. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include "system_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_ITEMS 6

struct eqp_recipe {
  eqp_ctx *ctx;
  int nitems;
  eqp_recipe_item item[MAX_ITEMS];
  char names[MAX_ITEMS][96];
  double pH, I, T, volume;
  eqp_solution *made;          /* the composition the recipe describes */
  char procedure[4096];
};

static const eqpi_reagent *reagent_of(eqp_ctx *ctx, const char *name)
{
  int g = eqpi_db_find_reagent(&ctx->db, name);
  return g < 0 ? NULL : &ctx->db.rg[g];
}

typedef struct plan {
  const eqpi_reagent *a, *b;   /* pair: acid form, base form; or free + titrant */
  int titrant;                 /* b is a titrant stock */
  const eqpi_reagent *salt;
} plan;

static int choose(eqp_ctx *ctx, const eqp_recipe_spec *sp, plan *p)
{
  memset(p, 0, sizeof *p);
  const char *r1 = NULL, *r2 = NULL;
  if (sp->nreagents == 2) {
    r1 = sp->reagents[0];
    r2 = sp->reagents[1];
  } else if (sp->nreagents != 0) {
    return eqpi_fail(ctx, EQP_E_INPUT, "recipe: 'using' lists two reagents (acid and base form, "
                     "or the buffer substance and a titrant)");
  }
  if (sp->buffer) {
    const eqpi_buffer *b = NULL;
    for (int i = 0; i < ctx->db.nbuffers; i++)
      if (strcmp(ctx->db.buffers[i].name, sp->buffer) == 0) b = &ctx->db.buffers[i];
    if (!b) return eqpi_fail(ctx, EQP_E_UNKNOWN, "recipe: no buffer '%s' in the library",
                             sp->buffer);
    if (!r1) {
      if (b->acid >= 0) {
        r1 = ctx->db.rg[b->acid].name;
        r2 = ctx->db.rg[b->base].name;
      } else {
        r1 = ctx->db.rg[b->free].name;
        r2 = ctx->db.rg[b->titrant].name;
      }
    }
  }
  if (!r1) return eqpi_fail(ctx, EQP_E_INPUT, "recipe: name a 'buffer' or the reagents 'using'");
  p->a = reagent_of(ctx, r1);
  p->b = reagent_of(ctx, r2);
  if (!p->a || !p->b)
    return eqpi_fail(ctx, EQP_E_UNKNOWN, "recipe: unknown reagent '%s'", p->a ? r2 : r1);
  /* a strong acid or base as the second is a titrant stock; two forms of
  ** the same system are a pair */
  static const char *const strong[] = {"HCl", "HNO3", "NaOH", "KOH"};
  for (size_t i = 0; i < sizeof strong / sizeof strong[0]; i++)
    if (strcmp(p->b->name, strong[i]) == 0) p->titrant = 1;
  if (!isnan(sp->ionic_strength)) {
    p->salt = reagent_of(ctx, sp->salt ? sp->salt : "NaCl");
    if (!p->salt) return eqpi_fail(ctx, EQP_E_UNKNOWN, "recipe: unknown salt '%s'", sp->salt);
  }
  return EQP_OK;
}

/* Make the buffer at salt s_mol; *v is the base-form fraction (pair) or
** litres of titrant stock. The solution *out holds the composition. */
static int make_at(eqp_ctx *ctx, const eqp_recipe_spec *sp, const plan *p, double s_mol,
                   eqp_solution **out, double *v)
{
  double W = sp->volume * eqpi_water_density(sp->T), n = sp->total * sp->volume;
  eqp_solution_opts o = {W, sp->T, sp->activity};
  eqp_solution *s;
  int rc = eqp_solution_new(ctx, &o, &s);
  if (rc < 0) return rc;
  double *a = eqpi_calloc(ctx, (size_t)s->ntotal + 1, sizeof(double)), wa, wb;
  if (!a) { eqp_solution_free(s); return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"); }
  /* the water of crystallisation and of the titrant is part of the final
  ** volume, so the solvent stays at W while the amounts vary */
  if ((rc = eqpi_use_reagent(s, p->a)) < 0 || (rc = eqpi_use_reagent(s, p->b)) < 0 ||
      (p->salt && (rc = eqpi_use_reagent(s, p->salt)) < 0)) {
    eqpi_free(ctx, a, sizeof(double) * ((size_t)s->ntotal + 1));
    eqp_solution_free(s);
    return rc;
  }
  eqpi_reagent_dir(s, p->a, s->total, &wa, n);
  if (p->salt) eqpi_reagent_dir(s, p->salt, s->total, &wb, s_mol);
  eqpi_adjust aj = {s->total, a, W, 0, sp->T, &s->model, sp->pH, 0, 0, "", ""};
  char what[160], limit[96];
  if (p->titrant) {
    eqpi_reagent_dir(s, p->b, a, &wb, sp->titrant_molar);     /* per L of stock */
    aj.vmax = sp->volume;
    snprintf(what, sizeof what, "%s and %s", p->a->name, p->b->name);
    snprintf(limit, sizeof limit, "a titrant volume equal to the final volume");
  } else {
    eqpi_reagent_dir(s, p->b, a, &wb, n);                     /* all base form */
    double *acid = eqpi_calloc(ctx, (size_t)s->ntotal + 1, sizeof(double));
    if (!acid) { rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"); goto out; }
    eqpi_reagent_dir(s, p->a, acid, &wa, n);
    for (int c = 0; c < s->ntotal; c++) a[c] -= acid[c];       /* per unit: swap a for b */
    eqpi_free(ctx, acid, sizeof(double) * ((size_t)s->ntotal + 1));
    aj.vmax = 1;
    snprintf(what, sizeof what, "%s and %s", p->a->name, p->b->name);
    snprintf(limit, sizeof limit, "the base form alone");
  }
  aj.what = what;
  aj.vmax_text = limit;
  aj.v0 = aj.vmax * 1e-9;
  eqpi_solve_stats st;
  rc = eqpi_system_adjust(ctx, &s->sys, &aj, v, &st);
  if (rc == EQP_OK)
    for (int c = 0; c < s->ntotal; c++) s->total[c] += *v * a[c];
out:
  eqpi_free(ctx, a, sizeof(double) * ((size_t)s->ntotal + 1));
  if (rc < 0) {
    eqp_solution_free(s);
    return rc;
  }
  *out = s;
  return EQP_OK;
}

static double ionic_strength(eqp_solution *s)
{
  eqp_result *r;
  if (eqp_solution_equilibrate(s, &r) < 0) return NAN;
  double I = eqp_result_ionic_strength(r);
  eqp_result_free(r);
  return I;
}

static void add_item(eqp_recipe *rc, const eqpi_reagent *r, double mol, double mL, int role)
{
  eqp_recipe_item *it = &rc->item[rc->nitems];
  snprintf(rc->names[rc->nitems], sizeof rc->names[0], "%s", r ? r->name : "water");
  it->reagent = rc->names[rc->nitems];
  it->mol = mol;
  it->grams = r && role != EQP_ROLE_TITRANT ? mol * r->molar_mass : NAN;
  it->mL = mL;
  it->role = role;
  rc->nitems++;
}

#define APPEND(...) do { if (used < sizeof out->procedure) used += (size_t)snprintf( \
    out->procedure + used, sizeof out->procedure - used, __VA_ARGS__); } while (0)

static void write_procedure(eqp_recipe *out, const eqp_recipe_spec *sp, const plan *p,
                            const char *model)
{
  size_t used = 0;
  int step = 1;
  double tC = sp->T - 273.15;
  APPEND("Recipe: %.4g mL of buffer, pH %.2f at %.1f C, %.4g mM buffer", sp->volume * 1e3, sp->pH,
         tC, sp->total * 1e3);
  if (p->salt) APPEND(", ionic strength %.3f mol/kg", sp->ionic_strength);
  APPEND(" (activity model %s)\n", model);
  for (int i = 0; i < out->nitems; i++) {
    const eqp_recipe_item *it = &out->item[i];
    if (it->role == EQP_ROLE_SOLID || it->role == EQP_ROLE_SALT)
      APPEND("%2d. Weigh %.4f g of %s (%.4g mmol).\n", step++, it->grams, it->reagent,
             it->mol * 1e3);
  }
  APPEND("%2d. Dissolve in about %.0f mL of water.\n", step++, 0.8 * sp->volume * 1e3);
  for (int i = 0; i < out->nitems; i++) {
    const eqp_recipe_item *it = &out->item[i];
    if (it->role == EQP_ROLE_TITRANT)
      APPEND("%2d. While stirring, add %.2f mL of %.4g M %s (%.4g mmol), slowly.\n", step++,
             it->mL, sp->titrant_molar, it->reagent, it->mol * 1e3);
  }
  APPEND("%2d. Bring to %.1f C and make up to %.4g mL with water (about %.1f mL of water in "
         "all); mix well.\n", step++, tC, sp->volume * 1e3, out->item[out->nitems - 1].mL);
  APPEND("%2d. Check with a pH meter calibrated at %.1f C: it should read %.2f; the model "
         "gives an estimate, the meter decides.\n", step++, tC, sp->pH);
  for (int i = 0; i < out->nitems; i++) {
    char caution[1024];
    if (eqpi_caution_text(&out->ctx->db, eqpi_db_find_reagent(&out->ctx->db, out->item[i].reagent),
                          caution, sizeof caution))
      APPEND("Caution: %s\n", caution);
  }
}

int eqp_recipe_make(eqp_ctx *ctx, const eqp_recipe_spec *spec, eqp_recipe **out)
{
  if (!ctx || !spec || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  eqp_recipe_spec sp = *spec;
  if (!(sp.total > 0) || !(sp.volume > 0))
    return eqpi_fail(ctx, EQP_E_INPUT, "recipe: 'total' and 'volume' must be positive");
  if (!(sp.pH > -1 && sp.pH < 15)) return eqpi_fail(ctx, EQP_E_INPUT, "recipe: pH %g", sp.pH);
  if (!(sp.titrant_molar > 0)) sp.titrant_molar = 1.0;
  if (sp.T == 0) sp.T = 298.15;
  if (ctx->db.nsp == 0) {
    int rc0 = eqp_ctx_load_default_library(ctx);
    if (rc0 < 0) return rc0;
  }
  plan p;
  int rc = choose(ctx, &sp, &p);
  if (rc < 0) return rc;
  eqp_solution *s = NULL;
  double v = 0, salt = 0;
  if ((rc = make_at(ctx, &sp, &p, 0, &s, &v)) < 0) return rc;
  if (p.salt) {
    /* secant on the salt amount: I is nearly linear in it */
    double I0 = ionic_strength(s), target = sp.ionic_strength, W = eqp_solution_water(s);
    if (!(target >= I0 - 1e-9)) {
      eqp_solution_free(s);
      return eqpi_fail(ctx, EQP_E_INPUT, "recipe: the buffer alone has ionic strength %.4f "
                       "mol/kg, above the target %.4f", I0, target);
    }
    double s0 = 0, f0 = I0 - target, s1 = (target - I0) * W, f1 = 0;
    for (int it = 0; it < 30 && fabs(f0) > 1e-10 * target; it++) {
      eqp_solution_free(s);
      if ((rc = make_at(ctx, &sp, &p, s1, &s, &v)) < 0) return rc;
      f1 = ionic_strength(s) - target;
      double s2 = f1 == f0 ? s1 : s1 - f1 * (s1 - s0) / (f1 - f0);
      s0 = s1; f0 = f1; s1 = s2 > 0 ? s2 : 0.5 * s1;
    }
    salt = s0;
  }
  eqp_recipe *r = eqpi_calloc(ctx, 1, sizeof *r);
  if (!r) { eqp_solution_free(s); return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"); }
  r->ctx = ctx;
  double n = sp.total * sp.volume, W = sp.volume * eqpi_water_density(sp.T), water = W;
  if (p.titrant) {
    add_item(r, p.a, n, NAN, EQP_ROLE_SOLID);
    add_item(r, p.b, v * sp.titrant_molar, v * 1e3, EQP_ROLE_TITRANT);
    water -= v * eqpi_water_density(sp.T);             /* the stock's own water */
  } else {
    add_item(r, p.a, (1 - v) * n, NAN, EQP_ROLE_SOLID);
    add_item(r, p.b, v * n, NAN, EQP_ROLE_SOLID);
  }
  if (p.salt) add_item(r, p.salt, salt, NAN, EQP_ROLE_SALT);
  for (int i = 0; i < r->nitems; i++) {
    const eqpi_reagent *g = reagent_of(ctx, r->item[i].reagent);
    if (g && r->item[i].role != EQP_ROLE_TITRANT)
      water -= r->item[i].mol * g->hydrate * EQPI_M_WATER * 1e-3;
  }
  add_item(r, NULL, water / (EQPI_M_WATER * 1e-3), water / eqpi_water_density(sp.T) * 1e3,
           EQP_ROLE_WATER);
  eqp_result *res;
  if ((rc = eqp_solution_equilibrate(s, &res)) < 0) {
    eqp_recipe_free(r);
    eqp_solution_free(s);
    return rc;
  }
  r->pH = eqp_result_pH(res);
  r->I = eqp_result_ionic_strength(res);
  r->T = sp.T;
  r->volume = sp.volume;
  write_procedure(r, &sp, &p, eqp_result_activity_model(res));
  eqp_result_free(res);
  r->made = s;
  *out = r;
  return EQP_OK;
}

void eqp_recipe_free(eqp_recipe *r)
{
  if (!r) return;
  eqp_solution_free(r->made);
  eqpi_free(r->ctx, r, sizeof *r);
}

const eqp_solution *eqp_recipe_solution(const eqp_recipe *r) { return r ? r->made : NULL; }

size_t eqp_recipe_item_count(const eqp_recipe *r) { return r ? (size_t)r->nitems : 0; }

const eqp_recipe_item *eqp_recipe_item_at(const eqp_recipe *r, size_t i)
{
  return r && i < (size_t)r->nitems ? &r->item[i] : NULL;
}

double eqp_recipe_pH(const eqp_recipe *r) { return r ? r->pH : NAN; }
double eqp_recipe_ionic_strength(const eqp_recipe *r) { return r ? r->I : NAN; }
const char *eqp_recipe_procedure(const eqp_recipe *r) { return r ? r->procedure : NULL; }
