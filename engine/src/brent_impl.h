/* Brent's one-dimensional root finder and minimiser (brent.c). */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_BRENT_IMPL_H
#define EQP_BRENT_IMPL_H

/* A scalar function: *fx at x; returns 0, or a negative status (an engine
** error code, passed back unchanged) when it cannot be evaluated. */
typedef int (*eqpi_fn1)(void *ud, double x, double *fx);

/* Statuses of the solvers themselves, beyond the engine's error codes. */
#define EQPI_BRENT_NOBRACKET (-1001)  /* f(a) and f(b) have the same sign */
#define EQPI_BRENT_MAXIT (-1002)      /* *root is the last estimate */
#define EQPI_BRENT_NONFINITE (-1003)  /* f gave NaN or an infinity */

/* A root of f in [a, b], given fa = f(a) and fb = f(b) of opposite signs,
** to an absolute tolerance tol (plus rounding) within maxit evaluations. */
int eqpi_brent_root(eqpi_fn1 f, void *ud, double a, double b, double fa, double fb,
                    double tol, int maxit, double *root);
/* A local minimum of f in [a, b] to a relative tolerance tol; *fmin (if not
** NULL) receives f there. */
int eqpi_brent_min(eqpi_fn1 f, void *ud, double a, double b, double tol, int maxit,
                   double *xmin, double *fmin);

#endif
