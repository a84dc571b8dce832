/* scripts/examples/incubator_air.lua in C: a bicarbonate medium under 5 %
** CO2, then open to room air. */
/* SPDX-License-Identifier: MIT */
#include "example.h"

static double expose(eqp_solution *s, const char *gas, const char *pressure)
{
  double mol;
  check(eqp_solution_expose(s, gas, q(pressure, EQP_Q_PRESSURE), &mol), "expose");
  return mol;
}

int main(int argc, char **argv)
{
  start(argc, argv);
  eqp_solution *medium = solution("500 mL", NULL, CELSIUS(37), "davies");
  add(add(medium, "NaHCO3", "26 mM"), "NaCl", "110 mM");
  eqp_solution *incubator = copy(medium);
  double taken = expose(incubator, "CO2(g)", "0.05 atm");
  eqp_result *r = equilibrate(incubator);
  printf("in the incubator (5 %% CO2, 37 C): pH %.2f, %.2f mmol CO2 taken up\n",
         eqp_result_pH(r), taken * 1e3);

  eqp_solution *bench = copy(incubator);
  check(eqp_solution_set_temperature(bench, CELSIUS(22)), "set_temperature");
  double lost = expose(bench, "CO2(g)", "426.9 uatm");
  eqp_result *rb = equilibrate(bench);
  printf("open on the bench (air, 22 C), at equilibrium: pH %.2f, %.2f mmol CO2 lost\n",
         eqp_result_pH(rb), -lost * 1e3);
  eqp_result_free(rb);
  double beta, per_kg;
  check(eqp_solution_buffer_capacity(incubator, &beta, &per_kg), "buffer capacity");
  printf("buffer capacity in the incubator: %.1f mM per pH unit\n", beta * 1e3);

  double I = eqp_result_ionic_strength(r);
  eqp_curve *c = distribution("NaHCO3", I, CELSIUS(37), 4, 12);
  plot_distribution(c, "NaHCO3", I, CELSIUS(37), "carbonate_distribution.svg");
  eqp_curve_free(c);
  eqp_result_free(r);
  eqp_solution_free(bench);
  eqp_solution_free(incubator);
  eqp_solution_free(medium);
  finish();
  return 0;
}
