/* scripts/examples/physiological_recipe.lua in C: a phosphate buffer at
** physiological ionic strength from hydrates, re-made from its printed amounts. */
/* SPDX-License-Identifier: MIT */
#include "example.h"

int main(int argc, char **argv)
{
  start(argc, argv);
  const char *using[] = {"NaH2PO4.H2O", "Na2HPO4.7H2O"};
  eqp_recipe_spec rs = EQP_RECIPE_SPEC_INIT;
  rs.buffer = "phosphate";
  rs.reagents = using;
  rs.nreagents = 2;
  rs.pH = 7.40;
  rs.total = q("50 mM", EQP_Q_MOLARITY);
  rs.volume = q("1 L", EQP_Q_VOLUME);
  rs.T = CELSIUS(37);
  rs.ionic_strength = q("0.16 mol/kg", EQP_Q_MOLALITY);
  rs.salt = "NaCl";
  rs.titrant_molar = 1.0;
  eqp_recipe *r;
  check(eqp_recipe_make(ctx, &rs, &r), "recipe");
  printf("%s\n", eqp_recipe_procedure(r));     /* print(procedure) */

  /* re-made from the printed quantities, as the bench would */
  size_t n = eqp_recipe_item_count(r);
  char water[64];
  snprintf(water, sizeof water, "%.6f kg", eqp_recipe_item_at(r, n - 1)->mL * 1e-3 * 0.99333);
  eqp_solution *s = solution(NULL, water, CELSIUS(37), NULL);
  for (size_t i = 0; i < n; i++) {
    const eqp_recipe_item *it = eqp_recipe_item_at(r, i);
    if (it->role != EQP_ROLE_WATER) add(s, it->reagent, it->printed);
  }
  eqp_result *res = equilibrate(s);
  double pH = eqp_result_pH(res);
  printf("re-made from the printed amounts: pH %.4f at 37 C\n", pH);
  if (!(fabs(pH - 7.40) <= 0.005)) die("the printed recipe does not give its pH back");

  const char *buffers[] = {"phosphate"};
  eqp_capacity_spec cap = EQP_CAPACITY_SPEC_INIT;
  cap.buffers = buffers;
  cap.nbuffers = 1;
  cap.total = q("50 mM", EQP_Q_MOLARITY);
  cap.T = CELSIUS(37);
  cap.pH_lo = 5.5;
  cap.pH_hi = 9;
  cap.points = 61;
  cap.window_lo = 7.35;
  cap.window_hi = 7.45;
  eqp_curve *c;
  check(eqp_capacity_sweep(ctx, &cap, &c), "capacity");
  eqp_capacity_spec drawn = EQP_CAPACITY_SPEC_INIT;
  drawn.total = cap.total;
  drawn.T = cap.T;
  drawn.window_lo = cap.window_lo;
  drawn.window_hi = cap.window_hi;
  eqp_plot *p = NULL;
  int rc = eqp_plot_capacity(c, &drawn, &p);
  write_plot(rc, p, "phosphate_capacity.svg");
  eqp_curve_free(c);
  eqp_result_free(res);
  eqp_solution_free(s);
  eqp_recipe_free(r);
  finish();
  return 0;
}
