/* scripts/examples/temperature_models.lua in C: one Tris buffer at 25, 4 and
** 37 C under four activity models, with each model's warnings. */
/* SPDX-License-Identifier: MIT */
#include "example.h"

static eqp_solution *tris_buffer(const char *model)
{
  eqp_solution *s = solution("1 L", NULL, CELSIUS(25), model);
  add(s, "Tris", "6.057 g");          /* 50 mmol Tris base */
  add(s, "TrisHCl", "3.940 g");       /* 25 mmol Tris hydrochloride */
  add(s, "NaCl", "100 mmol");
  return s;
}

int main(int argc, char **argv)
{
  start(argc, argv);
  static const char *const models[] = {"dh-extended", "davies", "bdot", "sit"};
  static const int temps[] = {25, 4, 37};
  printf("%-12s %8s %8s %8s   (pH at each temperature)\n", "model", "25 C", "4 C", "37 C");
  for (int m = 0; m < 4; m++) {
    eqp_solution *s = tris_buffer(models[m]);
    char row[256], notes[16][512];
    int nnotes = 0;
    snprintf(row, sizeof row, "%-12s", models[m]);
    for (int k = 0; k < 3; k++) {
      check(eqp_solution_set_temperature(s, CELSIUS(temps[k])), "set_temperature");
      eqp_result *r = equilibrate(s);
      snprintf(row + strlen(row), sizeof row - strlen(row), " %8.3f", eqp_result_pH(r));
      for (size_t w = 0; w < eqp_result_warning_count(r); w++) {
        int seen = 0;    /* a set, as the script's table of warnings */
        for (int i = 0; i < nnotes; i++) seen |= strcmp(notes[i], eqp_result_warning(r, w)) == 0;
        if (!seen && nnotes < 16)
          snprintf(notes[nnotes++], sizeof notes[0], "%s", eqp_result_warning(r, w));
      }
      eqp_result_free(r);
    }
    printf("%s\n", row);
    for (int i = 0; i < nnotes; i++) printf("    note: %s\n", notes[i]);
    eqp_solution_free(s);
  }

  /* pH against temperature under each model, 4 to 37 C */
  eqp_plot *p;
  check(eqp_plot_new(ctx, &p), "plot");
  int rc = eqp_plot_set_title(p, "Tris buffer against temperature");
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 0, "temperature", "\u00b0C", NAN, NAN);
  if (rc == EQP_OK) rc = eqp_plot_set_axis(p, 1, "pH", NULL, NAN, NAN);
  for (int m = 0; m < 4 && rc == EQP_OK; m++) {
    eqp_solution *s = tris_buffer(models[m]);
    double T0 = CELSIUS(4), T1 = CELSIUS(37);
    eqp_curve *c;
    check(eqp_solution_temperature_sweep(s, T0, T1, 0, &c), "temperature sweep");
    double T[64], pH[64];
    size_t n = eqp_curve_rows(c);
    for (size_t i = 0; i < n && i < 64; i++) {
      T[i] = eqp_curve_value(c, i, 0);
      pH[i] = eqp_curve_value(c, i, 1);
    }
    rc = eqp_plot_add_line(p, models[m], n, T, pH);
    eqp_curve_free(c);
    eqp_solution_free(s);
  }
  if (rc == EQP_OK) rc = eqp_plot_set_size(p, 720, 480);
  write_plot(rc, p, "tris_temperature.svg");

  printf("\n");
  printf("Tris loses about 0.03 pH per degree warming: adjust the pH at the\n");
  printf("temperature of use, and confirm it there with a calibrated meter.\n");
  finish();
  return 0;
}
