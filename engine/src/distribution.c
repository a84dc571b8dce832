/* Distribution diagrams: the fraction of each form of an acid or ligand
** system against pH in a constant ionic medium.
**
** Each form i is the ligand component L with n_i protons, so by mass action
** m_i = K_i a(L) a(H+)^n_i / g_i and its fraction is
**   alpha_i = K_i a(H+)^n_i / g_i / sum_j K_j a(H+)^n_j / g_j,
** with pH = -log10 a(H+). The activity coefficients g_i are those of the
** chosen model at the stated ionic strength, set by a background salt;
** the system itself is at trace level, so they do not change with pH. */
/* SPDX-License-Identifier: MIT */
#include "curve_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_FORMS 16
#define MAX_MEDIUM 4

typedef struct ladder {
  int n;
  int sp[MAX_FORMS + MAX_MEDIUM];   /* forms, then the medium's ions */
  double protons[MAX_FORMS];
  int nmedium;
  double medium_m[MAX_MEDIUM];      /* mol/kg of each medium ion */
} ladder;

static int component_of(const eqpi_db *db, int c)
{
  return db->comp_species[c];
}

/* The ligand component of species i: its one component besides H+ and
** water, or -1 (none), -2 (more than one). */
static int ligand_of(const eqpi_db *db, int i)
{
  const eqpi_species *s = &db->sp[i];
  int lig = -1;
  for (int t = 0; t < s->nterm; t++) {
    int cs = component_of(db, s->term_comp[t]);
    if (cs == db->h_plus || cs == db->water || s->term_nu[t] == 0) continue;
    if (lig >= 0 && lig != s->term_comp[t]) return -2;
    lig = s->term_comp[t];
  }
  return lig;
}

/* The system named by a species, a reagent or a buffer system. */
static int find_ligand(eqp_ctx *ctx, const char *name)
{
  const eqpi_db *db = ctx->db;
  char hint[256];
  int i = eqpi_db_find_species(db, name);
  if (i >= 0) {
    int lig = ligand_of(db, i);
    if (lig == -2)
      return eqpi_fail(ctx, EQP_E_INPUT, "'%s' holds more than one component besides H+: name "
                       "a form of the acid or ligand itself", name);
    if (lig < 0) return eqpi_fail(ctx, EQP_E_INPUT, "'%s' is not part of an acid or ligand "
                                  "system", name);
    return lig;
  }
  int g = eqpi_db_find_reagent(db, name);
  for (int b = 0; g < 0 && b < db->nbuffers; b++)
    if (strcmp(db->buffers[b].name, name) == 0)
      g = db->buffers[b].acid >= 0 ? db->buffers[b].acid : db->buffers[b].free;
  if (g < 0)
    return eqpi_fail(ctx, EQP_E_UNKNOWN, "no species, reagent or buffer system '%s'%s", name,
                     eqpi_name_hint(name, hint, sizeof hint));
  /* the reagent's ion that has a ladder of its own (H2PO4- of NaH2PO4) */
  const eqpi_reagent *r = &db->rg[g];
  for (int k = 0; k < r->n; k++) {
    int lig = ligand_of(db, r->sp[k]);
    if (lig < 0) continue;
    for (int j = 0; j < db->nsp; j++)
      if (j != component_of(db, lig) && ligand_of(db, j) == lig) return lig;
  }
  return eqpi_fail(ctx, EQP_E_INPUT, "'%s' releases no acid or ligand with protonated forms",
                   name);
}

static double protons_of(const eqpi_db *db, const eqpi_species *s, int lig, double *nu_lig)
{
  double n = 0;
  *nu_lig = 0;
  for (int t = 0; t < s->nterm; t++) {
    if (s->term_comp[t] == lig) *nu_lig = s->term_nu[t];
    else if (component_of(db, s->term_comp[t]) == db->h_plus) n = s->term_nu[t];
  }
  return n;
}

static int build_ladder(eqp_ctx *ctx, const eqp_distribution_spec *d, int lig, ladder *L)
{
  const eqpi_db *db = ctx->db;
  memset(L, 0, sizeof *L);
  for (int i = 0; i < db->nsp; i++) {
    if (ligand_of(db, i) != lig) continue;
    double nu, n = protons_of(db, &db->sp[i], lig, &nu);
    if (fabs(nu - 1) > 1e-12)
      return eqpi_fail(ctx, EQP_E_INPUT, "'%s' holds %g of the ligand: its fraction depends on "
                       "the total, which a distribution diagram does not fix", db->sp[i].name,
                       nu);
    if (L->n == MAX_FORMS) return eqpi_fail(ctx, EQP_E_INPUT, "more than %d forms", MAX_FORMS);
    int k = L->n++;   /* insertion sort: most protons first */
    while (k > 0 && L->protons[k - 1] < n) {
      L->sp[k] = L->sp[k - 1];
      L->protons[k] = L->protons[k - 1];
      k--;
    }
    L->sp[k] = i;
    L->protons[k] = n;
  }
  if (L->n < 2)
    return eqpi_fail(ctx, EQP_E_INPUT, "'%s' has a single form: nothing to distribute", d->system);
  if (!(d->ionic_strength > 0)) return EQP_OK;
  const char *salt = d->medium ? d->medium : "NaCl";
  int g = eqpi_db_find_reagent(db, salt);
  if (g < 0) return eqpi_fail(ctx, EQP_E_UNKNOWN, "unknown medium salt '%s'", salt);
  const eqpi_reagent *r = &db->rg[g];
  double half_z2 = 0;
  for (int k = 0; k < r->n; k++) half_z2 += 0.5 * r->nu[k] * db->sp[r->sp[k]].comp.charge *
                                            db->sp[r->sp[k]].comp.charge;
  if (!(half_z2 > 0) || r->n > MAX_MEDIUM)
    return eqpi_fail(ctx, EQP_E_INPUT, "medium '%s' must be a salt of up to %d ions", salt,
                     MAX_MEDIUM);
  for (int k = 0; k < r->n; k++) {
    L->sp[L->n + k] = r->sp[k];
    L->medium_m[k] = r->nu[k] * d->ionic_strength / half_z2;   /* gives I exactly */
  }
  L->nmedium = r->n;
  return EQP_OK;
}

typedef struct bindinfo { const eqpi_db *db; const int *sp; } bindinfo;

static int info_param(const void *ud, size_t i, const char *key, double *v)
{
  const bindinfo *b = ud;
  return eqpi_db_species_param(b->db, b->sp[i], key, v);
}

static int info_pair(const void *ud, size_t i, size_t j, const char *key, double *v)
{
  const bindinfo *b = ud;
  return eqpi_db_pair_param(b->db, b->sp[i], b->sp[j], key, v);
}

/* log10 g of every form at the medium's ionic strength. */
static int log_gammas(eqp_ctx *ctx, const eqp_distribution_spec *d, const ladder *L, double T,
                      double *lg)
{
  int n = L->n + L->nmedium;
  if (!(d->ionic_strength > 0)) {
    for (int i = 0; i < n; i++) lg[i] = 0;
    return EQP_OK;
  }
  const eqpi_db *db = ctx->db;
  eqpi_model m;
  const char *name = d->activity ? d->activity : "davies";
  int rc = eqpi_model_open(ctx, name, &m);
  if (rc < 0) return rc;
  if (m.desc->max_ionic_strength > 0 && d->ionic_strength > m.desc->max_ionic_strength) {
    eqpi_model_close(ctx, &m);
    return eqpi_fail(ctx, EQP_E_INPUT, "ionic strength %g mol/kg is beyond the range of the "
                     "'%s' model (%g mol/kg): choose another model", d->ionic_strength, name,
                     m.desc->max_ionic_strength);
  }
  const char *names[MAX_FORMS + MAX_MEDIUM];
  double z[MAX_FORMS + MAX_MEDIUM], size[MAX_FORMS + MAX_MEDIUM], mol[MAX_FORMS + MAX_MEDIUM];
  for (int i = 0; i < n; i++) {
    const eqpi_species *s = &db->sp[L->sp[i]];
    names[i] = s->name;
    z[i] = s->comp.charge;
    size[i] = s->size;
    mol[i] = i < L->n ? 1e-12 : L->medium_m[i - L->n];   /* the system at trace level */
  }
  bindinfo bi = {db, L->sp};
  eqp_species_info info = {(size_t)n, names, z, size, &bi, info_param, info_pair};
  char err[256] = "", warn[256] = "";
  const eqp_activity_ops *ops = m.ops;
  if (ops->struct_size >= offsetof(eqp_activity_ops, bind) + sizeof ops->bind && ops->bind &&
      ops->bind(m.state, &info, warn, sizeof warn, err, sizeof err) != 0)
    rc = eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s': %s", name, err);
  eqp_activity_in in = {(size_t)n, z, size, mol, d->ionic_strength, T, 0, 0};
  eqpi_debye_huckel_AB(T, &in.A, &in.B);
  if (rc == EQP_OK && ops->log_gamma(m.state, &in, lg, err, sizeof err) != 0)
    rc = eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s': %s", name, err);
  for (int i = 0; rc == EQP_OK && i < n; i++)
    if (!isfinite(lg[i]))
      rc = eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s' gave a non-finite log gamma", name);
  eqpi_model_close(ctx, &m);
  return rc;
}

int eqp_distribution(eqp_ctx *ctx, const eqp_distribution_spec *user, eqp_curve **out)
{
  if (!ctx || !user || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  eqp_distribution_spec opts = EQP_DISTRIBUTION_SPEC_INIT;
  const eqp_distribution_spec *d = &opts;
  int rc = eqpi_opts_read(ctx, "eqp_distribution_spec", user, &opts, sizeof opts,
                          EQPI_DISTRIBUTION_SPEC_0_1);
  if (rc < 0) return rc;
  if (!d->system) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  double lo = d->pH_lo, hi = d->pH_hi, T = d->T > 0 ? d->T : EQPI_T25;
  if (lo == 0 && hi == 0) hi = 14;
  size_t np = d->points ? d->points : 281;
  if (!(isfinite(lo) && isfinite(hi) && lo < hi && lo >= -2 && hi <= 16))
    return eqpi_fail(ctx, EQP_E_INPUT, "pH range %g .. %g: low first, within -2 .. 16", lo, hi);
  if (np < 2 || np > 100000) return eqpi_fail(ctx, EQP_E_INPUT, "2 to 100000 points");
  if (!(T >= 273.15 && T <= 373.15))
    return eqpi_fail(ctx, EQP_E_INPUT, "temperature %g K outside 273.15 .. 373.15", T);
  if (!(d->ionic_strength >= 0 && d->ionic_strength <= 10))
    return eqpi_fail(ctx, EQP_E_INPUT, "ionic strength %g mol/kg outside 0 .. 10",
                     d->ionic_strength);
  rc = eqp_ctx_load_default_library(ctx);
  if (rc < 0) return rc;
  int lig = find_ligand(ctx, d->system);
  if (lig < 0) return lig;
  ladder L;
  double lg[MAX_FORMS + MAX_MEDIUM], logK[MAX_FORMS];
  if ((rc = build_ladder(ctx, d, lig, &L)) < 0) return rc;
  if ((rc = log_gammas(ctx, d, &L, T, lg)) < 0) return rc;
  eqpi_tnotes notes = {0, 0};
  for (int i = 0; i < L.n; i++) logK[i] = eqpi_species_logK(ctx->db, L.sp[i], T, &notes);
  const char *names[MAX_FORMS + 1] = {"pH"};
  for (int i = 0; i < L.n; i++) names[i + 1] = ctx->db->sp[L.sp[i]].name;
  eqp_curve *c = eqpi_curve_new(ctx, L.n + 1, names);
  if (!c) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  c->values = EQPI_VALUES_FRACTION;
  for (size_t k = 0; k < np && rc == EQP_OK; k++) {
    double row[MAX_FORMS + 1], w[MAX_FORMS], top = -INFINITY, sum = 0;
    double pH = lo + (hi - lo) * (double)k / (double)(np - 1);
    row[0] = pH;
    for (int i = 0; i < L.n; i++) {
      w[i] = logK[i] - L.protons[i] * pH - lg[i];
      top = fmax(top, w[i]);
    }
    for (int i = 0; i < L.n; i++) sum += (w[i] = pow(10, w[i] - top));   /* no overflow */
    for (int i = 0; i < L.n; i++) row[i + 1] = w[i] / sum;
    rc = eqpi_curve_push(c, row);
  }
  if (rc < 0) {
    eqp_curve_free(c);
    return rc;
  }
  *out = c;
  return EQP_OK;
}
