/* The context: allocator, error message, its species library (loading
** species files and folders into it; the library path is in library.c, the
** loads in stage.c), plugin path. */
/* SPDX-License-Identifier: MIT */
#include <errno.h>
#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>
#include "eqp_impl.h"
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
  ctx->host = eqpi_host_template;
  ctx->host.ud = ctx;             /* the 1.1 host functions reach the context */
  if (!(ctx->db = eqpi_db_new_empty(ctx))) {
    alloc(ud, ctx, sizeof *ctx, 0);
    return NULL;
  }
  return ctx;
}

void eqp_ctx_free(eqp_ctx *ctx)
{
  if (!ctx) return;
  eqpi_newton_pool_free(ctx);
  eqpi_result_spare_free(ctx);
  eqpi_tableau_cache_free(ctx);
  eqpi_plugins_free(ctx);
  for (int i = 0; i < ctx->nplugin_dirs; i++) eqpi_strfree(ctx, ctx->plugin_dirs[i]);
  eqpi_free(ctx, ctx->plugin_dirs, sizeof(char *) * (size_t)ctx->nplugin_dirs);
  eqpi_library_free(ctx);
  eqpi_config_free(ctx);
  eqpi_cautions_free(ctx);
  eqpi_db_release(ctx->db);
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
    if (eqpi_grow_size(ctx, &buf, &cap, cap + 1, 1) < 0) {
      eqpi_free(ctx, buf, cap);
      buf = NULL;
    }
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

/* A load onto the context's library: the library it made becomes the
** context's. */
static int into_ctx(eqp_ctx *ctx, int rc, eqpi_db **lib)
{
  if (rc == EQP_OK) eqpi_ctx_set_library(ctx, *lib);
  return rc;
}

int eqp_ctx_load_species_file(eqp_ctx *ctx, const char *path)
{
  if (!ctx || !path) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  eqpi_db *lib = NULL;
  return into_ctx(ctx, eqpi_load_file(ctx, ctx->db, path, &lib), &lib);
}

int eqp_ctx_load_species_text(eqp_ctx *ctx, const char *text, size_t len, const char *source)
{
  if (!ctx || !text || !source) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  eqpi_db *lib = NULL;
  return into_ctx(ctx, eqpi_load_text(ctx, ctx->db, text, len, source, &lib), &lib);
}

int eqp_ctx_load_species_dir(eqp_ctx *ctx, const char *dir)
{
  if (!ctx || !dir) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  eqpi_db *lib = NULL;
  return into_ctx(ctx, eqpi_load_dir(ctx, ctx->db, dir, &lib), &lib);
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
