/* The species library: look-ups by name, temperature dependence of log K,
** and the public listing calls (the libraries themselves: snapshot.c). */
/* SPDX-License-Identifier: MIT */
#include "snapshot_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

/* A miss may be a Unicode or variant spelling of a stored name. */
static int needs_fold(const char *name)
{
  for (const unsigned char *p = (const unsigned char *)name; *p; p++)
    if (*p >= 0x80 || *p == '^') return 1;
  return 0;
}

static int find_folded(const eqpi_db *db, const char *name,
                       int (*get)(const eqpi_db *, const char *))
{
  if (!db || !name) return -1;
  int i = get(db, name);
  char buf[256];
  if (i < 0 && needs_fold(name) && eqpi_name_normalize(name, buf, sizeof buf) == 1)
    i = get(db, buf);
  return i;
}

int eqpi_db_find_species(const eqpi_db *db, const char *name)
{
  return find_folded(db, name, eqpi_db_index_species);
}

int eqpi_db_find_reagent(const eqpi_db *db, const char *name)
{
  return find_folded(db, name, eqpi_db_index_reagent);
}

int eqpi_db_find_buffer(const eqpi_db *db, const char *name)
{
  for (int i = 0; name && i < db->nbuffers; i++)
    if (strcmp(db->buffers[i].name, name) == 0) return i;
  return -1;
}

int eqpi_db_species_param(const eqpi_db *db, int i, const char *key, double *v)
{
  const eqpi_species *s = &db->sp[i];
  for (int k = 0; k < s->nparam; k++)
    if (strcmp(s->pkey[k], key) == 0) {
      *v = s->pval[k];
      return 0;
    }
  return -1;
}

int eqpi_db_pair_param(const eqpi_db *db, int i, int j, const char *key, double *v)
{
  for (int k = 0; k < db->npairs; k++) {
    const eqpi_pairparam *p = &db->pairs[k];
    if (((p->a == i && p->b == j) || (p->a == j && p->b == i)) && strcmp(p->key, key) == 0) {
      *v = p->value;
      return 0;
    }
  }
  return -1;
}

/* Integrated van't Hoff equation with a constant heat capacity of reaction
** (e.g. Goldberg, Kishore & Lennen, J. Phys. Chem. Ref. Data 31, 231 (2002),
** eq. for pK(T)): log K(T) = log K(th) - dH/(R ln10) (1/T - 1/th)
**                        + dCp/(R ln10) (th/T - 1 + ln(T/th)). */
double eqpi_reaction_logK(const eqpi_reaction *r, double T, eqpi_tnotes *notes)
{
  if (r->tmodel == EQPI_T_WATER) return -eqpi_water_pKw(T);
  if (r->tmodel == EQPI_T_FUNCTION) {
    const double *f = r->fn;
    if (!isnan(r->Tmin) && (T < r->Tmin - 1e-9 || T > r->Tmax + 1e-9)) notes->outside++;
    return f[0] + f[1] * T + f[2] / T + f[3] * log(T) + f[4] / (T * T) + f[5] * T * T;
  }
  if (fabs(T - EQPI_T25) < 1e-9) return r->logK;
  double v = r->logK;
  if (isnan(r->dH)) {
    notes->missing++;
    return v;
  }
  v -= r->dH * 1e3 / (EQPI_R * EQPI_LN10) * (1.0 / T - 1.0 / EQPI_T25);
  if (!isnan(r->dCp))
    v += r->dCp / (EQPI_R * EQPI_LN10) * (EQPI_T25 / T - 1.0 + log(T / EQPI_T25));
  return v;
}

double eqpi_species_logK(const eqpi_db *db, int i, double T, eqpi_tnotes *notes)
{
  const eqpi_species *s = &db->sp[i];
  double v = 0;
  for (int k = 0; k < s->nrx; k++)
    v += s->rx_c[k] * eqpi_reaction_logK(&db->rx[s->rx_idx[k]], T, notes);
  return v;
}

/* ------------------------------------------------------------ public */

const eqp_library *eqp_ctx_library(const eqp_ctx *ctx) { return ctx ? ctx->db : NULL; }

const eqp_library *eqp_library_ref(const eqp_library *lib) { return eqpi_db_ref(lib); }

void eqp_library_free(const eqp_library *lib) { eqpi_db_release(lib); }

size_t eqp_library_species_count(const eqp_library *lib) { return lib ? (size_t)lib->nsp : 0; }

const char *eqp_library_species_name(const eqp_library *lib, size_t i)
{
  return lib && i < (size_t)lib->nsp ? lib->sp[i].name : NULL;
}

size_t eqp_library_reagent_count(const eqp_library *lib) { return lib ? (size_t)lib->nrg : 0; }

const char *eqp_library_reagent_name(const eqp_library *lib, size_t i)
{
  return lib && i < (size_t)lib->nrg ? lib->rg[i].name : NULL;
}

size_t eqp_library_source_count(const eqp_library *lib) { return lib ? (size_t)lib->nfiles : 0; }

const char *eqp_library_source_path(const eqp_library *lib, size_t i)
{
  return lib && i < (size_t)lib->nfiles ? lib->files[i] : NULL;
}

size_t eqp_library_buffer_count(const eqp_library *lib)
{
  return lib ? (size_t)lib->nbuffers : 0;
}

const char *eqp_library_buffer_name(const eqp_library *lib, size_t i)
{
  return lib && i < (size_t)lib->nbuffers ? lib->buffers[i].name : NULL;
}

size_t eqp_library_solid_count(const eqp_library *lib) { return lib ? (size_t)lib->nsolids : 0; }

const char *eqp_library_solid_name(const eqp_library *lib, size_t i)
{
  return lib && i < (size_t)lib->nsolids ? lib->solids[i].name : NULL;
}

size_t eqp_library_gas_count(const eqp_library *lib) { return lib ? (size_t)lib->ngases : 0; }

const char *eqp_library_gas_name(const eqp_library *lib, size_t i)
{
  return lib && i < (size_t)lib->ngases ? lib->gases[i].name : NULL;
}

size_t eqp_ctx_species_count(const eqp_ctx *ctx)
{
  return eqp_library_species_count(eqp_ctx_library(ctx));
}

const char *eqp_ctx_species_name(const eqp_ctx *ctx, size_t i)
{
  return eqp_library_species_name(eqp_ctx_library(ctx), i);
}

size_t eqp_ctx_reagent_count(const eqp_ctx *ctx)
{
  return eqp_library_reagent_count(eqp_ctx_library(ctx));
}

const char *eqp_ctx_reagent_name(const eqp_ctx *ctx, size_t i)
{
  return eqp_library_reagent_name(eqp_ctx_library(ctx), i);
}

size_t eqp_ctx_source_count(const eqp_ctx *ctx)
{
  return eqp_library_source_count(eqp_ctx_library(ctx));
}

const char *eqp_ctx_source_path(const eqp_ctx *ctx, size_t i)
{
  return eqp_library_source_path(eqp_ctx_library(ctx), i);
}

size_t eqp_ctx_reagent_hazard_count(const eqp_ctx *ctx, const char *name)
{
  int g = ctx ? eqpi_db_find_reagent(ctx->db, name) : -1;
  return g < 0 ? 0 : (size_t)ctx->db->rg[g].nhazards;
}

const char *eqp_ctx_reagent_hazard(const eqp_ctx *ctx, const char *name, size_t i)
{
  int g = ctx ? eqpi_db_find_reagent(ctx->db, name) : -1;
  return g < 0 || i >= (size_t)ctx->db->rg[g].nhazards ? NULL : ctx->db->rg[g].hazards[i];
}

int eqp_ctx_reagent_molar_mass(eqp_ctx *ctx, const char *name, double *gmol)
{
  int g = ctx && name ? eqpi_db_find_reagent(ctx->db, name) : -1;
  if (g < 0) return eqpi_fail(ctx, EQP_E_UNKNOWN, "unknown reagent '%s'", name ? name : "");
  *gmol = ctx->db->rg[g].molar_mass;
  return EQP_OK;
}

size_t eqp_ctx_buffer_count(const eqp_ctx *ctx)
{
  return eqp_library_buffer_count(eqp_ctx_library(ctx));
}

const char *eqp_ctx_buffer_name(const eqp_ctx *ctx, size_t i)
{
  return eqp_library_buffer_name(eqp_ctx_library(ctx), i);
}

size_t eqp_ctx_buffer_note_count(const eqp_ctx *ctx, size_t i)
{
  return ctx && i < (size_t)ctx->db->nbuffers ? (size_t)ctx->db->buffers[i].nnotes : 0;
}

const char *eqp_ctx_buffer_note(const eqp_ctx *ctx, size_t i, size_t k)
{
  return ctx && i < (size_t)ctx->db->nbuffers && k < (size_t)ctx->db->buffers[i].nnotes
           ? ctx->db->buffers[i].notes[k] : NULL;
}

static const char *fold(const char *name, char *buf, size_t len)
{
  return needs_fold(name) && eqpi_name_normalize(name, buf, len) == 1 ? buf : name;
}

int eqpi_db_find_gas(const eqpi_db *db, const char *name)
{
  char buf[256];
  if (!name) return -1;
  name = fold(name, buf, sizeof buf);
  for (int i = 0; i < db->ngases; i++)
    if (strcmp(db->gases[i].name, name) == 0) return i;
  return -1;
}

void eqpi_db_add_composition(const eqpi_db *db, int sp, double coef, double *a, int n)
{
  const eqpi_species *x = &db->sp[sp];
  int water = db->water >= 0 ? db->sp[db->water].component : -1;
  for (int t = 0; t < x->nterm; t++)
    if (x->term_comp[t] != water && x->term_comp[t] < n) a[x->term_comp[t]] += coef * x->term_nu[t];
}

int eqpi_db_find_solid(const eqpi_db *db, const char *name)
{
  char buf[256];
  if (!name) return -1;
  name = fold(name, buf, sizeof buf);
  for (int i = 0; i < db->nsolids; i++)
    if (strcmp(db->solids[i].name, name) == 0) return i;
  size_t n = strlen(name);
  if (n < 4 || strcmp(name + n - 3, "(s)") != 0) return -1;
  int found = -1;
  for (int i = 0; i < db->nsolids; i++)
    if (strlen(db->solids[i].formula) == n - 3 && strncmp(db->solids[i].formula, name, n - 3) == 0)
      found = found == -1 ? i : -2;
  return found;
}

void eqpi_db_solids_with_formula(const eqpi_db *db, const char *f, char *buf, size_t len)
{
  size_t used = 0, n = strlen(f);
  if (len) buf[0] = '\0';
  if (n > 3 && strcmp(f + n - 3, "(s)") == 0) n -= 3;
  for (int i = 0; i < db->nsolids && used < len; i++)
    if (strlen(db->solids[i].formula) == n && strncmp(db->solids[i].formula, f, n) == 0)
      used += (size_t)snprintf(buf + used, len - used, "%s%s", used ? ", " : "",
                               db->solids[i].name);
}
