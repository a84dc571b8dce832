/* What the run makes, as the engine tells of it: an observer registered on
** the script's context hears of every result, curve, reagent, warning and
** caution when it is made. Each is placed at the script's line that made
** it; a warning is shown at once (stderr, or a --jsonl record), each kind
** once per line; the rest is kept only as far as the chosen output needs
** it: the --json document, the provenance, the --report page. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <math.h>
#include <cjson/cJSON.h>
#include <ctype.h>
#include <stdlib.h>
#include <string.h>

/* ------------------------------------------------------ string sets */

static size_t hash(const char *s)
{
  size_t h = 1469598103934665603u;   /* FNV-1a */
  for (; *s; s++) h = (h ^ (unsigned char)*s) * 1099511628211u;
  return h;
}

static int grow(cli_strings *set)
{
  size_t n = set->nslot ? set->nslot * 2 : 64;
  char **slot = calloc(n, sizeof *slot);
  if (!slot) return -1;
  for (size_t i = 0; i < set->n; i++) {
    size_t k = hash(set->item[i]) & (n - 1);
    while (slot[k]) k = (k + 1) & (n - 1);
    slot[k] = set->item[i];
  }
  free(set->slot);
  set->slot = slot;
  set->nslot = n;
  return 0;
}

int cli_strings_add(cli_strings *set, const char *s)
{
  if (2 * (set->n + 1) > set->nslot && grow(set) < 0) return -1;
  size_t k = hash(s) & (set->nslot - 1);
  for (; set->slot[k]; k = (k + 1) & (set->nslot - 1))
    if (strcmp(set->slot[k], s) == 0) return 0;
  if (set->n == set->cap) {
    size_t cap = set->cap ? set->cap * 2 : 16;
    char **item = realloc(set->item, cap * sizeof *item);
    if (!item) return -1;
    set->item = item;
    set->cap = cap;
  }
  char *copy = strdup(s);
  if (!copy) return -1;
  set->item[set->n++] = copy;
  set->slot[k] = copy;
  return 1;
}

void cli_strings_free(cli_strings *set)
{
  for (size_t i = 0; i < set->n; i++) free(set->item[i]);
  free(set->item);
  free(set->slot);
  memset(set, 0, sizeof *set);
}

void cli_record_free(cli_record *rec)
{
  for (int k = 0; k < 2; k++)
    if (rec->spill[k]) fclose(rec->spill[k]);
  cJSON_Delete(rec->results);
  cJSON_Delete(rec->curves);
  for (size_t i = 0; i < rec->nkept; i++) eqp_result_free(rec->kept[i]);
  cli_strings_free(&rec->species);
  cli_strings_free(&rec->reagents);
  cli_strings_free(&rec->seen);
  cli_strings_free(&rec->warnings);
  cli_strings_free(&rec->cautions);
  memset(rec, 0, sizeof *rec);
}

/* --------------------------------------------------------- callbacks */

/* "file:line" of the script where the engine is now: the innermost Lua
** function of the script's thread (the binding that called the engine is
** level 0). Empty outside the script. */
static void where(cli_state *st, char *buf, size_t len)
{
  lua_State *L = st->lim.L ? st->lim.L : st->L;
  buf[0] = '\0';
  if (L) eqpi_lua_where(L, buf, len);
}

/* Keep o (a result, k 0, or a curve, k 1) for the --json document: its
** text in the spill file (indented for its place in the document), or, if
** the file cannot be made, the object itself. Takes o. */
static void keep(cli_state *st, int k, cJSON *o)
{
  cli_record *rec = &st->rec;
  void **list = k ? &rec->curves : &rec->results;
  if (!rec->spill[k] && !*list) rec->spill[k] = tmpfile();   /* tried once: order is kept */
  char *text = rec->spill[k] ? cJSON_Print(o) : NULL;
  if (text) {
    FILE *f = rec->spill[k];
    fputs(rec->nspill[k]++ ? ",\n\t\t" : "\t\t", f);
    cli_put_clean(f, text, strlen(text), "\t\t");   /* JSON strings hold no raw newline */
    cJSON_free(text);
    cJSON_Delete(o);
    return;
  }
  if (!*list) *list = cJSON_CreateArray();
  if (*list) cJSON_AddItemToArray(*list, o);
  else cJSON_Delete(o);
}

/* A new record {type, index, where, ...fields of body}. */
static void emit_entry(cli_state *st, const char *type, size_t index, const char *at,
                       cJSON *body)
{
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "type", type);
  cJSON_AddNumberToObject(o, "index", (double)index);
  cJSON_AddStringToObject(o, "where", at);
  while (body && body->child) {
    cJSON *item = body->child;
    const char *key = item->string;
    cJSON_DetachItemViaPointer(body, item);
    cJSON_AddItemToObject(o, key, item);   /* copies key, then frees the item's old one */
  }
  cJSON_Delete(body);
  cli_emit(st, o);
}

static void on_result(void *ud, const eqp_result *r)
{
  cli_state *st = ud;
  cli_record *rec = &st->rec;
  rec->nresults++;
  if (st->run->report || st->run->json || st->run->jsonl) {
    for (size_t i = 0; i < eqp_result_species_count(r); i++)
      cli_strings_add(&rec->species, eqp_result_species_name(r, i));
    double T = eqp_result_temperature_K(r);
    int seen = 0;
    for (size_t i = 0; i < rec->ntemps; i++) seen |= fabs(rec->temps[i] - T) < 1e-6;
    if (!seen && rec->ntemps < sizeof rec->temps / sizeof rec->temps[0]) rec->temps[rec->ntemps++] = T;
  }
  if (!st->run->json && !st->run->jsonl) return;
  /* the JSON provenance lists the constants of the first results */
  if (rec->nkept < CLI_KEEP_RESULTS && eqp_result_copy(r, &rec->kept[rec->nkept]) == EQP_OK)
    rec->nkept++;
  char at[300];
  where(st, at, sizeof at);
  cJSON *o = cli_result_json(r);
  if (!o) return;
  if (st->run->jsonl) {
    emit_entry(st, "result", rec->nresults, at, o);
    return;
  }
  cJSON_AddStringToObject(o, "where", at);
  keep(st, 0, o);
}

static void on_curve(void *ud, const eqp_curve *c)
{
  cli_state *st = ud;
  cli_record *rec = &st->rec;
  rec->ncurves++;
  char at[300];
  where(st, at, sizeof at);
  cJSON *o = cli_curve_json(c);
  if (!o) return;
  if (st->run->jsonl) {
    emit_entry(st, "curve", rec->ncurves, at, o);
    return;
  }
  cJSON_AddStringToObject(o, "where", at);
  keep(st, 1, o);
}

static void on_reagent_used(void *ud, const char *reagent)
{
  cli_state *st = ud;
  cli_strings_add(&st->rec.reagents, reagent);
}

static void on_caution(void *ud, const char *reagent, const char *text)
{
  cli_state *st = ud;
  (void)reagent;
  cli_strings_add(&st->rec.cautions, text);
}

/* The text without its numbers: the points of a titration or the passes of
** a loop say the same thing with other values. */
static void skeleton(const char *text, char *out, size_t len)
{
  size_t k = 0;
  for (const char *p = text; *p && k + 1 < len; p++) {
    int digit = isdigit((unsigned char)*p);
    int near = (p > text && isdigit((unsigned char)p[-1])) || isdigit((unsigned char)p[1]);
    if (digit || (near && strchr(".eE+-", *p))) continue;
    out[k++] = *p;
  }
  out[k] = '\0';
}

/* Each kind of warning once per script line: shown at once (stderr, or a
** --jsonl record), and kept for the document and the report. */
static void on_warning(void *ud, const char *kind, const char *text)
{
  cli_state *st = ud;
  char at[300], key[1200], shape[800];
  where(st, at, sizeof at);
  skeleton(text, shape, sizeof shape);
  snprintf(key, sizeof key, "%s\n%s\n%s", at, kind, shape);
  if (cli_strings_add(&st->rec.seen, key) != 1) return;
  snprintf(key, sizeof key, "%s%s%s", at, at[0] ? ": " : "", text);
  cli_strings_add(&st->rec.warnings, key);
  if (st->run->jsonl) {
    cJSON *o = cJSON_CreateObject();
    cJSON_AddStringToObject(o, "type", "warning");
    cJSON_AddStringToObject(o, "where", at);
    cJSON_AddStringToObject(o, "kind", kind);
    cJSON_AddStringToObject(o, "text", text);
    cli_emit(st, o);
  } else if (!st->run->json) {
    fprintf(stderr, "warning: %s\n", key);
  }
}

void cli_observe_attach(cli_state *st, eqp_ctx *ctx)
{
  const cli_run *run = st->run;
  eqp_observer obs = EQP_OBSERVER_INIT;
  obs.on_warning = on_warning;
  obs.on_caution = on_caution;
  /* a plain run keeps no result: it hears of none */
  if (run->json || run->jsonl || run->report) obs.on_result = on_result;
  if (run->json || run->jsonl) obs.on_curve = on_curve;
  if (run->json || run->jsonl || run->report) obs.on_reagent_used = on_reagent_used;
  st->ctx = ctx;
  eqp_ctx_set_observer(ctx, &obs, st);
}
