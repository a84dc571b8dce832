/* Solids that form or dissolve: an active set of phases around ordinary
** solves. A phase present holds its saturation (log IAP = log Ksp) and its
** amount leaves the solution's totals; the most supersaturated allowed
** phase joins, a phase whose amount would be negative leaves. Each amount
** is found by Brent's method on ordinary solves (the saturation index is
** monotone in the amount of its own phase), the phases of a set swept in
** turn until all hold together. Design: docs/methods.md. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include "system_impl.h"
#include "brent_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_PHASES EQPI_MAX_SOLIDS_PRESENT   /* the phase rule caps it lower */
#define MAX_ROUNDS 24      /* additions and removals of the active set */
#define MAX_SWEEPS 60      /* of the amounts of a set together */
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

/* ------------------------------------------------------------ measures */

/* What one mol of phase k holds, over the database's components (water's
** own component left out, as for reagents). */
static void phase_dir(const eqpi_db *db, int k, double *a)
{
  const eqpi_solid *p = &db->solids[k];
  int water = db->water >= 0 ? db->sp[db->water].component : -1;
  memset(a, 0, sizeof(double) * (size_t)db->ncomp);
  for (int j = 0; j < p->n; j++) {
    if (p->sp[j] == db->water) continue;
    const eqpi_species *sp = &db->sp[p->sp[j]];
    for (int t = 0; t < sp->nterm; t++)
      if (sp->term_comp[t] != water) a[sp->term_comp[t]] += p->nu[j] * sp->term_nu[t];
  }
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
  const double *mol;     /* totals with nothing precipitated, mol/kg */
  double *tot;           /* dissolved totals now */
  double *dir;           /* MAX_PHASES x ncomp */
  int ph[MAX_PHASES];    /* the phases present */
  double n[MAX_PHASES];  /* their amounts, mol/kg */
  int np, k;             /* present; the one a 1-D search moves */
} pset;

static int solve_set(pset *P)
{
  const eqpi_db *db = P->s->db;
  for (int c = 0; c < db->ncomp; c++) {
    double v = P->mol[c];
    for (int q = 0; q < P->np; q++) v -= P->n[q] * P->dir[q * db->ncomp + c];
    /* a component used up to rounding is gone, not negative */
    P->tot[c] = v < 0 && v > -1e-13 * fabs(P->mol[c]) - 1e-300 ? 0 : v;
  }
  return eqpi_system_solve(P->s->ctx, P->s->db, &P->s->sys, P->tot, P->s->T, P->model, P->st);
}

static int miss(void *ud, double x, double *f)
{
  pset *P = ud;
  P->n[P->k] = x;
  int rc = solve_set(P);
  if (rc < 0) return rc;
  double v = ln_sat(P->s->sys, P->s->T, P->ph[P->k]);
  *f = isfinite(v) ? v : -1e3;     /* a phase whose ion is gone: far undersaturated */
  return 0;
}

/* The most of phase q that can leave with the others held: the first
** component it draws on to run out. */
static double most(const pset *P, int q)
{
  const eqpi_db *db = P->s->db;
  double best = HUGE_VAL;
  int hc = db->sp[db->h_plus].component;
  for (int c = 0; c < db->ncomp; c++) {
    double a = P->dir[q * db->ncomp + c];
    if (a <= 0 || c == hc) continue;
    double v = P->mol[c];
    for (int r = 0; r < P->np; r++)
      if (r != q) v -= P->n[r] * P->dir[r * db->ncomp + c];
    best = fmin(best, fmax(v, 0) / a);
  }
  return best;
}

/* The amount of phase q alone, the others held; 0 when even none of it
** leaves the solution undersaturated. */
static int amount_one(pset *P, int q)
{
  double f0, fb, hi = most(P, q), root;
  P->k = q;
  int rc = miss(P, 0, &f0);
  if (rc < 0 || f0 <= 0) return rc;
  if (!isfinite(hi) || hi <= 0)
    return eqpi_fail(P->s->ctx, EQP_E_INPUT, "solid %s: no component bounds its amount",
                     P->s->db->solids[P->ph[q]].name);
  double b = hi * (1 - 1e-12);
  if ((rc = miss(P, b, &fb)) < 0) return rc;
  if (fb > 0) { P->n[q] = b; return solve_set(P); }
  rc = eqpi_brent_root(miss, P, 0, b, f0, fb, 0.0, 200, &root);
  if (rc < 0 && rc != EQPI_BRENT_MAXIT) return rc > -1000 ? rc : EQP_E_CONVERGE;
  return miss(P, root, &f0);
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

int eqpi_precipitate(eqp_solution *s, const double *mol, eqpi_model *model,
                     eqpi_solve_stats *st, double *amounts)
{
  eqp_ctx *ctx = s->ctx;
  const eqpi_db *db = s->db;
  const int nc = db->ncomp, nsol = db->nsolids;
  for (int k = 0; k < nsol; k++) amounts[k] = 0;
  size_t bytes = sizeof(double) * (size_t)nc * (MAX_PHASES + 2);
  double *blk = eqpi_calloc(ctx, 1, bytes);
  if (!blk) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  pset P = {s, model, st, mol, blk, blk + nc, {0}, {0}, 0, 0};
  int rc = EQP_OK;
  int hc = db->sp[db->h_plus].component;
  for (int round = 0; rc == EQP_OK; round++) {
    /* the most supersaturated allowed phase not present */
    int join = -1;
    double top = SI_ON * EQPI_LN10;
    for (int k = 0; k < nsol; k++) {
      int present = 0;
      for (int q = 0; q < P.np; q++) present |= P.ph[q] == k;
      if (present || !eqpi_solution_allowed(s, k)) continue;
      double v = ln_sat(s->sys, s->T, k);
      if (v > top) { top = v; join = k; }
    }
    if (join < 0) break;
    if (round >= MAX_ROUNDS) {
      rc = eqpi_fail(ctx, EQP_E_CONVERGE, "the set of solids did not settle in %d changes "
                     "(%s keeps joining)", MAX_ROUNDS, db->solids[join].name);
      break;
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
    P.n[P.np++] = 0;
    /* the amounts of the set together; a phase that would be negative leaves */
    for (int sweep = 0; rc == EQP_OK; sweep++) {
      for (int q = 0; q < P.np && rc == EQP_OK; q++) rc = amount_one(&P, q);
      if (rc < 0) break;
      double worst = 0;
      for (int q = 0; q < P.np; q++) {
        if (P.n[q] <= 0) continue;
        double v = ln_sat(s->sys, s->T, P.ph[q]);
        worst = fmax(worst, isfinite(v) ? fabs(v) : HUGE_VAL);
      }
      int w = 0;
      for (int q = 0; q < P.np; q++)
        if (P.n[q] > 0) {
          P.ph[w] = P.ph[q];
          P.n[w] = P.n[q];
          memmove(P.dir + w * nc, P.dir + q * nc, sizeof(double) * (size_t)nc);
          w++;
        }
      int dropped = w < P.np;
      P.np = w;
      if (dropped) rc = solve_set(&P);
      else if (worst < 1e-11) break;
      if (rc == EQP_OK && sweep >= MAX_SWEEPS)
        rc = eqpi_fail(ctx, EQP_E_CONVERGE, "the amounts of the solids present did not "
                       "settle in %d sweeps", MAX_SWEEPS);
    }
  }
  if (rc == EQP_OK)
    for (int q = 0; q < P.np; q++) amounts[P.ph[q]] = P.n[q];
  eqpi_free(ctx, blk, bytes);
  return rc;
}
