/* The context: allocator, error message, species library, plugin path. */
/* SPDX-License-Identifier: MIT */
#include "stage_impl.h"
#include <dirent.h>
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#ifndef EQP_BUILD_SPECIES_DIR
#define EQP_BUILD_SPECIES_DIR ""
#endif
#ifndef EQP_INSTALL_SPECIES_DIR
#define EQP_INSTALL_SPECIES_DIR ""
#endif

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
  return ctx;
}

void eqp_ctx_free(eqp_ctx *ctx)
{
  if (!ctx) return;
  eqpi_plugins_free(ctx);
  for (int i = 0; i < ctx->nplugin_dirs; i++) eqpi_strfree(ctx, ctx->plugin_dirs[i]);
  eqpi_free(ctx, ctx->plugin_dirs, sizeof(char *) * (size_t)ctx->nplugin_dirs);
  eqpi_db_free(ctx, &ctx->db);
  ctx->alloc(ctx->ud, ctx, sizeof *ctx, 0);
}

/* Read a whole file through the context's allocator. */
static int read_file(eqp_ctx *ctx, const char *path, char **text, size_t *len,
                     size_t *capp)
{
  FILE *f = fopen(path, "rb");
  if (!f) return eqpi_fail(ctx, EQP_E_IO, "%s: cannot open: %s", path, strerror(errno));
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
  *text = buf;
  *len = n;
  *capp = cap;     /* the caller frees with eqpi_free(ctx, text, cap) */
  return EQP_OK;
}

static int stage_file(eqp_ctx *ctx, eqpi_stage *st, const char *path)
{
  char *text = NULL;
  size_t len = 0, cap = 0;
  int rc = read_file(ctx, path, &text, &len, &cap);
  if (rc < 0) return rc;
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
  int rc = stage_file(ctx, st, path);
  if (rc < 0) {
    eqpi_stage_free(ctx, st);
    return rc;
  }
  return finish(ctx, st);
}

int eqp_ctx_load_species_text(eqp_ctx *ctx, const char *text, size_t len, const char *source)
{
  if (!ctx || !text || !source) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  eqpi_stage *st = eqpi_stage_new(ctx);
  if (!st) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  eqpi_load_text(ctx, st, text, len, source);
  return finish(ctx, st);
}

static int cmp_str(const void *a, const void *b)
{
  return strcmp(*(char *const *)a, *(char *const *)b);
}

int eqp_ctx_load_species_dir(eqp_ctx *ctx, const char *dir)
{
  if (!ctx || !dir) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  DIR *d = opendir(dir);
  if (!d) return eqpi_fail(ctx, EQP_E_IO, "%s: cannot open folder: %s", dir, strerror(errno));
  char *names[512];
  int n = 0;
  struct dirent *e;
  while ((e = readdir(d)) && n < 512) {
    size_t l = strlen(e->d_name);
    if (l > 4 && strcmp(e->d_name + l - 4, ".lua") == 0 && e->d_name[0] != '.') {
      names[n] = eqpi_strdup(ctx, e->d_name);
      if (names[n]) n++;
    }
  }
  closedir(d);
  qsort(names, (size_t)n, sizeof *names, cmp_str);
  eqpi_stage *st = eqpi_stage_new(ctx);
  int rc = st ? EQP_OK : eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  for (int i = 0; i < n; i++) {
    if (rc == EQP_OK) {
      char path[4096];
      snprintf(path, sizeof path, "%s/%s", dir, names[i]);
      rc = stage_file(ctx, st, path);
    }
    eqpi_strfree(ctx, names[i]);
  }
  if (rc < 0) {
    eqpi_stage_free(ctx, st);
    return rc;
  }
  return finish(ctx, st);
}

static int is_dir(const char *p)
{
  struct stat sb;
  return p && *p && stat(p, &sb) == 0 && S_ISDIR(sb.st_mode);
}

int eqp_ctx_load_default_library(eqp_ctx *ctx)
{
  if (!ctx) return EQP_E_ARG;
  if (ctx->default_loaded) return EQP_OK;
  const char *env = getenv("EQUIPOISE_SPECIES_PATH");
  const char *dir = is_dir(env) ? env
                  : is_dir(EQP_BUILD_SPECIES_DIR) ? EQP_BUILD_SPECIES_DIR
                  : is_dir(EQP_INSTALL_SPECIES_DIR) ? EQP_INSTALL_SPECIES_DIR : NULL;
  if (env && *env && !is_dir(env))
    return eqpi_fail(ctx, EQP_E_IO, "EQUIPOISE_SPECIES_PATH: '%s' is not a folder", env);
  if (!dir) return eqpi_fail(ctx, EQP_E_IO, "no species library found (set EQUIPOISE_SPECIES_PATH)");
  int rc = eqp_ctx_load_species_dir(ctx, dir);
  if (rc < 0) return rc;
  ctx->default_loaded = true;
  char user[4096];
  const char *xdg = getenv("XDG_DATA_HOME"), *home = getenv("HOME");
  if (xdg && *xdg) snprintf(user, sizeof user, "%s/equipoise/species", xdg);
  else if (home && *home) snprintf(user, sizeof user, "%s/.local/share/equipoise/species", home);
  else user[0] = '\0';
  if (is_dir(user)) return eqp_ctx_load_species_dir(ctx, user);
  return EQP_OK;
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
