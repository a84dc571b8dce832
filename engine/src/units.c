/* Quantities with units: "12.5 mmol", "1.42 g", "25 mM", "10 mL", "37 C". */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct unit_def {
  const char *sym;
  eqp_quantity kind;
  double factor;       /* to the base unit of its kind */
  double offset;       /* temperatures only */
} unit_def;

/* "u" stands for micro; "µ" (U+00B5) and "μ" (U+03BC) are mapped to it.
** The litre is written L or l, both in common use (the CGPM allowed both
** symbols in 1979); unit_sym() maps a final or lone 'l' to 'L'. */
static const unit_def units[] = {
  {"mol", EQP_Q_AMOUNT, 1.0, 0},     {"mmol", EQP_Q_AMOUNT, 1e-3, 0},
  {"umol", EQP_Q_AMOUNT, 1e-6, 0},   {"nmol", EQP_Q_AMOUNT, 1e-9, 0},
  {"kg", EQP_Q_MASS, 1.0, 0},        {"g", EQP_Q_MASS, 1e-3, 0},
  {"mg", EQP_Q_MASS, 1e-6, 0},       {"ug", EQP_Q_MASS, 1e-9, 0},
  {"M", EQP_Q_MOLARITY, 1.0, 0},     {"mM", EQP_Q_MOLARITY, 1e-3, 0},
  {"uM", EQP_Q_MOLARITY, 1e-6, 0},   {"nM", EQP_Q_MOLARITY, 1e-9, 0},
  {"mol/L", EQP_Q_MOLARITY, 1.0, 0}, {"mmol/L", EQP_Q_MOLARITY, 1e-3, 0},
  {"umol/L", EQP_Q_MOLARITY, 1e-6, 0},
  {"mol/kg", EQP_Q_MOLALITY, 1.0, 0},{"mmol/kg", EQP_Q_MOLALITY, 1e-3, 0},
  {"umol/kg", EQP_Q_MOLALITY, 1e-6, 0},
  {"L", EQP_Q_VOLUME, 1.0, 0},       {"mL", EQP_Q_VOLUME, 1e-3, 0},
  {"uL", EQP_Q_VOLUME, 1e-6, 0},
  {"K", EQP_Q_TEMPERATURE, 1.0, 0},  {"C", EQP_Q_TEMPERATURE, 1.0, 273.15},
  {"degC", EQP_Q_TEMPERATURE, 1.0, 273.15},
  {"atm", EQP_Q_PRESSURE, 1.0, 0},      {"uatm", EQP_Q_PRESSURE, 1e-6, 0},
  {"bar", EQP_Q_PRESSURE, 1 / 1.01325, 0}, {"kPa", EQP_Q_PRESSURE, 1 / 101.325, 0},
  {"Pa", EQP_Q_PRESSURE, 1 / 101325.0, 0},
};

static const char *kind_names(unsigned mask, char *buf, size_t len)
{
  static const struct { unsigned k; const char *n; } names[] = {
    {EQP_Q_AMOUNT, "an amount (mol, mmol, umol)"},
    {EQP_Q_MASS, "a mass (kg, g, mg, ug)"},
    {EQP_Q_MOLARITY, "a concentration (M, mM, uM)"},
    {EQP_Q_MOLALITY, "a molality (mol/kg, mmol/kg)"},
    {EQP_Q_VOLUME, "a volume (L, mL, uL)"},
    {EQP_Q_TEMPERATURE, "a temperature (K, C)"},
    {EQP_Q_PRESSURE, "a pressure (atm, uatm, bar, kPa, Pa)"},
  };
  size_t used = 0;
  buf[0] = '\0';
  for (size_t i = 0; i < sizeof names / sizeof names[0]; i++)
    if ((mask & names[i].k) && used < len)
      used += (size_t)snprintf(buf + used, len - used, "%s%s", used ? " or " : "", names[i].n);
  return buf;
}

/* Copy the unit, mapping the micro signs to 'u'. */
static int normalise_unit(const char *p, char *out, size_t len)
{
  size_t o = 0;
  while (*p && o + 1 < len) {
    unsigned char c = (unsigned char)*p;
    if (c == 0xC2 && (unsigned char)p[1] == 0xB5) { out[o++] = 'u'; p += 2; }
    else if (c == 0xCE && (unsigned char)p[1] == 0xBC) { out[o++] = 'u'; p += 2; }
    else if (c == 0xC2 && (unsigned char)p[1] == 0xB0) { p += 2; } /* degree sign */
    else { out[o++] = (char)c; p++; }
  }
  out[o] = '\0';
  while (o > 0 && isspace((unsigned char)out[o - 1])) out[--o] = '\0';
  /* the litre's lower-case symbol: "l", "ml", "ul", "mol/l", "mmol/l" */
  if (o > 0 && out[o - 1] == 'l' && (o == 1 || strchr("mu/", out[o - 2]))) out[o - 1] = 'L';
  return *p ? -1 : 0;
}

/* The common plain decimal ("25", "0.07", "1e-3") without strtod, which
** costs about 400 instructions: at most 2^53 as an integer m and a power
** of ten e with |e| <= 22, m and 10^|e| are exact doubles and m * 10^e
** (or m / 10^-e) is one correctly rounded operation, strtod's result to
** the bit (W. D. Clinger, PLDI 1990). NULL, for strtod to decide, when p
** is anything else. The characters read are those strtod reads. */
const char *eqpi_fast_decimal(const char *p, double *out)
{
  static const double p10[] = {1e0,  1e1,  1e2,  1e3,  1e4,  1e5,  1e6,  1e7,
                               1e8,  1e9,  1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
                               1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};
  const char *q = p;
  int neg = *q == '-';
  if (*q == '-' || *q == '+') q++;
  if (q[0] == '0' && (q[1] == 'x' || q[1] == 'X')) return NULL;     /* hex */
  uint64_t m = 0;
  int digits = 0, e = 0;
  for (; *q >= '0' && *q <= '9'; q++, digits++) {
    if (m >= 100000000000000000ull) return NULL;   /* long: strtod's */
    m = m * 10 + (uint64_t)(*q - '0');
  }
  if (*q == '.') {
    q++;
    for (; *q >= '0' && *q <= '9'; q++, digits++, e--) {
      if (m >= 100000000000000000ull) return NULL;
      m = m * 10 + (uint64_t)(*q - '0');
    }
  }
  if (digits == 0 || m > (1ull << 53)) return NULL;
  if ((*q == 'e' || *q == 'E') &&
      ((q[1] >= '0' && q[1] <= '9') ||
       ((q[1] == '+' || q[1] == '-') && q[2] >= '0' && q[2] <= '9'))) {
    const char *r = q + 1;
    int eneg = *r == '-', x = 0;
    if (*r == '+' || *r == '-') r++;
    for (; *r >= '0' && *r <= '9'; r++)
      if ((x = x * 10 + (*r - '0')) > 1000) return NULL;
    e += eneg ? -x : x;
    q = r;
  }
  if (e < -22 || e > 22) return NULL;
  double v = (double)m;                      /* exact: m <= 2^53 */
  v = e < 0 ? v / p10[-e] : v * p10[e];
  *out = neg ? -v : v;
  return q;
}

int eqpi_parse_quantity(const char *text, unsigned allowed, double *value,
                        eqp_quantity *kind, char *err, size_t errlen)
{
  char want[200], unit[32];
  const char *p = text;
  while (isspace((unsigned char)*p)) p++;
  double v;
  const char *end = eqpi_fast_decimal(p, &v);
  int range = 0;
  if (!end) {
    errno = 0;
    char *e;
    v = strtod(p, &e);
    end = e;
    range = errno == ERANGE;
  }
  if (end == p || (!range && !isfinite(v)) || (end > p && (end[-1] == '.' && end - p == 1))) {
    snprintf(err, errlen, "'%s' is not a number with a unit (expected %s)", text,
             kind_names(allowed, want, sizeof want));
    return -1;
  }
  /* strtod takes "inf", "nan" and hex; a quantity is a plain decimal. */
  for (const char *q = p; q < end; q++)
    if (!(isdigit((unsigned char)*q) || strchr("+-.eE", *q))) {
      snprintf(err, errlen, "'%s' is not a plain decimal number", text);
      return -1;
    }
  /* too large or too small for a double: the number is fine, its size is not */
  if (range) {
    snprintf(err, errlen, "'%s' is out of range (%s)", text,
             fabs(v) > 1 ? "too large" : "too small to tell from zero");
    return -1;
  }
  while (isspace((unsigned char)*end)) end++;
  if (!*end) {
    snprintf(err, errlen, "'%s' has no unit (expected %s)", text,
             kind_names(allowed, want, sizeof want));
    return -1;
  }
  if (normalise_unit(end, unit, sizeof unit) < 0) {
    snprintf(err, errlen, "unknown unit in '%s'", text);
    return -1;
  }
  const unit_def *u = NULL;
  for (size_t i = 0; i < sizeof units / sizeof units[0] && !u; i++)   /* symbols are unique */
    if (units[i].sym[0] == unit[0] && strcmp(units[i].sym, unit) == 0) u = &units[i];
  if (!u) {
    snprintf(err, errlen, "unknown unit '%s' in '%s' (expected %s)", unit, text,
             kind_names(allowed, want, sizeof want));
    return -1;
  }
  if (!(allowed & u->kind)) {
    char got[64];
    snprintf(err, errlen, "'%s' is %s, expected %s", text,
             kind_names(u->kind, got, sizeof got), kind_names(allowed, want, sizeof want));
    return -1;
  }
  double base = v * u->factor + u->offset;
  if (u->kind == EQP_Q_TEMPERATURE ? !(base > 0) : v < 0) {
    snprintf(err, errlen, "'%s' is negative%s", text,
             u->kind == EQP_Q_TEMPERATURE ? " on the kelvin scale" : "");
    return -1;
  }
  *value = base;
  if (kind) *kind = u->kind;
  return 0;
}

int eqp_parse_quantity(eqp_ctx *ctx, const char *text, unsigned allowed,
                       double *value, eqp_quantity *kind)
{
  if (!ctx || !text || !value) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  char err[EQPI_ERRLEN];
  if (eqpi_parse_quantity(text, allowed, value, kind, err, sizeof err) < 0)
    return eqpi_fail(ctx, EQP_E_INPUT, "%s", err);
  return EQP_OK;
}
