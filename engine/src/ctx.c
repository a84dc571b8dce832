/* The context: allocator, error message, loading species files and
** folders (the library and its path are in library.c), plugin path. */
/* SPDX-License-Identifier: MIT */
#include <errno.h>
#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>
#include "stage_impl.h"
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static void *default_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  if (nsize == 0) {
    free(ptr);
    return NULL;
  }
  return realloc(ptr, nsize);
}

eqp_ctx *eqp_ctx_new(eqp_alloc_fn alloc, void *ud)
{
  if (!alloc) alloc = default_alloc;
  eqp_ctx *ctx = alloc(ud, NULL, 0, sizeof *ctx);
  if (!ctx) return NULL;
  memset(ctx, 0, sizeof *ctx);
  ctx->alloc = alloc;
  ctx->ud = ud;
  ctx->db.h_plus = ctx->db.water = -1;
  ctx->host = eqpi_host_template;
  ctx->host.ud = ctx;             /* the 1.1 host functions reach the context */
  return ctx;
}

void eqp_ctx_free(eqp_ctx *ctx)
{
  if (!ctx) return;
  eqpi_newton_pool_free(ctx);
  eqpi_tableau_cache_free(ctx);
  eqpi_plugins_free(ctx);
  for (int i = 0; i < ctx->nplugin_dirs; i++) eqpi_strfree(ctx, ctx->plugin_dirs[i]);
  eqpi_free(ctx, ctx->plugin_dirs, sizeof(char *) * (size_t)ctx->nplugin_dirs);
  eqpi_library_free(ctx);
  eqpi_config_free(ctx);
  eqpi_cautions_free(ctx);
  eqpi_db_free(ctx, &ctx->db);
  ctx->alloc(ctx->ud, ctx, sizeof *ctx, 0);
}

FILE *eqpi_fopen_regular(const char *path)
{
  /* without O_NONBLOCK, opening a FIFO waits for a writer: a hang */
  int fd = open(path, O_RDONLY | O_NONBLOCK | O_CLOEXEC);
  if (fd < 0) return NULL;
  struct stat st;
  if (fstat(fd, &st) < 0 || !S_ISREG(st.st_mode)) {
    close(fd);
    errno = EINVAL;
    return NULL;
  }
  int fl = fcntl(fd, F_GETFL);
  if (fl >= 0) fcntl(fd, F_SETFL, fl & ~O_NONBLOCK);
  FILE *f = fdopen(fd, "rb");
  if (!f) close(fd);
  return f;
}

int eqpi_read_file(eqp_ctx *ctx, const char *path, char **text, size_t *len, size_t *capp)
{
  FILE *f = eqpi_fopen_regular(path);
  if (!f)
    return eqpi_fail(ctx, EQP_E_IO, "%s: cannot open: %s", path,
                     errno == EINVAL ? "not a regular file" : strerror(errno));
  size_t cap = 8192, n = 0;
  char *buf = eqpi_malloc(ctx, cap);
  while (buf) {
    size_t got = fread(buf + n, 1, cap - n, f);
    n += got;
    if (n < cap) break;
    if (cap >= (64u << 20)) {
      eqpi_free(ctx, buf, cap);
      fclose(f);
      return eqpi_fail(ctx, EQP_E_DATA, "%s: larger than 64 MiB", path);
    }
    char *nb = eqpi_realloc(ctx, buf, cap, cap * 2);
    if (!nb) eqpi_free(ctx, buf, cap);
    buf = nb;
    cap *= 2;
  }
  int err = ferror(f);
  fclose(f);
  if (!buf) return eqpi_fail(ctx, EQP_E_NOMEM, "%s: out of memory", path);
  if (err) {
    eqpi_free(ctx, buf, cap);
    return eqpi_fail(ctx, EQP_E_IO, "%s: read error", path);
  }
  if (n >= 3 && memcmp(buf, "\xEF\xBB\xBF", 3) == 0) {   /* a UTF-8 byte-order mark */
    memmove(buf, buf + 3, n - 3);
    n -= 3;
  }
  *text = buf;
  *len = n;
  *capp = cap;     /* the caller frees with eqpi_free(ctx, text, cap) */
  return EQP_OK;
}

/* A file read for a load: its key and content hash, for the record of
** what is loaded. */
typedef struct src_id {
  char key[4096];
  unsigned long long hash;
} src_id;

/* Stage the file at path unless exactly this file is loaded already
** (then *skipped is set). */
static int stage_file(eqp_ctx *ctx, eqpi_stage *st, const char *path, src_id *id, int *skipped)
{
  char *text = NULL;
  size_t len = 0, cap = 0;
  *skipped = 0;
  int rc = eqpi_read_file(ctx, path, &text, &len, &cap);
  if (rc < 0) return rc;
  eqpi_file_key(path, id->key, sizeof id->key);
  id->hash = eqpi_hash_bytes(text, len, 0);
  if (eqpi_loaded_has(ctx, id->key, id->hash)) {
    *skipped = 1;
    eqpi_free(ctx, text, cap);
    return EQP_OK;
  }
  const char *p = eqpi_arena_strdup(ctx, &st->arena, path);
  if (p) {
    const char **slot = eqpi_stage_push(ctx, st, (void **)&st->files, &st->nfiles,
                                        &st->capfiles, sizeof *st->files);
    if (slot) *slot = p;
  }
  eqpi_load_text(ctx, st, text, len, path);
  eqpi_free(ctx, text, cap);
  return EQP_OK;
}

static int finish(eqp_ctx *ctx, eqpi_stage *st)
{
  int rc = eqpi_stage_commit(ctx, st);
  eqpi_stage_free(ctx, st);
  return rc;
}

int eqp_ctx_load_species_file(eqp_ctx *ctx, const char *path)
{
  if (!ctx || !path) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  eqpi_stage *st = eqpi_stage_new(ctx);
  if (!st) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  src_id id;
  int skipped, rc = stage_file(ctx, st, path, &id, &skipped);
  if (rc < 0 || skipped) {
    eqpi_stage_free(ctx, st);
    return rc;
  }
  rc = finish(ctx, st);
  if (rc == EQP_OK) eqpi_loaded_add(ctx, id.key, id.hash);
  return rc;
}

int eqp_ctx_load_species_text(eqp_ctx *ctx, const char *text, size_t len, const char *source)
{
  if (!ctx || !text || !source) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  unsigned long long hash = eqpi_hash_bytes(text, len, 0);
  if (eqpi_loaded_has(ctx, source, hash)) return EQP_OK;
  eqpi_stage *st = eqpi_stage_new(ctx);
  if (!st) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  eqpi_load_text(ctx, st, text, len, source);
  int rc = finish(ctx, st);
  if (rc == EQP_OK) eqpi_loaded_add(ctx, source, hash);
  return rc;
}

int eqp_ctx_load_species_dir(eqp_ctx *ctx, const char *dir)
{
  if (!ctx || !dir) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  char **names = NULL;
  int n = 0;
  int rc = eqpi_list_species_files(ctx, dir, &names, &n);
  if (rc < 0) return rc;
  eqpi_stage *st = eqpi_stage_new(ctx);
  src_id *ids = n ? eqpi_malloc(ctx, sizeof *ids * (size_t)n) : NULL;
  char *loaded = n ? eqpi_calloc(ctx, (size_t)n, 1) : NULL;
  rc = st && (!n || (ids && loaded)) ? EQP_OK : eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (int i = 0; i < n && rc == EQP_OK; i++) {
    char path[4096];
    int skipped = 0;
    if (snprintf(path, sizeof path, "%s/%s", dir, names[i]) >= (int)sizeof path)
      rc = eqpi_fail(ctx, EQP_E_IO, "%s/%s: path too long", dir, names[i]);
    else
      rc = stage_file(ctx, st, path, &ids[i], &skipped);
    loaded[i] = (char)(rc == EQP_OK && !skipped);
  }
  if (rc == EQP_OK) {
    rc = eqpi_stage_commit(ctx, st);
    for (int i = 0; i < n && rc == EQP_OK; i++)
      if (loaded[i]) eqpi_loaded_add(ctx, ids[i].key, ids[i].hash);
  }
  eqpi_stage_free(ctx, st);
  eqpi_free(ctx, ids, sizeof *ids * (size_t)n);
  eqpi_free(ctx, loaded, (size_t)n);
  eqpi_free_names(ctx, names, n);
  return rc;
}

int eqp_ctx_add_plugin_dir(eqp_ctx *ctx, const char *dir)
{
  if (!ctx || !dir) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  char **p = eqpi_realloc(ctx, ctx->plugin_dirs, sizeof(char *) * (size_t)ctx->nplugin_dirs,
                          sizeof(char *) * (size_t)(ctx->nplugin_dirs + 1));
  if (!p) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  ctx->plugin_dirs = p;
  memmove(p + 1, p, sizeof(char *) * (size_t)ctx->nplugin_dirs);
  p[0] = eqpi_strdup(ctx, dir);
  if (!p[0]) {
    memmove(p, p + 1, sizeof(char *) * (size_t)ctx->nplugin_dirs);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  ctx->nplugin_dirs++;
  return EQP_OK;
}
