/* The tableau of the components present: which species exist, what they are
** made of, their charges and log K at one temperature. Immutable once
** built; a change of components, library or temperature makes a new one. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_TABLEAU_IMPL_H
#define EQP_TABLEAU_IMPL_H

#include "eqp_impl.h"

typedef struct eqpi_tableau {
  size_t bytes;         /* the whole block (one allocation) */
  unsigned refs;        /* systems using it (ownership only: the tableau does not change) */
  int cached;           /* held by the context's cache */
  const eqpi_db *db;    /* the library it was built from (its users hold it) */
  unsigned generation;  /* that library's generation */
  int ncg;              /* global component count at build time */
  const unsigned char *active;   /* ncg flags: the components present */
  double T;             /* K, of lnK */
  int nc;               /* components present (water excluded) */
  const int *comp;      /* global component index */
  const int *comp_sp;   /* local species of each component's own species */
  int hloc;             /* local component of H+ */
  int ns;               /* species present */
  const int *sp;        /* global species index */
  const char *const *names;
  const double *z, *z2, *size;
  const double *lnK;    /* natural log of the overall formation constant at T */
  int missing_T, outside_T;   /* temperature notes of lnK (eqpi_tnotes) */
  double A, B;          /* Debye-Hueckel A and B at T */
  double rho;           /* density of water at T, kg/L (every result reports it) */
  /* Stoichiometry, sparse by species (CSR): species i is the sum over
  ** t in [row[i], row[i+1]) of nu[t] times component cmp[t]. */
  const int *row, *cmp;
  const double *nu;
  /* The same by component (CSC): component c is in species csp[t] with
  ** coefficient cnu[t], t in [col[c], col[c+1]). */
  const int *col, *csp;
  const double *cnu;
  /* Acid ladders: the species made of component c and H+ alone, with one
  ** c each (its protonation states), t in [lad[c], lad[c+1]) of ladsp;
  ** closed[c] when c is in no other species (then its ladder is all of it). */
  const int *lad, *ladsp;
  const unsigned char *closed;
  /* Species made of component c and H+ alone (c at least once; c = H+
  ** has none), t in [own[c], own[c+1]): local species ownsp[t] with
  ** ownc[t] of c and ownh[t] of H+. The proton reference is chosen among them. */
  const int *own, *ownsp;
  const double *ownc, *ownh;
  /* The library's solids whose species are all present (water aside), by
  ** ascending library index sol[j]: terms [srow[j], srow[j+1]) of local
  ** species ssp with coefficients snu, and log10 Ksp at T. Every other
  ** solid has a saturation index of -inf here, so results skip it. */
  int nsol;
  const int *sol, *srow, *ssp;
  const double *snu, *slogK;
} eqpi_tableau;

/* Build the tableau of the components flagged in mask (ncomp flags over the
** database's components) at T (K). NULL with a message on failure. */
eqpi_tableau *eqpi_tableau_new(eqp_ctx *ctx, const eqpi_db *db, const unsigned char *mask,
                               double T);
void eqpi_tableau_free(eqp_ctx *ctx, eqpi_tableau *t);
/* The tableau for mask at T, shared: from the context's cache of the last
** few (same library generation, components and temperature), or new. One
** reference for the caller; give it back with eqpi_tableau_release. */
eqpi_tableau *eqpi_tableau_get(eqp_ctx *ctx, const eqpi_db *db, const unsigned char *mask,
                               double T);
void eqpi_tableau_release(eqp_ctx *ctx, eqpi_tableau *t);
/* Coefficient of local component c in species i (0 if absent). */
double eqpi_tableau_nu(const eqpi_tableau *t, int i, int c);

#endif
