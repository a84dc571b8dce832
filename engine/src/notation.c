/* Species-name notation: IUPAC charge order (number before sign, after a
** caret: "HPO4^2-", "Ca^2+"; single charges "Na+", "Cl-"), Unicode input
** ("HPO₄²⁻") folded to that ASCII form, and a hint for the sign-first
** spelling ("HPO4-2"), which is not accepted. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <ctype.h>
#include <stdio.h>
#include <string.h>

/* One Unicode character we fold: its UTF-8 bytes and what it stands for.
** kind: 'd' subscript digit, 'D' superscript digit, 's' superscript sign,
** 'm' minus sign, 'o' middle dot (kept as '.'). */
typedef struct fold { const char *utf8; char ascii; char kind; } fold;

static const fold folds[] = {
  {"\xE2\x82\x80", '0', 'd'}, {"\xE2\x82\x81", '1', 'd'}, {"\xE2\x82\x82", '2', 'd'},
  {"\xE2\x82\x83", '3', 'd'}, {"\xE2\x82\x84", '4', 'd'}, {"\xE2\x82\x85", '5', 'd'},
  {"\xE2\x82\x86", '6', 'd'}, {"\xE2\x82\x87", '7', 'd'}, {"\xE2\x82\x88", '8', 'd'},
  {"\xE2\x82\x89", '9', 'd'},
  {"\xE2\x81\xB0", '0', 'D'}, {"\xC2\xB9", '1', 'D'}, {"\xC2\xB2", '2', 'D'},
  {"\xC2\xB3", '3', 'D'}, {"\xE2\x81\xB4", '4', 'D'}, {"\xE2\x81\xB5", '5', 'D'},
  {"\xE2\x81\xB6", '6', 'D'}, {"\xE2\x81\xB7", '7', 'D'}, {"\xE2\x81\xB8", '8', 'D'},
  {"\xE2\x81\xB9", '9', 'D'},
  {"\xE2\x81\xBA", '+', 's'}, {"\xE2\x81\xBB", '-', 's'},
  {"\xE2\x88\x92", '-', 'm'},
  {"\xC2\xB7", '.', 'o'}, {"\xE2\x8B\x85", '.', 'o'},
};

static const fold *fold_at(const char *p)
{
  if (!((unsigned char)*p & 0x80)) return NULL;
  for (size_t i = 0; i < sizeof folds / sizeof folds[0]; i++) {
    size_t n = strlen(folds[i].utf8);
    if (strncmp(p, folds[i].utf8, n) == 0) return &folds[i];
  }
  return NULL;
}

static int is_sign(char c) { return c == '+' || c == '-'; }

int eqpi_name_normalize(const char *in, char *out, size_t len)
{
  size_t o = 0;
  char sup[16];
  size_t nsup = 0;
  int changed = 0;
  if (!len) return -1;
#define PUT(c) do { if (o + 1 >= len) return -1; out[o++] = (c); } while (0)
  for (const char *p = in; *p;) {
    const fold *f = fold_at(p);
    if (f && (f->kind == 'D' || f->kind == 's' || (f->kind == 'm' && nsup))) {
      if (nsup + 1 >= sizeof sup) return -1;
      sup[nsup++] = f->ascii;
      p += strlen(f->utf8);
      changed = 1;
      continue;
    }
    if (nsup) {     /* superscripts only make sense at the end */
      for (size_t k = 0; k < nsup; k++) PUT(sup[k]);
      nsup = 0;
    }
    if (f) {
      PUT(f->ascii);
      p += strlen(f->utf8);
      changed = 1;
      continue;
    }
    PUT(*p);
    p++;
  }
  if (nsup) {
    /* "²⁻" -> "^2-", "⁺" -> "+", "¹⁻" -> "-" */
    size_t nd = 0;
    while (nd < nsup && isdigit((unsigned char)sup[nd])) nd++;
    int simple = nd == nsup - 1 && is_sign(sup[nsup - 1]);
    int one = simple && (nd == 0 || (nd == 1 && sup[0] == '1'));
    if (simple && !one) PUT('^');
    for (size_t k = one ? nd : 0; k < nsup; k++) PUT(sup[k]);
  }
  out[o] = '\0';
  /* ASCII spellings of a single charge: "Na^+", "Na^1+" -> "Na+" */
  char *caret = strrchr(out, '^');
  if (caret && ((is_sign(caret[1]) && !caret[2]) ||
                (caret[1] == '1' && is_sign(caret[2]) && !caret[3]))) {
    char sign = is_sign(caret[1]) ? caret[1] : caret[2];
    caret[0] = sign;
    caret[1] = '\0';
    changed = 1;
  }
#undef PUT
  return changed;
}

int eqpi_name_old_style(const char *name, char *buf, size_t len)
{
  size_t n = strlen(name), d = n;
  while (d > 0 && isdigit((unsigned char)name[d - 1])) d--;
  if (d == n || d < 2 || !is_sign(name[d - 1])) return 0;
  char prev = name[d - 2];
  if (!(isalnum((unsigned char)prev) || prev == ')' || prev == ']')) return 0;
  int q = 0;
  for (size_t k = d; k < n && q < 1000; k++) q = q * 10 + (name[k] - '0');
  if (q < 1) return 0;
  if (q == 1)
    snprintf(buf, len, "%.*s%c", (int)(d - 1), name, name[d - 1]);
  else
    snprintf(buf, len, "%.*s^%d%c", (int)(d - 1), name, q, name[d - 1]);
  return 1;
}

const char *eqpi_name_hint(const char *name, char *buf, size_t len)
{
  char good[128];
  if (!len) return "";
  buf[0] = '\0';
  if (name && eqpi_name_old_style(name, good, sizeof good))
    snprintf(buf, len, " (did you mean '%s'? charges are written number first, then the "
             "sign, after a caret)", good);
  return buf;
}

int eqpi_name_pretty(const char *name, char *out, size_t len)
{
  static const char *const sub[10] = {"\xE2\x82\x80", "\xE2\x82\x81", "\xE2\x82\x82",
    "\xE2\x82\x83", "\xE2\x82\x84", "\xE2\x82\x85", "\xE2\x82\x86", "\xE2\x82\x87",
    "\xE2\x82\x88", "\xE2\x82\x89"};
  static const char *const sup[10] = {"\xE2\x81\xB0", "\xC2\xB9", "\xC2\xB2", "\xC2\xB3",
    "\xE2\x81\xB4", "\xE2\x81\xB5", "\xE2\x81\xB6", "\xE2\x81\xB7", "\xE2\x81\xB8",
    "\xE2\x81\xB9"};
  size_t o = 0;
  int in_sup = 0, after_dot = 0;
  if (!len) return -1;
  for (const char *p = name; *p; p++) {
    const char *piece = NULL;
    char one[2] = {*p, 0};
    if (*p == '^') { in_sup = 1; continue; }
    if (in_sup && isdigit((unsigned char)*p)) piece = sup[*p - '0'];
    else if (is_sign(*p) && (in_sup || !p[1])) piece = *p == '+' ? "\xE2\x81\xBA" : "\xE2\x81\xBB";
    else if (*p == '.' && p != name) { piece = "\xC2\xB7"; after_dot = 1; }
    else if (isdigit((unsigned char)*p) && p != name && !after_dot &&
             (isalpha((unsigned char)p[-1]) || p[-1] == ')' || p[-1] == ']' ||
              isdigit((unsigned char)p[-1])))
      piece = sub[*p - '0'];
    else {
      if (!isdigit((unsigned char)*p)) after_dot = 0;
      piece = one;
    }
    size_t n = strlen(piece);
    if (o + n + 1 > len) return -1;
    memcpy(out + o, piece, n);
    o += n;
  }
  out[o] = '\0';
  return 0;
}
