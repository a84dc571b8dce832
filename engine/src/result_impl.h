/* Results: immutable snapshots of a solved system. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_RESULT_IMPL_H
#define EQP_RESULT_IMPL_H

#include "eqp_impl.h"

/* A result of the solved system sys, made with library db (which it holds);
** with_phases: with room for the solids present and a headspace (the
** solve allowed solids or the vessel is sealed). */
int eqpi_result_make(eqp_ctx *ctx, const eqpi_db *db, const eqpi_system *sys,
                     const eqpi_model *model, double T, double water_kg,
                     const eqpi_solve_stats *st, int with_phases, eqp_result **out);

const eqpi_db *eqpi_result_library(const eqp_result *r);

/* A result moved into memory its holder owns (eqpi_result_bytes of it,
** aligned for a double), as a Lua host does with its userdata so that a
** result is plain memory for the collector: r's block goes back to the
** context and r's reference to its library is given back, so the holder
** must keep that library (eqpi_result_library of r) alive while the copy
** lives, and the context too. eqp_result_free of the copy does nothing. */
size_t eqpi_result_bytes(const eqp_result *r);
eqp_result *eqpi_result_place(eqp_result *r, void *mem);

/* The context a result belongs to. */
eqp_ctx *eqpi_result_ctx(const eqp_result *r);

/* Give result r the amounts of the solids present (mol/kg of water_kg,
** over the library's n solids). */
int eqpi_result_set_solids(eqp_result *r, const double *amounts, int n, double water_kg);

/* Give result r a headspace: volume (L), water vapour (atm) and, over the
** library's n gases, those on with their pressure (atm) and mol; warns of
** a total pressure above 2 atm, and passes note (if not NULL) on as a
** temperature warning. */
int eqpi_result_set_gases(eqp_result *r, double litres, double p_water, int n,
                          const unsigned char *on, const double *p, const double *mol,
                          const char *note);

#endif
