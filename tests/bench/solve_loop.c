/* N additions of 1 umol NaOH to a phosphate buffer, each followed by an
** equilibrium, in C: the reference for the cost of the same loop through
** Lua (tests/bench/lua_overhead.sh). Usage: solve_loop N */
/* SPDX-License-Identifier: MIT */
#include <equipoise/equipoise.h>
#include <stdio.h>
#include <stdlib.h>

int main(int argc, char **argv)
{
  long n = argc > 1 ? atol(argv[1]) : 20000;
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = "davies";
  eqp_solution *s;
  eqp_result *r;
  if (!ctx || eqp_solution_new(ctx, &o, &s) < 0 ||
      eqp_solution_add_str(s, "KH2PO4", "25 mmol") < 0 ||
      eqp_solution_add_str(s, "Na2HPO4", "25 mmol") < 0 || eqp_solution_equilibrate(s, &r) < 0) {
    fprintf(stderr, "solve_loop: %s\n", ctx ? eqp_ctx_errmsg(ctx) : "out of memory");
    return 1;
  }
  eqp_result_free(r);
  for (long i = 0; i < n; i++) {
    if (eqp_solution_add_str(s, "NaOH", "1 umol") < 0 || eqp_solution_equilibrate(s, &r) < 0) {
      fprintf(stderr, "solve_loop: %s\n", eqp_ctx_errmsg(ctx));
      return 1;
    }
    eqp_result_free(r);
  }
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
  return 0;
}
