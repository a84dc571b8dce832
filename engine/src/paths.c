/* Where the engine finds things. The environment is read in one place, and
** only when a program asks for the default configuration. The plugins and
** species that come with the library are found beside the library's own
** file at run time, by the layout of an install (the build tree mirrors
** it), so that no path is compiled in and an install can move. */
/* SPDX-License-Identifier: MIT */
#define _GNU_SOURCE 1   /* dladdr */
#include "eqp_impl.h"
#include <dlfcn.h>
#include <limits.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* The install layout, relative (CMakeLists.txt): from the library's folder
** to the plugins and to the species, and from the programs' folder to the
** library's, for a program that has the engine linked in statically. */
#ifndef EQP_PLUGINS_FROM_LIBDIR
#define EQP_PLUGINS_FROM_LIBDIR "equipoise/plugins"
#endif
#ifndef EQP_SPECIES_FROM_LIBDIR
#define EQP_SPECIES_FROM_LIBDIR "../share/equipoise/species"
#endif
#ifndef EQP_LIBDIR_FROM_BINDIR
#define EQP_LIBDIR_FROM_BINDIR "../lib"
#endif

static int set_str(eqp_ctx *ctx, char **slot, const char *v)
{
  char *d = v && *v ? eqpi_strdup(ctx, v) : NULL;
  if (v && *v && !d) return -1;
  eqpi_strfree(ctx, *slot);
  *slot = d;
  return 0;
}

int eqp_ctx_default_config(eqp_ctx *ctx)
{
  if (!ctx) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  char user[4096] = "";
  const char *xdg = getenv("XDG_DATA_HOME"), *home = getenv("HOME");
  if (xdg && *xdg) snprintf(user, sizeof user, "%s/equipoise/species", xdg);
  else if (home && *home) snprintf(user, sizeof user, "%s/.local/share/equipoise/species", home);
  if (set_str(ctx, &ctx->env_species_path, getenv("EQUIPOISE_SPECIES_PATH")) < 0 ||
      set_str(ctx, &ctx->env_plugin_path, getenv("EQUIPOISE_PLUGIN_PATH")) < 0 ||
      set_str(ctx, &ctx->user_species_dir, user) < 0)
    return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  eqpi_log(ctx, EQP_LOG_DEBUG, "configuration: EQUIPOISE_SPECIES_PATH %s, "
           "EQUIPOISE_PLUGIN_PATH %s, user species folder %s",
           ctx->env_species_path ? ctx->env_species_path : "(unset)",
           ctx->env_plugin_path ? ctx->env_plugin_path : "(unset)",
           ctx->user_species_dir ? ctx->user_species_dir : "(none)");
  return EQP_OK;
}

void eqpi_config_free(eqp_ctx *ctx)
{
  eqpi_strfree(ctx, ctx->env_species_path);
  eqpi_strfree(ctx, ctx->env_plugin_path);
  eqpi_strfree(ctx, ctx->user_species_dir);
  ctx->env_species_path = ctx->env_plugin_path = ctx->user_species_dir = NULL;
}

/* The folder of the library's own file. When the engine is linked into a
** program, that file is the program, and the library's folder is where
** the layout puts it relative to the programs' folder. */
static int own_libdir(char *buf, size_t len)
{
  Dl_info info;
  char self[PATH_MAX], exe[PATH_MAX];
  if (!dladdr((void *)(size_t)eqp_version, &info) || !info.dli_fname ||
      !realpath(info.dli_fname, self)) {
    if (!realpath("/proc/self/exe", self)) return -1;
  }
  int in_program = realpath("/proc/self/exe", exe) && strcmp(self, exe) == 0;
  char *slash = strrchr(self, '/');
  if (!slash) return -1;
  *slash = '\0';
  int n = in_program ? snprintf(buf, len, "%s/%s", self, EQP_LIBDIR_FROM_BINDIR)
                     : snprintf(buf, len, "%s", self);
  return n > 0 && (size_t)n < len ? 0 : -1;
}

int eqpi_builtin_dir(int which, char *buf, size_t len)
{
  char lib[PATH_MAX], dir[PATH_MAX + 64], real[PATH_MAX];
  if (own_libdir(lib, sizeof lib) < 0) return -1;
  snprintf(dir, sizeof dir, "%s/%s", lib,
           which == EQPI_DIR_PLUGINS ? EQP_PLUGINS_FROM_LIBDIR : EQP_SPECIES_FROM_LIBDIR);
  /* messages name the folder without the "lib/../" of the layout */
  int n = snprintf(buf, len, "%s", realpath(dir, real) ? real : dir);
  return n > 0 && (size_t)n < len ? 0 : -1;
}
