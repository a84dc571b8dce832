/* Text renderings of the description and listing trees (describe.c), for
** `equipoise species show|list` and eq.describe. */
/* SPDX-License-Identifier: MIT */
#include "describe_impl.h"
#include <math.h>
#include <string.h>

static const char *str(const cJSON *o, const char *key)
{
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(o, key);
  return cJSON_IsString(v) ? v->valuestring : NULL;
}

static const cJSON *num(const cJSON *o, const char *key)
{
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(o, key);
  return cJSON_IsNumber(v) ? v : NULL;
}

static const cJSON *arr(const cJSON *o, const char *key)
{
  return cJSON_GetObjectItemCaseSensitive(o, key);
}

/* A charge as IUPAC writes it after a formula: 0, 1+, 2-. */
static void charge(char *buf, size_t len, double z)
{
  if (z == 0) snprintf(buf, len, "0");
  else snprintf(buf, len, "%g%c", fabs(z), z > 0 ? '+' : '-');
}

/* A constant: the reaction and its value at 25 C on one line, its value at
** the chosen temperature, its source. */
static void constant_text(eqpi_text *t, const cJSON *c)
{
  const char *k = str(c, "constant");
  eqpi_text_printf(t, "  %s   %s %.6g at 25 \u00b0C", str(c, "equation"), k,
                   num(c, "value")->valuedouble);
  if (num(c, "enthalpy")) eqpi_text_printf(t, ", \u0394rH\u00b0 %g kJ/mol",
                                           num(c, "enthalpy")->valuedouble);
  if (num(c, "heat_capacity")) eqpi_text_printf(t, ", \u0394rCp\u00b0 %g J/(K\u00b7mol)",
                                                num(c, "heat_capacity")->valuedouble);
  eqpi_text_printf(t, "\n");
  const char *dep = str(c, "temperature_dependence");
  const cJSON *range = arr(c, "temperature_range");
  const cJSON *v;
  cJSON_ArrayForEach(v, arr(c, "values")) {
    double T = num(v, "temperature")->valuedouble;
    if (fabs(T - 25) < 1e-9) continue;
    eqpi_text_printf(t, "      at %g \u00b0C: %s %.3f (", T, k, num(v, "value")->valuedouble);
    if (strcmp(dep, "none") == 0) eqpi_text_printf(t, "no temperature data: the 25 \u00b0C value");
    else eqpi_text_printf(t, "%s", dep);
    if (cJSON_GetArraySize(range) == 2)
      eqpi_text_printf(t, ", stated for %g to %g \u00b0C", cJSON_GetArrayItem(range, 0)->valuedouble,
                       cJSON_GetArrayItem(range, 1)->valuedouble);
    eqpi_text_printf(t, ")\n");
  }
  cJSON_ArrayForEach(v, arr(c, "warnings")) eqpi_text_printf(t, "      warning: %s\n", v->valuestring);
  const cJSON *m = cJSON_GetObjectItemCaseSensitive(c, "measured");
  if (m) {
    const cJSON *medium = cJSON_GetObjectItemCaseSensitive(m, "medium");
    const cJSON *to = cJSON_GetObjectItemCaseSensitive(m, "to_I0");
    eqpi_text_printf(t, "      measured at I = %g, %g \u00b0C", num(m, "ionic_strength")->valuedouble,
                     num(m, "temperature")->valuedouble);
    if (cJSON_IsString(medium)) eqpi_text_printf(t, " (%s)", medium->valuestring);
    if (cJSON_IsString(to))
      eqpi_text_printf(t, "; taken to I = 0 with %s",
                       strcmp(to->valuestring, "davies") == 0 ? "the Davies equation"
                       : strcmp(to->valuestring, "sit") == 0 ? "specific ion interaction theory"
                       : "the Debye\u2013H\u00fcckel equation");
    eqpi_text_printf(t, "\n");
  }
  eqpi_text_printf(t, "      source: %s\n", str(c, "source"));
}

static void constants_text(eqpi_text *t, const cJSON *e)
{
  const cJSON *c;
  cJSON_ArrayForEach(c, arr(e, "reactions")) constant_text(t, c);
}

static void species_text(eqpi_text *t, const cJSON *e)
{
  char z[32];
  charge(z, sizeof z, num(e, "charge")->valuedouble);
  eqpi_text_printf(t, "%s: species, charge %s, formula %s\n", str(e, "name"), z, str(e, "formula"));
  constants_text(t, e);
  if (num(e, "ion_size"))
    eqpi_text_printf(t, "  ion size %g \u00c5\n      source: %s\n", num(e, "ion_size")->valuedouble,
                     str(e, "ion_size_source"));
  const cJSON *p;
  cJSON_ArrayForEach(p, arr(e, "parameters")) {
    if (str(p, "with"))
      eqpi_text_printf(t, "  %s with %s = %g\n", str(p, "name"), str(p, "with"),
                       num(p, "value")->valuedouble);
    else
      eqpi_text_printf(t, "  %s = %g\n", str(p, "name"), num(p, "value")->valuedouble);
    eqpi_text_printf(t, "      source: %s\n", str(p, "source"));
  }
}

static void list_names(eqpi_text *t, const char *label, const cJSON *a, const char *sep)
{
  if (cJSON_GetArraySize(a) == 0) return;
  eqpi_text_printf(t, "  %s", label);
  const cJSON *v;
  int first = 1;
  cJSON_ArrayForEach(v, a) {
    eqpi_text_printf(t, "%s%s", first ? "" : sep, v->valuestring);
    first = 0;
  }
  eqpi_text_printf(t, "\n");
}

static void reagent_text(eqpi_text *t, const cJSON *e)
{
  eqpi_text_printf(t, "%s: reagent, formula %s, %.3f g/mol\n", str(e, "name"), str(e, "formula"),
                   num(e, "molar_mass")->valuedouble);
  eqpi_text_printf(t, "      molar mass from: %s\n", str(e, "molar_mass_source"));
  list_names(t, "also called: ", arr(e, "aliases"), "; ");
  eqpi_text_printf(t, "  gives:");
  const cJSON *g;
  int first = 1;
  double water = 0, hydrate = num(e, "water_of_crystallisation") ?
                               num(e, "water_of_crystallisation")->valuedouble : 0;
  cJSON_ArrayForEach(g, arr(e, "gives")) {
    double n = num(g, "count")->valuedouble;
    if (strcmp(str(g, "species"), "H2O") == 0) water += n;   /* written once, net, below */
    else if (n == 1) eqpi_text_printf(t, "%s %s", first ? "" : " +", str(g, "species"));
    else eqpi_text_printf(t, "%s %g %s", first ? "" : " +", n, str(g, "species"));
    first = 0;
  }
  double net = water + hydrate;
  if (net != 0) eqpi_text_printf(t, " %c %g H2O", net > 0 ? '+' : '-', fabs(net));
  if (hydrate > 0 && water == 0) eqpi_text_printf(t, " (water of crystallisation)");
  else if (hydrate > 0)
    eqpi_text_printf(t, " (%g of crystallisation, %g %s on dissolving)", hydrate, fabs(water),
                     water < 0 ? "taken up" : "released");
  eqpi_text_printf(t, "\n");
  if (num(e, "density")) eqpi_text_printf(t, "  density %g g/mL\n", num(e, "density")->valuedouble);
  list_names(t, "hazards: ", arr(e, "hazards"), ", ");
}

static void buffer_text(eqpi_text *t, const cJSON *e)
{
  eqpi_text_printf(t, "%s: buffer system\n", str(e, "name"));
  if (str(e, "acid_form"))
    eqpi_text_printf(t, "  made from %s (acid form) and %s (base form)\n", str(e, "acid_form"),
                     str(e, "base_form"));
  if (str(e, "substance"))
    eqpi_text_printf(t, "  %s %s with %s (titrant)\n", str(e, "acid_form") ? "or from" : "made from",
                     str(e, "substance"), str(e, "titrant") ? str(e, "titrant") : "-");
  constants_text(t, e);
  const cJSON *n;
  cJSON_ArrayForEach(n, arr(e, "notes")) eqpi_text_printf(t, "  note: %s\n", n->valuestring);
}

void eqpi_describe_text(eqpi_text *t, const cJSON *doc)
{
  const cJSON *e;
  int first = 1;
  cJSON_ArrayForEach(e, arr(doc, "entries")) {
    const char *kind = str(e, "kind");
    if (!first) eqpi_text_printf(t, "\n");
    first = 0;
    if (strcmp(kind, "species") == 0) {
      species_text(t, e);
    } else if (strcmp(kind, "reagent") == 0) {
      reagent_text(t, e);
    } else if (strcmp(kind, "buffer_system") == 0) {
      buffer_text(t, e);
    } else if (strcmp(kind, "solid") == 0) {
      eqpi_text_printf(t, "%s: solid, formula %s\n", str(e, "name"), str(e, "formula"));
      constants_text(t, e);
    } else {
      eqpi_text_printf(t, "%s: gas, dissolves as %s\n", str(e, "name"), str(e, "dissolves"));
      constants_text(t, e);
    }
    eqpi_text_printf(t, "  defined at %s\n", str(e, "defined"));
  }
}

/* The file name without its folder, for the listing. */
static const char *base_name(const char *path)
{
  const char *s = strrchr(path, '/');
  return s ? s + 1 : path;
}

void eqpi_list_text(eqpi_text *t, const cJSON *doc)
{
  const cJSON *e, *a = arr(doc, "species");
  char z[32];
  eqpi_text_printf(t, "species (%d)\n", cJSON_GetArraySize(a));
  cJSON_ArrayForEach(e, a) {
    charge(z, sizeof z, num(e, "charge")->valuedouble);
    eqpi_text_printf(t, "  %-20s charge %-4s %s\n", str(e, "name"), z, base_name(str(e, "defined")));
  }
  a = arr(doc, "reagents");
  eqpi_text_printf(t, "reagents (%d)\n", cJSON_GetArraySize(a));
  cJSON_ArrayForEach(e, a) {
    const cJSON *n;
    int first = 1;
    if (cJSON_GetArraySize(arr(e, "aliases")) == 0) eqpi_text_printf(t, "  %s", str(e, "name"));
    cJSON_ArrayForEach(n, arr(e, "aliases")) {
      if (first) eqpi_text_printf(t, "  %-20s also: %s", str(e, "name"), n->valuestring);
      else eqpi_text_printf(t, "; %s", n->valuestring);
      first = 0;
    }
    eqpi_text_printf(t, "\n");
  }
  a = arr(doc, "buffer_systems");
  eqpi_text_printf(t, "buffer systems (%d)\n", cJSON_GetArraySize(a));
  cJSON_ArrayForEach(e, a) {
    eqpi_text_printf(t, "  %-20s", str(e, "name"));
    if (str(e, "acid_form")) eqpi_text_printf(t, " %s + %s", str(e, "acid_form"), str(e, "base_form"));
    if (str(e, "substance"))
      eqpi_text_printf(t, "%s %s with %s", str(e, "acid_form") ? ", or" : "", str(e, "substance"),
                       str(e, "titrant") ? str(e, "titrant") : "-");
    eqpi_text_printf(t, "\n");
  }
  a = arr(doc, "solids");
  eqpi_text_printf(t, "solids (%d)\n", cJSON_GetArraySize(a));
  int w = 20;   /* names such as "octacalcium phosphate" widen the column */
  cJSON_ArrayForEach(e, a) {
    const char *n = str(e, "name");
    if (n && (int)strlen(n) > w) w = (int)strlen(n);
  }
  cJSON_ArrayForEach(e, a) eqpi_text_printf(t, "  %-*s %s\n", w, str(e, "name"), str(e, "formula"));
  a = arr(doc, "gases");
  eqpi_text_printf(t, "gases (%d)\n", cJSON_GetArraySize(a));
  cJSON_ArrayForEach(e, a)
    eqpi_text_printf(t, "  %-20s dissolves as %s\n", str(e, "name"), str(e, "dissolves"));
  a = arr(doc, "species_files");
  eqpi_text_printf(t, "species files (%d)\n", cJSON_GetArraySize(a));
  cJSON_ArrayForEach(e, a) eqpi_text_printf(t, "  %s\n", e->valuestring);
}
