/* The API around the chemistry: the log callback, the run-time version,
** options that carry their own size. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"

typedef struct seen { int lines, trace, worst; char last[256]; } seen;

static void collect(void *ud, int level, const char *msg)
{
  seen *s = ud;
  s->lines++;
  if (level == EQP_LOG_TRACE) s->trace++;
  if (level > s->worst) s->worst = level;
  snprintf(s->last, sizeof s->last, "%s", msg);
  assert_null(strchr(msg, '\n'));     /* one line, without its newline */
}

static void solve_buffer(eqp_ctx *ctx)
{
  eqp_result *r = test_solve(ctx, "davies", 298.15, "KH2PO4", "25 mmol", "Na2HPO4", "25 mmol",
                             NULL);
  eqp_result_free(r);
}

/* The solver's trace reaches the callback only at EQP_LOG_TRACE, and
** nothing is logged before a callback is set or after it is removed. */
static void test_log_levels(void **state)
{
  eqp_ctx *ctx = test_ctx();
  seen s = {0};
  solve_buffer(ctx);                                   /* no callback: nothing */
  eqp_ctx_set_log(ctx, collect, &s, EQP_LOG_DEBUG);
  solve_buffer(ctx);
  assert_int_equal(s.trace, 0);
  eqp_ctx_set_log(ctx, collect, &s, EQP_LOG_TRACE);
  solve_buffer(ctx);
  assert_true(s.trace > 0);
  assert_int_equal(s.worst, EQP_LOG_TRACE);
  int before = s.lines;
  eqp_ctx_set_log(ctx, NULL, &s, EQP_LOG_TRACE);
  solve_buffer(ctx);
  assert_int_equal(s.lines, before);
  assert_string_equal(eqp_log_level_name(EQP_LOG_WARN), "warn");
  assert_string_equal(eqp_log_level_name(EQP_LOG_TRACE), "trace");
  assert_string_equal(eqp_log_level_name(0), "?");
  eqp_ctx_free(ctx);
}

/* The library that runs says which version it is: here the one these
** headers belong to. */
static void test_version(void **state)
{
  assert_string_equal(eqp_version(), EQP_VERSION_STRING);
  assert_int_equal(eqp_version_number(), EQP_VERSION_NUMBER);
  char packed[32];
  snprintf(packed, sizeof packed, "%d.%d.%d", eqp_version_number() / 10000,
           eqp_version_number() / 100 % 100, eqp_version_number() % 100);
  assert_string_equal(packed, eqp_version());
}

/* An option struct set to {0} is refused instead of read as zeros (a
** titration to pH 0); one from newer headers than the library is refused;
** the INIT macros' defaults work as documented. */
static void test_option_sizes(void **state)
{
  eqp_ctx *ctx = test_ctx();
  eqp_solution_opts zero_opts = {0};
  eqp_solution *s = NULL;
  assert_int_equal(eqp_solution_new(ctx, &zero_opts, &s), EQP_E_ARG);
  assert_contains(eqp_ctx_errmsg(ctx), "eqp_solution_opts: size 0: start from its INIT macro");
  assert_null(s);
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;   /* 1 kg of water at 25 C, davies */
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_close(eqp_solution_water(s), 1.0, 0);
  assert_close(eqp_solution_temperature_K(s), 298.15, 0);
  assert_int_equal(eqp_solution_add_str(s, "KH2PO4", "5 mmol"), EQP_OK);

  eqp_titration zero_t = {0};
  eqp_curve *c = NULL;
  assert_int_equal(eqp_solution_titrate(s, &zero_t, &c), EQP_E_ARG);
  assert_contains(eqp_ctx_errmsg(ctx), "eqp_titration: size 0");
  /* a program built with headers newer than this library: its new member
  ** would be ignored, so the call is refused */
  struct { eqp_titration t; double newer; } big = {EQP_TITRATION_INIT, 1.0};
  big.t.size = sizeof big;
  big.t.reagent = "NaOH";
  big.t.step = 0.5e-3;
  big.t.to = 5e-3;
  assert_int_equal(eqp_solution_titrate(s, &big.t, &c), EQP_E_ARG);
  assert_contains(eqp_ctx_errmsg(ctx), "newer headers");
  eqp_titration small = big.t;
  small.size = offsetof(eqp_titration, species);   /* smaller than any published */
  assert_int_equal(eqp_solution_titrate(s, &small, &c), EQP_E_ARG);
  assert_contains(eqp_ctx_errmsg(ctx), "smaller than the first published");

  /* INIT: no pH stop (until_pH NaN, where 0 would stop at pH 0), steps of at
  ** most 0.1 pH; 5 mmol NaOH into 5 mmol KH2PO4 runs to the end */
  eqp_titration t = EQP_TITRATION_INIT;
  assert_true(isnan(t.until_pH));
  t.reagent = "NaOH";
  t.step = 0.5e-3;
  t.to = 5e-3;
  assert_int_equal(eqp_solution_titrate(s, &t, &c), EQP_OK);
  size_t last = eqp_curve_rows(c) - 1;
  assert_close(eqp_curve_value(c, last, 0), 5e-3, 1e-12);
  for (size_t i = 1; i <= last; i++)
    assert_true(fabs(eqp_curve_value(c, i, 3) - eqp_curve_value(c, i - 1, 3)) <= 2 * 0.1);
  eqp_curve_free(c);
  eqp_solution_free(s);

  eqp_distribution_spec d = EQP_DISTRIBUTION_SPEC_INIT;   /* pH 0 .. 14 in 281 points */
  d.system = "phosphate";
  assert_int_equal(eqp_distribution(ctx, &d, &c), EQP_OK);
  assert_int_equal(eqp_curve_rows(c), 281);
  assert_close(eqp_curve_value(c, 280, 0), 14, 1e-12);
  eqp_curve_free(c);
  eqp_distribution_spec zero_d = {0};
  assert_int_equal(eqp_distribution(ctx, &zero_d, &c), EQP_E_ARG);
  eqp_capacity_spec zero_c = {0};
  assert_int_equal(eqp_capacity_sweep(ctx, &zero_c, &c), EQP_E_ARG);
  eqp_recipe_spec zero_r = {0};
  eqp_recipe *r = NULL;
  assert_int_equal(eqp_recipe_make(ctx, &zero_r, &r), EQP_E_ARG);
  assert_null(r);
  eqp_recipe_spec nopH = EQP_RECIPE_SPEC_INIT;           /* the pH must be given */
  nopH.buffer = "phosphate";
  nopH.total = 0.05;
  assert_int_equal(eqp_recipe_make(ctx, &nopH, &r), EQP_E_INPUT);
  eqp_ctx_free(ctx);
}

/* The environment is read only by eqp_ctx_default_config: a context that
** never calls it finds the library's own species and plugins and ignores
** EQUIPOISE_SPECIES_PATH and EQUIPOISE_PLUGIN_PATH. */
static void test_default_config(void **state)
{
  const char *fixtures = getenv("EQP_FIXTURE_DIR");
  assert_non_null(fixtures);
  char *saved = getenv("EQUIPOISE_SPECIES_PATH") ? strdup(getenv("EQUIPOISE_SPECIES_PATH")) : NULL;
  setenv("EQUIPOISE_SPECIES_PATH", "/nonexistent/equipoise-species", 1);
  setenv("EQUIPOISE_PLUGIN_PATH", fixtures, 1);

  eqp_ctx *plain = eqp_ctx_new(NULL, NULL);
  assert_int_equal(eqp_ctx_load_default_library(plain), EQP_OK);   /* beside the library */
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = "abi_1_0";                                          /* a fixture plugin */
  eqp_solution *s = NULL;
  assert_int_equal(eqp_solution_new(plain, &o, &s), EQP_E_PLUGIN);
  assert_contains(eqp_ctx_errmsg(plain), "not found");
  o.activity = "davies";                                           /* the library's own */
  assert_int_equal(eqp_solution_new(plain, &o, &s), EQP_OK);
  eqp_solution_free(s);
  eqp_ctx_free(plain);

  eqp_ctx *env = eqp_ctx_new(NULL, NULL);
  assert_int_equal(eqp_ctx_default_config(env), EQP_OK);
  assert_int_equal(eqp_ctx_load_default_library(env), EQP_E_IO);
  assert_contains(eqp_ctx_errmsg(env), "EQUIPOISE_SPECIES_PATH: '/nonexistent/equipoise-species'");
  eqp_ctx_free(env);

  if (saved) setenv("EQUIPOISE_SPECIES_PATH", saved, 1);
  else unsetenv("EQUIPOISE_SPECIES_PATH");
  free(saved);
  env = eqp_ctx_new(NULL, NULL);
  assert_int_equal(eqp_ctx_default_config(env), EQP_OK);
  o.activity = "abi_1_0";
  assert_int_equal(eqp_solution_new(env, &o, &s), EQP_OK);         /* on EQUIPOISE_PLUGIN_PATH */
  eqp_solution_free(s);
  eqp_ctx_free(env);
  unsetenv("EQUIPOISE_PLUGIN_PATH");
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_log_levels),
    cmocka_unit_test(test_version),
    cmocka_unit_test(test_option_sizes),
    cmocka_unit_test(test_default_config),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
