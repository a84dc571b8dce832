/* Descriptions of library entries (species show, eq.describe), the listing,
** and the constants a run used. The presentation is checked against how
** the publications write the reactions; the values at other temperatures
** against the published temperature equations, evaluated here
** independently of the engine. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include <cjson/cJSON.h>

#define R_LN10 (8.314462618 * 2.302585092994046)

/* pK(T) of R. N. Goldberg, N. Kishore, R. M. Lennen, "Thermodynamic
** quantities for the ionization reactions of buffers", J. Phys. Chem. Ref.
** Data 31, 231 (2002), from pK, dH (kJ/mol) and dCp (J/(K mol)) at 298.15 K. */
static double goldberg_pK(double pK, double dH, double dCp, double T)
{
  const double t = 298.15;
  return pK + dH * 1e3 / R_LN10 * (1 / T - 1 / t) - dCp / R_LN10 * (t / T - 1 + log(T / t));
}

static char *describe(eqp_ctx *ctx, const char *name, double T, eqp_format fmt)
{
  char *out = NULL;
  if (eqp_ctx_describe(ctx, name, T, fmt, &out) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return out;
}

static cJSON *describe_json(eqp_ctx *ctx, const char *name, double T)
{
  char *text = describe(ctx, name, T, EQP_FORMAT_JSON);
  cJSON *doc = cJSON_Parse(text);
  eqp_free_string(text);
  assert_non_null(doc);
  return doc;
}

static const cJSON *at(const cJSON *o, const char *key)
{
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(o, key);
  if (!v) fail_msg("no key '%s'", key);
  return v;
}

static double num_at(const cJSON *o, const char *key) { return at(o, key)->valuedouble; }

/* The constant of an entry whose equation is eq. */
static const cJSON *reaction(const cJSON *entry, const char *eq)
{
  const cJSON *c;
  cJSON_ArrayForEach(c, at(entry, "reactions"))
    if (strcmp(at(c, "equation")->valuestring, eq) == 0) return c;
  fail_msg("no reaction '%s'", eq);
  return NULL;
}

/* Acid steps read as dissociations with pKa, in the direction that releases
** H+, whichever way the species file wrote them (Goldberg et al. 2002). */
static void test_acid_steps_as_dissociations(void **state)
{
  eqp_ctx *ctx = test_ctx();
  char *t = describe(ctx, "H2PO4-", 310.15, EQP_FORMAT_TEXT);
  assert_contains(t, "H3PO4 \u21cc H+ + H2PO4-   pKa 2.148 at 25 \u00b0C");
  assert_contains(t, "H2PO4- \u21cc H+ + HPO4^2-   pKa 7.198 at 25 \u00b0C, \u0394rH\u00b0 3.6 kJ/mol, "
                     "\u0394rCp\u00b0 -230 J/(K\u00b7mol)");
  char want[64];
  snprintf(want, sizeof want, "at 37 \u00b0C: pKa %.3f (van't Hoff)",
           goldberg_pK(7.198, 3.6, -230, 310.15));
  assert_contains(t, want);
  assert_contains(t, "Goldberg");
  if (strstr(t, "component") || strstr(t, "basis")) fail_msg("speaks of components:\n%s", t);
  eqp_free_string(t);
  /* boric acid is stored as the formation of B(OH)3 from borate; it reads
  ** as the ionization B(OH)3 + H2O = H+ + B(OH)4- with its own dH and dCp */
  cJSON *doc = describe_json(ctx, "B(OH)3", 310.15);
  const cJSON *c = reaction(cJSON_GetArrayItem(at(doc, "entries"), 0),
                            "B(OH)3 + H2O \u21cc H+ + B(OH)4-");
  assert_string_equal(at(c, "constant")->valuestring, "pKa");
  assert_close(num_at(c, "value"), 9.237, 1e-12);
  assert_close(num_at(c, "enthalpy"), 13.8, 1e-12);
  assert_close(num_at(c, "heat_capacity"), -240, 1e-12);
  const cJSON *v = cJSON_GetArrayItem(at(c, "values"), 1);
  assert_close(num_at(v, "temperature"), 37, 1e-9);
  assert_close(num_at(v, "value"), goldberg_pK(9.237, 13.8, -240, 310.15), 1e-9);
  cJSON_Delete(doc);
  eqp_ctx_free(ctx);
}

/* Water: pKw by the IAPWS R11-07 formulation; at 50 C 13.264 in the CRC
** Handbook table "Ionization constant of water" (computed from IAPWS 2007). */
static void test_water(void **state)
{
  eqp_ctx *ctx = test_ctx();
  cJSON *doc = describe_json(ctx, "OH-", 323.15);
  const cJSON *c = reaction(cJSON_GetArrayItem(at(doc, "entries"), 0), "H2O \u21cc H+ + OH-");
  assert_string_equal(at(c, "constant")->valuestring, "pKw");
  assert_string_equal(at(c, "temperature_dependence")->valuestring, "IAPWS R11-07");
  assert_close(num_at(c, "value"), 13.995, 1e-12);
  assert_close(num_at(cJSON_GetArrayItem(at(c, "values"), 1), "value"), 13.264, 0.001);
  cJSON_Delete(doc);
  eqp_ctx_free(ctx);
}

/* Complexes read as formations with log beta. The library's CaCO3(aq) is
** log K 3.224 at 25 C (L. N. Plummer, E. Busenberg, Geochim. Cosmochim. Acta
** 46, 1011 (1982)) [from memory]; what is checked is how it is written. */
static void test_complex_as_formation(void **state)
{
  eqp_ctx *ctx = test_ctx();
  char *d = describe(ctx, "CaCO3(aq)", 298.15, EQP_FORMAT_TEXT);
  assert_contains(d, "Ca^2+ + CO3^2- \u21cc CaCO3(aq)   log \u03b2 3.22");
  eqp_free_string(d);
  /* and under the ion it binds, with the solids it forms */
  d = describe(ctx, "Ca^2+", 298.15, EQP_FORMAT_TEXT);
  assert_contains(d, "\u21cc CaCO3(aq)   log \u03b2 3.22");
  assert_contains(d, "CaCO3(s) \u21cc Ca^2+ + CO3^2-   log Ksp -8.48");
  eqp_free_string(d);
  eqp_ctx_free(ctx);
}

/* Solids with log Ksp, gases with log K_H, and at 37 C from the equations
** of Plummer & Busenberg (1982), T in K:
**   log Ksp(calcite) = -171.9065 - 0.077993 T + 2839.319/T + 71.595 log10 T
**   log K_H = 108.3865 + 0.01985076 T - 6919.53/T - 40.45154 log10 T + 669365/T^2 */
static void test_solid_and_gas(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const double T = 310.15;
  cJSON *doc = describe_json(ctx, "calcite", T);
  const cJSON *e = cJSON_GetArrayItem(at(doc, "entries"), 0);
  assert_string_equal(at(e, "kind")->valuestring, "solid");
  const cJSON *c = reaction(e, "CaCO3(s) \u21cc Ca^2+ + CO3^2-");
  assert_string_equal(at(c, "constant")->valuestring, "log Ksp");
  assert_close(num_at(cJSON_GetArrayItem(at(c, "values"), 1), "value"),
               -171.9065 - 0.077993 * T + 2839.319 / T + 71.595 * log10(T), 1e-9);
  cJSON_Delete(doc);
  doc = describe_json(ctx, "CO2(g)", T);
  e = cJSON_GetArrayItem(at(doc, "entries"), 0);
  assert_string_equal(at(e, "kind")->valuestring, "gas");
  c = reaction(e, "CO2(g) \u21cc CO2");
  assert_string_equal(at(c, "constant")->valuestring, "log K_H");
  assert_close(num_at(c, "value"), -1.468, 1e-12);
  assert_close(num_at(cJSON_GetArrayItem(at(c, "values"), 1), "value"),
               108.3865 + 0.01985076 * T - 6919.53 / T - 40.45154 * log10(T) + 669365 / (T * T),
               1e-9);
  cJSON_Delete(doc);
  eqp_ctx_free(ctx);
}

/* A buffer system shows the step it works on, not the whole ladder. */
static void test_buffer_system(void **state)
{
  eqp_ctx *ctx = test_ctx();
  char *t = describe(ctx, "phosphate", 298.15, EQP_FORMAT_TEXT);
  assert_contains(t, "phosphate: buffer system");
  assert_contains(t, "made from NaH2PO4 (acid form) and Na2HPO4 (base form)");
  assert_contains(t, "H2PO4- \u21cc H+ + HPO4^2-   pKa 7.198");
  if (strstr(t, "PO4^3-")) fail_msg("the third step is not phosphate's buffer step:\n%s", t);
  eqp_free_string(t);
  /* Tris: species, reagent and buffer system under one name; its one step
  ** written once although both its pair and its titrant lead to it */
  cJSON *doc = describe_json(ctx, "Tris", 298.15);
  assert_int_equal(cJSON_GetArraySize(at(doc, "entries")), 3);
  const cJSON *b = cJSON_GetArrayItem(at(doc, "entries"), 2);
  assert_string_equal(at(b, "kind")->valuestring, "buffer_system");
  assert_int_equal(cJSON_GetArraySize(at(b, "reactions")), 1);
  assert_close(num_at(reaction(b, "TrisH+ \u21cc H+ + Tris"), "value"), 8.072, 1e-12);
  cJSON_Delete(doc);
  eqp_ctx_free(ctx);
}

static void test_refusals(void **state)
{
  eqp_ctx *ctx = test_ctx();
  char *out = (char *)"unchanged";
  assert_int_equal(eqp_ctx_describe(ctx, "Unobtainium", 298.15, EQP_FORMAT_TEXT, &out),
                   EQP_E_UNKNOWN);
  assert_null(out);
  assert_contains(eqp_ctx_errmsg(ctx), "'Unobtainium'");
  assert_int_equal(eqp_ctx_describe(ctx, "H2PO4-", 400, EQP_FORMAT_TEXT, &out), EQP_E_INPUT);
  assert_int_equal(eqp_ctx_describe(ctx, NULL, 298.15, EQP_FORMAT_TEXT, &out), EQP_E_ARG);
  eqp_ctx_free(ctx);
}

static int has_string(const cJSON *list, const char *key, const char *value)
{
  const cJSON *e;
  cJSON_ArrayForEach(e, list) {
    const cJSON *v = key ? cJSON_GetObjectItemCaseSensitive(e, key) : e;
    if (cJSON_IsString(v) && strcmp(v->valuestring, value) == 0) return 1;
  }
  return 0;
}

static void test_list(void **state)
{
  eqp_ctx *ctx = test_ctx();
  char *text;
  assert_int_equal(eqp_ctx_list(ctx, EQP_FORMAT_JSON, &text), EQP_OK);
  cJSON *doc = cJSON_Parse(text);
  eqp_free_string(text);
  assert_non_null(doc);
  assert_true(has_string(at(doc, "solids"), "name", "calcite"));
  assert_true(has_string(at(doc, "gases"), "name", "CO2(g)"));
  assert_true(has_string(at(doc, "buffer_systems"), "name", "phosphate"));
  const cJSON *g;
  int found = 0;
  cJSON_ArrayForEach(g, at(doc, "reagents"))
    if (strcmp(at(g, "name")->valuestring, "NaH2PO4") == 0)
      found = has_string(at(g, "aliases"), NULL, "sodium dihydrogen phosphate");
  assert_true(found);
  cJSON_Delete(doc);
  assert_int_equal(eqp_ctx_list(ctx, EQP_FORMAT_TEXT, &text), EQP_OK);
  assert_contains(text, "solids (");
  assert_contains(text, "gases (");
  assert_contains(text, "buffer systems (");
  eqp_free_string(text);
  eqp_ctx_free(ctx);
}

static const cJSON *constant_for(const cJSON *list, const char *eq)
{
  const cJSON *c;
  cJSON_ArrayForEach(c, list)
    if (strcmp(at(c, "equation")->valuestring, eq) == 0) return c;
  return NULL;
}

/* The provenance of a run: every constant its results used, at 25 C and at
** each of the results' temperatures. */
static void test_constants_used(void **state)
{
  eqp_ctx *ctx = test_ctx();
  eqp_result *r[2];
  r[0] = test_solve(ctx, "davies", 310.15, "KH2PO4", "25 mmol", "Na2HPO4", "25 mmol", NULL);
  r[1] = test_solve(ctx, "davies", 298.15, "CaCl2", "1 mmol", "NaHCO3", "2 mmol", NULL);
  char *text = eqp_ctx_constants_to_json(ctx, (const eqp_result *const *)r, 1);
  cJSON *list = cJSON_Parse(text);
  eqp_free_string(text);
  const cJSON *c = constant_for(list, "H2PO4- \u21cc H+ + HPO4^2-");
  assert_non_null(c);
  assert_contains(at(c, "source")->valuestring, "Goldberg");
  assert_int_equal(cJSON_GetArraySize(at(c, "values")), 2);
  const cJSON *v = cJSON_GetArrayItem(at(c, "values"), 1);
  assert_close(num_at(v, "temperature"), 37, 1e-9);
  assert_close(num_at(v, "value"), goldberg_pK(7.198, 3.6, -230, 310.15), 1e-9);
  assert_non_null(constant_for(list, "H2O \u21cc H+ + OH-"));
  assert_null(constant_for(list, "CaCO3(s) \u21cc Ca^2+ + CO3^2-"));   /* no calcium here */
  assert_null(constant_for(list, "CO2(g) \u21cc CO2"));                /* no gas exchange */
  cJSON_Delete(list);
  /* both results: the carbonate steps and the solids with an index */
  text = eqp_ctx_constants_to_json(ctx, (const eqp_result *const *)r, 2);
  list = cJSON_Parse(text);
  eqp_free_string(text);
  assert_non_null(constant_for(list, "HCO3- \u21cc H+ + CO3^2-"));
  assert_non_null(constant_for(list, "CaCO3(s) \u21cc Ca^2+ + CO3^2-"));
  assert_null(constant_for(list, "CO2(g) \u21cc CO2"));
  cJSON_Delete(list);
  eqp_result_free(r[0]);
  eqp_result_free(r[1]);
  /* a solution opened to CO2: its Henry's-law constant joins them */
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1.0;
  o.temperature_K = 298.15;
  o.activity = "davies";
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  double mol;
  assert_int_equal(eqp_solution_expose(s, "CO2(g)", 4.269e-4, &mol), EQP_OK);
  assert_int_equal(eqp_solution_equilibrate(s, &r[0]), EQP_OK);
  text = eqp_ctx_constants_to_json(ctx, (const eqp_result *const *)r, 1);
  list = cJSON_Parse(text);
  eqp_free_string(text);
  assert_non_null(constant_for(list, "CO2(g) \u21cc CO2"));
  cJSON_Delete(list);
  eqp_result_free(r[0]);
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
}

/* The constants a report lists (eqp_ctx_constants): a solid dissolves into
** its ions, a coefficient of 1 left unwritten (common practice; the report
** printed "0Ca^2+"). */
typedef struct seen { char ksp[8][128]; int n; } seen;

static void collect_ksp(void *ud, const eqp_constant *k)
{
  seen *s = ud;
  if (strcmp(k->kind, "log Ksp") == 0 && s->n < 8)
    snprintf(s->ksp[s->n++], sizeof s->ksp[0], "%s", k->equation);
}

static void test_report_constants(void **state)
{
  (void)state;
  eqp_ctx *ctx = test_ctx();
  const char *names[] = {"CaCl2", "NaHCO3"};
  seen s = {.n = 0};
  assert_int_equal(eqp_ctx_constants(ctx, names, 2, collect_ksp, &s), EQP_OK);
  assert_int_equal(s.n, 3);   /* Ca^2+ and OH- are there for portlandite too */
  static const char *const want[3][2] = {
    {"calcite \u21cc Ca^2+ + CO3^2-", "calcite \u21cc CO3^2- + Ca^2+"},
    {"aragonite \u21cc Ca^2+ + CO3^2-", "aragonite \u21cc CO3^2- + Ca^2+"},
    {"portlandite \u21cc Ca^2+ + 2 OH-", "portlandite \u21cc 2 OH- + Ca^2+"}};
  for (int k = 0; k < 3; k++)
    if (strcmp(s.ksp[k], want[k][0]) != 0 && strcmp(s.ksp[k], want[k][1]) != 0)
      fail_msg("'%s' is not '%s'", s.ksp[k], want[k][0]);
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_acid_steps_as_dissociations),
    cmocka_unit_test(test_water),
    cmocka_unit_test(test_complex_as_formation),
    cmocka_unit_test(test_solid_and_gas),
    cmocka_unit_test(test_buffer_system),
    cmocka_unit_test(test_refusals),
    cmocka_unit_test(test_list),
    cmocka_unit_test(test_constants_used),
    cmocka_unit_test(test_report_constants),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
