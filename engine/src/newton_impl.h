/* The Newton workspace: one KINSOL instance (Newton-Krylov, SPGMR, line
** search) with its vectors, the dense Jacobian and its LU factors, for
** problems of one size. Idle workspaces wait in a small pool of the
** context, so a new solution of the same size does not build KINSOL again. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_NEWTON_IMPL_H
#define EQP_NEWTON_IMPL_H

#include "problem_impl.h"
#include <kinsol/kinsol.h>
#include <nvector/nvector_serial.h>
#include <sundials/sundials_context.h>
#include <sunlinsol/sunlinsol_spgmr.h>

/* A converged point with an ionic strength beyond EQPI_MAX_MOLALITY: a root
** of the model's equations that no solution has (the limiting law, whose
** gamma falls without bound, has one near I = 300 mol/kg made of water's
** own ions). Treated as a failure, so that the fallbacks, which follow the
** branch of the ideal solution, take over. */
#define EQPI_KIN_IMPLAUSIBLE (-100)
#define EQPI_FNORM_TOL 1e-13   /* max-norm of the scaled residual at convergence */

typedef struct eqpi_newton {
  struct eqpi_newton *next;   /* the context's pool */
  eqp_ctx *ctx;
  size_t bytes;
  int n;
  SUNContext sun;
  void *kmem;
  N_Vector u, scale;          /* their data live in this block */
  SUNLinearSolver LS;
  double *J, *Jlu;            /* n x n column-major: the Jacobian, its LU factors */
  double **cols;              /* column pointers of Jlu, for SUNDlsMat_dense* */
  sunindextype *piv;
  double *uj;                 /* where J was made */
  int jac_ok, jac_exact;
  int jv_analytic;            /* KINSOL gets J v from J (else difference quotients) */
  eqpi_problem *P;            /* the problem of the present run */
  char kin_err[256];
  int maxiter;                /* KINSOL's iteration limit as last set */
} eqpi_newton;

/* A workspace for problems of n unknowns, from the pool or new; NULL with
** a message on failure. */
eqpi_newton *eqpi_newton_get(eqp_ctx *ctx, int n);
/* Back to the pool (freed when the pool is full); NULL ok. */
void eqpi_newton_put(eqp_ctx *ctx, eqpi_newton *ws);
void eqpi_newton_pool_free(eqp_ctx *ctx);
/* One KINSOL run on P from u0, at most maxiter iterations: KINSOL's flag,
** or EQPI_KIN_IMPLAUSIBLE; *iters grows by the iterations made. The
** iterate is eqpi_newton_u(ws) whatever the flag. */
int eqpi_newton_run(eqpi_newton *ws, eqpi_problem *P, const double *u0, int maxiter,
                    long *iters);
/* The same with full Newton steps (no line search): for a start already
** inside the region where Newton converges quadratically, where the line
** search would only accept the full step at the cost of its tests. */
int eqpi_newton_run_full(eqpi_newton *ws, eqpi_problem *P, const double *u0, int maxiter,
                         long *iters);
static inline double *eqpi_newton_u(eqpi_newton *ws) { return NV_DATA_S(ws->u); }
/* The Jacobian of P at u and its LU factors. 0, -1 when the model failed,
** -2 when the matrix is singular. */
int eqpi_newton_factor(eqpi_newton *ws, eqpi_problem *P, const double *u);
/* b := J^-1 b with the factors of the last eqpi_newton_factor. */
void eqpi_newton_lu_solve(eqpi_newton *ws, double *b);
/* Kernels for short vectors in v's table of operations (vecops.c); before
** KINSOL or GMRES clone v. */
void eqpi_vec_install(N_Vector v);
/* b := A^-1 b from the factors of SUNDlsMat_denseGETRF (columns a, pivots
** p): SUNDlsMat_denseGETRS's operations in its order (vecops.c). */
void eqpi_dense_getrs(double *const *a, int n, const sunindextype *p, double *b);
/* The name of a KINSOL flag (or of EQPI_KIN_IMPLAUSIBLE). */
const char *eqpi_newton_flag_name(int flag, char *buf, size_t len);

#endif
