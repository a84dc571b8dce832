/* The reference for the solver benchmarks: a hand-coded dense Newton for
** the phosphate buffer (Davies), the floor the engine is measured against. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_BENCH_REFERENCE_H
#define EQP_BENCH_REFERENCE_H

#include <equipoise/equipoise.h>

/* Species H+, OH-, PO4^3-, HPO4^2-, H2PO4-, H3PO4 over the components H+
** and PO4^3-; Na+ and K+ are spectators. Unknowns: ln m(H+), ln m(PO4^3-)
** and ln I, the engine's own unknowns. */
typedef struct ref_buffer {
  double lnK[6];          /* natural log of the formation constants */
  double TH, TP, TNa, TK; /* totals, mol/kg */
  double A, c;            /* Davies A (log10 basis) and its linear coefficient */
  double x[3];            /* ln m(H+), ln m(PO4^3-), ln I */
  double m[6];            /* molalities of the six species at x */
  long iterations;        /* Newton iterations, all solves */
} ref_buffer;

/* Take the constants from a solved engine result of the same buffer, so
** that both solve the same equations (K_i from the species' activities);
** the totals and the start from the same result. Returns 0 or -1. */
int ref_init(ref_buffer *b, const eqp_result *r, double TH, double TP, double TNa, double TK);
/* Newton from the present x to a scaled residual of at most tol: 3 x 3
** analytic Jacobian, Gaussian elimination with partial pivoting. Returns
** the iterations, or -1 without convergence in 50. */
int ref_solve(ref_buffer *b, double tol);
double ref_pH(const ref_buffer *b);

#endif
