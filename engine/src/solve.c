/* Solving the active system with KINSOL (Newton-Krylov, SPGMR, line search),
** the ideal Jacobian N^T diag(m) N as preconditioner, warm starts between
** solves, fallbacks, and verification of every result. */
/* SPDX-License-Identifier: MIT */
#include "system_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <stdlib.h>
#include <kinsol/kinsol_ls.h>

#define FNORM_TOL 1e-13   /* max-norm of the scaled residual at convergence */
/* A converged point with an ionic strength beyond EQPI_MAX_MOLALITY: a root
** of the model's equations that no solution has (the limiting law, whose
** gamma falls without bound, has one near I = 300 mol/kg made of water's
** own ions). Treated as a failure, so that the fallbacks, which follow the
** branch of the ideal solution, take over. */
#define EQPI_KIN_IMPLAUSIBLE (-100)
#define EQPI_LN_MAX_I log(EQPI_MAX_MOLALITY)

static const char *kin_flag_name(int flag)
{
  static const char *const names[] = {
    "KIN_SUCCESS", "KIN_MEM_NULL", "KIN_ILL_INPUT", "KIN_NO_MALLOC", "KIN_MEM_FAIL",
    "KIN_LINESEARCH_NONCONV", "KIN_MAXITER_REACHED", "KIN_MXNEWT_5X_EXCEEDED",
    "KIN_LINESEARCH_BCFAIL", "KIN_LINSOLV_NO_RECOVERY", "KIN_LINIT_FAIL",
    "KIN_LSETUP_FAIL", "KIN_LSOLVE_FAIL", "KIN_SYSFUNC_FAIL", "KIN_FIRST_SYSFUNC_ERR",
    "KIN_REPTD_SYSFUNC_ERR", "KIN_VECTOROP_ERR", "KIN_CONTEXT_ERR",
  };
  if (flag == KIN_INITIAL_GUESS_OK) return "KIN_INITIAL_GUESS_OK";
  if (flag == EQPI_KIN_IMPLAUSIBLE) return "an ionic strength beyond 100 mol/kg";
  if (flag == KIN_STEP_LT_STPTOL) return "KIN_STEP_LT_STPTOL";
  if (flag <= 0 && -flag < (int)(sizeof names / sizeof names[0])) return names[-flag];
  return "KIN_UNKNOWN_FLAG";
}



/* ------------------------------------------------------------ KINSOL hooks */

static int kin_f(N_Vector uu, N_Vector fval, void *ud)
{
  int rc = eqpi_sys_eval(ud, N_VGetArrayPointer(uu), N_VGetArrayPointer(fval));
  if (rc == 0) {
    /* keep NaN out of KINSOL: a non-finite residual is an unrecoverable failure */
    const double *F = N_VGetArrayPointer(fval);
    for (sunindextype k = 0; k < N_VGetLength(fval); k++)
      if (!isfinite(F[k])) return -1;
  }
  return rc < 0 ? -1 : 0;
}

static int kin_psetup(N_Vector uu, N_Vector uscale, N_Vector fval, N_Vector fscale, void *ud)
{
  eqpi_system *sys = ud;
  return eqpi_sys_precond(sys, N_VGetArrayPointer(uu)) < 0 ? 1 : 0;
}

static int kin_psolve(N_Vector uu, N_Vector uscale, N_Vector fval, N_Vector fscale,
                      N_Vector vv, void *ud)
{
  eqpi_system *sys = ud;
  eqpi_lu_solve(sys->J, sys->piv, sys->n, N_VGetArrayPointer(vv));
  return 0;
}

static void kin_err(int code, const char *module, const char *function, char *msg, void *ud)
{
  eqpi_system *sys = ud;
  snprintf(sys->kin_err, sizeof sys->kin_err, "%s: %s", function, msg);
}

static void kinsol_free(eqpi_system *sys)
{
  if (sys->kmem) KINFree(&sys->kmem);
  if (sys->LS) SUNLinSolFree(sys->LS);
  if (sys->u) N_VDestroy(sys->u);
  if (sys->scale) N_VDestroy(sys->scale);
  if (sys->sun) SUNContext_Free(&sys->sun);
  sys->kmem = NULL;
  sys->LS = NULL;
  sys->u = sys->scale = NULL;
  sys->sun = NULL;
}

/* Order matters to KINSOL 6.4: create, user data and error handler, init,
** then the linear solver and its hooks, then the other settings. */
static int kinsol_setup(eqpi_system *sys)
{
  const sunindextype n = sys->n;
  if (SUNContext_Create(NULL, &sys->sun) != 0) return -1;
  sys->u = N_VNew_Serial(n, sys->sun);
  sys->scale = N_VNew_Serial(n, sys->sun);
  sys->kmem = KINCreate(sys->sun);
  if (!sys->u || !sys->scale || !sys->kmem) return -1;
  N_VConst(1.0, sys->scale);
  if (KINSetUserData(sys->kmem, sys) || KINSetErrHandlerFn(sys->kmem, kin_err, sys) ||
      KINInit(sys->kmem, kin_f, sys->u))
    return -1;
  sys->LS = SUNLinSol_SPGMR(sys->u, SUN_PREC_RIGHT, (int)n + 2, sys->sun);
  if (!sys->LS || KINSetLinearSolver(sys->kmem, sys->LS, NULL) ||
      KINSetPreconditioner(sys->kmem, kin_psetup, kin_psolve))
    return -1;
  KINSetMaxSetupCalls(sys->kmem, 1);
  KINSetNumMaxIters(sys->kmem, 200);
  KINSetFuncNormTol(sys->kmem, FNORM_TOL);
  KINSetScaledStepTol(sys->kmem, 1e-15);
  /* a log-variable step of more than ~10 per unknown only overshoots */
  KINSetMaxNewtonStep(sys->kmem, 10.0 * sqrt((double)n));
  KINSetPrintLevel(sys->kmem, 0);
  return 0;
}

/* ------------------------------------------------------------ assembly */

#define GROW(ctx, p, n) ((p) = eqpi_calloc((ctx), (size_t)(n) + 1, sizeof *(p)))

static void arrays_free(eqp_ctx *ctx, eqpi_system *s)
{
  size_t nc = (size_t)s->nc + 1, ns = (size_t)s->ns + 1, n = (size_t)s->n + 1;
  eqpi_free(ctx, s->active, (size_t)s->ncg + 1);
  eqpi_free(ctx, s->comp, sizeof(int) * nc);
  eqpi_free(ctx, s->comp_sp, sizeof(int) * nc);
  eqpi_free(ctx, s->xidx, sizeof(int) * nc);
  eqpi_free(ctx, s->tot, sizeof(double) * nc);
  eqpi_free(ctx, s->lnfix, sizeof(double) * nc);
  eqpi_free(ctx, s->lnfree, sizeof(double) * nc);
  eqpi_free(ctx, s->tot_last, sizeof(double) * nc);
  eqpi_free(ctx, s->xcomp, sizeof(int) * n);
  eqpi_free(ctx, s->sp, sizeof(int) * ns);
  eqpi_free(ctx, s->lnK, sizeof(double) * ns);
  eqpi_free(ctx, s->nu, sizeof(double) * ((size_t)s->ns * (size_t)s->nc + 1));
  eqpi_free(ctx, s->z, sizeof(double) * ns);
  eqpi_free(ctx, s->z2, sizeof(double) * ns);
  eqpi_free(ctx, s->size, sizeof(double) * ns);
  eqpi_free(ctx, s->s0, sizeof(double) * ns);
  eqpi_free(ctx, s->mid, sizeof(double) * ns);
  eqpi_free(ctx, s->lg, sizeof(double) * ns);
  eqpi_free(ctx, s->lng, sizeof(double) * ns);
  eqpi_free(ctx, s->m, sizeof(double) * ns);
  eqpi_free(ctx, s->J, sizeof(double) * (n * n));
  eqpi_free(ctx, s->piv, sizeof(int) * n);
  eqpi_free(ctx, s->g, sizeof(double) * (n + 1));
  eqpi_free(ctx, s->d, sizeof(double) * n);
  eqpi_free(ctx, s->xt, sizeof(double) * 2 * n);
  eqpi_free(ctx, s->u_last, sizeof(double) * n);
  eqpi_free(ctx, s->names, sizeof(char *) * ns);
  eqpi_free(ctx, s->dlng, sizeof(double) * ns);
  eqpi_free(ctx, s->href, sizeof(double) * nc);
  eqpi_free(ctx, s->coefH, sizeof(double) * ns);
  eqpi_free(ctx, s->N0, sizeof(double) * nc);
  eqpi_free(ctx, s->adir, sizeof(double) * nc);
}

void eqpi_system_free(eqp_ctx *ctx, eqpi_system *sys)
{
  if (!sys) return;
  kinsol_free(sys);
  arrays_free(ctx, sys);
  eqpi_free(ctx, sys, sizeof *sys);
}

/* Which components are present: H+ always, others with a positive total. */
static int active_mask(eqp_ctx *ctx, const double *totals, unsigned char *mask)
{
  const eqpi_db *db = &ctx->db;
  for (int c = 0; c < db->ncomp; c++) {
    int sp = db->comp_species[c];
    mask[c] = 0;
    if (sp == db->water) continue;
    if (sp == db->h_plus) { mask[c] = 1; continue; }
    if (totals[c] < 0) {
      if (totals[c] < -1e-14)
        return eqpi_fail(ctx, EQP_E_INPUT, "total of %s is negative (%g mol/kg)",
                         db->sp[sp].name, totals[c]);
    }
    mask[c] = totals[c] > 0;
  }
  return EQP_OK;
}

static int species_present(const eqpi_db *db, int i, const unsigned char *mask)
{
  if (i == db->water) return 0;
  const eqpi_species *s = &db->sp[i];
  for (int t = 0; t < s->nterm; t++) {
    int c = s->term_comp[t];
    if (db->comp_species[c] != db->water && !mask[c]) return 0;
  }
  return 1;
}

static int build(eqp_ctx *ctx, eqpi_system *s, const unsigned char *mask)
{
  const eqpi_db *db = &ctx->db;
  int ncg = db->ncomp, nc = 0, ns = 0;
  int *loc = eqpi_calloc(ctx, (size_t)ncg + 1, sizeof(int));
  if (!loc) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (int c = 0; c < ncg; c++) loc[c] = mask[c] ? nc++ : -1;
  for (int i = 0; i < db->nsp; i++) ns += species_present(db, i, mask);
  s->ncg = ncg;
  s->nc = nc;
  s->ns = ns;
  s->n = nc + 1;  /* upper bound until spectators are known */
  int ok = GROW(ctx, s->active, ncg) && GROW(ctx, s->comp, nc) && GROW(ctx, s->comp_sp, nc) &&
           GROW(ctx, s->xidx, nc) && GROW(ctx, s->tot, nc) && GROW(ctx, s->lnfix, nc) &&
           GROW(ctx, s->lnfree, nc) && GROW(ctx, s->tot_last, nc) &&
           GROW(ctx, s->xcomp, nc + 1) && GROW(ctx, s->sp, ns) && GROW(ctx, s->lnK, ns) &&
           GROW(ctx, s->nu, (size_t)ns * (size_t)nc) && GROW(ctx, s->z, ns) &&
           GROW(ctx, s->z2, ns) && GROW(ctx, s->size, ns) && GROW(ctx, s->s0, ns) &&
           GROW(ctx, s->mid, ns) && GROW(ctx, s->lg, ns) && GROW(ctx, s->lng, ns) &&
           GROW(ctx, s->m, ns) && GROW(ctx, s->J, (nc + 2) * (nc + 2)) &&
           GROW(ctx, s->piv, nc + 2) && GROW(ctx, s->g, nc + 3) && GROW(ctx, s->d, nc + 2) &&
           GROW(ctx, s->xt, 2 * (nc + 2)) && GROW(ctx, s->u_last, nc + 2) &&
           GROW(ctx, s->names, ns) && GROW(ctx, s->dlng, ns) && GROW(ctx, s->N0, nc) &&
           GROW(ctx, s->href, nc) && GROW(ctx, s->coefH, ns) &&
           GROW(ctx, s->adir, nc);
  if (!ok) {
    eqpi_free(ctx, loc, sizeof(int) * ((size_t)ncg + 1));
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  memcpy(s->active, mask, (size_t)ncg);
  for (int c = 0; c < ncg; c++)
    if (loc[c] >= 0) s->comp[loc[c]] = c;
  int k = 0;
  for (int i = 0; i < db->nsp; i++) {
    if (!species_present(db, i, mask)) continue;
    const eqpi_species *sp = &db->sp[i];
    s->sp[k] = i;
    for (int t = 0; t < sp->nterm; t++) {
      int c = sp->term_comp[t];
      if (loc[c] >= 0) s->nu[(size_t)k * nc + loc[c]] = sp->term_nu[t];
    }
    if (sp->component >= 0) s->comp_sp[loc[sp->component]] = k;
    s->names[k] = sp->name;
    s->z[k] = sp->comp.charge;
    s->z2[k] = sp->comp.charge * sp->comp.charge;
    s->size[k] = sp->size;
    k++;
  }
  /* spectators: a component whose only species is itself */
  s->nx = 0;
  for (int c = 0; c < nc; c++) {
    int others = 0;
    for (int i = 0; i < ns; i++)
      others += i != s->comp_sp[c] && s->nu[(size_t)i * nc + c] != 0;
    if (s->comp[c] == db->sp[db->h_plus].component) s->hloc = c;
    if (others || s->comp[c] == db->sp[db->h_plus].component) {
      s->xidx[c] = s->nx;
      s->xcomp[s->nx++] = c;
    } else {
      s->xidx[c] = -1;
    }
  }
  s->n = s->nx + 1;
  for (int i = 0; i < ns; i++) s->coefH[i] = s->nu[(size_t)i * nc + s->hloc];  /* href = 0 */
  s->generation = db->generation;
  s->bound = NULL;
  s->Tk = -1;
  s->solved = false;
  eqpi_free(ctx, loc, sizeof(int) * ((size_t)ncg + 1));
  return EQP_OK;
}

static void set_temperature(eqpi_system *s, double T)
{
  if (s->Tk == T) return;
  s->Tk = T;
  eqpi_tnotes notes = {0, 0};
  for (int i = 0; i < s->ns; i++)
    s->lnK[i] = EQPI_LN10 * eqpi_species_logK(&s->ctx->db, s->sp[i], T, &notes);
  s->missing_T = notes.missing;
  s->outside_T = notes.outside;
  eqpi_debye_huckel_AB(T, &s->A, &s->B);
}

static int info_param(const void *ud, size_t i, const char *key, double *v)
{
  const eqpi_system *s = ud;
  return eqpi_db_species_param(&s->ctx->db, s->sp[i], key, v);
}

static int info_pair(const void *ud, size_t i, size_t j, const char *key, double *v)
{
  const eqpi_system *s = ud;
  return eqpi_db_pair_param(&s->ctx->db, s->sp[i], s->sp[j], key, v);
}

/* Tell the model which species are present (optional op of the ABI). */
static int bind_model(eqp_ctx *ctx, eqpi_system *s, eqpi_model *model)
{
  s->bound = model;
  eqp_species_info info = {(size_t)s->ns, s->names, s->z, s->size, s, info_param, info_pair};
  char err[256] = "";
  if (eqpi_model_bind(model, &info, s->bind_warn, sizeof s->bind_warn, err, sizeof err) != 0) {
    s->bound = NULL;
    return eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s': %s", model->desc->name,
                     err[0] ? err : "bind failed");
  }
  return EQP_OK;
}

/* Reuse the structure and the KINSOL instance when the same components are
** present; rebuild otherwise. */
int eqpi_system_prepare(eqp_ctx *ctx, eqpi_system **sysp, const double *totals, double T,
                        eqpi_model *model, const double *extra)
{
  const eqpi_db *db = &ctx->db;
  if (db->h_plus < 0 || db->water < 0)
    return eqpi_fail(ctx, EQP_E_DATA, "the species library defines no 'H+' and 'H2O'");
  unsigned char stackmask[256];
  unsigned char *mask = db->ncomp <= 256 ? stackmask : eqpi_malloc(ctx, (size_t)db->ncomp);
  if (!mask) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  int rc = active_mask(ctx, totals, mask);
  /* components a reagent about to be added brings must be in the system */
  for (int c = 0; extra && rc == EQP_OK && c < db->ncomp; c++)
    if (extra[c] > 0 && db->comp_species[c] != db->water) mask[c] = 1;
  eqpi_system *s = *sysp;
  if (rc == EQP_OK && (!s || s->generation != db->generation || s->ncg != db->ncomp ||
                       memcmp(s->active, mask, (size_t)db->ncomp) != 0)) {
    if (s) {
      kinsol_free(s);
      arrays_free(ctx, s);
      memset(s, 0, sizeof *s);
    } else if (!(s = eqpi_calloc(ctx, 1, sizeof *s))) {
      rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
    }
    if (s) {
      *sysp = s;
      s->ctx = ctx;
      rc = build(ctx, s, mask);
      if (rc == EQP_OK && kinsol_setup(s) < 0)
        rc = eqpi_fail(ctx, EQP_E_NOMEM, "cannot set up KINSOL");
      if (rc < 0) { kinsol_free(s); arrays_free(ctx, s); memset(s, 0, sizeof *s); }
    }
  }
  if (mask != stackmask) eqpi_free(ctx, mask, (size_t)db->ncomp);
  if (rc < 0) return rc;
  s->model = model;
  if (s->bound != model && (rc = bind_model(ctx, s, model)) < 0) return rc;
  for (int c = 0; c < s->nc; c++) {
    s->tot[c] = totals[s->comp[c]];
    s->lnfix[c] = log(s->tot[c] > 0 ? s->tot[c] : 1e-300);
  }
  set_temperature(s, T);
  return EQP_OK;
}

/* ------------------------------------------------------------ solving */

int eqpi_run_kinsol(eqpi_system *s, const double *u0, long *iters)
{
  double *uu = N_VGetArrayPointer(s->u);
  memcpy(uu, u0, sizeof(double) * (size_t)s->n);
  s->kin_err[0] = '\0';
  /* An already converged start (a repeated solve) would make KINSOL's line
  ** search fail to find a distinct iterate; accept it as it is. */
  double *F = s->xt + s->n, fmax = 0;
  if (eqpi_sys_eval(s, uu, F) < 0) return KIN_SYSFUNC_FAIL;
  /* the proton reference for this run, from u0; the H+ row changes with it */
  if (eqpi_sys_reference(s) && eqpi_sys_eval(s, uu, F) < 0) return KIN_SYSFUNC_FAIL;
  for (int k = 0; k < s->n; k++) fmax = fabs(F[k]) > fmax ? fabs(F[k]) : fmax;
  if (fmax <= FNORM_TOL)
    return uu[s->nx] > EQPI_LN_MAX_I ? EQPI_KIN_IMPLAUSIBLE : KIN_SUCCESS;
  int flag = KINSol(s->kmem, s->u, KIN_LINESEARCH, s->scale, s->scale);
  if (flag == KIN_STEP_LT_STPTOL) {
    /* "steps too small" is a success only if the residual is small too;
    ** otherwise KINSOL has stalled and the caller's fallback must run */
    double fm = 0;
    if (eqpi_sys_eval(s, uu, F) < 0) return KIN_SYSFUNC_FAIL;
    for (int k = 0; k < s->n; k++) fm = fabs(F[k]) > fm ? fabs(F[k]) : fm;
    if (!(fm <= 1e-8)) flag = KIN_LINESEARCH_NONCONV;
  }
  if (flag >= 0 && !(uu[s->nx] <= EQPI_LN_MAX_I)) flag = EQPI_KIN_IMPLAUSIBLE;
  long it = 0;
  KINGetNumNonlinSolvIters(s->kmem, &it);
  if (eqpi_log_on(s->ctx, EQP_LOG_TRACE)) {
    long nli = 0, nfe = 0, nbt = 0; double fn = 0;
    KINGetNumLinIters(s->kmem, &nli); KINGetNumFuncEvals(s->kmem, &nfe);
    KINGetNumBacktrackOps(s->kmem, &nbt); KINGetFuncNorm(s->kmem, &fn);
    eqpi_log(s->ctx, EQP_LOG_TRACE, "KINSOL lambda %.2f: %s, %ld iterations, %ld linear, %ld evaluations, %ld backtracks, |F| %.2e %s",
            s->lambda, kin_flag_name(flag), it, nli, nfe, nbt, fn, s->kin_err);
  }
  *iters += it;
  return flag;
}

static int fail_converge(eqp_ctx *ctx, eqpi_system *s, int flag, long iters)
{
  if (s->plugin_failed)
    return eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s' failed: %s",
                     s->model->desc->name, s->plugin_err);
  char res[512];
  size_t used = 0;
  double *F = s->xt + s->n;
  s->lambda = 1;
  res[0] = '\0';
  if (eqpi_sys_eval(s, N_VGetArrayPointer(s->u), F) == 0)
    for (int k = 0; k < s->n && used < sizeof res; k++)
      used += (size_t)snprintf(res + used, sizeof res - used, "%s%s %.2e", k ? ", " : "",
                               eqpi_sys_row_name(s, k), F[k]);
  char names[256];
  used = 0;
  for (int k = 0; k < s->nx && used < sizeof names; k++)
    used += (size_t)snprintf(names + used, sizeof names - used, "%s%s", k ? ", " : "",
                             eqpi_sys_row_name(s, k));
  return eqpi_fail(ctx, EQP_E_CONVERGE, "no convergence for the system {%s} at %.2f C with "
                   "model '%s': KINSOL stopped with %s after %ld iterations%s%s; last scaled "
                   "residuals: %s", names, s->Tk - 273.15, s->model->desc->name,
                   kin_flag_name(flag), iters, s->kin_err[0] ? ": " : "", s->kin_err, res);
}

/* A direct attempt at the full model: from a good start Newton needs a
** handful of iterations, so one that has not converged in 60 is better
** handed to the continuation than left to run. */
static int solve_from(eqpi_system *s, double *u0, long *iters)
{
  s->lambda = 1;
  KINSetNumMaxIters(s->kmem, 60);
  int flag = eqpi_run_kinsol(s, u0, iters);
  KINSetNumMaxIters(s->kmem, 200);
  return flag;
}

int eqpi_system_solve(eqp_ctx *ctx, eqpi_system **sysp, const double *totals, double T,
                      eqpi_model *model, eqpi_solve_stats *stats)
{
  int rc = eqpi_system_prepare(ctx, sysp, totals, T, model, NULL);
  if (rc < 0) return rc;
  eqpi_system *s = *sysp;
  return eqpi_system_solve_prepared(ctx, s, &rc, stats);
}

int eqpi_system_solve_prepared(eqp_ctx *ctx, eqpi_system *s, int *rcp, eqpi_solve_stats *stats)
{
  int rc = *rcp;
  double ustart[64], *u = s->n <= 64 ? ustart : eqpi_malloc(ctx, sizeof(double) * (size_t)s->n);
  if (!u) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  long iters = 0;
  int flag = -1;
  s->plugin_failed = 0;
  if (s->solved) {
    /* warm start: shift each component by the change of its total */
    memcpy(u, s->u_last, sizeof(double) * (size_t)s->n);
    for (int k = 0; k < s->nx; k++) {
      int c = s->xcomp[k];
      if (c != s->hloc && s->tot_last[c] > 0) u[k] += log(s->tot[c] / s->tot_last[c]);
    }
    flag = solve_from(s, u, &iters);
  }
  if (flag < 0 && !s->plugin_failed) {
    eqpi_sys_coldstart(s, u);
    flag = solve_from(s, u, &iters);
  }
  /* Continuation in the activity model, ideal -> full: each stage starts
  ** from the last converged one; a failed stage is retried with half the
  ** increment, down to 1/256. */
  if (flag < 0 && !s->plugin_failed) {
    eqpi_sys_coldstart(s, u);
    double lam = 0, step = 0.25;
    while (lam < 1 && step >= 1.0 / 256 && !s->plugin_failed) {
      double next = lam + step < 1 ? lam + step : 1;
      s->lambda = next;
      flag = eqpi_run_kinsol(s, u, &iters);
      if (flag >= 0) {
        memcpy(u, N_VGetArrayPointer(s->u), sizeof(double) * (size_t)s->n);
        lam = next;
        step *= 1.5;
      } else {
        step *= 0.5;
      }
    }
    if (lam < 1 && flag >= 0) flag = KIN_MAXITER_REACHED;
  }
  s->lambda = 1;
  if (flag < 0) {
    rc = fail_converge(ctx, s, flag, iters);
    s->solved = false;
    goto out;
  }
  int worst;
  double *ufin = N_VGetArrayPointer(s->u);
  double r = eqpi_sys_verify(s, ufin, &worst);
  if (!(r <= EQPI_VERIFY_TOL)) {
    /* KINSOL stops at a scaled residual of 1e-13; a balance that a large
    ** neutral total dominates can still be short of 1e-10 in the charge.
    ** Polish with full Newton steps on the (near exact) preconditioner
    ** matrix, which converge to rounding. */
    for (int k = 0; k < 3 && !(r <= EQPI_VERIFY_TOL); k++) {
      double *F = s->xt + s->n;
      memcpy(u, ufin, sizeof(double) * (size_t)s->n);
      if (eqpi_sys_precond(s, u) < 0 || eqpi_sys_eval(s, u, F) < 0) break;
      for (int j = 0; j < s->n; j++) u[j] = -F[j];
      eqpi_lu_solve(s->J, s->piv, s->n, u);
      for (int j = 0; j < s->n; j++) u[j] += ufin[j];
      int w2;
      double r2 = eqpi_sys_verify(s, u, &w2);
      if (!(r2 < r)) break;
      memcpy(ufin, u, sizeof(double) * (size_t)s->n);
      r = r2;
      worst = w2;
      iters++;
    }
    r = eqpi_sys_verify(s, ufin, &worst);   /* and leaves the state at the accepted point */
  }
  if (!(r <= EQPI_VERIFY_TOL)) {
    s->solved = false;
    if (worst > s->n)
      rc = eqpi_fail(ctx, EQP_E_VERIFY, "refusing the result: after the solve the molality "
                     "or activity coefficient of %s is not a finite number (model '%s', "
                     "%.2f C)", eqpi_sys_row_name(s, worst), s->model->desc->name,
                     s->Tk - 273.15);
    else
      rc = eqpi_fail(ctx, EQP_E_VERIFY, "refusing the result: after the solve the %s balance "
                     "has relative residual %.3e (limit %.0e), KINSOL %s after %ld iterations",
                     eqpi_sys_row_name(s, worst), r, EQPI_VERIFY_TOL, kin_flag_name(flag), iters);
    goto out;
  }
  memcpy(s->u_last, ufin, sizeof(double) * (size_t)s->n);
  memcpy(s->tot_last, s->tot, sizeof(double) * (size_t)s->nc);
  s->solved = true;
  if (stats) {
    stats->iterations = iters;
    stats->residual = r;
    stats->missing_T = s->missing_T;
    stats->outside_T = s->outside_T;
    stats->model_note = s->bind_warn;
  }
  rc = EQP_OK;
out:
  if (u != ustart) eqpi_free(ctx, u, sizeof(double) * (size_t)s->n);
  return rc;
}

int eqpi_system_nspecies(const eqpi_system *sys) { return sys ? sys->ns : 0; }

int eqpi_system_species(const eqpi_system *sys, int i, double *m, double *lg)
{
  *m = sys->m[i];
  *lg = sys->lg[i];
  return sys->sp[i];
}

double eqpi_system_ionic_strength(const eqpi_system *sys)
{
  double I = 0;
  for (int i = 0; i < sys->ns; i++) I += 0.5 * sys->z2[i] * sys->m[i];
  return I;
}

