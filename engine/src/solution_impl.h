/* Solutions: the private record, shared by the files that work on it. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_SOLUTION_IMPL_H
#define EQP_SOLUTION_IMPL_H

#include "result_impl.h"

struct eqp_solution {
  eqp_ctx *ctx;
  const eqpi_db *db;      /* its species library, held for its life */
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
  /* no model named: beyond the default's stated range the next model of
  ** eqpi_default_chain that covers the ionic strength is used (default_model.c) */
  bool model_default;
  eqpi_model chain[EQPI_DEFAULT_CHAIN];   /* [0] unused (s->model); opened when needed */
  signed char chain_state[EQPI_DEFAULT_CHAIN]; /* 0 not tried, 1 open, -1 unavailable */
  /* estimated volume of the solutes (volume.c) and mass of those of unknown volume */
  double solute_L, unknown_g;
  /* the last reagent added, by the name it was given: a titration or a
  ** loop adds one reagent over and over (solution.c) */
  char rg_name[32];
  int rg_index;
  unsigned rg_gen;
  const eqpi_reagent *vol_r;   /* the last reagent's volume, cached */
  unsigned vol_gen;
  double vol_L;
  int vol_known;
  /* solids that may form or dissolve (precipitate.c): all, or flags over
  ** the library's first nallow solids; none by default */
  int allow_all;
  unsigned char *allow;
  int nallow;
  /* a closed headspace (headspace.c); NULL when open */
  struct eqpi_head *head;
};

int eqpi_find_reagent(eqp_solution *s, const char *name, const eqpi_reagent **r);
/* Add k times the totals of stock (mol per component of its library) to a
** (per component of s's library): by index when both have one library,
** else by component name. EQP_E_UNKNOWN, naming it, when the stock holds a
** component s's library does not define. */
int eqpi_add_stock(const eqp_solution *s, const eqp_solution *stock, double k, double *a);
/* What k mol of reagent r adds: components into a (added), kg of water into *w (per mol). */
void eqpi_reagent_dir(const eqp_solution *s, const eqpi_reagent *r, double *a, double *w, double k);
/* Record that reagent r, or everything hazardous in stock, went into s
** (and so into the run: its context shows the caution). caution.c */
int eqpi_use_reagent(eqp_solution *s, const eqpi_reagent *r);
/* What a reagent does to the pH, as its formula says (recipe.c): it
** releases H+ (an acid: HCl), takes it up (a base: NaOH), holds a weak acid
** or base (a component with protonated or hydrolysed forms: KH2PO4, Tris,
** CaCO3; *comp, if given, is that component, else -1), or none of these
** (NaCl). */
enum { EQPI_RG_NEUTRAL, EQPI_RG_ACID, EQPI_RG_BASE, EQPI_RG_WEAK };
int eqpi_reagent_kind(const eqpi_db *db, const eqpi_reagent *r, int *comp);
int eqpi_use_stock(eqp_solution *s, const eqp_solution *stock);
/* The record of a copy: the same reagents, and no new use for the run. */
int eqpi_copy_hazards(eqp_solution *dst, const eqp_solution *src);
void eqpi_solution_hazards_free(eqp_solution *s);
/* eqp_solution_equilibrate without telling the observer: for the states an
** operation solves inside (titration points, budgets, comparisons). */
int eqpi_solution_equilibrate(eqp_solution *s, eqp_result **out);
/* Room in s->total for every component of the library. */
int eqpi_solution_grow(eqp_solution *s);
/* The volume (or unknown mass) k mol of reagent r brings into s. */
void eqpi_solution_bulk(eqp_solution *s, const eqpi_reagent *r, double k);
/* Make sure s->sys holds the equilibrium of the present composition. */
int eqpi_solution_solved(eqp_solution *s);
/* Volume and unknown mass that k mol of reagent r brings into *L and *g. */
void eqpi_reagent_bulk(const eqpi_reagent *r, double k, double *L, double *g);

/* default_model.c. Model k of the default chain for s (0: s->model), or NULL
** when its plugin cannot be opened. */
eqpi_model *eqpi_chain_model(eqp_solution *s, int k);
/* The first model of the chain from k on that s may use at ionic strength I
** (its stated range covers I); -1 if none. */
int eqpi_chain_choice(eqp_solution *s, double I, int k);
/* Refuse a state beyond every model of the chain (EQP_E_INPUT). */
int eqpi_chain_refuse(eqp_solution *s, double I, const char *what);
void eqpi_chain_close(eqp_solution *s);
/* Equilibrate with model k of the chain first (0: the solution's own), then,
** for a default model and if follow, with the next ones while the ionic
** strength is beyond the range of the one used. *k receives the model used,
** *st (if not NULL) the statistics the result's warnings came from. */
int eqpi_solution_equilibrate_from(eqp_solution *s, int *k, int follow, eqp_result **out,
                                   eqpi_solve_stats *st);
/* The adjustment of n targets with model *k of the chain (0: the solution's
** own), then, for the default model, again with the next ones while the
** ionic strength is beyond the range of the one used; what names the
** operation in a refusal ("pH adjustment"). */
int eqpi_solution_adjust(eqp_solution *s, eqpi_adjust *aj, int n, double *v, eqpi_solve_stats *st,
                         int *k, const char *what);

/* precipitate.c. Whether solid k of the library may form in s. */
int eqpi_solution_allowed(const eqp_solution *s, int k);
/* The active set of solids over the totals mol (mol/kg, nothing
** precipitated) with model: s->sys ends solved for the dissolved totals,
** amounts (one per solid of the library) holds mol of each phase per kg of
** the water before precipitation, *wfrac the water left in solution over
** that (a hydrate's water stays in the solid). */
int eqpi_precipitate(eqp_solution *s, const double *mol, eqpi_model *model,
                     eqpi_solve_stats *st, double *amounts, double *wfrac);
/* Whether s lets any solid form. */
int eqpi_solution_any_solid(const eqp_solution *s);
/* The adjustment of n targets (eqpi_system_adjust) with the solids s
** allows: the active set with each set one solve in which the targets'
** amounts and the phases' amounts are unknowns together; v receives the
** targets' amounts, s->sys ends solved at the dissolved totals. what names
** the operation in a failure. */
int eqpi_precipitate_adjust(eqp_solution *s, const eqpi_adjust *aj, int n, double *v,
                            eqpi_solve_stats *st, const char *what);

/* headspace.c. The gases of a sealed solution partitioned over the liquid's
** totals mol (mol/kg, before any exchange) with model: s->sys ends solved
** for the dissolved totals (and amt, if not NULL, holds the solids' amounts
** and *wfrac the water left in solution, as eqpi_precipitate); the record
** keeps each gas's pressure and amount. */
int eqpi_headspace_solve(eqp_solution *s, const double *mol, eqpi_model *model,
                         eqpi_solve_stats *st, double *amt, double *wfrac);
/* Give r the headspace of the last eqpi_headspace_solve. */
int eqpi_headspace_result(const eqp_solution *s, eqp_result *r);
/* dpH/dv along a direction (a over the library's components, w kg of water
** per unit) at the solved state, the headspace's gases following. */
int eqpi_solution_dpH_dir(eqp_solution *s, const double *a, double w, double *dpH);
/* Refuse an operation a sealed solution cannot do (EQP_E_INPUT). */
int eqpi_head_refuse(eqp_solution *s, const char *what);
int eqpi_head_copy(eqp_solution *dst, const eqp_solution *src);
void eqpi_head_free(eqp_solution *s);
/* Saturation vapour pressure of water at T (K), atm. */
double eqpi_water_vapour_atm(double T);

/* A total that rounding took just below zero (within 1e-13 of what it was
** made from) is used up, not negative. */
static inline double eqpi_used_up(double v, double ref)
{
  return v < 0 && v > -1e-13 * fabs(ref) - 1e-300 ? 0 : v;
}

#endif
