/* What a run leaves for its reader: JSON document, warnings, cautions. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include <cjson/cJSON.h>
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

static const char general_caution[] =
  "Results are model estimates: confirm the pH of every preparation with a calibrated "
  "meter. For clinical, pharmaceutical or food use follow validated methods and local "
  "regulations.";

/* The engine records every hazardous reagent a run used, whichever way it
** entered a solution, once per reagent; the observer heard of each. */
void cli_each_caution(cli_state *st, void (*f)(void *, const char *), void *ud)
{
  for (size_t i = 0; i < st->rec.cautions.n; i++) f(ud, st->rec.cautions.item[i]);
}

/* What loading the species library had to say (a file left out, a file
** replaced), as warnings. */
static void each_notice(cli_state *st, void (*f)(void *, const char *), void *ud)
{
  for (size_t i = 0; st->ctx && i < eqp_ctx_notice_count(st->ctx); i++)
    f(ud, eqp_ctx_notice(st->ctx, i));
}

static void print_warning(void *ud, const char *text)
{
  (void)ud;
  fprintf(stderr, "warning: %s\n", text);
}

static void print_caution(void *ud, const char *text)
{
  (void)ud;
  fprintf(stderr, "caution: %s\n", text);
}

/* Warnings were shown as they came (observe.c); the cautions close the run. */
void cli_report_text(cli_state *st)
{
  each_notice(st, print_warning, NULL);
  cli_each_caution(st, print_caution, NULL);
}

static const char water_sources[] =
  "density: G. S. Kell, 'Density, thermal expansivity, and compressibility of liquid water "
  "from 0 to 150 C', J. Chem. Eng. Data 20, 97-105 (1975); relative permittivity: C. G. "
  "Malmberg, A. A. Maryott, 'Dielectric constant of water from 0 to 100 C', J. Res. Natl. "
  "Bur. Stand. 56, 1-8 (1956) [titles from memory]";

static void add_string(void *ud, const char *text)
{
  cJSON_AddItemToArray(ud, cJSON_CreateString(text));
}

/* The engine's JSON of a result or a curve, as a cJSON object. */
static cJSON *parsed(char *text)
{
  cJSON *o = text ? cJSON_Parse(text) : NULL;
  eqp_free_string(text);
  return o;
}

void *cli_result_json(const eqp_result *r) { return parsed(eqp_result_to_json(r)); }
void *cli_curve_json(const eqp_curve *c) { return parsed(eqp_curve_to_json(c)); }

/* Length of the valid UTF-8 sequence at s (at most n bytes), or 0. */
static size_t utf8_len(const unsigned char *s, size_t n)
{
  unsigned c = s[0];
  size_t len = c < 0x80 ? 1 : c >= 0xC2 && c <= 0xDF ? 2 : c >= 0xE0 && c <= 0xEF ? 3
             : c >= 0xF0 && c <= 0xF4 ? 4 : 0;
  if (len == 0 || len > n) return 0;
  unsigned lo = 0x80, hi = 0xBF;   /* the second byte's range excludes overlongs, surrogates */
  if (c == 0xE0) lo = 0xA0;
  else if (c == 0xED) hi = 0x9F;
  else if (c == 0xF0) lo = 0x90;
  else if (c == 0xF4) hi = 0x8F;
  for (size_t i = 1; i < len; i++) {
    if (s[i] < (i == 1 ? lo : 0x80) || s[i] > (i == 1 ? hi : 0xBF)) return 0;
  }
  return len;
}

static const char replacement[] = "\xEF\xBF\xBD";   /* U+FFFD */

void *cli_json_bytes(const char *s, size_t len)
{
  size_t cap = len * 3 + 1, k = 0;
  char *buf = cJSON_malloc(cap);
  if (!buf) return cJSON_CreateString("");
  for (size_t i = 0; i < len;) {
    size_t n = s[i] ? utf8_len((const unsigned char *)s + i, len - i) : 0;
    if (n) {
      memcpy(buf + k, s + i, n);
      k += n;
      i += n;
    } else {
      memcpy(buf + k, replacement, 3);
      k += 3;
      i++;
    }
  }
  buf[k] = '\0';
  cJSON *o = cJSON_CreateString(buf);
  cJSON_free(buf);
  return o;
}

/* text with every invalid UTF-8 sequence replaced by U+FFFD, and a newline;
** malloc'd, NULL when memory is exhausted. */
static char *clean_line(const char *text, size_t *out)
{
  const unsigned char *s = (const unsigned char *)text;
  size_t n = strlen(text), k = 0;
  char *buf = malloc(n * 3 + 2);
  if (!buf) return NULL;
  for (size_t i = 0; i < n;) {
    size_t len = s[i] < 0x80 ? 1 : utf8_len(s + i, n - i);
    if (len) memcpy(buf + k, s + i, len);
    else memcpy(buf + k, replacement, 3);
    k += len ? len : 3;
    i += len ? len : 1;
  }
  buf[k++] = '\n';
  *out = k;
  return buf;
}

void cli_put_json_line(FILE *f, const char *text)
{
  size_t len;
  char *line = clean_line(text, &len);
  if (!line) {
    fputs("{\"type\":\"error\",\"text\":\"out of memory while writing a record\"}\n", f);
    fflush(f);
    return;
  }
  /* one write(2) per record: a kill leaves whole lines behind */
  fflush(f);
  for (size_t done = 0; done < len;) {
    ssize_t w = write(fileno(f), line + done, len - done);
    if (w < 0 && errno == EINTR) continue;
    if (w <= 0) break;
    done += (size_t)w;
  }
  free(line);
}

static void add_head(cJSON *doc, const cli_run *run)
{
  cJSON_AddNumberToObject(doc, "schema_version", CLI_JSON_SCHEMA_VERSION);
  cJSON_AddStringToObject(doc, "equipoise", EQP_VERSION_STRING);
  cJSON_AddStringToObject(doc, "script", run->script ? run->script : "");
  cJSON *params = cJSON_AddObjectToObject(doc, "params");
  for (int i = 0; i < run->nparams; i++)
    cJSON_AddStringToObject(params, run->param_names[i], run->param_values[i]);
  cJSON_AddBoolToObject(doc, "trusted", run->trusted);
}

static void add_status(cJSON *doc, int code, const char *error)
{
  cJSON_AddStringToObject(doc, "status", code == 0 ? "ok" : "error");
  cJSON_AddNumberToObject(doc, "exit_code", code);
  if (error) cJSON_AddStringToObject(doc, "error", error);
  else cJSON_AddNullToObject(doc, "error");
}

/* The lines of what the script printed (kept in the registry when no
** temporary file could be made) and of what was written to fd 1 (the
** script's print too, in JSON modes), in order, one line in memory at a
** time; a last line without its newline too. */
typedef struct lines { char *buf; size_t n, cap; void (*f)(void *, const char *, size_t); void *ud; } lines;

static void feed(lines *l, const char *s, size_t len)
{
  for (size_t i = 0; i < len; i++) {
    if (s[i] == '\n') {
      l->f(l->ud, l->buf ? l->buf : "", l->n);
      l->n = 0;
      continue;
    }
    if (l->n == l->cap) {
      size_t cap = l->cap ? l->cap * 2 : 256;
      char *b = realloc(l->buf, cap);
      if (!b) return;           /* out of memory: the rest of this line is lost */
      l->buf = b;
      l->cap = cap;
    }
    l->buf[l->n++] = s[i];
  }
}

static void each_output_line(cli_state *st, void (*f)(void *, const char *, size_t), void *ud)
{
  lines l = {NULL, 0, 0, f, ud};
  lua_State *L = st->L;
  if (L) {
    int t = lua_gettop(L) + 1;
    lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.output");
    lua_Integer n = lua_istable(L, t) ? (lua_Integer)lua_rawlen(L, t) : 0;
    for (lua_Integer i = 1; i <= n; i++) {
      size_t len;
      lua_rawgeti(L, t, i);
      const char *s = lua_tolstring(L, -1, &len);
      if (s) feed(&l, s, len);
      lua_pop(L, 1);
    }
    lua_settop(L, t - 1);
  }
  if (st->stray) {
    char chunk[4096];
    size_t got;
    fflush(stdout);
    rewind(st->stray);
    while ((got = fread(chunk, 1, sizeof chunk, st->stray)) > 0) feed(&l, chunk, got);
  }
  if (l.n) f(ud, l.buf, l.n);
  free(l.buf);
}

static void add_closing(cli_state *st, cJSON *doc)
{
  eqp_ctx *ctx = st->ctx;
  cJSON *warnings = cJSON_AddArrayToObject(doc, "warnings");
  each_notice(st, add_string, warnings);
  for (size_t i = 0; i < st->rec.warnings.n; i++) add_string(warnings, st->rec.warnings.item[i]);
  cJSON *cautions = cJSON_AddArrayToObject(doc, "cautions");
  cJSON_AddItemToArray(cautions, cJSON_CreateString(general_caution));
  cli_each_caution(st, add_string, cautions);
  cJSON *lim = cJSON_AddObjectToObject(doc, "limits");
  cJSON_AddNumberToObject(lim, "instructions", (double)st->lim.steps);
  cJSON_AddNumberToObject(lim, "max_instructions", (double)st->run->max_steps);
  cJSON_AddNumberToObject(lim, "memory_peak_bytes", (double)st->lim.peak);
  cJSON_AddNumberToObject(lim, "max_memory_bytes", (double)st->run->max_memory);
  cJSON *prov = cJSON_AddObjectToObject(doc, "provenance");
  cJSON *files = cJSON_AddArrayToObject(prov, "species_files");
  for (size_t i = 0; ctx && i < eqp_ctx_source_count(ctx); i++)
    cJSON_AddItemToArray(files, cJSON_CreateString(eqp_ctx_source_path(ctx, i)));
  cJSON_AddStringToObject(prov, "water_properties", water_sources);
  /* every constant of the species the run's reagents and results can form,
  ** at 25 C and at each temperature of its results */
  const char *names[512];
  size_t n = 0;
  const cli_record *rec = &st->rec;
  for (size_t i = 0; i < rec->reagents.n && n < 256; i++) names[n++] = rec->reagents.item[i];
  for (size_t i = 0; i < rec->species.n && n < 512; i++) names[n++] = rec->species.item[i];
  char *constants = ctx ? eqp_ctx_constants_of_json(ctx, names, n, rec->temps, rec->ntemps) : NULL;
  cJSON *both = constants ? cJSON_Parse(constants) : NULL;
  cJSON *list = both ? cJSON_DetachItemFromObject(both, "constants") : NULL;
  cJSON *par = both ? cJSON_DetachItemFromObject(both, "parameters") : NULL;
  cJSON_AddItemToObject(prov, "constants", list ? list : cJSON_CreateArray());
  cJSON_AddItemToObject(prov, "parameters", par ? par : cJSON_CreateArray());
  cJSON_Delete(both);
  eqp_free_string(constants);
}

/* cJSON_Print can fail only when memory is exhausted: say so, still in JSON. */
static void print_doc(cli_state *st, cJSON *doc, int formatted)
{
  char *text = doc ? (formatted ? cJSON_Print(doc) : cJSON_PrintUnformatted(doc)) : NULL;
  if (text) cli_put_json_line(st->doc, text);
  else fputs("{\"status\":\"error\",\"exit_code\":7,\"error\":\"out of memory while writing "
             "the report\"}\n", st->doc);
  fflush(st->doc);
  cJSON_free(text);
  cJSON_Delete(doc);
}

/* s (len bytes) to f with every invalid UTF-8 sequence replaced by U+FFFD,
** and indent after each newline. */
static void put_clean(FILE *f, const char *s, size_t len, const char *indent)
{
  const unsigned char *u = (const unsigned char *)s;
  for (size_t i = 0; i < len;) {
    size_t n = u[i] && u[i] < 0x80 ? 1 : u[i] ? utf8_len(u + i, len - i) : 0;
    if (n) fwrite(s + i, 1, n, f);
    else fputs(replacement, f);
    if (indent && s[i] == '\n') fputs(indent, f);
    i += n ? n : 1;
  }
}

void cli_put_clean(FILE *f, const char *s, size_t len, const char *indent)
{
  put_clean(f, s, len, indent);
}

/* The members of the printed object text, without its braces. */
static void put_members(FILE *f, const char *text)
{
  size_t len = strlen(text);
  if (len > 4) put_clean(f, text + 2, len - 4, NULL);   /* "{\n" members "\n}" */
}

/* One of the lists the observer kept: its spill file as it is, or the
** objects themselves. */
static void put_list(FILE *f, cli_record *rec, int k)
{
  void **list = k ? &rec->curves : &rec->results;
  fputs("[", f);
  if (rec->spill[k] && rec->nspill[k]) {
    char chunk[8192];
    size_t got;
    fflush(rec->spill[k]);
    rewind(rec->spill[k]);
    fputs("\n", f);
    while ((got = fread(chunk, 1, sizeof chunk, rec->spill[k])) > 0) fwrite(chunk, 1, got, f);
    fputs("\n\t", f);
  }
  for (cJSON *o = *list ? ((cJSON *)*list)->child : NULL; o; o = o->next) {
    char *text = cJSON_Print(o);
    if (!text) continue;
    fputs(o == ((cJSON *)*list)->child && !rec->nspill[k] ? "\n\t\t" : ",\n\t\t", f);
    put_clean(f, text, strlen(text), "\t\t");
    cJSON_free(text);
    if (!o->next) fputs("\n\t", f);
  }
  fputs("]", f);
}

typedef struct out_lines { FILE *f; size_t n; } out_lines;

static void put_line(void *ud, const char *s, size_t len)
{
  out_lines *o = ud;
  cJSON *str = cli_json_bytes(s, len);
  char *text = str ? cJSON_PrintUnformatted(str) : NULL;
  if (text) {
    fputs(o->n++ ? ",\n\t\t" : "\n\t\t", o->f);
    fputs(text, o->f);
  }
  cJSON_free(text);
  cJSON_Delete(str);
}

/* The document, written piece by piece: the results, curves and printed
** lines come from files (or the little kept in memory), so that a run of a
** million results writes its document in the memory of one. */
void cli_report_json(cli_state *st, int code, const char *error)
{
  cJSON *head = cJSON_CreateObject(), *tail = cJSON_CreateObject();
  if (head) {
    add_head(head, st->run);
    add_status(head, code, error);
  }
  if (tail) add_closing(st, tail);
  char *h = head ? cJSON_Print(head) : NULL, *t = tail ? cJSON_Print(tail) : NULL;
  cJSON_Delete(head);
  cJSON_Delete(tail);
  FILE *f = st->doc;
  if (!h || !t) {
    fputs("{\"status\":\"error\",\"exit_code\":7,\"error\":\"out of memory while writing "
          "the report\"}\n", f);
  } else {
    fputs("{\n", f);
    put_members(f, h);
    fputs(",\n\t\"results\": ", f);
    put_list(f, &st->rec, 0);
    fputs(",\n\t\"curves\": ", f);
    put_list(f, &st->rec, 1);
    fputs(",\n\t\"output\": [", f);
    out_lines o = {f, 0};
    each_output_line(st, put_line, &o);
    fputs(o.n ? "\n\t],\n" : "],\n", f);
    put_members(f, t);
    fputs("\n}\n", f);
  }
  fflush(f);
  cJSON_free(h);
  cJSON_free(t);
}

void cli_report_start(cli_state *st)
{
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "type", "start");
  add_head(o, st->run);
  print_doc(st, o, 0);
}

static void emit_line(void *ud, const char *s, size_t len)
{
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "type", "output");
  cJSON_AddItemToObject(o, "text", cli_json_bytes(s, len));
  cli_emit(ud, o);
}

/* The closing record of a stream: what others wrote to fd 1, then the summary. */
void cli_report_summary(cli_state *st, int code, const char *error)
{
  if (st->stray && st->L) each_output_line(st, emit_line, st);
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "type", "summary");
  add_status(o, code, error);
  cJSON_AddNumberToObject(o, "results", (double)st->rec.nresults);
  cJSON_AddNumberToObject(o, "curves", (double)st->rec.ncurves);
  add_closing(st, o);
  print_doc(st, o, 0);
}
