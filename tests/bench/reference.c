/* A hand-coded dense Newton for the phosphate buffer with Davies activity
** coefficients: the same unknowns, rows and tolerance as the engine, with
** nothing general about it. It is what the engine's warm solve is measured
** against (tests/bench/bench_phosphate.c). */
/* SPDX-License-Identifier: MIT */
#include "reference.h"
#include <math.h>

#define LN10 2.302585092994045684

static const double nuH[6] = {1, -1, 0, 1, 2, 3};
static const double nuP[6] = {0, 0, 1, 1, 1, 1};
static const double z2[6] = {1, 1, 9, 4, 1, 0};
static const char *const names[6] = {"H+", "OH-", "PO4^3-", "HPO4^2-", "H2PO4-", "H3PO4"};

int ref_init(ref_buffer *b, const eqp_result *r, double TH, double TP, double TNa, double TK)
{
  double a[6], g;
  for (int i = 0; i < 6; i++)
    if (eqp_result_activity(r, names[i], &a[i]) != EQP_OK) return -1;
  for (int i = 0; i < 6; i++)
    b->lnK[i] = log(a[i]) - nuH[i] * log(a[0]) - nuP[i] * log(a[2]);
  double I = eqp_result_ionic_strength(r), sI = sqrt(I);
  b->c = 0.3;
  if (eqp_result_gamma(r, "Na+", &g) != EQP_OK) return -1;
  b->A = -log10(g) / (sI / (1 + sI) - b->c * I);
  b->TH = TH;
  b->TP = TP;
  b->TNa = TNa;
  b->TK = TK;
  double mH, mP;
  eqp_result_molality(r, "H+", &mH);
  eqp_result_molality(r, "PO4^3-", &mP);
  b->x[0] = log(mH);
  b->x[1] = log(mP);
  b->x[2] = log(I);
  b->iterations = 0;
  return 0;
}

/* Residual F and Jacobian J (row-major) at b->x. Rows: the H+ and PO4^3-
** balances scaled by sum |nu| m, and ln(I computed) - ln I. */
static void eval(ref_buffer *b, double F[3], double J[9])
{
  double I = exp(b->x[2]), sI = sqrt(I);
  /* ln gamma = z^2 f(I), Davies; df = d f / d ln I */
  double f = -b->A * LN10 * (sI / (1 + sI) - b->c * I);
  double df = -b->A * LN10 * I * (0.5 / (sI * (1 + sI) * (1 + sI)) - b->c);
  double xH = b->x[0] + f, xP = b->x[1] + 9 * f, dl[6];
  double RH = -b->TH, SH = 0, RP = -b->TP, SP = 0, Ic = 0.5 * (b->TNa + b->TK);
  double dRH[3] = {0, 0, 0}, dSH[3] = {0, 0, 0}, dRP[3] = {0, 0, 0}, dSP[3] = {0, 0, 0};
  double dIc[3] = {0, 0, 0};
  for (int i = 0; i < 6; i++) {
    double m = exp(b->lnK[i] + nuH[i] * xH + nuP[i] * xP - z2[i] * f);
    b->m[i] = m;
    dl[0] = nuH[i];
    dl[1] = nuP[i];
    dl[2] = (nuH[i] + 9 * nuP[i] - z2[i]) * df;
    RH += nuH[i] * m;
    SH += fabs(nuH[i]) * m;
    RP += nuP[i] * m;
    SP += nuP[i] * m;
    Ic += 0.5 * z2[i] * m;
    for (int k = 0; k < 3; k++) {
      double dm = m * dl[k];
      dRH[k] += nuH[i] * dm;
      dSH[k] += fabs(nuH[i]) * dm;
      dRP[k] += nuP[i] * dm;
      dSP[k] += nuP[i] * dm;
      dIc[k] += 0.5 * z2[i] * dm;
    }
  }
  F[0] = RH / SH;
  F[1] = RP / SP;
  F[2] = log(Ic) - b->x[2];
  for (int k = 0; k < 3; k++) {
    J[k] = (dRH[k] - F[0] * dSH[k]) / SH;
    J[3 + k] = (dRP[k] - F[1] * dSP[k]) / SP;
    J[6 + k] = dIc[k] / Ic;
  }
  J[8] -= 1;
}

/* Gaussian elimination with partial pivoting: J d = -F. */
static int solve3(double J[9], double F[3], double d[3])
{
  int p[3] = {0, 1, 2};
  for (int i = 0; i < 3; i++) d[i] = -F[i];
  for (int k = 0; k < 3; k++) {
    int q = k;
    for (int i = k + 1; i < 3; i++)
      if (fabs(J[p[i] * 3 + k]) > fabs(J[p[q] * 3 + k])) q = i;
    int t = p[k]; p[k] = p[q]; p[q] = t;
    double piv = J[p[k] * 3 + k];
    if (piv == 0) return -1;
    for (int i = k + 1; i < 3; i++) {
      double f = J[p[i] * 3 + k] / piv;
      for (int j = k; j < 3; j++) J[p[i] * 3 + j] -= f * J[p[k] * 3 + j];
      d[p[i]] -= f * d[p[k]];
    }
  }
  double x[3];
  for (int k = 2; k >= 0; k--) {
    double s = d[p[k]];
    for (int j = k + 1; j < 3; j++) s -= J[p[k] * 3 + j] * x[j];
    x[k] = s / J[p[k] * 3 + k];
  }
  for (int k = 0; k < 3; k++) d[k] = x[k];
  return 0;
}

int ref_solve(ref_buffer *b, double tol)
{
  double F[3], J[9], d[3];
  for (int it = 0; it < 50; it++) {
    eval(b, F, J);
    if (fabs(F[0]) <= tol && fabs(F[1]) <= tol && fabs(F[2]) <= tol) {
      b->iterations += it;
      return it;
    }
    if (solve3(J, F, d) < 0) return -1;
    for (int k = 0; k < 3; k++) b->x[k] += d[k];
  }
  return -1;
}

double ref_pH(const ref_buffer *b)
{
  double I = exp(b->x[2]), sI = sqrt(I);
  return -b->x[0] / LN10 + b->A * (sI / (1 + sI) - b->c * I);
}
