/* Plugin loading: search path, dlopen, ABI checks, activity-model instances. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <ctype.h>
#include <dirent.h>
#include <dlfcn.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

/* A dlclose'd module loses its symbols in AddressSanitizer's leak reports:
** under the sanitizer, plugins stay mapped for the life of the process. */
#if defined(__SANITIZE_ADDRESS__)
#define KEEP_PLUGINS 1
#elif defined(__has_feature)
#if __has_feature(address_sanitizer)
#define KEEP_PLUGINS 1
#endif
#endif
#ifndef KEEP_PLUGINS
#define KEEP_PLUGINS 0
#endif

/* The context whose call into a plugin is running: the 1.0 log function
** has no user-data pointer, so its lines reach the right log through this. */
static _Thread_local eqp_ctx *calling;

static void *host_alloc(size_t n) { return malloc(n ? n : 1); }
static void host_free(void *p) { free(p); }
static void host_log(const char *msg) { eqpi_log(calling, EQP_LOG_INFO, "plugin: %s", msg); }

/* 1.1: the context itself is the user data */
static void *host_ctx_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  eqp_ctx *ctx = ud;
  return ctx->alloc(ctx->ud, ptr, osize, nsize);
}

static void host_ctx_log(void *ud, int level, const char *msg)
{
  if (level < EQP_LOG_ERROR) level = EQP_LOG_ERROR;
  eqpi_log(ud, level, "plugin: %s", msg);
}

const eqp_host_api eqpi_host_template = {
  .abi_version = EQP_PLUGIN_ABI_VERSION, .struct_size = sizeof(eqp_host_api),
  .alloc = host_alloc, .free = host_free, .log = host_log,
  .ud = NULL, .ctx_alloc = host_ctx_alloc, .ctx_log = host_ctx_log,
};

/* The 1.0 sizes are frozen: a member inserted before the end of 1.0 would
** move them and refuse, or misread, every plugin built before it. */
#if UINTPTR_MAX == 0xffffffffffffffffu
_Static_assert(EQP_HOST_API_SIZE_1_0 == 32, "eqp_host_api 1.0 is 32 bytes on LP64");
_Static_assert(EQP_PLUGIN_DESC_SIZE_1_0 == 56, "eqp_plugin_desc 1.0 is 56 bytes on LP64");
_Static_assert(EQP_ACTIVITY_OPS_REQUIRED == 32, "required operations are 32 bytes on LP64");
_Static_assert(EQP_ACTIVITY_OPS_SIZE_1_0 == 48, "eqp_activity_ops 1.0 is 48 bytes on LP64");
#endif

int eqpi_plugin_check(const eqp_plugin_desc *d, const char *path, char *err, size_t len)
{
  if (!d) {
    snprintf(err, len, "%s: entry returned no descriptor", path);
    return -1;
  }
  if (d->abi_version >> 16 != EQP_PLUGIN_ABI_MAJOR) {
    snprintf(err, len, "%s: plugin ABI %u.%u, this engine needs %u.x", path,
             d->abi_version >> 16, d->abi_version & 0xffffu, EQP_PLUGIN_ABI_MAJOR);
    return -1;
  }
  if (d->struct_size < EQP_PLUGIN_DESC_SIZE_1_0) {
    snprintf(err, len, "%s: descriptor is %u bytes, ABI %u needs at least %zu", path,
             d->struct_size, EQP_PLUGIN_ABI_MAJOR, EQP_PLUGIN_DESC_SIZE_1_0);
    return -1;
  }
  if (d->sizes != EQP_PLUGIN_SIZES) {
    snprintf(err, len, "%s: built with number sizes 0x%x, engine has 0x%x", path, d->sizes,
             (unsigned)EQP_PLUGIN_SIZES);
    return -1;
  }
  if (d->kind != EQP_PLUGIN_ACTIVITY) {
    snprintf(err, len, "%s: unknown plugin kind %u", path, d->kind);
    return -1;
  }
  if (!d->name || !d->version || !d->summary || !d->ops) {
    snprintf(err, len, "%s: descriptor lacks a name, version, summary or operations", path);
    return -1;
  }
  const eqp_activity_ops *o = d->ops;
  if (o->struct_size < EQP_ACTIVITY_OPS_REQUIRED || !o->create || !o->destroy ||
      !o->log_gamma) {
    snprintf(err, len, "%s: activity operations incomplete (size %u, need %zu)", path,
             o->struct_size, EQP_ACTIVITY_OPS_REQUIRED);
    return -1;
  }
  return 0;
}

/* The message a plugin wrote into buf (len bytes). The ABI asks for a
** terminated string; one that fills the buffer is cut at its end rather
** than read beyond it. */
static const char *plugin_text(char *buf, size_t len, const char *none)
{
  if (!len) return none;
  buf[len - 1] = '\0';
  return buf[0] ? buf : none;
}

/* Open path and check what it exports; on success *dl and *desc are set. */
static int plugin_dlopen(eqp_ctx *ctx, const char *path, void **dl, const eqp_plugin_desc **desc,
                         char *err, size_t len)
{
  void *h = dlopen(path, RTLD_NOW | RTLD_LOCAL);
  if (!h) {
    snprintf(err, len, "%s: cannot load: %s", path, dlerror());
    return -1;
  }
  eqp_plugin_entry_fn entry;
  *(void **)&entry = dlsym(h, EQP_PLUGIN_ENTRY);
  if (!entry) {
    snprintf(err, len, "%s: does not export %s()", path, EQP_PLUGIN_ENTRY);
    dlclose(h);
    return -1;
  }
  char perr[256] = "";
  eqp_ctx *prev = calling;
  calling = ctx;
  const eqp_plugin_desc *d = entry(&ctx->host, perr, sizeof perr);
  calling = prev;
  if (!d) {
    snprintf(err, len, "%s: plugin refused to load: %s", path,
             plugin_text(perr, sizeof perr, "no reason"));
    dlclose(h);
    return -1;
  }
  if (eqpi_plugin_check(d, path, err, len) < 0) {
    dlclose(h);
    return -1;
  }
  *dl = h;
  *desc = d;
  return 0;
}

static int is_file(const char *p)
{
  struct stat sb;
  return stat(p, &sb) == 0 && S_ISREG(sb.st_mode);
}

/* Call f(ud, dir) for each folder of the search path, in order; stop when f
** returns non-zero. */
static int each_dir(eqp_ctx *ctx, int (*f)(void *, const char *), void *ud)
{
  for (int i = 0; i < ctx->nplugin_dirs; i++)
    if (f(ud, ctx->plugin_dirs[i])) return 1;
  const char *env = ctx->env_plugin_path;   /* eqp_ctx_default_config */
  if (env) {
    char buf[4096];
    snprintf(buf, sizeof buf, "%s", env);
    char *save = NULL;
    for (char *d = strtok_r(buf, ":", &save); d; d = strtok_r(NULL, ":", &save))
      if (*d && f(ud, d)) return 1;
  }
  char builtin[4096];
  if (eqpi_builtin_dir(EQPI_DIR_PLUGINS, builtin, sizeof builtin) == 0 && f(ud, builtin))
    return 1;
  return 0;
}

typedef struct finder {
  const char *name;
  char path[4096];
  char tried[1024];
  size_t used;
} finder;

static int find_in(void *ud, const char *dir)
{
  finder *fd = ud;
  snprintf(fd->path, sizeof fd->path, "%s/%s.so", dir, fd->name);
  if (is_file(fd->path)) return 1;
  if (fd->used < sizeof fd->tried)
    fd->used += (size_t)snprintf(fd->tried + fd->used, sizeof fd->tried - fd->used, "%s%s",
                                 fd->used ? ", " : "", dir);
  return 0;
}

static size_t min_size(size_t a, size_t b) { return a < b ? a : b; }

static void copy_desc(const eqp_plugin_desc *d, eqpi_plugin_copy *c)
{
  memset(c, 0, sizeof *c);
  memcpy(&c->desc, d, min_size(d->struct_size, sizeof c->desc));
  const eqp_activity_ops *o = d->ops;
  memcpy(&c->ops, o, min_size(o->struct_size, sizeof c->ops));
  c->desc.struct_size = sizeof c->desc;
  c->ops.struct_size = sizeof c->ops;
  c->desc.ops = &c->ops;
}

static int registry_get(eqp_ctx *ctx, const char *name, eqpi_plugin_handle **out)
{
  for (int i = 0; i < ctx->nplugins; i++)
    if (strcmp(ctx->plugins[i].name, name) == 0) {
      *out = &ctx->plugins[i];
      return EQP_OK;
    }
  for (const char *p = name; *p; p++)
    if (!isalnum((unsigned char)*p) && *p != '_' && *p != '-')
      return eqpi_fail(ctx, EQP_E_PLUGIN, "'%s' is not a plugin name (letters, digits, _ -)",
                       name);
  if (!*name) return eqpi_fail(ctx, EQP_E_PLUGIN, "empty plugin name");
  finder fd = {name, "", "", 0};
  if (!each_dir(ctx, find_in, &fd))
    return eqpi_fail(ctx, EQP_E_PLUGIN, "no activity model '%s': %s.so not found in %s "
                     "(see 'equipoise plugins'; EQUIPOISE_PLUGIN_PATH adds folders)",
                     name, name, fd.used ? fd.tried : "an empty search path");
  void *dl;
  const eqp_plugin_desc *d;
  char err[EQPI_ERRLEN];
  if (plugin_dlopen(ctx, fd.path, &dl, &d, err, sizeof err) < 0)
    return eqpi_fail(ctx, EQP_E_PLUGIN, "%s", err);
  if (strcmp(d->name, name) != 0) {
    /* the message quotes the plugin's own name: write it while the module
    ** is still mapped */
    int rc = eqpi_fail(ctx, EQP_E_PLUGIN, "%s: file is named '%s' but the plugin calls itself "
                       "'%.64s'; a plugin is loaded under its own name (rename the file to "
                       "%.64s.so)", fd.path, name, d->name, d->name);
    dlclose(dl);
    return rc;
  }
  if (eqpi_grow(ctx, &ctx->plugins, &ctx->capplugins, ctx->nplugins + 1,
                sizeof *ctx->plugins) < 0) {
    dlclose(dl);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  eqpi_plugin_handle *h = &ctx->plugins[ctx->nplugins];
  h->name = eqpi_strdup(ctx, name);
  h->path = eqpi_strdup(ctx, fd.path);
  if (!h->name || !h->path) {
    eqpi_strfree(ctx, h->name);
    eqpi_strfree(ctx, h->path);
    dlclose(dl);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  /* the host reads its own full-size copies: a 1.0 plugin's missing tail
  ** reads as NULL, a newer plugin's unknown tail is left behind */
  h->copy = eqpi_malloc(ctx, sizeof *h->copy);
  if (!h->copy) {
    eqpi_strfree(ctx, h->name);
    eqpi_strfree(ctx, h->path);
    dlclose(dl);
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  copy_desc(d, h->copy);
  h->dl = dl;
  h->desc = &h->copy->desc;
  ctx->nplugins++;
  *out = h;
  return EQP_OK;
}

int eqpi_model_open(eqp_ctx *ctx, const char *name, eqpi_model *out)
{
  eqpi_plugin_handle *h;
  memset(out, 0, sizeof *out);
  int rc = registry_get(ctx, name, &h);
  if (rc < 0) return rc;
  const eqp_activity_ops *ops = &h->copy->ops;
  char err[256] = "";
  void *state = NULL;
  eqp_ctx *prev = calling;
  calling = ctx;
  int failed = ops->create(&ctx->host, &state, err, sizeof err) != 0;
  calling = prev;
  if (failed)
    return eqpi_fail(ctx, EQP_E_PLUGIN, "activity model '%s' (%s): %s", name, h->path,
                     plugin_text(err, sizeof err, "create failed"));
  out->desc = h->desc;
  out->ops = ops;
  out->state = state;
  out->handle = h->dl;
  out->path = h->path;
  out->ctx = ctx;
  return EQP_OK;
}

/* The calls into a model that return a message: each message is bounded
** by its buffer whatever the plugin wrote. */
int eqpi_model_set_param(eqpi_model *m, const char *name, double value, char *err, size_t len)
{
  if (len) err[0] = '\0';
  if (!EQP_PLUGIN_HAS_OP(m->ops, set_param)) {
    snprintf(err, len, "the model takes no parameters");
    return -1;
  }
  eqp_ctx *prev = calling;
  calling = m->ctx;
  int rc = m->ops->set_param(m->state, name, value, err, len);
  calling = prev;
  plugin_text(err, len, "");
  return rc;
}

int eqpi_model_bind(eqpi_model *m, const eqp_species_info *info, char *warn, size_t wlen,
                    char *err, size_t elen)
{
  const eqp_activity_ops *ops = m->ops;
  if (wlen) warn[0] = '\0';
  if (elen) err[0] = '\0';
  if (!EQP_PLUGIN_HAS_OP(ops, bind)) return 0;
  eqp_ctx *prev = calling;
  calling = m->ctx;
  int rc = ops->bind(m->state, info, warn, wlen, err, elen);
  calling = prev;
  plugin_text(warn, wlen, "");
  plugin_text(err, elen, "");
  return rc;
}

int eqpi_model_log_gamma(eqpi_model *m, const eqp_activity_in *in, double *lg, char *err,
                         size_t len)
{
  if (len) err[0] = '\0';
  eqp_ctx *prev = calling;
  calling = m->ctx;
  int rc = m->ops->log_gamma(m->state, in, lg, err, len);
  calling = prev;
  plugin_text(err, len, "");
  return rc;
}

/* The optional derivative operations of ABI 1.2, read only where the
** plugin's operations table is large enough to hold them. */
int eqpi_model_derivs(const eqpi_model *m)
{
  if (EQP_PLUGIN_HAS_OP(m->ops, dlog_gamma_dI)) return EQPI_DERIV_I;
  if (EQP_PLUGIN_HAS_OP(m->ops, log_gamma_tangent)) return EQPI_DERIV_TANGENT;
  return EQPI_DERIV_NONE;
}

int eqpi_model_dlog_gamma_dI(eqpi_model *m, const eqp_activity_in *in, double *dlg, char *err,
                             size_t len)
{
  if (len) err[0] = '\0';
  int rc = m->ops->dlog_gamma_dI(m->state, in, dlg, err, len);
  plugin_text(err, len, "");
  return rc;
}

int eqpi_model_tangent(eqpi_model *m, const eqp_activity_in *in, const double *dm, double dI,
                       double *dlg, char *err, size_t len)
{
  if (len) err[0] = '\0';
  int rc = m->ops->log_gamma_tangent(m->state, in, dm, dI, dlg, err, len);
  plugin_text(err, len, "");
  return rc;
}

void eqpi_model_close(eqp_ctx *ctx, eqpi_model *m)
{
  if (m && m->ops) {
    eqp_ctx *prev = calling;
    calling = ctx;
    m->ops->destroy(&ctx->host, m->state);
    calling = prev;
  }
  if (m) memset(m, 0, sizeof *m);
}

void eqpi_plugins_free(eqp_ctx *ctx)
{
  for (int i = 0; i < ctx->nplugins; i++) {
    if (!KEEP_PLUGINS) dlclose(ctx->plugins[i].dl);
    eqpi_strfree(ctx, ctx->plugins[i].name);
    eqpi_strfree(ctx, ctx->plugins[i].path);
    eqpi_free(ctx, ctx->plugins[i].copy, sizeof *ctx->plugins[i].copy);
  }
  eqpi_free(ctx, ctx->plugins, sizeof *ctx->plugins * (size_t)ctx->capplugins);
  ctx->plugins = NULL;
  ctx->nplugins = ctx->capplugins = 0;
}

typedef struct lister {
  eqp_ctx *ctx;
  eqp_plugin_list_fn fn;
  void *ud;
  char seen[64][64];
  int nseen;
} lister;

static int cmp_name(const void *a, const void *b) { return strcmp(a, b); }

static int list_in(void *ud, const char *dir)
{
  lister *ls = ud;
  DIR *d = opendir(dir);
  if (!d) return 0;
  char files[64][64];
  int nf = 0;
  struct dirent *e;
  while ((e = readdir(d)) && nf < 64) {
    size_t l = strlen(e->d_name);
    if (l >= 4 && l < 64 && strcmp(e->d_name + l - 3, ".so") == 0)
      memcpy(files[nf++], e->d_name, l + 1);
  }
  closedir(d);
  qsort(files, (size_t)nf, sizeof files[0], cmp_name);
  for (int f = 0; f < nf; f++) {
    size_t l = strlen(files[f]);
    char name[64];
    snprintf(name, sizeof name, "%.*s", (int)(l - 3), files[f]);
    int dup = 0;
    for (int i = 0; i < ls->nseen; i++) dup |= strcmp(ls->seen[i], name) == 0;
    if (dup) continue;   /* an earlier folder wins, as when loading */
    if (ls->nseen < 64) snprintf(ls->seen[ls->nseen++], 64, "%s", name);
    char path[4096], err[EQPI_ERRLEN];
    snprintf(path, sizeof path, "%s/%s", dir, files[f]);
    void *dl;
    const eqp_plugin_desc *desc;
    if (plugin_dlopen(ls->ctx, path, &dl, &desc, err, sizeof err) < 0) {
      ls->fn(ls->ud, NULL, NULL, err, path);
      continue;
    }
    ls->fn(ls->ud, desc->name, desc->version, desc->summary, path);
    dlclose(dl);
  }
  return 0;
}

int eqp_ctx_list_plugins(eqp_ctx *ctx, eqp_plugin_list_fn fn, void *ud)
{
  if (!ctx || !fn) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  lister *ls = eqpi_calloc(ctx, 1, sizeof *ls);
  if (!ls) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  ls->ctx = ctx;
  ls->fn = fn;
  ls->ud = ud;
  each_dir(ctx, list_in, ls);
  eqpi_free(ctx, ls, sizeof *ls);
  return EQP_OK;
}
