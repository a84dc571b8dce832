/* Fixed-activity solves: the amount of a reagent direction that brings the
** pH to a target (KINSOL on the augmented system, bracketing as fallback),
** and dpH/dv of a solved system for any direction. */
/* SPDX-License-Identifier: MIT */
#include "system_impl.h"
#include <math.h>
#include <string.h>

/* Normal solve at v units of the direction; pH of the result. */
static int solve_at(eqp_ctx *ctx, eqpi_system **sysp, const eqpi_adjust *aj, double v,
                    double *tot, double *pH, eqpi_solve_stats *st)
{
  const eqpi_db *db = &ctx->db;
  double W = aj->W0 + v * aj->w;
  for (int c = 0; c < db->ncomp; c++) tot[c] = (aj->N0[c] + v * aj->a[c]) / W;
  int rc = eqpi_system_prepare(ctx, sysp, tot, aj->T, aj->model, aj->a);
  if (rc < 0) return rc;
  rc = eqpi_system_solve_prepared(ctx, *sysp, &rc, st);
  if (rc < 0) return rc;
  eqpi_system *s = *sysp;
  int h = s->comp_sp[s->hloc];
  *pH = -(log(s->m[h]) + s->lng[h]) / EQPI_LN10;
  return EQP_OK;
}

/* Local direction of the system from the global one. */
static void local_dir(const eqpi_system *s, const double *g, double *l)
{
  for (int c = 0; c < s->nc; c++) l[c] = g[s->comp[c]];
}

int eqpi_system_dpH(eqp_ctx *ctx, eqpi_system *s, const double *a_global, double w, double W,
                    double *dpH)
{
  if (!s || !s->solved) return eqpi_fail(ctx, EQP_E_ARG, "solve the solution first");
  double stack[64], *a = s->nc <= 64 ? stack : eqpi_malloc(ctx, sizeof(double) * (size_t)s->nc);
  if (!a) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  local_dir(s, a_global, a);
  const eqpi_db *db = &ctx->db;
  double dI = 0;
  for (int c = 0; c < db->ncomp; c++)
    if (a_global[c] != 0 && (c >= s->ncg || !s->active[c]) && db->comp_species[c] != db->water) {
      double z = db->sp[db->comp_species[c]].comp.charge;
      dI += 0.5 * z * z * a_global[c] / W;
    }
  int rc = eqpi_sys_dpH(s, a, w, W, dI, dpH) < 0
             ? eqpi_fail(ctx, EQP_E_CONVERGE, "the Jacobian is singular at this state")
             : EQP_OK;
  if (a != stack) eqpi_free(ctx, a, sizeof(double) * (size_t)s->nc);
  return rc;
}

/* Fixed-activity solve: H+ held at the target, the amount v unknown. */
static int adjust_kinsol(eqp_ctx *ctx, eqpi_system *s, const eqpi_adjust *aj, double v_lin,
                         double *v)
{
  for (int c = 0; c < s->nc; c++) {
    s->N0[c] = aj->N0[s->comp[c]];
    s->adir[c] = aj->a[s->comp[c]];
  }
  s->W0 = aj->W0;
  s->wdir = aj->w;
  /* v = u vscale: the scale keeps u near 1 for KINSOL's step limits; the
  ** linear estimate alone can be far too small in an unbuffered solution */
  s->vscale = isfinite(v_lin) ? fmin(fmax(fabs(v_lin), 1e-3 * aj->vmax), aj->vmax) : aj->vmax;
  s->lnaH = -aj->pH * EQPI_LN10;
  double u[64];
  if (s->n > 64) return -1;
  memcpy(u, s->u_last, sizeof(double) * (size_t)s->n);
  int kh = s->xidx[s->hloc];
  u[kh] = aj->v0 / s->vscale;
  s->adjust = 1;
  s->lambda = 1;
  long iters = 0;
  int flag = eqpi_run_kinsol(s, u, &iters), worst;
  double r = flag >= 0 ? eqpi_sys_verify(s, N_VGetArrayPointer(s->u), &worst) : INFINITY;
  double *uf = N_VGetArrayPointer(s->u);
  *v = uf[kh] * s->vscale;
  if (r <= EQPI_VERIFY_TOL) {
    /* back to the normal form at the solution: H+'s slot holds ln m(H+) */
    eqpi_sys_eval(s, uf, s->xt + s->n);
    memcpy(s->u_last, uf, sizeof(double) * (size_t)s->n);
    s->u_last[kh] = s->lnfree[s->hloc];
    memcpy(s->tot_last, s->tot, sizeof(double) * (size_t)s->nc);
  }
  s->adjust = 0;
  return r <= EQPI_VERIFY_TOL ? 0 : -1;
}

int eqpi_system_adjust(eqp_ctx *ctx, eqpi_system **sysp, const eqpi_adjust *aj, double *v_out,
                       eqpi_solve_stats *st)
{
  const eqpi_db *db = &ctx->db;
  double *tot = eqpi_malloc(ctx, sizeof(double) * ((size_t)db->ncomp + 1));
  if (!tot) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  double pH0, pHmax, dpH, v = 0;
  int rc = solve_at(ctx, sysp, aj, aj->v0, tot, &pH0, st);
  if (rc == EQP_OK) rc = eqpi_system_dpH(ctx, *sysp, aj->a, aj->w, aj->W0 + aj->v0 * aj->w, &dpH);
  if (rc < 0) goto out;
  if (fabs(pH0 - aj->pH) < 1e-12) {
    *v_out = aj->v0;
    goto out;
  }
  if ((aj->pH - pH0) * dpH <= 0) {
    rc = eqpi_fail(ctx, EQP_E_INPUT, "pH %.3f is out of reach with %s: adding it %s the pH "
                   "(now %.3f)", aj->pH, aj->what, dpH < 0 ? "lowers" : "raises", pH0);
    goto out;
  }
  /* Newton-Krylov on the fixed-activity system from the present state */
  if (adjust_kinsol(ctx, *sysp, aj, aj->v0 + (aj->pH - pH0) / dpH, &v) == 0 && v >= aj->v0 &&
      v <= aj->vmax) {
    *v_out = v;
    (*sysp)->solved = true;
    goto out;
  }
  /* Fallback: bracketing on v with ordinary solves (pH is monotone in the
  ** amount of an acid or a base) */
  rc = solve_at(ctx, sysp, aj, aj->vmax, tot, &pHmax, st);
  if (rc < 0) goto out;
  if ((aj->pH - pHmax) * dpH > 0) {
    rc = eqpi_fail(ctx, EQP_E_INPUT, "pH %.3f is out of reach with %s: even %s brings it "
                   "only to %.3f", aj->pH, aj->what, aj->vmax_text, pHmax);
    goto out;
  }
  double lo = aj->v0, hi = aj->vmax;
  for (int it = 0; it < 200 && hi - lo > 1e-15 * hi; it++) {
    double mid = 0.5 * (lo + hi), pm;
    if ((rc = solve_at(ctx, sysp, aj, mid, tot, &pm, st)) < 0) goto out;
    if ((pm - aj->pH) * dpH < 0) lo = mid;
    else hi = mid;
  }
  v = 0.5 * (lo + hi);
  rc = solve_at(ctx, sysp, aj, v, tot, &pH0, st);
  *v_out = v;
out:
  eqpi_free(ctx, tot, sizeof(double) * ((size_t)db->ncomp + 1));
  return rc;
}
