/* Shared helpers of the cmocka unit tests. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_TEST_H
#define EQP_TEST_H

#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <setjmp.h>
#include <cmocka.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <equipoise/equipoise.h>

/* cmocka's float assertion casts to float: compare doubles ourselves. */
#define assert_close(got, want, tol) do { double g_ = (got), w_ = (want), t_ = (tol); \
    if (!(fabs(g_ - w_) <= t_)) \
      fail_msg("%s = %.15g, expected %.15g within %.3g (off by %.3g)", #got, g_, w_, t_, \
               g_ - w_); } while (0)
#define assert_rel(got, want, rtol) do { double g_ = (got), w_ = (want), t_ = (rtol); \
    if (!(fabs(g_ - w_) <= t_ * fabs(w_))) \
      fail_msg("%s = %.15g, expected %.15g within relative %.3g (off by %.3g)", #got, g_, \
               w_, t_, (g_ - w_) / w_); } while (0)

#define assert_contains(hay, needle) do { const char *h_ = (hay); \
    if (!h_ || !strstr(h_, (needle))) fail_msg("'%s' does not contain '%s'", h_ ? h_ : "(null)", \
                                               (needle)); } while (0)

static inline eqp_ctx *test_ctx(void)
{
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  assert_non_null(ctx);
  if (eqp_ctx_load_default_library(ctx) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return ctx;
}

/* Solve a solution given as reagent/amount pairs ending in NULL. */
static inline eqp_result *test_solve(eqp_ctx *ctx, const char *model, double T, ...)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1.0;
  o.temperature_K = T;
  o.activity = model;
  eqp_solution *s;
  if (eqp_solution_new(ctx, &o, &s) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  va_list ap;
  va_start(ap, T);
  const char *name;
  while ((name = va_arg(ap, const char *))) {
    const char *amount = va_arg(ap, const char *);
    if (eqp_solution_add_str(s, name, amount) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  }
  va_end(ap);
  eqp_result *r;
  if (eqp_solution_equilibrate(s, &r) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  eqp_solution_free(s);
  return r;
}

static inline double test_m(const eqp_result *r, const char *sp)
{
  double v;
  assert_int_equal(eqp_result_molality(r, sp, &v), EQP_OK);
  return v;
}

#endif
