/* Hazard classes and safety cautions. A reagent's hazards are keys of a
** fixed list, each standing for a hazard class of the Globally Harmonized
** System of Classification and Labelling of Chemicals (UN GHS, Rev. 9,
** 2021; chapter numbers below). Whatever path brings a hazardous reagent
** into a solution records it on the solution and on its context, so that a
** run shows one caution per reagent however it was used. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include <ctype.h>
#include <stdio.h>
#include <string.h>

/* What the caution asks the user to do; composed once per reagent. */
enum {
  A_EYES = 1 << 0, A_GLOVES = 1 << 1, A_COAT = 1 << 2, A_WATER_FIRST = 1 << 3,
  A_HOOD = 1 << 4, A_DUST = 1 << 5, A_MOUTH = 1 << 6, A_SPECIAL = 1 << 7,
  A_IGNITION = 1 << 8, A_COMBUST = 1 << 9, A_WATER_REACT = 1 << 10, A_AIR = 1 << 11,
  A_PRESSURE = 1 << 12, A_HEAT = 1 << 13, A_SHOCK = 1 << 14, A_CONTAINER = 1 << 15,
  A_DRAIN = 1 << 16
};

typedef struct hazard {
  const char *key;      /* ours, stable: what species files write */
  const char *label;    /* short, for the caution line */
  const char *ghs;      /* the GHS hazard class (and category where the key is one) */
  unsigned advice;
} hazard;

static const hazard hazards[] = {
  {"explosive", "explosive", "Explosives (GHS 2.1)", A_SHOCK | A_IGNITION | A_EYES},
  {"flammable-gas", "flammable gas", "Flammable gases (GHS 2.2)", A_IGNITION | A_PRESSURE},
  {"aerosol", "aerosol", "Aerosols and chemicals under pressure (GHS 2.3)",
   A_IGNITION | A_PRESSURE},
  {"oxidizing-gas", "oxidizing gas", "Oxidizing gases (GHS 2.4)", A_COMBUST | A_PRESSURE},
  {"gas-under-pressure", "gas under pressure", "Gases under pressure (GHS 2.5)", A_PRESSURE},
  {"flammable-liquid", "flammable liquid", "Flammable liquids (GHS 2.6)",
   A_IGNITION | A_HOOD},
  {"flammable-solid", "flammable solid", "Flammable solids (GHS 2.7)", A_IGNITION},
  {"self-reactive", "self-reactive", "Self-reactive substances and mixtures (GHS 2.8)",
   A_HEAT | A_IGNITION},
  {"pyrophoric-liquid", "pyrophoric liquid", "Pyrophoric liquids (GHS 2.9)", A_AIR},
  {"pyrophoric-solid", "pyrophoric solid", "Pyrophoric solids (GHS 2.10)", A_AIR},
  {"self-heating", "self-heating", "Self-heating substances and mixtures (GHS 2.11)", A_HEAT},
  {"water-reactive", "gives flammable gas with water",
   "Substances and mixtures which, in contact with water, emit flammable gases (GHS 2.12)",
   A_WATER_REACT | A_IGNITION},
  {"oxidizing-liquid", "oxidizing liquid", "Oxidizing liquids (GHS 2.13)", A_COMBUST},
  {"oxidizing-solid", "oxidizing solid", "Oxidizing solids (GHS 2.14)", A_COMBUST},
  {"organic-peroxide", "organic peroxide", "Organic peroxides (GHS 2.15)", A_HEAT | A_COMBUST},
  {"metal-corrosive", "corrosive to metals", "Corrosive to metals (GHS 2.16)", A_CONTAINER},
  {"desensitized-explosive", "desensitized explosive", "Desensitized explosives (GHS 2.17)",
   A_SHOCK | A_IGNITION},
  {"toxic-oral", "toxic if swallowed", "Acute toxicity, oral (GHS 3.1)", A_MOUTH | A_GLOVES},
  {"toxic-dermal", "toxic on skin contact", "Acute toxicity, dermal (GHS 3.1)",
   A_GLOVES | A_COAT},
  {"toxic-inhaled", "toxic if inhaled", "Acute toxicity, inhalation (GHS 3.1)", A_HOOD},
  {"skin-corrosion", "skin corrosion",
   "Skin corrosion/irritation, category 1: skin corrosion (GHS 3.2)",
   A_EYES | A_GLOVES | A_COAT | A_WATER_FIRST},
  {"skin-irritation", "skin irritation",
   "Skin corrosion/irritation, category 2: skin irritation (GHS 3.2)", A_GLOVES},
  {"eye-damage", "serious eye damage",
   "Serious eye damage/eye irritation, category 1: serious eye damage (GHS 3.3)", A_EYES},
  {"eye-irritation", "eye irritation",
   "Serious eye damage/eye irritation, category 2: eye irritation (GHS 3.3)", A_EYES},
  {"respiratory-sensitizer", "respiratory sensitizer",
   "Respiratory or skin sensitization: respiratory sensitizer (GHS 3.4)", A_DUST | A_HOOD},
  {"skin-sensitizer", "skin sensitizer",
   "Respiratory or skin sensitization: skin sensitizer (GHS 3.4)", A_GLOVES},
  {"mutagen", "germ cell mutagen", "Germ cell mutagenicity (GHS 3.5)", A_SPECIAL | A_GLOVES},
  {"carcinogen", "carcinogen", "Carcinogenicity (GHS 3.6)", A_SPECIAL | A_GLOVES},
  {"reproductive-toxicant", "reproductive toxicant", "Reproductive toxicity (GHS 3.7)",
   A_SPECIAL | A_GLOVES},
  {"organ-toxic-single", "organ toxicity (single exposure)",
   "Specific target organ toxicity, single exposure (GHS 3.8)", A_DUST},
  {"organ-toxic-repeated", "organ toxicity (repeated exposure)",
   "Specific target organ toxicity, repeated exposure (GHS 3.9)", A_DUST | A_GLOVES},
  {"aspiration", "aspiration hazard", "Aspiration hazard (GHS 3.10)", A_MOUTH},
  {"aquatic-acute", "harmful to aquatic life",
   "Hazardous to the aquatic environment, short-term (acute) (GHS 4.1)", A_DRAIN},
  {"aquatic-chronic", "harmful to aquatic life (long-term)",
   "Hazardous to the aquatic environment, long-term (chronic) (GHS 4.1)", A_DRAIN},
  {"ozone", "harmful to the ozone layer", "Hazardous to the ozone layer (GHS 4.2)", A_DRAIN},
};

#define NHAZARDS ((int)(sizeof hazards / sizeof hazards[0]))

int eqpi_hazard_find(const char *key)
{
  for (int i = 0; key && i < NHAZARDS; i++)
    if (strcmp(hazards[i].key, key) == 0) return i;
  return -1;
}

const char *eqp_hazard_class(const char *key)
{
  int h = eqpi_hazard_find(key);
  return h < 0 ? NULL : hazards[h].ghs;
}

size_t eqp_hazard_key_count(void) { return (size_t)NHAZARDS; }

const char *eqp_hazard_key(size_t i) { return i < (size_t)NHAZARDS ? hazards[i].key : NULL; }

/* Edit distance of short strings (keys are under 32 characters). */
static int distance(const char *a, const char *b)
{
  int la = (int)strlen(a), lb = (int)strlen(b);
  if (la > 31 || lb > 31) return 99;
  int d[32][32];
  for (int i = 0; i <= la; i++) d[i][0] = i;
  for (int j = 0; j <= lb; j++) d[0][j] = j;
  for (int i = 1; i <= la; i++)
    for (int j = 1; j <= lb; j++) {
      int m = d[i - 1][j - 1] + (a[i - 1] != b[j - 1]);
      if (d[i - 1][j] + 1 < m) m = d[i - 1][j] + 1;
      if (d[i][j - 1] + 1 < m) m = d[i][j - 1] + 1;
      d[i][j] = m;
    }
  return d[la][lb];
}

/* Words of an older, looser vocabulary and the classes that replace them. */
static const char *const older[][2] = {
  {"corrosive", "skin-corrosion, eye-damage or metal-corrosive"},
  {"irritant", "skin-irritation or eye-irritation"},
  {"toxic", "toxic-oral, toxic-dermal or toxic-inhaled"},
  {"oxidizer", "oxidizing-solid or oxidizing-liquid"},
  {"flammable", "flammable-liquid, flammable-solid or flammable-gas"},
};

void eqpi_hazard_hint(const char *key, char *buf, size_t len)
{
  const char *best = NULL;
  int bd = 4;
  for (int i = 0; i < NHAZARDS; i++) {
    int d = distance(key, hazards[i].key);
    if (d < bd) { bd = d; best = hazards[i].key; }
  }
  for (size_t i = 0; i < sizeof older / sizeof older[0]; i++) {
    int d = distance(key, older[i][0]);
    if (d < bd || (d == bd && d <= 2)) { bd = d; best = older[i][1]; }
  }
  if (best) snprintf(buf, len, "did you mean %s?", best);
  else snprintf(buf, len, "the classes are listed in docs/species-format.md, e.g. "
                "skin-corrosion, eye-damage, toxic-oral, oxidizing-solid");
}

#define APPEND(...) do { if (used < len) \
    used += (size_t)snprintf(buf + used, len - used, __VA_ARGS__); } while (0)

/* "HCl (hydrochloric acid): skin corrosion, ...: wear eye protection, ...;
** consult its safety data sheet." */
static void caution_text(const eqpi_reagent *r, char *buf, size_t len)
{
  static const char *const steps[] = {
    [3] = "add it slowly to water, never water to it, as dissolving or diluting releases heat",
    [4] = "work in a fume hood",
    [5] = "do not breathe its dust, mist or vapour",
    [6] = "do not swallow it: never pipette by mouth",
    [7] = "obtain special instructions before use and keep exposure as low as possible",
    [8] = "keep it away from heat, sparks and open flames",
    [9] = "keep it away from combustible and organic material",
    [10] = "keep it dry: with water it gives a flammable gas",
    [11] = "handle it under inert gas: it ignites in air",
    [12] = "secure gas cylinders and keep them away from heat",
    [13] = "keep it cool",
    [14] = "do not heat, grind or strike it",
    [15] = "keep it in a corrosion-resistant container",
    [16] = "do not pour it down the drain; collect it for disposal",
  };
  size_t used = 0;
  unsigned advice = 0;
  APPEND("%s", r->name);
  if (r->naliases) APPEND(" (%s)", r->aliases[0]);
  APPEND(": ");
  for (int h = 0; h < r->nhazards; h++) {
    int k = eqpi_hazard_find(r->hazards[h]);
    APPEND("%s%s", h ? ", " : "", k < 0 ? r->hazards[h] : hazards[k].label);
    if (k >= 0) advice |= hazards[k].advice;
  }
  APPEND(". ");
  const char *ppe[3], *act[20];
  int np = 0, na = 0;
  if (advice & A_EYES) ppe[np++] = "eye protection";
  if (advice & A_GLOVES) ppe[np++] = "gloves";
  if (advice & A_COAT) ppe[np++] = "a lab coat";
  char wear[96] = "wear";
  for (int i = 0; i < np; i++)
    snprintf(wear + strlen(wear), sizeof wear - strlen(wear), "%s%s",
             i == 0 ? " " : i == np - 1 ? " and " : ", ", ppe[i]);
  if (np) act[na++] = wear;
  for (int b = 3; b <= 16; b++)
    if (advice & (1u << b)) act[na++] = steps[b];
  act[na++] = "consult its safety data sheet and follow local rules";
  APPEND("%c%s", toupper((unsigned char)act[0][0]), act[0] + 1);
  for (int i = 1; i < na; i++) APPEND("; %s", act[i]);
  APPEND(".");
}

int eqpi_caution_text(const eqpi_db *db, int reagent, char *buf, size_t len)
{
  if (!len) return 0;
  buf[0] = '\0';
  if (reagent < 0 || reagent >= db->nrg || !db->rg[reagent].nhazards) return 0;
  caution_text(&db->rg[reagent], buf, len);
  return 1;
}

/* ------------------------------------------------------------ records */

static int int_push(eqp_ctx *ctx, int **arr, int *n, int *cap, int v)
{
  for (int i = 0; i < *n; i++)
    if ((*arr)[i] == v) return 0;
  if (eqpi_grow(ctx, arr, cap, *n + 1, sizeof **arr) < 0) return -1;
  (*arr)[(*n)++] = v;
  return 1;
}

/* Append a caution under its label (a reagent's name, or a label such as a
** sealed vessel's) and tell the observer. */
static int record(eqp_ctx *ctx, const char *label, const char *text)
{
  if (eqpi_grow(ctx, &ctx->caution_rg, &ctx->capcaution_rg, ctx->ncautions + 1,
                sizeof(char *)) < 0 ||
      eqpi_grow(ctx, &ctx->caution_text, &ctx->capcautions, ctx->ncautions + 1,
                sizeof(char *)) < 0)
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  char *t = eqpi_strdup(ctx, text), *nm = eqpi_strdup(ctx, label);
  if (!t || !nm) {
    eqpi_strfree(ctx, t);
    eqpi_strfree(ctx, nm);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  ctx->caution_rg[ctx->ncautions] = nm;
  ctx->caution_text[ctx->ncautions++] = t;
  eqpi_observe_caution(ctx, nm, t);
  return EQP_OK;
}

/* The context's record: reagent name and its caution text, in order of
** first use (by name: solutions may use libraries of their own). */
static int ctx_record(eqp_ctx *ctx, const eqpi_db *db, int reagent)
{
  if (ctx->caution_seen_gen == db->generation && ctx->caution_seen_rg == reagent)
    return EQP_OK;                     /* the same again, as in a loop of additions */
  const char *name = db->rg[reagent].name;
  int known = 0;
  for (int i = 0; i < ctx->ncautions && !known; i++) known = strcmp(ctx->caution_rg[i], name) == 0;
  if (known) {
    ctx->caution_seen_gen = db->generation;
    ctx->caution_seen_rg = reagent;
    return EQP_OK;
  }
  char text[1024];
  eqpi_caution_text(db, reagent, text, sizeof text);
  int rc = record(ctx, name, text);
  if (rc < 0) return rc;
  ctx->caution_seen_gen = db->generation;
  ctx->caution_seen_rg = reagent;
  return EQP_OK;
}

/* r went into s: its hazards are recorded on s and, unless held, in the run. */
static int use(eqp_solution *s, const eqpi_reagent *r)
{
  if (!r->nhazards) return EQP_OK;
  eqp_ctx *ctx = s->ctx;
  int g = (int)(r - s->db->rg);
  if (int_push(ctx, &s->hazard, &s->nhazard, &s->caphazard, g) < 0)
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  return ctx->caution_hold ? EQP_OK : ctx_record(ctx, s->db, g);
}

int eqpi_use_reagent(eqp_solution *s, const eqpi_reagent *r)
{
  if (!s->ctx->caution_hold) eqpi_observe_reagent(s->ctx, r->name);
  return use(s, r);
}

int eqpi_copy_hazards(eqp_solution *dst, const eqp_solution *src)
{
  eqpi_cautions_hold(dst->ctx, 1);    /* a copy holds what its original holds: no new use */
  int rc = eqpi_use_stock(dst, src);
  eqpi_cautions_hold(dst->ctx, -1);
  return rc;
}

void eqpi_cautions_hold(eqp_ctx *ctx, int delta)
{
  ctx->caution_hold += delta;
}

int eqpi_use_stock(eqp_solution *s, const eqp_solution *stock)
{
  const eqpi_db *from = stock->db, *to = s->db;
  for (int i = 0; i < stock->nhazard; i++) {
    /* the same library, or the reagent of the same name in s's own */
    int g = from == to ? stock->hazard[i] : eqpi_db_find_reagent(to, from->rg[stock->hazard[i]].name);
    if (g >= 0 && use(s, &to->rg[g]) < 0) return s->ctx->errcode;
  }
  return EQP_OK;
}

void eqpi_solution_hazards_free(eqp_solution *s)
{
  eqpi_free(s->ctx, s->hazard, sizeof *s->hazard * (size_t)s->caphazard);
  s->hazard = NULL;
  s->nhazard = s->caphazard = 0;
}

void eqpi_cautions_free(eqp_ctx *ctx)
{
  for (int i = 0; i < ctx->ncautions; i++) {
    eqpi_strfree(ctx, ctx->caution_text[i]);
    eqpi_strfree(ctx, ctx->caution_rg[i]);
  }
  eqpi_free(ctx, ctx->caution_text, sizeof *ctx->caution_text * (size_t)ctx->capcautions);
  eqpi_free(ctx, ctx->caution_rg, sizeof *ctx->caution_rg * (size_t)ctx->capcaution_rg);
  ctx->caution_text = NULL;
  ctx->caution_rg = NULL;
  ctx->ncautions = ctx->capcautions = ctx->capcaution_rg = 0;
  ctx->caution_seen_gen = 0;
  for (int i = 0; i < ctx->ngases_used; i++) eqpi_strfree(ctx, ctx->gases_used[i]);
  eqpi_free(ctx, ctx->gases_used, sizeof(char *) * (size_t)ctx->capgases_used);
  ctx->gases_used = NULL;
  ctx->ngases_used = ctx->capgases_used = 0;
}

/* ------------------------------------------------------------ public */

size_t eqp_ctx_caution_count(const eqp_ctx *ctx) { return ctx ? (size_t)ctx->ncautions : 0; }

const char *eqp_ctx_caution(const eqp_ctx *ctx, size_t i)
{
  return ctx && i < (size_t)ctx->ncautions ? ctx->caution_text[i] : NULL;
}

const char *eqp_ctx_caution_reagent(const eqp_ctx *ctx, size_t i)
{
  return ctx && i < (size_t)ctx->ncautions ? ctx->caution_rg[i] : NULL;
}

size_t eqp_solution_hazard_count(const eqp_solution *s) { return s ? (size_t)s->nhazard : 0; }

const char *eqp_solution_hazard_reagent(const eqp_solution *s, size_t i)
{
  return s && i < (size_t)s->nhazard ? s->db->rg[s->hazard[i]].name : NULL;
}

int eqpi_caution_note(eqp_ctx *ctx, const char *label, const char *text)
{
  if (ctx->caution_hold) return EQP_OK;
  for (int i = 0; i < ctx->ncautions; i++)
    if (strcmp(ctx->caution_rg[i], label) == 0) return EQP_OK;
  return record(ctx, label, text);
}

/* ------------------------------------------------------------ gases */

void eqpi_gas_used(eqp_ctx *ctx, const char *name)
{
  if (eqpi_gas_was_used(ctx, name)) return;
  char *n = eqpi_strdup(ctx, name);      /* informational: a failure loses a line only */
  if (n && eqpi_grow(ctx, &ctx->gases_used, &ctx->capgases_used, ctx->ngases_used + 1,
                     sizeof(char *)) == 0)
    ctx->gases_used[ctx->ngases_used++] = n;
  else
    eqpi_strfree(ctx, n);
}

int eqpi_gas_was_used(const eqp_ctx *ctx, const char *name)
{
  for (int i = 0; i < ctx->ngases_used; i++)
    if (strcmp(ctx->gases_used[i], name) == 0) return 1;
  return 0;
}
