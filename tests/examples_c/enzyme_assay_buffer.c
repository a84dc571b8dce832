/* scripts/examples/enzyme_assay_buffer.lua in C: buffers ranked under an
** acid load, the best one's load budget, capacity against pH. */
/* SPDX-License-Identifier: MIT */
#include "example.h"

int main(int argc, char **argv)
{
  start(argc, argv);
  /* eq.compare_buffers{ pH = 7.2, temperature = 30, total = "100 mM", volume = "1 L",
  **                     load = "2 mM", load_with = "HCl", window = 0.05 } */
  eqp_recipe_spec rs = EQP_RECIPE_SPEC_INIT;
  rs.pH = 7.2;
  rs.total = q("100 mM", EQP_Q_MOLARITY);
  rs.volume = q("1 L", EQP_Q_VOLUME);
  rs.T = CELSIUS(30);
  rs.ionic_strength = NAN;
  rs.titrant_molar = 1.0;
  eqp_compare_spec cs = EQP_COMPARE_SPEC_INIT;
  cs.recipe = &rs;
  cs.load = q("2 mM", EQP_Q_MOLARITY);
  cs.load_with = "HCl";
  cs.window = 0.05;
  eqp_comparison *ranked;
  check(eqp_compare_buffers(ctx, &cs, &ranked), "compare buffers");
  fputs(eqp_comparison_text(ranked), stdout);
  printf("\n");
  const eqp_candidate *best = eqp_comparison_at(ranked, 0);
  printf("best: %s (pH moves %+.3f under the load)\n", best->buffer, best->shift);

  /* the chosen buffer's own budget */
  eqp_recipe_spec one = rs;
  one.buffer = best->buffer;
  eqp_recipe *r;
  check(eqp_recipe_make(ctx, &one, &r), "recipe");
  eqp_solution *s = copy(eqp_recipe_solution(r));
  eqp_budget_spec bs = EQP_BUDGET_SPEC_INIT;
  bs.window = 0.05;
  eqp_budget b;
  check(eqp_solution_load_budget(s, &bs, &b), "load budget");
  printf("%s budget within +-0.05: %.2f mM acid, %.2f mM base\n", best->buffer,
         b.acid_molar * 1e3, b.base_molar * 1e3);

  /* capacity against pH of the four best candidates, the window shaded */
  const char *names[4];
  size_t n = 0;
  for (size_t i = 0; i < eqp_comparison_count(ranked) && n < 4; i++)
    if (eqp_comparison_at(ranked, i)->possible) names[n++] = eqp_comparison_at(ranked, i)->buffer;
  eqp_capacity_spec cap = EQP_CAPACITY_SPEC_INIT;
  cap.buffers = names;
  cap.nbuffers = n;
  cap.total = q("100 mM", EQP_Q_MOLARITY);
  cap.T = CELSIUS(30);
  cap.pH_lo = 5.5;
  cap.pH_hi = 9.5;
  cap.points = 61;
  cap.window_lo = 7.15;
  cap.window_hi = 7.25;
  eqp_curve *c;
  check(eqp_capacity_sweep(ctx, &cap, &c), "capacity");
  eqp_capacity_spec drawn = EQP_CAPACITY_SPEC_INIT;   /* what curve:plot knows of it */
  drawn.total = cap.total;
  drawn.T = cap.T;
  drawn.window_lo = cap.window_lo;
  drawn.window_hi = cap.window_hi;
  eqp_plot *p = NULL;
  int rc = eqp_plot_capacity(c, &drawn, &p);
  write_plot(rc, p, "assay_capacity.svg");
  eqp_curve_free(c);
  eqp_solution_free(s);
  eqp_recipe_free(r);
  eqp_comparison_free(ranked);
  finish();
  return 0;
}
