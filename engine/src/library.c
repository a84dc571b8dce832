/* The species library as found on disk: the species path (a list of
** folders, the user's first, overlaying the built-in library), and a load
** that leaves out a broken file, and whatever needs it, instead of failing
** every run. What a library has loaded is recorded in the library itself
** (loading the same file again is a no-op). */
/* SPDX-License-Identifier: MIT */
#include "stage_impl.h"
#include <dirent.h>
#include <errno.h>
#include <limits.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

typedef unsigned long long u64;

/* ------------------------------------------------------------ record */

u64 eqpi_hash_bytes(const void *p, size_t n, u64 h)
{
  const unsigned char *b = p;
  if (!h) h = 14695981039346656037ull;          /* FNV-1a, 64 bits */
  for (size_t i = 0; i < n; i++) h = (h ^ b[i]) * 1099511628211ull;
  return h;
}

void eqpi_file_key(const char *path, char *buf, size_t len)
{
  char real[PATH_MAX];
  snprintf(buf, len, "%s", realpath(path, real) ? real : path);
}

static int push_str(eqp_ctx *ctx, char ***arr, int *n, int *cap, const char *s)
{
  if (eqpi_grow(ctx, arr, cap, *n + 1, sizeof **arr) < 0) return -1;
  if (!((*arr)[*n] = eqpi_strdup(ctx, s))) return -1;
  (*n)++;
  return 0;
}

static void free_strs(eqp_ctx *ctx, char **arr, int n, int cap)
{
  for (int i = 0; i < n; i++) eqpi_strfree(ctx, arr[i]);
  eqpi_free(ctx, arr, sizeof *arr * (size_t)cap);
}

void eqpi_library_free(eqp_ctx *ctx)
{
  free_strs(ctx, ctx->species_dirs, ctx->nspecies_dirs, ctx->nspecies_dirs);
  free_strs(ctx, ctx->notices, ctx->nnotices, ctx->capnotices);
  free_strs(ctx, ctx->broken, ctx->nbroken, ctx->capbroken);
  eqpi_index_free(ctx, &ctx->broken_names);
  eqpi_arena_free(ctx, &ctx->broken_arena);
}

/* ------------------------------------------------------------ folders */

static int cmp_str(const void *a, const void *b)
{
  return strcmp(*(char *const *)a, *(char *const *)b);
}

void eqpi_free_names(eqp_ctx *ctx, char **names, int n)
{
  for (int i = 0; i < n; i++) eqpi_strfree(ctx, names[i]);
  eqpi_free(ctx, names, sizeof *names * (size_t)(n + 1));
}

int eqpi_list_species_files(eqp_ctx *ctx, const char *dir, char ***out, int *nout)
{
  *out = NULL;
  *nout = 0;
  DIR *d = opendir(dir);
  if (!d) return eqpi_fail(ctx, EQP_E_IO, "%s: cannot open folder: %s", dir, strerror(errno));
  char **names = NULL;
  int n = 0, cap = 0, rc = EQP_OK;
  struct dirent *e;
  while ((e = readdir(d))) {
    size_t l = strlen(e->d_name);
    if (l <= 4 || strcmp(e->d_name + l - 4, ".lua") != 0 || e->d_name[0] == '.') continue;
    if (push_str(ctx, &names, &n, &cap, e->d_name) < 0) {
      rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
      break;
    }
  }
  closedir(d);
  /* resize to n + 1 so that eqpi_free_names knows the size */
  char **fit = eqpi_realloc(ctx, names, sizeof *names * (size_t)cap, sizeof *names * (size_t)(n + 1));
  if (!fit) {
    for (int i = 0; i < n; i++) eqpi_strfree(ctx, names[i]);
    eqpi_free(ctx, names, sizeof *names * (size_t)cap);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  if (rc < 0) {
    eqpi_free_names(ctx, fit, n);
    return rc;
  }
  qsort(fit, (size_t)n, sizeof *fit, cmp_str);
  *out = fit;
  *nout = n;
  return EQP_OK;
}

static int is_dir(const char *p)
{
  struct stat sb;
  return p && *p && stat(p, &sb) == 0 && S_ISDIR(sb.st_mode);
}

int eqp_ctx_add_species_dir(eqp_ctx *ctx, const char *dir)
{
  if (!ctx || !dir) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  if (ctx->default_loaded)
    return eqpi_fail(ctx, EQP_E_ARG, "%s: the species library is loaded already; add folders "
                     "to the species path before it loads", dir);
  if (!is_dir(dir)) return eqpi_fail(ctx, EQP_E_IO, "%s: not a folder", dir);
  int n = ctx->nspecies_dirs;
  char *d = eqpi_strdup(ctx, dir);
  char **p = eqpi_malloc(ctx, sizeof *p * (size_t)(n + 1));
  if (!d || !p) {
    eqpi_strfree(ctx, d);
    eqpi_free(ctx, p, sizeof *p * (size_t)(n + 1));
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  p[0] = d;                       /* the last added comes first */
  if (n) memcpy(p + 1, ctx->species_dirs, sizeof *p * (size_t)n);
  eqpi_free(ctx, ctx->species_dirs, sizeof *p * (size_t)n);
  ctx->species_dirs = p;
  ctx->nspecies_dirs = n + 1;
  return EQP_OK;
}

/* The folders of the species path, first first (see equipoise.h), and
** which of them is the built-in library (-1: none). */
typedef struct folders {
  char path[16][4096];
  int n;
  int builtin;
} folders;

/* The place of dir on the path, added at the end unless listed already;
** -1 when the path is full. */
static int add_folder(folders *f, const char *dir)
{
  char a[PATH_MAX], b[PATH_MAX];
  if (!realpath(dir, a)) snprintf(a, sizeof a, "%s", dir);
  for (int i = 0; i < f->n; i++)
    if (realpath(f->path[i], b) && strcmp(a, b) == 0) return i;
  if (f->n == 16) return -1;
  snprintf(f->path[f->n], sizeof f->path[0], "%s", dir);
  return f->n++;
}

static int species_path(eqp_ctx *ctx, folders *f)
{
  f->n = 0;
  f->builtin = -1;
  for (int i = 0; i < ctx->nspecies_dirs; i++)
    if (add_folder(f, ctx->species_dirs[i]) < 0) goto many;
  const char *env = ctx->env_species_path;   /* eqp_ctx_default_config */
  if (env && *env) {
    char buf[8192];
    snprintf(buf, sizeof buf, "%s", env);
    char *save = NULL;
    for (char *d = strtok_r(buf, ":", &save); d; d = strtok_r(NULL, ":", &save)) {
      if (!is_dir(d))
        return eqpi_fail(ctx, EQP_E_IO, "EQUIPOISE_SPECIES_PATH: '%s' is not a folder", d);
      if (add_folder(f, d) < 0) goto many;
    }
  }
  const char *user = ctx->user_species_dir;
  if (is_dir(user) && add_folder(f, user) < 0) goto many;
  char lib[4096];
  if (eqpi_builtin_dir(EQPI_DIR_SPECIES, lib, sizeof lib) == 0 && is_dir(lib) &&
      (f->builtin = add_folder(f, lib)) < 0)
    goto many;
  if (f->n == 0)
    return eqpi_fail(ctx, EQP_E_IO, "no species library found (set EQUIPOISE_SPECIES_PATH)");
  return EQP_OK;
many:
  return eqpi_fail(ctx, EQP_E_IO, "the species path has more than 16 folders");
}

/* ------------------------------------------------------------ library */

typedef struct lib_file {
  char *path;           /* folder/name, or the file being checked */
  const char *name;     /* its file name: what a file earlier on the path replaces */
  int rank;             /* place of its folder on the path; -1: the file being checked */
  eqpi_source_id id;    /* key and content hash */
  eqpi_stage *st;       /* its entries, once staged */
  int state;            /* F_* */
  char *why;            /* why it was left out */
  int note;             /* its entry in ctx->broken, once remembered; -1: none */
  int cause;            /* the file left out before it whose names it needs; -1: none */
} lib_file;

enum { F_PENDING, F_GOOD, F_BROKEN, F_SKIPPED };

typedef struct lib_load {
  eqp_ctx *ctx;
  lib_file *f;
  int n, cap;
} lib_load;

static const char *base_name(const char *p)
{
  const char *s = strrchr(p, '/');
  return s ? s + 1 : p;
}

static void notice(eqp_ctx *ctx, const char *fmt, ...) EQPI_PRINTF(2, 3);

static void notice(eqp_ctx *ctx, const char *fmt, ...)
{
  char buf[EQPI_ERRLEN];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(buf, sizeof buf, fmt, ap);
  va_end(ap);
  push_str(ctx, &ctx->notices, &ctx->nnotices, &ctx->capnotices, buf);  /* informational */
}

/* Add path unless a file of the same name is on the path already, earlier. */
static int choose(lib_load *ld, const char *path, int rank, const folders *fo)
{
  const char *name = base_name(path);
  for (int i = 0; i < ld->n; i++) {
    if (strcmp(ld->f[i].name, name) != 0) continue;
    char a[PATH_MAX], b[PATH_MAX];
    if (!(realpath(path, a) && realpath(ld->f[i].path, b) && strcmp(a, b) == 0))
      notice(ld->ctx, "species file %s replaces %s%s", ld->f[i].path,
             rank == fo->builtin ? "the built-in " : "", path);
    return 0;
  }
  if (eqpi_grow(ld->ctx, &ld->f, &ld->cap, ld->n + 1, sizeof *ld->f) < 0) return -1;
  lib_file *f = &ld->f[ld->n];
  memset(f, 0, sizeof *f);
  f->note = f->cause = -1;
  if (!(f->path = eqpi_strdup(ld->ctx, path))) return -1;
  f->name = base_name(f->path);
  f->rank = rank;
  ld->n++;
  return 0;
}

/* The built-in library first, the user's files after it, so that a clash
** between a user's file and the library is reported at the user's file. */
static int cmp_load_order(const void *x, const void *y)
{
  const lib_file *a = x, *b = y;
  if (a->rank != b->rank) return a->rank > b->rank ? -1 : 1;
  return strcmp(a->name, b->name);
}

static int collect(lib_load *ld, const folders *fo, const char *check)
{
  eqp_ctx *ctx = ld->ctx;
  if (check && choose(ld, check, -1, fo) < 0) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (int r = 0; r < fo->n; r++) {
    char **names;
    int n, rc = eqpi_list_species_files(ctx, fo->path[r], &names, &n);
    if (rc < 0) return rc;
    for (int i = 0; i < n && rc == EQP_OK; i++) {
      char path[4096];
      if (snprintf(path, sizeof path, "%s/%s", fo->path[r], names[i]) >= (int)sizeof path)
        rc = eqpi_fail(ctx, EQP_E_IO, "%s/%s: path too long", fo->path[r], names[i]);
      else if (choose(ld, path, r, fo) < 0)
        rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
    }
    eqpi_free_names(ctx, names, n);
    if (rc < 0) return rc;
  }
  qsort(ld->f, (size_t)ld->n, sizeof *ld->f, cmp_load_order);
  return EQP_OK;
}

static void leave_out(eqp_ctx *ctx, lib_file *f, const char *why)
{
  f->state = F_BROKEN;
  eqpi_strfree(ctx, f->why);
  f->why = eqpi_strdup(ctx, why);
}

/* Read and stage every file on its own: a file that cannot be read or run,
** or whose entries are malformed, is left out here. */
static int stage_each(lib_load *ld)
{
  eqp_ctx *ctx = ld->ctx;
  for (int i = 0; i < ld->n; i++) {
    lib_file *f = &ld->f[i];
    int skipped = 0;
    if (!(f->st = eqpi_stage_new(ctx))) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
    int rc = eqpi_stage_file(ctx, f->st, ctx->db, f->path, &f->id, &skipped);
    if (rc == EQP_E_NOMEM) return rc;
    if (rc < 0) leave_out(ctx, f, eqp_ctx_errmsg(ctx));
    else if (skipped) f->state = F_SKIPPED;
    else if (f->st->nerr) leave_out(ctx, f, f->st->err);
    else f->state = F_GOOD;
  }
  return EQP_OK;
}

/* The lines of a load's error text that are about file path. */
static void lines_of(const char *err, const char *path, char *buf, size_t len)
{
  size_t used = 0, pl = strlen(path);
  buf[0] = '\0';
  for (const char *p = err; *p;) {
    const char *e = strchr(p, '\n');
    size_t l = e ? (size_t)(e - p) : strlen(p);
    if (l > pl && strncmp(p, path, pl) == 0 && p[pl] == ':' && used + l + 2 < len) {
      used += (size_t)snprintf(buf + used, len - used, "%s%.*s", used ? "\n" : "", (int)l, p);
    }
    p += l + (e ? 1 : 0);
  }
  if (!buf[0]) snprintf(buf, len, "%s: problems found (run 'equipoise species check %s')",
                        path, path);
}

/* Commit the good files together; leave out the files a failed commit
** names, and try again with the rest. Each round leaves out at least one
** file, so this ends. */
static int commit_good(lib_load *ld)
{
  eqp_ctx *ctx = ld->ctx;
  eqpi_loaded *rec = eqpi_malloc(ctx, sizeof *rec * ((size_t)ld->n + 1));
  if (!rec) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  int rc = EQP_OK;
  for (;;) {
    eqpi_stage *all = eqpi_stage_new(ctx);
    if (!all) {
      rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
      break;
    }
    int ngood = 0;
    for (int i = 0; i < ld->n && rc == EQP_OK; i++) {
      lib_file *f = &ld->f[i];
      if (f->state != F_GOOD) continue;
      rec[ngood].key = f->id.key;
      rec[ngood++].hash = f->id.hash;
      if (eqpi_stage_append(ctx, all, f->st) < 0) rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
    }
    if (rc < 0 || !ngood) {
      eqpi_stage_free(ctx, all);
      break;
    }
    eqpi_db *lib;
    rc = eqpi_stage_commit(ctx, ctx->db, all, rec, ngood, &lib);
    if (rc == EQP_OK) {
      for (int i = 0; i < ld->n; i++)
        if (ld->f[i].state == F_GOOD)      /* its strings are the library's now */
          eqpi_stage_give_strings(ld->f[i].st, &lib->arena);
      eqpi_ctx_set_library(ctx, lib);
      eqpi_stage_free(ctx, all);
      break;
    }
    int left = 0;
    if (rc != EQP_E_NOMEM && !all->errnofile)
      for (int i = 0; i < ld->n; i++) {
        lib_file *f = &ld->f[i];
        if (f->state != F_GOOD) continue;
        for (int k = 0; k < all->nerrfile; k++)
          if (strcmp(all->errfile[k], f->path) == 0) {
            char why[EQPI_ERRLEN];
            lines_of(all->err, f->path, why, sizeof why);
            leave_out(ctx, f, why);
            left++;
            break;
          }
      }
    eqpi_stage_free(ctx, all);
    if (!left) break;     /* out of memory, or a problem no file can be blamed for */
    rc = EQP_OK;
  }
  eqpi_free(ctx, rec, sizeof *rec * ((size_t)ld->n + 1));
  return rc;
}

/* Remember what the files left out define, so that a run asking for one of
** those names hears why it is missing. */
static void remember(eqp_ctx *ctx, lib_file *f)
{
  char first[512];
  const char *nl = strchr(f->why ? f->why : "", '\n');
  snprintf(first, sizeof first, "%.*s", nl ? (int)(nl - f->why) : 400, f->why ? f->why : "");
  char msg[1024];
  snprintf(msg, sizeof msg, "it is defined in %s, which was left out of the library: %s",
           f->path, first);
  int idx = ctx->nbroken;
  if (push_str(ctx, &ctx->broken, &ctx->nbroken, &ctx->capbroken, msg) < 0) return;
  f->note = idx;
  if (!f->st) return;
  const eqpi_stage *st = f->st;
#define KEEP(s) do { const char *k_ = (s) ? eqpi_arena_strdup(ctx, &ctx->broken_arena, (s)) : NULL; \
    if (k_) eqpi_index_put(ctx, &ctx->broken_names, k_, idx, NULL); } while (0)
  for (int i = 0; i < st->nsp; i++) KEEP(st->sp[i].name);
  for (int i = 0; i < st->nrg; i++) {
    KEEP(st->rg[i].name);
    for (int a = 0; a < st->rg[i].naliases; a++) KEEP(st->rg[i].aliases[a]);
  }
  for (int i = 0; i < st->nbf; i++) KEEP(st->bf[i].name);
  for (int i = 0; i < st->ngs; i++) KEEP(st->gs[i].name);
  for (int i = 0; i < st->nso; i++) KEEP(st->so[i].name);
#undef KEEP
}

const char *eqpi_library_note(const eqp_ctx *ctx, const char *name)
{
  int i = ctx && name ? eqpi_index_get(&ctx->broken_names, name) : -1;
  return i < 0 || i >= ctx->nbroken ? NULL : ctx->broken[i];
}

/* The file left out whose names f's problems quote ('Zq+' in "unknown
** species 'Zq+'"), if any: f was left out because that one was. */
static int cause_of(const eqp_ctx *ctx, const lib_load *ld, const lib_file *f)
{
  const char *p = f->why ? f->why : "";
  while ((p = strchr(p, '\'')) != NULL) {
    const char *e = strchr(p + 1, '\'');
    if (!e) break;
    char name[256];
    if ((size_t)(e - p - 1) < sizeof name) {
      snprintf(name, sizeof name, "%.*s", (int)(e - p - 1), p + 1);
      int note = eqpi_index_get(&ctx->broken_names, name);
      for (int i = 0; note >= 0 && i < ld->n; i++)
        if (ld->f[i].note == note && &ld->f[i] != f) return i;
    }
    p = e + 1;
  }
  return -1;
}

/* One notice per file left out for its own problems, naming the files left
** out with it because they need what it defines (and, in turn, those that
** need them), instead of one notice for each of those. */
static void notices(eqp_ctx *ctx, lib_load *ld)
{
  for (int i = 0; i < ld->n; i++)
    if (ld->f[i].state == F_BROKEN && ld->f[i].rank >= 0) remember(ctx, &ld->f[i]);
  for (int i = 0; i < ld->n; i++) {
    lib_file *f = &ld->f[i];
    if (f->state == F_BROKEN && f->rank >= 0) f->cause = cause_of(ctx, ld, f);
  }
  for (int i = 0; i < ld->n; i++) {
    const lib_file *f = &ld->f[i];
    if (f->state != F_BROKEN || f->rank < 0 || f->cause >= 0) continue;
    char deps[EQPI_ERRLEN] = "";
    size_t used = 0;
    for (int j = 0; j < ld->n; j++) {
      const lib_file *g = &ld->f[j];
      int root = j, hops = 0;
      while (ld->f[root].cause >= 0 && hops++ < ld->n) root = ld->f[root].cause;
      if (j == i || root != i || g->state != F_BROKEN || g->rank < 0) continue;
      const char *nl = strchr(g->why ? g->why : "", '\n');
      int wl = g->why ? (nl ? (int)(nl - g->why) : (int)strlen(g->why)) : 0;
      if (used < sizeof deps)
        used += (size_t)snprintf(deps + used, sizeof deps - used, "%s%.*s", used ? "; " : "",
                                 wl, g->why ? g->why : g->path);
    }
    if (used)
      notice(ctx, "species file %s was left out of the library; runs that need what it "
             "defines fail: %s. Left out with it, as they need what it defines: %s", f->path,
             f->why ? f->why : "", deps);
    else
      notice(ctx, "species file %s was left out of the library; runs that need what it "
             "defines fail: %s", f->path, f->why ? f->why : "");
  }
}

static void lib_free(lib_load *ld)
{
  for (int i = 0; i < ld->n; i++) {
    eqpi_strfree(ld->ctx, ld->f[i].path);
    eqpi_strfree(ld->ctx, ld->f[i].why);
    eqpi_stage_free(ld->ctx, ld->f[i].st);
  }
  eqpi_free(ld->ctx, ld->f, sizeof *ld->f * (size_t)ld->cap);
}

/* Load the library; with check, that file first on the path and its own
** problems the result. */
static int load_library(eqp_ctx *ctx, const char *check)
{
  folders *fo = eqpi_malloc(ctx, sizeof *fo);
  if (!fo) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  lib_load ld = {ctx, NULL, 0, 0};
  int rc = species_path(ctx, fo);
  if (rc == EQP_OK) rc = collect(&ld, fo, check);
  if (rc == EQP_OK) rc = stage_each(&ld);
  if (rc == EQP_OK) rc = commit_good(&ld);
  eqpi_free(ctx, fo, sizeof *fo);
  if (rc < 0) {
    lib_free(&ld);
    return rc;
  }
  int nloaded = 0, nbroken = 0;
  const lib_file *checked = NULL, *first_broken = NULL;
  for (int i = 0; i < ld.n; i++) {
    const lib_file *f = &ld.f[i];
    nloaded += f->state == F_GOOD || f->state == F_SKIPPED;
    if (f->rank < 0) checked = f;
    if (f->state != F_BROKEN) continue;
    if (!nbroken++) first_broken = f;
  }
  notices(ctx, &ld);    /* the file being checked reports its own problems */
  ctx->default_loaded = true;
  if (checked && checked->state == F_BROKEN && checked->st && checked->st->nerr) {
    eqpi_db *none;                  /* fails: with its name checks, every problem */
    if ((rc = eqpi_stage_commit(ctx, ctx->db, checked->st, NULL, 0, &none)) == EQP_OK) {
      eqpi_db_release(none);
      rc = eqpi_fail(ctx, EQP_E_DATA, "%s", checked->st->err);
    }
  }
  else if (checked && checked->state == F_BROKEN)
    rc = eqpi_fail(ctx, EQP_E_DATA, "%s", checked->why ? checked->why : checked->path);
  else if (!nloaded && nbroken)
    rc = eqpi_fail(ctx, EQP_E_DATA, "no species file could be loaded; the first: %s",
                   first_broken->why ? first_broken->why : first_broken->path);
  lib_free(&ld);
  return rc;
}

int eqp_ctx_load_default_library(eqp_ctx *ctx)
{
  if (!ctx) return EQP_E_ARG;
  if (ctx->default_loaded) return EQP_OK;
  /* the rounds of a load that leaves files out fail on the way: a load
  ** that succeeds leaves the context's last error as it found it */
  char msg[EQPI_ERRLEN];
  int code = ctx->errcode;
  memcpy(msg, ctx->errmsg, sizeof msg);
  int rc = load_library(ctx, NULL);
  if (rc == EQP_OK) {
    ctx->errcode = code;
    memcpy(ctx->errmsg, msg, sizeof msg);
  }
  return rc;
}

int eqp_ctx_check_species_file(eqp_ctx *ctx, const char *path, size_t *nspecies)
{
  if (!ctx || !path) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  if (nspecies) *nspecies = 0;
  int rc = ctx->default_loaded ? eqp_ctx_load_species_file(ctx, path) : load_library(ctx, path);
  if (rc < 0) return rc;
  if (nspecies)
    for (int i = 0; i < ctx->db->nsp; i++) *nspecies += strcmp(ctx->db->sp[i].file, path) == 0;
  /* warnings, not errors: a metal complex's log K depends on the medium */
  const eqpi_db *db = ctx->db;
  for (int i = 0; i < db->nrx; i++) {
    const eqpi_reaction *r = &db->rx[i];
    if (r->file && strcmp(r->file, path) == 0 && !r->measured.given &&
        eqpi_reaction_metal_ligand(db, r))
      notice(ctx, "%s:%d: log K of %s has no conditions (measured = { I =, t = })", r->file,
             r->line, db->sp[r->product].name);
  }
  return EQP_OK;
}

size_t eqp_ctx_notice_count(const eqp_ctx *ctx) { return ctx ? (size_t)ctx->nnotices : 0; }

const char *eqp_ctx_notice(const eqp_ctx *ctx, size_t i)
{
  return ctx && i < (size_t)ctx->nnotices ? ctx->notices[i] : NULL;
}
