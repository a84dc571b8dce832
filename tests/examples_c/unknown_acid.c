/* scripts/examples/unknown_acid.lua in C: a titration of an acid sample. */
/* SPDX-License-Identifier: MIT */
#include "example.h"

int main(int argc, char **argv)
{
  start(argc, argv);
  eqp_solution *sample = solution("50 mL", NULL, DEFAULT_T, "davies");
  add(sample, "CH3COOH", "0.85 mmol");
  eqp_solution *naoh = solution("1 L", NULL, DEFAULT_T, "davies");
  add(naoh, "NaOH", "0.1 mol");
  /* sample:titrate{ with = naoh, step = "0.25 mL", to = "15 mL", species = { "CH3COO-" } } */
  const char *species[] = {"CH3COO-"};
  eqp_titration t = EQP_TITRATION_INIT;
  t.stock = naoh;
  t.step = q("0.25 mL", EQP_Q_VOLUME);
  t.to = q("15 mL", EQP_Q_VOLUME);
  t.species = species;
  t.nspecies = 1;
  eqp_curve *curve;
  check(eqp_solution_titrate(sample, &t, &curve), "titrate");
  printf("%d points\n", (int)eqp_curve_rows(curve));
  double amount, volume, pH;
  check(eqp_curve_equivalence(curve, 0, &amount, &volume, &pH), "equivalence point");
  double acid_mmol = volume * 0.1 * 1e3;
  printf("equivalence at %.3f mL, pH %.2f\n", volume * 1e3, pH);
  printf("acid in the sample: %.4f mmol, %.1f mM in the 10 mL taken\n", acid_mmol,
         acid_mmol / 10 * 1e3);
  check(eqp_curve_save_csv(curve, "curve.csv"), "curve.csv");
  for (size_t i = 0; i < eqp_curve_rows(curve); i++) {
    double v = eqp_curve_value(curve, i, 1), rowpH = eqp_curve_value(curve, i, 3);
    if (v >= volume / 2) {
      printf("half-equivalence (%.3f mL): pH %.3f\n", v * 1e3, rowpH);
      break;
    }
  }
  eqp_plot *p = NULL;
  int rc = eqp_plot_titration(curve, NULL, &p);
  write_plot(rc, p, "titration.svg");
  eqp_curve_free(curve);
  eqp_solution_free(naoh);
  eqp_solution_free(sample);
  finish();
  return 0;
}
