/* The Newton workspace: KINSOL (Newton-Krylov: GMRES with right
** preconditioning and a line search) on an equilibrium problem. The
** preconditioner is the problem's Jacobian itself, factored densely by
** SUNDIALS's LU; where the activity model gives derivatives that matrix is
** exact, KINSOL's Jacobian-vector products come from it, and GMRES
** converges in one iteration. */
/* SPDX-License-Identifier: MIT */
#include "newton_impl.h"
#include <kinsol/kinsol_ls.h>
#include <sundials/sundials_dense.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define POOL_MAX 8

const char *eqpi_newton_flag_name(int flag, char *buf, size_t len)
{
  /* KINGetReturnFlagName says "NONE" for these (SUNDIALS 6.4) */
  static const char *const late[] = {"KIN_SYSFUNC_FAIL", "KIN_FIRST_SYSFUNC_ERR",
                                     "KIN_REPTD_SYSFUNC_ERR", "KIN_VECTOROP_ERR",
                                     "KIN_CONTEXT_ERR"};
  if (flag == EQPI_KIN_IMPLAUSIBLE) return "an ionic strength beyond 100 mol/kg";
  if (flag <= KIN_SYSFUNC_FAIL && flag >= KIN_CONTEXT_ERR) return late[KIN_SYSFUNC_FAIL - flag];
  char *s = KINGetReturnFlagName(flag);   /* malloc'd by SUNDIALS */
  snprintf(buf, len, "%s", s ? s : "KIN_UNKNOWN_FLAG");
  free(s);
  return buf;
}

/* ------------------------------------------------------------ KINSOL hooks */

static int kin_f(N_Vector uu, N_Vector fval, void *ud)
{
  eqpi_newton *ws = ud;
  eqpi_problem *P = ws->P;
  double *F = NV_DATA_S(fval);
  const double *u = NV_DATA_S(uu);
  int rc;
  if (P->at_ok && eqpi_vsame(P->u_at, u, ws->n)) {
    eqpi_vcopy(F, P->F, ws->n);   /* the start, evaluated already */
    rc = 0;
  } else {
    rc = eqpi_problem_eval(P, u, F);
  }
  if (rc == 0)   /* keep NaN out of KINSOL: a non-finite residual is unrecoverable */
    for (int k = 0; k < ws->n; k++)
      if (!isfinite(F[k])) return -1;
  return rc < 0 ? -1 : 0;
}

static int kin_psetup(N_Vector uu, N_Vector uscale, N_Vector fval, N_Vector fscale, void *ud)
{
  eqpi_newton *ws = ud;
  return eqpi_newton_factor(ws, ws->P, NV_DATA_S(uu)) < 0 ? 1 : 0;
}

static int kin_psolve(N_Vector uu, N_Vector uscale, N_Vector fval, N_Vector fscale,
                      N_Vector vv, void *ud)
{
  eqpi_newton_lu_solve(ud, NV_DATA_S(vv));
  return 0;
}

/* J v from the analytic Jacobian made at this iterate by the setup. */
static int kin_jtimes(N_Vector v, N_Vector Jv, N_Vector uu, sunbooleantype *new_uu, void *ud)
{
  eqpi_newton *ws = ud;
  const int n = ws->n;
  const double *x = NV_DATA_S(v), *u = NV_DATA_S(uu);
  double *y = NV_DATA_S(Jv);
  if (!ws->jac_ok || !eqpi_vsame(ws->uj, u, n))
    if (eqpi_newton_factor(ws, ws->P, u) == -1) return -1;
  *new_uu = SUNFALSE;
  memset(y, 0, sizeof(double) * (size_t)n);
  for (int l = 0; l < n; l++) {
    const double *c = ws->J + (size_t)l * n, xl = x[l];
    if (xl != 0)
      for (int k = 0; k < n; k++) y[k] += c[k] * xl;
  }
  return 0;
}

static void kin_err(int code, const char *module, const char *function, char *msg, void *ud)
{
  eqpi_newton *ws = ud;
  snprintf(ws->kin_err, sizeof ws->kin_err, "%s: %s", function, msg);
}

/* ------------------------------------------------------------ workspace */

static void kinsol_free(eqpi_newton *ws)
{
  if (ws->kmem) KINFree(&ws->kmem);
  if (ws->LS) SUNLinSolFree(ws->LS);
  if (ws->u) N_VDestroy(ws->u);
  if (ws->scale) N_VDestroy(ws->scale);
  if (ws->sun) SUNContext_Free(&ws->sun);
}

/* Order matters to KINSOL 6.4: create, user data and error handler, init,
** then the linear solver and its hooks, then the other settings. */
static int kinsol_setup(eqpi_newton *ws, double *udata, double *sdata)
{
  const sunindextype n = ws->n;
  if (SUNContext_Create(NULL, &ws->sun) != 0) return -1;
  ws->u = N_VMake_Serial(n, udata, ws->sun);
  ws->scale = N_VMake_Serial(n, sdata, ws->sun);
  ws->kmem = KINCreate(ws->sun);
  if (!ws->u || !ws->scale || !ws->kmem) return -1;
  eqpi_vec_install(ws->u);      /* before KINSOL and GMRES clone u */
  eqpi_vec_install(ws->scale);
  N_VConst(1.0, ws->scale);
  if (KINSetUserData(ws->kmem, ws) || KINSetErrHandlerFn(ws->kmem, kin_err, ws) ||
      KINInit(ws->kmem, kin_f, ws->u))
    return -1;
  /* With the exact Jacobian as preconditioner GMRES needs one iteration;
  ** a Krylov space of two, restarted up to n times, leaves room for a
  ** model without derivatives (preconditioner and J v then differ by the
  ** difference quotient). Every solve zeroes GMRES's Hessenberg matrix,
  ** (maxl + 1) maxl entries: a larger space costs on every solve. */
  ws->LS = SUNLinSol_SPGMR(ws->u, SUN_PREC_RIGHT, 2, ws->sun);
  if (!ws->LS || SUNLinSol_SPGMRSetMaxRestarts(ws->LS, (int)n) ||
      KINSetLinearSolver(ws->kmem, ws->LS, NULL) ||
      KINSetPreconditioner(ws->kmem, kin_psetup, kin_psolve))
    return -1;
  KINSetMaxSetupCalls(ws->kmem, 1);
  KINSetEtaConstValue(ws->kmem, 1e-4);
  KINSetNumMaxIters(ws->kmem, 200);
  ws->maxiter = 200;
  KINSetFuncNormTol(ws->kmem, EQPI_FNORM_TOL);
  KINSetScaledStepTol(ws->kmem, 1e-15);
  /* a log-variable step of more than ~10 per unknown only overshoots */
  KINSetMaxNewtonStep(ws->kmem, 10.0 * sqrt((double)n));
  KINSetPrintLevel(ws->kmem, 0);
  return 0;
}

static void newton_free(eqpi_newton *ws)
{
  if (!ws) return;
  kinsol_free(ws);
  eqpi_free(ws->ctx, ws, ws->bytes);
}

eqpi_newton *eqpi_newton_get(eqp_ctx *ctx, int n)
{
  for (eqpi_newton **p = &ctx->newton_pool; *p; p = &(*p)->next)
    if ((*p)->n == n) {
      eqpi_newton *ws = *p;
      *p = ws->next;
      ws->next = NULL;
      ctx->newton_pooled--;
      ws->jac_ok = 0;
      return ws;
    }
  size_t nn = (size_t)n;
  size_t bytes = sizeof(eqpi_newton) + sizeof(double) * (2 * nn * nn + 3 * nn) +
                 sizeof(double *) * nn + sizeof(sunindextype) * nn + 64;
  eqpi_newton *ws = eqpi_calloc(ctx, 1, bytes);
  if (!ws) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"), NULL;
  ws->ctx = ctx;
  ws->bytes = bytes;
  ws->n = n;
  double *d = (double *)(((uintptr_t)(ws + 1) + 15) & ~(uintptr_t)15);
  ws->J = d;
  ws->Jlu = d + nn * nn;
  ws->uj = d + 2 * nn * nn;
  double *udata = ws->uj + nn, *sdata = udata + nn;
  ws->cols = (double **)(sdata + nn);
  ws->piv = (sunindextype *)(ws->cols + nn);
  for (int j = 0; j < n; j++) ws->cols[j] = ws->Jlu + (size_t)j * nn;
  if (kinsol_setup(ws, udata, sdata) < 0) {
    newton_free(ws);
    return eqpi_fail(ctx, EQP_E_NOMEM, "cannot set up KINSOL"), NULL;
  }
  return ws;
}

void eqpi_newton_put(eqp_ctx *ctx, eqpi_newton *ws)
{
  if (!ws) return;
  if (ctx->newton_pooled >= POOL_MAX) {
    newton_free(ws);
    return;
  }
  ws->P = NULL;
  ws->next = ctx->newton_pool;
  ctx->newton_pool = ws;
  ctx->newton_pooled++;
}

void eqpi_newton_pool_free(eqp_ctx *ctx)
{
  while (ctx->newton_pool) {
    eqpi_newton *ws = ctx->newton_pool;
    ctx->newton_pool = ws->next;
    newton_free(ws);
  }
  ctx->newton_pooled = 0;
}

/* ------------------------------------------------------------ linear algebra */

int eqpi_newton_factor(eqpi_newton *ws, eqpi_problem *P, const double *u)
{
  const int n = ws->n;
  ws->jac_ok = 0;
  if (eqpi_problem_at(P, u) < 0) return -1;
  if (eqpi_problem_jacobian(P, ws->J, &ws->jac_exact) < 0) return -1;
  eqpi_vcopy(ws->Jlu, ws->J, n * n);
  eqpi_vcopy(ws->uj, u, n);
  if (SUNDlsMat_denseGETRF(ws->cols, n, n, ws->piv) != 0) return -2;
  ws->jac_ok = 1;
  return 0;
}

void eqpi_newton_lu_solve(eqpi_newton *ws, double *b)
{
  eqpi_dense_getrs(ws->cols, ws->n, ws->piv, b);
}

/* ------------------------------------------------------------ a run */

static int run(eqpi_newton *ws, eqpi_problem *P, const double *u0, int maxiter, long *iters,
               int strategy)
{
  const int n = ws->n;
  double *uu = NV_DATA_S(ws->u);
  ws->P = P;
  ws->kin_err[0] = '\0';
  eqpi_vcopy(uu, u0, n);
  int analytic = P->derivs != EQPI_DERIV_NONE || P->lambda == 0;
  if (analytic != ws->jv_analytic) {
    KINSetJacTimesVecFn(ws->kmem, analytic ? kin_jtimes : NULL);
    /* With the exact Jacobian GMRES's one iteration solves to rounding, so
    ** the forcing term (GMRES's tolerance) only costs its bookkeeping: a
    ** constant one, tight enough that a poorly conditioned step still
    ** gets a second iteration. Otherwise Eisenstat and Walker's choice 1. */
    KINSetEtaForm(ws->kmem, analytic ? KIN_ETACONSTANT : KIN_ETACHOICE1);
    /* choice 1 leaves its last eta behind in KINSOL: the constant again */
    if (analytic) KINSetEtaConstValue(ws->kmem, 1e-4);
    ws->jv_analytic = analytic;
  }
  if (maxiter != ws->maxiter) {        /* a setter of KINSOL's costs a call chain */
    KINSetNumMaxIters(ws->kmem, maxiter);
    ws->maxiter = maxiter;
  }
  /* the proton reference for this run, from the state at u0; an already
  ** converged start (a repeated solve) would make KINSOL's line search fail
  ** to find a distinct iterate: accept it as it is */
  if (eqpi_problem_at(P, uu) < 0) return KIN_SYSFUNC_FAIL;
  if (eqpi_problem_reference(P) && eqpi_problem_at(P, uu) < 0) return KIN_SYSFUNC_FAIL;
  double fmax = 0;
  for (int k = 0; k < n; k++) fmax = fmax > fabs(P->F[k]) ? fmax : fabs(P->F[k]);
  if (fmax <= EQPI_FNORM_TOL) return P->I > EQPI_MAX_MOLALITY ? EQPI_KIN_IMPLAUSIBLE : KIN_SUCCESS;
  ws->jac_ok = 0;
  int flag = KINSol(ws->kmem, ws->u, strategy, ws->scale, ws->scale);
  if (flag == KIN_STEP_LT_STPTOL) {
    /* "steps too small" is a success only if the residual is small too;
    ** otherwise KINSOL has stalled and the caller's fallback must run */
    if (eqpi_problem_at(P, uu) < 0) return KIN_SYSFUNC_FAIL;
    double fm = 0;
    for (int k = 0; k < n; k++) fm = fabs(P->F[k]) > fm ? fabs(P->F[k]) : fm;
    if (!(fm <= 1e-8)) flag = KIN_LINESEARCH_NONCONV;
  }
  if (flag >= 0 && !(uu[n - 1] <= log(EQPI_MAX_MOLALITY))) flag = EQPI_KIN_IMPLAUSIBLE;
  long it = 0;
  KINGetNumNonlinSolvIters(ws->kmem, &it);
  if (eqpi_log_on(ws->ctx, EQP_LOG_TRACE)) {
    long nfe = 0, nbt = 0, nli = 0;
    double fn = 0;
    char name[64];
    KINGetNumLinIters(ws->kmem, &nli);
    KINGetNumFuncEvals(ws->kmem, &nfe);
    KINGetNumBacktrackOps(ws->kmem, &nbt);
    KINGetFuncNorm(ws->kmem, &fn);
    eqpi_log(ws->ctx, EQP_LOG_TRACE, "KINSOL lambda %.2f, %d unknowns, %s Jv, %s: %s, %ld "
             "iterations, %ld linear, %ld evaluations, %ld backtracks, |F| %.2e %s", P->lambda,
             n, analytic ? "analytic" : "difference",
             strategy == KIN_NONE ? "full steps" : "line search",
             eqpi_newton_flag_name(flag, name, sizeof name), it, nli, nfe, nbt, fn, ws->kin_err);
  }
  *iters += it;
  return flag;
}

int eqpi_newton_run(eqpi_newton *ws, eqpi_problem *P, const double *u0, int maxiter,
                    long *iters)
{
  return run(ws, P, u0, maxiter, iters, KIN_LINESEARCH);
}

int eqpi_newton_run_full(eqpi_newton *ws, eqpi_problem *P, const double *u0, int maxiter,
                         long *iters)
{
  return run(ws, P, u0, maxiter, iters, KIN_NONE);
}

/* ------------------------------------------------------------ small dense LU */

/* Dense LU of a small row-major n x n matrix (n <= 64) by SUNDIALS's
** routine (partial pivoting): A is transposed in place into the
** column-major order that routine uses, so the factors are opaque to the
** caller, for eqpi_lu_solve. -1 when singular or too large. */
int eqpi_lu_factor(double *A, int *piv, int n)
{
  double *cols[64];
  sunindextype p[64];
  if (n < 1 || n > 64) return -1;
  for (int i = 0; i < n; i++)
    for (int j = i + 1; j < n; j++) {
      double t = A[i * n + j];
      A[i * n + j] = A[j * n + i];
      A[j * n + i] = t;
    }
  for (int j = 0; j < n; j++) cols[j] = A + (size_t)j * n;
  int rc = SUNDlsMat_denseGETRF(cols, n, n, p) != 0 ? -1 : 0;
  for (int j = 0; j < n; j++) piv[j] = (int)p[j];
  return rc;
}

void eqpi_lu_solve(const double *A, const int *piv, int n, double *b)
{
  double *cols[64];
  sunindextype p[64];
  if (n < 1 || n > 64) return;
  for (int j = 0; j < n; j++) {
    cols[j] = (double *)(A + (size_t)j * n);
    p[j] = piv[j];
  }
  eqpi_dense_getrs(cols, n, p, b);
}
