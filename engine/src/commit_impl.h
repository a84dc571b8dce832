/* The state of one commit, shared by commit.c and commit_extras.c. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_COMMIT_IMPL_H
#define EQP_COMMIT_IMPL_H

#include "stage_impl.h"
#include "snapshot_impl.h"

/* A sparse sum over n slots: v holds the values, idx the slots touched
** since the last reset, so that building each species' resolved terms
** costs the size of its terms, not the number of components. */
typedef struct eqpi_sparse {
  double *v;
  int *idx;
  unsigned char *on;
  int n, nidx;
} eqpi_sparse;

typedef struct committer {
  eqp_ctx *ctx;
  const eqpi_db *db;  /* the library the load goes onto */
  eqpi_db *out;       /* the library being made: base's entries, then these */
  eqpi_stage *st;
  /* the arrays of out, with room for everything the stage can add (counts
  ** start at base's) */
  eqpi_species *sp;
  int nsp;
  eqpi_reaction *rx;
  int nrx;
  eqpi_reagent *rg;
  int nrg;
  int ncomp;
  int *comp_species;
  signed char *state; /* per species: 0 todo, 1 resolving, 2 done */
  eqpi_pairparam *pairs;
  int npairs;
  eqpi_buffer *buf;
  int nbuf;
  eqpi_gas *gas;
  int ngas;
  eqpi_solid *sol;
  int nsol;
  eqpi_index spnew;   /* names of the species of this load */
  eqpi_index rgnew;   /* names and aliases of the reagents of this load */
  eqpi_sparse comp, rxn; /* scratch sums over components and reactions */
} committer;

/* A species or reagent by name in the database or in this commit; -1 if none. */
int eqpi_commit_find_species(const committer *c, const char *name);
int eqpi_commit_find_reagent(const committer *c, const char *name);
/* The entries beyond species, reactions and reagents (commit_extras.c). */
void eqpi_commit_interactions(committer *c);
void eqpi_commit_buffers(committer *c);
void eqpi_commit_gases(committer *c);
void eqpi_commit_solids(committer *c);

#endif
