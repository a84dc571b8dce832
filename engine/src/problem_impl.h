/* The equilibrium problem over a tableau: one row per component (a mass
** balance, a fixed activity or the charge balance), amounts that are
** unknowns with a row each (an activity, or the ionic strength, held at a
** target; or a solid phase at its saturation), the ionic strength row, and
** the state of the last evaluation. Design: docs/methods.md. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_PROBLEM_IMPL_H
#define EQP_PROBLEM_IMPL_H

#include "tableau_impl.h"

/* The row of a component. */
enum {
  EQPI_ROW_MASS = 0,      /* sum_i nu_ic m_i = T_c: the total is given */
  EQPI_ROW_ACTIVITY = 1,  /* ln a_c = target: the total is an output */
  EQPI_ROW_CHARGE = 2     /* sum_i z_i m_i = 0 in place of c's balance: the total is an output */
};

#define EQPI_MAX_TARGETS 4      /* amounts an adjustment solves together */
/* those and the solid phases present at once (the phase rule caps these) */
#define EQPI_MAX_AMOUNTS (EQPI_MAX_TARGETS + EQPI_MAX_SOLIDS_PRESENT)
#define EQPI_TARGET_IONIC (-1)   /* an amount whose row holds the ionic strength */
#define EQPI_TARGET_SOLID (-3)   /* an amount whose row holds a phase's saturation */

/* An unknown amount v of a direction (a: mol per unit over the local
** components, w: kg of water per unit) and the row that fixes it: the
** activity of a species, or the ionic strength, at a target; or, for a
** solid phase (a: minus its composition, w: minus a hydrate's water), its saturation
** sum_c b_c (x_c + ln g_c) = ln_target, the ln Ksp less the log K of the
** species it dissolves to (b: its composition over the local components). */
typedef struct eqpi_amount {
  double *a;            /* nc, in the problem's block */
  double *b;            /* nc, in the problem's block: a solid's row */
  double w;
  double scale;         /* v = u scale: keeps the unknown near 1 */
  int target;           /* local species, EQPI_TARGET_IONIC or EQPI_TARGET_SOLID */
  int molal;            /* the row holds ln m of the species, not ln a */
  double ln_target;     /* ln a(target) (ln m if molal), ln I, or a solid's as above */
  const char *name;     /* a solid's, for messages (borrowed) */
} eqpi_amount;

typedef struct eqpi_problem {
  eqp_ctx *ctx;
  const eqpi_tableau *tab;
  size_t bytes;
  eqpi_model *model;
  int derivs;           /* EQPI_DERIV_* of the model */
  const eqpi_model *bound;   /* the model bind() last saw this species set */
  char bind_warn[256];
  char plugin_err[256];
  int plugin_failed;
  /* rows of the components */
  unsigned char *kind;  /* nc: EQPI_ROW_* */
  double *lna;          /* nc: target ln a of an ACTIVITY row */
  double *tot;          /* nc: totals, mol/kg (outputs for ACTIVITY and CHARGE rows) */
  double *lnfix;        /* nc: ln total of spectators */
  double *logx, *logv;  /* nc: the last total set_totals took the log of, and its log */
  int *xidx;            /* nc: unknown of the component, -1 for a spectator */
  /* amounts: the totals follow them, T = (N0 + sum v a) / (W0 + sum v w) */
  int na;
  eqpi_amount amt[EQPI_MAX_AMOUNTS];
  double *N0;           /* nc: mol before the amounts */
  double W0, W;         /* kg of water before the amounts, and at the last evaluation */
  /* unknowns: nx component unknowns, na amounts, ln I last */
  int nx, n, nmax;
  int *xcomp;           /* nmax: component of unknown k < nx */
  /* The H+ mass balance is written relative to the dominant protonation
  ** state of each component (a proton condition): row_H - sum_c href_c
  ** row_c. Same solution, but a buffer whose protonated form dominates no
  ** longer cancels two large terms in it. */
  double *href;         /* nc */
  double *coefH;        /* ns */
  double lambda;        /* continuation weight on ln gamma */
  /* the last evaluation */
  double *u_at;         /* nmax: where; valid when at_ok */
  int at_ok;
  double *lnfree;       /* nc: ln free molality of each component */
  double *lngc;         /* nc: ln gamma of each component's own species */
  double *s0, *mid;     /* ns: ln and molality by mass action with gamma = 1 */
  double *lg, *lng;     /* ns: log10 and ln gamma (times lambda) */
  double *m;            /* ns: molalities */
  double *F, *S;        /* nmax: residual and row scales */
  double I, Ic;         /* the unknown and the computed ionic strength */
  /* derivatives at the last Jacobian */
  double *dlng;         /* ns: d ln gamma / d ln I */
  /* scratch */
  double *w_ns[4], *w_nc[3], *w_n;
} eqpi_problem;

/* A problem over tab with the model (bound to its species when needed):
** every row a mass balance, no amounts. NULL with a message on failure. */
eqpi_problem *eqpi_problem_new(eqp_ctx *ctx, const eqpi_tableau *tab, eqpi_model *model);
void eqpi_problem_free(eqpi_problem *P);
/* Use model from now on (bind it if the species set is new to it). */
int eqpi_problem_set_model(eqpi_problem *P, eqpi_model *model);
/* Set the totals of the mass-balance rows from totals over the database's
** components (mol/kg). */
void eqpi_problem_set_totals(eqpi_problem *P, const double *totals);
/* Set the row of component c (local), with its target ln a for an
** ACTIVITY row; then eqpi_problem_layout. */
void eqpi_problem_set_row(eqpi_problem *P, int c, int kind, double lna);
/* Add an amount (a: mol per unit over the database's components); the
** first amount also fixes N0 (mol, database's components) and W0 (kg).
** -1 when there are already EQPI_MAX_AMOUNTS. Then eqpi_problem_layout. */
int eqpi_problem_add_amount(eqpi_problem *P, const double *N0, double W0, const double *a,
                            double w, double scale, int target, int molal, double ln_target);
/* Add a solid phase as an amount (as eqpi_problem_add_amount, w = 0; a
** hydrate sets amt[na - 1].w to minus its water after): a over the
** database's components, b over the local ones, name
** borrowed. -1 when there are already EQPI_MAX_AMOUNTS. */
int eqpi_problem_add_solid(eqpi_problem *P, const double *N0, double W0, const double *a,
                           double scale, const double *b, double ln_target, const char *name);
void eqpi_problem_clear_amounts(eqpi_problem *P);
/* Number the unknowns after the rows or amounts changed. */
void eqpi_problem_layout(eqpi_problem *P);

/* Residual F(u) (P->n entries); the state (m, gamma, totals) follows u.
** 0, -1 when the activity model failed, -2 for a non-finite iterate. */
int eqpi_problem_eval(eqpi_problem *P, const double *u, double *F);
/* Evaluate at u unless the last evaluation was there already. */
int eqpi_problem_at(eqpi_problem *P, const double *u);
/* The Jacobian dF/du at the last evaluation, column-major n x n into J;
** exact where the model gives derivatives, the ln I column by difference
** otherwise (*exact says which). 0 or -1 when the model failed. */
int eqpi_problem_jacobian(eqpi_problem *P, double *J, int *exact);
/* Choose the reference species of the H+ row at the last evaluation; 1 if
** it changed (the H+ row with it). */
int eqpi_problem_reference(eqpi_problem *P);
/* Totals of the rows whose total is an output, after a solve. */
void eqpi_problem_outputs(eqpi_problem *P);
/* Largest relative residual of the rows and of the charge balance at u,
** after a fresh evaluation with lambda = 1 (reused when the last evaluation
** was at u with lambda = 1); worst receives the offending row (n: the
** charge balance; beyond n + 1: a species whose molality or gamma is not
** finite). */
double eqpi_problem_verify(eqpi_problem *P, const double *u, int *worst);
const char *eqpi_problem_row_name(const eqpi_problem *P, int k);
/* 1/2 sum z^2 m at the last evaluation, mol/kg. */
double eqpi_problem_ionic_strength(const eqpi_problem *P);
/* Set the continuation weight on ln gamma (the state is stale after a change). */
static inline void eqpi_problem_set_lambda(eqpi_problem *P, double lambda)
{
  if (P->lambda != lambda) P->at_ok = 0;
  P->lambda = lambda;
}

#endif
