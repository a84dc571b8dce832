/* Buffer comparison: every buffer system of the library made by recipe at
** the same pH, total and temperature, its capacity measured, then loaded
** with an acid or base; ranked by how little the load moves its pH. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define MAX_WARN 20

typedef struct cand {
  eqp_candidate pub;
  char why[512];
  char *warn[MAX_WARN];
  const char *warnp[MAX_WARN];
} cand;

struct eqp_comparison {
  eqp_ctx *ctx;
  cand *c;
  size_t n, cap;
  char *text;
  size_t textcap;
};

static void keep_warning(eqp_ctx *ctx, cand *c, const char *prefix, const char *text)
{
  if (c->pub.nwarnings >= MAX_WARN) return;
  size_t len = strlen(prefix) + strlen(text) + 1;
  char *w = eqpi_malloc(ctx, len);
  if (!w) return;                /* a warning lost to memory exhaustion, not the row */
  snprintf(w, len, "%s%s", prefix, text);
  c->warn[c->pub.nwarnings] = w;
  c->warnp[c->pub.nwarnings++] = w;
}

/* Make the candidate by recipe, measure its capacity, load it. */
static void candidate(eqp_ctx *ctx, const eqp_recipe_spec *sp, double load_mol,
                      const char *load_with, double window, cand *c)
{
  eqp_recipe *r;
  int rc = eqp_recipe_make(ctx, sp, &r);
  if (rc < 0) {
    snprintf(c->why, sizeof c->why, "%s", eqp_ctx_errmsg(ctx));
    return;
  }
  for (size_t i = 0; i < eqp_recipe_warning_count(r); i++)
    keep_warning(ctx, c, "", eqp_recipe_warning(r, i));
  eqp_solution *s = NULL;
  eqp_result *res = NULL;
  double bkg, bL, pH0 = eqp_recipe_pH(r);
  rc = eqp_solution_copy(eqp_recipe_solution(r), &s);
  if (rc == EQP_OK) rc = eqp_solution_buffer_capacity(s, &bL, &bkg);
  if (rc == EQP_OK) rc = eqp_solution_add(s, load_with, load_mol, EQP_Q_AMOUNT);
  if (rc == EQP_OK) rc = eqpi_solution_equilibrate(s, &res);
  for (size_t i = 0; res && i < eqp_result_warning_count(res); i++)
    keep_warning(ctx, c, "under the load: ", eqp_result_warning(res, i));
  if (rc == EQP_OK) {
    c->pub.possible = 1;
    c->pub.beta = bL;
    c->pub.shift = eqp_result_pH(res) - pH0;
    c->pub.within_window = fabs(c->pub.shift) <= window;
    c->pub.pH = pH0;
    c->pub.ionic_strength = eqp_result_ionic_strength(res);
    /* the most a monoprotic buffer of total C gives, at its pKa: ln10 C / 4
    ** (Van Slyke 1922); far below that the system is not buffering here */
    double share = bL / (log(10) * sp->total / 4);
    snprintf(c->why, sizeof c->why, "%sbeta %.1f mM per pH; the load moves the pH by %+.3f",
             share < 0.2 ? "far from its pKa here; " : "", bL * 1e3, c->pub.shift);
  } else {
    snprintf(c->why, sizeof c->why, "%s", eqp_ctx_errmsg(ctx));
  }
  eqp_result_free(res);
  eqp_solution_free(s);
  eqp_recipe_free(r);
}

/* Possible first, by the size of the shift; then the others, by name. */
static int ranking(const void *pa, const void *pb)
{
  const eqp_candidate *a = &((const cand *)pa)->pub, *b = &((const cand *)pb)->pub;
  if (a->possible != b->possible) return a->possible ? -1 : 1;
  if (a->possible && fabs(a->shift) != fabs(b->shift)) return fabs(a->shift) < fabs(b->shift) ? -1 : 1;
  return strcmp(a->buffer, b->buffer);
}

/* Append one line of text, growing the buffer through the context. */
static int put_line(eqp_comparison *cmp, const char *line)
{
  size_t used = cmp->text ? strlen(cmp->text) : 0, len = strlen(line);
  if (used + len + 2 > cmp->textcap) {
    size_t cap = cmp->textcap ? cmp->textcap : 1024;
    while (cap < used + len + 2) cap *= 2;
    char *t = eqpi_realloc(cmp->ctx, cmp->text, cmp->textcap, cap);
    if (!t) return eqpi_fail(cmp->ctx, EQP_E_NOMEM, "out of memory");
    if (!cmp->text) t[0] = '\0';
    cmp->text = t;
    cmp->textcap = cap;
  }
  memcpy(cmp->text + used, line, len);
  memcpy(cmp->text + used + len, "\n", 2);
  return EQP_OK;
}

static int write_text(eqp_comparison *cmp, const eqp_recipe_spec *sp, double load,
                      const char *load_with, double window)
{
  char line[768];
  snprintf(line, sizeof line, "Buffers for pH %.2f at %.1f C, %.4g mM, load %.4g mM %s, "
           "window +-%.2f:", sp->pH, sp->T - 273.15, sp->total * 1e3, load * 1e3, load_with,
           window);
  int rc = put_line(cmp, line);
  for (size_t i = 0; i < cmp->n && rc == EQP_OK; i++) {
    const eqp_candidate *c = &cmp->c[i].pub;
    snprintf(line, sizeof line, "%2d. %-20s %s%s", (int)i + 1, c->buffer,
             !c->possible ? "cannot be made: " : c->within_window ? "" : "(leaves the window) ",
             c->why);
    rc = put_line(cmp, line);
    for (size_t q = 0; q < c->nnotes && rc == EQP_OK; q++) {
      snprintf(line, sizeof line, "      note: %s", c->notes[q]);
      rc = put_line(cmp, line);
    }
  }
  return rc;
}

static int check_spec(eqp_ctx *ctx, const eqp_compare_spec *user, eqp_compare_spec *sp,
                      eqp_recipe_spec *rs)
{
  const eqp_compare_spec dflt = EQP_COMPARE_SPEC_INIT;
  *sp = dflt;
  int rc = eqpi_opts_read(ctx, "eqp_compare_spec", user, sp, sizeof *sp, EQPI_COMPARE_SPEC_0_1);
  if (rc < 0) return rc;
  if (!sp->recipe || !sp->load_with)
    return eqpi_fail(ctx, EQP_E_ARG, "compare buffers: NULL recipe or load reagent");
  if (!(sp->load > 0) || !isfinite(sp->load))
    return eqpi_fail(ctx, EQP_E_INPUT, "compare buffers: the load %g mol/L must be positive",
                     sp->load);
  if (!(sp->window > 0 && sp->window <= 7))
    return eqpi_fail(ctx, EQP_E_INPUT, "compare buffers: the window %g must be above 0 and at "
                     "most 7 pH units", sp->window);
  int g = eqpi_db_find_reagent(ctx->db, sp->load_with);   /* unknown: said when it is added */
  if (g >= 0 && eqpi_reagent_kind(ctx->db, &ctx->db->rg[g], NULL) == EQPI_RG_NEUTRAL)
    return eqpi_fail(ctx, EQP_E_INPUT, "compare buffers: load_with = '%s' is neither an acid nor "
                     "a base (it releases and takes up no H+), so it loads no buffer; name an "
                     "acid or a base, such as HCl or NaOH", sp->load_with);
  *rs = (eqp_recipe_spec)EQP_RECIPE_SPEC_INIT;
  if ((rc = eqpi_opts_read(ctx, "eqp_recipe_spec", sp->recipe, rs, sizeof *rs,
                           EQPI_RECIPE_SPEC_0_1)) < 0)
    return rc;
  rs->buffer = NULL;
  rs->reagents = NULL;
  rs->nreagents = 0;
  if (rs->T == 0) rs->T = 298.15;      /* the defaults of eqp_recipe_make, for the text */
  if (rs->volume == 0) rs->volume = 1;
  return EQP_OK;
}

int eqp_compare_buffers(eqp_ctx *ctx, const eqp_compare_spec *spec, eqp_comparison **out)
{
  if (!ctx || !spec || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  eqp_compare_spec sp;
  eqp_recipe_spec base;
  int rc = check_spec(ctx, spec, &sp, &base);
  if (rc < 0) return rc;
  if ((rc = eqp_ctx_load_default_library(ctx)) < 0) return rc;
  eqp_comparison *cmp = eqpi_calloc(ctx, 1, sizeof *cmp);
  size_t nb = eqp_ctx_buffer_count(ctx);
  if (cmp) {
    cmp->ctx = ctx;
    cmp->cap = nb ? nb : 1;
    cmp->c = eqpi_calloc(ctx, cmp->cap, sizeof *cmp->c);
  }
  if (!cmp || !cmp->c) {
    eqp_comparison_free(cmp);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  for (size_t i = 0; i < nb; i++) {
    cand *c = &cmp->c[cmp->n++];
    eqp_recipe_spec one = base;
    one.buffer = c->pub.buffer = eqp_ctx_buffer_name(ctx, i);
    c->pub.nnotes = eqp_ctx_buffer_note_count(ctx, i);
    c->pub.notes = (const char *const *)ctx->db->buffers[i].notes;
    c->pub.warnings = c->warnp;
    c->pub.why = c->why;
    c->pub.beta = c->pub.shift = c->pub.pH = c->pub.ionic_strength = NAN;
    candidate(ctx, &one, sp.load * base.volume, sp.load_with, sp.window, c);
  }
  qsort(cmp->c, cmp->n, sizeof *cmp->c, ranking);
  for (size_t i = 0; i < cmp->n; i++) {   /* moved by the sort: point into the new place */
    cmp->c[i].pub.warnings = cmp->c[i].warnp;
    cmp->c[i].pub.why = cmp->c[i].why;
  }
  if ((rc = write_text(cmp, &base, sp.load, sp.load_with, sp.window)) < 0) {
    eqp_comparison_free(cmp);
    return rc;
  }
  *out = cmp;
  return EQP_OK;
}

void eqp_comparison_free(eqp_comparison *cmp)
{
  if (!cmp) return;
  for (size_t i = 0; cmp->c && i < cmp->n; i++)
    for (size_t k = 0; k < cmp->c[i].pub.nwarnings; k++)
      eqpi_free(cmp->ctx, cmp->c[i].warn[k], strlen(cmp->c[i].warn[k]) + 1);
  if (cmp->c) eqpi_free(cmp->ctx, cmp->c, sizeof *cmp->c * cmp->cap);
  eqpi_free(cmp->ctx, cmp->text, cmp->textcap);
  eqpi_free(cmp->ctx, cmp, sizeof *cmp);
}

size_t eqp_comparison_count(const eqp_comparison *c) { return c ? c->n : 0; }

const eqp_candidate *eqp_comparison_at(const eqp_comparison *c, size_t i)
{
  return c && i < c->n ? &c->c[i].pub : NULL;
}

const char *eqp_comparison_text(const eqp_comparison *c) { return c && c->text ? c->text : ""; }
