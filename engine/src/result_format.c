/* A result written out: as JSON for programs, as a table for a reader. */
/* SPDX-License-Identifier: MIT */
#include "result_impl.h"
#include <cjson/cJSON.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

char *eqp_result_to_json(const eqp_result *r)
{
  if (!r) return NULL;
  const eqp_ctx *ctx = eqpi_result_ctx(r);
  cJSON *o = cJSON_CreateObject();
  if (!o) return NULL;
  cJSON_AddNumberToObject(o, "pH", eqp_result_pH(r));
  cJSON_AddNumberToObject(o, "ionic_strength", eqp_result_ionic_strength(r));
  cJSON_AddNumberToObject(o, "temperature", eqp_result_temperature_K(r) - 273.15);
  cJSON_AddNumberToObject(o, "water", eqp_result_water(r));
  cJSON_AddStringToObject(o, "activity_model", eqp_result_activity_model(r));
  cJSON_AddNumberToObject(o, "residual", eqp_result_residual(r));
  cJSON_AddNumberToObject(o, "iterations", (double)eqp_result_iterations(r));
  cJSON *sp = cJSON_AddArrayToObject(o, "species");
  for (size_t i = 0; sp && i < eqp_result_species_count(r); i++) {
    cJSON *e = cJSON_CreateObject();
    cJSON_AddStringToObject(e, "name", eqp_result_species_name(r, i));
    cJSON_AddNumberToObject(e, "molality", eqp_result_species_molality(r, i));
    cJSON_AddNumberToObject(e, "gamma", pow(10.0, eqp_result_species_log_gamma(r, i)));
    cJSON_AddItemToArray(sp, e);
  }
  cJSON *sat = cJSON_AddObjectToObject(o, "saturation_index");
  for (size_t i = 0; sat && i < eqp_ctx_solid_count(ctx); i++) {
    double si;
    if (eqp_result_saturation(r, eqp_ctx_solid_name(ctx, i), &si) == EQP_OK && isfinite(si))
      cJSON_AddNumberToObject(sat, eqp_ctx_solid_name(ctx, i), si);
  }
  if (eqp_result_solid_count(r)) {    /* only when solids were allowed and formed */
    cJSON *so = cJSON_AddObjectToObject(o, "solids");
    for (size_t i = 0; so && i < eqp_result_solid_count(r); i++) {
      double mol;
      const char *name = eqp_result_solid_name(r, i, &mol);
      cJSON_AddNumberToObject(so, name, mol);
    }
  }
  double V, pt, pw;
  if (eqp_result_headspace(r, &V, &pt, &pw) == 1) {   /* only for a sealed solution */
    cJSON *hs = cJSON_AddObjectToObject(o, "headspace");
    cJSON_AddNumberToObject(hs, "volume", V);
    cJSON_AddNumberToObject(hs, "pressure", pt);
    cJSON_AddNumberToObject(hs, "water_vapour", pw);
    cJSON *gs = cJSON_AddArrayToObject(hs, "gases");
    for (size_t i = 0; gs && i < eqp_result_gas_count(r); i++) {
      double p, mol;
      const char *name = eqp_result_gas_name(r, i, &p, &mol);
      cJSON *e = cJSON_CreateObject();
      cJSON_AddStringToObject(e, "name", name);
      cJSON_AddNumberToObject(e, "pressure", p);
      cJSON_AddNumberToObject(e, "mol", mol);
      cJSON_AddItemToArray(gs, e);
    }
  }
  cJSON *w = cJSON_AddArrayToObject(o, "warnings");
  for (size_t i = 0; w && i < eqp_result_warning_count(r); i++)
    cJSON_AddItemToArray(w, cJSON_CreateString(eqp_result_warning(r, i)));
  char *text = cJSON_PrintUnformatted(o);
  cJSON_Delete(o);
  return text;   /* free with eqp_free_string */
}

/* Species in the order a reader wants them: largest molality first. */
typedef struct row { const char *name; double m, lg; } row;

static int by_molality(const void *a, const void *b)
{
  double x = ((const row *)a)->m, y = ((const row *)b)->m;
  return x < y ? 1 : x > y ? -1 : strcmp(((const row *)a)->name, ((const row *)b)->name);
}

char *eqp_result_to_text(const eqp_result *r)
{
  if (!r) return NULL;
  size_t n = eqp_result_species_count(r);
  row *rows = malloc(sizeof(row) * (n + 1));
  char *buf = NULL;
  size_t len = 0;
  FILE *f = rows ? open_memstream(&buf, &len) : NULL;
  if (!f) {
    free(rows);
    return NULL;
  }
  for (size_t i = 0; i < n; i++) {
    rows[i].name = eqp_result_species_name(r, i);
    rows[i].m = eqp_result_species_molality(r, i);
    rows[i].lg = eqp_result_species_log_gamma(r, i);
  }
  qsort(rows, n, sizeof *rows, by_molality);
  double rho = eqp_result_water_density(r);
  fprintf(f, "pH %.3f   ionic strength %.4g mol/kg   %.2f \u00b0C   activity model %s\n",
          eqp_result_pH(r), eqp_result_ionic_strength(r), eqp_result_temperature_K(r) - 273.15,
          eqp_result_activity_model(r));
  /* mM as a bench chemist reads it (molality x density of water, dilute) */
  fprintf(f, "  %-16s %12s %14s %8s\n", "species", "mM", "mol/kg", "gamma");
  for (size_t i = 0; i < n; i++)
    fprintf(f, "  %-16s %12.5g %14.6e %8.4f\n", rows[i].name, rows[i].m * rho * 1e3, rows[i].m,
            pow(10.0, rows[i].lg));
  double V, pt, pw;
  if (eqp_result_headspace(r, &V, &pt, &pw) == 1) {
    fprintf(f, "  headspace %.4g mL at %.4g atm (water vapour %.3g atm)\n", V * 1e3, pt, pw);
    fprintf(f, "  %-16s %12s %14s\n", "gas", "atm", "mol");
    for (size_t i = 0; i < eqp_result_gas_count(r); i++) {
      double p, mol;
      const char *name = eqp_result_gas_name(r, i, &p, &mol);
      fprintf(f, "  %-16s %12.5g %14.6e\n", name, p, mol);
    }
  }
  for (size_t i = 0; i < eqp_result_warning_count(r); i++)
    fprintf(f, "  warning: %s\n", eqp_result_warning(r, i));
  int bad = ferror(f);
  fclose(f);        /* buf is malloc'd, as eqp_free_string expects */
  free(rows);
  if (bad) {
    free(buf);
    return NULL;
  }
  return buf;
}
