/* Option structs that begin with their size: read as much of the caller's
** struct as it has, keep the defaults for the rest, refuse what cannot be
** read. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <string.h>

int eqpi_opts_read(eqp_ctx *ctx, const char *type, const void *user, void *local,
                   size_t local_size, size_t first_size)
{
  size_t size;
  memcpy(&size, user, sizeof size);
  if (size == 0)
    return eqpi_fail(ctx, EQP_E_ARG, "%s: size 0: start from its INIT macro (a struct set to "
                     "{0} would ask for zeros the library cannot tell from choices)", type);
  if (size < first_size)
    return eqpi_fail(ctx, EQP_E_ARG, "%s: size %zu, smaller than the first published (%zu)",
                     type, size, first_size);
  if (size > local_size)
    return eqpi_fail(ctx, EQP_E_ARG, "%s: size %zu, larger than this library's (%zu): the "
                     "program was built with newer headers than the library it runs with (%s)",
                     type, size, local_size, eqp_version());
  memcpy(local, user, size);
  memcpy(local, &local_size, sizeof local_size);
  return EQP_OK;
}
