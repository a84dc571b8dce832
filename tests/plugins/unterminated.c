/* Fixture: a plugin that fills a message buffer to its very end, without
** the terminating NUL the ABI asks for; the engine must read no further
** than the buffer. Built once per place a message can come from:
** UNTERM_ENTRY refuses in its entry, UNTERM_CREATE in create, UNTERM_BIND
** warns in bind and refuses every parameter, UNTERM_GAMMA fails in
** log_gamma. UNTERM_NAME is the plugin's (and its file's) name. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/plugin.h>
#include <string.h>

#define STR_(x) #x
#define STR(x) STR_(x)

static void fill(char *buf, size_t n)
{
  if (buf && n) memset(buf, 'x', n);
}

static int make(const eqp_host_api *h, void **s, char *e, size_t n)
{
  (void)h;
  *s = 0;
#ifdef UNTERM_CREATE
  fill(e, n);
  return 1;
#else
  (void)e; (void)n;
  return 0;
#endif
}

static void drop(const eqp_host_api *h, void *s) { (void)h; (void)s; }

static int lg(void *s, const eqp_activity_in *in, double *out, char *e, size_t n)
{
  (void)s;
  for (size_t i = 0; i < in->n; i++) out[i] = 0;
#ifdef UNTERM_GAMMA
  fill(e, n);
  return 1;
#else
  (void)e; (void)n;
  return 0;
#endif
}

static int setp(void *s, const char *name, double v, char *e, size_t n)
{
  (void)s; (void)name; (void)v;
  fill(e, n);
  return 1;
}

static int bind(void *s, const eqp_species_info *info, char *w, size_t wn, char *e, size_t en)
{
  (void)s; (void)info; (void)e; (void)en;
#ifdef UNTERM_BIND
  fill(w, wn);
#else
  (void)w; (void)wn;
#endif
  return 0;
}

static const eqp_activity_ops ops = {sizeof ops, make, drop, lg, setp, bind, 0, 0};
static const eqp_plugin_desc desc = {
  EQP_PLUGIN_ABI_VERSION, sizeof desc, EQP_PLUGIN_SIZES, EQP_PLUGIN_ACTIVITY, STR(UNTERM_NAME),
  "1.0", "fixture writing messages without their NUL", &ops, 0};

#ifdef UNTERM_ENTRY
EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *h, char *e, size_t n);
EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *h, char *e, size_t n)
{
  (void)h;
  (void)desc;
  fill(e, n);
  return NULL;
}
#else
EQP_PLUGIN_DEFINE(desc)
#endif
