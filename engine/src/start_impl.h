/* Starting points for Newton (start.c). */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_START_IMPL_H
#define EQP_START_IMPL_H

#include "problem_impl.h"

/* The free H+ that balances the protons, with every closed acid ladder at
** its own total and ln gamma held at lng (NULL: ideal); other components
** keep their values in u. Writes the unknown components and ln I of u.
** *evals (if not NULL) grows by the evaluations made. 0, or -1 when the
** problem has no H+ mass balance or amounts, or no bracket was found. */
int eqpi_start_proton(eqpi_problem *P, double *u, const double *lng, int *evals);
/* The ideal problem (unit activity coefficients) from u by damped Newton
** on its convex potential; u receives the unknowns and the ideal ln I.
** work holds 2 nx * nx + n doubles and cols nx pointers. *iters (if not
** NULL) grows by the Newton iterations. 0, or -1 if it did not reach 1e-9
** (u is then the best point found). */
int eqpi_start_ideal(eqpi_problem *P, double *u, double *work, double **cols, int *iters);

#endif
