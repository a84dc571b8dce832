/* Chemical formulas: parsing, element balance and molar mass. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct fparser {
  const char *s, *p;
  char *err;
  size_t errlen;
} fparser;

static int fp_fail(fparser *fp, const char *what)
{
  snprintf(fp->err, fp->errlen, "bad formula '%s': %s at position %d", fp->s, what,
           (int)(fp->p - fp->s) + 1);
  return -1;
}

int eqpi_comp_add(eqpi_comp *a, const eqpi_comp *b, double k)
{
  for (int i = 0; i < b->n; i++) {
    int j = 0;
    while (j < a->n && a->el[j] != b->el[i]) j++;
    if (j == a->n) {
      if (a->n == EQPI_MAX_ELEM) return -1;
      a->el[j] = b->el[i];
      a->cnt[j] = 0;
      a->n++;
    }
    a->cnt[j] += k * b->cnt[i];
  }
  a->charge += k * b->charge;
  return 0;
}

/* Element counts are whole numbers ("PO4.2H2O" is PO4 then 2 H2O); adduct
** counts may be decimal ("CaSO4.0.5H2O"). */
static double fp_number(fparser *fp, double dflt)
{
  if (!isdigit((unsigned char)*fp->p)) return dflt;
  double v = 0;
  while (isdigit((unsigned char)*fp->p)) v = v * 10 + (*fp->p++ - '0');
  return v > 1e6 ? INFINITY : v;   /* no real formula has such counts */
}

static double fp_decimal(fparser *fp, double dflt)
{
  if (!isdigit((unsigned char)*fp->p)) return dflt;
  char *end;
  double v = strtod(fp->p, &end);
  fp->p = end;
  return v;
}

static int fp_group(fparser *fp, eqpi_comp *out, int depth);

/* One run of elements and bracketed groups with their counts. */
static int fp_sequence(fparser *fp, eqpi_comp *out, int depth)
{
  int any = 0;
  for (;;) {
    eqpi_comp g = {0};
    const char *c = fp->p;
    if (*c == '(' || *c == '[') {
      char close = *c == '(' ? ')' : ']';
      fp->p++;
      if (depth > 8) return fp_fail(fp, "brackets nested too deep");
      if (fp_group(fp, &g, depth + 1) < 0) return -1;
      if (*fp->p != close) return fp_fail(fp, "unclosed bracket");
      fp->p++;
    } else if (isupper((unsigned char)*c)) {
      size_t len = islower((unsigned char)c[1]) ? 2 : 1;
      int z = eqpi_element_lookup(c, len);
      if (!z) return fp_fail(fp, "unknown element");
      fp->p += len;
      g.n = 1;
      g.el[0] = (unsigned char)z;
      g.cnt[0] = 1;
    } else {
      break;
    }
    double k = fp_number(fp, 1.0);
    if (!(k > 0)) return fp_fail(fp, "count must be positive");
    if (!isfinite(k)) return fp_fail(fp, "count too large");
    if (eqpi_comp_add(out, &g, k) < 0) return fp_fail(fp, "too many elements");
    any = 1;
  }
  return any ? 0 : fp_fail(fp, "expected an element");
}

static int fp_group(fparser *fp, eqpi_comp *out, int depth)
{
  return fp_sequence(fp, out, depth);
}

static int is_dot(const char *p, size_t *len)
{
  if (*p == '.' || *p == '*') { *len = 1; return 1; }
  if ((unsigned char)p[0] == 0xC2 && (unsigned char)p[1] == 0xB7) { *len = 2; return 1; }
  return 0;
}

int eqpi_formula_parse(const char *f, eqpi_comp *out, double *hydrate,
                       char *err, size_t errlen)
{
  char folded[256];     /* "Na₂HPO₄·7H₂O" reads as "Na2HPO4.7H2O" */
  for (const unsigned char *q = (const unsigned char *)f; *q; q++)
    if (*q >= 0x80) {
      if (eqpi_name_normalize(f, folded, sizeof folded) == 1) f = folded;
      break;
    }
  fparser fp = {f, f, err, errlen};
  memset(out, 0, sizeof *out);
  if (hydrate) *hydrate = 0;
  if (fp_sequence(&fp, out, 0) < 0) return -1;
  size_t dl;
  while (is_dot(fp.p, &dl)) {
    fp.p += dl;
    double k = fp_decimal(&fp, 1.0);
    if (!(k > 0)) return fp_fail(&fp, "adduct count must be positive");
    if (!(k <= 1e6)) return fp_fail(&fp, "adduct count too large");
    eqpi_comp a = {0};
    const char *start = fp.p;
    if (fp_sequence(&fp, &a, 0) < 0) return -1;
    if (hydrate && fp.p - start == 3 && memcmp(start, "H2O", 3) == 0) *hydrate += k;
    if (eqpi_comp_add(out, &a, k) < 0) return fp_fail(&fp, "too many elements");
  }
  /* IUPAC order: "Na+", "Cl-", "HPO4^2-", "Fe^3+" */
  if (*fp.p == '^') {
    fp.p++;
    double q = fp_number(&fp, 0.0);
    if (!(q >= 2) || !isfinite(q)) return fp_fail(&fp, "a charge after '^' is a number of 2 or more, then "
                                  "'+' or '-' (a single charge is written 'Na+', 'Cl-')");
    if (*fp.p != '+' && *fp.p != '-') return fp_fail(&fp, "charge needs its sign after the number");
    out->charge = (*fp.p == '+' ? 1.0 : -1.0) * q;
    fp.p++;
  } else if (*fp.p == '+' || *fp.p == '-') {
    char good[128];
    if (isdigit((unsigned char)fp.p[1]) && eqpi_name_old_style(f, good, sizeof good)) {
      snprintf(err, errlen, "bad formula '%s': charge written sign first; write '%s' "
               "(number first, then the sign, after a caret)", f, good);
      return -1;
    }
    out->charge = *fp.p == '+' ? 1.0 : -1.0;
    fp.p++;
  }
  if (*fp.p) return fp_fail(&fp, "unexpected character");
  return 0;
}

double eqpi_comp_mass(const eqpi_comp *c)
{
  double m = 0;
  for (int i = 0; i < c->n; i++) m += c->cnt[i] * eqpi_atomic_weight(c->el[i]);
  return m;
}

int eqpi_comp_diff(const eqpi_comp *a, const eqpi_comp *b, char *buf, size_t len)
{
  eqpi_comp d = *a;
  size_t used = 0;
  int differ = 0;
  if (eqpi_comp_add(&d, b, -1.0) < 0) {
    snprintf(buf, len, "too many elements");
    return 1;
  }
  if (len) buf[0] = '\0';
  for (int i = 0; i < d.n; i++) {
    if (fabs(d.cnt[i]) > 1e-9) {
      differ = 1;
      if (used < len)
        used += (size_t)snprintf(buf + used, len - used, "%s%s %+g", used ? ", " : "",
                                 eqpi_element_symbol(d.el[i]), d.cnt[i]);
    }
  }
  if (fabs(d.charge) > 1e-9) {
    differ = 1;
    if (used < len)
      snprintf(buf + used, len - used, "%scharge %+g", used ? ", " : "", d.charge);
  }
  return differ;
}

int eqp_formula_molar_mass(eqp_ctx *ctx, const char *formula, double *gmol)
{
  if (!ctx || !formula || !gmol) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  eqpi_comp c;
  char err[256];
  if (eqpi_formula_parse(formula, &c, NULL, err, sizeof err) < 0)
    return eqpi_fail(ctx, EQP_E_INPUT, "%s", err);
  for (int i = 0; i < c.n; i++)
    if (eqpi_atomic_weight(c.el[i]) == 0)
      return eqpi_fail(ctx, EQP_E_INPUT, "formula '%s': element %s has no standard atomic weight",
                       formula, eqpi_element_symbol(c.el[i]));
  *gmol = eqpi_comp_mass(&c);
  return EQP_OK;
}
