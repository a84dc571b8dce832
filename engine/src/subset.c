/* Libraries made from a library: restricted to some of its species files
** (only these and what they build on; all but these), and the public calls
** that make libraries (extended by a file or text, restricted). A
** restricted library is a library of its own, with its own numbering: the
** solver and everything else see nothing of what was left out. */
/* SPDX-License-Identifier: MIT */
#include "snapshot_impl.h"
#include <stdio.h>
#include <string.h>

/* The species files of a library, and which builds on which. */
typedef struct filemap {
  eqp_ctx *ctx;
  const eqpi_db *db;
  const char **name;    /* as the entries give it */
  int n, cap;
  unsigned char *dep;   /* n x n: file i builds on file j */
  unsigned char *keep;
  int *sp_file;         /* file of each species */
} filemap;

static int file_of(filemap *f, const char *file)
{
  for (int i = 0; i < f->n; i++)
    if (strcmp(f->name[i], file) == 0) return i;
  if (eqpi_grow(f->ctx, &f->name, &f->cap, f->n + 1, sizeof *f->name) < 0) return -1;
  f->name[f->n] = file;
  return f->n++;
}

/* "phosphate" for ".../species/phosphate.lua"; the whole name otherwise. */
static int names_file(const char *file, const char *name)
{
  if (strcmp(file, name) == 0) return 1;
  const char *b = strrchr(file, '/');
  b = b ? b + 1 : file;
  size_t l = strlen(b), n = strlen(name);
  return l == n + 4 && strcmp(b + n, ".lua") == 0 && strncmp(b, name, n) == 0;
}

static void needs(filemap *f, int a, int sp)
{
  int b = sp >= 0 ? f->sp_file[sp] : -1;
  if (a >= 0 && b >= 0 && a != b) f->dep[(size_t)a * (size_t)f->n + (size_t)b] = 1;
}

/* Every file of db, and what each builds on: the species of its reactions,
** reagents, buffers' reagents, gases and solids. A pair parameter builds
** on nothing: it goes when either species goes. */
static int collect(filemap *f)
{
  const eqpi_db *db = f->db;
  f->sp_file = eqpi_malloc(f->ctx, sizeof(int) * ((size_t)db->nsp + 1));
  if (!f->sp_file) return -1;
  for (int i = 0; i < db->nsp; i++)
    if ((f->sp_file[i] = file_of(f, db->sp[i].file)) < 0) return -1;
  int nrg0 = 0;
  for (int i = 0; i < db->nrg; i++) nrg0 |= file_of(f, db->rg[i].file) < 0;
  for (int i = 0; i < db->nbuffers; i++) nrg0 |= file_of(f, db->buffers[i].file) < 0;
  for (int i = 0; i < db->ngases; i++) nrg0 |= file_of(f, db->gases[i].kh.file) < 0;
  for (int i = 0; i < db->nsolids; i++) nrg0 |= file_of(f, db->solids[i].ksp.file) < 0;
  for (int i = 0; i < db->nrx; i++) nrg0 |= file_of(f, db->rx[i].file) < 0;
  for (int i = 0; i < db->npairs; i++) nrg0 |= file_of(f, db->pairs[i].file) < 0;
  if (nrg0) return -1;
  size_t nn = (size_t)f->n * (size_t)f->n + 1;
  f->dep = eqpi_calloc(f->ctx, nn, 1);
  f->keep = eqpi_calloc(f->ctx, (size_t)f->n + 1, 1);
  if (!f->dep || !f->keep) return -1;
  for (int i = 0; i < db->nrx; i++) {
    const eqpi_reaction *r = &db->rx[i];
    int a = file_of(f, r->file);
    if (r->product >= 0 && f->sp_file[r->product] != a)      /* declared elsewhere */
      f->dep[(size_t)f->sp_file[r->product] * (size_t)f->n + (size_t)a] = 1;
    for (int j = 0; j < r->n; j++) needs(f, a, r->reactant[j]);
  }
  for (int i = 0; i < db->nrg; i++) {
    int a = file_of(f, db->rg[i].file);
    for (int j = 0; j < db->rg[i].n; j++) needs(f, a, db->rg[i].sp[j]);
  }
  for (int i = 0; i < db->nbuffers; i++) {
    const eqpi_buffer *b = &db->buffers[i];
    int a = file_of(f, b->file), g[4] = {b->acid, b->base, b->free, b->titrant};
    for (int k = 0; k < 4; k++)
      if (g[k] >= 0) {
        int c = file_of(f, db->rg[g[k]].file);
        if (c != a) f->dep[(size_t)a * (size_t)f->n + (size_t)c] = 1;
      }
  }
  for (int i = 0; i < db->ngases; i++)
    needs(f, file_of(f, db->gases[i].kh.file), db->gases[i].species);
  for (int i = 0; i < db->nsolids; i++)
    for (int j = 0; j < db->solids[i].n; j++)
      needs(f, file_of(f, db->solids[i].ksp.file), db->solids[i].sp[j]);
  return 0;
}

static void files_free(filemap *f)
{
  eqpi_free(f->ctx, f->name, sizeof *f->name * (size_t)f->cap);
  eqpi_free(f->ctx, f->dep, (size_t)f->n * (size_t)f->n + 1);
  eqpi_free(f->ctx, f->keep, (size_t)f->n + 1);
  eqpi_free(f->ctx, f->sp_file, sizeof(int) * ((size_t)f->db->nsp + 1));
}

/* Mark the files named; EQP_E_UNKNOWN for a name that is no file. */
static int mark_named(filemap *f, const char *what, const char *const *names, size_t n,
                      unsigned char *named)
{
  for (size_t k = 0; k < n; k++) {
    int any = 0;
    for (int i = 0; names[k] && i < f->n; i++)
      if (names_file(f->name[i], names[k])) named[i] = any = 1;
    if (any) continue;
    char list[1024] = "";
    size_t used = 0;
    for (int i = 0; i < f->n && used < sizeof list; i++) {
      const char *b = strrchr(f->name[i], '/');
      used += (size_t)snprintf(list + used, sizeof list - used, "%s%.*s", i ? ", " : "",
                               (int)strcspn(b ? b + 1 : f->name[i], "."), b ? b + 1 : f->name[i]);
    }
    return eqpi_fail(f->ctx, EQP_E_UNKNOWN, "library %s: no species file '%s' in the library "
                     "(its files: %s)", what, names[k] ? names[k] : "(null)", list);
  }
  return EQP_OK;
}

/* The files that define the solvent: kept whatever is asked. */
static void keep_solvent(filemap *f)
{
  if (f->db->water >= 0) f->keep[f->sp_file[f->db->water]] = 1;
  if (f->db->h_plus >= 0) f->keep[f->sp_file[f->db->h_plus]] = 1;
}

/* What the kept files build on, kept too. */
static void close_over(filemap *f)
{
  for (int changed = 1; changed;) {
    changed = 0;
    for (int i = 0; i < f->n; i++)
      for (int j = 0; f->keep[i] && j < f->n; j++)
        if (f->dep[(size_t)i * (size_t)f->n + (size_t)j] && !f->keep[j]) f->keep[j] = changed = 1;
  }
}

/* ------------------------------------------------------------ copy */

typedef struct copy {
  eqp_ctx *ctx;
  const eqpi_db *from;
  eqpi_db *to;
  const filemap *f;
  int *sp, *rx, *rg, *comp;   /* old index -> new, -1 when left out */
} copy;

static int *remap(copy *c, const int *v, int n, const int *map)
{
  int *p = eqpi_arena_alloc(c->ctx, &c->to->arena, sizeof(int) * ((size_t)n + 1));
  for (int k = 0; p && k < n; k++) p[k] = map[v[k]];
  return p;
}

#define KEPT_FILE(c, file) ((c)->f->keep[file_of((filemap *)(c)->f, (file))])

/* Which entries stay, and their new indexes (in order). */
static void number(copy *c)
{
  const eqpi_db *d = c->from;
  int n = 0, k = 0;
  for (int i = 0; i < d->nsp; i++) c->sp[i] = c->f->keep[c->f->sp_file[i]] ? n++ : -1;
  for (int i = 0; i < d->ncomp; i++) c->comp[i] = c->sp[d->comp_species[i]] >= 0 ? k++ : -1;
  n = 0;
  for (int i = 0; i < d->nrx; i++)
    c->rx[i] = d->rx[i].product >= 0 && c->sp[d->rx[i].product] >= 0 ? n++ : -1;
  n = 0;
  for (int i = 0; i < d->nrg; i++) c->rg[i] = KEPT_FILE(c, d->rg[i].file) ? n++ : -1;
}

static int copy_species(copy *c)
{
  const eqpi_db *d = c->from;
  eqpi_db *t = c->to;
  for (int i = 0; i < d->nsp; i++) {
    if (c->sp[i] < 0) continue;
    eqpi_species *s = &t->sp[t->nsp++];
    *s = d->sp[i];
    s->rxn = s->rxn >= 0 ? c->rx[s->rxn] : -1;
    s->component = s->component >= 0 ? c->comp[s->component] : -1;
    if (!(s->term_comp = remap(c, d->sp[i].term_comp, s->nterm, c->comp)) ||
        !(s->rx_idx = remap(c, d->sp[i].rx_idx, s->nrx, c->rx)))
      return -1;
  }
  for (int i = 0; i < d->ncomp; i++)
    if (c->comp[i] >= 0) t->comp_species[t->ncomp++] = c->sp[d->comp_species[i]];
  for (int i = 0; i < d->nrx; i++) {
    if (c->rx[i] < 0) continue;
    eqpi_reaction *r = &t->rx[t->nrx++];
    *r = d->rx[i];
    r->product = c->sp[r->product];
    if (!(r->reactant = remap(c, d->rx[i].reactant, r->n, c->sp))) return -1;
  }
  return 0;
}

static int copy_rest(copy *c)
{
  const eqpi_db *d = c->from;
  eqpi_db *t = c->to;
  for (int i = 0; i < d->nrg; i++) {
    if (c->rg[i] < 0) continue;
    eqpi_reagent *g = &t->rg[t->nrg++];
    *g = d->rg[i];
    if (!(g->sp = remap(c, d->rg[i].sp, g->n, c->sp)) ||
        !(g->term_comp = remap(c, d->rg[i].term_comp, g->nterm, c->comp)))
      return -1;
  }
  for (int i = 0; i < d->nbuffers; i++) {
    const eqpi_buffer *b = &d->buffers[i];
    if (!KEPT_FILE(c, b->file)) continue;
    eqpi_buffer *o = &t->buffers[t->nbuffers++];
    *o = *b;
    o->acid = b->acid >= 0 ? c->rg[b->acid] : -1;
    o->base = b->base >= 0 ? c->rg[b->base] : -1;
    o->free = b->free >= 0 ? c->rg[b->free] : -1;
    o->titrant = b->titrant >= 0 ? c->rg[b->titrant] : -1;
  }
  for (int i = 0; i < d->ngases; i++) {
    const eqpi_gas *g = &d->gases[i];
    if (!KEPT_FILE(c, g->kh.file)) continue;
    eqpi_gas *o = &t->gases[t->ngases++];
    *o = *g;
    o->species = c->sp[g->species];
    o->kh.product = o->species;
  }
  for (int i = 0; i < d->nsolids; i++) {
    const eqpi_solid *so = &d->solids[i];
    if (!KEPT_FILE(c, so->ksp.file)) continue;
    eqpi_solid *o = &t->solids[t->nsolids++];
    *o = *so;
    if (!(o->sp = remap(c, so->sp, so->n, c->sp))) return -1;
  }
  for (int i = 0; i < d->npairs; i++) {
    const eqpi_pairparam *p = &d->pairs[i];
    if (!KEPT_FILE(c, p->file) || c->sp[p->a] < 0 || c->sp[p->b] < 0) continue;
    eqpi_pairparam *o = &t->pairs[t->npairs++];
    *o = *p;
    o->a = c->sp[p->a];
    o->b = c->sp[p->b];
  }
  return 0;
}

/* The sources loaded: all but those of the files left out. */
static void copy_sources(copy *c)
{
  const eqpi_db *d = c->from;
  eqpi_db *t = c->to;
  for (int i = 0; i < d->nfiles; i++) {
    int k = -1;
    for (int j = 0; j < c->f->n && k < 0; j++)
      if (strcmp(c->f->name[j], d->files[i]) == 0) k = j;
    if (k < 0 || c->f->keep[k]) t->files[t->nfiles++] = d->files[i];
  }
  for (int i = 0; i < d->nloaded; i++) {
    int out = 0;
    for (int j = 0; j < c->f->n && !out; j++) {
      char key[4096];
      eqpi_file_key(c->f->name[j], key, sizeof key);
      out = !c->f->keep[j] && strcmp(key, d->loaded[i].key) == 0;
    }
    if (!out) t->loaded[t->nloaded++] = d->loaded[i];
  }
}

/* The library of the kept files of f. */
static int make(filemap *f, unsigned long long how, eqpi_db **out)
{
  eqp_ctx *ctx = f->ctx;
  const eqpi_db *d = f->db;
  copy c = {ctx, d, NULL, f, NULL, NULL, NULL, NULL};
  int rc = EQP_E_NOMEM;
  c.sp = eqpi_malloc(ctx, sizeof(int) * ((size_t)d->nsp + 1));
  c.rx = eqpi_malloc(ctx, sizeof(int) * ((size_t)d->nrx + 1));
  c.rg = eqpi_malloc(ctx, sizeof(int) * ((size_t)d->nrg + 1));
  c.comp = eqpi_malloc(ctx, sizeof(int) * ((size_t)d->ncomp + 1));
  if (c.sp && c.rx && c.rg && c.comp) {
    number(&c);
    eqpi_room all = {d->nsp, d->nrx, d->nrg, d->ncomp, d->npairs, d->nbuffers,
                     d->ngases, d->nsolids, d->nfiles, d->nloaded};
    c.to = eqpi_db_begin(ctx, d, &all, 1);
    if (c.to && copy_species(&c) == 0 && copy_rest(&c) == 0) {
      copy_sources(&c);
      if (eqpi_db_finish(c.to) == 0) rc = EQP_OK;
    }
  }
  if (rc == EQP_OK) {
    eqpi_db_remember(c.to, how);
    *out = c.to;
  } else {
    eqpi_db_release(c.to);
    rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  }
  eqpi_free(ctx, c.sp, sizeof(int) * ((size_t)d->nsp + 1));
  eqpi_free(ctx, c.rx, sizeof(int) * ((size_t)d->nrx + 1));
  eqpi_free(ctx, c.rg, sizeof(int) * ((size_t)d->nrg + 1));
  eqpi_free(ctx, c.comp, sizeof(int) * ((size_t)d->ncomp + 1));
  return rc;
}

/* What a restriction stands for, so that the same one gives the same library. */
static unsigned long long how_of(const char *what, const unsigned char *keep, int n)
{
  unsigned long long h = eqpi_hash_bytes(what, strlen(what) + 1, 0);
  return eqpi_hash_bytes(keep, (size_t)n, h) | 1;
}

/* Why file i cannot go: the first kept file that builds on it. */
static int needed_by(const filemap *f, int i)
{
  for (int j = 0; j < f->n; j++)
    if (f->keep[j] && f->dep[(size_t)j * (size_t)f->n + (size_t)i]) return j;
  return -1;
}

static int restrict_to(eqp_ctx *ctx, const eqpi_db *base, const char *what,
                       const char *const *names, size_t n, eqpi_db **out)
{
  *out = NULL;
  filemap f;
  memset(&f, 0, sizeof f);
  f.ctx = ctx;
  f.db = base;
  int rc = collect(&f) < 0 ? eqpi_fail(ctx, EQP_E_NOMEM, "out of memory") : EQP_OK;
  unsigned char *named = rc == EQP_OK ? eqpi_calloc(ctx, (size_t)f.n + 1, 1) : NULL;
  if (rc == EQP_OK && !named) rc = eqpi_fail(ctx, EQP_E_NOMEM, "out of memory");
  if (rc == EQP_OK) rc = mark_named(&f, what, names, n, named);
  int only = strcmp(what, "only") == 0;
  for (int i = 0; rc == EQP_OK && i < f.n; i++) f.keep[i] = only ? named[i] : !named[i];
  if (rc == EQP_OK && only) {
    keep_solvent(&f);
    close_over(&f);
  }
  for (int i = 0; rc == EQP_OK && !only && i < f.n; i++) {
    int j = named[i] ? needed_by(&f, i) : -1;
    int solvent = (base->water >= 0 && f.sp_file[base->water] == i) ||
                  (base->h_plus >= 0 && f.sp_file[base->h_plus] == i);
    if (named[i] && solvent)
      rc = eqpi_fail(ctx, EQP_E_INPUT, "library without: %s defines the solvent (H2O, H+) and "
                     "cannot be left out", f.name[i]);
    else if (j >= 0)
      rc = eqpi_fail(ctx, EQP_E_INPUT, "library without: %s cannot be left out: %s builds on "
                     "it (leave that out too)", f.name[i], f.name[j]);
  }
  if (rc == EQP_OK) {
    unsigned long long how = how_of(what, f.keep, f.n);
    if (!(*out = eqpi_db_derived(base, how))) rc = make(&f, how, out);
  }
  eqpi_free(ctx, named, (size_t)f.n + 1);
  files_free(&f);
  return rc;
}

int eqpi_db_only(eqp_ctx *ctx, const eqpi_db *base, const char *const *names, size_t n,
                 eqpi_db **out)
{
  return restrict_to(ctx, base, "only", names, n, out);
}

int eqpi_db_without(eqp_ctx *ctx, const eqpi_db *base, const char *const *names, size_t n,
                    eqpi_db **out)
{
  return restrict_to(ctx, base, "without", names, n, out);
}

/* ------------------------------------------------------------ public */

static int check_base(eqp_ctx *ctx, const eqp_library *base, const void *arg,
                      const eqp_library **out)
{
  if (out) *out = NULL;
  if (!ctx || !base || !arg || !out) return eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  if (base->ctx != ctx) return eqpi_fail(ctx, EQP_E_ARG, "the library belongs to another context");
  return EQP_OK;
}

int eqp_library_extend_file(eqp_ctx *ctx, const eqp_library *base, const char *path,
                            const eqp_library **out)
{
  int rc = check_base(ctx, base, path, out);
  eqpi_db *lib = NULL;
  if (rc == EQP_OK && (rc = eqpi_load_file(ctx, base, path, &lib)) == EQP_OK) *out = lib;
  return rc;
}

int eqp_library_extend_text(eqp_ctx *ctx, const eqp_library *base, const char *text, size_t len,
                            const char *source, const eqp_library **out)
{
  int rc = check_base(ctx, base, text, out);
  if (rc == EQP_OK && !source) rc = eqpi_fail(ctx, EQP_E_ARG, "NULL argument");
  eqpi_db *lib = NULL;
  if (rc == EQP_OK && (rc = eqpi_load_text(ctx, base, text, len, source, &lib)) == EQP_OK)
    *out = lib;
  return rc;
}

int eqp_library_only(eqp_ctx *ctx, const eqp_library *base, const char *const *files, size_t n,
                     const eqp_library **out)
{
  int rc = check_base(ctx, base, n ? (const void *)files : (const void *)base, out);
  eqpi_db *lib = NULL;
  if (rc == EQP_OK && (rc = eqpi_db_only(ctx, base, files, n, &lib)) == EQP_OK) *out = lib;
  return rc;
}

int eqp_library_without(eqp_ctx *ctx, const eqp_library *base, const char *const *files,
                        size_t n, const eqp_library **out)
{
  int rc = check_base(ctx, base, n ? (const void *)files : (const void *)base, out);
  eqpi_db *lib = NULL;
  if (rc == EQP_OK && (rc = eqpi_db_without(ctx, base, files, n, &lib)) == EQP_OK) *out = lib;
  return rc;
}

