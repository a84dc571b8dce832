/* Line numbers of the fields of a species file's returned table.
**
** The Lua runtime does not keep the line where a table field was written, so
** the loader would otherwise only know "somewhere in the file". This scans
** the source once with a small tokenizer that knows Lua's comments, strings
** and brackets, follows the table constructor after the top-level 'return',
** and records the line of every field under its path ("species.3.size").
** Files that build their table with code get the line of 'return' instead. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <ctype.h>
#include <stdio.h>
#include <string.h>

typedef struct lm_entry {
  char *path;
  int line;
} lm_entry;

struct eqpi_linemap {
  lm_entry *e;
  int n, cap;
  int return_line;
  eqpi_index ix;       /* path -> line, so that a look-up costs the same in any file */
};

typedef enum { T_EOF, T_NAME, T_STRING, T_NUMBER, T_PUNCT } tok_kind;

typedef struct lexer {
  const char *p, *end;
  int line;
  tok_kind kind;
  const char *ts;      /* token text (for strings: the contents) */
  size_t tlen;
  int tline;
  char punct;
} lexer;

/* Length of a long bracket opener "[==[" at p, or 0. */
static int long_open(const char *p, const char *end)
{
  if (p >= end || *p != '[') return 0;
  const char *q = p + 1;
  while (q < end && *q == '=') q++;
  return q < end && *q == '[' ? (int)(q - p + 1) : 0;
}

static void skip_long(lexer *lx, int level)
{
  while (lx->p < lx->end) {
    if (*lx->p == '\n') lx->line++;
    if (*lx->p == ']') {
      const char *q = lx->p + 1;
      int eq = 0;
      while (q < lx->end && *q == '=') { q++; eq++; }
      if (eq == level && q < lx->end && *q == ']') {
        lx->p = q + 1;
        return;
      }
    }
    lx->p++;
  }
}

static void next_token(lexer *lx)
{
  for (;;) {
    while (lx->p < lx->end && isspace((unsigned char)*lx->p)) {
      if (*lx->p == '\n') lx->line++;
      lx->p++;
    }
    if (lx->p + 1 < lx->end && lx->p[0] == '-' && lx->p[1] == '-') {
      lx->p += 2;
      int lo = long_open(lx->p, lx->end);
      if (lo) {
        lx->p += lo;
        skip_long(lx, lo - 2);
      } else {
        while (lx->p < lx->end && *lx->p != '\n') lx->p++;
      }
      continue;
    }
    break;
  }
  lx->tline = lx->line;
  if (lx->p >= lx->end) { lx->kind = T_EOF; return; }
  char c = *lx->p;
  int lo = long_open(lx->p, lx->end);
  if (lo) {
    lx->p += lo;
    lx->ts = lx->p;
    skip_long(lx, lo - 2);
    lx->tlen = (size_t)(lx->p - lx->ts) - (size_t)lo;
    lx->kind = T_STRING;
    return;
  }
  if (c == '"' || c == '\'') {
    lx->ts = ++lx->p;
    while (lx->p < lx->end && *lx->p != c && *lx->p != '\n') {
      if (*lx->p == '\\' && lx->p + 1 < lx->end) lx->p++;
      lx->p++;
    }
    lx->tlen = (size_t)(lx->p - lx->ts);
    if (lx->p < lx->end && *lx->p == c) lx->p++;
    lx->kind = T_STRING;
    return;
  }
  lx->ts = lx->p;
  if (isalpha((unsigned char)c) || c == '_') {
    while (lx->p < lx->end && (isalnum((unsigned char)*lx->p) || *lx->p == '_')) lx->p++;
    lx->kind = T_NAME;
  } else if (isdigit((unsigned char)c) || (c == '.' && lx->p + 1 < lx->end &&
                                            isdigit((unsigned char)lx->p[1]))) {
    while (lx->p < lx->end && (isalnum((unsigned char)*lx->p) || *lx->p == '.' ||
           ((*lx->p == '-' || *lx->p == '+') && (lx->p[-1] == 'e' || lx->p[-1] == 'E'))))
      lx->p++;
    lx->kind = T_NUMBER;
  } else {
    lx->p++;
    lx->kind = T_PUNCT;
    lx->punct = c;
  }
  lx->tlen = (size_t)(lx->p - lx->ts);
}

static int is_punct(const lexer *lx, char c) { return lx->kind == T_PUNCT && lx->punct == c; }

static int lm_add(eqp_ctx *ctx, eqpi_linemap *lm, const char *path, int line)
{
  if (lm->n == lm->cap) {
    int cap = lm->cap ? lm->cap * 2 : 64;
    lm_entry *e = eqpi_realloc(ctx, lm->e, sizeof *e * (size_t)lm->cap, sizeof *e * (size_t)cap);
    if (!e) return -1;
    lm->e = e;
    lm->cap = cap;
  }
  lm->e[lm->n].path = eqpi_strdup(ctx, path);
  if (!lm->e[lm->n].path) return -1;
  lm->e[lm->n++].line = line;
  return eqpi_index_put(ctx, &lm->ix, lm->e[lm->n - 1].path, line, NULL) < 0 ? -1 : 0;
}

/* Skip an expression up to ',' ';' or the closing '}' at depth 0. */
static void skip_expr(lexer *lx)
{
  int depth = 0;
  while (lx->kind != T_EOF) {
    if (lx->kind == T_PUNCT) {
      char c = lx->punct;
      if (depth == 0 && (c == ',' || c == ';' || c == '}')) return;
      if (c == '(' || c == '[' || c == '{') depth++;
      if (c == ')' || c == ']' || c == '}') depth--;
    }
    next_token(lx);
  }
}

#define LM_PATH 512

/* At '{': record every field of this constructor under prefix. */
static int lm_table(eqp_ctx *ctx, eqpi_linemap *lm, lexer *lx, char *prefix, int depth)
{
  size_t plen = strlen(prefix);
  int idx = 1;
  next_token(lx);
  while (lx->kind != T_EOF && !is_punct(lx, '}')) {
    char key[128];
    int line = lx->tline;
    if (lx->kind == T_NAME) {
      lexer save = *lx;
      next_token(lx);
      if (is_punct(lx, '=') && !(lx->p < lx->end && *lx->p == '=')) {
        snprintf(key, sizeof key, "%.*s", (int)save.tlen, save.ts);
        next_token(lx);
      } else {
        *lx = save;
        snprintf(key, sizeof key, "%d", idx++);
      }
    } else if (is_punct(lx, '[') && !long_open(lx->ts, lx->end)) {
      next_token(lx);
      if (lx->kind == T_STRING) snprintf(key, sizeof key, "%.*s", (int)lx->tlen, lx->ts);
      else if (lx->kind == T_NUMBER) snprintf(key, sizeof key, "%.*s", (int)lx->tlen, lx->ts);
      else key[0] = '\0';
      while (lx->kind != T_EOF && !is_punct(lx, ']')) next_token(lx);
      next_token(lx);
      if (is_punct(lx, '=')) next_token(lx);
    } else {
      snprintf(key, sizeof key, "%d", idx++);
    }
    if (plen + strlen(key) + 2 < LM_PATH && key[0]) {
      snprintf(prefix + plen, LM_PATH - plen, "%s%s", plen ? "." : "", key);
      if (lm_add(ctx, lm, prefix, line) < 0) return -1;
      if (is_punct(lx, '{') && depth < 32) {
        if (lm_table(ctx, lm, lx, prefix, depth + 1) < 0) return -1;
        next_token(lx);
      } else {
        skip_expr(lx);
      }
      prefix[plen] = '\0';
    } else {
      skip_expr(lx);
    }
    if (is_punct(lx, ',') || is_punct(lx, ';')) next_token(lx);
  }
  return 0;
}

eqpi_linemap *eqpi_linemap_build(eqp_ctx *ctx, const char *text, size_t len)
{
  eqpi_linemap *lm = eqpi_calloc(ctx, 1, sizeof *lm);
  if (!lm) return NULL;
  lexer lx = {text, text + len, 1, T_EOF, NULL, 0, 1, 0};
  int depth = 0;
  next_token(&lx);
  while (lx.kind != T_EOF) {
    if (lx.kind == T_PUNCT && strchr("({[", lx.punct)) depth++;
    if (lx.kind == T_PUNCT && strchr(")}]", lx.punct)) depth--;
    if (lx.kind == T_NAME && lx.tlen == 6 && memcmp(lx.ts, "return", 6) == 0 && depth == 0) {
      lm->return_line = lx.tline;
      next_token(&lx);
      if (is_punct(&lx, '{')) {
        char prefix[LM_PATH] = "";
        if (lm_table(ctx, lm, &lx, prefix, 0) < 0) {
          eqpi_linemap_free(ctx, lm);
          return NULL;
        }
      }
      break;
    }
    next_token(&lx);
  }
  return lm;
}

void eqpi_linemap_free(eqp_ctx *ctx, eqpi_linemap *lm)
{
  if (!lm) return;
  for (int i = 0; i < lm->n; i++) eqpi_strfree(ctx, lm->e[i].path);
  eqpi_free(ctx, lm->e, sizeof *lm->e * (size_t)lm->cap);
  eqpi_index_free(ctx, &lm->ix);
  eqpi_free(ctx, lm, sizeof *lm);
}

int eqpi_linemap_line(const eqpi_linemap *lm, const char *const *path, int depth)
{
  if (!lm) return 0;
  /* the path at each depth is a prefix of the deepest one */
  char buf[LM_PATH];
  size_t end[33], used = 0;
  if (depth > 32) depth = 32;
  for (int i = 0; i < depth; i++) {
    size_t l = strlen(path[i]);
    if (used + l + 2 > sizeof buf) { depth = i; break; }
    if (i) buf[used++] = '.';
    memcpy(buf + used, path[i], l);
    used += l;
    end[i + 1] = used;
  }
  for (int d = depth; d > 0; d--) {
    buf[end[d]] = '\0';
    int line = eqpi_index_get(&lm->ix, buf);
    if (line >= 0) return line;
  }
  return lm->return_line;
}
