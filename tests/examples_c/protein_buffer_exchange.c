/* scripts/examples/protein_buffer_exchange.lua in C: two rounds of
** dilute-and-concentrate from Tris into phosphate. */
/* SPDX-License-Identifier: MIT */
#include "example.h"

static double rounds[3], pHs[3], tris[3];
static int ntrack;

static void show(const char *label, eqp_solution *s)
{
  eqp_result *r = equilibrate(s);
  printf("%-28s pH %.3f  Tris %.3f mM  phosphate %.2f mM  I %.3f mol/kg\n", label,
         eqp_result_pH(r), 1e3 * (molarity(r, "Tris") + molarity(r, "TrisH+")),
         1e3 * (molarity(r, "H2PO4-") + molarity(r, "HPO4^2-")), eqp_result_ionic_strength(r));
  eqp_result_free(r);
}

static void track(int round, eqp_solution *s)
{
  eqp_result *r = equilibrate(s);
  rounds[ntrack] = round;
  pHs[ntrack] = eqp_result_pH(r);
  tris[ntrack++] = 1e3 * (molarity(r, "Tris") + molarity(r, "TrisH+"));
  eqp_result_free(r);
}

/* eq.mix{ { a, va }, { b, vb } } (b NULL: one part) */
static eqp_solution *mix(eqp_solution *a, const char *va, eqp_solution *b, const char *vb)
{
  eqp_solution *parts[2] = {a, b};
  double litres[2] = {q(va, EQP_Q_VOLUME), b ? q(vb, EQP_Q_VOLUME) : 0};
  eqp_solution *m;
  check(eqp_solution_mix(b ? 2 : 1, parts, litres, &m), "mix");
  return m;
}

int main(int argc, char **argv)
{
  start(argc, argv);
  int T = 4;   /* cold room */
  eqp_solution *sample = solution("0.5 mL", NULL, CELSIUS(T), "davies");
  add(add(sample, "Tris", "20 mM"), "NaCl", "150 mM");
  double mol, litres;
  check(eqp_solution_adjust_pH(sample, 8.0, "HCl", NULL, &mol, &litres), "adjust_pH");

  eqp_solution *exchange = solution("1 L", NULL, CELSIUS(T), "davies");
  add(add(exchange, "NaH2PO4", "10 mM"), "Na2HPO4", "15 mM");
  eqp_result *r = equilibrate(exchange);
  printf("exchange buffer at %d C: pH %.3f\n", T, eqp_result_pH(r));
  eqp_result_free(r);

  show("start", sample);
  track(0, sample);
  for (int round = 1; round <= 2; round++) {
    eqp_solution *mixed = mix(sample, "0.5 mL", exchange, "4.5 mL");
    eqp_solution *kept = mix(mixed, "0.5 mL", NULL, NULL);
    eqp_solution_free(mixed);
    eqp_solution_free(sample);
    sample = kept;
    char label[32];
    snprintf(label, sizeof label, "after round %d", round);
    show(label, sample);
    track(round, sample);
  }

  /* eq.plot{ file =, title =, x = { label = "round" }, y = { label = "pH" },
  **          lines = { { x = rounds, y = pHs, label = "pH", points = true } },
  **          hlines = { { y = exchange:equilibrate().pH, label = "exchange buffer" } } } */
  r = equilibrate(exchange);
  double hline = eqp_result_pH(r);
  eqp_result_free(r);
  eqp_plot *p;
  check(eqp_plot_new(ctx, &p), "plot");
  int rc = eqp_plot_set_title(p, "Buffer exchange at 4 \u00b0C");
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 0, "round", NULL, NAN, NAN);
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 1, "pH", NULL, NAN, NAN);
  if (rc == EQP_OK) rc = eqp_plot_add_points(p, "pH", (size_t)ntrack, rounds, pHs);
  if (rc == EQP_OK) rc = eqp_plot_add_hline(p, hline, "exchange buffer");
  if (rc == EQP_OK) rc = eqp_plot_set_size(p, 720, 480);
  write_plot(rc, p, "exchange_rounds.svg");
  (void)tris;
  eqp_solution_free(exchange);
  eqp_solution_free(sample);
  finish();
  return 0;
}
