/* Species libraries as immutable snapshots: a solution and its results keep
** the library they were made with; a library extended or restricted for one
** solution changes no other; making and dropping libraries in a loop keeps
** memory flat; a reagent has any number of other names. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"

/* An acid of our own (the constants are invented for these tests). The
** check that uses it is Henderson-Hasselbalch at equal amounts of acid and
** salt, which mass action makes exact in an ideal solution when [H+] and
** [OH-] are negligible beside the buffer: pH = pKa. */
static void acid_text(char *buf, size_t len, const char *tag, double pKa)
{
  snprintf(buf, len,
           "return {\n"
           "  sources = { t = 'invented for this test' },\n"
           "  species = { { 'H%s', formula = 'C2H4O2' }, { '%s-', formula = 'C2H3O2-' } },\n"
           "  acids = { { 'H%s', '%s-', pKa = %.4f, source = 't' } },\n"
           "  reagents = { { 'Na%s', formula = 'C2H3O2Na', gives = { ['Na+'] = 1, ['%s-'] = 1 } } },\n"
           "}\n", tag, tag, tag, tag, pKa, tag, tag);
}

static eqp_solution *solution_in(eqp_ctx *ctx, const eqp_library *lib, const char *model)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = model;
  eqp_solution *s;
  if (eqp_solution_new_in(ctx, lib, &o, &s) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  return s;
}

static double pH_of(eqp_ctx *ctx, eqp_solution *s)
{
  eqp_result *r;
  if (eqp_solution_equilibrate(s, &r) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  double pH = eqp_result_pH(r);
  eqp_result_free(r);
  return pH;
}

/* A load into the context makes a new library: what was made before keeps
** the old one, what is made after sees both. */
static void test_solutions_keep_their_library(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const eqp_library *before = eqp_ctx_library(ctx);
  size_t n = eqp_library_species_count(before);
  eqp_solution *old = solution_in(ctx, NULL, "davies");
  assert_ptr_equal(eqp_solution_library(old), before);
  assert_int_equal(eqp_solution_add_str(old, "KH2PO4", "25 mmol"), EQP_OK);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(old, &r), EQP_OK);
  char t[1024];
  acid_text(t, sizeof t, "Qz", 4.5);
  assert_int_equal(eqp_ctx_load_species_text(ctx, t, strlen(t), "qz.lua"), EQP_OK);
  const eqp_library *after = eqp_ctx_library(ctx);
  assert_true(after != before);
  assert_int_equal(eqp_library_species_count(after), n + 2);
  /* the old solution's library is as it was: listing it lists what it had */
  assert_int_equal(eqp_library_species_count(eqp_solution_library(old)), n);
  assert_int_equal(eqp_solution_add_str(old, "NaQz", "1 mmol"), EQP_E_UNKNOWN);
  eqp_solution *fresh = solution_in(ctx, NULL, "davies");
  assert_int_equal(eqp_solution_add_str(fresh, "NaQz", "1 mmol"), EQP_OK);
  /* the result outlives its solution, and its library the context's change */
  eqp_solution_free(old);
  size_t ns = eqp_result_species_count(r);
  assert_true(ns > 3);
  for (size_t i = 0; i < ns; i++) assert_non_null(eqp_result_species_name(r, i));
  double m;
  assert_int_equal(eqp_result_molality(r, "H2PO4-", &m), EQP_OK);
  assert_true(m > 0.02);
  assert_int_equal(eqp_result_molality(r, "Qz-", &m), EQP_E_UNKNOWN);
  eqp_result_free(r);
  eqp_solution_free(fresh);
  eqp_ctx_free(ctx);
}

/* A library extended for one solution: the context's library and every
** other solution's stay as they are; the same extension again is the same
** library while it lives. */
static void test_extend_for_one_solution(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const eqp_library *base = eqp_ctx_library(ctx), *lib, *again;
  size_t n = eqp_library_species_count(base);
  char t[1024];
  acid_text(t, sizeof t, "Wz", 5.25);
  assert_int_equal(eqp_library_extend_text(ctx, base, t, strlen(t), "mine", &lib), EQP_OK);
  assert_int_equal(eqp_library_species_count(lib), n + 2);
  assert_ptr_equal(eqp_ctx_library(ctx), base);
  assert_int_equal(eqp_ctx_species_count(ctx), n);
  assert_int_equal(eqp_library_extend_text(ctx, base, t, strlen(t), "mine", &again), EQP_OK);
  assert_ptr_equal(again, lib);
  eqp_library_free(again);
  eqp_solution *s = solution_in(ctx, lib, "ideal"), *other = solution_in(ctx, NULL, "ideal");
  eqp_library_free(lib);                   /* the solution holds it */
  assert_int_equal(eqp_solution_add_str(s, "HWz", "10 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "NaWz", "10 mmol"), EQP_OK);
  assert_close(pH_of(ctx, s), 5.25, 1e-3);    /* Henderson-Hasselbalch, equal amounts */
  assert_int_equal(eqp_solution_add_str(other, "NaWz", "10 mmol"), EQP_E_UNKNOWN);
  /* a copy keeps the library; a stock from it pours into a solution that
  ** has its components, and not into one that lacks them */
  eqp_solution *copy;
  assert_int_equal(eqp_solution_copy(s, &copy), EQP_OK);
  assert_ptr_equal(eqp_solution_library(copy), eqp_solution_library(s));
  assert_int_equal(eqp_solution_add_str(other, "NaCl", "1 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_pour(copy, other, 0.1), EQP_OK);     /* NaCl into s's */
  double na;
  assert_int_equal(eqp_solution_total(copy, "Na+", &na), EQP_OK);
  assert_close(na, 10e-3 + 0.1 / eqp_solution_volume(other) * 1e-3, 1e-15);
  assert_int_equal(eqp_solution_pour(other, s, 0.1), EQP_E_UNKNOWN);
  assert_contains(eqp_ctx_errmsg(ctx), "the stock holds Wz-");
  eqp_solution_free(copy);
  eqp_solution_free(s);
  eqp_solution_free(other);
  eqp_ctx_free(ctx);
}

/* The IUPAC primary phosphate standard, 0.025 m KH2PO4 + 0.025 m Na2HPO4,
** pH(S) 6.865 at 25 C (R. P. Buck et al., 'Measurement of pH. Definition,
** standards, and procedures', Pure Appl. Chem. 74, 2169-2200 (2002)); the
** design bar is 0.02 with the Davies model. */
static double phosphate_standard(eqp_ctx *ctx, const eqp_library *lib)
{
  eqp_solution *s = solution_in(ctx, lib, "davies");
  if (eqp_solution_add_str(s, "KH2PO4", "25 mmol") || eqp_solution_add_str(s, "Na2HPO4", "25 mmol"))
    fail_msg("%s", eqp_ctx_errmsg(ctx));
  double pH = pH_of(ctx, s);
  eqp_solution_free(s);
  return pH;
}

/* A library restricted to some species files: only those, what they build
** on and the solvent; nothing else reaches the solver. */
static void test_only(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const eqp_library *base = eqp_ctx_library(ctx), *lib, *again;
  const char *only[] = {"phosphate"};
  assert_int_equal(eqp_library_only(ctx, base, only, 1, &lib), EQP_OK);
  assert_true(eqp_library_species_count(lib) < eqp_library_species_count(base));
  assert_int_equal(eqp_library_only(ctx, base, only, 1, &again), EQP_OK);
  assert_ptr_equal(again, lib);
  eqp_library_free(again);
  double full = phosphate_standard(ctx, NULL), part = phosphate_standard(ctx, lib);
  assert_close(full, 6.865, 0.02);
  assert_close(part, 6.865, 0.02);
  assert_close(part, full, 1e-9);        /* no phosphate complex of Na+ or K+ is left out */
  eqp_solution *s = solution_in(ctx, lib, "davies");
  assert_int_equal(eqp_solution_add_str(s, "NaOH", "1 mmol"), EQP_OK);   /* built on */
  assert_int_equal(eqp_solution_add_str(s, "TrisHCl", "1 mmol"), EQP_E_UNKNOWN);
  assert_int_equal(eqp_solution_add_str(s, "Na2HPO4", "10 mmol"), EQP_OK);
  /* its totals pour into a solution of the whole library by name */
  eqp_solution *whole = solution_in(ctx, NULL, "davies");
  assert_int_equal(eqp_solution_pour(whole, s, eqp_solution_volume(s)), EQP_OK);
  double p, na;
  assert_int_equal(eqp_solution_total(whole, "PO4^3-", &p), EQP_OK);
  assert_int_equal(eqp_solution_total(whole, "Na+", &na), EQP_OK);
  assert_close(p, 10e-3, 1e-15);
  assert_close(na, 21e-3, 1e-15);
  eqp_solution_free(whole);
  eqp_solution_free(s);
  /* a species file names a system: an unknown one is refused */
  const char *bad[] = {"phosphat"};
  const eqp_library *none;
  assert_int_equal(eqp_library_only(ctx, base, bad, 1, &none), EQP_E_UNKNOWN);
  assert_null(none);
  assert_contains(eqp_ctx_errmsg(ctx), "no species file 'phosphat'");
  assert_contains(eqp_ctx_errmsg(ctx), "phosphate");
  eqp_library_free(lib);
  eqp_ctx_free(ctx);
}

static void test_without(void **state)
{
  eqp_ctx *ctx = test_ctx();
  const eqp_library *base = eqp_ctx_library(ctx), *lib;
  const char *metals[] = {"metals", "chelators"}, *alone[] = {"metals"};
  assert_int_equal(eqp_library_without(ctx, base, alone, 1, &lib), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "chelators.lua builds on it");
  assert_int_equal(eqp_library_without(ctx, base, metals, 2, &lib), EQP_OK);
  eqp_solution *s = solution_in(ctx, lib, "davies");
  assert_int_equal(eqp_solution_add_str(s, "KH2PO4", "1 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "CuSO4", "1 mmol"), EQP_E_UNKNOWN);
  eqp_solution_free(s);
  eqp_library_free(lib);
  /* what others build on cannot go alone, nor can the solvent */
  const char *strong[] = {"strong"}, *water[] = {"water"};
  assert_int_equal(eqp_library_without(ctx, base, strong, 1, &lib), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "builds on it");
  assert_int_equal(eqp_library_without(ctx, base, water, 1, &lib), EQP_E_INPUT);
  assert_contains(eqp_ctx_errmsg(ctx), "solvent");
  eqp_ctx_free(ctx);
}

/* An allocator that counts the bytes in use. */
typedef struct counter {
  long long bytes;
} counter;

static void *count_alloc(void *ud, void *p, size_t o, size_t n)
{
  counter *c = ud;
  if (!p) o = 0;
  if (n == 0) {
    free(p);
    c->bytes -= (long long)o;
    return NULL;
  }
  void *q = realloc(p, n);
  if (q) c->bytes += (long long)n - (long long)o;
  return q;
}

/* A library of its own for every solution of a long loop (an acid whose
** pKa changes from one to the next, as in fitting a constant) neither
** grows the context nor keeps anything once each solution is gone. */
static void test_memory_flat(void **state)
{
  counter c = {0};
  eqp_ctx *ctx = eqp_ctx_new(count_alloc, &c);
  assert_non_null(ctx);
  assert_int_equal(eqp_ctx_load_default_library(ctx), EQP_OK);
  size_t n = eqp_ctx_species_count(ctx);
  long long at[2] = {0, 0};
  char same[1024];
  acid_text(same, sizeof same, "Sz", 3.0);
  for (int i = 0; i < 1500; i++) {
    char t[1024];
    double pKa = 6 + 0.001 * i;      /* [H+], [OH-] < 1e-6 m beside 10 mmol */
    acid_text(t, sizeof t, "Vz", pKa);
    const eqp_library *lib;
    if (eqp_library_extend_text(ctx, eqp_ctx_library(ctx), t, strlen(t), "fit", &lib))
      fail_msg("%s", eqp_ctx_errmsg(ctx));
    eqp_solution *s = solution_in(ctx, lib, "ideal");
    eqp_library_free(lib);
    assert_int_equal(eqp_solution_add_str(s, "HVz", "10 mmol"), EQP_OK);
    assert_int_equal(eqp_solution_add_str(s, "NaVz", "10 mmol"), EQP_OK);
    assert_close(pH_of(ctx, s), pKa, 1e-3);   /* Henderson-Hasselbalch, equal amounts */
    eqp_solution_free(s);
    /* and loading the same text into the context again and again */
    assert_int_equal(eqp_ctx_load_species_text(ctx, same, strlen(same), "same.lua"), EQP_OK);
    if (i == 100) at[0] = c.bytes;
    if (i == 1499) at[1] = c.bytes;
  }
  print_message("bytes in use after 100 and 1500 libraries: %lld, %lld\n", at[0], at[1]);
  assert_true(at[0] == at[1]);
  assert_true(eqp_ctx_species_count(ctx) > n);
  eqp_ctx_free(ctx);
  assert_true(c.bytes == 0);
}

/* A reagent with 40 other names: each finds it (an earlier index held 31). */
static void test_forty_aliases(void **state)
{
  eqp_ctx *ctx = test_ctx();
  char t[8192];
  size_t used = (size_t)snprintf(t, sizeof t, "return {\n reagents = { { 'NaCl2x', formula = "
                                 "'NaCl', gives = { ['Na+'] = 1, ['Cl-'] = 1 }, names = {");
  for (int i = 1; i <= 40; i++)
    used += (size_t)snprintf(t + used, sizeof t - used, "%s'salt no. %d'", i > 1 ? ", " : " ", i);
  snprintf(t + used, sizeof t - used, " } } },\n}\n");
  assert_int_equal(eqp_ctx_load_species_text(ctx, t, strlen(t), "aliases.lua"), EQP_OK);
  double want, got;
  assert_int_equal(eqp_ctx_reagent_molar_mass(ctx, "NaCl", &want), EQP_OK);
  for (int i = 1; i <= 40; i++) {
    char name[32];
    snprintf(name, sizeof name, "salt no. %d", i);
    if (eqp_ctx_reagent_molar_mass(ctx, name, &got) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
    assert_close(got, want, 0);
  }
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_solutions_keep_their_library),
    cmocka_unit_test(test_extend_for_one_solution),
    cmocka_unit_test(test_only),
    cmocka_unit_test(test_without),
    cmocka_unit_test(test_memory_flat),
    cmocka_unit_test(test_forty_aliases),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
