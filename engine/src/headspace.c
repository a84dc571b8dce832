/* A closed headspace: the gases of the library partition between a sealed
** vessel's gas phase (ideal, n = pV/RT) and the solution (Henry's law,
** a(X) = K_H p), each component's total over both conserved. Unknowns:
** delta_g, the mol of gas g that went from the headspace into the solution;
** for each g the miss f_g = ln a(X_g) - ln K_H - ln((n0_g - delta_g) RT/V)
** rises strictly with delta_g (more dissolved, less in the gas), so Brent's
** method on ordinary solves finds it between the bounds the components
** set; several gases are swept in turn until all hold together. Design
** and its justification: docs/methods.md. */
/* SPDX-License-Identifier: MIT */
#include "solution_impl.h"
#include "system_impl.h"
#include "brent_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

/* L atm K-1 mol-1: R = 8.314462618 J/(mol K) (exact since the SI of 2019; CODATA 2018)
** over 101.325 J/(L atm) */
#define R_ATM (8.314462618 / 101.325)
#define EDGE 1e-14            /* an open bound, relative to the gas's scale */
#define MAX_SWEEPS 60
#define F_TOL 1e-10           /* |f_g|: Henry's law met to 1e-10 relative in p */
#define P_WARN 2.0            /* atm: beyond it, a warning */

struct eqpi_head {
  size_t bytes;
  double vessel_L;      /* headspace + liquid at sealing: fixed */
  int ng;               /* the library's gases */
  double *n0;           /* ng: mol put in the headspace at sealing */
  double *delta;        /* ng: mol gone into the solution at the last equilibrium */
  double *p, *mol;      /* ng: partial pressure (atm) and mol in gas, last equilibrium */
  unsigned char *on;    /* ng: held any of it at the last equilibrium */
  double V, pw;         /* headspace L and water vapour atm, last equilibrium */
  char note[256];       /* K_H used beyond its stated temperature range, or "" */
};

/* ------------------------------------------------------------ water vapour */

/* Saturation vapour pressure of water, atm: W. Wagner, A. Pruss, 'International
** equations for the saturation properties of ordinary water substance.
** Revised according to the International Temperature Scale of 1990', J. Phys.
** Chem. Ref. Data 22, 783-787 (1993) (IAPWS 1992): 3.1699 kPa at 25 C. */
double eqpi_water_vapour_atm(double T)
{
  static const double a[6] = {-7.85951783, 1.84408259, -11.7866497, 22.6807411, -15.9618719,
                              1.80122502};
  static const double e[6] = {1, 1.5, 3, 3.5, 4, 7.5};
  const double Tc = 647.096, pc = 22.064e6;
  double tau = 1 - T / Tc, s = 0;
  for (int i = 0; i < 6; i++) s += a[i] * pow(tau, e[i]);
  return pc * exp(Tc / T * s) / 101325.0;
}

/* ------------------------------------------------------------ record */

static struct eqpi_head *head_new(eqp_ctx *ctx, int ng)
{
  size_t n = (size_t)(ng > 0 ? ng : 1);
  size_t bytes = sizeof(struct eqpi_head) + n * (4 * sizeof(double) + 1);
  struct eqpi_head *h = eqpi_calloc(ctx, 1, bytes);
  if (!h) return NULL;
  h->bytes = bytes;
  h->ng = ng;
  h->n0 = (double *)(h + 1);
  h->delta = h->n0 + n;
  h->p = h->delta + n;
  h->mol = h->p + n;
  h->on = (unsigned char *)(h->mol + n);
  return h;
}

void eqpi_head_free(eqp_solution *s)
{
  if (s->head) eqpi_free(s->ctx, s->head, s->head->bytes);
  s->head = NULL;
}

int eqpi_head_copy(eqp_solution *dst, const eqp_solution *src)
{
  eqpi_head_free(dst);
  if (!src->head) return EQP_OK;
  struct eqpi_head *h = head_new(dst->ctx, src->head->ng);
  if (!h) return eqpi_fail(dst->ctx, EQP_E_NOMEM, "out of memory");
  memcpy(h, src->head, src->head->bytes);
  h->n0 = (double *)(h + 1);     /* the pointers into the copy's own block */
  size_t n = (size_t)(h->ng > 0 ? h->ng : 1);
  h->delta = h->n0 + n;
  h->p = h->delta + n;
  h->mol = h->p + n;
  h->on = (unsigned char *)(h->mol + n);
  dst->head = h;
  return EQP_OK;
}

int eqp_solution_sealed(const eqp_solution *s) { return s && s->head ? 1 : 0; }

int eqpi_head_refuse(eqp_solution *s, const char *what)
{
  return eqpi_fail(s->ctx, EQP_E_INPUT, "%s: the solution is sealed under a headspace; open it "
                   "first (unseal), or do this before sealing", what);
}

/* What one mol of gas g brings into the solution, over the library's
** components (water's own left out, as for reagents). */
static void gas_dir(const eqpi_db *db, int g, double *a, int n)
{
  for (int c = 0; c < n; c++) a[c] = 0;
  eqpi_db_add_composition(db, db->gases[g].species, 1, a, n);
}

int eqp_solution_seal(eqp_solution *s, const eqp_headspace *user)
{
  if (!s || !user) return eqpi_fail(s ? s->ctx : NULL, EQP_E_ARG, "NULL argument");
  eqp_ctx *ctx = s->ctx;
  eqp_headspace o = EQP_HEADSPACE_INIT;
  int rc = eqpi_opts_read(ctx, "eqp_headspace", user, &o, sizeof o, EQPI_HEADSPACE_FIRST);
  if (rc < 0) return rc;
  if (s->head) return eqpi_fail(ctx, EQP_E_INPUT, "the solution is sealed already");
  if (!(o.litres > 0) || !isfinite(o.litres) || o.litres > EQPI_MAX_WATER)
    return eqpi_fail(ctx, EQP_E_INPUT, "a headspace of %g L: above 0 and at most %g L",
                     o.litres, EQPI_MAX_WATER);
  if (o.ngases && (!o.gases || !o.p_atm)) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  if ((rc = eqpi_solution_grow(s)) < 0) return rc;
  const eqpi_db *db = s->db;
  struct eqpi_head *h = head_new(ctx, db->ngases);
  if (!h) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (size_t i = 0; i < o.ngases; i++) {
    int g = o.gases[i] ? eqpi_db_find_gas(db, o.gases[i]) : -1;
    if (g < 0) {
      char list[256] = "";
      size_t m = 0;
      for (int j = 0; j < db->ngases && m < sizeof list; j++)
        m += (size_t)snprintf(list + m, sizeof list - m, "%s%s", j ? ", " : "", db->gases[j].name);
      eqpi_free(ctx, h, h->bytes);
      return eqpi_fail(ctx, EQP_E_UNKNOWN, "unknown gas '%s' (the library's gases: %s)",
                       o.gases[i] ? o.gases[i] : "(null)", db->ngases ? list : "none");
    }
    double p = o.p_atm[i];
    if (!(p >= 0) || !isfinite(p) || p > 100) {
      eqpi_free(ctx, h, h->bytes);
      return eqpi_fail(ctx, EQP_E_INPUT, "partial pressure of %s in the headspace: %g atm "
                       "(0 to 100 atm)", db->gases[g].name, p);
    }
    h->n0[g] = p * o.litres / (R_ATM * s->T);     /* ideal gas at sealing */
  }
  h->vessel_L = o.litres + eqp_solution_volume(s);
  s->head = h;
  return eqpi_caution_note(ctx, "sealed vessel",
                           "sealed vessel: gas evolution (acid added to carbonate or "
                           "bicarbonate, warming, ammonia from an alkaline ammonium solution) "
                           "raises the pressure in a closed vessel; use a vessel rated for it, "
                           "open or vent it slowly and away from the face, wear eye "
                           "protection, and follow the safety data sheets and local practice");
}

int eqp_solution_unseal(eqp_solution *s)
{
  if (!s) return EQP_E_ARG;
  if (!s->head) return EQP_OK;
  /* the equilibrium of the vessel, then its gas let go */
  eqp_result *r;
  s->ctx->quiet++;
  int rc = eqpi_solution_equilibrate(s, &r);
  s->ctx->quiet--;
  eqp_result_free(r);
  if (rc < 0) return rc;
  const eqpi_db *db = s->db;
  double a[256], *dir = s->ntotal <= 256 ? a : eqpi_malloc(s->ctx, sizeof(double) * (size_t)s->ntotal);
  if (!dir) return eqpi_fail(s->ctx, EQP_E_NOMEM, "out of memory");
  for (int g = 0; g < db->ngases; g++) {
    if (!s->head->on[g]) continue;
    gas_dir(db, g, dir, s->ntotal);
    for (int c = 0; c < s->ntotal; c++) s->total[c] += s->head->delta[g] * dir[c];
  }
  if (dir != a) eqpi_free(s->ctx, dir, sizeof(double) * (size_t)s->ntotal);
  eqpi_head_free(s);
  return EQP_OK;
}

/* ------------------------------------------------------------ partition */

typedef struct part {
  eqp_solution *s;
  eqpi_model *model;
  eqpi_solve_stats *st;
  double *amt;             /* solids' amounts, when solids may form */
  double wfrac;            /* the water the solids leave in solution */
  const double *mol;       /* the liquid's totals before any exchange, mol/kg */
  double *tot;             /* dissolved totals now, mol/kg */
  double *dir;             /* ng x nt: per mol of gas dissolved */
  double *lnKH;            /* ng */
  int nt;
  double V, RT;
  int g;                   /* the gas a 1-D search moves */
  int fresh;               /* the solved state is at the present deltas */
} part;

static int solve_now(part *P)
{
  eqp_solution *s = P->s;
  struct eqpi_head *h = s->head;
  for (int c = 0; c < P->nt; c++) {
    double v = P->mol[c] * s->water_kg;
    for (int g = 0; g < h->ng; g++)
      if (h->on[g]) v += h->delta[g] * P->dir[g * P->nt + c];
    v /= s->water_kg;
    P->tot[c] = eqpi_used_up(v, P->mol[c]);
  }
  int rc = eqpi_system_solve(s->ctx, s->db, &s->sys, P->tot, s->T, P->model, P->st);
  if (rc == EQP_OK && P->amt)
    rc = eqpi_precipitate(s, P->tot, P->model, P->st, P->amt, &P->wfrac);
  P->fresh = rc == EQP_OK;
  return rc;
}

/* ln a of gas g's dissolved species in the solved system; -HUGE_VAL when absent. */
static double ln_act(const part *P, int g)
{
  const eqpi_system *sys = P->s->sys;
  int X = P->s->db->gases[g].species;
  for (int i = 0; i < sys->tab->ns; i++)
    if (sys->tab->sp[i] == X)
      return sys->prob->m[i] > 0 ? log(sys->prob->m[i]) + EQPI_LN10 * sys->prob->lg[i]
                                 : -HUGE_VAL;
  return -HUGE_VAL;
}

/* The miss of gas g at the solved state: ln a(X) - ln(K_H p). */
static double miss_of(const part *P, int g)
{
  double n = P->s->head->n0[g] - P->s->head->delta[g];
  double la = ln_act(P, g);
  if (!(n > 0)) return 1e3;                /* the gas phase emptied: far too much dissolved */
  if (!isfinite(la)) return -1e3;          /* its species gone: far too little */
  return la - P->lnKH[g] - log(n * P->RT / P->V);
}

static int miss(void *ud, double x, double *f)
{
  part *P = ud;
  if (P->fresh && P->s->head->delta[P->g] == x) {   /* solved there already */
    *f = miss_of(P, P->g);
    return 0;
  }
  P->s->head->delta[P->g] = x;
  int rc = solve_now(P);
  if (rc < 0) return rc;
  *f = miss_of(P, P->g);
  return 0;
}

/* Bounds of delta_g with the other gases held: no component but H+ may go
** negative in the solution, and the gas phase holds what it holds. */
static void bounds(const part *P, int g, double *lo, double *hi)
{
  const eqp_solution *s = P->s;
  const struct eqpi_head *h = s->head;
  int hc = s->db->sp[s->db->h_plus].component;
  *lo = -HUGE_VAL;
  *hi = h->n0[g];
  for (int c = 0; c < P->nt; c++) {
    double a = P->dir[g * P->nt + c];
    if (c == hc || a == 0) continue;
    double base = P->mol[c] * s->water_kg;
    for (int q = 0; q < h->ng; q++)
      if (q != g && h->on[q]) base += h->delta[q] * P->dir[q * P->nt + c];
    base = fmax(base, 0);
    if (a > 0) *lo = fmax(*lo, -base / a);
    else *hi = fmin(*hi, base / -a);
  }
  if (!isfinite(*lo)) *lo = 0;     /* no component bounds it: the liquid gives none */
}

/* delta_g with the other gases held: a bracket from a Newton step (the
** slope from the solved state's Jacobian, taken 20 % long so that it
** usually passes the root), grown if it does not, then Brent's method. */
static int one_gas(part *P, int g)
{
  struct eqpi_head *h = P->s->head;
  double lo, hi, f0, root;
  bounds(P, g, &lo, &hi);
  double scale = fmax(fmax(fabs(lo), fabs(hi)), 1e-300);
  double a = lo + EDGE * scale, b = hi - EDGE * scale;
  P->g = g;
  if (!(a < b)) {                          /* nothing to move */
    double x = fmin(fmax(h->delta[g], lo), hi);
    return x == h->delta[g] && P->fresh ? EQP_OK : (h->delta[g] = x, solve_now(P));
  }
  double x0 = fmin(fmax(h->delta[g], a), b);
  int rc = miss(P, x0, &f0);
  if (rc < 0 || fabs(f0) <= F_TOL * 1e-2) return rc;
  double edge = f0 > 0 ? a : b, step = 1e-6 * scale, x1, f1;
  double d, n = h->n0[g] - x0;
  const eqp_solution *s = P->s;
  if (eqpi_system_dlna(s->ctx, s->sys, P->dir + (size_t)g * P->nt, 0, s->water_kg,
                       s->db->gases[g].species, &d) == EQP_OK && n > 0 && d + 1 / n > 0)
    step = fmax(1.2 * fabs(f0) / (d + 1 / n), 1e-15 * scale);
  for (;;) {
    x1 = f0 > 0 ? fmax(x0 - step, a) : fmin(x0 + step, b);
    if ((rc = miss(P, x1, &f1)) < 0) return rc;
    if ((f1 > 0) != (f0 > 0) || f1 == 0) break;
    if (x1 == edge) return EQP_OK;         /* beyond the open bound: one phase holds it all */
    x0 = x1;
    f0 = f1;
    step *= 16;
  }
  if (f1 == 0) return EQP_OK;
  rc = eqpi_brent_root(miss, P, fmin(x0, x1), fmax(x0, x1), x0 < x1 ? f0 : f1, x0 < x1 ? f1 : f0,
                       0.0, 200, &root);
  if (rc < 0 && rc != EQPI_BRENT_MAXIT) return rc > -1000 ? rc : EQP_E_CONVERGE;
  return miss(P, root, &f0);
}

int eqpi_headspace_solve(eqp_solution *s, const double *mol, eqpi_model *model,
                         eqpi_solve_stats *st, double *amt, double *wfrac)
{
  eqp_ctx *ctx = s->ctx;
  const eqpi_db *db = s->db;
  struct eqpi_head *h = s->head;
  const int nt = s->ntotal, ng = h->ng;
  double V = h->vessel_L - eqp_solution_volume(s);
  if (!(V > 0))
    return eqpi_fail(ctx, EQP_E_INPUT, "the liquid, %.6g mL, fills the sealed vessel of %.6g mL: "
                     "no headspace is left", eqp_solution_volume(s) * 1e3, h->vessel_L * 1e3);
  size_t bytes = sizeof(double) * ((size_t)nt * ((size_t)ng + 1) + (size_t)ng + 1);
  double *blk = eqpi_calloc(ctx, 1, bytes);
  if (!blk) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  part P = {s, model, st, amt, 1, mol, blk, blk + nt, blk + nt + (size_t)nt * ng, nt, V,
            R_ATM * s->T, 0, 0};
  /* the gases the vessel holds: in the headspace, or all of whose dissolved
  ** species' components the solution holds */
  int hc = db->sp[db->h_plus].component, nact = 0;
  size_t used = 0;
  h->note[0] = '\0';
  for (int g = 0; g < ng; g++) {
    double *d = P.dir + (size_t)g * nt;
    gas_dir(db, g, d, nt);
    int holds = 1;
    for (int c = 0; c < nt; c++)
      if (c != hc && d[c] > 0 && !(mol[c] > 0)) holds = 0;
    h->on[g] = h->n0[g] > 0 || holds;
    if (!h->on[g]) h->delta[g] = 0;
    h->p[g] = h->mol[g] = 0;
    nact += h->on[g];
    if (h->on[g]) eqpi_gas_used(ctx, db->gases[g].name);   /* its K_H: the provenance */
    eqpi_tnotes notes = {0, 0};
    P.lnKH[g] = EQPI_LN10 * eqpi_reaction_logK(&db->gases[g].kh, s->T, &notes);
    if (h->on[g] && (notes.outside || notes.missing) && used < sizeof h->note)
      used += (size_t)snprintf(h->note + used, sizeof h->note - used, "%s%s", used ? ", " : "",
                               db->gases[g].name);
  }
  int rc = solve_now(&P);
  double worst = HUGE_VAL;
  for (int sweep = 0; rc == EQP_OK && nact; sweep++) {
    for (int g = 0; g < ng && rc == EQP_OK; g++)
      if (h->on[g]) rc = one_gas(&P, g);
    if (rc < 0) break;
    worst = 0;
    for (int g = 0; g < ng; g++) {
      if (!h->on[g]) continue;
      double lo, hi;
      bounds(&P, g, &lo, &hi);
      double scale = fmax(fmax(fabs(lo), fabs(hi)), 1e-300);
      double x = h->delta[g];
      /* at an open bound the miss keeps its sign: one phase holds it all */
      if (x <= lo + 2 * EDGE * scale || x >= hi - 2 * EDGE * scale) continue;
      worst = fmax(worst, fabs(miss_of(&P, g)));
    }
    if (nact == 1 || worst <= F_TOL) break;
    if (sweep >= MAX_SWEEPS) {
      rc = eqpi_fail(ctx, EQP_E_CONVERGE, "the gases of the sealed vessel did not settle in %d "
                     "sweeps (largest miss %.2e in ln p)", MAX_SWEEPS, worst);
    }
  }
  if (rc == EQP_OK) {
    for (int g = 0; g < ng; g++) {
      if (!h->on[g]) continue;
      h->mol[g] = fmax(h->n0[g] - h->delta[g], 0);
      h->p[g] = h->mol[g] * P.RT / V;
    }
    h->V = V;
    h->pw = eqpi_water_vapour_atm(s->T);
    if (wfrac) *wfrac = P.wfrac;
  }
  eqpi_free(ctx, blk, bytes);
  return rc;
}

int eqpi_headspace_result(const eqp_solution *s, eqp_result *r)
{
  const struct eqpi_head *h = s->head;
  char w[400] = "";
  if (h->note[0])
    snprintf(w, sizeof w, "Henry's law constant of %s used outside the temperature range its "
             "source states (or without temperature data), at %.2f C", h->note, s->T - 273.15);
  return eqpi_result_set_gases(r, h->V, h->pw, h->ng, h->on, h->p, h->mol, w[0] ? w : NULL);
}

/* ------------------------------------------------------------ derivatives */

/* dpH/dv along a direction with the headspace following: the gases stay at
** f_g = 0, so by implicit differentiation
**   sum_h (d ln a_g/d delta_h + [g = h]/n_g) d delta_h/dv = -d ln a_g/dv
** (the headspace volume held over the step), and
**   dpH/dv = dpH/dv|delta + sum_h dpH/d delta_h d delta_h/dv. */
int eqpi_solution_dpH_dir(eqp_solution *s, const double *a, double w, double *dpH)
{
  eqp_ctx *ctx = s->ctx;
  int rc = eqpi_system_dpH(ctx, s->sys, a, w, s->water_kg, dpH);
  if (rc < 0 || !s->head) return rc;
  const eqpi_db *db = s->db;
  struct eqpi_head *h = s->head;
  int act[16], n = 0;
  for (int g = 0; g < h->ng; g++)
    if (h->on[g] && h->mol[g] > 0) {
      if (n >= 16) return eqpi_fail(ctx, EQP_E_INPUT, "more than 16 gases in a headspace");
      act[n++] = g;
    }
  if (!n) return EQP_OK;
  const int nt = s->ntotal;
  size_t bytes = sizeof(double) * ((size_t)nt * (size_t)n + (size_t)(n * n + 2 * n));
  double *blk = eqpi_calloc(ctx, 1, bytes);
  if (!blk) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  double *dir = blk, *M = blk + (size_t)nt * n, *b = M + n * n, *dph = b + n;
  for (int i = 0; i < n && rc == EQP_OK; i++) {
    gas_dir(db, act[i], dir + (size_t)i * nt, nt);
    int X = db->gases[act[i]].species;
    rc = eqpi_system_dlna(ctx, s->sys, a, w, s->water_kg, X, &b[i]);
    b[i] = -b[i];
    for (int j = 0; j < n && rc == EQP_OK; j++) {
      double d;
      /* the direction of gas j is needed before row i can use it */
      if (j > i) gas_dir(db, act[j], dir + (size_t)j * nt, nt);
      rc = eqpi_system_dlna(ctx, s->sys, dir + (size_t)j * nt, 0, s->water_kg, X, &d);
      M[i * n + j] = d + (i == j ? 1 / h->mol[act[i]] : 0);
    }
  }
  for (int j = 0; j < n && rc == EQP_OK; j++)
    rc = eqpi_system_dpH(ctx, s->sys, dir + (size_t)j * nt, 0, s->water_kg, &dph[j]);
  int piv[16];
  if (rc == EQP_OK && eqpi_lu_factor(M, piv, n) < 0)
    rc = eqpi_fail(ctx, EQP_E_CONVERGE, "the headspace's derivative is singular here");
  if (rc == EQP_OK) {
    eqpi_lu_solve(M, piv, n, b);
    for (int j = 0; j < n; j++) *dpH += dph[j] * b[j];
    if (!isfinite(*dpH)) rc = eqpi_fail(ctx, EQP_E_CONVERGE, "dpH/dv is not a finite number here");
  }
  eqpi_free(ctx, blk, bytes);
  return rc;
}
