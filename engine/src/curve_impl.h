/* Curves of a titration. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_CURVE_IMPL_H
#define EQP_CURVE_IMPL_H

#include "eqp_impl.h"

#define EQPI_MAX_EQ 8

struct eqp_curve {
  eqp_ctx *ctx;
  int ncols;
  char **names;
  double *v;            /* nrows x ncols */
  size_t nrows, caprows;
  double eq[EQPI_MAX_EQ][3];   /* amount (mol), volume (L), pH */
  int neq;
};

eqp_curve *eqpi_curve_new(eqp_ctx *ctx, int ncols, const char *const *names);
int eqpi_curve_push(eqp_curve *c, const double *row);

#endif
