/* libFuzzer target: the species-file loader (sandbox, line map, checks).
** Each input is loaded into a fresh context: it must load or be refused
** with a message; the sandbox's instruction and memory limits bound it. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/equipoise.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  eqp_ctx *ctx = eqp_ctx_new(NULL, NULL);
  if (!ctx) return 0;
  eqp_ctx_load_species_text(ctx, (const char *)data, size, "fuzz.lua");
  eqp_ctx_free(ctx);
  return 0;
}
