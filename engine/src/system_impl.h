/* The solver state of one solution: its tableau, its problem, its Newton
** workspace, and the last converged state for warm starts. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_SYSTEM_IMPL_H
#define EQP_SYSTEM_IMPL_H

#include "newton_impl.h"
#include "start_impl.h"

struct eqpi_system {
  eqp_ctx *ctx;
  eqpi_tableau *tab;
  eqpi_problem *prob;
  eqpi_newton *ws;      /* for the problem with its mass balances (n = nx + 1) */
  size_t bytes;         /* of the block below */
  double *u_last;       /* nmax: the last converged unknowns */
  double *tot_last;     /* nc: the totals they were converged for */
  double *S_last;       /* nmax: row scales there; the ionic strength row's entry
                           holds the computed I (the tangent needs it) */
  double *work;         /* 2 nmax * nmax + 2 nmax */
  double *lng_hold;     /* ns: ln gamma held by the proton-balance start */
  double **cols;        /* nmax */
  bool solved;
  bool lu_near_last;    /* ws holds the factors of J near u_last (same rows) */
  long start_evals;     /* proton-balance evaluations of the last solve */
};

/* Build or reuse the system for totals (mol/kg over the database's
** components, with the components of extra forced present) at T. */
int eqpi_system_prepare(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp,
                        const double *totals, double T, eqpi_model *model, const double *extra);
/* Solve the system as prepared: warm start, cold start, continuation,
** verification. */
int eqpi_system_solve_prepared(eqp_ctx *ctx, eqpi_system *s, eqpi_solve_stats *stats);
/* dpH/dv at the last solved state for adding v units of a direction
** (a: moles per unit over the local components, w: kg of water per unit)
** to W kg of water; dI_absent: d(ionic strength)/dv of components the
** direction brings that the system does not have yet (spectators to be). */
int eqpi_sys_dpH(eqpi_system *sys, const double *a, double w, double W, double dI_absent,
                 double *dpH);
/* Add the amounts of the n targets aj to the problem of s (then
** eqpi_problem_layout), each scaled by vlin (a linear estimate, or the
** amounts now); -1 when a target's species is not in the system or there
** are too many amounts. adjust.c */
int eqpi_adjust_add_targets(eqpi_system *s, const eqpi_adjust *aj, int n, const double *vlin);
/* Largest relative residual at u after a fresh evaluation (eqpi_problem_verify). */
static inline double eqpi_sys_verify(eqpi_system *sys, const double *u, int *worst)
{
  return eqpi_problem_verify(sys->prob, u, worst);
}
/* Fail with the names of the rows and their last residuals. */
int eqpi_system_fail_converge(eqp_ctx *ctx, eqpi_system *s, eqpi_newton *ws, int flag,
                              long iters);

#endif
