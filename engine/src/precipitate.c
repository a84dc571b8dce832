/* Solids that form or dissolve: an active set of phases. A phase present
** is an unknown amount of the problem with its solid-phase row (log IAP =
** log Ksp), its composition leaving the solution's totals, so that each
** set is one Newton solve (with continuation in the target of a phase
** that joins far supersaturated); the most supersaturated allowed phase
** joins, a phase whose amount comes out negative leaves. Design and
** measurements: docs/methods.md. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include "system_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_PHASES EQPI_MAX_SOLIDS_PRESENT   /* the phase rule caps it lower */
#define MAX_ROUNDS 24      /* additions and removals of the active set */
#define SET_ITERS 40       /* Newton iterations for the solve of one set at once */
#define STEP_ITERS 40      /* and for each step of the continuation */
#define TINY 1e-300
#define SAT_TOL 1e-12      /* its saturation rows, ln units */
#define SI_ON 1e-10        /* a phase joins above this saturation index */

/* ------------------------------------------------------------ choice */

int eqp_solution_allow_solids(eqp_solution *s, const char *const *names, size_t n)
{
  if (!s || (n && !names)) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  const eqpi_db *db = s->db;
  int ns = db->nsolids;
  unsigned char *flags = eqpi_calloc(s->ctx, (size_t)(ns > 0 ? ns : 1), 1);
  if (!flags) return eqpi_fail(s->ctx, EQP_E_NOMEM, "out of memory");
  for (size_t i = 0; i < n; i++) {
    int k = names[i] ? eqpi_db_find_solid(db, names[i]) : -1;
    if (k == -2) {
      char which[256];
      eqpi_db_solids_with_formula(db, names[i], which, sizeof which);
      eqpi_free(s->ctx, flags, (size_t)(ns > 0 ? ns : 1));
      return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "'%s' names several solids (%s): name the one "
                       "you mean", names[i], which);
    }
    if (k < 0) {
      char list[512] = "";
      size_t m = 0;
      for (int j = 0; j < ns && m < sizeof list; j++)
        m += (size_t)snprintf(list + m, sizeof list - m, "%s%s", j ? ", " : "", db->solids[j].name);
      eqpi_free(s->ctx, flags, (size_t)(ns > 0 ? ns : 1));
      return eqpi_fail(s->ctx, EQP_E_UNKNOWN, "unknown solid '%s' (the library's solids: %s)",
                       names[i] ? names[i] : "(null)", ns ? list : "none");
    }
    flags[k] = 1;
  }
  eqpi_free(s->ctx, s->allow, (size_t)(s->nallow > 0 ? s->nallow : 1));
  s->allow = n ? flags : NULL;
  s->nallow = n ? ns : 0;
  if (!n) eqpi_free(s->ctx, flags, (size_t)(ns > 0 ? ns : 1));
  s->allow_all = 0;
  return EQP_OK;
}

int eqp_solution_allow_all_solids(eqp_solution *s, int on)
{
  if (!s) return EQP_E_ARG;
  eqpi_free(s->ctx, s->allow, (size_t)(s->nallow > 0 ? s->nallow : 1));
  s->allow = NULL;
  s->nallow = 0;
  s->allow_all = on != 0;
  return EQP_OK;
}

int eqpi_solution_allowed(const eqp_solution *s, int k)
{
  return s->allow_all ? k < s->db->nsolids : k < s->nallow && s->allow[k];
}

int eqpi_solution_any_solid(const eqp_solution *s)
{
  /* asked on every equilibration: nothing to scan unless solids were named */
  if (s->allow_all) return s->db->nsolids > 0;
  for (int k = 0; k < s->nallow; k++)
    if (s->allow[k]) return 1;
  return 0;
}

/* ------------------------------------------------------------ measures */

/* What one mol of phase k holds, over the database's components (water's
** own component left out, as for reagents). */
static void phase_dir(const eqpi_db *db, int k, double *a)
{
  const eqpi_solid *p = &db->solids[k];
  memset(a, 0, sizeof(double) * (size_t)db->ncomp);
  for (int j = 0; j < p->n; j++)
    if (p->sp[j] != db->water) eqpi_db_add_composition(db, p->sp[j], p->nu[j], a, db->ncomp);
}

/* ln(IAP/Ksp) of phase k in the solved system; -HUGE_VAL when a species of
** it is absent. */
static double ln_sat(const eqpi_system *sys, double T, int k)
{
  const eqpi_db *db = sys->tab->db;
  const eqpi_solid *p = &db->solids[k];
  const eqpi_tableau *t = sys->tab;
  double v = 0;
  for (int j = 0; j < p->n; j++) {
    if (p->sp[j] == db->water) continue;
    int i = -1;
    for (int q = 0; q < t->ns && i < 0; q++)
      if (t->sp[q] == p->sp[j]) i = q;
    if (i < 0 || !(sys->prob->m[i] > 0)) return -HUGE_VAL;
    v += p->nu[j] * (log(sys->prob->m[i]) + EQPI_LN10 * sys->prob->lg[i]);
  }
  eqpi_tnotes notes = {0, 0};
  return v - EQPI_LN10 * eqpi_reaction_logK(&p->ksp, T, &notes);
}

/* ------------------------------------------------------------ the set */

typedef struct pset {
  eqp_solution *s;
  eqpi_model *model;
  eqpi_solve_stats *st;
  const double *mol;     /* totals with nothing precipitated, mol/kg (no targets) */
  /* targets solved with the solids (an adjustment, nt > 0): their amounts
  ** are unknowns of each solve too, and the phases' amounts are then mol
  ** (in the water W0 + sum v w), not mol/kg */
  const eqpi_adjust *aj;
  int nt;
  double *v;             /* nt amounts */
  const char *what;      /* the operation, for messages */
  double *tot;           /* dissolved totals now */
  double *dir;           /* MAX_PHASES x ncomp */
  double *a, *b, *lnfree, *u;   /* scratch: ncomp + EQPI_MAX_AMOUNTS + 1 each */
  int ph[MAX_PHASES];    /* the phases present */
  double n[MAX_PHASES];  /* their amounts, mol/kg */
  double pw[MAX_PHASES]; /* kg of water one mol of each holds (a hydrate's) */
  int np;                /* present */
  double wfrac;          /* the water left over that before the solids, at the end */
  long iters;            /* Newton iterations of every solve */
} pset;

/* What the solution holds of component c with nothing precipitated (mol/kg
** without targets; mol with them), and its water (1 without; kg with). */
static double base(const pset *P, int c)
{
  if (!P->nt) return P->mol[c];
  double N = P->aj[0].N0[c];
  for (int k = 0; k < P->nt; k++) N += P->v[k] * P->aj[k].a[c];
  return N;
}

static double water(const pset *P)
{
  if (!P->nt) return 1;
  double W = P->aj[0].W0;
  for (int k = 0; k < P->nt; k++) W += P->v[k] * P->aj[k].w;
  return W;
}

/* The water left in the solution: a hydrate's water stays in its solid. */
static double water_left(const pset *P)
{
  double W = water(P);
  for (int q = 0; q < P->np; q++) W -= P->n[q] * P->pw[q];
  return W;
}

/* kg of water in one mol of phase k: the water its dissolution releases
** (as a reagent's formula counts it into the solvent). */
static double phase_water(const eqpi_db *db, int k)
{
  const eqpi_solid *p = &db->solids[k];
  double h2o = 0;
  for (int j = 0; j < p->n; j++)
    if (p->sp[j] == db->water) h2o += p->nu[j];
  return h2o * EQPI_M_WATER * 1e-3;
}

static void dissolved(pset *P)
{
  const eqpi_db *db = P->s->db;
  double W = water_left(P);
  for (int c = 0; c < db->ncomp; c++) {
    double N = base(P, c), v = N;
    for (int q = 0; q < P->np; q++) v -= P->n[q] * P->dir[q * db->ncomp + c];
    P->tot[c] = eqpi_used_up(v, N) / W;
  }
}

/* An ordinary solve at the dissolved totals of the amounts P->n (and of
** the targets' amounts P->v as they stand). */
static int solve_plain(pset *P)
{
  dissolved(P);
  int rc = eqpi_system_solve(P->s->ctx, P->s->db, &P->s->sys, P->tot, P->s->T, P->model, P->st);
  if (rc == EQP_OK && P->st) P->iters += P->st->iterations;
  return rc;
}

/* The solve of a set without phases: ordinary, or the adjustment of the
** targets alone. */
static int solve_set(pset *P)
{
  if (!P->nt) return solve_plain(P);
  int rc = eqpi_system_adjust(P->s->ctx, P->s->db, &P->s->sys, P->aj, P->nt, P->v, P->st);
  if (rc == EQP_OK && P->st) P->iters += P->st->iterations;
  return rc;
}

/* ------------------------------------------------------------ one solve */

/* The solid-phase row of phase k over the local components of sys: b its
** composition (the tableau rows of the species it dissolves to, water at
** unit activity left out, as in ln_sat), *lnt its ln Ksp less their ln K.
** -1 when one of those species is not in the system. */
static int solid_row(const eqpi_system *sys, double T, int k, double *b, double *lnt)
{
  const eqpi_tableau *t = sys->tab;
  const eqpi_db *db = t->db;
  const eqpi_solid *p = &db->solids[k];
  eqpi_tnotes notes = {0, 0};
  double v = EQPI_LN10 * eqpi_reaction_logK(&p->ksp, T, &notes);
  memset(b, 0, sizeof(double) * (size_t)t->nc);
  for (int j = 0; j < p->n; j++) {
    if (p->sp[j] == db->water) continue;
    int i = -1;
    for (int q = 0; q < t->ns && i < 0; q++)
      if (t->sp[q] == p->sp[j]) i = q;
    if (i < 0) return -1;
    v -= p->nu[j] * t->lnK[i];
    for (int r = t->row[i]; r < t->row[i + 1]; r++) b[t->cmp[r]] += p->nu[j] * t->nu[r];
  }
  *lnt = v;
  return 0;
}

/* The most of phase q that can leave with the others held: the first
** component it draws on to run out (the scale of its amount). */
static double most(const pset *P, int q)
{
  const eqpi_db *db = P->s->db;
  double best = HUGE_VAL;
  int hc = db->sp[db->h_plus].component;
  for (int c = 0; c < db->ncomp; c++) {
    double a = P->dir[q * db->ncomp + c];
    if (a <= 0 || c == hc) continue;
    double v = base(P, c);
    for (int r = 0; r < P->np; r++)
      if (r != q) v -= P->n[r] * P->dir[r * db->ncomp + c];
    best = fmin(best, fmax(v, 0) / a);
  }
  return best;
}

/* The solved state of the system with its amounts as unknowns back in the
** normal form: the totals are the dissolved ones, each unknown ln m again. */
static int normal_form(pset *Q, double lnI)
{
  eqpi_system *s = Q->s->sys;
  eqpi_problem *P = s->prob;
  const int nc = s->tab->nc;
  int worst;
  for (int c = 0; c < nc; c++) {
    if (P->xidx[c] >= 0) s->u_last[P->xidx[c]] = Q->lnfree[c];
    P->lnfix[c] = log(P->tot[c] > TINY ? P->tot[c] : TINY);
  }
  s->u_last[P->n - 1] = lnI;
  memcpy(s->tot_last, P->tot, sizeof(double) * (size_t)nc);
  double r = eqpi_problem_verify(P, s->u_last, &worst);
  if (!(r <= EQPI_VERIFY_TOL)) {
    s->solved = false;
    return -1;
  }
  memcpy(s->S_last, P->S, sizeof(double) * (size_t)P->n);
  s->S_last[P->n - 1] = P->Ic;
  s->solved = true;
  if (Q->st) Q->st->residual = r;
  return 0;
}

/* The largest residual of a mass balance at the last evaluation relative
** to all that enters it, dissolved and solid (u: the amounts). */
static double closure(const eqpi_problem *P, const double *u)
{
  double w = 0;
  for (int k = 0; k < P->nx; k++) {
    int c = P->xcomp[k];
    if (P->kind[c] != EQPI_ROW_MASS) continue;
    double solid = 0;
    for (int q = 0; q < P->na; q++)
      solid += fabs(u[P->nx + q] * P->amt[q].scale * P->amt[q].a[c]);
    double r = fabs(P->F[k]) * P->S[k] / (P->S[k] + solid / P->W);
    if (!(r <= w)) w = isfinite(r) ? r : INFINITY;
  }
  return w;
}

/* KINSOL on the problem with its amounts from u: 0 and u at the solution,
** or -1. A component that the solids take nearly all of has a dissolved
** total N0 - n a that cancels: the rounding of n alone can leave its
** balance at 1e-9 of the little left (and KINSOL's line search stall
** there). Such a point is taken when the saturation rows hold to SAT_TOL
** and every balance to 1e-10 of all that enters it, dissolved and solid;
** the state is verified afterwards at the dissolved totals themselves
** (normal_form), the charge balance with it, to the usual 1e-10. */
static int run_set(pset *Q, eqpi_newton *ws, double *u, int iters)
{
  eqpi_problem *P = Q->s->sys->prob;
  int worst = -1, flag = eqpi_newton_run(ws, P, u, iters, &Q->iters);
  double *uf = eqpi_newton_u(ws), r = eqpi_problem_verify(P, uf, &worst), sat = 0;
  for (int k = 0; k < P->na; k++) sat = fmax(sat, fabs(P->F[P->nx + k]));
  if (r <= EQPI_VERIFY_TOL || (sat <= SAT_TOL && closure(P, uf) <= EQPI_VERIFY_TOL)) {
    memcpy(u, uf, sizeof(double) * (size_t)P->n);
    return 0;
  }
  if (eqpi_log_on(Q->s->ctx, EQP_LOG_DEBUG)) {
    char fname[64];
    eqpi_log(Q->s->ctx, EQP_LOG_DEBUG, "solids: a solve of a set of %d stopped (%s, worst row "
             "%s)", Q->np, eqpi_newton_flag_name(flag, fname, sizeof fname),
             eqpi_problem_row_name(P, worst));
  }
  return -1;
}

/* The set from u when the phase that joined (amount k, at 0 in u) is far
** supersaturated: continuation in its target, from its ln IAP now (where
** u solves the problem) to ln Ksp, each stage from the last; a failed
** stage is retried with half the increment, down to 1/256. */
static int continue_set(pset *Q, eqpi_newton *ws, double *u, const double *u0, int k)
{
  eqpi_problem *P = Q->s->sys->prob;
  const double lnt = P->amt[k].ln_target;
  memcpy(u, u0, sizeof(double) * (size_t)P->n);
  if (eqpi_problem_eval(P, u, P->F) < 0) return -1;
  const double gap = P->F[P->nx + k];     /* ln IAP/Ksp at the start */
  double th = 0, step = 0.25;
  int ok = -1;
  while (th < 1 && step >= 1.0 / 256) {
    double next = th + step < 1 ? th + step : 1;
    P->amt[k].ln_target = lnt + gap * (1 - next);
    P->at_ok = 0;
    double *keep = Q->b;    /* the last stage's solution */
    memcpy(keep, u, sizeof(double) * (size_t)P->n);
    ok = run_set(Q, ws, u, STEP_ITERS);
    if (ok == 0) {
      th = next;
      step *= 1.5;
    } else {
      memcpy(u, keep, sizeof(double) * (size_t)P->n);
      step *= 0.5;
    }
  }
  P->amt[k].ln_target = lnt;
  P->at_ok = 0;
  return th >= 1 && ok == 0 ? 0 : -1;
}

/* The set as one Newton solve from the solved state at the amounts Q->n:
** the phases present are amounts of the problem (a = minus the phase's
** composition, per mol/kg of it) with their solid-phase rows; for a phase
** that has just joined (join: its place, or -1) continuation in its
** target should that solve fail. 0 with Q->n and the system solved at the
** dissolved totals; -1 otherwise, the system left at the state it started
** from. */
static int newton_set(pset *Q, int join)
{
  eqp_ctx *ctx = Q->s->ctx;
  const eqpi_db *db = Q->s->db;
  eqpi_system *s = Q->s->sys;
  eqpi_problem *P = s->prob;
  const int nc = s->tab->nc;
  if (!s->solved || eqpi_problem_at(P, s->u_last) < 0) return -1;
  double lnI = s->u_last[P->n - 1];
  memcpy(Q->lnfree, P->lnfree, sizeof(double) * (size_t)nc);
  int ok = 0, nt = Q->nt;
  const double *N0 = nt ? Q->aj[0].N0 : Q->mol;
  const double W0 = nt ? Q->aj[0].W0 : 1.0;
  if (nt && eqpi_adjust_add_targets(s, Q->aj, nt, Q->v) < 0) ok = -1;
  for (int q = 0; q < Q->np && ok == 0; q++) {
    double lnt, sc = Q->n[q] > 0 ? Q->n[q] : most(Q, q);   /* u near 1, or below it */
    if (!(sc > 0) || !isfinite(sc)) sc = 1e-3;
    for (int c = 0; c < db->ncomp; c++) Q->a[c] = -Q->dir[q * db->ncomp + c];
    if (solid_row(s, Q->s->T, Q->ph[q], Q->b, &lnt) < 0 ||
        eqpi_problem_add_solid(P, N0, W0, Q->a, sc, Q->b, lnt,
                               db->solids[Q->ph[q]].name) < 0)
      ok = -1;
    else
      P->amt[P->na - 1].w = -Q->pw[q];     /* its water leaves with it */
  }
  eqpi_problem_layout(P);
  eqpi_newton *ws = ok == 0 ? eqpi_newton_get(ctx, P->n) : NULL;
  ok = -1;
  if (ws) {
    double *u = Q->u, *u0 = Q->a;   /* a: free again once the rows are set */
    for (int c = 0; c < nc; c++)
      if (P->xidx[c] >= 0) u[P->xidx[c]] = Q->lnfree[c];
    for (int k = 0; k < nt; k++) u[P->nx + k] = Q->v[k] / P->amt[k].scale;
    for (int q = 0; q < Q->np; q++) u[P->nx + nt + q] = Q->n[q] / P->amt[nt + q].scale;
    u[P->n - 1] = lnI;
    memcpy(u0, u, sizeof(double) * (size_t)P->n);
    ok = run_set(Q, ws, u, SET_ITERS);
    if (ok < 0 && join >= 0) ok = continue_set(Q, ws, u, u0, nt + join);
    if (ok == 0 && eqpi_problem_at(P, u) < 0) ok = -1;
    for (int k = 0; k < nt && ok == 0; k++) {
      /* a target's amount out of its bounds is no answer */
      double v = u[P->nx + k] * P->amt[k].scale;
      if (!(v >= Q->aj[k].vmin && v <= Q->aj[k].vmax)) ok = -1;
    }
    if (ok == 0) {
      for (int k = 0; k < nt; k++) Q->v[k] = u[P->nx + k] * P->amt[k].scale;
      for (int q = 0; q < Q->np; q++) Q->n[q] = u[P->nx + nt + q] * P->amt[nt + q].scale;
      memcpy(Q->lnfree, P->lnfree, sizeof(double) * (size_t)nc);
      lnI = u[P->n - 1];
    }
    eqpi_newton_put(ctx, ws);
  }
  eqpi_problem_clear_amounts(P);
  eqpi_problem_layout(P);
  s->lu_near_last = false;
  if (ok < 0) {
    /* the totals of the mass-balance rows back to the last solved state */
    for (int c = 0; c < nc; c++)
      if (P->kind[c] == EQPI_ROW_MASS) {
        P->tot[c] = s->tot_last[c];
        P->lnfix[c] = log(P->tot[c] > TINY ? P->tot[c] : TINY);
      }
    P->at_ok = 0;
    return -1;
  }
  /* the dissolved totals are those of the species at the solution: the
  ** state is then an equilibrium with each phase saturated, and dissolved
  ** plus solid closes each balance to its row's residual (run_set) */
  dissolved(Q);
  const eqpi_tableau *t = s->tab;
  for (int c = 0; c < nc; c++) {
    if (P->kind[c] != EQPI_ROW_MASS) continue;
    double T = 0;
    for (int k = t->col[c]; k < t->col[c + 1]; k++) T += t->cnu[k] * P->m[t->csp[k]];
    P->tot[c] = T;
    Q->tot[t->comp[c]] = T;
  }
  /* should the normal form miss the tolerance, an ordinary (warm) solve at
  ** the totals of the amounts finishes it */
  return normal_form(Q, lnI) == 0 ? 0 : solve_plain(Q) == EQP_OK ? 0 : -1;
}

/* Solve the set as it stands: one Newton solve (an ordinary one when no
** phase is left). */
static int solve_phases(pset *P, int join)
{
  if (P->np == 0) return solve_set(P);
  if (newton_set(P, join) == 0) return EQP_OK;
  const eqpi_db *db = P->s->db;
  char names[256] = "";
  size_t m = 0;
  for (int q = 0; q < P->np && m < sizeof names; q++)
    m += (size_t)snprintf(names + m, sizeof names - m, "%s%s", q ? ", " : "",
                          db->solids[P->ph[q]].name);
  if (P->nt)
    return eqpi_fail(P->s->ctx, EQP_E_CONVERGE, "%s with the solids %s present did not "
                     "converge (or needed an amount beyond its bounds); without precipitate = "
                     "{...} the operation runs, the solids then only reported as saturation "
                     "indices", P->what, names);
  return eqpi_fail(P->s->ctx, EQP_E_CONVERGE, "the solids %s could not be brought to "
                   "saturation together: the equilibrium with them did not converge", names);
}

/* Phase q leaves the set. */
static void drop(pset *P, int q, int nc)
{
  for (int r = q; r + 1 < P->np; r++) {
    P->ph[r] = P->ph[r + 1];
    P->n[r] = P->n[r + 1];
    P->pw[r] = P->pw[r + 1];
    memmove(P->dir + r * nc, P->dir + (r + 1) * nc, sizeof(double) * (size_t)nc);
  }
  P->np--;
}

/* Rank of the directions of the present phases with one more (Gaussian
** elimination with partial pivoting over the components). */
static int rank_of(const pset *P, int ncomp, int rows)
{
  double M[MAX_PHASES + 1][64];
  int nc = ncomp < 64 ? ncomp : 64, r = 0;
  for (int i = 0; i < rows; i++) memcpy(M[i], P->dir + i * ncomp, sizeof(double) * (size_t)nc);
  for (int c = 0; c < nc && r < rows; c++) {
    int piv = -1;
    double best = 1e-9;
    for (int i = r; i < rows; i++)
      if (fabs(M[i][c]) > best) { best = fabs(M[i][c]); piv = i; }
    if (piv < 0) continue;
    for (int j = 0; j < nc; j++) { double x = M[r][j]; M[r][j] = M[piv][j]; M[piv][j] = x; }
    for (int i = r + 1; i < rows; i++) {
      double f = M[i][c] / M[r][c];
      for (int j = 0; j < nc; j++) M[i][j] -= f * M[r][j];
    }
    r++;
  }
  return r;
}

/* The active set from the solved state (P.np = 0); amounts as for
** eqpi_precipitate, mol/kg of the final water. */
static int active_set(pset *Pp, double *amounts)
{
  pset P = *Pp;
  eqp_solution *s = P.s;
  eqp_ctx *ctx = s->ctx;
  const eqpi_db *db = s->db;
  const int nc = db->ncomp, nsol = db->nsolids;
  int rc = EQP_OK;
  int hc = db->sp[db->h_plus].component;
  for (int round = 0; rc == EQP_OK; round++) {
    /* a phase whose amount came out negative leaves, the most negative first */
    int out = -1;
    for (int q = 0; q < P.np; q++)
      if (P.n[q] <= 0 && (out < 0 || P.n[q] < P.n[out])) out = q;
    /* else the most supersaturated allowed phase not present joins */
    int join = -1;
    double top = SI_ON * EQPI_LN10;
    for (int k = 0; k < nsol && out < 0; k++) {
      int present = 0;
      for (int q = 0; q < P.np; q++) present |= P.ph[q] == k;
      if (present || !eqpi_solution_allowed(s, k)) continue;
      double v = ln_sat(s->sys, s->T, k);
      if (v > top) { top = v; join = k; }
    }
    if (out < 0 && join < 0) break;
    if (round >= MAX_ROUNDS) {
      rc = eqpi_fail(ctx, EQP_E_CONVERGE, "the set of solids did not settle in %d changes "
                     "(%s keeps %s)", MAX_ROUNDS, db->solids[out >= 0 ? P.ph[out] : join].name,
                     out >= 0 ? "leaving" : "joining");
      break;
    }
    if (out >= 0) {
      drop(&P, out, nc);
      rc = solve_phases(&P, -1);
      continue;
    }
    if (P.np >= MAX_PHASES || nc > 64) {
      rc = eqpi_fail(ctx, EQP_E_INPUT, "more than %d solids at once", MAX_PHASES);
      break;
    }
    phase_dir(db, join, P.dir + P.np * nc);
    P.dir[P.np * nc + hc] = 0;     /* protons follow the charge; not a constraint */
    int r = rank_of(&P, nc, P.np + 1);
    phase_dir(db, join, P.dir + P.np * nc);
    if (r <= P.np) {
      /* the phase rule: its ion activity product is already fixed by the
      ** others, so it and they cannot all be saturated at once */
      char with[256] = "";
      size_t m = 0;
      for (int q = 0; q < P.np && m < sizeof with; q++)
        m += (size_t)snprintf(with + m, sizeof with - m, "%s%s", q ? ", " : "",
                              db->solids[P.ph[q]].name);
      rc = eqpi_fail(ctx, EQP_E_INPUT, "inconsistent set of solids: %s is supersaturated "
                     "(SI %.3g) while %s fix%s the same ion activities (the phase rule)",
                     db->solids[join].name, top / EQPI_LN10, with, P.np > 1 ? "" : "es");
      break;
    }
    P.ph[P.np] = join;
    P.pw[P.np] = phase_water(db, join);
    P.n[P.np++] = 0;
    rc = solve_phases(&P, P.np - 1);
  }
  if (rc == EQP_OK)
    for (int q = 0; q < P.np; q++) amounts[P.ph[q]] = P.n[q] / water(&P);
  Pp->iters = P.iters;
  Pp->wfrac = water_left(&P) / water(&P);
  return rc;
}

/* The scratch of a set: dir, tot and four vectors as in pset. */
static double *scratch(eqp_ctx *ctx, int nc, size_t *bytes)
{
  const size_t w = (size_t)nc + EQPI_MAX_AMOUNTS + 1;
  *bytes = sizeof(double) * ((size_t)nc * (MAX_PHASES + 1) + 4 * w);
  return eqpi_calloc(ctx, 1, *bytes);
}

static pset make_set(eqp_solution *s, eqpi_model *model, eqpi_solve_stats *st, double *blk)
{
  const int nc = s->db->ncomp;
  const size_t w = (size_t)nc + EQPI_MAX_AMOUNTS + 1;
  double *sc = blk + (size_t)nc * (MAX_PHASES + 1);
  pset P = {s, model, st, NULL, NULL, 0, NULL, NULL, blk, blk + nc, sc, sc + w, sc + 2 * w,
            sc + 3 * w, {0}, {0}, {0}, 0, 1, st ? st->iterations : 0};
  return P;
}

int eqpi_precipitate(eqp_solution *s, const double *mol, eqpi_model *model,
                     eqpi_solve_stats *st, double *amounts, double *wfrac)
{
  eqp_ctx *ctx = s->ctx;
  for (int k = 0; k < s->db->nsolids; k++) amounts[k] = 0;
  size_t bytes;
  double *blk = scratch(ctx, s->db->ncomp, &bytes);
  if (!blk) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  pset P = make_set(s, model, st, blk);
  P.mol = mol;
  int rc = active_set(&P, amounts);
  *wfrac = P.wfrac;
  if (st) st->iterations = P.iters;
  eqpi_free(ctx, blk, bytes);
  return rc;
}

int eqpi_precipitate_adjust(eqp_solution *s, const eqpi_adjust *aj, int n, double *v,
                            eqpi_solve_stats *st, const char *what)
{
  eqp_ctx *ctx = s->ctx;
  size_t bytes, ab = sizeof(double) * (size_t)(s->db->nsolids > 0 ? s->db->nsolids : 1);
  double *blk = scratch(ctx, s->db->ncomp, &bytes), *amounts = eqpi_malloc(ctx, ab);
  double vv[EQPI_MAX_TARGETS];
  int rc = blk && amounts ? EQP_OK : eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  pset P = make_set(s, aj[0].model, st, blk);
  P.aj = aj;
  P.nt = n;
  P.v = vv;
  P.what = what;
  for (int k = 0; k < n; k++) vv[k] = aj[k].v0;
  /* the targets alone first, then the phases join and leave around them */
  if (rc == EQP_OK) rc = solve_set(&P);
  if (rc == EQP_OK) rc = active_set(&P, amounts);
  if (rc == EQP_OK) memcpy(v, vv, sizeof(double) * (size_t)n);
  if (st) st->iterations = P.iters;
  eqpi_free(ctx, blk, bytes);
  eqpi_free(ctx, amounts, ab);
  return rc;
}
