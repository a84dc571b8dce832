/* Memory stays flat over many solves: a C program adds 1 umol of NaOH or of
** HCl (in turn, so the buffer stays a buffer) and equilibrates, N times,
** through a context whose allocator counts the bytes the engine holds, and
** samples them and the resident set size at every tenth of the run.
** Usage: mem_flat N [MAX_RSS_GROWTH_KIB]. Exit 0 when, after the first
** tenth (the warm-up), the engine holds no more bytes than it did then and
** the resident set has grown by at most the bound (default 1024 KiB). */
/* SPDX-License-Identifier: MIT */
#include <equipoise/equipoise.h>
#include <stdio.h>
#include <stdlib.h>
#include <unistd.h>

static size_t live, peak;

static void *counting(void *ud, void *ptr, size_t osize, size_t nsize)
{
  (void)ud;
  if (nsize == 0) {
    if (ptr) live -= osize;
    free(ptr);
    return NULL;
  }
  void *p = realloc(ptr, nsize);
  if (p) {
    live += nsize - (ptr ? osize : 0);
    if (live > peak) peak = live;
  }
  return p;
}

static long rss_kib(void)
{
  long pages = 0, resident = 0;
  FILE *f = fopen("/proc/self/statm", "r");
  if (f) {
    if (fscanf(f, "%ld %ld", &pages, &resident) != 2) resident = 0;
    fclose(f);
  }
  return resident * (sysconf(_SC_PAGESIZE) / 1024);
}

static void fail(eqp_ctx *ctx, const char *what)
{
  fprintf(stderr, "mem_flat: %s: %s\n", what, eqp_ctx_errmsg(ctx));
  exit(1);
}

int main(int argc, char **argv)
{
  long n = argc > 1 ? atol(argv[1]) : 1000000;
  long bound = argc > 2 ? atol(argv[2]) : 1024;
  eqp_ctx *ctx = eqp_ctx_new(counting, NULL);
  eqp_solution_opts o = EQP_SOLUTION_OPTS_INIT;
  o.water = 10.0;
  o.activity = "davies";
  eqp_solution *s;
  if (!ctx || eqp_solution_new(ctx, &o, &s) < 0) fail(ctx, "solution");
  if (eqp_solution_add_str(s, "KH2PO4", "250 mmol") < 0 ||
      eqp_solution_add_str(s, "Na2HPO4", "250 mmol") < 0)
    fail(ctx, "add");
  size_t live0 = 0, live_max = 0;
  long rss0 = 0, rss_max = 0;
  for (long i = 1; i <= n; i++) {
    eqp_result *r;
    if (eqp_solution_add_str(s, i % 2 ? "NaOH" : "HCl", "1 umol") < 0) fail(ctx, "add");
    if (eqp_solution_equilibrate(s, &r) < 0) fail(ctx, "equilibrate");
    eqp_result_free(r);
    if (i % (n / 10 > 0 ? n / 10 : 1) == 0) {
      long rss = rss_kib();
      if (!rss0) {
        live0 = live;
        rss0 = rss;
      }
      if (live > live_max) live_max = live;
      if (rss > rss_max) rss_max = rss;
      printf("C   %8ld solves: engine holds %zu bytes, resident %ld KiB\n", i, live, rss);
    }
  }
  eqp_solution_free(s);
  eqp_ctx_free(ctx);
  int ok = live_max <= live0 && rss_max - rss0 <= bound;
  printf("%s C program: %ld solves, engine bytes %zu after the first tenth, at most %zu "
         "after; resident set +%ld KiB (bound %ld)\n", ok ? "ok  " : "FAIL", n, live0,
         live_max, rss_max - rss0, bound);
  return ok ? 0 : 1;
}
