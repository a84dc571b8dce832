/* Shared by the C versions of the example experiments (scripts/examples/):
** each program calls the same C API the Lua bindings call, in the same
** order and with the same values, prints what the script prints, draws
** the same figures, and writes every result and curve the engine's
** observer reports as JSON Lines, so that compare.py can check that a C
** program and a Lua script give identical results. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_EXAMPLE_H
#define EQP_EXAMPLE_H

#include <equipoise/equipoise.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static eqp_ctx *ctx;
static FILE *record;      /* the observer's results and curves, one JSON object a line */

static inline void die(const char *what)
{
  fprintf(stderr, "%s: %s\n", what, ctx ? eqp_ctx_errmsg(ctx) : "no context");
  exit(1);
}

static inline void check(int rc, const char *what)
{
  if (rc < 0) die(what);
}

static inline void on_result(void *ud, const eqp_result *r)
{
  (void)ud;
  char *text = eqp_result_to_json(r);
  if (!text) die("result to JSON");
  fprintf(record, "{\"result\":%s}\n", text);
  eqp_free_string(text);
}

static inline void on_curve(void *ud, const eqp_curve *c)
{
  (void)ud;
  char *text = eqp_curve_to_json(c);
  if (!text) die("curve to JSON");
  fprintf(record, "{\"curve\":%s}\n", text);
  eqp_free_string(text);
}

/* The context, its library, and the observer writing to argv[1]. */
static inline void start(int argc, char **argv)
{
  ctx = eqp_ctx_new(NULL, NULL);
  if (!ctx) die("context");
  record = fopen(argc > 1 ? argv[1] : "/dev/null", "w");
  if (!record) die("record file");
  eqp_observer obs = EQP_OBSERVER_INIT;
  obs.on_result = on_result;
  obs.on_curve = on_curve;
  check(eqp_ctx_set_observer(ctx, &obs, NULL), "observer");
  check(eqp_ctx_load_default_library(ctx), "library");
}

static inline void finish(void)
{
  fclose(record);
  eqp_ctx_free(ctx);
}

/* A quantity string ("25 mM", "0.05 atm") in base units, as the bindings read it. */
static inline double q(const char *text, unsigned kinds)
{
  double v;
  eqp_quantity k;
  check(eqp_parse_quantity(ctx, text, kinds, &v, &k), text);
  return v;
}

/* A temperature given in C, as the bindings take it to K; a solution given
** none is at 298.15 K. */
#define CELSIUS(t) ((double)(t) + 273.15)
#define DEFAULT_T 298.15

/* eq.solution{ volume = vol | water = kg, temperature = T, activity = model } */
static inline eqp_solution *solution(const char *vol, const char *water, double T,
                                      const char *model)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.temperature_K = T;
  o.water = water ? q(water, EQP_Q_MASS) : 1.0;
  if (vol) o.water = eqp_water_of_volume(q(vol, EQP_Q_VOLUME), o.temperature_K);
  o.activity = model;
  eqp_solution *s;
  check(eqp_solution_new(ctx, &o, &s), "solution");
  return s;
}

static inline eqp_solution *add(eqp_solution *s, const char *reagent, const char *amount)
{
  check(eqp_solution_add_str(s, reagent, amount), reagent);
  return s;
}

static inline eqp_result *equilibrate(eqp_solution *s)
{
  eqp_result *r;
  check(eqp_solution_equilibrate(s, &r), "equilibrate");
  return r;
}

static inline double molarity(const eqp_result *r, const char *sp)
{
  double v;
  check(eqp_result_molarity(r, sp, &v), sp);
  return v;
}

static inline eqp_solution *copy(const eqp_solution *s)
{
  eqp_solution *c;
  check(eqp_solution_copy(s, &c), "copy");
  return c;
}

/* A figure made (status rc) and written, as curve:plot(file) and eq.plot do. */
static inline void write_plot(int rc, eqp_plot *p, const char *file)
{
  check(rc, file);
  check(eqp_plot_write(p, file), file);
  eqp_plot_free(p);
}

/* curve:plot(file) of a distribution: the figure from what the curve was made of */
static inline void plot_distribution(const eqp_curve *c, const char *system, double I, double T,
                              const char *file)
{
  eqp_distribution_spec d = EQP_DISTRIBUTION_SPEC_INIT;
  d.system = system;
  d.ionic_strength = I;
  d.T = T;
  eqp_plot *p = NULL;
  int rc = eqp_plot_distribution(c, &d, &p);
  write_plot(rc, p, file);
}

/* eq.distribution{ system =, ionic_strength =, temperature =, pH = { lo, hi } } */
static inline eqp_curve *distribution(const char *system, double I, double T, double lo,
                                      double hi)
{
  eqp_distribution_spec d = EQP_DISTRIBUTION_SPEC_INIT;
  d.system = system;
  d.ionic_strength = I;
  d.T = T;
  d.pH_lo = lo;
  d.pH_hi = hi;
  d.points = 281;
  eqp_curve *c;
  check(eqp_distribution(ctx, &d, &c), "distribution");
  return c;
}

/* print(result): its text, then print's newline */
static inline void print_result(const eqp_result *r)
{
  char *text = eqp_result_to_text(r);
  if (!text) die("result to text");
  printf("%s\n", text);
  eqp_free_string(text);
}

#endif
