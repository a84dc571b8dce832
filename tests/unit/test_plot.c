/* Plots: the palette under colour-vision deficiencies, equivalence points
** marked where the closed form puts them, the distribution diagram of
** phosphate at a stated ionic strength, output formats and atomic files. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "plot_impl.h"
#include <dirent.h>
#include <lauxlib.h>
#include <lualib.h>
#include <unistd.h>

/* ---------------------------------------------------------- palette */

/* Simulation of dichromats in linear RGB, severity 1: G. M. Machado,
** M. M. Oliveira, L. A. F. Fernandes, "A physiologically-based model for
** simulation of color vision deficiency", IEEE TVCG 15, 1291-1298 (2009),
** Table 1 [matrices from memory]. */
static const double cvd[4][3][3] = {
  {{1, 0, 0}, {0, 1, 0}, {0, 0, 1}},
  {{0.152286, 1.052583, -0.204868}, {0.114503, 0.786281, 0.099216},
   {-0.003882, -0.048116, 1.051998}},                                     /* protanopia */
  {{0.367322, 0.860646, -0.227968}, {0.280085, 0.672501, 0.047413},
   {-0.011820, 0.042940, 0.968881}},                                      /* deuteranopia */
  {{1.255528, -0.076749, -0.178779}, {-0.078411, 0.930809, 0.147602},
   {0.004733, 0.691367, 0.303900}},                                       /* tritanopia */
};

/* sRGB to linear (IEC 61966-2-1), linear RGB to CIE XYZ (D65) to CIELAB
** (CIE 15:2004). */
static double linear(unsigned char c)
{
  double v = c / 255.0;
  return v <= 0.04045 ? v / 12.92 : pow((v + 0.055) / 1.055, 2.4);
}

static double lab_f(double t)
{
  return t > 216.0 / 24389 ? cbrt(t) : (24389.0 / 27 * t + 16) / 116;
}

static void to_lab(const unsigned char rgb[3], const double m[3][3], double lab[3])
{
  double l[3], s[3];
  for (int i = 0; i < 3; i++) l[i] = linear(rgb[i]);
  for (int i = 0; i < 3; i++) {
    s[i] = m[i][0] * l[0] + m[i][1] * l[1] + m[i][2] * l[2];
    s[i] = s[i] < 0 ? 0 : s[i] > 1 ? 1 : s[i];
  }
  double X = 0.4124 * s[0] + 0.3576 * s[1] + 0.1805 * s[2];
  double Y = 0.2126 * s[0] + 0.7152 * s[1] + 0.0722 * s[2];
  double Z = 0.0193 * s[0] + 0.1192 * s[1] + 0.9505 * s[2];
  double fx = lab_f(X / 0.95047), fy = lab_f(Y), fz = lab_f(Z / 1.08883);
  lab[0] = 116 * fy - 16;
  lab[1] = 500 * (fx - fy);
  lab[2] = 200 * (fy - fz);
}

/* Every pair of palette colours stays at least 20 CIELAB units (CIE76)
** apart in normal vision and in the three simulated dichromacies. The
** threshold is our choice: a difference of about 10 is already plain to
** see side by side (common practice), so 20 leaves room for thin lines. */
static void palette_distinct(void **state)
{
  (void)state;
  for (int v = 0; v < 4; v++)
    for (int i = 0; i < EQPI_PALETTE_SIZE; i++)
      for (int j = i + 1; j < EQPI_PALETTE_SIZE; j++) {
        double a[3], b[3];
        to_lab(eqpi_palette[i], cvd[v], a);
        to_lab(eqpi_palette[j], cvd[v], b);
        double d = sqrt((a[0] - b[0]) * (a[0] - b[0]) + (a[1] - b[1]) * (a[1] - b[1]) +
                        (a[2] - b[2]) * (a[2] - b[2]));
        if (!(d >= 20)) fail_msg("colours %d and %d are %.1f apart in view %d", i, j, d, v);
      }
  /* and every colour is dark enough to read on white: L* at most 72 */
  for (int i = 0; i < EQPI_PALETTE_SIZE; i++) {
    double a[3];
    to_lab(eqpi_palette[i], cvd[0], a);
    if (!(a[0] <= 72)) fail_msg("colour %d has L* %.1f", i, a[0]);
  }
}

/* -------------------------------------------------------- titrations */

static eqp_solution *new_solution(eqp_ctx *ctx, double litres)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = litres * eqp_water_density(298.15);
  o.temperature_K = 298.15;
  o.activity = "davies";
  eqp_solution *s;
  if (eqp_solution_new(ctx, &o, &s) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return s;
}

/* The figure of titrating 'acid' (mmol in 50 mL) with 0.1 M NaOH. */
static eqp_plot *titration_figure(eqp_ctx *ctx, const char *acid, const char *mmol)
{
  eqp_solution *s = new_solution(ctx, 0.050), *naoh = new_solution(ctx, 1.0);
  assert_int_equal(eqp_solution_add_str(s, acid, mmol), EQP_OK);
  assert_int_equal(eqp_solution_add_str(naoh, "NaOH", "0.1 mol"), EQP_OK);
  eqp_titration t = EQP_TITRATION_INIT;
  t.stock = naoh;
  t.step = 0.25e-3;
  t.to = 20e-3;
  eqp_curve *c;
  if (eqp_solution_titrate(s, &t, &c) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  eqp_plot *p;
  if (eqp_plot_titration(c, NULL, &p) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  eqp_curve_free(c);
  eqp_solution_free(s);
  eqp_solution_free(naoh);
  return p;
}

/* The marker's pH lies on the plotted curve (linear interpolation). */
static double curve_pH_at(const eqp_plot *p, double x)
{
  const eqpi_series *s = &p->line[0];
  for (size_t k = 1; k < s->n; k++)
    if (s->x[k - 1] <= x && x <= s->x[k])
      return s->y[k - 1] + (s->y[k] - s->y[k - 1]) * (x - s->x[k - 1]) / (s->x[k] - s->x[k - 1]);
  return NAN;
}

/* Strong acid with strong base: 1.000 mmol HCl with 0.1 M NaOH. Closed
** form: V = n / c = 10.000 mL, and there a(H+) = a(OH-), so pH = pKw / 2 =
** 6.9975 with pKw = 13.995 at 25 C (IAPWS R11-07; Bandura & Lvov, J. Phys.
** Chem. Ref. Data 35, 15 (2006)). */
static void titration_strong(void **state)
{
  (void)state;
  eqp_ctx *ctx = test_ctx();
  eqp_plot *p = titration_figure(ctx, "HCl", "1.000 mmol");
  assert_int_equal(p->nmarker, 1);
  assert_close(p->marker[0].x, 10.000, 0.001);          /* mL */
  assert_close(p->marker[0].y, 13.995 / 2, 0.01);
  assert_contains(p->marker[0].label, "10.000 mL");
  assert_string_equal(p->axis[0].unit, "mL");
  eqp_plot_free(p);
  eqp_ctx_free(ctx);
}

/* Acetic acid with NaOH: 0.850 mmol with 0.1 M NaOH, closed form V = n / c
** = 8.500 mL. The plot marks the steepest point of the curve, which for a
** weak acid lies a hair before the stoichiometric point; 0.005 mL (a
** twentieth of a burette's 0.1 mL division, common practice) bounds it. */
static void titration_acetic(void **state)
{
  (void)state;
  eqp_ctx *ctx = test_ctx();
  eqp_plot *p = titration_figure(ctx, "CH3COOH", "0.850 mmol");
  assert_int_equal(p->nmarker, 1);
  assert_close(p->marker[0].x, 8.500, 0.005);
  assert_close(p->marker[0].y, curve_pH_at(p, p->marker[0].x), 0.5);  /* on the steep part */
  assert_true(p->marker[0].y > 7.5 && p->marker[0].y < 9.5);          /* basic end point */
  eqp_plot_free(p);
  eqp_ctx_free(ctx);
}

/* ------------------------------------------------------ distribution */

/* pKa values of phosphoric acid as species/phosphate.lua holds them, read
** with a plain Lua, not with the engine's loader. */
static void library_pKa(double pKa[3])
{
  const char *src = getenv("EQP_SOURCE_DIR");
  char path[1024];
  snprintf(path, sizeof path, "%s/species/phosphate.lua", src ? src : ".");
  lua_State *L = luaL_newstate();
  luaL_openlibs(L);
  if (luaL_dofile(L, path) != LUA_OK) fail_msg("%s", lua_tostring(L, -1));
  lua_getfield(L, -1, "acids");
  lua_rawgeti(L, -1, 1);
  lua_getfield(L, -1, "pKa");
  for (int i = 0; i < 3; i++) {
    lua_rawgeti(L, -1, i + 1);
    pKa[i] = lua_tonumber(L, -1);
    lua_pop(L, 1);
  }
  lua_close(L);
}

/* Davies (C. W. Davies, Ion Association, 1962): log10 g = -A z^2
** (sqrt(I)/(1 + sqrt(I)) - 0.3 I), with A = 0.5092 kg^1/2 mol^-1/2 at
** 25 C (the usual handbook value, e.g. Robinson & Stokes, Electrolyte
** Solutions, 1959 [from memory]). */
static double davies(double z, double I)
{
  return -0.5092 * z * z * (sqrt(I) / (1 + sqrt(I)) - 0.3 * I);
}

/* Where the fraction of column j falls through 50 %. */
static double crossing(const eqp_curve *c, size_t j)
{
  for (size_t i = 1; i < eqp_curve_rows(c); i++) {
    double a = eqp_curve_value(c, i - 1, j), b = eqp_curve_value(c, i, j);
    if (a >= 0.5 && b < 0.5) {
      double x0 = eqp_curve_value(c, i - 1, 0), x1 = eqp_curve_value(c, i, 0);
      return x0 + (x1 - x0) * (a - 0.5) / (a - b);
    }
  }
  return NAN;
}

/* For HA = A + H+, Ka = a(H+) g(A) m(A) / (g(HA) m(HA)); where m(A) = m(HA)
** the pH (-log10 a(H+)) is pKa + log10(g(A)/g(HA)). Each form falls through
** 50 % there, less the tiny share of the third form (below 1e-4 here). The
** 0.003 allowed covers the spread of A at 25 C between sources (0.509 to
** 0.512; the engine derives its own from the density and permittivity of
** water) times the change of z^2 (up to 5) times the Davies term at
** I = 0.1 (0.21); at I = 0 the crossings are the pKa values themselves. */
static void distribution_phosphate(void **state)
{
  (void)state;
  eqp_ctx *ctx = test_ctx();
  double pKa[3], I = 0.1;
  library_pKa(pKa);
  const double z[4] = {0, -1, -2, -3};   /* H3PO4, H2PO4-, HPO4^2-, PO4^3- */
  for (int dilute = 0; dilute < 2; dilute++) {
    eqp_distribution_spec d = EQP_DISTRIBUTION_SPEC_INIT;
    d.system = "phosphate";
    d.pH_hi = 14;
    d.points = 14001;
    d.T = 298.15;
    d.ionic_strength = dilute ? 0 : I;
    d.activity = "davies";
    eqp_curve *c;
    if (eqp_distribution(ctx, &d, &c) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
    assert_int_equal(eqp_curve_cols(c), 5);
    assert_string_equal(eqp_curve_col_name(c, 1), "H3PO4");
    assert_string_equal(eqp_curve_col_name(c, 4), "PO4^3-");
    for (int k = 0; k < 3; k++) {
      double want = pKa[k];
      if (!dilute) want += davies(z[k + 1], I) - davies(z[k], I);
      assert_close(crossing(c, (size_t)k + 1), want, dilute ? 1e-4 : 3e-3);
    }
    /* the figure draws each form in % with the 50 % line */
    eqp_plot *p;
    assert_int_equal(eqp_plot_distribution(c, &d, &p), EQP_OK);
    assert_int_equal(p->nline, 4);
    assert_int_equal(p->nhline, 1);
    assert_close(p->hline[0].y, 50, 0);
    assert_string_equal(p->line[2].label, "HPO\xE2\x82\x84\xC2\xB2\xE2\x81\xBB");  /* HPO₄²⁻ */
    eqp_plot_free(p);
    eqp_curve_free(c);
  }
  /* a reagent or one form of the system names the same system */
  eqp_distribution_spec d2 = EQP_DISTRIBUTION_SPEC_INIT;
  d2.system = "NaH2PO4";
  eqp_curve *c2;
  assert_int_equal(eqp_distribution(ctx, &d2, &c2), EQP_OK);
  assert_int_equal(eqp_curve_cols(c2), 5);
  eqp_curve_free(c2);
  eqp_distribution_spec bad = EQP_DISTRIBUTION_SPEC_INIT;
  bad.system = "no such thing";
  assert_int_equal(eqp_distribution(ctx, &bad, &c2), EQP_E_UNKNOWN);
  eqp_ctx_free(ctx);
}

/* ------------------------------------------------------ capacity sweep */

/* A capacity sweep gives beta per litre of buffer (docs/lua-api.md), which
** at 80 C is 3 % below beta per kg of water (a litre of water holds 0.9718
** kg there: G. S. Kell, J. Chem. Eng. Data 20, 97 (1975) [from memory]).
** 50 mM acetate made at pH = pKa(80 C), ideal activities: D. D. Van Slyke,
** J. Biol. Chem. 52, 525 (1922), beta = ln10 (C Ka h / (Ka + h)^2 + h + Kw/h)
** = ln10 (C/4 + h) there (Kw/h below 1e-7). pKa(80 C) from 4.756, dH -0.41
** kJ/mol and dCp -142 J/(K mol) at 25 C (Goldberg, Kishore & Lennen, J.
** Phys. Chem. Ref. Data 31, 231 (2002)) by the integrated van't Hoff
** equation. 1 % covers the volume the solids take in the recipe (0.3 %). */
static void capacity_per_litre(void **state)
{
  (void)state;
  eqp_ctx *ctx = test_ctx();
  const double t0 = 298.15, T = 353.15, RL = 8.314462618 * log(10);
  double pK = 4.756 + -410 / RL * (1 / T - 1 / t0) + 142 / RL * (t0 / T - 1 + log(T / t0));
  const char *acetate[] = {"acetate"};
  eqp_capacity_spec cs = EQP_CAPACITY_SPEC_INIT;
  cs.buffers = acetate;
  cs.nbuffers = 1;
  cs.total = 0.050;
  cs.T = T;
  cs.activity = "ideal";
  cs.pH_lo = pK;
  cs.pH_hi = pK + 1;
  cs.points = 2;
  eqp_curve *c;
  if (eqp_capacity_sweep(ctx, &cs, &c) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  assert_close(eqp_curve_value(c, 0, 0), pK, 1e-12);
  assert_rel(eqp_curve_value(c, 0, 1), log(10) * (0.050 / 4 + pow(10, -pK)), 0.01);
  eqp_curve_free(c);
  eqp_ctx_free(ctx);
}

/* ---------------------------------------------------- printed tables */

/* The text table of a curve (print(curve) in Lua). */
static char *text_of(const eqp_curve *c)
{
  char *buf = NULL;
  size_t len = 0;
  FILE *f = open_memstream(&buf, &len);
  assert_non_null(f);
  assert_int_equal(eqp_curve_write_text(c, f), EQP_OK);
  fclose(f);
  return buf;
}

/* Line k (0: the names, 1: the units, 2: the first row) of a text table. */
static const char *line_of(const char *text, int k)
{
  for (; k > 0 && text; k--) text = strchr(text, '\n') ? strchr(text, '\n') + 1 : NULL;
  assert_non_null(text);
  return text;
}

/* Each column of a printed table is in the unit its second line names,
** whatever the curve: a distribution (fractions), a capacity sweep (mM per
** pH) and a temperature sweep (°C, mol/kg), not only a titration. Acetic
** acid at infinite dilution, pKa 4.756 (Goldberg, Kishore & Lennen, J.
** Phys. Chem. Ref. Data 31, 231 (2002)): at pH 4 the acid is
** 1 / (1 + 10^(4 - 4.756)) of the total; at pH = pKa its buffer capacity is
** ln10 (C/4 + h) (D. D. Van Slyke, J. Biol. Chem. 52, 525 (1922)), 28.8 mM
** per pH for C = 50 mM. Tris half neutralized with HCl, ideal: pH = pKa,
** 8.072 at 25 C (Goldberg et al. 2002). */
static void text_tables(void **state)
{
  (void)state;
  eqp_ctx *ctx = test_ctx();
  double pH, a, b;
  eqp_distribution_spec d = EQP_DISTRIBUTION_SPEC_INIT;
  d.system = "acetate";
  d.pH_lo = 4;
  d.pH_hi = 6;
  d.points = 3;
  eqp_curve *c;
  if (eqp_distribution(ctx, &d, &c) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  char *t = text_of(c);
  assert_contains(line_of(t, 1), "fraction");
  assert_int_equal(sscanf(line_of(t, 2), "%lf %lf %lf", &pH, &a, &b), 3);
  assert_close(pH, 4.0, 1e-9);
  assert_close(a, 1 / (1 + pow(10, 4 - 4.756)), 1e-4);
  assert_close(a + b, 1, 1e-4);
  free(t);
  eqp_curve_free(c);

  const char *acetate[] = {"acetate"};
  eqp_capacity_spec cs = EQP_CAPACITY_SPEC_INIT;
  cs.buffers = acetate;
  cs.nbuffers = 1;
  cs.total = 0.050;
  cs.activity = "ideal";
  cs.pH_lo = 4.756;
  cs.pH_hi = 5.756;
  cs.points = 2;
  if (eqp_capacity_sweep(ctx, &cs, &c) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  t = text_of(c);
  assert_contains(line_of(t, 1), "mM/pH");
  assert_int_equal(sscanf(line_of(t, 2), "%lf %lf", &pH, &b), 2);
  assert_close(pH, 4.756, 1e-9);
  assert_rel(b, log(10) * (0.050 / 4 + pow(10, -4.756)) * 1e3, 0.01);
  free(t);
  eqp_curve_free(c);

  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = "ideal";
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "Tris", "25 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "TrisHCl", "25 mmol"), EQP_OK);
  if (eqp_solution_temperature_sweep(s, 293.15, 303.15, 3, &c) != EQP_OK)
    fail_msg("%s", eqp_ctx_errmsg(ctx));
  t = text_of(c);
  assert_contains(line_of(t, 1), "\xC2\xB0" "C");
  assert_contains(line_of(t, 1), "mol/kg");
  assert_int_equal(sscanf(line_of(t, 3), "%lf %lf %lf", &a, &pH, &b), 3);
  assert_close(a, 25, 1e-9);
  assert_close(pH, 8.072, 0.002);
  assert_close(b, 0.025, 1e-4);
  free(t);
  eqp_curve_free(c);
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
}

/* ----------------------------------------------------------- output */

static int count_files(const char *dir)
{
  DIR *d = opendir(dir);
  int n = 0;
  for (struct dirent *e; d && (e = readdir(d));) n += e->d_name[0] != '.';
  if (d) closedir(d);
  return n;
}

static void formats_and_files(void **state)
{
  (void)state;
  eqp_ctx *ctx = test_ctx();
  eqp_plot *p;
  assert_int_equal(eqp_plot_new(ctx, &p), EQP_OK);
  double x[3] = {1, 2, 3}, y[3] = {4, NAN, 6}, inf[1] = {INFINITY};
  assert_int_equal(eqp_plot_add_line(p, "H2PO4-", 3, x, y), EQP_OK);
  assert_int_equal(eqp_plot_add_line(p, "bad", 1, x, inf), EQP_E_INPUT);
  assert_int_equal(eqp_plot_add_band(p, 2, 1, "backwards"), EQP_E_INPUT);
  assert_int_equal(eqp_plot_set_title(p, "two\nlines"), EQP_OK);
  assert_int_equal(eqp_plot_set_title(p, "three\nlines\nno"), EQP_E_INPUT);
  assert_int_equal(eqp_plot_set_axis(p, 0, "x & <y>", "mL", 0, 4), EQP_OK);
  static const struct { int fmt; const char *magic; } f[] = {
    {EQP_PLOT_SVG, "<?xml"}, {EQP_PLOT_PNG, "\x89PNG"}, {EQP_PLOT_PDF, "%PDF"}};
  for (int k = 0; k < 3; k++) {
    char *data;
    size_t len;
    if (eqp_plot_render(p, (eqp_plot_format)f[k].fmt, &data, &len) != EQP_OK)
      fail_msg("%s", eqp_ctx_errmsg(ctx));
    assert_true(len > 1000);
    assert_memory_equal(data, f[k].magic, strlen(f[k].magic));
    eqp_free_buffer(data);
  }
  char dir[] = "/tmp/eqp_plot_XXXXXX", path[256];
  assert_non_null(mkdtemp(dir));
  snprintf(path, sizeof path, "%s/figure.svg", dir);
  assert_int_equal(eqp_plot_write(p, path), EQP_OK);
  assert_int_equal(count_files(dir), 1);                /* no temporary left behind */
  snprintf(path, sizeof path, "%s/figure.gif", dir);
  assert_int_equal(eqp_plot_write(p, path), EQP_E_INPUT);
  snprintf(path, sizeof path, "%s/no/such/folder/figure.png", dir);
  assert_int_equal(eqp_plot_write(p, path), EQP_E_WRITE);
  assert_contains(eqp_ctx_errmsg(ctx), "cannot write");
  snprintf(path, sizeof path, "%s/figure.svg", dir);
  unlink(path);
  rmdir(dir);
  eqp_plot_free(p);
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(palette_distinct),
    cmocka_unit_test(titration_strong),
    cmocka_unit_test(titration_acetic),
    cmocka_unit_test(distribution_phosphate),
    cmocka_unit_test(capacity_per_litre),
    cmocka_unit_test(text_tables),
    cmocka_unit_test(formats_and_files),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
