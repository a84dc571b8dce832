/* Seeded random recipes over every activity model, 1e-10 to 5 mol/kg,
** strong acid to strong base, 0 to 90 C: each either gives a
** result whose balances close, recomputed here from the reported molalities
** and the formulas of the species (a parser of our own, through the public
** accessors only, independent of the solver's verification), or is refused
** cleanly with a message. No failure is tolerated.
**
** EQP_STRESS_N sets the number of recipes (default 21000, 3000 per model
** with the default model counted as one), EQP_STRESS_SEED the seed. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include <ctype.h>

static unsigned long long rng = 0x9e3779b97f4a7c15ULL;

static double uniform(void)
{
  rng ^= rng << 13;
  rng ^= rng >> 7;
  rng ^= rng << 17;
  return (double)(rng >> 11) / 9007199254740992.0;
}

/* The models and their stated ranges of ionic strength (mol/kg), as
** docs/activity-models.md gives them; NULL is the default model. */
static const struct { const char *name; double Imax; } models[] = {
  {"ideal", 0}, {"dh-limiting", 0.005}, {"dh-extended", 0.1}, {"davies", 0.5},
  {"bdot", 1.0}, {"sit", 3.5}, {NULL, 3.5},
};
#define NMODELS ((int)(sizeof models / sizeof models[0]))

/* ------------------------------------------------------------ formulas */

/* Element counts by symbol; charge. Independent of the engine's parser. */
#define MAXEL 24
typedef struct comp {
  int n;
  char sym[MAXEL][3];
  double cnt[MAXEL];
  double charge;
} comp;

static void comp_add(comp *c, const char *sym, double k)
{
  for (int i = 0; i < c->n; i++)
    if (strcmp(c->sym[i], sym) == 0) { c->cnt[i] += k; return; }
  assert_true(c->n < MAXEL);
  snprintf(c->sym[c->n], 3, "%s", sym);
  c->cnt[c->n++] = k;
}

static double comp_get(const comp *c, const char *sym)
{
  for (int i = 0; i < c->n; i++)
    if (strcmp(c->sym[i], sym) == 0) return c->cnt[i];
  return 0;
}

static double number(const char **p, double dflt)
{
  if (!isdigit((unsigned char)**p)) return dflt;
  char *end;
  double v = (double)strtoul(*p, &end, 10);   /* integers: "Cl2.6H2O" is Cl2 . 6 H2O */
  *p = end;
  return v;
}

/* group := (Element | '(' group* ')') count?, repeated until ')' '.' '^' '+' '-' or end */
static void parse_groups(const char **p, comp *c, double k)
{
  while (**p && **p != ')' && **p != '.' && **p != '^' && **p != '+' && **p != '-') {
    if (**p == '(') {
      (*p)++;
      comp inner = {0};
      parse_groups(p, &inner, 1);
      if (**p != ')') fail_msg("unbalanced parenthesis");
      (*p)++;
      double m = number(p, 1);
      for (int i = 0; i < inner.n; i++) comp_add(c, inner.sym[i], k * m * inner.cnt[i]);
    } else if (isupper((unsigned char)**p)) {
      char sym[3] = {**p, 0, 0};
      (*p)++;
      if (islower((unsigned char)**p)) sym[1] = *(*p)++;
      comp_add(c, sym, k * number(p, 1));
    } else {
      fail_msg("cannot read formula at '%s'", *p);
    }
  }
}

/* "Na2HPO4.7H2O", "C4H11NO3.HCl", "B(OH)4-", "HPO4^2-", "Ca^2+" */
static void parse_formula(const char *f, comp *c)
{
  memset(c, 0, sizeof *c);
  const char *p = f;
  parse_groups(&p, c, 1);
  while (*p == '.') {
    p++;
    double k = number(&p, 1);
    parse_groups(&p, c, k);
  }
  if (*p == '^') {
    p++;
    double z = number(&p, 1);
    if (*p != '+' && *p != '-') fail_msg("formula %s: sign expected", f);
    c->charge = *p == '+' ? z : -z;
    p++;
  } else if (*p == '+' || *p == '-') {
    c->charge = *p == '+' ? 1 : -1;
    p++;
  }
  if (*p) fail_msg("formula %s: unread '%s'", f, p);
}

/* ------------------------------------------------------------ balances */

typedef struct added {
  int n;
  const char *reagent[4];
  double mol[4];
} added;

/* Recompute I, charge, every element but H and O, and H - 2 O (the proton
** balance: invariant under any exchange of water) from the result. Returns
** a description of the first balance that does not close, or NULL. */
static const char *check_balances(eqp_ctx *ctx, const eqp_result *r, const added *a,
                                  char *why, size_t len)
{
  const double tol = 1e-9;
  double W = eqp_result_water(r), q = 0, qa = 0, I = 0;
  comp in = {0}, out = {0}, absout = {0};
  double hin = 0, hin_abs = 0, hout = 0, hout_abs = 0;
  for (int k = 0; k < a->n; k++) {
    comp c;
    parse_formula(eqp_ctx_formula(ctx, a->reagent[k]), &c);
    for (int e = 0; e < c.n; e++) comp_add(&in, c.sym[e], a->mol[k] * c.cnt[e]);
    double h = comp_get(&c, "H") - 2 * comp_get(&c, "O");
    hin += a->mol[k] * h;
    hin_abs += fabs(a->mol[k] * h);
  }
  if (!isfinite(eqp_result_pH(r)) || !isfinite(eqp_result_ionic_strength(r)) ||
      !(W > 0) || !isfinite(W))
    return snprintf(why, len, "non-finite pH %g, I %g or water %g", eqp_result_pH(r),
                    eqp_result_ionic_strength(r), W), why;
  for (size_t i = 0; i < eqp_result_species_count(r); i++) {
    const char *name = eqp_result_species_name(r, i);
    double m = eqp_result_species_molality(r, i), lg = eqp_result_species_log_gamma(r, i);
    if (!isfinite(m) || m < 0 || !isfinite(lg))
      return snprintf(why, len, "%s: molality %g, log gamma %g", name, m, lg), why;
    if (strcmp(name, "H2O") == 0) continue;
    comp c;
    parse_formula(eqp_ctx_formula(ctx, name), &c);
    for (int e = 0; e < c.n; e++) {
      comp_add(&out, c.sym[e], m * W * c.cnt[e]);
      comp_add(&absout, c.sym[e], m * W * c.cnt[e]);
    }
    double h = comp_get(&c, "H") - 2 * comp_get(&c, "O");
    hout += m * W * h;
    hout_abs += fabs(m * W * h);
    q += c.charge * m;
    qa += fabs(c.charge) * m;
    I += 0.5 * c.charge * c.charge * m;
  }
  double Ir = eqp_result_ionic_strength(r);
  if (!(fabs(I - Ir) <= tol * I))
    return snprintf(why, len, "ionic strength %.17g reported, %.17g recomputed", Ir, I), why;
  if (!(fabs(q) <= tol * qa))
    return snprintf(why, len, "charge %.3g of %.3g mol/kg", q, qa), why;
  for (int e = 0; e < in.n; e++) {
    if (strcmp(in.sym[e], "H") == 0 || strcmp(in.sym[e], "O") == 0) continue;
    double got = comp_get(&out, in.sym[e]), want = in.cnt[e];
    if (!(fabs(got - want) <= tol * fmax(want, got)))
      return snprintf(why, len, "element %s: %.17g mol in species, %.17g added", in.sym[e],
                      got, want), why;
  }
  for (int e = 0; e < out.n; e++)
    if (comp_get(&in, out.sym[e]) == 0 && strcmp(out.sym[e], "H") && strcmp(out.sym[e], "O") &&
        out.cnt[e] > 0)
      return snprintf(why, len, "element %s appears from nothing", out.sym[e]), why;
  if (!(fabs(hout - hin) <= tol * (hout_abs + hin_abs)))
    return snprintf(why, len, "proton balance (H - 2 O): %.17g in species, %.17g added", hout,
                    hin), why;
  return NULL;
}

static int has_warning(const eqp_result *r, const char *what)
{
  for (size_t i = 0; i < eqp_result_warning_count(r); i++)
    if (strstr(eqp_result_warning(r, i), what)) return 1;
  return 0;
}

/* ------------------------------------------------------------ the runs */

static int env_int(const char *name, int dflt)
{
  const char *v = getenv(name);
  return v && *v ? atoi(v) : dflt;
}

static void test_random_recipes(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const int nr = (int)eqp_ctx_reagent_count(ctx);
  int N = env_int("EQP_STRESS_N", 21000);
  int solved[NMODELS] = {0}, refused[NMODELS] = {0}, failures = 0, warned = 0;
  int by_rc[16] = {0};
  for (int t = 0; t < N; t++) {
    int mi = t % NMODELS;
    eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
    o.water = 1;
    o.temperature_K = 273.15 + 90 * uniform();
    o.activity = models[mi].name;
    eqp_solution *s;
    assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
    added a = {0};
    int k = 1 + (int)(uniform() * 3);
    double total = 0;
    char recipe[512];
    size_t used = (size_t)snprintf(recipe, sizeof recipe, "%s at %.2f C:",
                                   o.activity ? o.activity : "default", o.temperature_K - 273.15);
    for (int j = 0; j < k; j++) {
      double mol = pow(10, -10 + uniform() * 10.7);   /* 1e-10 .. 5 */
      if (total + mol > 5) mol = 5 - total;
      total += mol;
      const char *g = eqp_ctx_reagent_name(ctx, (size_t)(uniform() * nr));
      assert_int_equal(eqp_solution_add(s, g, mol, EQP_Q_AMOUNT), EQP_OK);
      a.reagent[a.n] = g;
      a.mol[a.n++] = mol;
      if (used < sizeof recipe)
        used += (size_t)snprintf(recipe + used, sizeof recipe - used, " %s %.17g mol", g, mol);
    }
    eqp_result *r;
    int rc = eqp_solution_equilibrate(s, &r);
    if (rc == EQP_OK) {
      char why[512];
      const char *bad = check_balances(ctx, r, &a, why, sizeof why);
      double I = eqp_result_ionic_strength(r);
      if (!bad && models[mi].Imax > 0 && I > models[mi].Imax * (1 + 1e-6) &&
          !has_warning(r, "ionic strength"))
        bad = "beyond the model's range without a warning";
      /* the default: Davies up to 0.5 mol/kg, beyond it another model and a notice */
      if (!bad && !models[mi].name && I > 0.5 * (1 + 1e-6) &&
          (!has_warning(r, "default activity model") ||
           strcmp(eqp_result_activity_model(r), "davies") == 0))
        bad = "the default model beyond 0.5 mol/kg without giving way";
      if (bad) {
        failures++;
        printf("  FAILURE recipe %d (%s): %s\n", t, recipe, bad);
      }
      warned += eqp_result_warning_count(r) > 0;
      solved[mi]++;
      eqp_result_free(r);
    } else {
      refused[mi]++;
      by_rc[-rc < 16 ? -rc : 15]++;
      /* a clean refusal: no convergence or a failed verification with the
      ** residuals, or (default model only) an ionic strength beyond every
      ** model it may use */
      int clean = (rc == EQP_E_CONVERGE || rc == EQP_E_VERIFY ||
                   (rc == EQP_E_INPUT && !models[mi].name)) &&
                  strlen(eqp_ctx_errmsg(ctx)) > 20;
      if (!clean) {
        failures++;
        printf("  FAILURE recipe %d (%s): status %s: %s\n", t, recipe, eqp_status_name(rc),
               eqp_ctx_errmsg(ctx));
      } else if (rc != EQP_E_INPUT) {
        printf("  refused: recipe %d (%s): %s\n", t, recipe, eqp_ctx_errmsg(ctx));
      }
    }
    eqp_solution_free(s);
  }
  int ns = 0, nf = 0;
  printf("  %d random recipes, seed %llu, %d models (and the default), 0-90 C, 1e-10-5 mol/kg:\n",
         N, (unsigned long long)env_int("EQP_STRESS_SEED", 0), NMODELS - 1);
  for (int m = 0; m < NMODELS; m++) {
    printf("    %-12s %5d solved, %4d refused\n", models[m].name ? models[m].name : "(default)",
           solved[m], refused[m]);
    ns += solved[m];
    nf += refused[m];
  }
  printf("  solved and balanced %d (%d with a warning), refused %d (no convergence %d, "
         "verification %d, beyond the default model's reach %d), failures %d\n", ns, warned,
         nf, by_rc[-EQP_E_CONVERGE], by_rc[-EQP_E_VERIFY], by_rc[-EQP_E_INPUT], failures);
  assert_int_equal(failures, 0);
  eqp_ctx_free(ctx);
}

/* Random pH adjustments: each either reaches its target exactly (checked by
** a fresh solve) or is refused as out of reach, with a message. */
static void test_random_adjustments(void **state)
{
  static const char *const start[] = {"CH3COONa", "NaH2PO4", "TrisHCl", "KHP", "HCl", "NaOH",
                                      "Na2HPO4", "Tris"};
  static const char *const titrant[] = {"HCl", "NaOH", "KOH", "HNO3", "CH3COOH", "Tris"};
  eqp_ctx *ctx = test_ctx();
  int reached = 0, refused = 0, N = env_int("EQP_STRESS_N", 21000) / 20;
  for (int t = 0; t < N; t++) {
    int mi = t % NMODELS;
    eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
    o.water = 1;
    o.temperature_K = 273.15 + 90 * uniform();
    o.activity = models[mi].name;
    eqp_solution *s;
    assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
    const char *s0 = start[(int)(uniform() * 8)];
    double m0 = pow(10, -4 + 3.5 * uniform());
    eqp_solution_add(s, s0, m0, EQP_Q_AMOUNT);
    double target = 2 + 10 * uniform(), mol, L;
    const char *g = titrant[(int)(uniform() * 6)];
    int rc = eqp_solution_adjust_pH(s, target, g, NULL, &mol, &L);
    if (rc == EQP_OK) {
      eqp_result *r;
      assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);
      if (!(fabs(eqp_result_pH(r) - target) < 1e-8))
        fail_msg("adjust %d (%s at %.17g K, %.17g mol %s) with %s to %.17g gave %.10f", t,
                 o.activity ? o.activity : "default", o.temperature_K, m0, s0, g, target,
                 eqp_result_pH(r));
      assert_true(mol >= 0 && isfinite(mol));
      eqp_result_free(r);
      reached++;
    } else {
      if (rc != EQP_E_INPUT) fail_msg("adjust %d: %s", t, eqp_ctx_errmsg(ctx));
      if (!strstr(eqp_ctx_errmsg(ctx), "out of reach") &&
          !(models[mi].name == NULL && strstr(eqp_ctx_errmsg(ctx), "default activity model")))
        fail_msg("adjust %d: %s", t, eqp_ctx_errmsg(ctx));
      refused++;
    }
    eqp_solution_free(s);
  }
  printf("  %d random adjustments: %d reached their pH, %d refused as out of reach\n", N,
         reached, refused);
  eqp_ctx_free(ctx);
}

int main(void)
{
  if (getenv("EQP_STRESS_SEED"))
    rng ^= strtoull(getenv("EQP_STRESS_SEED"), NULL, 10) * 0x2545F4914F6CDD1DULL;
  const struct CMUnitTest tests[] = {cmocka_unit_test(test_random_recipes),
                                     cmocka_unit_test(test_random_adjustments)};
  return cmocka_run_group_tests(tests, NULL, NULL);
}
