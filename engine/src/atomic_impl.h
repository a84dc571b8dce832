/* Output files written whole or not at all. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_ATOMIC_IMPL_H
#define EQP_ATOMIC_IMPL_H

#include "eqp_impl.h"
#include <stdio.h>

/* Fills f with the file's content; returns EQP_OK or a negative status
** (with a message in the context). */
typedef int (*eqpi_fill_fn)(void *ud, FILE *f);

/*
** Write the file path atomically: fill() writes a temporary file in the same
** folder (so the rename cannot cross file systems), which is flushed, synced
** and renamed over path. On any failure (fill's status, a full disk, a file
** size limit) the temporary file is removed and path is left as it was. An
** existing path keeps its permissions; a new one gets 0666 less the umask.
** Only regular files are replaced. Returns EQP_OK, fill's status, or
** EQP_E_WRITE with "cannot write 'path': reason" in the context.
*/
int eqpi_write_atomic(eqp_ctx *ctx, const char *path, eqpi_fill_fn fill, void *ud);
/* The same for len bytes of data already in memory (figures, reports). */
int eqpi_write_file_atomic(eqp_ctx *ctx, const char *path, const char *data, size_t len);

#endif
