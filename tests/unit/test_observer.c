/* The application in C: the context's observer (what it is told, and that
** nothing is kept for it), results copied and written as JSON and text, the
** load budget, the buffer comparison, amounts of a reagent, the scales of a
** dilute solution; and a Lua host that registers an observer on the
** module's context. Sources are named beside each check. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include <cjson/cJSON.h>
#include <lauxlib.h>
#include <lualib.h>

static eqp_ctx *ctx;

/* What the observer was told. */
static struct seen {
  int results, curves, reagents, warnings, cautions;
  char reagent[32][64];
  char caution[8][64];
  char kind[32][32];
  double pH[16];
} seen;

static void on_result(void *ud, const eqp_result *r)
{
  struct seen *s = ud;
  if (s->results < 16) s->pH[s->results] = eqp_result_pH(r);
  s->results++;
}

static void on_curve(void *ud, const eqp_curve *c)
{
  (void)c;
  ((struct seen *)ud)->curves++;
}

static void on_reagent(void *ud, const char *reagent)
{
  struct seen *s = ud;
  if (s->reagents < 32) snprintf(s->reagent[s->reagents], sizeof s->reagent[0], "%s", reagent);
  s->reagents++;
}

static void on_warning(void *ud, const char *kind, const char *text)
{
  struct seen *s = ud;
  (void)text;
  if (s->warnings < 32) snprintf(s->kind[s->warnings], sizeof s->kind[0], "%s", kind);
  s->warnings++;
}

static void on_caution(void *ud, const char *reagent, const char *text)
{
  struct seen *s = ud;
  assert_contains(text, reagent);
  if (s->cautions < 8) snprintf(s->caution[s->cautions], sizeof s->caution[0], "%s", reagent);
  s->cautions++;
}

static int saw_reagent(const char *name)
{
  for (int i = 0; i < seen.reagents && i < 32; i++)
    if (strcmp(seen.reagent[i], name) == 0) return 1;
  return 0;
}

static int setup(void **state)
{
  (void)state;
  ctx = test_ctx();
  eqp_observer obs = EQP_OBSERVER_INIT;
  obs.on_result = on_result;
  obs.on_curve = on_curve;
  obs.on_reagent_used = on_reagent;
  obs.on_warning = on_warning;
  obs.on_caution = on_caution;
  assert_int_equal(eqp_ctx_set_observer(ctx, &obs, &seen), EQP_OK);
  memset(&seen, 0, sizeof seen);
  return 0;
}

static int teardown(void **state)
{
  (void)state;
  eqp_ctx_free(ctx);
  return 0;
}

static eqp_solution *phosphate(void)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = "davies";
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "KH2PO4", "25 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "Na2HPO4", "25 mmol"), EQP_OK);
  return s;
}

/* The caller's results are told, those made inside a titration are not; the
** titration is told as one curve; each reagent as it goes in; a hazardous
** one's caution once. */
static void test_observer_hears_what_is_made(void **state)
{
  (void)state;
  eqp_solution *s = phosphate();
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  assert_int_equal(seen.results, 1);
  assert_close(seen.pH[0], eqp_result_pH(r), 0);
  eqp_result_free(r);
  eqp_titration t = EQP_TITRATION_INIT;
  t.reagent = "NaOH";
  t.step = 1e-3;
  t.to = 10e-3;
  eqp_curve *c;
  assert_int_equal(eqp_solution_titrate(s, &t, &c), EQP_OK);
  assert_true(eqp_curve_rows(c) > 5);
  assert_int_equal(seen.results, 1);       /* the points of the curve are the curve's */
  assert_int_equal(seen.curves, 1);
  eqp_curve_free(c);
  assert_true(saw_reagent("KH2PO4") && saw_reagent("Na2HPO4") && saw_reagent("NaOH"));
  double mol, litres;
  assert_int_equal(eqp_solution_adjust_pH(s, 6.5, "HCl", NULL, &mol, &litres), EQP_OK);
  assert_true(saw_reagent("HCl"));
  /* NaOH and HCl are hazardous (species/strong.lua); each caution once */
  assert_int_equal(seen.cautions, 2);
  assert_string_equal(seen.caution[0], "NaOH");
  assert_string_equal(seen.caution[1], "HCl");
  assert_int_equal(eqp_solution_add_str(s, "NaOH", "1 mmol"), EQP_OK);
  assert_int_equal(seen.cautions, 2);
  eqp_solution_free(s);
}

/* A titration beyond the model's stated range tells its warnings, as a
** pH adjustment does: the gap the command had (docs/activity-models.md
** states Davies for I <= 0.5 mol/kg). */
static void test_warnings_of_titrations_and_adjustments(void **state)
{
  (void)state;
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = "davies";
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "0.8 mol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "CH3COOH", "10 mmol"), EQP_OK);
  eqp_titration t = EQP_TITRATION_INIT;
  t.reagent = "NaOH";
  t.step = 1e-3;
  t.to = 5e-3;
  eqp_curve *c;
  assert_int_equal(eqp_solution_titrate(s, &t, &c), EQP_OK);
  eqp_curve_free(c);
  int n = seen.warnings;
  assert_true(n > 0);
  assert_string_equal(seen.kind[0], "ionic-strength");
  double mol, litres;
  assert_int_equal(eqp_solution_adjust_pH(s, 5.0, "NaOH", NULL, &mol, &litres), EQP_OK);
  assert_true(seen.warnings > n);
  eqp_solution_free(s);
}

/* An observer struct from before the size was set is refused; NULL removes it. */
static void test_observer_size(void **state)
{
  (void)state;
  eqp_observer zero;
  memset(&zero, 0, sizeof zero);
  assert_int_equal(eqp_ctx_set_observer(ctx, &zero, NULL), EQP_E_ARG);
  assert_contains(eqp_ctx_errmsg(ctx), "INIT macro");
  assert_int_equal(eqp_ctx_set_observer(ctx, NULL, NULL), EQP_OK);
  eqp_solution *s = phosphate();
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  assert_int_equal(seen.results, 0);
  eqp_result_free(r);
  eqp_solution_free(s);
}

/* A copy outlives its original; JSON and text say what the accessors say. */
static void test_result_copy_json_text(void **state)
{
  (void)state;
  eqp_solution *s = phosphate();
  assert_int_equal(eqp_solution_add_str(s, "CaCl2", "1 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "NaHCO3", "1 mmol"), EQP_OK);
  eqp_result *r, *c;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
  assert_int_equal(eqp_result_copy(r, &c), EQP_OK);
  double pH = eqp_result_pH(r), I = eqp_result_ionic_strength(r), m;
  size_t ns = eqp_result_species_count(r), nw = eqp_result_warning_count(r);
  assert_int_equal(eqp_result_molality(r, "HPO4^2-", &m), EQP_OK);
  eqp_result_free(r);
  eqp_solution_free(s);
  assert_close(eqp_result_pH(c), pH, 0);
  assert_close(eqp_result_ionic_strength(c), I, 0);
  assert_int_equal(eqp_result_species_count(c), ns);
  assert_int_equal(eqp_result_warning_count(c), nw);
  assert_close(test_m(c, "HPO4^2-"), m, 0);
  char *json = eqp_result_to_json(c);
  cJSON *o = cJSON_Parse(json);
  assert_non_null(o);
  assert_close(cJSON_GetObjectItem(o, "pH")->valuedouble, pH, 0);   /* a double read back whole */
  assert_close(cJSON_GetObjectItem(o, "ionic_strength")->valuedouble, I, 0);
  assert_int_equal(cJSON_GetArraySize(cJSON_GetObjectItem(o, "species")), (int)ns);
  /* calcite's ions are present: it has an index */
  assert_true(cJSON_GetArraySize(cJSON_GetObjectItem(o, "saturation_index")) > 0);
  cJSON_Delete(o);
  eqp_free_string(json);
  char *text = eqp_result_to_text(c);
  char head[64];
  snprintf(head, sizeof head, "pH %.3f ", pH);
  assert_contains(text, head);
  assert_contains(text, "HPO4^2-");
  eqp_free_string(text);
  eqp_result_free(c);
}

/* The acid budget of an acetate buffer, ideal, against the charge balance
** solved by hand: Na+ + H+ = CH3COO- + OH- + Cl-, so the HCl that brings the
** pH to pH0 - w is n = Na + h - C Ka/(Ka + h) - Kw/h per kg of water at
** h = 10^-(pH0 - w) (with n = 0 at pH0; the acid brings no water). pKa 4.756 (Goldberg, Kishore &
** Lennen, J. Phys. Chem. Ref. Data 31, 231 (2002)), pKw 13.995 at 25 C
** (IAPWS R11-07, Bandura & Lvov 2006). */
static void test_load_budget_against_charge_balance(void **state)
{
  (void)state;
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = "ideal";
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "CH3COOH", "10 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "CH3COONa", "10 mmol"), EQP_OK);
  eqp_budget_spec sp = EQP_BUDGET_SPEC_INIT;
  sp.window = 0.2;
  eqp_budget b;
  assert_int_equal(eqp_solution_load_budget(s, &sp, &b), EQP_OK);
  double Ka = pow(10, -4.756), Kw = pow(10, -13.995), C = 0.02, Na = 0.01;
  /* pH0 itself, from the same balance with no Cl- (bisection on h) */
  double lo = 1e-6, hi = 1e-4;
  for (int i = 0; i < 200; i++) {
    double h = sqrt(lo * hi), f = Na + h - C * Ka / (Ka + h) - Kw / h;
    if (f > 0) hi = h;
    else lo = h;
  }
  double pH0 = -log10(sqrt(lo * hi));
  /* the same equations, solved to the engine's 1e-10 on the balances */
  assert_close(b.pH, pH0, 1e-8);
  double h1 = pow(10, -(b.pH - 0.2)), h0 = pow(10, -b.pH);
  double acid = (Na + h1 - C * Ka / (Ka + h1) - Kw / h1) - (Na + h0 - C * Ka / (Ka + h0) - Kw / h0);
  assert_rel(b.acid_mol, acid, 1e-8);
  double h2 = pow(10, -(b.pH + 0.2));
  double base = -((Na + h2 - C * Ka / (Ka + h2) - Kw / h2) - (Na + h0 - C * Ka / (Ka + h0) - Kw / h0));
  assert_rel(b.base_mol, base, 1e-8);
  assert_rel(b.acid_molar, b.acid_mol / eqp_solution_volume(s), 1e-15);
  /* and the same amount of HCl, added, gives pH0 - 0.2 */
  eqp_solution *c;
  eqp_result *r;
  assert_int_equal(eqp_solution_copy(s, &c), EQP_OK);
  assert_int_equal(eqp_solution_add(c, "HCl", b.acid_mol, EQP_Q_AMOUNT), EQP_OK);
  assert_int_equal(eqp_solution_equilibrate(c, &r), EQP_OK);
  assert_close(eqp_result_pH(r), b.pH - 0.2, 1e-8);
  eqp_result_free(r);
  eqp_solution_free(c);
  sp.window = 0;
  assert_int_equal(eqp_solution_load_budget(s, &sp, &b), EQP_E_INPUT);
  eqp_solution_free(s);
}

/* The ranking: possible buffers first by |shift|, each shift that of its
** recipe under the load, re-made here; the text has a line for each. */
static void test_compare_buffers(void **state)
{
  (void)state;
  eqp_recipe_spec rs = EQP_RECIPE_SPEC_INIT;
  rs.pH = 7.2;
  rs.total = 0.05;
  rs.volume = 1;
  rs.T = 298.15;
  rs.ionic_strength = NAN;
  eqp_compare_spec cs = EQP_COMPARE_SPEC_INIT;
  cs.recipe = &rs;
  cs.load = 2e-3;
  eqp_comparison *cmp;
  assert_int_equal(eqp_compare_buffers(ctx, &cs, &cmp), EQP_OK);
  size_t n = eqp_comparison_count(cmp);
  assert_int_equal(n, eqp_ctx_buffer_count(ctx));
  const char *text = eqp_comparison_text(cmp);
  assert_contains(text, "Buffers for pH 7.20 at 25.0 C, 50 mM, load 2 mM HCl");
  int possible = 1;
  double last = 0;
  for (size_t i = 0; i < n; i++) {
    const eqp_candidate *c = eqp_comparison_at(cmp, i);
    assert_contains(text, c->buffer);
    if (!c->possible) {
      possible = 0;
      continue;
    }
    assert_true(possible);                     /* no possible one after an impossible one */
    assert_true(fabs(c->shift) >= last);
    last = fabs(c->shift);
    assert_true(c->shift < 0);                 /* an acid load */
    assert_int_equal(c->within_window, fabs(c->shift) <= 0.1);
  }
  /* the best, made again by recipe and loaded with 2 mmol HCl */
  const eqp_candidate *best = eqp_comparison_at(cmp, 0);
  eqp_recipe_spec one = rs;
  one.buffer = best->buffer;
  eqp_recipe *r;
  assert_int_equal(eqp_recipe_make(ctx, &one, &r), EQP_OK);
  eqp_solution *s;
  eqp_result *res;
  assert_int_equal(eqp_solution_copy(eqp_recipe_solution(r), &s), EQP_OK);
  assert_int_equal(eqp_solution_add(s, "HCl", 2e-3, EQP_Q_AMOUNT), EQP_OK);
  assert_int_equal(eqp_solution_equilibrate(s, &res), EQP_OK);
  assert_close(eqp_result_pH(res) - eqp_recipe_pH(r), best->shift, 1e-12);
  eqp_result_free(res);
  eqp_solution_free(s);
  eqp_recipe_free(r);
  eqp_comparison_free(cmp);
  cs.load = 0;
  assert_int_equal(eqp_compare_buffers(ctx, &cs, &cmp), EQP_E_INPUT);
}

/* Amounts and scales. Na2HPO4 from the IUPAC standard atomic weights (CIAAW
** 2021 abridged: Na 22.990, H 1.0080, P 30.974, O 15.999): 141.957 g/mol.
** Water at 25 C: 0.997047 kg/L (Kell, J. Chem. Eng. Data 20, 97 (1975), his
** table; his equation, which the engine uses, gives it to about 2e-6, so
** within 1e-5 as in test_water.c). */
static void test_amounts_and_scales(void **state)
{
  (void)state;
  double mol;
  assert_int_equal(eqp_ctx_reagent_mol(ctx, "Na2HPO4", 1.42e-3, EQP_Q_MASS, &mol), EQP_OK);
  assert_rel(mol, 1.42 / (2 * 22.990 + 1.0080 + 30.974 + 4 * 15.999), 1e-12);
  assert_int_equal(eqp_ctx_reagent_mol(ctx, "NaOH", 2e-3, EQP_Q_AMOUNT, &mol), EQP_OK);
  assert_close(mol, 2e-3, 0);
  assert_int_equal(eqp_ctx_reagent_mol(ctx, "NaQH", 1e-3, EQP_Q_MASS, &mol), EQP_E_UNKNOWN);
  assert_int_equal(eqp_ctx_reagent_mol(ctx, "NaOH", 1e-3, EQP_Q_VOLUME, &mol), EQP_E_INPUT);
  assert_close(eqp_water_of_volume(1.0, 298.15), 0.997047, 1e-5);
  assert_close(eqp_water_of_volume(0.5, 298.15), 0.5 * 0.997047, 1e-5);
  assert_close(eqp_molal_of_molar(0.15, 298.15), 0.15 / 0.997047, 1e-5);
  eqp_solution *s = phosphate();
  double V = eqp_solution_volume(s);
  assert_int_equal(eqp_solution_dilute_to(s, 0.5 * V), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "water cannot be taken away");
  assert_int_equal(eqp_solution_dilute_to(s, 2 * V), EQP_OK);
  assert_rel(eqp_solution_volume(s), 2 * V, 1e-12);
  eqp_solution_free(s);
}

/* A Lua host registers its observer on the module's context: it hears of
** the script's results, and the module keeps none of them (the engine's
** memory is back where it was once the script drops them). */
static size_t lua_live;

static void *lua_counting(void *ud, void *ptr, size_t osize, size_t nsize)
{
  (void)ud;
  if (nsize == 0) {
    if (ptr) lua_live -= osize;
    free(ptr);
    return NULL;
  }
  void *p = realloc(ptr, nsize);
  if (p) lua_live += nsize - (ptr ? osize : 0);
  return p;
}

static void test_lua_host_observer(void **state)
{
  (void)state;
  lua_State *L = lua_newstate(lua_counting, NULL);
  luaL_openlibs(L);
  luaL_requiref(L, "equipoise", luaopen_equipoise, 1);
  lua_pop(L, 1);
  eqp_ctx *lctx = eqp_lua_context(L);
  assert_non_null(lctx);
  struct seen mine;
  memset(&mine, 0, sizeof mine);
  eqp_observer obs = EQP_OBSERVER_INIT;
  obs.on_result = on_result;
  assert_int_equal(eqp_ctx_set_observer(lctx, &obs, &mine), EQP_OK);
  const char *warm = "s = equipoise.solution{ activity = 'davies' }\n"
                     "s:add('KH2PO4', '25 mmol'):add('Na2HPO4', '25 mmol')\n"
                     "for i = 1, 100 do s:add('NaOH', '1 umol'); s:equilibrate() end\n"
                     "collectgarbage(); collectgarbage()";
  if (luaL_dostring(L, warm)) fail_msg("%s", lua_tostring(L, -1));
  size_t before = lua_live;
  if (luaL_dostring(L, "for i = 1, 2000 do s:add('NaOH', '1 umol'); s:equilibrate() end\n"
                       "collectgarbage(); collectgarbage()"))
    fail_msg("%s", lua_tostring(L, -1));
  assert_int_equal(mine.results, 2100);
  /* a result is about 1 KiB: keeping 2000 would be 2 MB; allow a little slack */
  assert_true(lua_live <= before + 4096);
  lua_close(L);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test_setup_teardown(test_observer_hears_what_is_made, setup, teardown),
    cmocka_unit_test_setup_teardown(test_warnings_of_titrations_and_adjustments, setup, teardown),
    cmocka_unit_test_setup_teardown(test_observer_size, setup, teardown),
    cmocka_unit_test_setup_teardown(test_result_copy_json_text, setup, teardown),
    cmocka_unit_test_setup_teardown(test_load_budget_against_charge_balance, setup, teardown),
    cmocka_unit_test_setup_teardown(test_compare_buffers, setup, teardown),
    cmocka_unit_test_setup_teardown(test_amounts_and_scales, setup, teardown),
    cmocka_unit_test(test_lua_host_observer),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
