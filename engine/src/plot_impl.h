/* Figures: the private record shared by the model (plot.c), the figures
** made from curves (plot_kinds.c) and the PLplot renderer (plot_render.c). */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_PLOT_IMPL_H
#define EQP_PLOT_IMPL_H

#include "eqp_impl.h"

#define EQPI_PLOT_TEXT 160      /* bytes of a title, label or unit */
#define EQPI_PLOT_MAX_ITEMS 64  /* lines, markers, bands and rules of one figure */

typedef struct eqpi_series {
  char label[EQPI_PLOT_TEXT];   /* display form; "" for no legend entry */
  size_t n;
  double *x, *y;
  int points;                   /* a dot at every point too */
} eqpi_series;

typedef struct eqpi_mark {
  double x, y;                  /* marker: point; band: x0 = x, x1 = y; hline: y */
  char label[EQPI_PLOT_TEXT];
} eqpi_mark;

typedef struct eqpi_axis {
  char label[EQPI_PLOT_TEXT];
  char unit[EQPI_PLOT_TEXT];
  double lo, hi;                /* NaN: from the data */
} eqpi_axis;

struct eqp_plot {
  eqp_ctx *ctx;
  char title[EQPI_PLOT_TEXT];
  eqpi_axis axis[2];
  int width, height;            /* points */
  eqpi_series line[EQPI_PLOT_MAX_ITEMS];
  int nline;
  eqpi_mark marker[EQPI_PLOT_MAX_ITEMS], band[EQPI_PLOT_MAX_ITEMS], hline[EQPI_PLOT_MAX_ITEMS];
  int nmarker, nband, nhline;
};

/* The palette: eight colours chosen so that every pair stays at least 20
** CIELAB units apart in normal vision and in simulated protanopia,
** deuteranopia and tritanopia (tests/unit/test_plot.c checks it). */
#define EQPI_PALETTE_SIZE 8
extern const unsigned char eqpi_palette[EQPI_PALETTE_SIZE][3];

/* The display form of a label: a species name of the library (or any
** name with a charge after a caret) gets Unicode sub- and superscripts. */
void eqpi_plot_label(const eqp_ctx *ctx, const char *in, char *out, size_t len);

/* Draw the figure with PLplot into malloc'd memory (plot_render.c). */
int eqpi_plot_draw(eqp_plot *p, eqp_plot_format fmt, char **data, size_t *len);


#endif
