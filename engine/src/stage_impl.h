/* The staging area filled by the species loader and checked on commit. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_STAGE_IMPL_H
#define EQP_STAGE_IMPL_H

#include "eqp_impl.h"

struct lua_State;

typedef struct st_pair {
  const char *name;
  double nu;
} st_pair;

typedef struct st_species {
  const char *name, *formula, *size_source, *file;
  double size;
  st_pair *params;        /* activity-model parameters, name -> value */
  int nparams;
  const char *params_source;
  int line;
} st_species;

typedef struct st_inter {
  const char *a, *b, *source, *file;
  st_pair *params;        /* e.g. sit = 0.03 */
  int n, line;
} st_inter;

/* A constant with its temperature data and its source, as staged. */
typedef struct st_const {
  double logK, dH, dCp;   /* dH kJ/mol, dCp J/(K mol); NaN if absent */
  int tmodel;             /* EQPI_T_* */
  double fn[6], Tmin, Tmax;
  const char *source;
  eqpi_measured measured;
} st_const;

typedef struct st_reaction {
  const char *product, *file;
  st_pair *r;
  int n;
  st_const k;             /* formation reaction of product */
  int line;
} st_reaction;

typedef struct st_reagent {
  const char *name, *formula, *file;
  const char **aliases;
  int naliases;
  st_pair *gives;
  int n;                  /* 0: the reagent is the species of the same name */
  double hydrate, density;
  const char **hazards;
  int nhazards;
  int line;
} st_reagent;

typedef struct st_buffer {
  const char *name, *acid, *base, *free, *titrant, *file;
  const char **notes;
  int nnotes, line;
} st_buffer;

typedef struct st_gas {
  const char *name, *dissolves, *file;
  st_const k;             /* log10 K_H */
  int line;
} st_gas;

typedef struct st_solid {
  const char *name, *formula, *file;
  st_pair *dissolves;
  int n, line;
  st_const k;             /* log10 Ksp */
} st_solid;

struct eqpi_stage {
  eqpi_arena *arena;
  st_species *sp;
  int nsp, capsp;
  st_reaction *rx;
  int nrx, caprx;
  st_reagent *rg;
  int nrg, caprg;
  st_inter *in;
  int nin, capin;
  st_buffer *bf;
  int nbf, capbf;
  st_gas *gs;
  int ngs, capgs;
  st_solid *so;
  int nso, capso;
  const char **files;
  int nfiles, capfiles;
  char err[EQPI_ERRLEN];
  size_t errused;
  int nerr;
  /* the files errors were found in, so that a library load can leave out
  ** just those (library.c); errors without a file (out of memory) counted */
  const char *errfile[32];
  int nerrfile, errnofile, errfile_full;
};

/* The staging area is made, filled and freed here (stage.c) and by the
** loader it calls (loader.c, sandbox.c); library.c holds stages between the
** rounds of a library load, through these calls only. */
eqpi_stage *eqpi_stage_new(eqp_ctx *ctx);
void eqpi_stage_free(eqp_ctx *ctx, eqpi_stage *st);
/* Append a "file:line: message" to the stage's error list. */
void eqpi_stage_error(eqpi_stage *st, const char *file, int line, const char *fmt, ...)
  EQPI_PRINTF(4, 5);
/* Append the entries of src to dst (shallow: strings stay in src's arena,
** which must outlive dst). -1 when out of memory. */
int eqpi_stage_append(eqp_ctx *ctx, eqpi_stage *dst, const eqpi_stage *src);
/* A 64-bit fingerprint of everything staged (not of where it was written). */
unsigned long long eqpi_stage_fingerprint(const eqpi_stage *st);
/* Grow one of the stage's arrays by one element; returns it zeroed. */
void *eqpi_stage_push(eqp_ctx *ctx, eqpi_stage *st, void **arr, int *n, int *cap, size_t elem);
/* Move the strings of src's entries into *arena (src's entries, and every
** stage they were appended to, keep pointing at them). */
void eqpi_stage_give_strings(eqpi_stage *src, eqpi_arena **arena);

/* A source read for a load: its key (real path, or source name) and a hash
** of its content. */
typedef struct eqpi_source_id {
  char key[4096];
  unsigned long long hash;
} eqpi_source_id;

/* Read the file at path and stage it, unless base has exactly this file
** loaded already (then *skipped is set). id receives its key and hash.
** Status of reading it; the problems of its content are in st. */
int eqpi_stage_file(eqp_ctx *ctx, eqpi_stage *st, const eqpi_db *base, const char *path,
                    eqpi_source_id *id, int *skipped);

/* Commit st onto base (commit.c): on success *out is a new library of
** base's entries and st's, with the nrec sources rec recorded as loaded,
** and st's strings belong to it. On failure every problem is in the
** context's message and nothing is kept. */
int eqpi_stage_commit(eqp_ctx *ctx, const eqpi_db *base, eqpi_stage *st, const eqpi_loaded *rec,
                      int nrec, eqpi_db **out);

/* Copy a staged constant into d with its file and line, and check that a
** temperature function reproduces the 25 C value it stands beside (which
** catches a sign or a pK/log K mix-up). 0, or -1 after recording an error
** that names what. */
int eqpi_commit_constant(eqpi_stage *st, const st_const *k, const char *file, int line,
                         const char *what, eqpi_reaction *d);

/* Where a species file's tables and fields were written, as Lua itself
** recorded it while the file ran (sandbox.c): the line of each table, and
** of each named field set on another line than its table's first field. */
typedef struct eqpi_lines eqpi_lines;
/* The line of the value at path (keys; digits stand for positions) under
** the table at index root of L: the deepest part of the path written on a
** line of its own; for none, the line of the file's returned table. 0 when
** lines is NULL. Reads the tables raw. */
int eqpi_lines_at(const eqpi_lines *ln, struct lua_State *L, int root, const char *const *path,
                  int depth);

/* The line of path in text run as a species file, as eqpi_lines_at gives
** it (for the tests); -1 when the text does not run. */
int eqpi_lines_of_text(eqp_ctx *ctx, const char *text, size_t len, const char *const *path,
                       int depth);
/* Run species text in the sandbox and stage the table it returns
** (sandbox.c). EQP_OK, EQP_E_DATA (the problems are in st), EQP_E_NOMEM. */
int eqpi_stage_text(eqp_ctx *ctx, eqpi_stage *st, const char *text, size_t len,
                    const char *source);
/* Convert the species table at idx of L into stage entries (loader.c).
** lines may be NULL (inline tables), then every message carries file as
** given. */
int eqpi_stage_from_table(eqp_ctx *ctx, eqpi_stage *st, struct lua_State *L, int idx,
                          const eqpi_lines *lines, const char *file);

#endif
