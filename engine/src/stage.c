/* The staging area: what a species load holds before its commit, its
** error list, and the operations the library loader needs (appending one
** file's entries to a load, fingerprinting a load); and the loads
** themselves, from a file, a folder, text or a script's table onto a
** library, each of which makes a new library. The staging area is made,
** filled, committed and freed under this file's control only. */
/* SPDX-License-Identifier: MIT */
#include "stage_impl.h"
#include <lauxlib.h>
#include <lua.h>
#include <stdio.h>
#include <string.h>

static void note_error_file(eqpi_stage *st, const char *file)
{
  if (!file) {
    st->errnofile++;
    return;
  }
  for (int i = 0; i < st->nerrfile; i++)
    if (strcmp(st->errfile[i], file) == 0) return;
  if (st->nerrfile < (int)(sizeof st->errfile / sizeof st->errfile[0]))
    st->errfile[st->nerrfile++] = file;
  else
    st->errfile_full = 1;
}

void eqpi_stage_error(eqpi_stage *st, const char *file, int line, const char *fmt, ...)
{
  st->nerr++;
  note_error_file(st, file);
  if (st->errused + 2 >= sizeof st->err) return;
  char *p = st->err + st->errused;
  size_t left = sizeof st->err - st->errused;
  int k = 0;
  if (st->errused) k = snprintf(p, left, "\n");
  if (file && line > 0) k += snprintf(p + k, left - (size_t)k, "%s:%d: ", file, line);
  else if (file) k += snprintf(p + k, left - (size_t)k, "%s: ", file);
  va_list ap;
  va_start(ap, fmt);
  if ((size_t)k < left) k += vsnprintf(p + k, left - (size_t)k, fmt, ap);
  va_end(ap);
  st->errused += (size_t)k < left ? (size_t)k : left - 1;
}

void *eqpi_stage_push(eqp_ctx *ctx, eqpi_stage *st, void **arr, int *n, int *cap, size_t elem)
{
  if (eqpi_grow(ctx, arr, cap, *n + 1, elem) < 0) {
    eqpi_stage_error(st, NULL, 0, "out of memory");
    return NULL;
  }
  void *e = (char *)*arr + elem * (size_t)(*n)++;
  memset(e, 0, elem);
  return e;
}

eqpi_stage *eqpi_stage_new(eqp_ctx *ctx)
{
  return eqpi_calloc(ctx, 1, sizeof(eqpi_stage));
}

void eqpi_stage_free(eqp_ctx *ctx, eqpi_stage *st)
{
  if (!st) return;
  eqpi_arena_free(ctx, &st->arena);
  eqpi_free(ctx, st->sp, sizeof *st->sp * (size_t)st->capsp);
  eqpi_free(ctx, st->rx, sizeof *st->rx * (size_t)st->caprx);
  eqpi_free(ctx, st->rg, sizeof *st->rg * (size_t)st->caprg);
  eqpi_free(ctx, st->in, sizeof *st->in * (size_t)st->capin);
  eqpi_free(ctx, st->bf, sizeof *st->bf * (size_t)st->capbf);
  eqpi_free(ctx, st->gs, sizeof *st->gs * (size_t)st->capgs);
  eqpi_free(ctx, st->so, sizeof *st->so * (size_t)st->capso);
  eqpi_free(ctx, st->files, sizeof *st->files * (size_t)st->capfiles);
  eqpi_free(ctx, st, sizeof *st);
}


/* Append m elements of size elem from src to the array *arr. */
static int append(eqp_ctx *ctx, void **arr, int *n, int *cap, const void *src, int m,
                  size_t elem)
{
  if (m == 0) return 0;
  if (eqpi_grow(ctx, arr, cap, *n + m, elem) < 0) return -1;
  memcpy((char *)*arr + elem * (size_t)*n, src, elem * (size_t)m);
  *n += m;
  return 0;
}

void eqpi_stage_give_strings(eqpi_stage *src, eqpi_arena **arena)
{
  eqpi_arena_splice(arena, &src->arena);
}

#define APPEND_ARR(a, n, cap) \
  append(ctx, (void **)&dst->a, &dst->n, &dst->cap, src->a, src->n, sizeof *src->a)

int eqpi_stage_append(eqp_ctx *ctx, eqpi_stage *dst, const eqpi_stage *src)
{
  return APPEND_ARR(sp, nsp, capsp) | APPEND_ARR(rx, nrx, caprx) | APPEND_ARR(rg, nrg, caprg) |
         APPEND_ARR(in, nin, capin) | APPEND_ARR(bf, nbf, capbf) | APPEND_ARR(gs, ngs, capgs) |
         APPEND_ARR(so, nso, capso) | APPEND_ARR(files, nfiles, capfiles) ? -1 : 0;
}

/* ------------------------------------------------------------ fingerprint */

typedef unsigned long long u64;

static u64 h_str(u64 h, const char *s)
{
  return s ? eqpi_hash_bytes(s, strlen(s) + 1, h) : eqpi_hash_bytes("\1", 1, h);
}

static u64 h_num(u64 h, double v) { return eqpi_hash_bytes(&v, sizeof v, h); }

static u64 h_pairs(u64 h, const st_pair *p, int n)
{
  h = h_num(h, n);
  for (int i = 0; i < n && p; i++) h = h_num(h_str(h, p[i].name), p[i].nu);
  return h;
}

static u64 h_strs(u64 h, const char *const *v, int n)
{
  h = h_num(h, n);
  for (int i = 0; i < n && v; i++) h = h_str(h, v[i]);
  return h;
}

static u64 h_const(u64 h, const st_const *k)
{
  h = h_num(h_num(h_num(h_num(h, k->logK), k->dH), k->dCp), k->tmodel);
  for (int i = 0; i < 6; i++) h = h_num(h, k->fn[i]);
  return h_str(h_num(h_num(h, k->Tmin), k->Tmax), k->source);
}

u64 eqpi_stage_fingerprint(const eqpi_stage *st)
{
  u64 h = eqpi_hash_bytes("eqp-stage", 9, 0);
  for (int i = 0; i < st->nsp; i++) {
    const st_species *s = &st->sp[i];
    h = h_str(h_str(h_num(h_str(h_str(h, s->name), s->formula), s->size), s->size_source),
              s->params_source);
    h = h_pairs(h, s->params, s->nparams);
  }
  for (int i = 0; i < st->nrx; i++)
    h = h_const(h_pairs(h_str(h, st->rx[i].product), st->rx[i].r, st->rx[i].n), &st->rx[i].k);
  for (int i = 0; i < st->nrg; i++) {
    const st_reagent *r = &st->rg[i];
    h = h_strs(h_str(h_str(h, r->name), r->formula), r->aliases, r->naliases);
    h = h_num(h_num(h_pairs(h, r->gives, r->n), r->hydrate), r->density);
    h = h_strs(h, r->hazards, r->nhazards);
  }
  for (int i = 0; i < st->nin; i++) {
    const st_inter *in = &st->in[i];
    h = h_pairs(h_str(h_str(h_str(h, in->a), in->b), in->source), in->params, in->n);
  }
  for (int i = 0; i < st->nbf; i++) {
    const st_buffer *b = &st->bf[i];
    h = h_str(h_str(h_str(h_str(h_str(h, b->name), b->acid), b->base), b->free), b->titrant);
    h = h_strs(h, b->notes, b->nnotes);
  }
  for (int i = 0; i < st->ngs; i++)
    h = h_const(h_str(h_str(h, st->gs[i].name), st->gs[i].dissolves), &st->gs[i].k);
  for (int i = 0; i < st->nso; i++) {
    const st_solid *s = &st->so[i];
    h = h_const(h_pairs(h_str(h_str(h, s->name), s->formula), s->dissolves, s->n), &s->k);
  }
  return h;
}

/* ------------------------------------------------------------ loads */

typedef unsigned long long u64;

/* What made a library from its base, for eqpi_db_derived. */
static u64 how(const char *kind, const char *key, u64 hash)
{
  u64 h = eqpi_hash_bytes(kind, strlen(kind) + 1, 0);
  h = eqpi_hash_bytes(key, strlen(key) + 1, h);
  return eqpi_hash_bytes(&hash, sizeof hash, h);
}

int eqpi_stage_file(eqp_ctx *ctx, eqpi_stage *st, const eqpi_db *base, const char *path,
                    eqpi_source_id *id, int *skipped)
{
  char *text = NULL;
  size_t len = 0, cap = 0;
  *skipped = 0;
  int rc = eqpi_read_file(ctx, path, &text, &len, &cap);
  if (rc < 0) return rc;
  eqpi_file_key(path, id->key, sizeof id->key);
  id->hash = eqpi_hash_bytes(text, len, 0);
  if (base && eqpi_db_loaded(base, id->key, id->hash)) {
    *skipped = 1;
    eqpi_free(ctx, text, cap);
    return EQP_OK;
  }
  const char *p = eqpi_arena_strdup(ctx, &st->arena, path);
  const char **slot = p ? eqpi_stage_push(ctx, st, (void **)&st->files, &st->nfiles,
                                          &st->capfiles, sizeof *st->files) : NULL;
  if (slot) *slot = p;
  else if (!p) eqpi_stage_error(st, NULL, 0, "out of memory");
  rc = eqpi_stage_text(ctx, st, text, len, path);
  eqpi_free(ctx, text, cap);
  return rc == EQP_E_NOMEM ? eqpi_fail(ctx, rc, "%s: out of memory", path) : EQP_OK;
}

/* Commit st onto base as what `made` stands for, with the sources rec;
** frees st. */
static int commit(eqp_ctx *ctx, const eqpi_db *base, eqpi_stage *st, const eqpi_loaded *rec,
                  int nrec, u64 made, eqpi_db **out)
{
  int rc = eqpi_stage_commit(ctx, base, st, rec, nrec, out);
  eqpi_stage_free(ctx, st);
  if (rc == EQP_OK) eqpi_db_remember(*out, made);
  return rc;
}

int eqpi_load_file(eqp_ctx *ctx, const eqpi_db *base, const char *path, eqpi_db **out)
{
  *out = NULL;
  eqpi_stage *st = eqpi_stage_new(ctx);
  eqpi_source_id *id = eqpi_malloc(ctx, sizeof *id);
  if (!st || !id) {
    eqpi_stage_free(ctx, st);
    eqpi_free(ctx, id, sizeof *id);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  int skipped, rc = eqpi_stage_file(ctx, st, base, path, id, &skipped);
  u64 made = rc == EQP_OK ? how("file", id->key, id->hash) : 0;
  if (rc < 0 || skipped || (*out = eqpi_db_derived(base, made))) {
    if (rc == EQP_OK && skipped) *out = eqpi_db_ref(base);
    eqpi_stage_free(ctx, st);
  } else {
    eqpi_loaded rec = {id->key, id->hash};
    rc = commit(ctx, base, st, &rec, 1, made, out);
  }
  eqpi_free(ctx, id, sizeof *id);
  return rc;
}

int eqpi_load_text(eqp_ctx *ctx, const eqpi_db *base, const char *text, size_t len,
                   const char *source, eqpi_db **out)
{
  u64 hash = eqpi_hash_bytes(text, len, 0), made = how("text", source, hash);
  if (eqpi_db_loaded(base, source, hash)) {
    *out = eqpi_db_ref(base);
    return EQP_OK;
  }
  if ((*out = eqpi_db_derived(base, made))) return EQP_OK;
  eqpi_stage *st = eqpi_stage_new(ctx);
  if (!st) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  int rc = eqpi_stage_text(ctx, st, text, len, source);
  if (rc == EQP_E_NOMEM) {
    eqpi_stage_free(ctx, st);
    return eqpi_fail(ctx, rc, "%s: out of memory", source);
  }
  eqpi_loaded rec = {source, hash};
  return commit(ctx, base, st, &rec, 1, made, out);
}

int eqpi_load_dir(eqp_ctx *ctx, const eqpi_db *base, const char *dir, eqpi_db **out)
{
  char **names = NULL;
  int n = 0;
  *out = NULL;
  int rc = eqpi_list_species_files(ctx, dir, &names, &n);
  if (rc < 0) return rc;
  eqpi_stage *st = eqpi_stage_new(ctx);
  eqpi_source_id *ids = n ? eqpi_malloc(ctx, sizeof *ids * (size_t)n) : NULL;
  eqpi_loaded *rec = n ? eqpi_malloc(ctx, sizeof *rec * (size_t)n) : NULL;
  rc = st && (!n || (ids && rec)) ? EQP_OK : eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  int nrec = 0;
  u64 made = eqpi_hash_bytes("dir", 4, 0);
  for (int i = 0; i < n && rc == EQP_OK; i++) {
    char path[4096];
    int skipped = 0;
    if (snprintf(path, sizeof path, "%s/%s", dir, names[i]) >= (int)sizeof path)
      rc = eqpi_fail(ctx, EQP_E_IO, "%s/%s: path too long", dir, names[i]);
    else
      rc = eqpi_stage_file(ctx, st, base, path, &ids[i], &skipped);
    if (rc == EQP_OK && !skipped) {
      rec[nrec].key = ids[i].key;
      rec[nrec++].hash = ids[i].hash;
      made = how("dir", ids[i].key, ids[i].hash ^ made);
    }
  }
  if (rc == EQP_OK && nrec == 0) {
    *out = eqpi_db_ref(base);
    eqpi_stage_free(ctx, st);
  } else if (rc == EQP_OK && (*out = eqpi_db_derived(base, made))) {
    eqpi_stage_free(ctx, st);
  } else if (rc == EQP_OK) {
    rc = commit(ctx, base, st, rec, nrec, made, out);
  } else {
    eqpi_stage_free(ctx, st);
  }
  eqpi_free(ctx, ids, sizeof *ids * (size_t)n);
  eqpi_free(ctx, rec, sizeof *rec * (size_t)n);
  eqpi_free_names(ctx, names, n);
  return rc;
}

/* ------------------------------------------------------------ inline tables */

typedef struct table_args {
  eqp_ctx *ctx;
  eqpi_stage *st;
  const char *where;
} table_args;

static int table_run(lua_State *L)
{
  table_args *a = lua_touserdata(L, 1);
  eqpi_stage_from_table(a->ctx, a->st, L, 2, NULL, a->where);
  return 0;
}

int eqpi_load_table(eqp_ctx *ctx, const eqpi_db *base, lua_State *L, int idx, const char *where,
                    eqpi_db **out)
{
  *out = NULL;
  idx = lua_absindex(L, idx);
  if (!lua_checkstack(L, 4)) return eqpi_fail(ctx, EQP_E_NOMEM, "%s: out of memory", where);
  eqpi_stage *st = eqpi_stage_new(ctx);
  if (!st) return eqpi_fail(ctx, EQP_E_NOMEM, "%s: out of memory", where);
  table_args a = {ctx, st, where};
  lua_pushcfunction(L, table_run);
  lua_pushlightuserdata(L, &a);
  lua_pushvalue(L, idx);
  int prc = lua_pcall(L, 2, 0, 0);
  if (prc != LUA_OK) {
    /* the stage is ours whatever happened: report, then free it */
    const char *msg = lua_tostring(L, -1);
    eqpi_stage_error(st, where, 0, "%s", msg ? msg : "error while reading the species table");
    lua_pop(L, 1);
    int rc = eqpi_fail(ctx, prc == LUA_ERRMEM ? EQP_E_NOMEM : EQP_E_DATA, "%s", st->err);
    eqpi_stage_free(ctx, st);
    return rc;
  }
  /* an inline table has no file: it is known by what it defines, so the
  ** same table loaded again, from anywhere in the script, is a no-op */
  u64 fp = eqpi_stage_fingerprint(st), made = how("table", "(inline species)", fp);
  if (st->nerr == 0 && eqpi_db_loaded(base, "(inline species)", fp)) {
    eqpi_stage_free(ctx, st);
    *out = eqpi_db_ref(base);
    return EQP_OK;
  }
  if (st->nerr == 0 && (*out = eqpi_db_derived(base, made))) {
    eqpi_stage_free(ctx, st);
    return EQP_OK;
  }
  eqpi_loaded rec = {"(inline species)", fp};
  return commit(ctx, base, st, &rec, 1, made, out);
}
