/* Benchmark: microseconds per equilibrium of a phosphate buffer (Davies),
** successive solves with small additions as in a titration; cold solves;
** and cost against the number of species present. Prints figures only. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/equipoise.h>
#include <stdio.h>
#include <stdlib.h>
#include <math.h>
#include <time.h>

static double now(void)
{
  struct timespec t;
  clock_gettime(CLOCK_MONOTONIC, &t);
  return t.tv_sec + t.tv_nsec * 1e-9;
}

static void die(eqp_ctx *ctx)
{
  fprintf(stderr, "bench: %s\n", eqp_ctx_errmsg(ctx));
  exit(1);
}

static eqp_solution *buffer(eqp_ctx *ctx, int systems)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1.0;
  o.temperature_K = 298.15;
  o.activity = "davies";
  eqp_solution *s;
  if (eqp_solution_new(ctx, &o, &s)) die(ctx);
  if (eqp_solution_add_str(s, "KH2PO4", "25 mmol") || eqp_solution_add_str(s, "Na2HPO4", "25 mmol"))
    die(ctx);
  if (systems > 1 && eqp_solution_add_str(s, "CH3COONa", "10 mmol")) die(ctx);
  if (systems > 2 && eqp_solution_add_str(s, "TrisHCl", "10 mmol")) die(ctx);
  if (systems > 3 && eqp_solution_add_str(s, "KHP", "5 mmol")) die(ctx);
  return s;
}

/* Successive solves, each after adding 1 umol NaOH; returns us per solve. */
static double warm(eqp_ctx *ctx, int systems, int n, double *iters, int *nsp)
{
  eqp_solution *s = buffer(ctx, systems);
  eqp_result *r;
  if (eqp_solution_equilibrate(s, &r)) die(ctx);
  *nsp = (int)eqp_result_species_count(r);
  eqp_result_free(r);
  long it = 0;
  double t0 = now();
  for (int i = 0; i < n; i++) {
    if (eqp_solution_add(s, "NaOH", 1e-6, EQP_Q_AMOUNT) || eqp_solution_equilibrate(s, &r))
      die(ctx);
    it += eqp_result_iterations(r);
    eqp_result_free(r);
  }
  double dt = now() - t0;
  eqp_solution_free(s);
  *iters = (double)it / n;
  return dt / n * 1e6;
}

static double cold(eqp_ctx *ctx, int n)
{
  double t0 = now();
  for (int i = 0; i < n; i++) {
    eqp_solution *s = buffer(ctx, 1);
    eqp_result *r;
    if (eqp_solution_equilibrate(s, &r)) die(ctx);
    eqp_result_free(r);
    eqp_solution_free(s);
  }
  return (now() - t0) / n * 1e6;
}

/* A 1000-point titration of the phosphate buffer with 0.1 mol/kg NaOH. */
static double titration_ms(eqp_ctx *ctx, size_t *rows)
{
  eqp_solution *s = buffer(ctx, 1), *naoh;
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1.0;
  o.temperature_K = 298.15;
  o.activity = "davies";
  if (eqp_solution_new(ctx, &o, &naoh) || eqp_solution_add_str(naoh, "NaOH", "0.1 mol")) die(ctx);
  eqp_titration t = EQP_TITRATION_INIT;
  t.stock = naoh;
  t.step = 0.1e-3;
  t.to = 100e-3;
  t.max_dpH = 10.0;
  eqp_curve *c;
  double t0 = now();
  if (eqp_solution_titrate(s, &t, &c)) die(ctx);
  double ms = (now() - t0) * 1e3;
  *rows = eqp_curve_rows(c);
  eqp_curve_free(c);
  eqp_solution_free(naoh);
  eqp_solution_free(s);
  return ms;
}

int main(int argc, char **argv)
{
  int n = argc > 1 ? atoi(argv[1]) : 20000;
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  if (!ctx || eqp_ctx_load_default_library(ctx)) die(ctx);
  double it;
  int nsp;
  warm(ctx, 1, n / 10, &it, &nsp);   /* warm the caches */
  double us = warm(ctx, 1, n, &it, &nsp);
  printf("phosphate buffer, Davies, successive solves (+1 umol NaOH each): %.2f us/solve, "
         "%.2f Newton iterations/solve, %d species\n", us, it, nsp);
  printf("phosphate buffer, Davies, cold solve (new solution each time): %.2f us/solve\n",
         cold(ctx, n / 10));
  printf("scaling with species count (successive solves):\n");
  for (int k = 1; k <= 4; k++) {
    us = warm(ctx, k, n / 2, &it, &nsp);
    printf("  %2d species  %6.2f us/solve  %.2f iterations\n", nsp, us, it);
  }
  size_t rows;
  titration_ms(ctx, &rows);
  double best = 1e9;
  for (int k = 0; k < 5; k++) best = fmin(best, titration_ms(ctx, &rows));
  printf("titration of the buffer with a NaOH stock, %zu points: %.2f ms (best of 5)\n", rows,
         best);
  eqp_ctx_free(ctx);
  return 0;
}
