/* A program built against an installed Equipoise: the pH of the IUPAC
** primary phosphate standard, 0.025 mol/kg KH2PO4 + 0.025 mol/kg Na2HPO4,
** against its published value pH(S) = 6.865 at 25 C (R. P. Buck et al.,
** "Measurement of pH. Definition, standards, and procedures", Pure Appl.
** Chem. 74, 2169 (2002), Table 4). It reads no environment variable: the
** species and the activity model come from beside the installed library,
** wherever the install was moved. Exit 0 when the pH is within 0.02. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/equipoise.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

static int check(eqp_ctx *ctx, int rc, const char *what)
{
  if (rc == EQP_OK) return 0;
  fprintf(stderr, "example: %s: %s (%s)\n", what, eqp_ctx_errmsg(ctx), eqp_status_name(rc));
  return 1;
}

int main(void)
{
  if (strcmp(eqp_version(), EQP_VERSION_STRING) != 0) {
    fprintf(stderr, "example: headers %s, library %s\n", EQP_VERSION_STRING, eqp_version());
    return 1;
  }
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  if (!ctx) return 1;
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;  /* 1 kg of water, 25 C, Davies */
  eqp_solution *s = NULL;
  eqp_result *r = NULL;
  int bad = check(ctx, eqp_ctx_load_default_library(ctx), "species library") ||
            check(ctx, eqp_solution_new(ctx, &o, &s), "solution") ||
            check(ctx, eqp_solution_add_str(s, "KH2PO4", "25 mmol"), "KH2PO4") ||
            check(ctx, eqp_solution_add_str(s, "Na2HPO4", "25 mmol"), "Na2HPO4") ||
            check(ctx, eqp_solution_equilibrate(s, &r), "equilibrium");
  if (!bad) {
    double pH = eqp_result_pH(r);
    printf("equipoise %s: phosphate standard pH %.3f (IUPAC pH(S) 6.865), model %s\n",
           eqp_version(), pH, eqp_result_activity_model(r));
    if (!(fabs(pH - 6.865) <= 0.02)) {
      fprintf(stderr, "example: pH %.4f is not within 0.02 of 6.865\n", pH);
      bad = 1;
    }
  }
  eqp_result_free(r);
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
  return bad;
}
