/* scripts/examples/demo.lua in C: the harvest-wash buffer and a 2 mmol acid spill. */
/* SPDX-License-Identifier: MIT */
#include "example.h"

int main(int argc, char **argv)
{
  start(argc, argv);
  static const char *const recipes[2][3] = {
    {"wash buffer, 50 mM", "20 mmol", "30 mmol"},
    {"wash buffer, 10 mM", "4 mmol", "6 mmol"},
  };
  printf("%-20s %8s %12s %12s %12s\n", "recipe", "pH", "I (mol/kg)", "H2PO4- (mM)",
         "HPO4^2- (mM)");
  for (int i = 0; i < 2; i++) {
    eqp_solution *s = solution(NULL, "1 kg", CELSIUS(25), "davies");
    add(s, "KH2PO4", recipes[i][1]);
    add(s, "Na2HPO4", recipes[i][2]);
    eqp_result *r = equilibrate(s);
    printf("%-20s %8.3f %12.4f %12.3f %12.3f\n", recipes[i][0], eqp_result_pH(r),
           eqp_result_ionic_strength(r), molarity(r, "H2PO4-") * 1e3,
           molarity(r, "HPO4^2-") * 1e3);
    eqp_solution *spill = copy(s);
    add(spill, "HCl", "2 mmol");
    eqp_result *r2 = equilibrate(spill);
    printf("%-20s %8.3f   (pH moved by %+.3f)\n", "  after 2 mmol HCl", eqp_result_pH(r2),
           eqp_result_pH(r2) - eqp_result_pH(r));
    eqp_result_free(r2);
    eqp_result_free(r);
    eqp_solution_free(spill);
    eqp_solution_free(s);
  }
  printf("\n");
  printf("Full speciation of the 50 mM wash buffer:\n");
  eqp_solution *s = solution(NULL, "1 kg", DEFAULT_T, "davies");
  add(add(s, "KH2PO4", "20 mmol"), "Na2HPO4", "30 mmol");
  eqp_result *r = equilibrate(s);
  print_result(r);
  eqp_result_free(r);
  r = equilibrate(s);
  double I = eqp_result_ionic_strength(r);
  eqp_result_free(r);
  eqp_curve *c = distribution("phosphate", I, 298.15, 4, 10);
  plot_distribution(c, "phosphate", I, 298.15, "phosphate_distribution.svg");
  eqp_curve_free(c);
  eqp_solution_free(s);
  finish();
  return 0;
}
