/* The report of a run: one self-contained HTML page with the procedure
** step by step and each step's results, tables, the figures inline (SVG),
** warnings and cautions, and the provenance of every constant used. It
** prints on A4 and Letter alike (@page with margins that suit both). */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include "../lua/lua_impl.h"
#include "../atomic_impl.h"
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

typedef struct report {
  lua_State *L;
  cli_state *st;
  eqp_ctx *ctx;
  FILE *f;
  int nfig;             /* figures embedded so far */
  int embedded;         /* registry ref: curves whose figure is already shown */
} report;

static const char css[] =
  "@page{size:auto;margin:14mm 13mm}"
  "body{font:10.5pt/1.4 'DejaVu Sans',Helvetica,Arial,sans-serif;color:#202020;"
  "max-width:180mm;margin:0 auto;padding:0 4mm}"
  "h1{font-size:17pt;margin:.6em 0 .2em}h2{font-size:13pt;margin:1.4em 0 .4em;"
  "border-bottom:1px solid #8fa0a8;break-after:avoid}"
  "table{border-collapse:collapse;margin:.3em 0 .6em;font-size:9pt}"
  "th,td{border:1px solid #c8ced2;padding:1px 5px;text-align:left;vertical-align:top}"
  "th{background:#eef1f3}td.n{text-align:right;font-variant-numeric:tabular-nums}"
  "tr{break-inside:avoid}thead{display:table-header-group}"
  "figure{margin:.5em 0;break-inside:avoid}figcaption{font-size:9pt;color:#444}"
  "svg.plot{width:100%;max-width:170mm;height:auto;display:block}"
  "pre{background:#f6f7f8;border:1px solid #e0e4e6;padding:4px 6px;font-size:8.5pt;"
  "white-space:pre-wrap;break-inside:avoid}"
  "code{font-size:9pt}ol.steps>li{margin:.5em 0}.line{color:#555;font-size:8.5pt}"
  ".failed{color:#b8261a;font-weight:bold}.caution{border-left:4px solid #f08a00;"
  "padding:2px 8px;margin:.3em 0;background:#fff8ee}.warning{border-left:4px solid #b8261a;"
  "padding:2px 8px;margin:.3em 0;background:#fdf1f0}"
  "ol.src{font:8.5pt monospace;padding-left:3.5em}ol.src li{white-space:pre-wrap}"
  "@media print{a{color:inherit;text-decoration:none}}";

/* ------------------------------------------------------------ output */

static void esc(FILE *f, const char *s)
{
  for (; s && *s; s++) {
    switch (*s) {
    case '&': fputs("&amp;", f); break;
    case '<': fputs("&lt;", f); break;
    case '>': fputs("&gt;", f); break;
    case '"': fputs("&quot;", f); break;
    default: fputc(*s, f);
    }
  }
}

/* A species name with sub- and superscripts where it is one. */
static void esc_name(FILE *f, const char *name)
{
  char buf[512];
  if (eqp_name_display(name, buf, sizeof buf) == EQP_OK) esc(f, buf);
  else esc(f, name);
}

static void num(FILE *f, double v)
{
  if (isnan(v)) fputs("<td class=n>&ndash;</td>", f);
  else fprintf(f, "<td class=n>%.6g</td>", v);
}

/* Inline an SVG of this document: ids made unique per figure, the XML
** prologue dropped, the size left to the page's CSS. */
static void inline_svg(report *rp, const char *svg, size_t len, const char *label)
{
  FILE *f = rp->f;
  char prefix[32];
  snprintf(prefix, sizeof prefix, "f%d-", ++rp->nfig);
  const char *p = strstr(svg, "<svg");
  if (!p) return;
  const char *end = svg + len;
  const char *open_end = memchr(p, '>', (size_t)(end - p));
  if (!open_end) return;
  const char *vb = strstr(p, "viewBox=\"");
  fputs("<svg class=\"plot\" role=\"img\" aria-label=\"", f);
  esc(f, label);
  fputs("\" xmlns=\"http://www.w3.org/2000/svg\" "
        "xmlns:xlink=\"http://www.w3.org/1999/xlink\"", f);
  if (vb && vb < open_end) {
    const char *q = strchr(vb + 9, '"');
    if (q) fprintf(f, " %.*s", (int)(q + 1 - vb), vb);
  }
  fputc('>', f);
  for (p = open_end + 1; p < end; p++) {
    static const char *const refs[] = {"id=\"", "href=\"#", "url(#"};
    int hit = 0;
    for (int k = 0; k < 3 && !hit; k++) {
      size_t n = strlen(refs[k]);
      if ((size_t)(end - p) > n && memcmp(p, refs[k], n) == 0) {
        fwrite(p, 1, n, f);
        fputs(prefix, f);
        p += n - 1;
        hit = 1;
      }
    }
    if (!hit) fputc(*p, f);
  }
}

static void figure(report *rp, eqp_plot *plot, const char *caption)
{
  char *svg;
  size_t len;
  if (eqp_plot_render(plot, EQP_PLOT_SVG, &svg, &len) < 0) {
    fputs("<p class=failed>figure could not be drawn: ", rp->f);
    esc(rp->f, eqp_ctx_errmsg(rp->ctx));
    fputs("</p>\n", rp->f);
    return;
  }
  fputs("<figure>", rp->f);
  inline_svg(rp, svg, len, caption ? caption : "figure");
  eqp_free_buffer(svg);
  if (caption) {
    fputs("<figcaption>", rp->f);
    esc(rp->f, caption);
    fputs("</figcaption>", rp->f);
  }
  fputs("</figure>\n", rp->f);
}

/* ----------------------------------------------------------- results */

static void result_block(report *rp, const eqp_result *r)
{
  FILE *f = rp->f;
  fprintf(f, "<table><tr><th>pH</th><th>ionic strength (mol/kg)</th><th>temperature (&deg;C)"
             "</th><th>water (kg)</th><th>activity model</th><th>largest relative residual"
             "</th></tr><tr>");
  num(f, eqp_result_pH(r));
  num(f, eqp_result_ionic_strength(r));
  num(f, eqp_result_temperature_K(r) - 273.15);
  num(f, eqp_result_water(r));
  fputs("<td>", f);
  esc(f, eqp_result_activity_model(r));
  fputs("</td>", f);
  num(f, eqp_result_residual(r));
  fputs("</tr></table>\n<table><thead><tr><th>species</th><th>molality (mol/kg)</th>"
        "<th>molarity (mol/L)</th><th>&gamma;</th><th>activity</th></tr></thead>\n", f);
  double rho = eqp_result_water_density(r);
  for (size_t i = 0; i < eqp_result_species_count(r); i++) {
    const char *name = eqp_result_species_name(r, i);
    double m = eqp_result_species_molality(r, i), g = pow(10, eqp_result_species_log_gamma(r, i));
    if (strcmp(name, "H2O") == 0) continue;
    fputs("<tr><td>", f);
    esc_name(f, name);
    fputs("</td>", f);
    num(f, m);
    num(f, m * rho);   /* molarity = molality x density of water (dilute) */
    num(f, g);
    num(f, m * g);
    fputs("</tr>\n", f);
  }
  fputs("</table>\n", f);
  for (size_t w = 0; w < eqp_result_warning_count(r); w++) {
    fputs("<div class=warning>warning: ", f);
    esc(f, eqp_result_warning(r, w));
    fputs("</div>\n", f);
  }
}

/* At most 25 rows of a curve, evenly spaced, with the first and the last. */
static void curve_table(report *rp, const eqp_curve *c)
{
  FILE *f = rp->f;
  size_t n = eqp_curve_rows(c), nc = eqp_curve_cols(c), step = n > 25 ? (n + 23) / 24 : 1;
  if (n > 25)
    fprintf(f, "<p>Every %zu%s of %zu rows, and the last:</p>\n", step,
            step == 2 ? "nd" : step == 3 ? "rd" : "th", n);
  fputs("<table><thead><tr>", f);
  for (size_t j = 0; j < nc; j++) {
    fputs("<th>", f);
    esc_name(f, eqp_curve_col_name(c, j));
    fputs("</th>", f);
  }
  fputs("</tr></thead>\n", f);
  for (size_t i = 0; i < n; i = (i + step < n || i == n - 1) ? i + step : n - 1) {
    fputs("<tr>", f);
    for (size_t j = 0; j < nc; j++) num(f, eqp_curve_value(c, i, j));
    fputs("</tr>\n", f);
    if (i == n - 1) break;
  }
  fputs("</table>\n", f);
  for (size_t k = 0; k < eqp_curve_equivalence_count(c); k++) {
    double a, v, pH;
    eqp_curve_equivalence(c, k, &a, &v, &pH);
    fprintf(f, "<p>Equivalence point %zu: ", k + 1);
    if (!isnan(a)) fprintf(f, "%.6g mmol, ", a * 1e3);
    if (!isnan(v)) fprintf(f, "%.6g mL, ", v * 1e3);
    fprintf(f, "pH %.3f</p>\n", pH);
  }
}

static int marked(report *rp, int idx)
{
  lua_rawgeti(rp->L, LUA_REGISTRYINDEX, rp->embedded);
  lua_pushvalue(rp->L, idx);
  int seen = lua_rawget(rp->L, -2) != LUA_TNIL;
  lua_pop(rp->L, 2);
  return seen;
}

static void mark(report *rp, int idx)
{
  lua_rawgeti(rp->L, LUA_REGISTRYINDEX, rp->embedded);
  lua_pushvalue(rp->L, idx);
  lua_pushboolean(rp->L, 1);
  lua_rawset(rp->L, -3);
  lua_pop(rp->L, 1);
}

static void value_block(report *rp, int idx, int self, const char *unit);

/* The unit of a number a function returns first, by its name. */
static const char *unit_of(const char *name)
{
  static const char *const units[][2] = {
    {"adjust_pH", "mol"}, {"buffer_capacity", "mol/(L&middot;pH)"}, {"expose", "mol"},
    {"total", "mol"}, {"volume", "L"}, {"water", "kg"}, {"temperature", "&deg;C"},
    {"molar_mass", "g/mol"}, {"molality", "mol/kg"}, {"molarity", "mol/L"},
  };
  for (size_t i = 0; name && i < sizeof units / sizeof units[0]; i++)
    if (strcmp(units[i][0], name) == 0) return units[i][1];
  return "";
}

/* A list of records (eq.compare_buffers) as one table; a record as pairs. */
static void table_block(report *rp, int idx)
{
  lua_State *L = rp->L;
  FILE *f = rp->f;
  idx = lua_absindex(L, idx);
  if (lua_getfield(L, idx, "procedure") == LUA_TSTRING) {   /* a recipe */
    fputs("<pre>", f);
    esc(f, lua_tostring(L, -1));
    fputs("</pre>\n", f);
    lua_pop(L, 1);
    return;
  }
  lua_pop(L, 1);
  lua_Integer n = (lua_Integer)lua_rawlen(L, idx);
  if (n > 0 && lua_rawgeti(L, idx, 1) == LUA_TTABLE) {
    static const char *const cols[] = {"buffer", "possible", "beta", "shift", "within_window",
                                       "why", NULL};
    int first = lua_gettop(L);
    lua_getfield(L, first, cols[0]);
    int records = lua_isstring(L, -1);
    lua_settop(L, first - 1);
    if (records) {
      fputs("<table><thead><tr>", f);
      for (int c = 0; cols[c]; c++) fprintf(f, "<th>%s</th>", cols[c]);
      fputs("</tr></thead>\n", f);
      for (lua_Integer i = 1; i <= n && i <= 100; i++) {
        lua_rawgeti(L, idx, i);
        fputs("<tr>", f);
        for (int c = 0; cols[c]; c++) {
          int ty = lua_getfield(L, -1, cols[c]);
          if (ty == LUA_TNUMBER) num(f, lua_tonumber(L, -1));
          else {
            fputs("<td>", f);
            if (ty == LUA_TBOOLEAN) fputs(lua_toboolean(L, -1) ? "yes" : "no", f);
            else if (ty == LUA_TSTRING) esc(f, lua_tostring(L, -1));
            fputs("</td>", f);
          }
          lua_pop(L, 1);
        }
        fputs("</tr>\n", f);
        lua_pop(L, 1);
      }
      fputs("</table>\n", f);
      return;
    }
  } else if (n > 0) {
    lua_pop(L, 1);
  }
  fputs("<table>", f);
  lua_pushnil(L);
  int rows = 0;
  while (lua_next(L, idx) && rows < 60) {
    if (lua_type(L, -2) == LUA_TSTRING && lua_type(L, -1) != LUA_TTABLE &&
        lua_type(L, -1) != LUA_TUSERDATA && lua_type(L, -1) != LUA_TFUNCTION) {
      fputs("<tr><th>", f);
      esc(f, lua_tostring(L, -2));
      fputs("</th>", f);
      if (lua_type(L, -1) == LUA_TNUMBER) num(f, lua_tonumber(L, -1));
      else {
        fputs("<td>", f);
        esc(f, luaL_tolstring(L, -1, NULL));
        lua_pop(L, 1);
        fputs("</td>", f);
      }
      fputs("</tr>", f);
      rows++;
    }
    lua_pop(L, 1);
  }
  fputs("</table>\n", f);
}

/* What a step returned. self is the object a method was called on (0: none). */
static void value_block(report *rp, int idx, int self, const char *unit)
{
  lua_State *L = rp->L;
  FILE *f = rp->f;
  idx = lua_absindex(L, idx);
  eqpl_result *res = luaL_testudata(L, idx, EQPL_RESULT);
  eqpl_curve *cur = luaL_testudata(L, idx, EQPL_CURVE);
  eqpl_plot *pu = luaL_testudata(L, idx, EQPL_PLOT);
  eqp_plot *plot = pu ? pu->p : NULL;
  if (res && res->r) {
    result_block(rp, res->r);
  } else if (cur && cur->c) {
    /* the figure curve:plot() draws for it, without a file */
    int top = lua_gettop(L);
    lua_getfield(L, idx, "plot");
    lua_pushvalue(L, idx);
    if (lua_pcall(L, 1, 1, 0) == LUA_OK) {
      eqpl_plot *fig = luaL_testudata(L, -1, EQPL_PLOT);
      if (fig && fig->p) {
        figure(rp, fig->p, NULL);
        mark(rp, idx);
      }
    }
    lua_settop(L, top);
    curve_table(rp, cur->c);
  } else if (plot) {
    if (self && marked(rp, self)) fputs("<p>The figure is shown above.</p>\n", f);
    else figure(rp, plot, NULL);
  } else if (lua_type(L, idx) == LUA_TNUMBER) {
    fprintf(f, "<p>&rarr; %.6g %s</p>\n", lua_tonumber(L, idx), unit ? unit : "");
  } else if (lua_type(L, idx) == LUA_TTABLE) {
    table_block(rp, idx);
  }
}

/* ---------------------------------------------------------- sections */

static void procedure(report *rp)
{
  lua_State *L = rp->L;
  FILE *f = rp->f;
  fputs("<h2 id=procedure>Procedure</h2>\n<ol class=steps>\n", f);
  if (lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.journal") != LUA_TTABLE) {
    lua_pop(L, 1);
    fputs("</ol>\n", f);
    return;
  }
  int j = lua_gettop(L);
  lua_Integer n = (lua_Integer)lua_rawlen(L, j);
  int open_pre = 0;
  for (lua_Integer i = 1; i <= n; i++) {
    lua_rawgeti(L, j, i);
    int e = lua_gettop(L);
    lua_getfield(L, e, "kind");
    lua_getfield(L, e, "line");
    int print = strcmp(lua_tostring(L, e + 1), "print") == 0;
    int line = (int)lua_tointeger(L, e + 2);
    if (print) {
      lua_getfield(L, e, "text");
      if (!open_pre) fputs("<li><pre>", f);
      open_pre = 1;
      esc(f, lua_tostring(L, -1));
      fputc('\n', f);
      lua_settop(L, j);
      continue;
    }
    if (open_pre) fputs("</pre></li>\n", f);
    open_pre = 0;
    fprintf(f, "<li><span class=line><a href=\"#L%d\">line %d</a></span> <code>", line, line);
    lua_getfield(L, e, "call");
    esc(f, lua_tostring(L, -1));
    fputs("</code>", f);
    lua_getfield(L, e, "failed");
    if (lua_toboolean(L, -1)) fputs(" <span class=failed>failed</span>", f);
    fputs("\n", f);
    if (lua_getfield(L, e, "results") == LUA_TTABLE) {
      int res = lua_gettop(L);
      lua_getfield(L, e, "self");    /* the object a method was called on */
      int self = lua_isnil(L, -1) ? 0 : lua_gettop(L);
      lua_getfield(L, e, "name");
      const char *unit = unit_of(lua_tostring(L, -1));
      for (lua_Integer k = 1; k <= (lua_Integer)lua_rawlen(L, res); k++) {
        lua_rawgeti(L, res, k);
        value_block(rp, -1, self, k == 1 ? unit : "");
        lua_pop(L, 1);
      }
    }
    fputs("</li>\n", f);
    lua_settop(L, j);
  }
  if (open_pre) fputs("</pre></li>\n", f);
  fputs("</ol>\n", f);
  lua_getfield(L, j, "dropped");
  if (lua_tointeger(L, -1) > 0)
    fprintf(f, "<p>&hellip; and %d more steps, not shown.</p>\n", (int)lua_tointeger(L, -1));
  lua_settop(L, j - 1);
}

static void add_caution(void *ud, const char *text)
{
  FILE *f = ud;
  fputs("<div class=caution>", f);
  esc(f, text);
  fputs("</div>\n", f);
}

/* Each kind of warning of the run once per script line, in order, with
** where it arose. */
static void warnings(report *rp)
{
  const cli_strings *w = &rp->st->rec.warnings;
  for (size_t i = 0; i < w->n; i++) {
    fputs("<div class=warning>", rp->f);
    esc(rp->f, w->item[i]);
    fputs("</div>\n", rp->f);
  }
}

static void one_constant(void *ud, const eqp_constant *k)
{
  FILE *f = ud;
  fputs("<tr><td>", f);
  esc(f, k->kind);
  fputs("</td><td>", f);
  /* names in the equation with sub- and superscripts, word by word */
  char eq[512];
  snprintf(eq, sizeof eq, "%s", k->equation);
  for (char *tok = strtok(eq, " "); tok; tok = strtok(NULL, " ")) {
    /* names get sub- and superscripts; "+", "=", "-", numbers and "(sit)" do not */
    int name = tok[0] != '(' && strpbrk(tok, "ABCDEFGHIJKLMNOPQRSTUVWXYZ") != NULL;
    if (name) esc_name(f, tok);
    else esc(f, tok);
    fputc(' ', f);
  }
  fputs("</td>", f);
  num(f, k->value);
  num(f, k->dH);
  num(f, k->dCp);
  fputs("<td>", f);
  esc(f, k->temperature);
  fputs("</td><td>", f);
  esc(f, k->source);
  fputs("</td><td>", f);
  const char *base = strrchr(k->file, '/');
  esc(f, base ? base + 1 : k->file);
  fprintf(f, ":%d</td></tr>\n", k->line);
}

static void provenance(report *rp)
{
  FILE *f = rp->f;
  const char *names[512];
  size_t n = 0;
  /* the reagents used, and every species any result held */
  const cli_record *rec = &rp->st->rec;
  for (size_t i = 0; i < rec->reagents.n && n < 256; i++) names[n++] = rec->reagents.item[i];
  for (size_t i = 0; i < rec->species.n && n < 512; i++) names[n++] = rec->species.item[i];
  fputs("<h2 id=provenance>Provenance of the constants</h2>\n<p>Every constant of the "
        "species that the reagents of this run can form, as its species file gives it: value "
        "at 25 &deg;C (log K, pKa, ion size in &Aring;, interaction coefficient in kg/mol), "
        "&Delta;H in kJ/mol and &Delta;C<sub>p</sub> in J/(K&middot;mol) of the reaction as "
        "written, how it follows temperature, and its source.</p>\n<table><thead><tr>"
        "<th>kind</th><th>reaction or species</th><th>value at 25 &deg;C</th><th>&Delta;H</th>"
        "<th>&Delta;C<sub>p</sub></th><th>temperature</th><th>source</th><th>defined at</th>"
        "</tr></thead>\n", f);
  if (eqp_ctx_constants(rp->ctx, names, n, one_constant, f) < 0) {
    fputs("</table><p class=failed>", f);
    esc(f, eqp_ctx_errmsg(rp->ctx));
    fputs("</p>\n", f);
  } else {
    fputs("</table>\n", f);
  }
  fputs("<p>Water: density from Kell (1975), relative permittivity from Malmberg &amp; "
        "Maryott (1956), giving the Debye&ndash;H&uuml;ckel A and B at each temperature; "
        "pK<sub>w</sub> from the IAPWS R11-07 formulation (Bandura &amp; Lvov 2006).</p>\n"
        "<p>Species files loaded:</p><ul>\n", f);
  for (size_t i = 0; i < eqp_ctx_source_count(rp->ctx); i++) {
    fputs("<li><code>", f);
    esc(f, eqp_ctx_source_path(rp->ctx, i));
    fputs("</code></li>\n", f);
  }
  fputs("</ul>\n", f);
}

static void source_listing(report *rp, const char *path)
{
  FILE *in = fopen(path, "r");
  if (!in) return;
  fputs("<h2 id=script>The script</h2>\n<ol class=src>\n", rp->f);
  char line[4096];
  int n = 0, at_start = 1;
  while (fgets(line, sizeof line, in)) {
    size_t len = strlen(line);
    int whole = len && line[len - 1] == '\n';
    if (whole) line[len - 1] = '\0';
    if (at_start) fprintf(rp->f, "<li id=L%d>", ++n);
    esc(rp->f, line);
    if (whole) fputs("</li>\n", rp->f);
    at_start = whole;
  }
  if (!at_start) fputs("</li>\n", rp->f);
  fclose(in);
  fputs("</ol>\n", rp->f);
}

/* ------------------------------------------------------------- write */

int cli_write_report(cli_state *st, int exit_code, const char *error)
{
  lua_State *L = st->L;
  const cli_run *run = st->run;
  report rp = {L, st, st->ctx, NULL, 0, LUA_NOREF};
  char *buf = NULL;
  size_t len = 0;
  FILE *f = open_memstream(&buf, &len);
  if (!f || !rp.ctx) {
    fprintf(stderr, "equipoise: cannot make the report (out of memory or no run)\n");
    if (f) fclose(f);
    free(buf);
    return -1;
  }
  rp.f = f;
  lua_newtable(L);
  rp.embedded = luaL_ref(L, LUA_REGISTRYINDEX);
  lua_pushboolean(L, 1);     /* what the report itself calls is not a step */
  lua_setfield(L, LUA_REGISTRYINDEX, "equipoise.journal.off");
  char when[64];
  time_t now = time(NULL);
  strftime(when, sizeof when, "%Y-%m-%d %H:%M:%S UTC", gmtime(&now));
  fputs("<!DOCTYPE html>\n<html lang=en>\n<head>\n<meta charset=utf-8>\n<title>Equipoise report: ",
        f);
  esc(f, run->script);
  fprintf(f, "</title>\n<style>%s</style>\n</head>\n<body>\n<h1>Equipoise report</h1>\n", css);
  fputs("<table><tr><th>script</th><td><code>", f);
  esc(f, run->script);
  fprintf(f, "</code></td></tr><tr><th>run</th><td>%s, equipoise %s</td></tr>", when,
          EQP_VERSION_STRING);
  for (int i = 0; i < run->nparams; i++) {
    fputs("<tr><th>param</th><td><code>", f);
    esc(f, run->param_names[i]);
    fputs(" = ", f);
    esc(f, run->param_values[i]);
    fputs("</code></td></tr>", f);
  }
  fprintf(f, "<tr><th>status</th><td>%s (exit code %d)</td></tr></table>\n",
          exit_code == 0 ? "completed" : "stopped by an error", exit_code);
  fputs("<h2 id=cautions>Cautions and warnings</h2>\n", f);
  if (error) {
    fputs("<div class=warning><b>The run stopped:</b> ", f);
    esc(f, error);
    fputs(" Everything computed before the error is shown below.</div>\n", f);
  }
  add_caution(f, "Results are model estimates: confirm the pH of every preparation with a "
              "calibrated meter. For clinical, pharmaceutical or food use follow validated "
              "methods and local regulations.");
  cli_each_caution(st, add_caution, f);
  warnings(&rp);
  procedure(&rp);
  provenance(&rp);
  source_listing(&rp, run->script);
  /* the expected count, where a browser check can compare it */
  fprintf(f, "<p class=line id=figure-count data-plots=\"%d\">%d figure%s.</p>\n", rp.nfig,
          rp.nfig, rp.nfig == 1 ? "" : "s");
  /* a check a browser runs: how many figures were laid out with a size */
  fputs("<script>document.documentElement.dataset.plotsRendered=Array.from(document."
        "querySelectorAll('svg.plot')).filter(function(s){var b=s.getBoundingClientRect();"
        "return b.width>0&&b.height>0;}).length;</script>\n</body>\n</html>\n", f);
  luaL_unref(L, LUA_REGISTRYINDEX, rp.embedded);
  if (fclose(f) != 0) {
    free(buf);
    return -1;
  }
  int rc = eqpi_write_file_atomic(rp.ctx, run->report, buf, len);
  free(buf);
  if (rc < 0) fprintf(stderr, "equipoise: the report: %s\n", eqp_ctx_errmsg(rp.ctx));
  return rc;
}
