/* Curves: rows of a titration, equivalence points, CSV and JSON output. */
/* SPDX-License-Identifier: MIT */
#include "curve_impl.h"
#include "atomic_impl.h"
#include <cjson/cJSON.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

eqp_curve *eqpi_curve_new(eqp_ctx *ctx, int ncols, const char *const *names)
{
  eqp_curve *c = eqpi_calloc(ctx, 1, sizeof *c);
  if (!c) return NULL;
  c->ctx = ctx;
  c->ncols = ncols;
  c->names = eqpi_calloc(ctx, (size_t)ncols, sizeof(char *));
  if (!c->names) {
    eqpi_free(ctx, c, sizeof *c);
    return NULL;
  }
  for (int j = 0; j < ncols; j++)
    if (!(c->names[j] = eqpi_strdup(ctx, names[j]))) {
      eqp_curve_free(c);
      return NULL;
    }
  return c;
}

int eqpi_curve_push(eqp_curve *c, const double *row)
{
  if (eqpi_grow_size(c->ctx, &c->v, &c->caprows, c->nrows + 1,
                     sizeof(double) * (size_t)c->ncols) < 0)
    return eqpi_fail(c->ctx, EQP_E_NOMEM, "out of memory");
  memcpy(c->v + c->nrows * (size_t)c->ncols, row, sizeof(double) * (size_t)c->ncols);
  c->nrows++;
  return EQP_OK;
}

int eqpi_curve_push_eq(eqp_curve *c, const eqpi_eqpoint *e)
{
  if (eqpi_grow_size(c->ctx, &c->eq, &c->capeq, c->neq + 1, sizeof *c->eq) < 0)
    return eqpi_fail(c->ctx, EQP_E_NOMEM, "out of memory");
  c->eq[c->neq++] = *e;
  return EQP_OK;
}

void eqp_curve_free(eqp_curve *c)
{
  if (!c) return;
  eqp_ctx *ctx = c->ctx;
  for (int j = 0; j < c->ncols; j++) eqpi_strfree(ctx, c->names[j]);
  eqpi_free(ctx, c->names, sizeof(char *) * (size_t)c->ncols);
  eqpi_free(ctx, c->v, sizeof(double) * c->caprows * (size_t)c->ncols);
  eqpi_free(ctx, c->eq, sizeof *c->eq * c->capeq);
  eqpi_free(ctx, c, sizeof *c);
}

size_t eqp_curve_rows(const eqp_curve *c) { return c ? c->nrows : 0; }
size_t eqp_curve_cols(const eqp_curve *c) { return c ? (size_t)c->ncols : 0; }

const char *eqp_curve_col_name(const eqp_curve *c, size_t j)
{
  return c && j < (size_t)c->ncols ? c->names[j] : NULL;
}

double eqp_curve_value(const eqp_curve *c, size_t i, size_t j)
{
  return c && i < c->nrows && j < (size_t)c->ncols ? c->v[i * (size_t)c->ncols + j] : NAN;
}

size_t eqp_curve_equivalence_count(const eqp_curve *c) { return c ? c->neq : 0; }

int eqp_curve_equivalence(const eqp_curve *c, size_t k, double *amount, double *litres,
                          double *pH)
{
  if (!c || k >= c->neq) return EQP_E_ARG;
  if (amount) *amount = c->eq[k].amount;
  if (litres) *litres = c->eq[k].litres;
  if (pH) *pH = c->eq[k].pH;
  return EQP_OK;
}

double eqp_curve_equivalence_sharpness(const eqp_curve *c, size_t k)
{
  return c && k < c->neq ? c->eq[k].sharpness : NAN;
}

int eqp_curve_write_csv(const eqp_curve *c, FILE *f)
{
  if (!c || !f) return EQP_E_ARG;
  for (int j = 0; j < c->ncols; j++) fprintf(f, "%s%s", j ? "," : "", c->names[j]);
  fputc('\n', f);
  for (size_t i = 0; i < c->nrows; i++) {
    for (int j = 0; j < c->ncols; j++) {
      double v = c->v[i * (size_t)c->ncols + j];
      if (isnan(v)) fprintf(f, "%s", j ? "," : "");
      else fprintf(f, "%s%.10g", j ? "," : "", v);
    }
    fputc('\n', f);
  }
  return ferror(f) ? eqpi_fail(c->ctx, EQP_E_IO, "write error") : EQP_OK;
}

/* Units as a bench chemist reads them: the column's factor from the stored
** unit, and its printed unit, by the column's name (titrate.c, sweep.c,
** distribution.c name them); the other columns by what the curve holds. */
static double text_unit(const eqp_curve *c, int j, const char **unit)
{
  static const struct { const char *name, *unit; double k; } named[] = {
    {"amount", "mmol", 1e3}, {"volume", "mL", 1e3}, {"total_volume", "mL", 1e3},
    {"pH", "", 1}, {"temperature", "\xC2\xB0" "C", 1}, {"ionic_strength", "mol/kg", 1},
  };
  int titration = c->ncols > 0 && strcmp(c->names[0], "amount") == 0;
  for (size_t k = 0; k < sizeof named / sizeof named[0]; k++)
    if (strcmp(c->names[j], named[k].name) == 0) {
      *unit = named[k].unit;
      return named[k].k;
    }
  if (titration && strcmp(c->names[j], "slope") == 0) {
    int stock = c->nrows > 0 && isnan(c->v[0]);   /* no amount: a stock titrant */
    *unit = stock ? "pH/mL" : "pH/mmol";
    return 1e-3;
  }
  if (titration) {
    *unit = "mM";
    return 1e3 * (c->rho > 0 ? c->rho : 1);   /* molality x density: dilute solution */
  }
  if (c->values == EQPI_VALUES_FRACTION) {
    *unit = "fraction";
    return 1;
  }
  if (c->values == EQPI_VALUES_BETA) {
    *unit = "mM/pH";
    return 1e3;
  }
  *unit = "";
  return 1;
}

int eqp_curve_write_text(const eqp_curve *c, FILE *f)
{
  if (!c || !f) return EQP_E_ARG;
  const char *unit;
  for (int j = 0; j < c->ncols; j++) fprintf(f, "%s%13s", j ? " " : "", c->names[j]);
  fputc('\n', f);
  for (int j = 0; j < c->ncols; j++) {
    text_unit(c, j, &unit);
    int extra = 0;   /* UTF-8 continuation bytes take no column ("°C") */
    for (const char *p = unit; *p; p++) extra += ((unsigned char)*p & 0xC0) == 0x80;
    fprintf(f, "%s%*s", j ? " " : "", 13 + extra, unit);
  }
  fputc('\n', f);
  for (size_t i = 0; i < c->nrows; i++) {
    for (int j = 0; j < c->ncols; j++) {
      double v = c->v[i * (size_t)c->ncols + j], k = text_unit(c, j, &unit);
      if (isnan(v)) fprintf(f, "%s%13s", j ? " " : "", "-");
      else fprintf(f, strcmp(c->names[j], "pH") == 0 ? "%s%13.3f" : "%s%13.5g", j ? " " : "",
                   v * k);
    }
    fputc('\n', f);
  }
  for (size_t k = 0; k < c->neq; k++) {
    fprintf(f, "equivalence point %zu:", k + 1);
    if (!isnan(c->eq[k].amount)) fprintf(f, " %.5g mmol,", c->eq[k].amount * 1e3);
    if (!isnan(c->eq[k].litres)) fprintf(f, " %.5g mL,", c->eq[k].litres * 1e3);
    fprintf(f, " pH %.3f, sharpness %.3g\n", c->eq[k].pH, c->eq[k].sharpness);
  }
  return ferror(f) ? eqpi_fail(c->ctx, EQP_E_IO, "write error") : EQP_OK;
}

static int fill_csv(void *ud, FILE *f) { return eqp_curve_write_csv(ud, f); }

static int fill_json(void *ud, FILE *f)
{
  const eqp_curve *c = ud;
  char *text = eqp_curve_to_json(c);
  if (!text) return eqpi_fail(c->ctx, EQP_E_NOMEM, "out of memory");
  size_t len = strlen(text);
  int ok = fwrite(text, 1, len, f) == len && fputc('\n', f) != EOF;
  eqp_free_string(text);
  return ok ? EQP_OK : EQP_E_IO;   /* the writer reports the system's reason */
}

int eqp_curve_save_csv(const eqp_curve *c, const char *path)
{
  if (!c || !path) return EQP_E_ARG;
  return eqpi_write_atomic(c->ctx, path, fill_csv, (void *)c);
}

int eqp_curve_save_json(const eqp_curve *c, const char *path)
{
  if (!c || !path) return EQP_E_ARG;
  return eqpi_write_atomic(c->ctx, path, fill_json, (void *)c);
}

char *eqp_curve_to_json(const eqp_curve *c)
{
  if (!c) return NULL;
  cJSON *o = cJSON_CreateObject();
  cJSON *cols = cJSON_AddArrayToObject(o, "columns");
  for (int j = 0; j < c->ncols; j++) cJSON_AddItemToArray(cols, cJSON_CreateString(c->names[j]));
  cJSON *rows = cJSON_AddArrayToObject(o, "rows");
  for (size_t i = 0; i < c->nrows; i++) {
    cJSON *r = cJSON_CreateArray();
    for (int j = 0; j < c->ncols; j++) {
      double v = c->v[i * (size_t)c->ncols + j];
      cJSON_AddItemToArray(r, isnan(v) ? cJSON_CreateNull() : cJSON_CreateNumber(v));
    }
    cJSON_AddItemToArray(rows, r);
  }
  cJSON *eq = cJSON_AddArrayToObject(o, "equivalence_points");
  for (size_t k = 0; k < c->neq; k++) {
    cJSON *e = cJSON_CreateObject();
    if (!isnan(c->eq[k].amount)) cJSON_AddNumberToObject(e, "amount", c->eq[k].amount);
    if (!isnan(c->eq[k].litres)) cJSON_AddNumberToObject(e, "volume", c->eq[k].litres);
    cJSON_AddNumberToObject(e, "pH", c->eq[k].pH);
    cJSON_AddNumberToObject(e, "sharpness", c->eq[k].sharpness);
    cJSON_AddItemToArray(eq, e);
  }
  char *text = cJSON_PrintUnformatted(o);
  cJSON_Delete(o);
  return text;   /* free with eqp_free_string */
}

void eqp_free_string(char *s) { cJSON_free(s); }
