/* Solutions: the private record, shared by the files that work on it. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_SOLUTION_IMPL_H
#define EQP_SOLUTION_IMPL_H

#include "result_impl.h"

struct eqp_solution {
  eqp_ctx *ctx;
  double water_kg;
  double T;               /* K */
  eqpi_model model;
  double *total;          /* mol per component of the database */
  int ntotal;
  eqpi_system *sys;
  char pname[8][32];      /* activity-model parameters set, for copies */
  double pvalue[8];
  int nparams;
  int *hazard;            /* hazardous reagents it received, directly or in a stock */
  int nhazard, caphazard;
};

int eqpi_find_reagent(eqp_solution *s, const char *name, const eqpi_reagent **r);
/* What k mol of reagent r adds: components into a (added), kg of water into *w (per mol). */
void eqpi_reagent_dir(const eqp_solution *s, const eqpi_reagent *r, double *a, double *w, double k);
/* Record that reagent r, or everything hazardous in stock, went into s
** (and so into the run: its context shows the caution). caution.c */
int eqpi_use_reagent(eqp_solution *s, const eqpi_reagent *r);
int eqpi_use_stock(eqp_solution *s, const eqp_solution *stock);
/* The record of a copy: the same reagents, and no new use for the run. */
int eqpi_copy_hazards(eqp_solution *dst, const eqp_solution *src);
void eqpi_solution_hazards_free(eqp_solution *s);
/* Make sure s->sys holds the equilibrium of the present composition. */
int eqpi_solution_solved(eqp_solution *s);

#endif
