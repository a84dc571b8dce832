/* Kernels for the short serial vectors of the Newton workspace, installed
** in the vector's table of operations (SUNDIALS's N_Vector interface lets
** an implementation replace them). Debian's SUNDIALS 6.4.1 libraries are
** built without optimisation: a 4-element dot product there costs about
** 85 instructions, most of them stack traffic, and a warm solve makes
** about 60 such calls. These are the same operations in the same order as
** nvector_serial.c, special cases included, so every result is identical
** to the last bit; only the code around the arithmetic is shorter. */
/* SPDX-License-Identifier: MIT */
#include "newton_impl.h"
#include <math.h>

#define LEN(v) NV_LENGTH_S(v)
#define DAT(v) NV_DATA_S(v)

static void v_linearsum(sunrealtype a, N_Vector x, sunrealtype b, N_Vector y, N_Vector z)
{
  const sunindextype n = LEN(x);
  sunrealtype *xd = DAT(x), *yd = DAT(y), *zd = DAT(z);
  /* the cases of nvector_serial.c, each with its own rounding */
  if (b == 1 && z == y) {                        /* y += a x */
    if (a == 1) for (sunindextype i = 0; i < n; i++) yd[i] += xd[i];
    else if (a == -1) for (sunindextype i = 0; i < n; i++) yd[i] -= xd[i];
    else for (sunindextype i = 0; i < n; i++) yd[i] += a * xd[i];
  } else if (a == 1 && z == x) {                 /* x += b y */
    if (b == 1) for (sunindextype i = 0; i < n; i++) xd[i] += yd[i];
    else if (b == -1) for (sunindextype i = 0; i < n; i++) xd[i] -= yd[i];
    else for (sunindextype i = 0; i < n; i++) xd[i] += b * yd[i];
  } else if (a == 1 && b == 1) {
    for (sunindextype i = 0; i < n; i++) zd[i] = xd[i] + yd[i];
  } else if ((a == 1 && b == -1) || (a == -1 && b == 1)) {
    sunrealtype *p = a == 1 ? xd : yd, *q = a == 1 ? yd : xd;
    for (sunindextype i = 0; i < n; i++) zd[i] = p[i] - q[i];
  } else if (a == 1 || b == 1) {                 /* z = c v1 + v2 */
    sunrealtype c = a == 1 ? b : a, *v1 = a == 1 ? yd : xd, *v2 = a == 1 ? xd : yd;
    for (sunindextype i = 0; i < n; i++) zd[i] = c * v1[i] + v2[i];
  } else if (a == -1 || b == -1) {               /* z = c v1 - v2 */
    sunrealtype c = a == -1 ? b : a, *v1 = a == -1 ? yd : xd, *v2 = a == -1 ? xd : yd;
    for (sunindextype i = 0; i < n; i++) zd[i] = c * v1[i] - v2[i];
  } else if (a == b) {
    for (sunindextype i = 0; i < n; i++) zd[i] = a * (xd[i] + yd[i]);
  } else if (a == -b) {
    for (sunindextype i = 0; i < n; i++) zd[i] = a * (xd[i] - yd[i]);
  } else {
    for (sunindextype i = 0; i < n; i++) zd[i] = a * xd[i] + b * yd[i];
  }
}

static void v_const(sunrealtype c, N_Vector z)
{
  sunrealtype *zd = DAT(z);
  for (sunindextype i = 0, n = LEN(z); i < n; i++) zd[i] = c;
}

static void v_prod(N_Vector x, N_Vector y, N_Vector z)
{
  sunrealtype *xd = DAT(x), *yd = DAT(y), *zd = DAT(z);
  for (sunindextype i = 0, n = LEN(x); i < n; i++) zd[i] = xd[i] * yd[i];
}

static void v_div(N_Vector x, N_Vector y, N_Vector z)
{
  sunrealtype *xd = DAT(x), *yd = DAT(y), *zd = DAT(z);
  for (sunindextype i = 0, n = LEN(x); i < n; i++) zd[i] = xd[i] / yd[i];
}

static void v_scale(sunrealtype c, N_Vector x, N_Vector z)
{
  sunrealtype *xd = DAT(x), *zd = DAT(z);
  const sunindextype n = LEN(x);
  if (z == x) for (sunindextype i = 0; i < n; i++) xd[i] *= c;
  else if (c == 1) for (sunindextype i = 0; i < n; i++) zd[i] = xd[i];
  else if (c == -1) for (sunindextype i = 0; i < n; i++) zd[i] = -xd[i];
  else for (sunindextype i = 0; i < n; i++) zd[i] = c * xd[i];
}

static void v_abs(N_Vector x, N_Vector z)
{
  sunrealtype *xd = DAT(x), *zd = DAT(z);
  for (sunindextype i = 0, n = LEN(x); i < n; i++) zd[i] = fabs(xd[i]);
}

static void v_inv(N_Vector x, N_Vector z)
{
  sunrealtype *xd = DAT(x), *zd = DAT(z);
  for (sunindextype i = 0, n = LEN(x); i < n; i++) zd[i] = 1 / xd[i];
}

static sunrealtype v_dotprod(N_Vector x, N_Vector y)
{
  sunrealtype s = 0, *xd = DAT(x), *yd = DAT(y);
  for (sunindextype i = 0, n = LEN(x); i < n; i++) s += xd[i] * yd[i];
  return s;
}

static sunrealtype v_maxnorm(N_Vector x)
{
  sunrealtype m = 0, *xd = DAT(x);
  for (sunindextype i = 0, n = LEN(x); i < n; i++)
    if (fabs(xd[i]) > m) m = fabs(xd[i]);
  return m;
}

static sunrealtype v_min(N_Vector x)
{
  sunrealtype *xd = DAT(x), m = xd[0];
  for (sunindextype i = 1, n = LEN(x); i < n; i++)
    if (xd[i] < m) m = xd[i];
  return m;
}

static sunrealtype v_wl2norm(N_Vector x, N_Vector w)
{
  sunrealtype s = 0, *xd = DAT(x), *wd = DAT(w);
  for (sunindextype i = 0, n = LEN(x); i < n; i++) {
    sunrealtype p = xd[i] * wd[i];
    s += p * p;
  }
  return sqrt(s);
}

static int v_linearcombination(int nvec, sunrealtype *c, N_Vector *X, N_Vector z)
{
  if (nvec == 1) {
    v_scale(c[0], X[0], z);
    return 0;
  }
  if (nvec == 2) {
    v_linearsum(c[0], X[0], c[1], X[1], z);
    return 0;
  }
  const sunindextype n = LEN(z);
  sunrealtype *zd = DAT(z);
  if (X[0] == z && c[0] == 1) {
  } else if (X[0] == z) {
    for (sunindextype j = 0; j < n; j++) zd[j] *= c[0];
  } else {
    sunrealtype *xd = DAT(X[0]);
    for (sunindextype j = 0; j < n; j++) zd[j] = c[0] * xd[j];
  }
  for (int i = 1; i < nvec; i++) {
    sunrealtype *xd = DAT(X[i]);
    for (sunindextype j = 0; j < n; j++) zd[j] += c[i] * xd[j];
  }
  return 0;
}

void eqpi_vec_install(N_Vector v)
{
  N_Vector_Ops o = v->ops;
  o->nvlinearsum = v_linearsum;
  o->nvconst = v_const;
  o->nvprod = v_prod;
  o->nvdiv = v_div;
  o->nvscale = v_scale;
  o->nvabs = v_abs;
  o->nvinv = v_inv;
  o->nvdotprod = v_dotprod;
  o->nvmaxnorm = v_maxnorm;
  o->nvmin = v_min;
  o->nvwl2norm = v_wl2norm;
  o->nvlinearcombination = v_linearcombination;
}

/* The solve with SUNDIALS's dense LU factors, for the same reason: three
** per warm solve (the predictor and GMRES's two preconditioner solves),
** where the unoptimised build took 6 % of the time. The operations and
** their order are those of SUNDlsMat_denseGETRS (sundials_dense.c). */
void eqpi_dense_getrs(double *const *a, int n, const sunindextype *p, double *b)
{
  for (int k = 0; k < n; k++) {          /* the row interchanges */
    sunindextype pk = p[k];
    if (pk != k) {
      double t = b[k];
      b[k] = b[pk];
      b[pk] = t;
    }
  }
  for (int k = 0; k < n - 1; k++) {      /* L y = b, unit diagonal */
    const double *col = a[k], bk = b[k];
    for (int i = k + 1; i < n; i++) b[i] -= col[i] * bk;
  }
  for (int k = n - 1; k > 0; k--) {      /* U x = y */
    const double *col = a[k];
    b[k] /= col[k];
    const double bk = b[k];
    for (int i = 0; i < k; i++) b[i] -= col[i] * bk;
  }
  b[0] /= a[0][0];
}
