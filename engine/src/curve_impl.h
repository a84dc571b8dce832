/* Curves of a titration. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_CURVE_IMPL_H
#define EQP_CURVE_IMPL_H

#include "eqp_impl.h"

/* An equivalence point: a maximum of |dpH/dv| found on the curve. */
typedef struct eqpi_eqpoint {
  double amount;        /* mol of a reagent titrant; NaN for a stock */
  double litres;        /* L added; NaN for a solid reagent */
  double pH;
  double sharpness;     /* |dpH/dv| there over the lowest |dpH/dv| of its flanks */
} eqpi_eqpoint;

struct eqp_curve {
  eqp_ctx *ctx;
  int ncols;
  char **names;
  double *v;            /* nrows x ncols */
  size_t nrows, caprows;
  eqpi_eqpoint *eq;     /* in the order of the titration */
  size_t neq, capeq;
  double rho;           /* kg/L of water at the titration's temperature */
  int values;           /* what the columns not named below hold (text tables) */
};

/* The columns of a curve other than amount, volume, total_volume, pH,
** slope, temperature and ionic_strength: a titration's species molalities,
** a distribution's fractions, a capacity sweep's beta in mol/(L pH), or
** numbers without a known unit (a table read back from a file). */
enum { EQPI_VALUES_OTHER, EQPI_VALUES_FRACTION, EQPI_VALUES_BETA };

eqp_curve *eqpi_curve_new(eqp_ctx *ctx, int ncols, const char *const *names);
int eqpi_curve_push(eqp_curve *c, const double *row);
int eqpi_curve_push_eq(eqp_curve *c, const eqpi_eqpoint *e);

#endif
