/* Recipes: the amounts of a buffer's reagents (two solid forms, or a free
** acid or base and a titrant stock), plus a neutral salt for a target
** ionic strength, that give a target pH at a working temperature: one
** solve with the H+ activity and the ionic strength held at their targets
** and the amounts unknown (eqpi_system_adjust). */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_ITEMS 6
#define MAX_WARN 10

struct eqp_recipe {
  eqp_ctx *ctx;
  int nitems;
  eqp_recipe_item item[MAX_ITEMS];
  char names[MAX_ITEMS][96];
  char printed[MAX_ITEMS][32];
  double pH, I, T, volume;
  eqp_solution *made;          /* the composition the recipe describes */
  char procedure[4096];
  const char *model;           /* the activity model the amounts were computed with */
  int nwarn;
  char warn[MAX_WARN][400];
  const char *kind[MAX_WARN];  /* static strings: the kinds of eqp_warning_fn */
};

static const eqpi_reagent *reagent_of(eqp_ctx *ctx, const char *name)
{
  int g = eqpi_db_find_reagent(ctx->db, name);
  return g < 0 ? NULL : &ctx->db->rg[g];
}

typedef struct plan {
  const eqpi_reagent *a, *b;   /* pair: acid form, base form; or free + titrant */
  int titrant;                 /* b is a titrant stock */
  const eqpi_reagent *salt;
} plan;

/* Whether component c has protonated forms: a species made of c alone
** besides H+ and water (PO4^3- has HPO4^2-; Na+ and Cl- have none). */
static int has_ladder(const eqpi_db *db, int c)
{
  for (int j = 0; j < db->nsp; j++) {
    const eqpi_species *s = &db->sp[j];
    int only_c = 0, other = 0;
    for (int t = 0; t < s->nterm; t++) {
      int cs = db->comp_species[s->term_comp[t]];
      if (cs == db->h_plus || cs == db->water || s->term_nu[t] == 0) continue;
      if (s->term_comp[t] == c) only_c = 1;
      else other = 1;
    }
    if (only_c && !other && j != db->comp_species[c]) return 1;
  }
  return 0;
}

/* Whether reagent u releases the acid or base of reagent form (a component
** with protonated forms that both hold): KH2PO4 for NaH2PO4, not Tris. */
static int same_system(const eqpi_db *db, const eqpi_reagent *form, const eqpi_reagent *u)
{
  for (int a = 0; a < form->nterm; a++)
    for (int b = 0; b < u->nterm; b++)
      if (form->term_comp[a] == u->term_comp[b] && has_ladder(db, form->term_comp[a]))
        return 1;
  return 0;
}

int eqpi_reagent_kind(const eqpi_db *db, const eqpi_reagent *r, int *comp)
{
  double h = 0;
  int ladder = -1;
  for (int t = 0; t < r->nterm; t++) {
    int cs = db->comp_species[r->term_comp[t]];
    if (cs == db->h_plus) h += r->term_nu[t];
    else if (cs != db->water && r->term_nu[t] != 0 && ladder < 0 && has_ladder(db, r->term_comp[t]))
      ladder = r->term_comp[t];
  }
  if (comp) *comp = ladder;
  if (ladder >= 0) return EQPI_RG_WEAK;
  return h > 0 ? EQPI_RG_ACID : h < 0 ? EQPI_RG_BASE : EQPI_RG_NEUTRAL;
}

/* The salt that sets the ionic strength must leave the pH and the buffer
** alone: an acid or base, or a salt of the buffer's own system, would be
** compensated by the buffer's ratio (or make the targets unreachable), so
** the recipe would not be the buffer asked for. */
static int check_salt(eqp_ctx *ctx, const plan *p)
{
  const eqpi_db *db = ctx->db;
  const eqpi_reagent *s = p->salt;
  static const char fix[] = "the ionic strength is set with a neutral salt that leaves the pH "
                            "alone, such as NaCl or KCl";
  for (int t = 0; t < s->nterm; t++) {
    int c = s->term_comp[t], cs = db->comp_species[c];
    if (cs == db->h_plus || cs == db->water || s->term_nu[t] == 0 || !has_ladder(db, c)) continue;
    for (int k = 0; k < 2; k++) {
      const eqpi_reagent *f = k ? p->b : p->a;
      for (int u = 0; u < f->nterm; u++)
        if (f->term_comp[u] == c && f->term_nu[u] != 0)
          return eqpi_fail(ctx, EQP_E_INPUT, "recipe: salt = '%s' holds %s, of the buffer's own "
                           "system (as %s does): it would change the buffer's total and ratio; "
                           "%s", s->name, db->sp[cs].name, f->name, fix);
    }
  }
  int kind = eqpi_reagent_kind(db, s, NULL);
  if (kind == EQPI_RG_ACID || kind == EQPI_RG_BASE)
    return eqpi_fail(ctx, EQP_E_INPUT, "recipe: salt = '%s' is %s (it %s H+), not a neutral salt; "
                     "%s", s->name, kind == EQPI_RG_ACID ? "an acid" : "a base",
                     kind == EQPI_RG_ACID ? "releases" : "takes up", fix);
  return EQP_OK;
}

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
    for (int i = 0; i < ctx->db->nbuffers; i++)
      if (strcmp(ctx->db->buffers[i].name, sp->buffer) == 0) b = &ctx->db->buffers[i];
    if (!b) return eqpi_fail(ctx, EQP_E_UNKNOWN, "recipe: no buffer '%s' in the library",
                             sp->buffer);
    if (r1) {   /* the reagents on the shelf must make this buffer, not another */
      const eqpi_reagent *form = &ctx->db->rg[b->acid >= 0 ? b->acid : b->free];
      const eqpi_reagent *u1 = reagent_of(ctx, r1), *u2 = reagent_of(ctx, r2);
      if (u1 && u2 && !same_system(ctx->db, form, u1) && !same_system(ctx->db, form, u2))
        return eqpi_fail(ctx, EQP_E_INPUT, "recipe: using = { %s, %s } does not make the buffer "
                         "'%s' (%s is one of its reagents); name the buffer of these reagents, "
                         "or leave out 'buffer'", r1, r2, b->name, form->name);
    } else {
      if (b->acid >= 0) {
        r1 = ctx->db->rg[b->acid].name;
        r2 = ctx->db->rg[b->base].name;
      } else {
        r1 = ctx->db->rg[b->free].name;
        r2 = ctx->db->rg[b->titrant].name;
      }
    }
  }
  if (!r1) return eqpi_fail(ctx, EQP_E_INPUT, "recipe: name a 'buffer' or the reagents 'using'");
  p->a = reagent_of(ctx, r1);
  p->b = reagent_of(ctx, r2);
  if (!p->a || !p->b)
    return eqpi_fail(ctx, EQP_E_UNKNOWN, "recipe: unknown reagent '%s'", p->a ? r2 : r1);
  if (p->a == p->b)
    return eqpi_fail(ctx, EQP_E_INPUT, "recipe: using names %s twice; name two reagents: the "
                     "acid and base forms (such as { 'NaH2PO4', 'Na2HPO4' }), or the buffer "
                     "substance and a strong acid or base (such as { 'Tris', 'HCl' })", p->a->name);
  if (eqpi_reagent_kind(ctx->db, p->a, NULL) != EQPI_RG_WEAK &&
      eqpi_reagent_kind(ctx->db, p->b, NULL) != EQPI_RG_WEAK)
    return eqpi_fail(ctx, EQP_E_INPUT, "recipe: using = { %s, %s } makes no buffer: neither is "
                     "a weak acid or base (a form of a buffer system such as phosphate or Tris); "
                     "name one, with its other form or a strong acid or base", p->a->name,
                     p->b->name);
  /* a strong acid or base as the second is a titrant stock; two forms of
  ** the same system are a pair */
  static const char *const strong[] = {"HCl", "HNO3", "NaOH", "KOH"};
  for (size_t i = 0; i < sizeof strong / sizeof strong[0]; i++)
    if (strcmp(p->b->name, strong[i]) == 0) p->titrant = 1;
  if (!isnan(sp->ionic_strength)) {
    p->salt = reagent_of(ctx, sp->salt ? sp->salt : "NaCl");
    if (!p->salt) return eqpi_fail(ctx, EQP_E_UNKNOWN, "recipe: unknown salt '%s'", sp->salt);
    return check_salt(ctx, p);
  }
  return EQP_OK;
}

/* Make the buffer in W kg of water with model k of the chain: one solve
** with the H+ activity held at the target and the amount v unknown (the
** base-form fraction of a pair, or litres of titrant stock), and, with_salt,
** the ionic strength held at its target too with the salt's amount unknown.
** The solution *out holds the composition. */
static int make_at(eqp_ctx *ctx, const eqp_recipe_spec *sp, const plan *p, double W, int k,
                   int with_salt, eqp_solution **out, double *v, double *salt)
{
  double n = sp->total * sp->volume;
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = W;
  o.temperature_K = sp->T;
  o.activity = sp->activity;
  eqp_solution *s;
  int rc = eqp_solution_new(ctx, &o, &s);
  if (rc < 0) return rc;
  eqpi_model *model = eqpi_chain_model(s, k);
  if (!model) {
    eqp_solution_free(s);
    return eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s' is not available",
                     eqpi_default_chain[k]);
  }
  size_t nb = (size_t)s->ntotal + 1;
  double *a = eqpi_calloc(ctx, 2 * nb, sizeof(double)), *as = a + nb, wa, wb;
  if (!a) { eqp_solution_free(s); return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"); }
  /* the water of crystallisation and of the titrant is part of the final
  ** volume, so the solvent stays at W while the amounts vary */
  if ((rc = eqpi_use_reagent(s, p->a)) < 0 || (rc = eqpi_use_reagent(s, p->b)) < 0 ||
      (p->salt && (rc = eqpi_use_reagent(s, p->salt)) < 0)) {
    eqpi_free(ctx, a, 2 * nb * sizeof(double));
    eqp_solution_free(s);
    return rc;
  }
  eqpi_reagent_dir(s, p->a, s->total, &wa, n);
  eqpi_adjust aj[2] = {{.N0 = s->total, .a = a, .W0 = W, .T = sp->T, .model = model,
                        .pH = sp->pH, .kind = EQPI_ADJ_PH}};
  char what[160], limit[96], salt_limit[96];
  if (p->titrant) {
    eqpi_reagent_dir(s, p->b, a, &wb, sp->titrant_molar);     /* per L of stock */
    aj[0].vmax = sp->volume;
    snprintf(limit, sizeof limit, "a titrant volume equal to the final volume");
  } else {
    eqpi_reagent_dir(s, p->b, a, &wb, n);                     /* all base form */
    eqpi_reagent_dir(s, p->a, as, &wa, n);
    for (int c = 0; c < s->ntotal; c++) a[c] -= as[c];         /* per unit: swap a for b */
    memset(as, 0, nb * sizeof(double));
    aj[0].vmax = 1;
    snprintf(limit, sizeof limit, "the base form alone");
  }
  snprintf(what, sizeof what, "%s and %s", p->a->name, p->b->name);
  aj[0].what = what;
  aj[0].vmax_text = limit;
  aj[0].v0 = aj[0].vmin = aj[0].vmax * 1e-9;
  if (with_salt) {
    eqpi_reagent_dir(s, p->salt, as, &wb, 1.0);               /* per mol of salt */
    snprintf(salt_limit, sizeof salt_limit, "20 mol of %s per kg of water", p->salt->name);
    aj[1] = aj[0];
    aj[1].a = as;
    aj[1].kind = EQPI_ADJ_IONIC;
    aj[1].value = sp->ionic_strength;
    aj[1].what = p->salt->name;
    aj[1].vmax_text = salt_limit;
    aj[1].vmax = 20 * W;
    aj[1].v0 = aj[1].vmin = aj[1].vmax * 1e-12;
  }
  eqpi_solve_stats st;
  double vv[2] = {0, 0};
  rc = eqpi_system_adjust(ctx, s->db, &s->sys, aj, with_salt ? 2 : 1, vv, &st);
  if (rc == EQP_OK)
    for (int c = 0; c < s->ntotal; c++) s->total[c] += vv[0] * a[c] + vv[1] * as[c];
  eqpi_free(ctx, a, 2 * nb * sizeof(double));
  if (rc < 0) {
    eqp_solution_free(s);
    return rc;
  }
  *v = vv[0];
  if (salt) *salt = vv[1];
  *out = s;
  return EQP_OK;
}

/* Ionic strength of s with model k of the chain, not following it. */
static double ionic_strength(eqp_solution *s, int k)
{
  eqp_result *r;
  if (eqpi_solution_equilibrate_from(s, &k, 0, &r, NULL) < 0) return NAN;
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

/* A mass (g) or a volume (mL) as the procedure prints it: grams to 0.1 mg
** and millilitres to 0.01 mL as a balance and a burette read, and smaller
** quantities in mg or uL with 4 significant digits (a 1 uL recipe printed
** "0.0000 g"). */
static void quantity_text(char *buf, size_t len, double v, int volume, int decimals)
{
  if (!volume && !(v < 0.01)) snprintf(buf, len, "%.4f g", v);
  else if (!volume) snprintf(buf, len, "%.4g mg", v * 1e3);
  else if (!(v < 0.1)) snprintf(buf, len, "%.*f mL", decimals, v);
  else snprintf(buf, len, "%.4g uL", v * 1e3);
}

static void write_procedure(eqp_recipe *out, const eqp_recipe_spec *sp, const plan *p)
{
  size_t used = 0;
  int step = 1;
  double tC = sp->T - 273.15, water_mL = out->item[out->nitems - 1].mL;
  APPEND("Recipe: %.4g mL of buffer, pH %.2f at %.1f C, %.4g mM buffer", sp->volume * 1e3, sp->pH,
         tC, sp->total * 1e3);
  if (p->salt) APPEND(", ionic strength %.3f mol/kg", sp->ionic_strength);
  APPEND(" (activity model %s)\n", out->model);
  for (int i = 0; i < out->nitems; i++) {
    const eqp_recipe_item *it = &out->item[i];
    if (it->role == EQP_ROLE_SOLID || it->role == EQP_ROLE_SALT)
      APPEND("%2d. Weigh %s of %s (%.4g mmol).\n", step++, it->printed, it->reagent,
             it->mol * 1e3);
  }
  char q[48];
  quantity_text(q, sizeof q, 0.8 * water_mL, 1, 0);
  APPEND("%2d. Dissolve in about %s of water.\n", step++, q);
  for (int i = 0; i < out->nitems; i++) {
    const eqp_recipe_item *it = &out->item[i];
    if (it->role == EQP_ROLE_TITRANT)
      APPEND("%2d. While stirring, add %s of %.4g M %s (%.4g mmol), slowly.\n", step++,
             it->printed, sp->titrant_molar, it->reagent, it->mol * 1e3);
  }
  APPEND("%2d. Bring to %.1f C and make up to %.4g mL with water (about %s of water in "
         "all); mix well.\n", step++, tC, sp->volume * 1e3, out->item[out->nitems - 1].printed);
  APPEND("%2d. Check with a pH meter calibrated at %.1f C: it should read %.2f; the model "
         "gives an estimate, the meter decides.\n", step++, tC, sp->pH);
  for (int i = 0; i < out->nwarn; i++) APPEND("Warning: %s.\n", out->warn[i]);
  for (int i = 0; i < out->nitems; i++) {
    char caution[1024];
    if (eqpi_caution_text(out->ctx->db, eqpi_db_find_reagent(out->ctx->db, out->item[i].reagent),
                          caution, sizeof caution))
      APPEND("Caution: %s\n", caution);
  }
}

/* One design at W kg of water with model k of the default chain (0: the
** spec's model): the base-form fraction or titrant litres v, the salt for
** the ionic strength, and the solution they make. */
static int design(eqp_ctx *ctx, const eqp_recipe_spec *sp, const plan *p, double W, int k,
                  eqp_solution **sout, double *v, double *salt)
{
  eqp_solution *s = NULL;
  int rc = make_at(ctx, sp, p, W, k, 0, &s, v, NULL);
  if (rc < 0) return rc;
  *salt = 0;
  if (p->salt) {
    /* the salt for the ionic strength: both targets in one solve */
    double I0 = ionic_strength(s, k), target = sp->ionic_strength;
    eqp_solution_free(s);
    if (!(target >= I0 - 1e-9))
      return isnan(I0) ? eqp_ctx_errcode(ctx)
                       : eqpi_fail(ctx, EQP_E_INPUT, "recipe: the buffer alone has ionic "
                                   "strength %.4f mol/kg, above the target %.4f", I0, target);
    if ((rc = make_at(ctx, sp, p, W, k, 1, &s, v, salt)) < 0) {
      if (rc == EQP_E_NOMEM) return rc;
      char why[EQPI_ERRLEN];
      snprintf(why, sizeof why, "%s", eqp_ctx_errmsg(ctx));
      return eqpi_fail(ctx, EQP_E_INPUT, "recipe: the buffer reaches pH %.2f alone, but not "
                       "with salt "
                       "'%s' bringing the ionic strength to %.4g mol/kg (%s): %s takes up or "
                       "gives off H+ itself; the ionic strength is set with a neutral salt that "
                       "leaves the pH alone, such as NaCl or KCl", sp->pH, p->salt->name, target,
                       why, p->salt->name);
    }
  }
  *sout = s;
  return EQP_OK;
}

/* The volume the solids of a design take (L, known densities) and the mass
** of those whose density is unknown, with their names. */
typedef struct bulk { double L, g; char unknown[160]; } bulk;

static void add_bulk(bulk *b, const eqpi_reagent *r, double mol)
{
  double per;
  if (eqpi_reagent_volume(r, &per)) {
    b->L += mol * per;
  } else if (mol > 0) {
    size_t n = strlen(b->unknown);
    b->g += mol * r->molar_mass;
    snprintf(b->unknown + n, sizeof b->unknown - n, "%s%s", n ? ", " : "", r->name);
  }
}

static void solids(const eqp_recipe_spec *sp, const plan *p, double v, double salt, bulk *b)
{
  double n = sp->total * sp->volume;
  memset(b, 0, sizeof *b);
  if (p->titrant) {
    add_bulk(b, p->a, n);      /* the stock's volume is counted as water */
  } else {
    add_bulk(b, p->a, (1 - v) * n);
    add_bulk(b, p->b, v * n);
  }
  if (p->salt && salt > 0) add_bulk(b, p->salt, salt);
}

/* kind is one of the static kinds of eqp_warning_fn */
static void add_warning(void *ud, const char *kind, const char *text)
{
  eqp_recipe *r = ud;
  if (r->nwarn >= MAX_WARN) return;
  r->kind[r->nwarn] = kind;
  snprintf(r->warn[r->nwarn++], sizeof r->warn[0], "%s", text);
}

/* The solids take part of the final volume V (L): what the water is then,
** and what is not known about it. */
static void volume_warnings(eqp_recipe *r, const eqp_recipe_spec *sp, const bulk *b,
                            double water_mL)
{
  double V = sp->volume;
  char w[400];
  if (b->L > 0.02 * V) {
    snprintf(w, sizeof w, "the solids take about %.0f mL of the %.4g mL (crystal densities, "
             "volumes taken as additive), so about %.0f mL of water goes in, and the amounts "
             "were computed for that water; make up to the mark rather than measuring the "
             "water", b->L * 1e3, V * 1e3, water_mL);
    add_warning(r, "recipe-volume", w);
  }
  if (b->g > 0.02 * V * 1e3) {
    snprintf(w, sizeof w, "the engine knows no density for %s (%.4g g): its volume, up to "
             "about %.0f mL at a density of 1 g/mL or more, is not counted, so less water than "
             "stated goes in and the concentrations in mol/kg are higher than those the pH "
             "was computed with", b->unknown, b->g, b->g);
    add_warning(r, "recipe-volume", w);
  }
}

/* A design settled on: the water the solids leave of the final volume and
** the model of the default chain both depend on the amounts, so the design
** is repeated until neither changes. */
typedef struct settled {
  eqp_solution *s;
  double W, v, salt;
  int k;
  bulk b;
} settled;

static int settle(eqp_ctx *ctx, const eqp_recipe_spec *sp, const plan *p, settled *d)
{
  double V = sp->volume, rho = eqpi_water_density(sp->T);
  d->s = NULL;
  bulk lo, hi;
  solids(sp, p, 0, 0, &lo);   /* the least the solids can take, whatever the split */
  solids(sp, p, 1, 0, &hi);
  if (fmin(lo.L, hi.L) >= V)
    return eqpi_fail(ctx, EQP_E_INPUT, "recipe cannot be made: its solids alone take at least "
                     "%.0f mL (crystal densities, %s) of the %.4g mL final volume",
                     fmin(lo.L, hi.L) * 1e3, eqpi_density_source, V * 1e3);
  d->W = V * rho;
  d->k = 0;
  for (int pass = 0; pass < 12; pass++) {
    eqp_solution_free(d->s);
    d->s = NULL;
    int rc = design(ctx, sp, p, d->W, d->k, &d->s, &d->v, &d->salt);
    if (rc < 0) return rc;
    solids(sp, p, d->v, d->salt, &d->b);
    if (d->b.L >= V)
      return eqpi_fail(ctx, EQP_E_INPUT, "recipe cannot be made: its solids alone take about "
                       "%.0f mL (crystal densities, %s) of the %.4g mL final volume",
                       d->b.L * 1e3, eqpi_density_source, V * 1e3);
    double Wn = (V - d->b.L) * rho, I = NAN;
    int kn = d->k;
    if (d->s->model_default) {
      I = ionic_strength(d->s, d->k);
      kn = isnan(I) ? d->k : eqpi_chain_choice(d->s, I, d->k);
    }
    if (kn < 0) return eqpi_chain_refuse(d->s, I, "recipe with the default activity model");
    if (fabs(Wn - d->W) <= 1e-9 * d->W && kn == d->k) break;
    d->W = Wn;
    d->k = kn;
  }
  return EQP_OK;
}

/* The items of a settled design; returns the make-up water, kg. */
static double add_items(eqp_recipe *r, const eqp_recipe_spec *sp, const plan *p,
                        const settled *d)
{
  double n = sp->volume * sp->total, rho = eqpi_water_density(sp->T), water = d->W;
  if (p->titrant) {
    add_item(r, p->a, n, NAN, EQP_ROLE_SOLID);
    add_item(r, p->b, d->v * sp->titrant_molar, d->v * 1e3, EQP_ROLE_TITRANT);
    water -= d->v * rho;                                 /* the stock's own water */
  } else {
    add_item(r, p->a, (1 - d->v) * n, NAN, EQP_ROLE_SOLID);
    add_item(r, p->b, d->v * n, NAN, EQP_ROLE_SOLID);
  }
  if (p->salt) add_item(r, p->salt, d->salt, NAN, EQP_ROLE_SALT);
  for (int i = 0; i < r->nitems; i++) {
    const eqpi_reagent *g = reagent_of(r->ctx, r->item[i].reagent);
    if (g && r->item[i].role != EQP_ROLE_TITRANT)
      water -= r->item[i].mol * g->hydrate * EQPI_M_WATER * 1e-3;
  }
  add_item(r, NULL, water / (EQPI_M_WATER * 1e-3), water / rho * 1e3, EQP_ROLE_WATER);
  return water;
}

static int build(eqp_ctx *ctx, eqp_recipe_spec *sp, const plan *p, eqp_recipe *r)
{
  settled d;
  int rc = settle(ctx, sp, p, &d);
  if (rc < 0) {
    eqp_solution_free(d.s);
    return rc;
  }
  double water = add_items(r, sp, p, &d);
  eqp_result *res;
  eqpi_solve_stats st;
  if ((rc = eqpi_solution_equilibrate_from(d.s, &d.k, 0, &res, &st)) < 0) {
    eqp_solution_free(d.s);
    return rc;
  }
  r->pH = eqp_result_pH(res);
  r->I = eqp_result_ionic_strength(res);
  r->model = eqp_result_activity_model(res);
  eqpi_state_warnings(eqpi_chain_model(d.s, d.k), r->I, sp->T, d.W, &st, add_warning, r);
  eqp_result_free(res);
  volume_warnings(r, sp, &d.b, water / eqpi_water_density(sp->T) * 1e3);
  d.s->solute_L = d.b.L;      /* later results of the solution know its solids */
  d.s->unknown_g = d.b.g;
  r->made = d.s;
  return EQP_OK;
}

/* The quantity of each item as the procedure prints it. */
static void print_items(eqp_recipe *r)
{
  for (int i = 0; i < r->nitems; i++) {
    eqp_recipe_item *it = &r->item[i];
    if (!isnan(it->grams)) quantity_text(r->printed[i], sizeof r->printed[i], it->grams, 0, 4);
    else quantity_text(r->printed[i], sizeof r->printed[i], it->mL, 1,
                       it->role == EQP_ROLE_WATER ? 1 : 2);
    it->printed = r->printed[i];
  }
}

/* Checks and defaults. */
static int normalize(eqp_ctx *ctx, eqp_recipe_spec *sp)
{
  if (sp->volume == 0) sp->volume = 1;
  if (!(sp->total > 0) || !(sp->volume > 0) || !isfinite(sp->total) || !isfinite(sp->volume))
    return eqpi_fail(ctx, EQP_E_INPUT, "recipe: 'total' and 'volume' must be positive");
  if (!(sp->pH >= -1 && sp->pH <= 15))
    return eqpi_fail(ctx, EQP_E_INPUT, "recipe: the target pH %g is outside -1..15", sp->pH);
  if (!(sp->titrant_molar > 0)) sp->titrant_molar = 1.0;
  if (sp->T == 0) sp->T = 298.15;
  return EQP_OK;
}

int eqp_recipe_make(eqp_ctx *ctx, const eqp_recipe_spec *spec, eqp_recipe **out)
{
  if (!ctx || !spec || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  eqp_recipe_spec sp = EQP_RECIPE_SPEC_INIT;
  int rc = eqpi_opts_read(ctx, "eqp_recipe_spec", spec, &sp, sizeof sp, EQPI_RECIPE_SPEC_0_1);
  if (rc < 0) return rc;
  if ((rc = normalize(ctx, &sp)) < 0) return rc;
  if (ctx->db->nsp == 0) {
    int rc0 = eqp_ctx_load_default_library(ctx);
    if (rc0 < 0) return rc0;
  }
  plan p;
  rc = choose(ctx, &sp, &p);
  if (rc < 0) return rc;
  eqp_recipe *r = eqpi_calloc(ctx, 1, sizeof *r);
  if (!r) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  r->ctx = ctx;
  r->T = sp.T;
  r->volume = sp.volume;
  ctx->quiet++;              /* the solves inside are the recipe's own */
  rc = build(ctx, &sp, &p, r);
  ctx->quiet--;
  if (rc < 0) {
    eqp_recipe_free(r);
    return rc;
  }
  print_items(r);                /* the procedure prints the items as printed */
  write_procedure(r, &sp, &p);
  char prefix[200];
  snprintf(prefix, sizeof prefix, "recipe for %s and %s, pH %.2f, %.4g mM", p.a->name,
           p.b->name, sp.pH, sp.total * 1e3);
  eqpi_prefixed pw = {ctx, prefix};
  for (int i = 0; i < r->nwarn; i++)
    eqpi_warn_prefixed(&pw, r->kind[i], r->warn[i]);
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
const char *eqp_recipe_activity_model(const eqp_recipe *r) { return r ? r->model : NULL; }
size_t eqp_recipe_warning_count(const eqp_recipe *r) { return r ? (size_t)r->nwarn : 0; }

const char *eqp_recipe_warning(const eqp_recipe *r, size_t i)
{
  return r && i < (size_t)r->nwarn ? r->warn[i] : NULL;
}
