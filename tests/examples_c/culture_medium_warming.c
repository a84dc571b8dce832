/* scripts/examples/culture_medium_warming.lua in C: a HEPES saline set at
** 22 C and used at 37 C. */
/* SPDX-License-Identifier: MIT */
#include "example.h"

static eqp_solution *saline(double T)
{
  eqp_solution *s = solution("500 mL", NULL, T, "davies");
  add(add(add(s, "HEPES", "25 mM"), "NaCl", "137 mM"), "KCl", "2.7 mM");
  return s;
}

static double adjust(eqp_solution *s, double pH, const char *reagent)
{
  double mol, litres;
  check(eqp_solution_adjust_pH(s, pH, reagent, NULL, &mol, &litres), "adjust_pH");
  return mol;
}

int main(int argc, char **argv)
{
  start(argc, argv);
  eqp_solution *s = saline(CELSIUS(22));
  double mol = adjust(s, 7.40, "NaOH");
  printf("NaOH to reach pH 7.40 at 22 C: %.2f mmol (%.2f mL of 1 M)\n", mol * 1e3, mol * 1e3);
  check(eqp_solution_set_temperature(s, CELSIUS(37)), "set_temperature");
  eqp_result *warm = equilibrate(s);
  printf("the same solution at 37 C: pH %.3f (shift %+.3f)\n", eqp_result_pH(warm),
         eqp_result_pH(warm) - 7.40);
  eqp_result_free(warm);

  eqp_solution *t = saline(CELSIUS(37));
  double mol37 = adjust(t, 7.40, "NaOH");
  check(eqp_solution_set_temperature(t, CELSIUS(22)), "set_temperature");
  eqp_result *r = equilibrate(t);
  printf("to read 7.40 at 37 C: %.2f mmol NaOH; at 22 C it then reads %.3f\n", mol37 * 1e3,
         eqp_result_pH(r));
  eqp_result_free(r);
  check(eqp_solution_set_temperature(t, CELSIUS(37)), "set_temperature");
  double beta, per_kg;
  check(eqp_solution_buffer_capacity(t, &beta, &per_kg), "buffer capacity");
  printf("buffer capacity at 37 C: %.2f mM per pH unit\n", beta * 1e3);

  /* s:temperature_sweep{ from = 4, to = 40 }: one point per degree */
  double T0 = CELSIUS(4), T1 = CELSIUS(40);
  eqp_curve *c;
  check(eqp_solution_temperature_sweep(s, T0, T1, 0, &c), "temperature sweep");
  const char *y[] = {"pH"};
  eqp_plot *p = NULL;
  int rc = eqp_plot_columns(c, "temperature", y, 1, "pH against temperature", &p);
  write_plot(rc, p, "saline_temperature.svg");
  eqp_curve_free(c);
  eqp_solution_free(t);
  eqp_solution_free(s);
  finish();
  return 0;
}
