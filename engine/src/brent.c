/* One-dimensional root finding and minimisation by Brent's methods
** (R. P. Brent, Algorithms for Minimization without Derivatives,
** Prentice-Hall 1973, chapters 4 and 5): inverse quadratic interpolation
** and the secant step, safeguarded by bisection for roots; parabolic
** interpolation safeguarded by golden sections for minima. The only 1-D
** solvers of the engine. */
/* SPDX-License-Identifier: MIT */
#include "brent_impl.h"
#include <float.h>
#include <math.h>

int eqpi_brent_root(eqpi_fn1 f, void *ud, double a, double b, double fa, double fb,
                    double tol, int maxit, double *root)
{
  if (fa == 0) { *root = a; return 0; }
  if (fb == 0) { *root = b; return 0; }
  if (!((fa < 0) != (fb < 0))) return EQPI_BRENT_NOBRACKET;
  double c = a, fc = fa, d = b - a, e = d;
  for (int it = 0; it < maxit; it++) {
    if ((fb < 0) == (fc < 0)) {      /* keep the root between b and c */
      c = a;
      fc = fa;
      d = e = b - a;
    }
    if (fabs(fc) < fabs(fb)) {       /* b is the best estimate */
      a = b; b = c; c = a;
      fa = fb; fb = fc; fc = fa;
    }
    double t = 2 * DBL_EPSILON * fabs(b) + 0.5 * tol, m = 0.5 * (c - b);
    if (fabs(m) <= t || fb == 0) {
      *root = b;
      return 0;
    }
    if (fabs(e) >= t && fabs(fa) > fabs(fb)) {
      double s = fb / fa, p, q;
      if (a == c) {                  /* secant */
        p = 2 * m * s;
        q = 1 - s;
      } else {                       /* inverse quadratic interpolation */
        double r = fb / fc;
        q = fa / fc;
        p = s * (2 * m * q * (q - r) - (b - a) * (r - 1));
        q = (q - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < fmin(3 * m * q - fabs(t * q), fabs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = e = m;                   /* bisection */
      }
    } else {
      d = e = m;
    }
    a = b;
    fa = fb;
    b += fabs(d) > t ? d : (m > 0 ? t : -t);
    int rc = f(ud, b, &fb);
    if (rc < 0) return rc;
    if (!isfinite(fb)) return EQPI_BRENT_NONFINITE;
  }
  *root = b;
  return EQPI_BRENT_MAXIT;
}

int eqpi_brent_min(eqpi_fn1 f, void *ud, double a, double b, double tol, int maxit,
                   double *xmin, double *fmin_out)
{
  const double g = 0.3819660112501051;   /* (3 - sqrt 5) / 2 */
  double x = a + g * (b - a), w = x, v = x, fx, d = 0, e = 0;
  int rc = f(ud, x, &fx);
  if (rc < 0) return rc;
  double fw = fx, fv = fx;
  for (int it = 0; it < maxit; it++) {
    double m = 0.5 * (a + b), t = tol * fabs(x) + 1e-300, t2 = 2 * t;
    if (fabs(x - m) <= t2 - 0.5 * (b - a)) break;
    double p = 0, q = 0, r = 0;
    if (fabs(e) > t) {               /* a parabola through x, w, v */
      r = (x - w) * (fx - fv);
      q = (x - v) * (fx - fw);
      p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
    }
    if (fabs(p) < fabs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
      d = p / q;
      double u = x + d;
      if (u - a < t2 || b - u < t2) d = x < m ? t : -t;
    } else {
      e = (x < m ? b : a) - x;        /* golden section */
      d = g * e;
    }
    double u = x + (fabs(d) >= t ? d : (d > 0 ? t : -t)), fu;
    if ((rc = f(ud, u, &fu)) < 0) return rc;
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w; fv = fw;
      w = x; fw = fx;
      x = u; fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w == x) {
        v = w; fv = fw;
        w = u; fw = fu;
      } else if (fu <= fv || v == x || v == w) {
        v = u; fv = fu;
      }
    }
  }
  *xmin = x;
  if (fmin_out) *fmin_out = fx;
  return 0;
}
