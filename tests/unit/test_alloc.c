/* Every constructor fails cleanly when the allocator does: no crash, a
** status, and (under the sanitizer build) no leak. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"

typedef struct budget { long left, calls; } budget;

static void *failing_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  budget *b = ud;
  if (nsize == 0) {
    free(ptr);
    return NULL;
  }
  b->calls++;
  if (b->left-- <= 0) return NULL;
  return realloc(ptr, nsize);
}

/* The whole path of an experiment; returns 1 when it got to the end. */
static int scenario(budget *b)
{
  eqp_ctx *ctx = eqp_ctx_new(failing_alloc, b);
  if (!ctx) return 0;
  int done = 0;
  eqp_solution *s = NULL, *c = NULL;
  eqp_result *r = NULL;
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1;
  o.temperature_K = 298.15;
  o.activity = "davies";
  if (eqp_ctx_load_default_library(ctx) == EQP_OK && eqp_solution_new(ctx, &o, &s) == EQP_OK &&
      eqp_solution_add_str(s, "KH2PO4", "25 mmol") == EQP_OK &&
      eqp_solution_add_str(s, "Na2HPO4", "25 mmol") == EQP_OK &&
      eqp_solution_equilibrate(s, &r) == EQP_OK && eqp_solution_copy(s, &c) == EQP_OK) {
    eqp_result_free(r);
    r = NULL;
    if (eqp_solution_add_str(c, "HCl", "1 mmol") == EQP_OK &&
        eqp_solution_equilibrate(c, &r) == EQP_OK)
      done = 1;
  } else {
    /* a failure must say so */
    if (eqp_ctx_errmsg(ctx)[0] == '\0') fail_msg("failure without a message");
  }
  eqp_result_free(r);
  eqp_solution_free(c);
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
  return done;
}

static void test_each_allocation_failing(void **state)
{
  budget b = {1L << 40, 0};
  assert_int_equal(scenario(&b), 1);
  long total = b.calls;
  assert_true(total > 10);
  int tried = 0;
  /* fail the k-th allocation for a spread of k over the whole run */
  for (long k = 0; k < total; k += 1 + k / 40, tried++) {
    budget f = {k, 0};
    scenario(&f);
  }
  printf("  %ld allocations in the scenario, %d failure points tried\n", total, tried);
}

int main(void)
{
  const struct CMUnitTest tests[] = {cmocka_unit_test(test_each_allocation_failing)};
  return cmocka_run_group_tests(tests, NULL, NULL);
}
