/* The active equilibrium system of one solution and its solver state. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_SYSTEM_IMPL_H
#define EQP_SYSTEM_IMPL_H

#include "eqp_impl.h"
#include <kinsol/kinsol.h>
#include <nvector/nvector_serial.h>
#include <sundials/sundials_context.h>
#include <sunlinsol/sunlinsol_spgmr.h>

struct eqpi_system {
  eqp_ctx *ctx;
  unsigned generation;  /* database generation the tableau was built from */
  int ncg;              /* global component count at build time */
  unsigned char *active;/* ncg flags: which components are present */
  double Tk;            /* temperature of lnK, K */
  /* components present (water excluded) */
  int nc;
  int *comp;            /* global component index */
  int *comp_sp;         /* local species index of each component's own species */
  int *xidx;            /* unknown index of a component, -1 when fixed */
  double *tot;          /* totals, mol/kg */
  double *lnfix;        /* ln total of fixed (spectator) components */
  int nx;               /* unknown components; unknown nx is ln I */
  int n;                /* nx + 1 */
  int *xcomp;           /* local component of unknown k */
  int hloc;             /* local index of H+ */
  /* species present */
  int ns;
  int *sp;              /* global species index */
  double *lnK;          /* natural log of the overall formation constant */
  double *nu;           /* ns x nc, row-major */
  double *z, *z2, *size;
  int missing_T, outside_T;
  /* work arrays */
  double *lnfree, *s0, *mid, *lg, *lng, *m;
  double *J;
  int *piv;
  double *g, *d, *xt;   /* cold start */
  double lambda;        /* continuation weight on ln gamma */
  double *dlng;         /* ns: d ln g / d ln I, from the last preconditioner */
  /* The H+ row is written relative to the dominant protonation state of
  ** each component (a proton condition): row_H - sum_c href_c row_c. It
  ** has the same solution, but a buffer whose protonated form dominates no
  ** longer cancels two large terms in it. */
  double *href;         /* nc: protons of the reference species per component */
  double *coefH;        /* ns: coefficients of the H+ row */
  /* Fixed-activity mode: a(H+) is held at exp(lnaH) and the
  ** amount v of a reagent direction takes H+'s unknown slot; the totals
  ** follow v: tot = (N0 + v adir) / (W0 + v wdir), v = u * vscale. */
  int adjust;
  double lnaH;
  double *N0, *adir;    /* nc: moles present, moles per unit of v */
  double W0, wdir, vscale;
  double A, B;
  eqpi_model *model;
  const eqpi_model *bound;   /* the model bind() last saw this species set */
  const char **names;        /* ns species names, for bind() */
  char bind_warn[256];
  char plugin_err[256];
  int plugin_failed;
  /* KINSOL, one instance reused between solves */
  SUNContext sun;
  void *kmem;
  N_Vector u, scale;
  SUNLinearSolver LS;
  char kin_err[256];
  /* the last converged state, for warm starts */
  bool solved;
  double *u_last;
  double *tot_last;
};

/* Evaluate the scaled residual F(u) (n entries). Returns 0, or -1 when the
** activity model failed. */
int eqpi_sys_eval(eqpi_system *sys, const double *u, double *F);
/* Choose the reference species of the H+ row at the state of the last
** evaluation (system.c); 1 if it changed (the H+ row with it). */
int eqpi_sys_reference(eqpi_system *sys);
/* dpH/dv at the last solved state for adding v units of a direction
** (a: moles per unit over the system's local components, w: kg of water
** per unit) to W kg of water: implicit differentiation through the
** system's Jacobian. dI_absent is d(ionic strength)/dv of components the
** direction brings that the system does not have yet (they enter as
** spectators). Returns 0, or -1 if the Jacobian is singular. */
int eqpi_sys_dpH(eqpi_system *sys, const double *a, double w, double W, double dI_absent,
                 double *dpH);
/* Largest relative residual of the balances and ionic strength at u, after
** a fresh evaluation with lambda = 1; worst receives the offending row. */
double eqpi_sys_verify(eqpi_system *sys, const double *u, int *worst);
/* Fill sys->J with the preconditioner at u (system.c) and factor it. Returns 0 or -1 if singular. */
int eqpi_sys_precond(eqpi_system *sys, const double *u);
/* Ideal-solution start: Newton on the convex potential. u receives the
** unknowns. Returns 0 or -1 if it did not reach the tolerance. */
int eqpi_sys_coldstart(eqpi_system *sys, double *u);
const char *eqpi_sys_row_name(const eqpi_system *sys, int k);

/* solve.c, shared with adjust.c: build or reuse the system for totals (with
** the components of extra forced present), solve it as prepared, and one
** KINSOL run from u0. */
int eqpi_system_prepare(eqp_ctx *ctx, eqpi_system **sysp, const double *totals, double T,
                        eqpi_model *model, const double *extra);
int eqpi_system_solve_prepared(eqp_ctx *ctx, eqpi_system *s, int *rcp, eqpi_solve_stats *stats);
int eqpi_run_kinsol(eqpi_system *s, const double *u0, long *iters);

#endif
