/* The one file that talks to PLplot: a figure drawn by the cairo drivers
** (svgcairo, pngcairo, pdfcairo) into an in-memory stream. */
/* SPDX-License-Identifier: MIT */
#include "plot_impl.h"
#include <math.h>
#include <plplot.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* colour map 0: background, ink, grid, band fill, then the palette */
enum { COL_BG = 0, COL_INK = 1, COL_GRID = 2, COL_BAND = 3, COL_PAL = 4 };
/* Lines are solid (PLplot draws dashes as one path per dash, which
** bloats SVG); where several lines are labelled each also carries its
** label beside its highest point, so that none relies on colour alone. */
static const PLINT line_style[EQPI_PALETTE_SIZE] = {1, 1, 1, 1, 1, 1, 1, 1};

/* PLplot reports a failed call through this handler; the first message
** becomes the error of the draw. */
static char draw_error[256];

static void on_abort(PLCHAR_VECTOR msg)
{
  if (!draw_error[0]) snprintf(draw_error, sizeof draw_error, "%s", msg ? msg : "PLplot error");
}

/* '#' starts PLplot's text escapes; the cairo driver passes the rest to
** pango markup, where '&' and '<' are special. */
static void escape(const char *in, char *out, size_t len)
{
  size_t o = 0;
  for (const char *c = in; *c && o + 6 < len; c++) {
    const char *rep = *c == '#' ? "##" : *c == '&' ? "&#38;" : *c == '<' ? "&#60;" : NULL;
    if (rep) {
      memcpy(out + o, rep, strlen(rep));
      o += strlen(rep);
    } else {
      out[o++] = *c;
    }
  }
  out[o] = '\0';
}

static void extend(double *lo, double *hi, double v)
{
  if (isnan(v)) return;
  if (v < *lo) *lo = v;
  if (v > *hi) *hi = v;
}

/* The plotted range of each axis: the one set, or the data's, padded. */
static void ranges(const eqp_plot *p, double r[2][2])
{
  for (int a = 0; a < 2; a++) {
    r[a][0] = INFINITY;
    r[a][1] = -INFINITY;
  }
  for (int i = 0; i < p->nline; i++)
    for (size_t k = 0; k < p->line[i].n; k++)
      if (!isnan(p->line[i].x[k]) && !isnan(p->line[i].y[k])) {
        extend(&r[0][0], &r[0][1], p->line[i].x[k]);
        extend(&r[1][0], &r[1][1], p->line[i].y[k]);
      }
  for (int i = 0; i < p->nmarker; i++) {
    extend(&r[0][0], &r[0][1], p->marker[i].x);
    extend(&r[1][0], &r[1][1], p->marker[i].y);
  }
  for (int i = 0; i < p->nband; i++) {
    extend(&r[0][0], &r[0][1], p->band[i].x);
    extend(&r[0][0], &r[0][1], p->band[i].y);
  }
  for (int i = 0; i < p->nhline; i++) extend(&r[1][0], &r[1][1], p->hline[i].y);
  for (int a = 0; a < 2; a++) {
    if (!isnan(p->axis[a].lo)) {
      r[a][0] = p->axis[a].lo;
      r[a][1] = p->axis[a].hi;
      continue;
    }
    if (!(r[a][0] <= r[a][1])) {    /* nothing drawn */
      r[a][0] = 0;
      r[a][1] = 1;
    }
    double span = r[a][1] - r[a][0];
    if (span <= 1e-12 * fmax(1, fabs(r[a][0]))) span = fmax(1, fabs(r[a][0]) * 0.1);
    double pad = a == 1 ? 0.04 * span : 0;   /* lines clear of the frame */
    if (r[a][1] - r[a][0] < span) {
      r[a][0] -= span / 2;
      r[a][1] += span / 2;
    }
    r[a][0] -= pad;
    r[a][1] += pad;
  }
}

static void axis_title(const eqpi_axis *a, char *out, size_t len)
{
  char t[EQPI_PLOT_TEXT * 2 + 8];
  /* quantity / unit, as ISO 80000-1 writes axis labels */
  if (a->unit[0]) snprintf(t, sizeof t, "%s / %s", a->label, a->unit);
  else snprintf(t, sizeof t, "%s", a->label);
  escape(t, out, len);
}

static void draw_lines(const eqp_plot *p)
{
  for (int i = 0; i < p->nline; i++) {
    const eqpi_series *s = &p->line[i];
    plcol0(COL_PAL + i % EQPI_PALETTE_SIZE);
    pllsty(line_style[i % EQPI_PALETTE_SIZE]);
    plwidth(2.2);
    size_t k = 0;
    while (k < s->n) {      /* runs between NaNs */
      while (k < s->n && (isnan(s->x[k]) || isnan(s->y[k]))) k++;
      size_t start = k;
      while (k < s->n && !isnan(s->x[k]) && !isnan(s->y[k])) k++;
      if (k - start >= 2) plline((PLINT)(k - start), s->x + start, s->y + start);
      if (k - start == 1 || (s->points && k > start))
        plstring((PLINT)(k - start), s->x + start, s->y + start, "\xE2\x97\x8F");
    }
  }
  pllsty(1);
}

static void draw_marks(const eqp_plot *p, double r[2][2])
{
  char text[EQPI_PLOT_TEXT * 6];
  double dx = (r[0][1] - r[0][0]) * 0.012, dy = (r[1][1] - r[1][0]) * 0.02;
  for (int i = 0; i < p->nhline; i++) {
    double x[2] = {r[0][0], r[0][1]}, y[2] = {p->hline[i].y, p->hline[i].y};
    plcol0(COL_INK);
    pllsty(2);
    plwidth(0.8);
    plline(2, x, y);
    escape(p->hline[i].label, text, sizeof text);
    plptex(r[0][1] - dx, p->hline[i].y + dy, 1, 0, 1.0, text);
  }
  for (int i = 0; i < p->nmarker; i++) {
    const eqpi_mark *m = &p->marker[i];
    double x[2] = {m->x, m->x}, y[2] = {r[1][0], r[1][1]};
    plcol0(COL_INK);
    pllsty(3);
    plwidth(1.0);
    plline(2, x, y);
    pllsty(1);
    plschr(0, 1.2);
    plstring(1, &m->x, &m->y, "\xE2\x97\x8F");   /* a filled circle */
    plschr(0, 0.85);
    escape(m->label, text, sizeof text);
    /* the label beside the point, on the side with more room */
    int right = m->x < 0.5 * (r[0][0] + r[0][1]);
    double ty = m->y + ((m->y < 0.5 * (r[1][0] + r[1][1])) ? 3 : -3) * dy;
    plptex(m->x + (right ? dx : -dx), ty, 1, 0, right ? 0.0 : 1.0, text);
    plschr(0, 1.0);
  }
  pllsty(1);
}

/* Each labelled line's label beside its highest point, in its colour. */
static void draw_direct_labels(const eqp_plot *p, double r[2][2])
{
  char text[EQPI_PLOT_TEXT * 6];
  int labelled = 0;
  for (int i = 0; i < p->nline; i++) labelled += p->line[i].label[0] != 0;
  if (labelled < 2) return;
  double dy = (r[1][1] - r[1][0]) * 0.025;
  double placed[EQPI_PLOT_MAX_ITEMS][4];   /* boxes of the labels drawn, x0 x1 y0 y1 */
  int nplaced = 0;
  plschr(0, 0.9);
  for (int i = 0; i < p->nline; i++) {
    const eqpi_series *s = &p->line[i];
    size_t best = s->n;
    for (size_t k = 0; k < s->n; k++)
      if (!isnan(s->y[k]) && !isnan(s->x[k]) && s->x[k] >= r[0][0] && s->x[k] <= r[0][1] &&
          (best == s->n || s->y[k] > s->y[best]))
        best = k;
    if (!s->label[0] || best == s->n) continue;
    double y = s->y[best] + dy;
    if (y > r[1][1] - dy) y = s->y[best] - 2 * dy;   /* keep it inside the frame */
    plcol0(COL_PAL + i % EQPI_PALETTE_SIZE);
    escape(s->label, text, sizeof text);
    /* centred over the peak, or pushed inwards at either edge */
    double f = (s->x[best] - r[0][0]) / (r[0][1] - r[0][0]);
    double just = f < 0.08 ? 0.0 : f > 0.92 ? 1.0 : 0.5;
    double dx = (r[0][1] - r[0][0]) * (just == 0.0 ? 0.01 : just == 1.0 ? -0.01 : 0);
    /* a label that would sit on another is left to the legend */
    int chars = 0;
    for (const char *c = s->label; *c; c++) chars += ((unsigned char)*c & 0xC0) != 0x80;
    double w = (r[0][1] - r[0][0]) * 0.0125 * chars * 720.0 / p->width;
    double x0 = s->x[best] + dx - just * w, box[4] = {x0, x0 + w, y - dy, y + 1.5 * dy};
    int clash = 0;
    for (int k = 0; k < nplaced; k++)
      clash |= box[0] < placed[k][1] && placed[k][0] < box[1] && box[2] < placed[k][3] &&
               placed[k][2] < box[3];
    if (clash) continue;
    memcpy(placed[nplaced++], box, sizeof box);
    plptex(s->x[best] + dx, y, 1, 0, just, text);
  }
  plschr(0, 1.0);
}

static int legend_entries(const eqp_plot *p)
{
  int n = 0;
  for (int i = 0; i < p->nline; i++) n += p->line[i].label[0] != 0;
  for (int i = 0; i < p->nband; i++) n += p->band[i].label[0] != 0;
  return n;
}

/* The widest legend label, in characters (UTF-8 continuation bytes not counted). */
static int legend_chars(const eqp_plot *p)
{
  int w = 0;
  for (int i = 0; i < p->nline + p->nband; i++) {
    const char *s = i < p->nline ? p->line[i].label : p->band[i - p->nline].label;
    int c = 0;
    for (; *s; s++) c += ((unsigned char)*s & 0xC0) != 0x80;
    if (c > w) w = c;
  }
  return w;
}

/* Columns of the legend below the plot: as many as fit across. */
static int legend_columns(const eqp_plot *p)
{
  int n = legend_entries(p);
  double entry = 7.0 * legend_chars(p) + 60;     /* points: sample line plus text */
  int cols = (int)(0.85 * p->width / entry);
  if (cols < 1) cols = 1;
  return cols < n ? cols : n;
}

static void draw_legend(const eqp_plot *p, int ncol, double below)
{
  enum { MAXL = 2 * EQPI_PLOT_MAX_ITEMS };
  PLINT opt[MAXL], tcol[MAXL], lcol[MAXL], lsty[MAXL], bcol[MAXL], bpat[MAXL];
  PLFLT lw[MAXL], bscale[MAXL], bw[MAXL];
  static char textbuf[MAXL][EQPI_PLOT_TEXT * 6];
  const char *text[MAXL];
  int n = 0;
  for (int i = 0; i < p->nband; i++) {
    if (!p->band[i].label[0]) continue;
    opt[n] = PL_LEGEND_COLOR_BOX;
    bcol[n] = COL_BAND;
    bpat[n] = 0;
    bscale[n] = 1.0;
    bw[n] = 1;
    escape(p->band[i].label, textbuf[n], sizeof textbuf[n]);
    n++;
  }
  for (int i = 0; i < p->nline; i++) {
    if (!p->line[i].label[0]) continue;
    opt[n] = PL_LEGEND_LINE;
    lcol[n] = COL_PAL + i % EQPI_PALETTE_SIZE;
    lsty[n] = line_style[i % EQPI_PALETTE_SIZE];
    lw[n] = 2.2;
    escape(p->line[i].label, textbuf[n], sizeof textbuf[n]);
    n++;
  }
  if (!n) return;
  for (int i = 0; i < n; i++) {
    text[i] = textbuf[i];
    tcol[i] = COL_INK;
  }
  PLFLT w, h;
  int nrow = (n + ncol - 1) / ncol;
  pllegend(&w, &h, PL_LEGEND_ROW_MAJOR, PL_POSITION_BOTTOM | PL_POSITION_OUTSIDE, 0.0, below,
           0.05, COL_BG, COL_INK, 1, nrow, ncol, n, opt, 0.8, 0.85, 1.6, 0.0, tcol, text, bcol,
           bpat, bscale, bw, lcol, lsty, lw, NULL, NULL, NULL, NULL);
}

/* Split a title at its first line break into two lines. */
static void title_lines(const char *t, char *a, char *b, size_t len)
{
  const char *nl = strchr(t, '\n');
  char one[EQPI_PLOT_TEXT];
  snprintf(one, sizeof one, "%.*s", nl ? (int)(nl - t) : (int)strlen(t), t);
  escape(one, a, len);
  escape(nl ? nl + 1 : "", b, len);
}

static void draw(const eqp_plot *p, const char *device, FILE *f)
{
  PLINT strm;
  plmkstrm(&strm);
  plsdev(device);
  plsfile(f);
  plspage(0, 0, p->width, p->height, 0, 0);
  plscolbga(255, 255, 255, 1.0);
  plscmap0n(COL_PAL + EQPI_PALETTE_SIZE);
  plscol0a(COL_INK, 0x20, 0x20, 0x20, 1.0);
  plscol0a(COL_GRID, 0xd8, 0xd8, 0xd8, 1.0);
  plscol0a(COL_BAND, 0xf0, 0x8a, 0x00, 0.22);
  for (int i = 0; i < EQPI_PALETTE_SIZE; i++)
    plscol0a(COL_PAL + i, eqpi_palette[i][0], eqpi_palette[i][1], eqpi_palette[i][2], 1.0);
  plsetopt("drvopt", "text_anti_aliasing=2,graphics_anti_aliasing=2");
  plinit();
  pladv(0);
  plschr(0, 1.0);
  double r[2][2];
  ranges(p, r);
  /* the legend goes below the x label, in as many columns as fit */
  int ncol = legend_entries(p) ? legend_columns(p) : 0;
  int nrow = ncol ? (legend_entries(p) + ncol - 1) / ncol : 0;
  double row_h = 22.0 / p->height, bottom = (62.0 + (nrow ? 10 : 0)) / p->height + nrow * row_h;
  int two = strchr(p->title, '\n') != NULL;
  double top = 1 - (p->title[0] ? (two ? 64.0 : 44.0) : 20.0) / p->height;
  plvpor(0.11, 0.95, bottom, top);
  plwind(r[0][0], r[0][1], r[1][0], r[1][1]);
  for (int i = 0; i < p->nband; i++) {
    double x[4] = {p->band[i].x, p->band[i].y, p->band[i].y, p->band[i].x};
    double y[4] = {r[1][0], r[1][0], r[1][1], r[1][1]};
    plcol0(COL_BAND);
    plfill(4, x, y);
  }
  plcol0(COL_GRID);
  plwidth(0.5);
  plbox("g", 0, 0, "g", 0, 0);
  draw_lines(p);
  draw_marks(p, r);
  draw_direct_labels(p, r);
  plcol0(COL_INK);
  plwidth(1.0);
  plbox("bcnst", 0, 0, "bcnstv", 0, 0);
  char xl[EQPI_PLOT_TEXT * 7], yl[EQPI_PLOT_TEXT * 7], t1[EQPI_PLOT_TEXT * 6],
    t2[EQPI_PLOT_TEXT * 6];
  axis_title(&p->axis[0], xl, sizeof xl);
  axis_title(&p->axis[1], yl, sizeof yl);
  title_lines(p->title, t1, t2, sizeof t1);
  pllab(xl, yl, "");
  plschr(0, 1.15);
  plmtex("t", t2[0] ? 3.2 : 1.6, 0.5, 0.5, t1);
  plschr(0, 1.0);
  if (t2[0]) plmtex("t", 1.4, 0.5, 0.5, t2);
  /* below the x label: its offset is in units of the viewport height */
  if (ncol) draw_legend(p, ncol, 52.0 / (p->height * (top - bottom)));
  plend1();    /* closes f */
}

/* plinit() exits the process on an unknown device: ask first. */
static int have_device(const char *device)
{
  PLCHAR_VECTOR menu[64], names[64], *m = menu, *d = names;
  int n = 64;    /* in: room in the arrays; out: devices listed */
  plgFileDevs(&m, &d, &n);
  for (int i = 0; i < n; i++)
    if (names[i] && strcmp(names[i], device) == 0) return 1;
  return 0;
}

int eqpi_plot_draw(eqp_plot *p, eqp_plot_format fmt, char **data, size_t *len)
{
  const char *device = fmt == EQP_PLOT_SVG ? "svgcairo" : fmt == EQP_PLOT_PNG ? "pngcairo"
                                                                              : "pdfcairo";
  if (!have_device(device))
    return eqpi_fail(p->ctx, EQP_E_IO, "PLplot has no '%s' output: install its cairo driver "
                     "(Debian package plplot-driver-cairo)", device);
  char *buf = NULL;
  size_t n = 0;
  FILE *f = open_memstream(&buf, &n);
  if (!f) return eqpi_fail(p->ctx, EQP_E_NOMEM, "out of memory");
  draw_error[0] = '\0';
  plsabort(on_abort);
  draw(p, device, f);
  plsabort(NULL);
  if (draw_error[0] || n == 0) {
    free(buf);
    return eqpi_fail(p->ctx, EQP_E_IO, "drawing the plot failed: %s",
                     draw_error[0] ? draw_error : "no output from the cairo driver");
  }
  *data = buf;
  *len = n;
  return EQP_OK;
}
