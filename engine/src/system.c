/* Tableau assembly and the residual of the equilibrium equations.
**
** Unknowns are x_j = ln m_j of each component's free molality and ln I.
** Species follow from mass action:
**   ln m_i = ln K_i + sum_j nu_ij (x_j + ln g_j) - ln g_i
** Each mass balance is scaled by sum_i |nu_ij| m_i so every row is O(1);
** the ionic strength row is ln(1/2 sum z^2 m) - ln I. Components that form
** no species but their own (spectators such as Na+ here) are fixed at their
** totals and drop out of the unknowns. */
/* SPDX-License-Identifier: MIT */
#include "system_impl.h"
#include <math.h>
#include <string.h>
#include <stdio.h>
#include <stdlib.h>

#define LNMAX 700.0      /* keep exp() finite during wild iterates */

static double clamp_exp(double s) { return exp(s > LNMAX ? LNMAX : s); }

/* Mass action with unit activity coefficients at the free components. */
static void ideal_pass(eqpi_system *sys)
{
  const int nc = sys->nc, ns = sys->ns;
  for (int i = 0; i < ns; i++) {
    const double *row = sys->nu + (size_t)i * nc;
    double s = sys->lnK[i];
    for (int c = 0; c < nc; c++) s += row[c] * sys->lnfree[c];
    sys->s0[i] = s;
    sys->mid[i] = clamp_exp(s);
  }
}

/* Activity coefficients at I, then the molalities they imply. */
static int model_pass(eqpi_system *sys, double I)
{
  const int nc = sys->nc, ns = sys->ns;
  if (sys->lambda == 0) {
    for (int i = 0; i < ns; i++) {
      sys->lg[i] = sys->lng[i] = 0;
      sys->m[i] = sys->mid[i];
    }
    return 0;
  }
  eqp_activity_in in = {(size_t)ns, sys->z, sys->size, sys->mid, I, sys->Tk, sys->A, sys->B};
  if (eqpi_model_log_gamma(sys->model, &in, sys->lg, sys->plugin_err,
                           sizeof sys->plugin_err) != 0) {
    sys->plugin_failed = 1;
    return -1;
  }
  for (int i = 0; i < ns; i++) {
    if (!isfinite(sys->lg[i])) {
      sys->plugin_failed = 1;
      strcpy(sys->plugin_err, "activity model returned a non-finite log gamma");
      return -1;
    }
    sys->lng[i] = sys->lambda * EQPI_LN10 * sys->lg[i];
  }
  for (int i = 0; i < ns; i++) {
    const double *row = sys->nu + (size_t)i * nc;
    double s = sys->s0[i] - sys->lng[i];
    for (int c = 0; c < nc; c++) s += row[c] * sys->lng[sys->comp_sp[c]];
    sys->m[i] = clamp_exp(s);
  }
  return 0;
}

int eqpi_sys_eval(eqpi_system *sys, const double *u, double *F)
{
  const int nc = sys->nc, ns = sys->ns, nx = sys->nx;
  /* a non-finite iterate cannot be evaluated; stop the solve (the caller
  ** falls back) rather than let NaN through KINSOL's line search */
  for (int k = 0; k < sys->n; k++)
    if (!isfinite(u[k])) {
      snprintf(sys->plugin_err, sizeof sys->plugin_err, "non-finite iterate");
      return -2;
    }
  if (sys->adjust) {
    double v = u[sys->xidx[sys->hloc]] * sys->vscale, W = sys->W0 + v * sys->wdir;
    for (int c = 0; c < nc; c++) {
      double t = (sys->N0[c] + v * sys->adir[c]) / W;
      sys->tot[c] = t;
      if (sys->xidx[c] < 0) sys->lnfix[c] = log(t > 1e-300 ? t : 1e-300);
    }
  }
  for (int c = 0; c < nc; c++)
    sys->lnfree[c] = sys->xidx[c] < 0 ? sys->lnfix[c] : u[sys->xidx[c]];
  double lnI = u[nx], I = exp(lnI);
  if (sys->adjust) {
    /* free H+ from its fixed activity: two passes, since g(H+) comes from
    ** the model (exact for models of I alone) */
    sys->lnfree[sys->hloc] = sys->lnaH;
    ideal_pass(sys);
    if (model_pass(sys, I) < 0) return -1;
    sys->lnfree[sys->hloc] = sys->lnaH - sys->lng[sys->comp_sp[sys->hloc]];
  }
  ideal_pass(sys);
  if (model_pass(sys, I) < 0) return -1;
  for (int k = 0; k < nx; k++) {
    int c = sys->xcomp[k];
    double R, S = 0;
    if (c == sys->hloc) {
      R = -sys->tot[c];
      for (int d = 0; d < nc; d++) R += sys->href[d] * sys->tot[d];
      for (int i = 0; i < ns; i++) {
        double v = sys->coefH[i] * sys->m[i];
        R += v;
        S += fabs(v);
      }
    } else {
      R = -sys->tot[c];
      for (int i = 0; i < ns; i++) {
        double v = sys->nu[(size_t)i * nc + c] * sys->m[i];
        R += v;
        S += fabs(v);
      }
    }
    F[k] = R / (S > 1e-300 ? S : 1e-300);
  }
  double Ic = 0;
  for (int i = 0; i < ns; i++) Ic += sys->z2[i] * sys->m[i];
  Ic *= 0.5;
  F[nx] = log(Ic > 1e-300 ? Ic : 1e-300) - lnI;
  return 0;
}

/* For each unknown component other than H+, the species made of it and H+
** alone that is most abundant now; its protons per unit of the component
** become the reference of the H+ row. */
int eqpi_sys_reference(eqpi_system *sys)
{
  const int nc = sys->nc, ns = sys->ns;
  int changed = 0;
  for (int c = 0; c < nc; c++) {
    double old = sys->href[c];
    sys->href[c] = 0;
    if (c == sys->hloc || sys->xidx[c] < 0) continue;
    double best = -1;
    for (int i = 0; i < ns; i++) {
      const double *row = sys->nu + (size_t)i * nc;
      if (row[c] <= 0) continue;
      int own = 1;
      for (int d = 0; d < nc && own; d++) own = d == c || d == sys->hloc || row[d] == 0;
      if (own && sys->m[i] / row[c] > best) {
        best = sys->m[i] / row[c];
        sys->href[c] = row[sys->hloc] / row[c];
      }
    }
    changed |= sys->href[c] != old;
  }
  if (!changed) return 0;
  for (int i = 0; i < ns; i++) {
    const double *row = sys->nu + (size_t)i * nc;
    double v = row[sys->hloc];
    for (int c = 0; c < nc; c++) v -= sys->href[c] * row[c];
    sys->coefH[i] = v;
  }
  return 1;
}

/* Any non-finite number (a residual, a molality, log gamma) makes the
** result unusable whatever the other rows say: it is reported as an
** infinite residual, never compared (NaN fails every comparison, so a
** running maximum would let a later finite row hide it). */
double eqpi_sys_verify(eqpi_system *sys, const double *u, int *worst)
{
  double lam = sys->lambda;
  sys->lambda = 1;
  double *F = sys->g;  /* n entries of scratch */
  double w = INFINITY;
  *worst = -1;
  if (eqpi_sys_eval(sys, u, F) == 0) {
    w = 0;
    for (int k = 0; k <= sys->nx && isfinite(w); k++) {
      double r = fabs(F[k]);
      if (k == sys->nx) r = fabs(expm1(F[k]));   /* relative ionic strength */
      if (!(r <= w)) { w = isfinite(r) ? r : INFINITY; *worst = k; }
    }
    /* Charge balance is implied by neutral totals; check it independently. */
    double q = 0, qa = 0;
    for (int i = 0; i < sys->ns && isfinite(w); i++) {
      if (!isfinite(sys->m[i]) || !isfinite(sys->lg[i]) || sys->m[i] < 0) {
        w = INFINITY;
        *worst = sys->n + 1 + i;
      }
      q += sys->z[i] * sys->m[i];
      qa += fabs(sys->z[i]) * sys->m[i];
    }
    double r = qa > 0 ? fabs(q) / qa : 0;
    if (isfinite(w) && !(r <= w)) { w = isfinite(r) ? r : INFINITY; *worst = sys->n; }
  }
  sys->lambda = lam;
  return w;
}

const char *eqpi_sys_row_name(const eqpi_system *sys, int k)
{
  if (k < 0) return "?";
  if (k < sys->nx) return sys->db->sp[sys->sp[sys->comp_sp[sys->xcomp[k]]]].name;
  if (k > sys->n && k - sys->n - 1 < sys->ns) return sys->names[k - sys->n - 1];
  return k == sys->nx ? "ionic strength" : "charge";
}

/* The ideal Jacobian N^T diag(m) N, rows scaled as the residual, plus the
** column of ln I by one forward difference: the activity coefficients act
** through I, and without that column Newton directions at high ionic
** strength are poor. u is the point of the last evaluation. */
int eqpi_sys_precond(eqpi_system *sys, const double *u)
{
  const int n = sys->n, nx = sys->nx, nc = sys->nc, ns = sys->ns;
  double *J = sys->J;
  memset(J, 0, sizeof *J * (size_t)n * (size_t)n);
  double *F0 = sys->xt + n, *F1 = sys->g, *up = sys->d;
  if (eqpi_sys_eval(sys, u, F0) < 0) return -1;   /* m and F at u (cheap next to KINSOL) */
  /* rows F = R/S: dF/dx = (dR/dx - F dS/dx) / S, both at fixed gamma */
  for (int k = 0; k < nx; k++) {
    int c = sys->xcomp[k];
    double S = 0;
    for (int i = 0; i < ns; i++) S += fabs(sys->nu[(size_t)i * nc + c]) * sys->m[i];
    S = S > 1e-300 ? S : 1e-300;
    const int hrow = c == sys->hloc;
    if (hrow) {
      S = 0;
      for (int i = 0; i < ns; i++) S += fabs(sys->coefH[i]) * sys->m[i];
      S = S > 1e-300 ? S : 1e-300;
    }
    for (int l = 0; l < nx; l++) {
      int d = sys->xcomp[l];
      double v = 0, w = 0;
      for (int i = 0; i < ns; i++) {
        double nd = sys->nu[(size_t)i * nc + d] * sys->m[i];
        double ci = hrow ? sys->coefH[i] : sys->nu[(size_t)i * nc + c];
        v += ci * nd;
        w += fabs(ci) * nd;
      }
      J[k * n + l] = (v - F0[k] * w) / S;
    }
  }
  double Ic = 0;
  for (int i = 0; i < ns; i++) Ic += 0.5 * sys->z2[i] * sys->m[i];
  Ic = Ic > 1e-300 ? Ic : 1e-300;
  for (int l = 0; l < nx; l++) {
    int d = sys->xcomp[l];
    double v = 0;
    for (int i = 0; i < ns; i++) v += 0.5 * sys->z2[i] * sys->nu[(size_t)i * nc + d] * sys->m[i];
    J[nx * n + l] = v / Ic;
  }
  J[nx * n + nx] = -1.0;
  const double h = 1e-7;
  for (int i = 0; i < ns; i++) sys->dlng[i] = sys->lng[i];
  if (sys->lambda != 0) {
    memcpy(up, u, sizeof *up * (size_t)n);
    up[nx] += h;
    if (eqpi_sys_eval(sys, up, F1) < 0) return -1;
    for (int k = 0; k < n; k++) J[k * n + nx] = (F1[k] - F0[k]) / h;
    for (int i = 0; i < ns; i++) sys->dlng[i] = (sys->lng[i] - sys->dlng[i]) / h;
  } else {
    for (int i = 0; i < ns; i++) sys->dlng[i] = 0;
  }
  if (sys->adjust) {
    /* H+'s slot holds the amount of reagent: its column by difference */
    int kh = sys->xidx[sys->hloc];
    memcpy(up, u, sizeof *up * (size_t)n);
    double hv = 1e-7 * (fabs(u[kh]) > 1 ? fabs(u[kh]) : 1);
    up[kh] += hv;
    if (eqpi_sys_eval(sys, up, F1) < 0) return -1;
    for (int k = 0; k < n; k++) J[k * n + kh] = (F1[k] - F0[k]) / hv;
  }
  return eqpi_lu_factor(J, sys->piv, n);
}

int eqpi_sys_dpH(eqpi_system *sys, const double *a, double w, double W, double dI_absent,
                 double *dpH)
{
  const int n = sys->n, nx = sys->nx, nc = sys->nc, ns = sys->ns;
  double *u = sys->u_last, *b = sys->g + 0;
  if (eqpi_sys_precond(sys, u) < 0) return -1;   /* J and d ln g / d ln I at u */
  /* state at u again (the preconditioner's difference left it elsewhere) */
  eqpi_sys_eval(sys, u, sys->xt + n);
  double Ic = 0;
  for (int i = 0; i < ns; i++) Ic += 0.5 * sys->z2[i] * sys->m[i];
  for (int k = 0; k <= nx; k++) b[k] = 0;
  b[nx] = -dI_absent / Ic;
  for (int c = 0; c < nc; c++) {
    double dtot = (a[c] - sys->tot[c] * w) / W;  /* d total / dv, mol/kg */
    int k = sys->xidx[c];
    if (k >= 0) {
      double S = 0;
      if (c == sys->hloc) {
        /* the H+ row's total is T_H - sum href T_c */
        for (int d = 0; d < nc; d++) dtot -= sys->href[d] * (a[d] - sys->tot[d] * w) / W;
        for (int i = 0; i < ns; i++) S += fabs(sys->coefH[i]) * sys->m[i];
      } else {
        for (int i = 0; i < ns; i++) S += fabs(sys->nu[(size_t)i * nc + c]) * sys->m[i];
      }
      b[k] = dtot / (S > 1e-300 ? S : 1e-300);     /* -dF/dv for F = (sum c m - T)/S */
    } else {
      /* a spectator's molality is its total: it moves I alone */
      b[nx] -= 0.5 * sys->z2[sys->comp_sp[c]] * dtot / Ic;
    }
  }
  eqpi_lu_solve(sys->J, sys->piv, n, b);          /* du/dv = -J^-1 dF/dv */
  int h = sys->comp_sp[sys->hloc];
  double dlnaH = b[sys->xidx[sys->hloc]] + sys->dlng[h] * b[nx];
  *dpH = -dlnaH / EQPI_LN10;
  return isfinite(*dpH) ? 0 : -1;
}

int eqpi_lu_factor(double *A, int *piv, int n)
{
  for (int k = 0; k < n; k++) {
    int p = k;
    double best = fabs(A[k * n + k]);
    for (int i = k + 1; i < n; i++)
      if (fabs(A[i * n + k]) > best) { best = fabs(A[i * n + k]); p = i; }
    piv[k] = p;
    if (!(best > 0)) return -1;
    /* swap from column k on only: eqpi_lu_solve applies each interchange
    ** just before its own column's multipliers, which therefore must stay
    ** in the rows where they were made */
    if (p != k)
      for (int j = k; j < n; j++) {
        double t = A[k * n + j];
        A[k * n + j] = A[p * n + j];
        A[p * n + j] = t;
      }
    double inv = 1.0 / A[k * n + k];
    for (int i = k + 1; i < n; i++) {
      double f = A[i * n + k] *= inv;
      for (int j = k + 1; j < n; j++) A[i * n + j] -= f * A[k * n + j];
    }
  }
  return 0;
}

void eqpi_lu_solve(const double *A, const int *piv, int n, double *b)
{
  for (int k = 0; k < n; k++) {
    if (piv[k] != k) { double t = b[k]; b[k] = b[piv[k]]; b[piv[k]] = t; }
    for (int i = k + 1; i < n; i++) b[i] -= A[i * n + k] * b[k];
  }
  for (int k = n - 1; k >= 0; k--) {
    for (int j = k + 1; j < n; j++) b[k] -= A[k * n + j] * b[j];
    b[k] /= A[k * n + k];
  }
}

/* Potential whose gradient is the ideal mass balance: G = sum m - sum T x. */
static double potential(eqpi_system *sys, const double *u)
{
  eqpi_sys_eval(sys, u, sys->xt + sys->n);
  double G = 0;
  for (int i = 0; i < sys->ns; i++) G += sys->m[i];
  for (int k = 0; k < sys->nx; k++) G -= sys->tot[sys->xcomp[k]] * u[k];
  return G;
}

static double max_scaled(const eqpi_system *sys, const double *F)
{
  double w = 0;
  for (int k = 0; k < sys->nx; k++) w = fabs(F[k]) > w ? fabs(F[k]) : w;
  return w;
}

/* Ideal solutions minimise a strictly convex function of the log
** concentrations, so damped Newton with an Armijo line search converges from
** any start; this gives KINSOL an iterate inside its region of fast
** convergence. */
int eqpi_sys_coldstart(eqpi_system *sys, double *u)
{
  const int nx = sys->nx, n = sys->n;
  double lam = sys->lambda;
  double *F = sys->xt + n;          /* n scratch after the n of xt */
  sys->lambda = 0;
  for (int k = 0; k < nx; k++) {
    int c = sys->xcomp[k];
    u[k] = c == sys->hloc ? log(1e-7) : log(sys->tot[c]);
  }
  u[nx] = 0;
  int ok = -1;
  for (int it = 0; it < 400; it++) {
    double G = potential(sys, u);
    double res = max_scaled(sys, F);
    if (res < 1e-9) { ok = 0; break; }
    /* gradient and Hessian of G over the unknown components */
    for (int k = 0; k < nx; k++) {
      int c = sys->xcomp[k];
      double g = -sys->tot[c];
      for (int i = 0; i < sys->ns; i++) g += sys->nu[(size_t)i * sys->nc + c] * sys->m[i];
      sys->g[k] = g;
      for (int l = 0; l < nx; l++) {
        int d = sys->xcomp[l];
        double h = 0;
        for (int i = 0; i < sys->ns; i++)
          h += sys->nu[(size_t)i * sys->nc + c] * sys->nu[(size_t)i * sys->nc + d] * sys->m[i];
        sys->J[k * nx + l] = h;
      }
      sys->d[k] = -g;
    }
    /* symmetric diagonal scaling: the Hessian spans many decades */
    for (int k = 0; k < nx; k++) {
      double dk = sys->J[k * nx + k];
      sys->lnfree[k] = dk > 0 ? 1.0 / sqrt(dk) : 1.0;   /* borrowed as scratch */
    }
    for (int k = 0; k < nx; k++) {
      for (int l = 0; l < nx; l++) sys->J[k * nx + l] *= sys->lnfree[k] * sys->lnfree[l];
      sys->d[k] *= sys->lnfree[k];
    }
    if (eqpi_lu_factor(sys->J, sys->piv, nx) < 0) break;
    eqpi_lu_solve(sys->J, sys->piv, nx, sys->d);
    double dmax = 0, slope = 0;
    for (int k = 0; k < nx; k++) sys->d[k] *= sys->lnfree[k];
    for (int k = 0; k < nx; k++) slope += sys->g[k] * sys->d[k];
    if (!(slope < 0)) {  /* rounding spoiled the Newton direction: use the gradient */
      slope = 0;
      for (int k = 0; k < nx; k++) {
        sys->d[k] = -sys->g[k] * sys->lnfree[k] * sys->lnfree[k];
        slope += sys->g[k] * sys->d[k];
      }
    }
    for (int k = 0; k < nx; k++) dmax = fabs(sys->d[k]) > dmax ? fabs(sys->d[k]) : dmax;
    double t = dmax > 4.0 ? 4.0 / dmax : 1.0;
    int moved = 0;
    for (int ls = 0; ls < 60; ls++, t *= 0.5) {
      for (int k = 0; k < nx; k++) sys->xt[k] = u[k] + t * sys->d[k];
      sys->xt[nx] = u[nx];
      double Gt = potential(sys, sys->xt);
      /* near the solution G is flat to rounding: there accept any step
      ** that reduces the scaled residual instead */
      if (Gt <= G + 1e-4 * t * slope || (res < 1e-6 && max_scaled(sys, F) < res)) {
        moved = 1;
        break;
      }
    }
    eqpi_log(sys->ctx, EQP_LOG_TRACE, "ideal start %d: residual %.3e, step %.3g", it, res, t);
    if (!moved) break;
    memcpy(u, sys->xt, sizeof *u * (size_t)nx);
  }
  eqpi_log(sys->ctx, EQP_LOG_TRACE, "ideal start %s", ok ? "did not converge" : "converged");
  /* ionic strength of the ideal solution as the start of ln I */
  potential(sys, u);
  double Ic = 0;
  for (int i = 0; i < sys->ns; i++) Ic += 0.5 * sys->z2[i] * sys->m[i];
  u[nx] = log(Ic > 1e-300 ? Ic : 1e-300);
  sys->lambda = lam;
  return ok;
}
