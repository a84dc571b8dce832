/* libFuzzer target: formulas and quantities with units. Any input must
** give a value or an error message, never a crash or undefined behaviour. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/equipoise.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  static eqp_ctx *ctx;
  if (!ctx) ctx = eqp_ctx_new(NULL, NULL);
  char *text = malloc(size + 1);
  if (!text) return 0;
  memcpy(text, data, size);
  text[size] = '\0';
  double v;
  eqp_quantity k;
  eqp_formula_molar_mass(ctx, text, &v);
  eqp_parse_quantity(ctx, text, 0xff, &v, &k);
  free(text);
  return 0;
}
