/* Making a library: the draft a commit (commit.c) or a restriction
** (subset.c) fills before it becomes visible (snapshot.c). */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_SNAPSHOT_IMPL_H
#define EQP_SNAPSHOT_IMPL_H

#include "eqp_impl.h"

/* How many entries of each kind a draft may add. */
typedef struct eqpi_room {
  int sp, rx, rg, comp, pairs, buffers, gases, solids, files, loaded;
} eqpi_room;

/* A library being made from base (NULL: from nothing): its arrays hold
** base's entries (when fresh, none) and room for more, its counts are
** base's (or 0). It shares base's store when base is the newest library of
** that store and there is room, so that a chain of loads copies nothing;
** else the store is new (a copy of base's entries: structs only, their
** strings stay where they are). The caller appends entries at the counts
** and then calls eqpi_db_finish, or eqpi_db_release to drop it. NULL when
** out of memory. */
eqpi_db *eqpi_db_begin(eqp_ctx *ctx, const eqpi_db *base, const eqpi_room *room, int fresh);
/* Make the draft a library: index the names of its new species and
** reagents. 0, or -1 when out of memory (the draft is then still a draft,
** for eqpi_db_release). */
int eqpi_db_finish(eqpi_db *db);
/* The entry a name stands for in the index of db's store (db.c folds
** spellings first); -1 if none that db sees. */
int eqpi_db_index_species(const eqpi_db *db, const char *name);
int eqpi_db_index_reagent(const eqpi_db *db, const char *name);

#endif
