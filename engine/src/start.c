/* Starting points for Newton. Log-variable Newton moves about one ln unit
** per step when a dominant term is orders of magnitude off (the pH just
** past an equivalence point, or a cold start), so the start matters more
** than anything else:
** - the proton balance alone: with the activity coefficients held, each
**   acid ladder's free component follows from its own total at a given
**   free H+ (fractions of its protonation states), and the free H+ that
**   balances the protons is found by Brent's method;
** - the ideal problem: the minimum of the strictly convex potential
**   G(x) = sum_i m_i(x) - sum_c T_c x_c, by damped Newton with an Armijo
**   line search (Cholesky on the Hessian N^T diag(m) N), which converges
**   from any start. */
/* SPDX-License-Identifier: MIT */
#include "start_impl.h"
#include "brent_impl.h"
#include <sundials/sundials_dense.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#define TINY 1e-300
#define LNMAX 700.0

static inline double clamp_exp(double s) { return exp(s > LNMAX ? LNMAX : s); }

/* ------------------------------------------------------------ proton balance */

typedef struct proton {
  eqpi_problem *P;
  double *x;            /* nc: ln free molality of every component */
  double *lng;          /* ns: held ln gamma */
  double *m;            /* ns */
  double *lngc;         /* nc */
  double *nuH;          /* ns: protons of each species */
  int evals;
} proton;

/* ln of sum exp over the ladder of c at x_H, each term a_i + n_i x_H. */
static double ladder_lse(const eqpi_problem *P, const proton *p, int c, double xH)
{
  const eqpi_tableau *t = P->tab;
  const int h = t->hloc;
  double top = -INFINITY, *e = P->w_ns[0];
  for (int k = t->lad[c]; k < t->lad[c + 1]; k++) {
    int i = t->ladsp[k];
    double s = t->lnK[i] - p->lng[i] + p->nuH[i] * (xH + p->lngc[h]);
    e[k - t->lad[c]] = s;
    top = s > top ? s : top;
  }
  double sum = 0;
  for (int k = t->lad[c]; k < t->lad[c + 1]; k++) sum += exp(e[k - t->lad[c]] - top);
  return top + log(sum);
}

/* The scaled H+ balance at x_H, the closed ladders following it. */
static int proton_f(void *ud, double xH, double *f)
{
  proton *p = ud;
  eqpi_problem *P = p->P;
  const eqpi_tableau *t = P->tab;
  const int nc = t->nc, ns = t->ns, h = t->hloc;
  p->evals++;
  p->x[h] = xH;
  for (int c = 0; c < nc; c++)
    if (c != h && P->xidx[c] >= 0 && t->closed[c] && P->tot[c] > 0)
      p->x[c] = log(P->tot[c]) - p->lngc[c] - ladder_lse(P, p, c, xH);
  double R = -P->tot[h], S = 0;
  for (int i = 0; i < ns; i++) {
    double s = t->lnK[i] - p->lng[i];
    for (int k = t->row[i]; k < t->row[i + 1]; k++)
      s += t->nu[k] * (p->x[t->cmp[k]] + p->lngc[t->cmp[k]]);
    p->m[i] = clamp_exp(s);
    R += p->nuH[i] * p->m[i];
    S += fabs(p->nuH[i]) * p->m[i];
  }
  *f = R / (S > TINY ? S : TINY);
  return 0;
}

int eqpi_start_proton(eqpi_problem *P, double *u, const double *lng, int *evals)
{
  const eqpi_tableau *t = P->tab;
  const int nc = t->nc, ns = t->ns, h = t->hloc;
  if (P->na || P->kind[h] != EQPI_ROW_MASS || P->xidx[h] < 0) return -1;
  proton p = {P, P->w_nc[1], P->w_ns[1], P->w_ns[2], P->w_nc[2], P->w_ns[3], 0};
  for (int i = 0; i < ns; i++) {
    p.lng[i] = lng ? lng[i] : 0;
    p.nuH[i] = eqpi_tableau_nu(t, i, h);
  }
  for (int c = 0; c < nc; c++) {
    p.lngc[c] = p.lng[t->comp_sp[c]];
    p.x[c] = P->xidx[c] >= 0 ? u[P->xidx[c]] : P->lnfix[c];
    if (P->kind[c] != EQPI_ROW_MASS && P->xidx[c] >= 0) return -1;
  }
  /* a bracket around the present free H+, widened fourfold until the sign
  ** changes (the balance rises with x_H), down to pH 26 and up to pH -2 */
  double x0 = u[P->xidx[h]], w = 1, lo = x0 - w, hi = x0 + w, flo, fhi;
  proton_f(&p, lo, &flo);
  proton_f(&p, hi, &fhi);
  while ((flo > 0 || fhi < 0) && w < 64) {
    w *= 4;
    if (flo > 0) {
      hi = lo;
      fhi = flo;
      proton_f(&p, lo = fmax(x0 - w, -60.0), &flo);
    } else {
      lo = hi;
      flo = fhi;
      proton_f(&p, hi = fmin(x0 + w, 5.0), &fhi);
    }
  }
  double xH;
  int rc = eqpi_brent_root(proton_f, &p, lo, hi, flo, fhi, 1e-9, 200, &xH);
  eqpi_log(P->ctx, EQP_LOG_TRACE, "proton-balance start: pH %.4f, %d evaluations%s",
           -xH / EQPI_LN10, p.evals, rc < 0 ? ", no root" : "");
  if (evals) *evals += p.evals;
  if (rc < 0 && rc != EQPI_BRENT_MAXIT) return -1;
  double f;
  proton_f(&p, xH, &f);
  for (int c = 0; c < nc; c++)
    if (P->xidx[c] >= 0) u[P->xidx[c]] = p.x[c];
  double Ic = 0;
  for (int i = 0; i < ns; i++) Ic += 0.5 * t->z2[i] * p.m[i];
  u[P->n - 1] = log(Ic > TINY ? Ic : TINY);
  return 0;
}

/* ------------------------------------------------------------ ideal problem */

/* Potential whose gradient is the ideal mass balance: G = sum m - sum T x. */
static double potential(eqpi_problem *P, const double *u)
{
  eqpi_problem_eval(P, u, P->F);
  double G = 0;
  for (int i = 0; i < P->tab->ns; i++) G += P->m[i];
  for (int k = 0; k < P->nx; k++) G -= P->tot[P->xcomp[k]] * u[k];
  return G;
}

static double max_scaled(const eqpi_problem *P)
{
  double w = 0;
  for (int k = 0; k < P->nx; k++) w = fabs(P->F[k]) > w ? fabs(P->F[k]) : w;
  return w;
}

/* Gradient g and Hessian H (column-major nx x nx) of G at the last
** evaluation: H = N^T diag(m) N over the unknown components, species by
** species over the pairs each holds. */
static void gradient_hessian(const eqpi_problem *P, double *g, double *H)
{
  const eqpi_tableau *t = P->tab;
  const int nx = P->nx;
  memset(H, 0, sizeof(double) * (size_t)nx * (size_t)nx);
  for (int k = 0; k < nx; k++) g[k] = -P->tot[P->xcomp[k]];
  for (int i = 0; i < t->ns; i++)
    for (int a = t->row[i]; a < t->row[i + 1]; a++) {
      int k = P->xidx[t->cmp[a]];
      if (k < 0) continue;
      double w = t->nu[a] * P->m[i];
      g[k] += w;
      for (int b = t->row[i]; b < t->row[i + 1]; b++) {
        int l = P->xidx[t->cmp[b]];
        if (l >= 0) H[(size_t)l * nx + k] += t->nu[b] * w;
      }
    }
}

int eqpi_start_ideal(eqpi_problem *P, double *u, double *work, double **cols, int *iters)
{
  const int nx = P->nx, n = P->n;
  for (int k = 0; k < nx; k++)
    if (P->kind[P->xcomp[k]] != EQPI_ROW_MASS) return -1;
  double lam = P->lambda;
  eqpi_problem_set_lambda(P, 0);
  double *H = work, *Hs = H + (size_t)nx * nx, *xt = Hs + (size_t)nx * nx;
  double *g = P->w_n, *d = P->w_nc[1], *sc = P->w_nc[2];
  int ok = -1;
  for (int it = 0; it < 400; it++) {
    double G = potential(P, u);
    double res = max_scaled(P);
    if (res < 1e-9) { ok = 0; break; }
    if (iters) (*iters)++;
    gradient_hessian(P, g, H);
    /* symmetric diagonal scaling: the Hessian spans many decades */
    for (int k = 0; k < nx; k++) {
      double dk = H[(size_t)k * nx + k];
      sc[k] = dk > 0 ? 1.0 / sqrt(dk) : 1.0;
    }
    for (int l = 0; l < nx; l++)
      for (int k = 0; k < nx; k++) H[(size_t)l * nx + k] *= sc[k] * sc[l];
    for (int k = 0; k < nx; k++) d[k] = -g[k] * sc[k];
    for (int l = 0; l < nx; l++) cols[l] = H + (size_t)l * nx;
    /* Cholesky; where two components are bound in one dominant complex the
    ** scaled Hessian is singular to rounding: then with a small multiple
    ** of the identity added (its diagonal is 1) */
    memcpy(Hs, H, sizeof(double) * (size_t)nx * (size_t)nx);
    double shift = 0;
    while (SUNDlsMat_densePOTRF(cols, nx) != 0 && shift < 1e-2) {
      shift = shift ? shift * 100 : 1e-12;
      memcpy(H, Hs, sizeof(double) * (size_t)nx * (size_t)nx);
      for (int k = 0; k < nx; k++) H[(size_t)k * nx + k] += shift;
    }
    if (shift >= 1e-2) break;
    SUNDlsMat_densePOTRS(cols, nx, d);
    double dmax = 0, slope = 0;
    for (int k = 0; k < nx; k++) d[k] *= sc[k];
    for (int k = 0; k < nx; k++) slope += g[k] * d[k];
    if (!(slope < 0)) {  /* rounding spoiled the Newton direction: use the gradient */
      slope = 0;
      for (int k = 0; k < nx; k++) {
        d[k] = -g[k] * sc[k] * sc[k];
        slope += g[k] * d[k];
      }
    }
    for (int k = 0; k < nx; k++) dmax = fabs(d[k]) > dmax ? fabs(d[k]) : dmax;
    double t = dmax > 4.0 ? 4.0 / dmax : 1.0;
    int moved = 0;
    for (int ls = 0; ls < 60; ls++, t *= 0.5) {
      for (int k = 0; k < nx; k++) xt[k] = u[k] + t * d[k];
      for (int k = nx; k < n; k++) xt[k] = u[k];
      double Gt = potential(P, xt);
      /* near the solution G is flat to rounding: there accept any step
      ** that reduces the scaled residual instead */
      if (Gt <= G + 1e-4 * t * slope || (res < 1e-6 && max_scaled(P) < res)) {
        moved = 1;
        break;
      }
    }
    eqpi_log(P->ctx, EQP_LOG_TRACE, "ideal start %d: residual %.3e, step %.3g", it, res, t);
    if (!moved) break;
    memcpy(u, xt, sizeof(double) * (size_t)nx);
  }
  eqpi_log(P->ctx, EQP_LOG_TRACE, "ideal start %s", ok ? "did not converge" : "converged");
  /* ionic strength of the ideal solution as the start of ln I */
  potential(P, u);
  u[n - 1] = log(P->Ic > TINY ? P->Ic : TINY);
  eqpi_problem_set_lambda(P, lam);
  return ok;
}
