/* Descriptions of library entries: built once as a JSON tree, rendered as
** JSON for programs or as text for a reader. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_DESCRIBE_IMPL_H
#define EQP_DESCRIBE_IMPL_H

#include "eqp_impl.h"
#include <cjson/cJSON.h>

/* A growable text in memory from cJSON's allocator, so that the result is
** freed with eqp_free_string like every other string the API returns. */
typedef struct eqpi_text {
  char *p;
  size_t n, cap;
  int oom;
} eqpi_text;

void eqpi_text_printf(eqpi_text *t, const char *fmt, ...) EQPI_PRINTF(2, 3);

/* Render the tree of eqp_ctx_describe or eqp_ctx_list as text. */
void eqpi_describe_text(eqpi_text *t, const cJSON *doc);
void eqpi_list_text(eqpi_text *t, const cJSON *doc);

#endif
