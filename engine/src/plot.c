/* Figures: what a plot holds (lines, markers, bands, axes), checked as it is
** built, and its output to memory or, atomically, to a file. */
/* SPDX-License-Identifier: MIT */
#include "plot_impl.h"
#include "atomic_impl.h"
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>
#include <unistd.h>

/* Deep blue, orange, green, brick, orchid, brown, violet, slate: our own
** choice, checked for colour-vision deficiencies in tests/unit/test_plot.c. */
const unsigned char eqpi_palette[EQPI_PALETTE_SIZE][3] = {
  {0x03, 0x52, 0x83}, {0xf0, 0x8a, 0x00}, {0x2a, 0xa8, 0x72}, {0xb8, 0x26, 0x1a},
  {0xc0, 0x5c, 0xe0}, {0x6a, 0x4a, 0x3e}, {0x6f, 0x2a, 0xd8}, {0x8f, 0xa0, 0xa8},
};

int eqp_plot_new(eqp_ctx *ctx, eqp_plot **out)
{
  if (!ctx || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  *out = NULL;
  eqp_plot *p = eqpi_calloc(ctx, 1, sizeof *p);
  if (!p) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  p->ctx = ctx;
  p->width = 720;
  p->height = 480;
  for (int a = 0; a < 2; a++) p->axis[a].lo = p->axis[a].hi = NAN;
  *out = p;
  return EQP_OK;
}

void eqp_plot_free(eqp_plot *p)
{
  if (!p) return;
  for (int i = 0; i < p->nline; i++) {
    eqpi_free(p->ctx, p->line[i].x, sizeof(double) * p->line[i].n);
    eqpi_free(p->ctx, p->line[i].y, sizeof(double) * p->line[i].n);
  }
  eqpi_free(p->ctx, p, sizeof *p);
}

void eqp_free_buffer(void *p) { free(p); }

int eqp_name_display(const char *name, char *out, size_t len)
{
  if (!name || !out || !len || eqpi_name_pretty(name, out, len) != 0) return EQP_E_ARG;
  return EQP_OK;
}

/* Copy text that the renderer will draw: no control characters. */
static int copy_text(eqp_plot *p, char *dst, const char *src, const char *what)
{
  int breaks = strcmp(what, "title") == 0;   /* one line break in a title */
  if (!src) {
    dst[0] = '\0';
    return EQP_OK;
  }
  if (strlen(src) >= EQPI_PLOT_TEXT)
    return eqpi_fail(p->ctx, EQP_E_INPUT, "plot %s longer than %d bytes", what,
                     EQPI_PLOT_TEXT - 1);
  for (const unsigned char *c = (const unsigned char *)src; *c; c++)
    if (*c < 0x20 && !(*c == '\n' && breaks-- > 0))
      return eqpi_fail(p->ctx, EQP_E_INPUT, "plot %s has a control character%s", what,
                       *c == '\n' ? " (a title may break once)" : "");
  memcpy(dst, src, strlen(src) + 1);
  return EQP_OK;
}

int eqp_plot_set_title(eqp_plot *p, const char *title)
{
  if (!p) return EQP_E_ARG;
  return copy_text(p, p->title, title, "title");
}

int eqp_plot_set_axis(eqp_plot *p, int axis, const char *label, const char *unit, double lo,
                      double hi)
{
  if (!p) return EQP_E_ARG;
  if (axis != 0 && axis != 1) return eqpi_fail(p->ctx, EQP_E_ARG, "axis is 0 (x) or 1 (y)");
  if (isnan(lo) != isnan(hi) || isinf(lo) || isinf(hi) || (!isnan(lo) && !(lo < hi)))
    return eqpi_fail(p->ctx, EQP_E_INPUT, "axis range %g .. %g: two finite numbers, low first",
                     lo, hi);
  eqpi_axis *a = &p->axis[axis];
  int rc = copy_text(p, a->label, label, "axis label");
  if (rc == EQP_OK) rc = copy_text(p, a->unit, unit, "axis unit");
  a->lo = lo;
  a->hi = hi;
  return rc;
}

int eqp_plot_set_size(eqp_plot *p, int width, int height)
{
  if (!p) return EQP_E_ARG;
  if (width < 200 || width > 4000 || height < 150 || height > 4000)
    return eqpi_fail(p->ctx, EQP_E_INPUT, "plot size %d x %d outside 200..4000 x 150..4000",
                     width, height);
  p->width = width;
  p->height = height;
  return EQP_OK;
}

static int room(eqp_plot *p, int n)
{
  if (n >= EQPI_PLOT_MAX_ITEMS)
    return eqpi_fail(p->ctx, EQP_E_INPUT, "a plot holds at most %d of each kind of item",
                     EQPI_PLOT_MAX_ITEMS);
  return EQP_OK;
}

int eqp_plot_add_line(eqp_plot *p, const char *label, size_t n, const double *x, const double *y)
{
  if (!p || (n && (!x || !y))) return eqpi_fail(p ? p->ctx : NULL, EQP_E_ARG, "NULL argument");
  int rc = room(p, p->nline);
  if (rc < 0) return rc;
  if (n > 1000000) return eqpi_fail(p->ctx, EQP_E_INPUT, "a plotted line has at most 1e6 points");
  for (size_t i = 0; i < n; i++)
    if (isinf(x[i]) || isinf(y[i]))
      return eqpi_fail(p->ctx, EQP_E_INPUT, "point %zu of line '%s' is infinite", i + 1,
                       label ? label : "");
  eqpi_series *s = &p->line[p->nline];
  memset(s, 0, sizeof *s);
  char shown[EQPI_PLOT_TEXT * 2];
  eqpi_plot_label(p->ctx, label ? label : "", shown, sizeof shown);
  if ((rc = copy_text(p, s->label, shown, "line label")) < 0) return rc;
  s->n = n;
  if (n) {
    s->x = eqpi_malloc(p->ctx, sizeof(double) * n);
    s->y = eqpi_malloc(p->ctx, sizeof(double) * n);
    if (!s->x || !s->y) {
      eqpi_free(p->ctx, s->x, sizeof(double) * n);
      eqpi_free(p->ctx, s->y, sizeof(double) * n);
      return eqpi_fail(p->ctx, EQP_E_NOMEM, "out of memory");
    }
    memcpy(s->x, x, sizeof(double) * n);
    memcpy(s->y, y, sizeof(double) * n);
  }
  p->nline++;
  return EQP_OK;
}

int eqp_plot_add_points(eqp_plot *p, const char *label, size_t n, const double *x,
                        const double *y)
{
  int rc = eqp_plot_add_line(p, label, n, x, y);
  if (rc == EQP_OK) p->line[p->nline - 1].points = 1;
  return rc;
}

static int add_mark(eqp_plot *p, eqpi_mark *list, int *count, double a, double b,
                    const char *label)
{
  int rc = room(p, *count);
  if (rc < 0) return rc;
  if (!isfinite(a) || !isfinite(b))
    return eqpi_fail(p->ctx, EQP_E_INPUT, "plot mark '%s' at a non-finite position",
                     label ? label : "");
  eqpi_mark *m = &list[*count];
  m->x = a;
  m->y = b;
  char shown[EQPI_PLOT_TEXT * 2];
  eqpi_plot_label(p->ctx, label ? label : "", shown, sizeof shown);
  if ((rc = copy_text(p, m->label, shown, "label")) < 0) return rc;
  (*count)++;
  return EQP_OK;
}

int eqp_plot_add_marker(eqp_plot *p, double x, double y, const char *label)
{
  if (!p) return EQP_E_ARG;
  return add_mark(p, p->marker, &p->nmarker, x, y, label);
}

int eqp_plot_add_band(eqp_plot *p, double x0, double x1, const char *label)
{
  if (!p) return EQP_E_ARG;
  if (!(x0 < x1)) return eqpi_fail(p->ctx, EQP_E_INPUT, "band %g .. %g: low end first", x0, x1);
  return add_mark(p, p->band, &p->nband, x0, x1, label);
}

int eqp_plot_add_hline(eqp_plot *p, double y, const char *label)
{
  if (!p) return EQP_E_ARG;
  return add_mark(p, p->hline, &p->nhline, 0, y, label);
}

int eqp_plot_format_of(const char *path)
{
  const char *dot = path ? strrchr(path, '.') : NULL;
  if (!dot) return 0;
  if (strcasecmp(dot, ".svg") == 0) return EQP_PLOT_SVG;
  if (strcasecmp(dot, ".png") == 0) return EQP_PLOT_PNG;
  if (strcasecmp(dot, ".pdf") == 0) return EQP_PLOT_PDF;
  return 0;
}

int eqp_plot_render(eqp_plot *p, eqp_plot_format fmt, char **data, size_t *len)
{
  if (!p || !data || !len) return eqpi_fail(p ? p->ctx : NULL, EQP_E_ARG, "NULL argument");
  *data = NULL;
  *len = 0;
  if (fmt != EQP_PLOT_SVG && fmt != EQP_PLOT_PNG && fmt != EQP_PLOT_PDF)
    return eqpi_fail(p->ctx, EQP_E_ARG, "unknown plot format %d", (int)fmt);
  return eqpi_plot_draw(p, fmt, data, len);
}

int eqp_plot_write(eqp_plot *p, const char *path)
{
  if (!p || !path) return eqpi_fail(p ? p->ctx : NULL, EQP_E_ARG, "NULL argument");
  int fmt = eqp_plot_format_of(path);
  if (!fmt)
    return eqpi_fail(p->ctx, EQP_E_INPUT, "plot file '%s': the name ends in .svg, .png or .pdf",
                     path);
  char *data;
  size_t len;
  int rc = eqpi_plot_draw(p, (eqp_plot_format)fmt, &data, &len);
  if (rc < 0) return rc;
  rc = eqpi_write_file_atomic(p->ctx, path, data, len);
  free(data);
  return rc;
}

void eqpi_plot_label(const eqp_ctx *ctx, const char *in, char *out, size_t len)
{
  /* only names the library knows, or that carry a caret charge, are
  ** chemistry: "pH" or "added volume" stay as written */
  int chem = strchr(in, '^') != NULL || eqpi_db_find_species(ctx->db, in) >= 0;
  if (!chem || eqpi_name_pretty(in, out, len) != 0) snprintf(out, len, "%s", in);
}
