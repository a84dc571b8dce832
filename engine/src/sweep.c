/* Sweeps: buffer capacity against pH for candidate buffers, pH against
** temperature; and the progress callback that long operations report to. */
/* SPDX-License-Identifier: MIT */
#include "curve_impl.h"
#include "solution_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_BUFFERS 64

void eqp_ctx_set_progress(eqp_ctx *ctx, eqp_progress_fn fn, void *ud)
{
  if (!ctx) return;
  ctx->progress = fn;
  ctx->progress_ud = ud;
}

void eqpi_progress(eqp_ctx *ctx, const char *what, size_t done, size_t total)
{
  if (ctx && ctx->progress) ctx->progress(ctx->progress_ud, what, done, total);
}

/* beta (mol/(L pH)) of one buffer made by recipe at pH; NaN if it cannot be
** made there. Only running out of memory is an error. */
static int beta_at(eqp_ctx *ctx, const eqp_capacity_spec *s, const char *buffer, double pH,
                   double *beta)
{
  eqp_recipe_spec sp = EQP_RECIPE_SPEC_INIT;
  sp.buffer = buffer;
  sp.pH = pH;
  sp.total = s->total;
  sp.volume = s->volume > 0 ? s->volume : 1.0;
  sp.T = s->T > 0 ? s->T : EQPI_T25;
  sp.activity = s->activity;
  sp.ionic_strength = NAN;
  *beta = NAN;
  eqp_recipe *r = NULL;
  eqp_solution *w = NULL;
  double bL, bkg;
  eqpi_cautions_hold(ctx, 1);     /* a curve of each buffer, not a preparation */
  int rc = eqp_recipe_make(ctx, &sp, &r);
  eqpi_cautions_hold(ctx, -1);
  if (rc == EQP_OK) rc = eqp_solution_copy(eqp_recipe_solution(r), &w);
  if (rc == EQP_OK) rc = eqp_solution_buffer_capacity(w, &bL, &bkg);   /* per L, per kg */
  if (rc == EQP_OK && isfinite(bL)) *beta = bL;
  eqp_solution_free(w);
  eqp_recipe_free(r);
  if (rc == EQP_E_NOMEM) return rc;
  eqp_ctx_clear_error(ctx);
  return EQP_OK;
}

int eqp_capacity_sweep(eqp_ctx *ctx, const eqp_capacity_spec *user, eqp_curve **out)
{
  if (!ctx || !user || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  eqp_capacity_spec opts = EQP_CAPACITY_SPEC_INIT;
  const eqp_capacity_spec *s = &opts;
  int rc = eqpi_opts_read(ctx, "eqp_capacity_spec", user, &opts, sizeof opts,
                          EQPI_CAPACITY_SPEC_0_1);
  if (rc < 0) return rc;
  size_t np = s->points ? s->points : 61;
  if (!(isfinite(s->pH_lo) && isfinite(s->pH_hi) && s->pH_lo < s->pH_hi && s->pH_lo >= 0 &&
        s->pH_hi <= 14))
    return eqpi_fail(ctx, EQP_E_INPUT, "pH range %g .. %g: low first, within 0 .. 14", s->pH_lo,
                     s->pH_hi);
  if (!(s->total > 0 && s->total <= 5))
    return eqpi_fail(ctx, EQP_E_INPUT, "buffer total %g mol/L outside 0 .. 5", s->total);
  if (np < 2 || np > 2001) return eqpi_fail(ctx, EQP_E_INPUT, "2 to 2001 points");
  if (!isnan(s->window_lo) && !(s->window_lo < s->window_hi))
    return eqpi_fail(ctx, EQP_E_INPUT, "window %g .. %g: low end first", s->window_lo,
                     s->window_hi);
  rc = eqp_ctx_load_default_library(ctx);
  if (rc < 0) return rc;
  const char *names[MAX_BUFFERS + 1] = {"pH"};
  size_t nb = s->buffers ? s->nbuffers : eqp_ctx_buffer_count(ctx);
  if (nb == 0 || nb > MAX_BUFFERS)
    return eqpi_fail(ctx, EQP_E_INPUT, "%s %d buffer systems at most: name the candidates",
                     s->buffers ? "a capacity sweep takes" : "the library holds more than the",
                     MAX_BUFFERS);
  for (size_t b = 0; b < nb; b++) {
    names[b + 1] = s->buffers ? s->buffers[b] : eqp_ctx_buffer_name(ctx, b);
    size_t k = 0;
    while (k < eqp_ctx_buffer_count(ctx) && strcmp(eqp_ctx_buffer_name(ctx, k), names[b + 1]))
      k++;
    if (k == eqp_ctx_buffer_count(ctx))
      return eqpi_fail(ctx, EQP_E_UNKNOWN, "no buffer system '%s' in the library",
                       names[b + 1]);
  }
  eqp_curve *c = eqpi_curve_new(ctx, (int)nb + 1, names);
  if (!c) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  c->values = EQPI_VALUES_BETA;
  for (size_t k = 0; k < np && rc == EQP_OK; k++) {
    double row[MAX_BUFFERS + 1];
    row[0] = s->pH_lo + (s->pH_hi - s->pH_lo) * (double)k / (double)(np - 1);
    for (size_t b = 0; b < nb && rc == EQP_OK; b++) {
      rc = beta_at(ctx, s, names[b + 1], row[0], &row[b + 1]);
      eqpi_progress(ctx, "buffer capacity", k * nb + b + 1, np * nb);
    }
    if (rc == EQP_OK) rc = eqpi_curve_push(c, row);
  }
  if (rc < 0) {
    eqp_curve_free(c);
    return rc;
  }
  *out = c;
  return EQP_OK;
}

int eqp_solution_temperature_sweep(eqp_solution *s, double T0, double T1, size_t points,
                                   eqp_curve **out)
{
  if (!s || !out) return EQP_E_ARG;
  eqp_ctx *ctx = s->ctx;
  *out = NULL;
  if (!(T0 >= 273.15 && T1 <= 373.15 && T0 < T1))
    return eqpi_fail(ctx, EQP_E_INPUT, "temperatures %g .. %g K: low first, within 273.15 .. "
                     "373.15", T0, T1);
  if (points == 0) points = floor(T1 - T0) + 1 < 2 ? 2 : (size_t)(floor(T1 - T0) + 1);
  if (points < 2 || points > 10001) return eqpi_fail(ctx, EQP_E_INPUT, "2 to 10001 points");
  static const char *const names[] = {"temperature", "pH", "ionic_strength"};
  eqp_solution *w;
  int rc = eqp_solution_copy(s, &w);
  if (rc < 0) return rc;
  eqp_curve *c = eqpi_curve_new(ctx, 3, names);
  if (!c) rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (size_t k = 0; k < points && rc == EQP_OK; k++) {
    double T = T0 + (T1 - T0) * (double)k / (double)(points - 1);
    eqp_result *r;
    rc = eqp_solution_set_temperature(w, T);
    if (rc == EQP_OK) rc = eqpi_solution_equilibrate(w, &r);
    if (rc == EQP_OK) {
      double row[3] = {T - 273.15, eqp_result_pH(r), eqp_result_ionic_strength(r)};
      eqp_result_free(r);
      rc = eqpi_curve_push(c, row);
    }
    eqpi_progress(ctx, "temperature sweep", k + 1, points);
  }
  eqp_solution_free(w);
  if (rc < 0) {
    eqp_curve_free(c);
    return rc;
  }
  *out = c;
  return EQP_OK;
}
