/* Warnings of a solved state and their observers: a model beyond its stated
** range, temperature data missing or extrapolated, molarities that no longer
** follow from molalities, a default model that gave way to another. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <math.h>
#include <stdio.h>

void eqp_ctx_set_warning_fn(eqp_ctx *ctx, eqp_warning_fn fn, void *ud)
{
  if (!ctx) return;
  ctx->warn_fn = fn;
  ctx->warn_ud = fn ? ud : NULL;
}

void eqpi_warn(eqp_ctx *ctx, const char *kind, const char *text)
{
  if (!ctx || ctx->quiet) return;
  if (ctx->warn_fn) ctx->warn_fn(ctx->warn_ud, kind, text);
  if (ctx->obs.on_warning) ctx->obs.on_warning(ctx->obs_ud, kind, text);
}

void eqpi_warn_prefixed(void *ud, const char *kind, const char *text)
{
  const eqpi_prefixed *p = ud;
  char line[512];
  snprintf(line, sizeof line, "%s: %s", p->prefix, text);
  eqpi_warn(p->ctx, kind, line);
}

/* Molarity is reported as molality x density of water, i.e. the volume of
** the solution taken as that of its water. Past 2 % of that volume taken by
** the solutes (the molarities are then high by as much) the state says so. */
#define SCALE_LIMIT 0.02

void eqpi_state_warnings(const eqpi_model *model, double I, double T, double water_kg,
                         const eqpi_solve_stats *st,
                         void (*add)(void *ud, const char *kind, const char *text), void *ud)
{
  char w[320];
  const char *name = model->desc->name;
  if (st->replaced) {
    snprintf(w, sizeof w, "the default activity model '%s' is stated for I <= %g mol/kg; at "
             "I = %.3g mol/kg this result uses '%s' (stated for I <= %g mol/kg) instead; "
             "name a model with activity = \"...\" to choose yourself", st->replaced->name,
             st->replaced->max_ionic_strength, I, name, model->desc->max_ionic_strength);
    add(ud, "default-model", w);
  }
  double Imax = model->desc->max_ionic_strength;
  if (Imax > 0 && I > Imax * (1 + 1e-6)) {   /* a recipe made to the limit is inside */
    snprintf(w, sizeof w, "ionic strength %.3g mol/kg is beyond the stated range of the '%s' "
             "activity model (I <= %g mol/kg); activity coefficients are extrapolated", I,
             name, Imax);
    add(ud, "ionic-strength", w);
  }
  if (st->model_note && st->model_note[0]) add(ud, "model", st->model_note);
  if (st->outside_T) {
    snprintf(w, sizeof w, "%d temperature function(s) were used outside the range their "
             "source states, at %.2f C", st->outside_T, T - 273.15);
    add(ud, "temperature", w);
  }
  if (st->missing_T) {
    snprintf(w, sizeof w, "%d constant(s) have no temperature data; their 25 C values were "
             "used at %.2f C", st->missing_T, T - 273.15);
    add(ud, "temperature", w);
  }
  /* water is never denser than 1 kg/L, so its volume is at least water_kg
  ** litres: most states are shown below the limit without the density */
  if (!((st->solute_L + st->unknown_g * 1e-3) / water_kg > SCALE_LIMIT)) return;
  double Vw = water_kg / eqpi_water_density(T);   /* L */
  double known = st->solute_L / Vw;
  /* a solid of unknown density: at least 1 g/mL for the salts and organic
  ** buffer substances of the library, so at most 1 mL per g */
  double bound = known + st->unknown_g * 1e-3 / Vw;
  if (known > SCALE_LIMIT) {
    snprintf(w, sizeof w, "the solutes take about %.0f%% of the volume of the water (crystal "
             "densities, volumes taken as additive): molarities, computed as molality x "
             "density of water, are about %.0f%% high; use the molalities", 100 * known,
             100 * known);
    add(ud, "concentration-scale", w);
  } else if (bound > SCALE_LIMIT) {
    snprintf(w, sizeof w, "%.3g g of solutes per kg of water have no density in the engine's "
             "table: their volume is not counted, and molarities, computed as molality x "
             "density of water, may be high by up to %.0f%%; use the molalities",
             st->unknown_g / water_kg, 100 * bound);
    add(ud, "concentration-scale", w);
  }
}
