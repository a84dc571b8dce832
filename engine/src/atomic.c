/* Output files written whole or not at all: temporary file, then rename. */
/* SPDX-License-Identifier: MIT */
#include "atomic_impl.h"
#include <errno.h>
#include <fcntl.h>
#include <string.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

/* A new temporary file beside path; its name goes to tmp. */
static int open_temp(const char *path, char *tmp, size_t len)
{
  const char *slash = strrchr(path, '/');
  int dirlen = slash ? (int)(slash - path) + 1 : 0;
  const char *base = slash ? slash + 1 : path;
  static unsigned counter;
  for (int attempt = 0; attempt < 100; attempt++) {
    unsigned tag = (unsigned)time(NULL) ^ (unsigned)clock() ^ (++counter * 2654435761u);
    if (snprintf(tmp, len, "%.*s.%s.%ld-%08x.tmp", dirlen, path, base, (long)getpid(), tag) >=
        (int)len) {
      errno = ENAMETOOLONG;
      return -1;
    }
    int fd = open(tmp, O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0666);
    if (fd >= 0 || errno != EEXIST) return fd;
  }
  return -1;
}

static int fail_write(eqp_ctx *ctx, const char *path, int err)
{
  return eqpi_fail(ctx, EQP_E_WRITE, "cannot write '%s': %s", path, strerror(err));
}

int eqpi_write_atomic(eqp_ctx *ctx, const char *path, eqpi_fill_fn fill, void *ud)
{
  if (!path || !*path || path[strlen(path) - 1] == '/')
    return eqpi_fail(ctx, EQP_E_ARG, "cannot write '%s': not a file name", path ? path : "");
  struct stat old;
  int exists = stat(path, &old) == 0;
  if (exists && !S_ISREG(old.st_mode))
    return eqpi_fail(ctx, EQP_E_WRITE, "cannot write '%s': not a regular file", path);
  char tmp[4096 + 64];
  int fd = open_temp(path, tmp, sizeof tmp);
  if (fd < 0) return fail_write(ctx, path, errno);
  if (exists) (void)fchmod(fd, old.st_mode & 07777);
  FILE *f = fdopen(fd, "w");
  if (!f) {
    int err = errno;
    close(fd);
    unlink(tmp);
    return fail_write(ctx, path, err);
  }
  errno = 0;
  int rc = fill(ud, f), err = 0;
  if (ferror(f)) err = errno ? errno : EIO;       /* the stream failed: say why */
  else if (rc == EQP_OK && fflush(f) != 0) err = errno ? errno : EIO;
  else if (rc == EQP_OK && fsync(fd) != 0 && errno != EINVAL) err = errno;
  if (fclose(f) != 0 && !err && rc == EQP_OK) err = errno ? errno : EIO;
  if (rc == EQP_OK && !err && rename(tmp, path) != 0) err = errno;
  if (rc == EQP_OK && !err) return EQP_OK;
  unlink(tmp);
  return err ? fail_write(ctx, path, err) : rc;
}

typedef struct bytes { const char *data; size_t len; } bytes;

static int fill_bytes(void *ud, FILE *f)
{
  const bytes *b = ud;
  return fwrite(b->data, 1, b->len, f) == b->len ? EQP_OK : EQP_E_WRITE;
}

int eqpi_write_file_atomic(eqp_ctx *ctx, const char *path, const char *data, size_t len)
{
  bytes b = {data, len};
  return eqpi_write_atomic(ctx, path, fill_bytes, &b);
}
