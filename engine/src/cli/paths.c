/* Which files a sandboxed script may read and write: reading from the
** script's folder, the working folder and the species folders; writing in
** the working folder and the folders named with --allow-write. Paths are
** resolved (symbolic links and "..") before they are judged. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include "../eqp_impl.h"
#include <errno.h>
#include <limits.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>
#include <unistd.h>

static void add_root(char (*roots)[4096], int *n, int max, const char *dir)
{
  char real[PATH_MAX];
  if (!dir || !*dir || *n >= max || !realpath(dir, real)) return;
  for (int i = 0; i < *n; i++)
    if (strcmp(roots[i], real) == 0) return;
  snprintf(roots[(*n)++], 4096, "%s", real);
}

void cli_paths_init(cli_state *st)
{
  const cli_run *run = st->run;
  int maxr = (int)(sizeof st->read_roots / sizeof st->read_roots[0]);
  int maxw = (int)(sizeof st->write_roots / sizeof st->write_roots[0]);
  char user[4096] = "";
  const char *xdg = getenv("XDG_DATA_HOME"), *home = getenv("HOME");
  if (xdg && *xdg) snprintf(user, sizeof user, "%s/equipoise/species", xdg);
  else if (home && *home) snprintf(user, sizeof user, "%s/.local/share/equipoise/species", home);
  add_root(st->read_roots, &st->nread, maxr, st->script_dir);
  add_root(st->read_roots, &st->nread, maxr, ".");
  const char *env = getenv("EQUIPOISE_SPECIES_PATH");   /* colon-separated */
  char buf[8192], *save = NULL;
  snprintf(buf, sizeof buf, "%s", env ? env : "");
  for (char *d = strtok_r(buf, ":", &save); d; d = strtok_r(NULL, ":", &save))
    add_root(st->read_roots, &st->nread, maxr, d);
  add_root(st->read_roots, &st->nread, maxr, user);
  char builtin[4096];   /* the library's own species, found beside it */
  if (eqpi_builtin_dir(EQPI_DIR_SPECIES, builtin, sizeof builtin) == 0)
    add_root(st->read_roots, &st->nread, maxr, builtin);
  add_root(st->write_roots, &st->nwrite, maxw, ".");
  for (int i = 0; i < run->nwrite_dirs; i++) {
    add_root(st->write_roots, &st->nwrite, maxw, run->write_dirs[i]);
    add_root(st->read_roots, &st->nread, maxr, run->write_dirs[i]);
  }
}

int cli_path_inside(const char *path, const char *root)
{
  size_t n = strlen(root);
  if (n == 1 && root[0] == '/') return path[0] == '/';
  return strncmp(path, root, n) == 0 && (path[n] == '\0' || path[n] == '/');
}

static int inside_any(const char *path, char (*roots)[4096], int n)
{
  for (int i = 0; i < n; i++)
    if (cli_path_inside(path, roots[i])) return 1;
  return 0;
}

/* A file to write: its folder must exist and resolve inside a write root;
** the name itself may not be "." or "..". */
static int resolve_write(const char *path, char *out, size_t len)
{
  const char *slash = strrchr(path, '/');
  const char *base = slash ? slash + 1 : path;
  char dir[PATH_MAX], real[PATH_MAX];
  if (slash == path) snprintf(dir, sizeof dir, "/");
  else if (slash) snprintf(dir, sizeof dir, "%.*s", (int)(slash - path), path);
  else snprintf(dir, sizeof dir, ".");
  if (!*base || strcmp(base, ".") == 0 || strcmp(base, "..") == 0) return -1;
  if (!realpath(dir, real)) return -2;
  snprintf(out, len, "%s/%s", strcmp(real, "/") == 0 ? "" : real, base);
  return 0;
}

static const char *list(char (*roots)[4096], int n, char *buf, size_t len)
{
  size_t used = 0;
  buf[0] = '\0';
  for (int i = 0; i < n && used < len; i++)
    used += (size_t)snprintf(buf + used, len - used, "%s%s", i ? ", " : "", roots[i]);
  return buf;
}

/* What a sandboxed script may write: output files only, so that it cannot
** replace a shell's start-up file, a script or a species file. */
static const char *const output_types[] = {".csv", ".json", ".jsonl", ".svg", ".png", ".pdf",
                                           ".html", ".txt", NULL};

static int output_name(const char *path)
{
  const char *slash = strrchr(path, '/');
  const char *base = slash ? slash + 1 : path;
  const char *dot = strrchr(base, '.');
  if (base[0] == '.' || !dot || dot == base) return 0;
  for (int i = 0; output_types[i]; i++)
    if (strcasecmp(dot, output_types[i]) == 0) return 1;
  return 0;
}

int cli_path_check(lua_State *L)
{
  cli_state *st = cli_current;
  const char *path = luaL_checkstring(L, 1);
  int write = luaL_checkstring(L, 2)[0] == 'w';
  char real[PATH_MAX + 8], roots[2048];
  if (write) {
    int rc = resolve_write(path, real, sizeof real);
    if (rc == -1) return cli_refuse(L, "cannot write '%s': not a file name", path);
    if (!output_name(path))
      return cli_refuse(L, "cannot write '%s': a script writes only output files (.csv, .json, "
                        ".jsonl, .svg, .png, .pdf, .html, .txt) and no hidden files; run a "
                        "script you trust with --trusted", path);
    if (rc == -2) {   /* no such folder: let the writer say so */
      lua_settop(L, 1);
      return 1;
    }
    if (!inside_any(real, st->write_roots, st->nwrite))
      return cli_refuse(L, "'%s' is outside the folders a script may write (%s): name its folder "
                        "with --allow-write DIR, or run a script you trust with --trusted", path,
                        list(st->write_roots, st->nwrite, roots, sizeof roots));
  } else {
    if (!realpath(path, real)) {   /* missing: the reader says so */
      lua_settop(L, 1);
      return 1;
    }
    if (!inside_any(real, st->read_roots, st->nread))
      return cli_refuse(L, "'%s' is outside the folders a script may read (%s): copy it beside "
                        "the script or into a species folder, or run a script you trust with "
                        "--trusted", path, list(st->read_roots, st->nread, roots, sizeof roots));
  }
  lua_pushstring(L, real);
  return 1;
}
