/* Plugin ABI: loading, refusals with clear messages, the two built-in models. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"
#include <unistd.h>

static eqp_ctx *fixture_ctx(void)
{
  eqp_ctx *ctx = test_ctx();
  const char *dir = getenv("EQP_FIXTURE_DIR");
  assert_non_null(dir);
  assert_int_equal(eqp_ctx_add_plugin_dir(ctx, dir), EQP_OK);
  return ctx;
}

static void refused(const char *name, const char *needle)
{
  eqp_ctx *ctx = fixture_ctx();
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1;
  o.temperature_K = 298.15;
  o.activity = name;
  eqp_solution *s = NULL;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_E_PLUGIN);
  assert_null(s);
  assert_contains(eqp_ctx_errmsg(ctx), needle);
  assert_contains(eqp_ctx_errmsg(ctx), name);
  eqp_ctx_free(ctx);
}

static void test_refusals(void **state)
{
  refused("bad_abi", "plugin ABI 2.0, this engine needs 1.x");
  refused("truncated", "descriptor is");
  refused("failing", "licence file missing");
  refused("no_such_model", "not found in");
  refused("../etc", "not a plugin name");
}

static void test_checks_directly(void **state)
{
  static const eqp_activity_ops ops = {sizeof ops, NULL, NULL, NULL, NULL, NULL, NULL, NULL};
  eqp_plugin_desc d = {EQP_PLUGIN_ABI_VERSION, sizeof d, EQP_PLUGIN_SIZES, EQP_PLUGIN_ACTIVITY,
                       "x", "1", "s", &ops, 0};
  char err[256];
  assert_int_equal(eqpi_plugin_check(&d, "x.so", err, sizeof err), -1);  /* no operations */
  assert_contains(err, "incomplete");
  d.sizes = 0x0404;
  assert_int_equal(eqpi_plugin_check(&d, "x.so", err, sizeof err), -1);
  assert_contains(err, "number sizes");
  d.sizes = EQP_PLUGIN_SIZES;
  d.kind = 7;
  assert_int_equal(eqpi_plugin_check(&d, "x.so", err, sizeof err), -1);
  assert_contains(err, "unknown plugin kind 7");
  assert_int_equal(eqpi_plugin_check(NULL, "x.so", err, sizeof err), -1);
}

/* Where the listing found a plugin by name. */
typedef struct where_is { const char *name; char path[4096]; } where_is;

static void find_path(void *ud, const char *name, const char *version, const char *summary,
                      const char *path)
{
  where_is *w = ud;
  if (name && strcmp(name, w->name) == 0 && !w->path[0]) snprintf(w->path, sizeof w->path, "%s", path);
}

static int copy_file(const char *from, const char *to)
{
  FILE *a = fopen(from, "rb"), *b = fopen(to, "wb");
  char buf[65536];
  size_t n;
  int ok = a && b;
  while (ok && (n = fread(buf, 1, sizeof buf, a)) > 0) ok = fwrite(buf, 1, n, b) == n;
  if (a) fclose(a);
  if (b && fclose(b) != 0) ok = 0;
  return ok ? 0 : -1;
}

/* A valid plugin under another file name (cp davies.so mydavies.so) is
** refused with a message; the name it reports was once read after the
** module was closed (a crash, exit 139). */
static void test_renamed_plugin(void **state)
{
  eqp_ctx *ctx = test_ctx();
  where_is w = {"davies", ""};
  assert_int_equal(eqp_ctx_list_plugins(ctx, find_path, &w), EQP_OK);
  assert_true(w.path[0] != '\0');
  char dir[] = "/tmp/eqp-renamed-XXXXXX", copy[4200];
  assert_non_null(mkdtemp(dir));
  snprintf(copy, sizeof copy, "%s/mydavies.so", dir);
  assert_int_equal(copy_file(w.path, copy), 0);
  assert_int_equal(eqp_ctx_add_plugin_dir(ctx, dir), EQP_OK);
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1;
  o.temperature_K = 298.15;
  o.activity = "mydavies";
  eqp_solution *s = NULL;
  for (int twice = 0; twice < 2; twice++) {     /* nothing of the refusal stays behind */
    assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_E_PLUGIN);
    assert_null(s);
    assert_contains(eqp_ctx_errmsg(ctx), "mydavies.so");
    assert_contains(eqp_ctx_errmsg(ctx), "calls itself 'davies'");
  }
  o.activity = "davies";               /* the real one still loads */
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  eqp_solution_free(s);
  remove(copy);
  rmdir(dir);
  eqp_ctx_free(ctx);
}

/* The 'x' a fixture wrote at the end of a message: exactly the buffer
** less its last byte, which the engine reserves for the NUL, and nothing
** read beyond it. */
static size_t trailing_x(const char *msg)
{
  size_t n = strlen(msg), k = 0;
  while (k < n && msg[n - 1 - k] == 'x') k++;
  return k;
}

static void test_unterminated_messages(void **state)
{
  eqp_ctx *ctx = fixture_ctx();
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 1;
  o.temperature_K = 298.15;
  o.activity = "unterm_entry";
  eqp_solution *s = NULL;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_E_PLUGIN);        /* entry */
  assert_contains(eqp_ctx_errmsg(ctx), "plugin refused to load: xxx");
  assert_int_equal(trailing_x(eqp_ctx_errmsg(ctx)), 255);
  o.activity = "unterm_create";
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_E_PLUGIN);        /* create */
  assert_int_equal(trailing_x(eqp_ctx_errmsg(ctx)), 255);
  o.activity = "unterm_bind";
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_set_activity_param(s, "a", 1), EQP_E_PLUGIN);   /* set_param */
  assert_int_equal(trailing_x(eqp_ctx_errmsg(ctx)), 255);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "10 mmol"), EQP_OK);
  eqp_result *r;
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_OK);             /* bind's warning */
  int seen = 0;
  for (size_t i = 0; i < eqp_result_warning_count(r); i++)
    if (strstr(eqp_result_warning(r, i), "xxx")) {
      assert_int_equal(trailing_x(eqp_result_warning(r, i)), 255);
      seen = 1;
    }
  assert_true(seen);
  eqp_result_free(r);
  eqp_solution_free(s);
  o.activity = "unterm_gamma";
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "NaCl", "10 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_equilibrate(s, &r), EQP_E_PLUGIN);       /* log_gamma */
  assert_contains(eqp_ctx_errmsg(ctx), "unterm_gamma");
  assert_int_equal(trailing_x(eqp_ctx_errmsg(ctx)), 255);
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
}

static void count(void *ud, const char *name, const char *version, const char *summary,
                  const char *path)
{
  int *n = ud;
  if (name && (strcmp(name, "ideal") == 0 || strcmp(name, "davies") == 0)) n[0]++;
  if (!name) n[1]++;
}

static void test_listing(void **state)
{
  eqp_ctx *ctx = fixture_ctx();
  int n[2] = {0, 0};
  assert_int_equal(eqp_ctx_list_plugins(ctx, count, n), EQP_OK);
  assert_int_equal(n[0], 2);     /* ideal and davies (among the six) from the build tree */
  assert_int_equal(n[1], 4);     /* the four fixtures that refuse to load */
  eqp_ctx_free(ctx);
}

/* Davies (C. W. Davies, Ion Association, Butterworths 1962) evaluated by
** hand at I = 0.1, A = 0.5108: log g = -A z^2 (0.316228/1.316228 - 0.03). */
static void test_davies_values(void **state)
{
  eqp_ctx *ctx = test_ctx();
  eqpi_model m;
  assert_int_equal(eqpi_model_open(ctx, "davies", &m), EQP_OK);
  double z[3] = {1, -2, 0}, size[3] = {NAN, NAN, NAN}, mol[3] = {0, 0, 0}, lg[3];
  eqp_activity_in in = {3, z, size, mol, 0.1, 298.15, 0.5108, 0.3287};
  assert_int_equal(m.ops->log_gamma(m.state, &in, lg, NULL, 0), 0);
  double f = -0.5108 * (sqrt(0.1) / (1 + sqrt(0.1)) - 0.3 * 0.1);
  assert_close(lg[0], f, 1e-14);
  assert_close(lg[1], 4 * f, 1e-14);
  assert_close(lg[2], 0, 0);
  char err[128];
  assert_int_equal(m.ops->set_param(m.state, "coefficient", 0.2, err, sizeof err), 0);
  assert_int_equal(m.ops->log_gamma(m.state, &in, lg, NULL, 0), 0);
  assert_close(lg[0], -0.5108 * (sqrt(0.1) / (1 + sqrt(0.1)) - 0.02), 1e-14);
  assert_int_not_equal(m.ops->set_param(m.state, "nonsense", 1, err, sizeof err), 0);
  assert_contains(err, "unknown parameter");
  eqpi_model_close(ctx, &m);
  assert_int_equal(eqpi_model_open(ctx, "ideal", &m), EQP_OK);
  assert_int_equal(m.ops->log_gamma(m.state, &in, lg, NULL, 0), 0);
  assert_close(lg[0] + lg[1] + lg[2], 0, 0);
  eqpi_model_close(ctx, &m);
  eqp_ctx_free(ctx);
}

/* What the plugins and the engine say, and the sizes the context's
** allocator is asked for. */
typedef struct watch { char lines[8][256]; int n; int got_4104, freed_4104; } watch;

static void watch_log(void *ud, int level, const char *msg)
{
  watch *w = ud;
  if (w->n < 8) snprintf(w->lines[w->n++], sizeof w->lines[0], "%d %s", level, msg);
}

static void *watch_alloc(void *ud, void *ptr, size_t osize, size_t nsize)
{
  watch *w = ud;
  if (nsize == 0) {
    w->freed_4104 += ptr && osize == 4104;
    free(ptr);
    return NULL;
  }
  w->got_4104 += nsize == 4104;
  return realloc(ptr, nsize);
}

static int logged(const watch *w, const char *needle)
{
  for (int i = 0; i < w->n; i++)
    if (strstr(w->lines[i], needle)) return 1;
  return 0;
}

/* pH of 0.025 m KH2PO4 + 0.025 m Na2HPO4 with the named model. */
static double phosphate_pH(eqp_ctx *ctx, const char *model)
{
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = model;
  eqp_solution *s;
  eqp_result *r;
  if (eqp_solution_new(ctx, &o, &s) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  assert_int_equal(eqp_solution_add_str(s, "KH2PO4", "25 mmol"), EQP_OK);
  assert_int_equal(eqp_solution_add_str(s, "Na2HPO4", "25 mmol"), EQP_OK);
  if (eqp_solution_equilibrate(s, &r) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  double pH = eqp_result_pH(r);
  eqp_result_free(r);
  eqp_solution_free(s);
  return pH;
}

/* A plugin built with the ABI 1.0 structs (a 1.0 descriptor, only the
** required operations) loads, computes, says it has no parameters instead
** of the host reading past its operations, and its 1.0 log line reaches
** the context's log. A plugin of a later minor version, with members this
** engine does not know, loads with them ignored, allocates through the
** context's allocator and logs through the context's log. Both compute
** Davies's equation, so both give the built-in davies model's pH. */
static void test_abi_versions(void **state)
{
  watch w;
  memset(&w, 0, sizeof w);
  eqp_ctx *ctx = eqp_ctx_new(watch_alloc, &w);
  assert_non_null(ctx);
  assert_int_equal(eqp_ctx_add_plugin_dir(ctx, getenv("EQP_FIXTURE_DIR")), EQP_OK);
  if (eqp_ctx_load_default_library(ctx) != EQP_OK) fail_msg("%s", eqp_ctx_errmsg(ctx));
  eqp_ctx_set_log(ctx, watch_log, &w, EQP_LOG_DEBUG);
  double davies = phosphate_pH(ctx, "davies");

  assert_close(phosphate_pH(ctx, "abi_1_0"), davies, 1e-12);
  assert_true(logged(&w, "3 plugin: abi_1_0: created from a 1.0 descriptor"));
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.activity = "abi_1_0";
  eqp_solution *s;
  assert_int_equal(eqp_solution_new(ctx, &o, &s), EQP_OK);
  assert_int_equal(eqp_solution_set_activity_param(s, "coefficient", 0.2), EQP_E_PLUGIN);
  assert_contains(eqp_ctx_errmsg(ctx), "takes no parameters");
  eqp_solution_free(s);

  assert_close(phosphate_pH(ctx, "abi_future"), davies, 1e-12);
  assert_true(logged(&w, "4 plugin: abi_future: state from the context's allocator"));
  assert_true(w.got_4104 > 0);
  assert_int_equal(w.freed_4104, w.got_4104);
  eqp_ctx_free(ctx);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_refusals),
    cmocka_unit_test(test_checks_directly),
    cmocka_unit_test(test_listing),
    cmocka_unit_test(test_renamed_plugin),
    cmocka_unit_test(test_unterminated_messages),
    cmocka_unit_test(test_davies_values),
    cmocka_unit_test(test_abi_versions),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
