/* The Jacobian of the equilibrium problem, analytic.
**
** With d ln m_i = sum_c nu_ic (dx_c + d ln g_c) - d ln g_i, a mass-balance
** row F = R/S has dF = (dR - F dS)/S. For a model of the ionic strength
** alone, ln g moves with ln I only, so the component columns are the ideal
** N^T diag(m) N (assembled species by species over the pairs of components
** each holds: cost linear in the species count) and the ln I column takes
** d ln g / d ln I from the model's derivative. A model with directional
** derivatives gets every column from them; a model with none gets the ln I
** column by one difference and is otherwise taken as a model of I alone
** (the matrix is then a preconditioner, not the Jacobian). */
/* SPDX-License-Identifier: MIT */
#include "problem_impl.h"
#include <math.h>
#include <string.h>

#define TINY 1e-300

/* d ln g / d ln I of every species into P->dlng. */
static int gamma_slope(eqpi_problem *P)
{
  const eqpi_tableau *t = P->tab;
  const int ns = t->ns;
  double *dlg = P->w_ns[0];
  if (P->lambda == 0) {
    memset(P->dlng, 0, sizeof(double) * (size_t)ns);
    return 0;
  }
  eqp_activity_in in = {(size_t)ns, t->z, t->size, P->mid, P->I, t->T, t->A, t->B};
  int rc;
  double f = P->lambda * EQPI_LN10 * P->I;
  if (P->derivs == EQPI_DERIV_I) {
    rc = eqpi_model_dlog_gamma_dI(P->model, &in, dlg, P->plugin_err, sizeof P->plugin_err);
  } else if (P->derivs == EQPI_DERIV_TANGENT) {
    rc = eqpi_model_tangent(P->model, &in, NULL, 1.0, dlg, P->plugin_err, sizeof P->plugin_err);
  } else {
    /* one forward difference in ln I */
    const double h = 1e-7;
    in.ionic_strength = P->I * exp(h);
    rc = eqpi_model_log_gamma(P->model, &in, dlg, P->plugin_err, sizeof P->plugin_err);
    for (int i = 0; i < ns && rc == 0; i++) dlg[i] = (dlg[i] - P->lg[i]) / h;
    f = P->lambda * EQPI_LN10;
  }
  if (rc != 0) {
    P->plugin_failed = 1;
    return -1;
  }
  for (int i = 0; i < ns; i++) {
    P->dlng[i] = f * dlg[i];
    if (!isfinite(P->dlng[i])) {
      P->plugin_failed = 1;
      strcpy(P->plugin_err, "activity model returned a non-finite derivative");
      return -1;
    }
  }
  return 0;
}

static void direction_rows(const eqpi_problem *P, const double *dl, double dlnI, const double *dT,
                           const double *dlng, const double *dlngc, const double *dlnm,
                           double dIc, double *col);

/* The derivative of every row along a direction of the state: dl (d ln
** free molality per component; NULL when none moves), dlnI, and dT (d
** total per component, NULL when the totals stay). Column of n entries
** into col. */
static int direction(eqpi_problem *P, const double *dl, double dlnI, const double *dT,
                     double *col)
{
  const eqpi_tableau *t = P->tab;
  const int nc = t->nc, ns = t->ns;
  double *ds0 = P->w_ns[0], *dlng = P->w_ns[1], *dlnm = P->w_ns[2], *dmid = P->w_ns[3];
  double *dlngc = P->w_nc[0];
  int moves = 0;
  for (int i = 0; i < ns; i++) {
    double s = 0;
    for (int k = t->row[i]; dl && k < t->row[i + 1]; k++) s += t->nu[k] * dl[t->cmp[k]];
    ds0[i] = s;
    moves |= s != 0;
  }
  for (int i = 0; i < ns; i++) dlng[i] = P->dlng[i] * dlnI;
  if (moves && P->derivs == EQPI_DERIV_TANGENT && P->lambda != 0) {
    eqp_activity_in in = {(size_t)ns, t->z, t->size, P->mid, P->I, t->T, t->A, t->B};
    for (int i = 0; i < ns; i++) dmid[i] = P->mid[i] * ds0[i];
    if (eqpi_model_tangent(P->model, &in, dmid, 0.0, dlnm, P->plugin_err,
                           sizeof P->plugin_err) != 0) {
      P->plugin_failed = 1;
      return -1;
    }
    for (int i = 0; i < ns; i++) dlng[i] += P->lambda * EQPI_LN10 * dlnm[i];
  }
  for (int c = 0; c < nc; c++) dlngc[c] = dlng[t->comp_sp[c]];
  double dIc = 0;
  for (int i = 0; i < ns; i++) {
    double s = ds0[i] - dlng[i];
    for (int k = t->row[i]; k < t->row[i + 1]; k++) s += t->nu[k] * dlngc[t->cmp[k]];
    dlnm[i] = s * P->m[i];          /* from here on: d m_i */
    dIc += 0.5 * t->z2[i] * dlnm[i];
  }
  direction_rows(P, dl, dlnI, dT, dlng, dlngc, dlnm, dIc, col);
  return 0;
}

/* The ln I column, direction's case with no component and no total moving
** (dl, dT NULL, dlnI 1: d ln m = -d ln g + sum nu d ln g_c), without its
** passes that would only add zeros: the same arithmetic. */
static void lnI_column(eqpi_problem *P, double *col)
{
  const eqpi_tableau *t = P->tab;
  const int nc = t->nc, ns = t->ns;
  const double *dlng = P->dlng;
  double *dlnm = P->w_ns[2], *dlngc = P->w_nc[0];
  for (int c = 0; c < nc; c++) dlngc[c] = dlng[t->comp_sp[c]];
  double dIc = 0;
  for (int i = 0; i < ns; i++) {
    double s = -dlng[i];
    for (int k = t->row[i]; k < t->row[i + 1]; k++) s += t->nu[k] * dlngc[t->cmp[k]];
    dlnm[i] = s * P->m[i];
    dIc += 0.5 * t->z2[i] * dlnm[i];
  }
  direction_rows(P, NULL, 1.0, NULL, dlng, dlngc, dlnm, dIc, col);
}

/* The rows' derivatives from the species' (dlnm: d m_i) along a direction. */
static void direction_rows(const eqpi_problem *P, const double *dl, double dlnI, const double *dT,
                           const double *dlng, const double *dlngc, const double *dlnm,
                           double dIc, double *col)
{
  const eqpi_tableau *t = P->tab;
  const int nc = t->nc, ns = t->ns, nx = P->nx, n = P->n, h = t->hloc;
  for (int k = 0; k < nx; k++) {
    int c = P->xcomp[k];
    double a = 0, b = 0;
    if (P->kind[c] == EQPI_ROW_ACTIVITY) {
      col[k] = (dl ? dl[c] : 0) + dlngc[c];
      continue;
    }
    if (P->kind[c] == EQPI_ROW_CHARGE) {
      for (int i = 0; i < ns; i++) {
        a += t->z[i] * dlnm[i];
        b += fabs(t->z[i]) * dlnm[i];
      }
    } else if (c == h) {
      for (int i = 0; i < ns; i++) {
        a += P->coefH[i] * dlnm[i];
        b += fabs(P->coefH[i]) * dlnm[i];
      }
      if (dT) {
        a -= dT[h];
        for (int d = 0; d < nc; d++) a += P->href[d] * dT[d];
      }
    } else {
      for (int j = t->col[c]; j < t->col[c + 1]; j++) {
        a += t->cnu[j] * dlnm[t->csp[j]];
        b += fabs(t->cnu[j]) * dlnm[t->csp[j]];
      }
      if (dT) a -= dT[c];
    }
    col[k] = (a - P->F[k] * b) / P->S[k];
  }
  for (int k = 0; k < P->na; k++) {
    int X = P->amt[k].target;
    double s = X == EQPI_TARGET_IONIC ? dlnI : 0;
    if (X == EQPI_TARGET_SOLID)     /* a solid's row: sum_c b_c (x_c + ln g_c) */
      for (int c = 0; c < nc; c++)
        if (P->amt[k].b[c] != 0) s += P->amt[k].b[c] * ((dl ? dl[c] : 0) + dlngc[c]);
    for (int j = X < 0 ? 0 : t->row[X]; X >= 0 && j < t->row[X + 1]; j++)
      s += t->nu[j] * ((dl ? dl[t->cmp[j]] : 0) + dlngc[t->cmp[j]]);
    if (P->amt[k].molal && X >= 0) s -= dlng[X];
    col[nx + k] = s;
  }
  col[n - 1] = dIc / (P->Ic > TINY ? P->Ic : TINY) - dlnI;
}

/* The component columns for a model of I alone: species by species, over
** the pairs (row component, column component) each holds. */
static void ideal_columns(eqpi_problem *P, double *J)
{
  const eqpi_tableau *t = P->tab;
  const int ns = t->ns, n = P->n, h = t->hloc;
  const int rH = P->kind[h] == EQPI_ROW_MASS ? P->xidx[h] : -1;
  double *invS = P->w_n;       /* per row */
  int rq[4], nq = 0;           /* charge rows */
  for (int k = 0; k < P->nx; k++) {
    invS[k] = 1 / P->S[k];
    if (P->kind[P->xcomp[k]] == EQPI_ROW_CHARGE && nq < 4) rq[nq++] = k;
  }
  const double invI = 1 / (P->Ic > TINY ? P->Ic : TINY);
  for (int i = 0; i < ns; i++) {
    const double mi = P->m[i];
    for (int kd = t->row[i]; kd < t->row[i + 1]; kd++) {
      int l = P->xidx[t->cmp[kd]];
      if (l < 0) continue;
      double w = t->nu[kd] * mi, *Jc = J + (size_t)l * n;
      for (int kc = t->row[i]; kc < t->row[i + 1]; kc++) {
        int c = t->cmp[kc], r = P->xidx[c];
        if (r < 0 || c == h || P->kind[c] != EQPI_ROW_MASS) continue;
        Jc[r] += (t->nu[kc] - P->F[r] * fabs(t->nu[kc])) * w * invS[r];
      }
      if (rH >= 0) Jc[rH] += (P->coefH[i] - P->F[rH] * fabs(P->coefH[i])) * w * invS[rH];
      for (int q = 0; q < nq; q++)
        Jc[rq[q]] += (t->z[i] - P->F[rq[q]] * fabs(t->z[i])) * w * invS[rq[q]];
      Jc[n - 1] += 0.5 * t->z2[i] * w * invI;
    }
  }
  for (int k = 0; k < P->nx; k++)
    if (P->kind[P->xcomp[k]] == EQPI_ROW_ACTIVITY) J[(size_t)k * n + k] = 1;
  for (int k = 0; k < P->na; k++) {
    int X = P->amt[k].target;
    for (int j = X < 0 ? 0 : t->row[X]; X >= 0 && j < t->row[X + 1]; j++) {
      int l = P->xidx[t->cmp[j]];
      if (l >= 0) J[(size_t)l * n + P->nx + k] = t->nu[j];
    }
    for (int c = 0; X == EQPI_TARGET_SOLID && c < t->nc; c++)
      if (P->xidx[c] >= 0) J[(size_t)P->xidx[c] * n + P->nx + k] = P->amt[k].b[c];
  }
}

/* Column of amount k: the totals and the spectators move with it. */
static int amount_column(eqpi_problem *P, int k, double *col)
{
  const eqpi_tableau *t = P->tab;
  double *dT = P->w_nc[1], *dl = P->w_nc[2];
  const eqpi_amount *A = &P->amt[k];
  double dW = A->w * A->scale;
  for (int c = 0; c < t->nc; c++) {
    dT[c] = (A->a[c] * A->scale - P->tot[c] * dW) / P->W;
    dl[c] = P->xidx[c] < 0 ? dT[c] / (P->tot[c] > TINY ? P->tot[c] : TINY) : 0;
  }
  return direction(P, dl, 0.0, dT, col);
}

int eqpi_problem_jacobian(eqpi_problem *P, double *J, int *exact)
{
  const eqpi_tableau *t = P->tab;
  const int n = P->n, nx = P->nx;
  *exact = P->derivs != EQPI_DERIV_NONE || P->lambda == 0;
  if (gamma_slope(P) < 0) return -1;
  memset(J, 0, sizeof(double) * (size_t)n * (size_t)n);
  if (P->derivs == EQPI_DERIV_TANGENT && P->lambda != 0) {
    double *e = P->w_nc[2];
    memset(e, 0, sizeof(double) * (size_t)t->nc);
    for (int l = 0; l < nx; l++) {
      e[P->xcomp[l]] = 1;
      if (direction(P, e, 0.0, NULL, J + (size_t)l * n) < 0) return -1;
      e[P->xcomp[l]] = 0;
    }
  } else {
    ideal_columns(P, J);
  }
  for (int k = 0; k < P->na; k++)
    if (amount_column(P, k, J + (size_t)(nx + k) * n) < 0) return -1;
  /* the ln I column: no component moves */
  lnI_column(P, J + (size_t)(n - 1) * n);
  return 0;
}
