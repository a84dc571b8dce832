/* Solving a solution's equilibrium: the system (tableau, problem, Newton
** workspace) built or reused, a warm start predicted from the last solve,
** a cold start from the proton balance and the ideal problem, continuation
** in the activity model as the fallback, and verification of every result. */
/* SPDX-License-Identifier: MIT */
#include "system_impl.h"
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>

#define TINY 1e-300
#define WARM_ITERS 20     /* from a good start Newton needs a handful */
/* A warm start whose largest scaled residual is below NEAR is taken with
** full Newton steps, at most NEAR_ITERS of them, before the line search is
** tried: with the exact Jacobian the residual then falls quadratically
** (1e-3, 1e-6, 1e-12), and the line search would only accept full steps. */
#define NEAR 1e-3
#define NEAR_ITERS 6
#define FULL_ITERS 60

/* ------------------------------------------------------------ assembly */

static void system_release(eqp_ctx *ctx, eqpi_system *s)
{
  eqpi_newton_put(ctx, s->ws);
  eqpi_problem_free(s->prob);
  eqpi_tableau_release(ctx, s->tab);
  s->ws = NULL;
  s->prob = NULL;
  s->tab = NULL;
}

void eqpi_system_free(eqp_ctx *ctx, eqpi_system *sys)
{
  if (!sys) return;
  system_release(ctx, sys);
  eqpi_free(ctx, sys, sys->bytes);
}

/* The mask of the totals made by a branch-free pass (neg: some total is
** below -1e-14): water out, H+ in, and a negative total other than
** theirs refused. */
static int mask_finish(eqp_ctx *ctx, const eqpi_db *db, const double *totals,
                       unsigned char *mask, int neg)
{
  const int w = db->sp[db->water].component, h = db->sp[db->h_plus].component;
  if (w >= 0 && h >= 0 && db->comp_species[w] == db->water &&
      db->comp_species[h] == db->h_plus) {
    /* the totals of water and H+ may be negative: only another one counts */
    if (neg) {
      neg = 0;
      for (int c = 0; c < db->ncomp && !neg; c++)
        neg = c != w && c != h && totals[c] < -1e-14;
    }
    mask[w] = 0;
    mask[h] = 1;
    if (!neg) return EQP_OK;
  }
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

/* The bits of x but its sign: zero for +0 and -0 alone. */
static inline uint64_t magnitude_bits(const double *x)
{
  uint64_t b;
  memcpy(&b, x, sizeof b);
  return b << 1;
}

/* One pass over the library's components: total / w into mol (when not
** NULL; an absent component's 0 stays as it is), the mask of those with a
** positive value, *neg when one is below -1e-14, *far when one is beyond
** EQPI_MAX_MOLALITY or not finite. Most of the library's components are
** absent: four at a time are passed over when they are all zero. */
static void scan(const double *total, int n, double w, double *mol, unsigned char *mask,
                 int *neg, int *far)
{
  if (mol) memcpy(mol, total, sizeof(double) * (size_t)n);
  memset(mask, 0, (size_t)n);
  *neg = *far = 0;
  for (int c0 = 0; c0 < n; c0 += 4) {
    const double *t = total + c0;
    if (c0 + 4 <= n && !(magnitude_bits(t) | magnitude_bits(t + 1) | magnitude_bits(t + 2) |
                         magnitude_bits(t + 3)))
      continue;
    for (int c = c0; c < c0 + 4 && c < n; c++) {
      if (total[c] == 0) continue;
      double m = total[c] / w;
      if (mol) mol[c] = m;
      mask[c] = m > 0;
      *neg |= m < -1e-14;
      *far |= !(fabs(m) <= EQPI_MAX_MOLALITY);
    }
  }
}

/* Which components are present: H+ always, others with a positive total;
** a negative total (beyond rounding) other than those of water and H+ is
** an error. */
static int active_mask(eqp_ctx *ctx, const eqpi_db *db, const double *totals,
                       unsigned char *mask)
{
  int neg, far;
  scan(totals, db->ncomp, 1.0, NULL, mask, &neg, &far);   /* x / 1 is x */
  return mask_finish(ctx, db, totals, mask, neg);
}

int eqpi_system_molalities(eqp_ctx *ctx, const eqpi_db *db, const double *total,
                           double water_kg, double *mol, unsigned char *mask, int *big)
{
  int neg;
  scan(total, db->ncomp, water_kg, mol, mask, &neg, big);
  return mask_finish(ctx, db, mol, mask, neg);
}

/* A new system on tab (whose reference it takes): one block for the
** warm-start state and the scratch, then problem and workspace. */
static eqpi_system *system_on(eqp_ctx *ctx, eqpi_tableau *tab, eqpi_model *model)
{
  size_t nmax = (size_t)tab->nc + EQPI_MAX_AMOUNTS + 1, nc = (size_t)tab->nc + 1;
  size_t ns = (size_t)tab->ns;
  size_t bytes = sizeof(eqpi_system) +
                 sizeof(double) * (3 * nmax + nc + 2 * nmax * nmax + 2 * nmax + ns) +
                 sizeof(double *) * nmax + 32;
  eqpi_system *s = eqpi_calloc(ctx, 1, bytes);
  if (!s) {
    eqpi_tableau_release(ctx, tab);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"), NULL;
  }
  s->ctx = ctx;
  s->bytes = bytes;
  s->tab = tab;
  double *d = (double *)(s + 1);
  s->u_last = d;
  s->S_last = d + nmax;
  s->tot_last = d + 2 * nmax;
  s->work = s->tot_last + nc;               /* 2 nmax^2 + 2 nmax */
  s->lng_hold = s->work + 2 * nmax * nmax + 2 * nmax;
  s->cols = (double **)(s->lng_hold + ns);
  if (!(s->prob = eqpi_problem_new(ctx, tab, model)) || !(s->ws = eqpi_newton_get(ctx, s->prob->n))) {
    eqpi_system_free(ctx, s);
    return NULL;
  }
  return s;
}

static eqpi_system *system_new(eqp_ctx *ctx, const eqpi_db *db, const unsigned char *mask,
                               double T, eqpi_model *model)
{
  eqpi_tableau *tab = eqpi_tableau_get(ctx, db, mask, T);
  return tab ? system_on(ctx, tab, model) : NULL;
}

eqpi_system *eqpi_system_clone(eqp_ctx *ctx, const eqpi_system *src, eqpi_model *model)
{
  if (!src || !src->solved) return NULL;
  eqpi_tableau *tab = src->tab;
  tab->refs++;                     /* shared: it does not change */
  eqpi_system *s = system_on(ctx, tab, model);
  if (!s) return NULL;
  const eqpi_problem *P = src->prob;
  size_t n = (size_t)P->n, nc = (size_t)tab->nc;
  memcpy(s->u_last, src->u_last, sizeof(double) * n);
  memcpy(s->S_last, src->S_last, sizeof(double) * n);
  memcpy(s->tot_last, src->tot_last, sizeof(double) * nc);
  memcpy(s->prob->href, P->href, sizeof(double) * nc);
  memcpy(s->prob->coefH, P->coefH, sizeof(double) * (size_t)tab->ns);
  memcpy(s->prob->tot, P->tot, sizeof(double) * nc);
  memcpy(s->prob->lnfix, P->lnfix, sizeof(double) * nc);
  s->solved = true;
  return s;
}

/* Reuse the system (its KINSOL instance with it) while the same components
** are present; a new temperature is a new tableau under the same problem. */
static int prepare(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp, const double *totals,
                   const unsigned char *known, double T, eqpi_model *model, const double *extra)
{
  if (db->h_plus < 0 || db->water < 0)
    return eqpi_fail(ctx, EQP_E_DATA, "the species library defines no 'H+' and 'H2O'");
  unsigned char stackmask[256];
  unsigned char *mask = db->ncomp <= 256 ? stackmask : eqpi_malloc(ctx, (size_t)db->ncomp);
  if (!mask) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  int rc = EQP_OK;
  if (known) memcpy(mask, known, (size_t)db->ncomp);
  else rc = active_mask(ctx, db, totals, mask);
  /* components a reagent about to be added brings must be in the system */
  for (int c = 0; extra && rc == EQP_OK && c < db->ncomp; c++)
    if (extra[c] > 0 && db->comp_species[c] != db->water) mask[c] = 1;
  eqpi_system *s = *sysp;
  if (rc == EQP_OK && (!s || s->tab->db != db || s->tab->generation != db->generation ||
                       s->tab->ncg != db->ncomp ||
                       memcmp(s->tab->active, mask, (size_t)db->ncomp) != 0)) {
    eqpi_system_free(ctx, s);
    *sysp = s = system_new(ctx, db, mask, T, model);
    if (!s) rc = eqp_ctx_errcode(ctx) < 0 ? eqp_ctx_errcode(ctx) : EQP_E_NOMEM;
  } else if (rc == EQP_OK && s->tab->T != T) {
    eqpi_tableau *tab = eqpi_tableau_get(ctx, db, mask, T);
    if (!tab) {
      rc = EQP_E_NOMEM;
    } else {
      eqpi_tableau_release(ctx, s->tab);
      s->tab = tab;
      s->prob->tab = tab;
      s->prob->at_ok = 0;
      s->lu_near_last = false;
    }
  }
  if (mask != stackmask) eqpi_free(ctx, mask, (size_t)db->ncomp);
  if (rc < 0) return rc;
  if ((rc = eqpi_problem_set_model(s->prob, model)) < 0) return rc;
  eqpi_problem_set_totals(s->prob, totals);
  return EQP_OK;
}

int eqpi_system_prepare(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp,
                        const double *totals, double T, eqpi_model *model, const double *extra)
{
  return prepare(ctx, db, sysp, totals, NULL, T, model, extra);
}

bool eqpi_system_current(const eqpi_system *s, const double *total, double water_kg, double T)
{
  if (!s || !s->solved || s->tab->T != T) return false;
  for (int c = 0; c < s->tab->nc; c++)
    if (!(fabs(s->tot_last[c] - total[s->tab->comp[c]] / water_kg) <=
          1e-15 * fabs(s->tot_last[c])))
      return false;
  return true;
}

void eqpi_system_forget(eqpi_system *s)
{
  if (s) s->solved = false;
}

/* ------------------------------------------------------------ starts */

/* The largest scaled residual at u (INFINITY if it cannot be evaluated). */
static double residual_at(eqpi_problem *P, const double *u)
{
  if (eqpi_problem_at(P, u) < 0) return INFINITY;
  double w = 0;
  for (int k = 0; k < P->n; k++) w = fabs(P->F[k]) > w ? fabs(P->F[k]) : w;
  return isfinite(w) ? w : INFINITY;
}

/* From the proton balance, with ln gamma held at the state of u: taken if
** its residual is lower. */
static void proton_correct(eqpi_system *s, double *u, double r)
{
  eqpi_problem *P = s->prob;
  double *alt = s->work, *lng = s->lng_hold;
  int evals = 0;
  if (eqpi_problem_at(P, u) < 0) return;
  memcpy(lng, P->lng, sizeof(double) * (size_t)P->tab->ns);
  memcpy(alt, u, sizeof(double) * (size_t)P->n);
  if (eqpi_start_proton(P, alt, lng, &evals) == 0 && residual_at(P, alt) < r)
    memcpy(u, alt, sizeof(double) * (size_t)P->n);
  s->start_evals += evals;
}

/* Warm start: the last solution moved along its tangent, du = -J^-1 dF/dT
** dT (implicit differentiation with the factors kept from the last solve);
** without them, or for a step the tangent cannot be trusted with, each
** component shifted by the log of the change of its total. A start whose
** proton balance is far off (the pH jumped past an equivalence point) is
** corrected from the proton balance. */
static double warm_start(eqpi_system *s, double *u)
{
  eqpi_problem *P = s->prob;
  const eqpi_tableau *t = s->tab;
  const int n = P->n, nx = P->nx, h = t->hloc;
  eqpi_vcopy(u, s->u_last, n);
  int moved = 0;
  if (s->lu_near_last && s->ws->jac_ok) {
    double *b = s->work, Ic = s->S_last[n - 1], big = 0;
    for (int k = 0; k < n; k++) b[k] = 0;
    for (int c = 0; c < t->nc; c++) {
      double dT = P->tot[c] - s->tot_last[c];
      if (dT == 0 || P->kind[c] != EQPI_ROW_MASS) continue;
      int k = P->xidx[c];
      if (k < 0) {                   /* a spectator moves the ionic strength alone */
        b[n - 1] -= 0.5 * t->z2[t->comp_sp[c]] * dT / Ic;
      } else if (c != h) {
        b[k] += dT / s->S_last[k];
      }
      if (P->kind[h] == EQPI_ROW_MASS)
        b[P->xidx[h]] += (c == h ? dT : -P->href[c] * dT) / s->S_last[P->xidx[h]];
    }
    eqpi_newton_lu_solve(s->ws, b);
    for (int k = 0; k < n; k++) big = fabs(b[k]) > big ? fabs(b[k]) : big;
    if (big <= 1.0) {
      for (int k = 0; k < n; k++) u[k] += b[k];
      moved = 1;
    }
  }
  if (!moved)
    for (int k = 0; k < nx; k++) {
      int c = P->xcomp[k];
      if (c != h && P->kind[c] == EQPI_ROW_MASS && s->tot_last[c] > 0 && P->tot[c] > 0)
        u[k] += log(P->tot[c] / s->tot_last[c]);
    }
  double r = residual_at(P, u);
  if (P->kind[h] == EQPI_ROW_MASS && !(fabs(P->F[P->xidx[h]]) <= 0.1)) {
    proton_correct(s, u, r);
    r = INFINITY;     /* not known for the start kept */
  }
  return r;
}

/* Cold start: the proton balance of the ideal solution, the ideal problem
** from there, then the proton balance again with the activity coefficients
** of that state, kept if it lowers the residual. */
static void cold_start(eqpi_system *s, double *u, long *iters)
{
  eqpi_problem *P = s->prob;
  const int n = P->n, h = s->tab->hloc;
  for (int k = 0; k < P->nx; k++) {
    int c = P->xcomp[k];
    u[k] = c == h ? log(1e-7) : log(P->tot[c] > TINY ? P->tot[c] : TINY);
  }
  u[n - 1] = 0;
  int evals = 0, it = 0, closed = 1;
  for (int k = 0; k < P->nx; k++) closed &= P->xcomp[k] == h || s->tab->closed[P->xcomp[k]];
  /* for acid ladders alone the proton balance gives the ideal solution;
  ** with complexes, whose components it holds, it can be far off */
  if (closed) eqpi_start_proton(P, u, NULL, &evals);
  s->start_evals += evals;
  eqpi_start_ideal(P, u, s->work, s->cols, &it);
  *iters += it;
  double lam = P->lambda;
  eqpi_problem_set_lambda(P, 1);
  proton_correct(s, u, residual_at(P, u));
  eqpi_problem_set_lambda(P, lam);
}

/* ------------------------------------------------------------ solving */

int eqpi_system_fail_converge(eqp_ctx *ctx, eqpi_system *s, eqpi_newton *ws, int flag,
                              long iters)
{
  eqpi_problem *P = s->prob;
  if (P->plugin_failed)
    return eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s' failed: %s",
                     P->model->desc->name, P->plugin_err);
  char res[512], names[256], fname[64];
  size_t used = 0;
  eqpi_problem_set_lambda(P, 1);
  res[0] = names[0] = '\0';
  if (eqpi_problem_eval(P, eqpi_newton_u(ws), P->F) == 0)
    for (int k = 0; k < P->n && used < sizeof res; k++)
      used += (size_t)snprintf(res + used, sizeof res - used, "%s%s %.2e", k ? ", " : "",
                               eqpi_problem_row_name(P, k), P->F[k]);
  used = 0;
  for (int k = 0; k < P->nx && used < sizeof names; k++)
    used += (size_t)snprintf(names + used, sizeof names - used, "%s%s", k ? ", " : "",
                             eqpi_problem_row_name(P, k));
  return eqpi_fail(ctx, EQP_E_CONVERGE, "no convergence for the system {%s} at %.2f C with "
                   "model '%s': KINSOL stopped with %s after %ld iterations%s%s; last scaled "
                   "residuals: %s", names, s->tab->T - 273.15, P->model->desc->name,
                   eqpi_newton_flag_name(flag, fname, sizeof fname), iters,
                   ws->kin_err[0] ? ": " : "", ws->kin_err, res);
}

/* Continuation in the activity model, ideal -> full: each stage starts from
** the last converged one; a failed stage is retried with half the
** increment, down to 1/256. */
static int continuation(eqpi_system *s, double *u, long *iters)
{
  eqpi_problem *P = s->prob;
  int it = 0, flag = -1;
  cold_start(s, u, iters);
  eqpi_start_ideal(P, u, s->work, s->cols, &it);
  *iters += it;
  double lam = 0, step = 0.25;
  while (lam < 1 && step >= 1.0 / 256 && !P->plugin_failed) {
    double next = lam + step < 1 ? lam + step : 1;
    eqpi_problem_set_lambda(P, next);
    flag = eqpi_newton_run(s->ws, P, u, 200, iters);
    if (flag >= 0) {
      memcpy(u, eqpi_newton_u(s->ws), sizeof(double) * (size_t)P->n);
      lam = next;
      step *= 1.5;
    } else {
      step *= 0.5;
    }
  }
  if (lam < 1 && flag >= 0) flag = KIN_MAXITER_REACHED;
  return flag;
}

/* KINSOL stops at a scaled residual of 1e-13; a balance that a large
** neutral total dominates can still be short of 1e-10 in the charge.
** Polish with full Newton steps on the Jacobian, which converge to
** rounding. Returns the residual at ufin, which it may move. */
static double polish(eqpi_system *s, double *ufin, double r, int *worst, long *iters)
{
  eqpi_problem *P = s->prob;
  double *u = s->work;
  for (int k = 0; k < 3 && !(r <= EQPI_VERIFY_TOL); k++) {
    if (eqpi_newton_factor(s->ws, P, ufin) < 0) break;
    for (int j = 0; j < P->n; j++) u[j] = -P->F[j];
    eqpi_newton_lu_solve(s->ws, u);
    for (int j = 0; j < P->n; j++) u[j] += ufin[j];
    int w2;
    double r2 = eqpi_problem_verify(P, u, &w2);
    if (!(r2 < r)) break;
    memcpy(ufin, u, sizeof(double) * (size_t)P->n);
    r = r2;
    *worst = w2;
    (*iters)++;
  }
  return eqpi_problem_verify(P, ufin, worst);   /* leaves the state at the accepted point */
}

int eqpi_system_solve_prepared(eqp_ctx *ctx, eqpi_system *s, eqpi_solve_stats *stats)
{
  eqpi_problem *P = s->prob;
  const int n = P->n;
  double u[EQPI_MAX_AMOUNTS + 64], *uh = n <= 64 ? u : eqpi_malloc(ctx, sizeof(double) * (size_t)n);
  if (!uh) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  long iters = 0;
  int flag = -1, rc;
  P->plugin_failed = 0;
  s->start_evals = 0;
  eqpi_problem_set_lambda(P, 1);
  if (s->solved) {
    double r0 = warm_start(s, uh);
    if (r0 <= NEAR) flag = eqpi_newton_run_full(s->ws, P, uh, NEAR_ITERS, &iters);
    /* a model that failed at a full step may hold where the line search
    ** steps: it gets its chance from the same start */
    if (flag < 0 && r0 <= NEAR) P->plugin_failed = 0;
    if (flag < 0 && !P->plugin_failed)
      flag = eqpi_newton_run(s->ws, P, uh, WARM_ITERS, &iters);
  }
  if (flag < 0 && !P->plugin_failed) {
    cold_start(s, uh, &iters);
    eqpi_problem_set_lambda(P, 1);
    flag = eqpi_newton_run(s->ws, P, uh, FULL_ITERS, &iters);
  }
  if (flag < 0 && !P->plugin_failed) flag = continuation(s, uh, &iters);
  eqpi_problem_set_lambda(P, 1);
  s->solved = false;
  s->lu_near_last = false;
  if (flag < 0) {
    rc = eqpi_system_fail_converge(ctx, s, s->ws, flag, iters);
    goto out;
  }
  int worst;
  double *ufin = eqpi_newton_u(s->ws);
  double r = eqpi_problem_verify(P, ufin, &worst);
  if (!(r <= EQPI_VERIFY_TOL)) r = polish(s, ufin, r, &worst, &iters);
  if (!(r <= EQPI_VERIFY_TOL)) {
    char fname[64];
    if (worst > n)
      rc = eqpi_fail(ctx, EQP_E_VERIFY, "refusing the result: after the solve the molality "
                     "or activity coefficient of %s is not a finite number (model '%s', "
                     "%.2f C)", eqpi_problem_row_name(P, worst), P->model->desc->name,
                     s->tab->T - 273.15);
    else
      rc = eqpi_fail(ctx, EQP_E_VERIFY, "refusing the result: after the solve the %s balance "
                     "has relative residual %.3e (limit %.0e), KINSOL %s after %ld iterations",
                     eqpi_problem_row_name(P, worst), r, EQPI_VERIFY_TOL,
                     eqpi_newton_flag_name(flag, fname, sizeof fname), iters);
    goto out;
  }
  eqpi_vcopy(s->u_last, ufin, n);
  eqpi_vcopy(s->tot_last, P->tot, s->tab->nc);
  eqpi_vcopy(s->S_last, P->S, n);
  s->S_last[n - 1] = P->Ic;     /* the ionic strength row keeps the computed I */
  s->solved = true;
  s->lu_near_last = s->ws->jac_ok && s->ws->n == n;
  if (stats) {
    stats->iterations = iters;
    stats->residual = r;
    stats->missing_T = s->tab->missing_T;
    stats->outside_T = s->tab->outside_T;
    stats->model_note = P->bind_warn;
  }
  rc = EQP_OK;
out:
  if (uh != u) eqpi_free(ctx, uh, sizeof(double) * (size_t)n);
  return rc;
}

int eqpi_system_solve(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp, const double *totals,
                      double T, eqpi_model *model, eqpi_solve_stats *stats)
{
  return eqpi_system_solve_mask(ctx, db, sysp, totals, NULL, T, model, stats);
}

int eqpi_system_solve_mask(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp,
                           const double *totals, const unsigned char *mask, double T,
                           eqpi_model *model, eqpi_solve_stats *stats)
{
  int rc = prepare(ctx, db, sysp, totals, mask, T, model, NULL);
  if (rc < 0) return rc;
  return eqpi_system_solve_prepared(ctx, *sysp, stats);
}

int eqpi_system_nspecies(const eqpi_system *sys) { return sys ? sys->tab->ns : 0; }

const eqpi_model *eqpi_system_model(const eqpi_system *s) { return s ? s->prob->model : NULL; }

int eqpi_system_species(const eqpi_system *sys, int i, double *m, double *lg)
{
  *m = sys->prob->m[i];
  *lg = sys->prob->lg[i];
  return sys->tab->sp[i];
}

double eqpi_system_ionic_strength(const eqpi_system *sys)
{
  return eqpi_problem_ionic_strength(sys->prob);
}
