/* Adjustments: the amounts of reagents that bring activities (the pH, a
** free metal ion, a dissolved gas) or the ionic strength to targets, in one
** solve of the problem with the amounts as unknowns; Brent's method on
** ordinary solves as the fallback. And the derivative of such a measure
** (dpH/dv among them) at a solved state, by implicit differentiation. */
/* SPDX-License-Identifier: MIT */
#include "system_impl.h"
#include "brent_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define TINY 1e-300

/* ------------------------------------------------------------ derivatives */

#define ABSENT (-2)

/* Local species of a database species in the tableau, or ABSENT. */
static int local_species(const eqpi_tableau *t, int g)
{
  for (int i = 0; i < t->ns; i++)
    if (t->sp[i] == g) return i;
  return ABSENT;
}

/* The species whose activity a target holds (local index), EQPI_TARGET_IONIC,
** or ABSENT. */
static int target_of(const eqpi_system *s, const eqpi_adjust *aj)
{
  if (aj->kind == EQPI_ADJ_IONIC) return EQPI_TARGET_IONIC;
  if (aj->kind == EQPI_ADJ_PH) return s->tab->comp_sp[s->tab->hloc];
  return local_species(s->tab, aj->species);
}

/* d(ln a of species X, or ln I)/dv at the last solved state for v units
** of a direction (a over the local components, w kg of water per unit) in
** W kg of water; dI_absent as in eqpi_sys_dpH. */
static int derivative(eqpi_system *s, const double *a, double w, double W, double dI_absent,
                      int X, int molal, double *d)
{
  eqpi_problem *P = s->prob;
  const eqpi_tableau *t = s->tab;
  const int n = P->n, nc = t->nc, h = t->hloc;
  if (eqpi_newton_factor(s->ws, P, s->u_last) < 0) return -1;
  s->lu_near_last = true;
  double *b = s->work, Ic = P->Ic > TINY ? P->Ic : TINY, *dT = P->w_nc[1];
  for (int k = 0; k < n; k++) b[k] = 0;
  b[n - 1] = -dI_absent / Ic;
  for (int c = 0; c < nc; c++) dT[c] = (a[c] - P->tot[c] * w) / W;  /* d total / dv, mol/kg */
  for (int c = 0; c < nc; c++) {
    int k = P->xidx[c];
    if (k < 0) {
      /* a spectator's molality is its total: it moves I alone */
      b[n - 1] -= 0.5 * t->z2[t->comp_sp[c]] * dT[c] / Ic;
    } else if (P->kind[c] == EQPI_ROW_MASS) {
      double e = dT[c];
      if (c == h)   /* the H+ row's total is T_H - sum href T_c */
        for (int j = 0; j < nc; j++) e -= P->href[j] * dT[j];
      b[k] = e / P->S[k];      /* -dF/dv for F = (sum c m - T)/S */
    }
  }
  eqpi_newton_lu_solve(s->ws, b);  /* du/dv = -J^-1 dF/dv */
  if (X == EQPI_TARGET_IONIC) {
    *d = b[n - 1];
  } else {
    double v = 0;
    for (int k = t->row[X]; k < t->row[X + 1]; k++) {
      int c = t->cmp[k], j = P->xidx[c];
      double dx = j >= 0 ? b[j] : dT[c] / (P->tot[c] > TINY ? P->tot[c] : TINY);
      v += t->nu[k] * (dx + P->dlng[t->comp_sp[c]] * b[n - 1]);
    }
    *d = molal ? v - P->dlng[X] * b[n - 1] : v;
  }
  return isfinite(*d) ? 0 : -1;
}

int eqpi_sys_dpH(eqpi_system *sys, const double *a, double w, double W, double dI_absent,
                 double *dpH)
{
  double d;
  if (derivative(sys, a, w, W, dI_absent, sys->tab->comp_sp[sys->tab->hloc], 0, &d) < 0) return -1;
  *dpH = -d / EQPI_LN10;
  return 0;
}

/* Local direction of the system from the global one. */
static void local_dir(const eqpi_system *s, const double *g, double *l)
{
  for (int c = 0; c < s->tab->nc; c++) l[c] = g[s->tab->comp[c]];
}

/* d(ionic strength)/dv of components the direction brings that the system
** does not have yet: they enter as spectators. */
static double absent_dI(eqp_ctx *ctx, const eqpi_system *s, const double *a_global, double W)
{
  const eqpi_db *db = s->tab->db;
  double dI = 0;
  for (int c = 0; c < db->ncomp; c++)
    if (a_global[c] != 0 && (c >= s->tab->ncg || !s->tab->active[c]) &&
        db->comp_species[c] != db->water) {
      double z = db->sp[db->comp_species[c]].comp.charge;
      dI += 0.5 * z * z * a_global[c] / W;
    }
  return dI;
}

static int measure_slope(eqp_ctx *ctx, eqpi_system *s, const double *a_global, double w,
                         double W, int X, int molal, double *d)
{
  double stack[64], *a = s->tab->nc <= 64 ? stack
                                          : eqpi_malloc(ctx, sizeof(double) * (size_t)s->tab->nc);
  if (!a) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  local_dir(s, a_global, a);
  int rc = derivative(s, a, w, W, absent_dI(ctx, s, a_global, W), X, molal, d) < 0
             ? eqpi_fail(ctx, EQP_E_CONVERGE, "the Jacobian is singular at this state")
             : EQP_OK;
  if (a != stack) eqpi_free(ctx, a, sizeof(double) * (size_t)s->tab->nc);
  return rc;
}

int eqpi_system_dpH(eqp_ctx *ctx, eqpi_system *s, const double *a_global, double w, double W,
                    double *dpH)
{
  if (!s || !s->solved) return eqpi_fail(ctx, EQP_E_ARG, "solve the solution first");
  double d;
  int rc = measure_slope(ctx, s, a_global, w, W, s->tab->comp_sp[s->tab->hloc], 0, &d);
  if (rc == EQP_OK) *dpH = -d / EQPI_LN10;
  return rc;
}

/* d(ln a of a library species)/dv at the solved state (a closed
** headspace couples its gases through these: headspace.c). */
int eqpi_system_dlna(eqp_ctx *ctx, eqpi_system *s, const double *a_global, double w, double W,
                     int species, double *d)
{
  if (!s || !s->solved) return eqpi_fail(ctx, EQP_E_ARG, "solve the solution first");
  int X = local_species(s->tab, species);
  if (X == ABSENT) return eqpi_fail(ctx, EQP_E_ARG, "the species is absent from the solution");
  return measure_slope(ctx, s, a_global, w, W, X, 0, d);
}

/* ------------------------------------------------------------ measures */

/* The target in ln units: ln a, or ln I. */
static double ln_target(const eqpi_adjust *aj)
{
  return aj->kind == EQPI_ADJ_PH ? -aj->pH * EQPI_LN10 : log(aj->value);
}

/* The measure of a target at the solved state, ln units. */
static double ln_measure(const eqpi_system *s, const eqpi_adjust *aj)
{
  const eqpi_problem *P = s->prob;
  int X = target_of(s, aj);
  if (X == EQPI_TARGET_IONIC) return log(eqpi_problem_ionic_strength(P));
  return aj->kind == EQPI_ADJ_FREE ? log(P->m[X]) : log(P->m[X]) + P->lng[X];
}

/* An adjustment in progress: the targets, their amounts, and the totals. */
typedef struct adj {
  eqp_ctx *ctx;
  const eqpi_db *db;    /* the library of the solution */
  eqpi_system **sysp;
  const eqpi_adjust *aj;
  int n;
  double *v;            /* n amounts */
  double *tot;          /* ncomp + 1 */
  double *extra;        /* ncomp + 1: the components any direction brings */
  eqpi_solve_stats *st;
  int k;                /* the target a 1-D search moves */
} adj;

/* Normal solve with the amounts v. */
static int solve_at(adj *A)
{
  eqp_ctx *ctx = A->ctx;
  const eqpi_adjust *aj = A->aj;
  const eqpi_db *db = A->db;
  double W = aj[0].W0;
  for (int k = 0; k < A->n; k++) W += A->v[k] * aj[k].w;
  for (int c = 0; c < db->ncomp; c++) {
    double N = aj[0].N0[c];
    for (int k = 0; k < A->n; k++) N += A->v[k] * aj[k].a[c];
    A->tot[c] = N / W;
  }
  int rc = eqpi_system_prepare(ctx, db, A->sysp, A->tot, aj[0].T, aj[0].model, A->extra);
  if (rc < 0) return rc;
  return eqpi_system_solve_prepared(ctx, *A->sysp, A->st);
}

/* ln measure - ln target of target A->k with its amount at x (Brent). */
static int miss(void *ud, double x, double *f)
{
  adj *A = ud;
  A->v[A->k] = x;
  int rc = solve_at(A);
  if (rc < 0) return rc;
  eqpi_system *s = *A->sysp;
  *f = ln_measure(s, &A->aj[A->k]) - ln_target(&A->aj[A->k]);
  return 0;
}

/* ------------------------------------------------------------ one solve */

/* The totals of the mass-balance rows back to the last solved state. */
static void restore_totals(eqpi_system *s)
{
  eqpi_problem *P = s->prob;
  for (int c = 0; c < s->tab->nc; c++)
    if (P->kind[c] == EQPI_ROW_MASS) {
      P->tot[c] = s->tot_last[c];
      P->lnfix[c] = log(P->tot[c] > TINY ? P->tot[c] : TINY);
    }
  P->at_ok = 0;
}

int eqpi_adjust_add_targets(eqpi_system *s, const eqpi_adjust *aj, int n, const double *vlin)
{
  for (int k = 0; k < n; k++)
    if (target_of(s, &aj[k]) == ABSENT) return -1;
  for (int k = 0; k < n; k++) {
    /* v = u scale: the scale keeps u near 1 for KINSOL's step limits; the
    ** linear estimate alone can be far too small in an unbuffered solution */
    double sc = isfinite(vlin[k]) ? fmin(fmax(fabs(vlin[k]), 1e-3 * aj[k].vmax), aj[k].vmax)
                                  : aj[k].vmax;
    if (eqpi_problem_add_amount(s->prob, aj[0].N0, aj[0].W0, aj[k].a, aj[k].w, sc,
                                target_of(s, &aj[k]), aj[k].kind == EQPI_ADJ_FREE,
                                ln_target(&aj[k])) < 0)
      return -1;
  }
  return 0;
}

/* The problem with the amounts as unknowns, from the solved state at A->v
** toward the linear estimate vlin (which sets the scale of each unknown).
** 0 and A->v set on success; -1 otherwise (the system is left as it was). */
static int amounts_kinsol(adj *A, const double *vlin)
{
  eqp_ctx *ctx = A->ctx;
  eqpi_system *s = *A->sysp;
  eqpi_problem *P = s->prob;
  const eqpi_tableau *t = s->tab;
  const eqpi_adjust *aj = A->aj;
  const int nc = t->nc;
  if (eqpi_problem_at(P, s->u_last) < 0) return -1;
  double lnI = s->u_last[P->n - 1], *lnfree = s->work;
  memcpy(lnfree, P->lnfree, sizeof(double) * (size_t)nc);
  if (eqpi_adjust_add_targets(s, aj, A->n, vlin) < 0) return -1;
  eqpi_problem_layout(P);
  eqpi_newton *ws = eqpi_newton_get(ctx, P->n);
  int ok = -1;
  if (ws) {
    double *uh = eqpi_malloc(ctx, sizeof(double) * (size_t)P->n);
    if (uh) {
      for (int c = 0; c < nc; c++)
        if (P->xidx[c] >= 0) uh[P->xidx[c]] = lnfree[c];
      for (int k = 0; k < A->n; k++) uh[P->nx + k] = A->v[k] / P->amt[k].scale;
      uh[P->n - 1] = lnI;
      long iters = 0;
      int worst, flag = eqpi_newton_run(ws, P, uh, 200, &iters);
      double *uf = eqpi_newton_u(ws);
      if (flag >= 0 && eqpi_problem_verify(P, uf, &worst) <= EQPI_VERIFY_TOL) {
        ok = 0;
        for (int k = 0; k < A->n; k++) {
          A->v[k] = uf[P->nx + k] * P->amt[k].scale;
          ok |= A->v[k] >= aj[k].vmin && A->v[k] <= aj[k].vmax ? 0 : -1;
        }
        memcpy(lnfree, P->lnfree, sizeof(double) * (size_t)nc);
        lnI = uf[P->n - 1];
        if (A->st) A->st->iterations = iters;
      }
      eqpi_free(ctx, uh, sizeof(double) * (size_t)P->n);
    }
    eqpi_newton_put(ctx, ws);
  }
  eqpi_problem_clear_amounts(P);
  eqpi_problem_layout(P);
  s->lu_near_last = false;
  if (ok < 0) {
    restore_totals(s);
    return -1;
  }
  /* back to the normal form at the solution: each unknown is ln m again */
  for (int c = 0; c < nc; c++)
    if (P->xidx[c] >= 0) s->u_last[P->xidx[c]] = lnfree[c];
  s->u_last[P->n - 1] = lnI;
  for (int c = 0; c < nc; c++) P->lnfix[c] = log(P->tot[c] > TINY ? P->tot[c] : TINY);
  memcpy(s->tot_last, P->tot, sizeof(double) * (size_t)nc);
  int worst;
  if (!(eqpi_problem_verify(P, s->u_last, &worst) <= EQPI_VERIFY_TOL)) {
    s->solved = false;
    return -1;
  }
  memcpy(s->S_last, P->S, sizeof(double) * (size_t)P->n);
  s->S_last[P->n - 1] = P->Ic;
  s->solved = true;
  return 0;
}

/* ------------------------------------------------------------ messages */

static int unreachable(eqp_ctx *ctx, const eqpi_system *s, const eqpi_adjust *aj, double now,
                       double slope, const char *even)
{
  const char *dir = slope < 0 ? "lowers" : "raises";
  if (aj->kind == EQPI_ADJ_PH) {
    double pH = -now / EQPI_LN10;
    if (even)
      return eqpi_fail(ctx, EQP_E_INPUT, "pH %.3f is out of reach with %s: even %s brings it "
                       "only to %.3f", aj->pH, aj->what, even, pH);
    return eqpi_fail(ctx, EQP_E_INPUT, "pH %.3f is out of reach with %s: adding it %s the pH "
                     "(now %.3f)", aj->pH, aj->what, slope < 0 ? "raises" : "lowers", pH);
  }
  const char *what = aj->kind == EQPI_ADJ_IONIC ? "the ionic strength"
                                                : s->tab->db->sp[aj->species].name;
  const char *unit = aj->kind == EQPI_ADJ_ACTIVITY ? "" : " mol/kg";
  const char *of = aj->kind == EQPI_ADJ_ACTIVITY ? "activity " :
                   aj->kind == EQPI_ADJ_FREE ? "free molality " : "";
  (void)s;
  if (even)
    return eqpi_fail(ctx, EQP_E_INPUT, "%s %s%.4g%s is out of reach with %s: even %s brings it "
                     "only to %.4g%s", what, of, aj->value, unit, aj->what, even, exp(now), unit);
  return eqpi_fail(ctx, EQP_E_INPUT, "%s %s%.4g%s is out of reach with %s: adding it %s it (now "
                   "%.4g%s)", what, of, aj->value, unit, aj->what, dir, exp(now), unit);
}

/* ------------------------------------------------------------ the search */

/* One target alone by Brent's method on ordinary solves between v0 and the
** bound on the side of the target (a measure of an acid, a base, a salt or
** a gas is monotone in its amount); the system is left at the root. */
static int brent_one(adj *A, int k, double slope)
{
  const eqpi_adjust *aj = &A->aj[k];
  double f0, fb, root;
  A->k = k;
  int rc = miss(A, aj->v0, &f0);
  if (rc < 0 || f0 == 0) return rc;
  int up = f0 * slope < 0;          /* more of it moves the measure toward the target */
  double bound = up ? aj->vmax : aj->vmin;
  if (bound == aj->v0) return rc;   /* past it already: v0 is the nearest */
  if ((rc = miss(A, bound, &fb)) < 0) return rc;
  if ((fb < 0) == (f0 < 0)) {
    eqpi_system *s = *A->sysp;
    if (!up && aj->floor_ok) return rc;   /* even the least there may be is above it */
    return unreachable(A->ctx, s, aj, ln_measure(s, aj), slope,
                       up ? aj->vmax_text : "the least the solution can hold");
  }
  rc = eqpi_brent_root(miss, A, up ? aj->v0 : bound, up ? bound : aj->v0, up ? f0 : fb,
                       up ? fb : f0, 0.0, 200, &root);
  if (rc < 0 && rc != EQPI_BRENT_MAXIT) return rc > -1000 ? rc : EQP_E_CONVERGE;
  return miss(A, root, &f0);
}

int eqpi_system_adjust(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp,
                       const eqpi_adjust *aj, int n, double *v_out, eqpi_solve_stats *st)
{
  if (n < 1 || n > EQPI_MAX_TARGETS) return eqpi_fail(ctx, EQP_E_ARG, "1 to %d targets",
                                                      EQPI_MAX_TARGETS);
  size_t nb = (size_t)db->ncomp + 1;
  double *tot = eqpi_calloc(ctx, 2 * nb, sizeof(double));
  if (!tot) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  double v[EQPI_MAX_TARGETS], now[EQPI_MAX_TARGETS], want[EQPI_MAX_TARGETS];
  double D[EQPI_MAX_TARGETS * EQPI_MAX_TARGETS], vlin[EQPI_MAX_TARGETS];
  adj A = {ctx, db, sysp, aj, n, v, tot, tot + nb, st, 0};
  for (int k = 0; k < n; k++) {
    v[k] = aj[k].v0;
    for (int c = 0; c < db->ncomp; c++) A.extra[c] += fabs(aj[k].a[c]);
  }
  int rc = solve_at(&A), done = 1;
  eqpi_system *s = *sysp;
  double W = aj[0].W0;
  for (int k = 0; k < n; k++) W += v[k] * aj[k].w;
  for (int k = 0; k < n && rc == EQP_OK; k++) {
    int X = target_of(s, &aj[k]);
    if (X == ABSENT) {
      rc = eqpi_fail(ctx, EQP_E_INPUT, "%s is not in this solution",
                     db->sp[aj[k].species].name);
      break;
    }
    now[k] = ln_measure(s, &aj[k]);
    want[k] = ln_target(&aj[k]);
    done &= fabs(now[k] - want[k]) < 1e-12 * EQPI_LN10;
    for (int j = 0; j < n && rc == EQP_OK; j++)
      rc = measure_slope(ctx, s, aj[j].a, aj[j].w, W, X, aj[k].kind == EQPI_ADJ_FREE,
                         &D[k * n + j]);
  }
  if (rc < 0 || done) goto out;
  /* a single target the reagent moves the wrong way is refused at once */
  if (n == 1 && aj[0].vmin >= aj[0].v0 && (want[0] - now[0]) * D[0] <= 0) {
    rc = unreachable(ctx, s, &aj[0], now[0], D[0], NULL);
    goto out;
  }
  /* the linear estimate: D (v - v0) = want - now */
  {
    double M[EQPI_MAX_TARGETS * EQPI_MAX_TARGETS];
    int piv[EQPI_MAX_TARGETS];
    memcpy(M, D, sizeof(double) * (size_t)(n * n));
    for (int k = 0; k < n; k++) vlin[k] = want[k] - now[k];
    if (eqpi_lu_factor(M, piv, n) == 0) eqpi_lu_solve(M, piv, n, vlin);
    else for (int k = 0; k < n; k++) vlin[k] = NAN;
    for (int k = 0; k < n; k++) vlin[k] += v[k];
  }
  if (amounts_kinsol(&A, vlin) == 0) goto out;
  /* Fallback: each target by Brent's method on ordinary solves, the
  ** others held, sweeping until all hold together */
  for (int k = 0; k < n; k++) v[k] = aj[k].v0;
  if (n == 1) {
    rc = brent_one(&A, 0, D[0]);
    goto out;
  }
  for (int sweep = 0; sweep < 40; sweep++) {
    for (int k = 0; k < n && rc == EQP_OK; k++) rc = brent_one(&A, k, D[k * n + k]);
    if (rc < 0) goto out;
    double worst = 0;
    for (int k = 0; k < n && rc == EQP_OK; k++) {
      double f;
      A.k = k;
      rc = miss(&A, v[k], &f);
      worst = fmax(worst, fabs(f));
    }
    if (rc < 0 || worst < 1e-10) break;
    if (sweep == 39) rc = eqpi_fail(ctx, EQP_E_CONVERGE, "the targets could not be met together");
  }
out:
  if (rc == EQP_OK) memcpy(v_out, v, sizeof(double) * (size_t)n);
  eqpi_free(ctx, tot, 2 * nb * sizeof(double));
  return rc;
}

/* ------------------------------------------------------------ fixed activity */

/* Local component of a database component, or -1. */
static int local_comp(const eqpi_tableau *t, int g)
{
  for (int c = 0; c < t->nc; c++)
    if (t->comp[c] == g) return c;
  return -1;
}

/* The rows of comp and counter back to mass balances, with the totals tc and
** tq (mol/kg), and the state at the solution lnfree, lnI when ok. */
static void unfix(eqpi_system *s, int c, int q, double tc, double tq, const double *lnfree,
                  double lnI, int ok)
{
  eqpi_problem *P = s->prob;
  const int nc = s->tab->nc;
  eqpi_problem_set_row(P, c, EQPI_ROW_MASS, 0);
  eqpi_problem_set_row(P, q, EQPI_ROW_MASS, 0);
  eqpi_problem_layout(P);
  s->lu_near_last = false;
  if (!ok) {
    restore_totals(s);
    return;
  }
  P->tot[c] = tc;
  P->tot[q] = tq;
  for (int k = 0; k < nc; k++) P->lnfix[k] = log(P->tot[k] > TINY ? P->tot[k] : TINY);
  for (int k = 0; k < nc; k++)
    if (P->xidx[k] >= 0) s->u_last[P->xidx[k]] = lnfree[k];
  s->u_last[P->n - 1] = lnI;
  memcpy(s->tot_last, P->tot, sizeof(double) * (size_t)nc);
}

int eqpi_system_fix(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp, const double *totals,
                    double T, eqpi_model *model, int comp, double lna, int counter, double *tc,
                    double *tq)
{
  size_t nb = (size_t)db->ncomp + 1;
  double *tot = eqpi_calloc(ctx, 2 * nb, sizeof(double)), *extra = tot + nb;
  if (!tot) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  memcpy(tot, totals, sizeof(double) * (size_t)db->ncomp);
  /* an absent component enters as a trace, its charge taken from H+'s total */
  int hplus = db->sp[db->h_plus].component, both[2] = {comp, counter};
  for (int j = 0; j < 2; j++)
    if (tot[both[j]] <= 0 && both[j] != hplus) {
      double z = db->sp[db->comp_species[both[j]]].comp.charge;
      tot[both[j]] = 1e-12;
      tot[hplus] -= z * 1e-12;
    }
  extra[comp] = extra[counter] = 1;
  int rc = eqpi_system_prepare(ctx, db, sysp, tot, T, model, extra);
  if (rc == EQP_OK) rc = eqpi_system_solve_prepared(ctx, *sysp, NULL);
  eqpi_free(ctx, tot, 2 * nb * sizeof(double));
  if (rc < 0) return rc;
  eqpi_system *s = *sysp;
  eqpi_problem *P = s->prob;
  const int nc = s->tab->nc, c = local_comp(s->tab, comp), q = local_comp(s->tab, counter);
  if (eqpi_problem_at(P, s->u_last) < 0) return eqpi_fail(ctx, EQP_E_CONVERGE, "model failed");
  double *lnfree = s->work, lnI = s->u_last[P->n - 1];
  memcpy(lnfree, P->lnfree, sizeof(double) * (size_t)nc);
  eqpi_problem_set_row(P, c, EQPI_ROW_ACTIVITY, lna);
  eqpi_problem_set_row(P, q, EQPI_ROW_CHARGE, 0);
  eqpi_problem_layout(P);
  eqpi_problem_set_totals(P, totals);   /* without the traces: they were for the start only */
  eqpi_newton *ws = eqpi_newton_get(ctx, P->n);
  double *u = ws ? eqpi_malloc(ctx, sizeof(double) * (size_t)P->n) : NULL;
  int ok = 0, flag = -1;
  long iters = 0;
  if (u) {
    for (int k = 0; k < nc; k++)
      if (P->xidx[k] >= 0) u[P->xidx[k]] = lnfree[k];
    u[P->n - 1] = lnI;
    flag = eqpi_newton_run(ws, P, u, 200, &iters);
    int worst;
    if (flag >= 0 && eqpi_problem_verify(P, eqpi_newton_u(ws), &worst) <= EQPI_VERIFY_TOL) {
      ok = 1;
      eqpi_problem_outputs(P);
      *tc = P->tot[c];
      *tq = P->tot[q];
      memcpy(lnfree, P->lnfree, sizeof(double) * (size_t)nc);
      lnI = eqpi_newton_u(ws)[P->n - 1];
    }
    eqpi_free(ctx, u, sizeof(double) * (size_t)P->n);
  }
  if (!ok && ws) eqpi_system_fail_converge(ctx, s, ws, flag, iters);
  eqpi_newton_put(ctx, ws);
  unfix(s, c, q, ok ? *tc : 0, ok ? *tq : 0, lnfree, lnI, ok);
  if (!ok) {
    s->solved = false;
    return eqp_ctx_errcode(ctx) < 0 ? eqp_ctx_errcode(ctx) : EQP_E_NOMEM;
  }
  int worst;
  if (!(eqpi_problem_verify(P, s->u_last, &worst) <= EQPI_VERIFY_TOL)) {
    s->solved = false;
    return eqpi_fail(ctx, EQP_E_VERIFY, "refusing the result: the %s balance does not close "
                     "after the fixed-activity solve", eqpi_problem_row_name(P, worst));
  }
  memcpy(s->S_last, P->S, sizeof(double) * (size_t)P->n);
  s->S_last[P->n - 1] = P->Ic;
  s->solved = true;
  return EQP_OK;
}
