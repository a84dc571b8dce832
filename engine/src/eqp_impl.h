/* Internal declarations shared across the engine's source files. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_IMPL_H
#define EQP_IMPL_H

#include <equipoise/equipoise.h>
#include <equipoise/plugin.h>
#include <stdarg.h>
#include <stdbool.h>
#include <stddef.h>
#include <stdint.h>
#include <string.h>

#define EQPI_ERRLEN 2048
#define EQPI_LN10 2.302585092994045684
#define EQPI_T25 298.15
#define EQPI_R 8.314462618          /* J K^-1 mol^-1, CODATA 2018 */
/* g/mol of H2O from the same standard atomic weights as every reagent, so
** that grams of a hydrate and the water it brings agree */
#define EQPI_M_WATER (2 * 1.0080 + 15.999)
#define EQPI_MAX_ELEM 16
#define EQPI_VERIFY_TOL 1e-10       /* largest relative residual a result may have */
#define EQPI_MAX_WATER 1e6          /* kg of water a solution may hold */
#define EQPI_MAX_MOLALITY 100.0     /* mol/kg: beyond, not an aqueous solution */
#define EQPI_TABLEAU_CACHE 4        /* tableaux a context keeps for new solutions */

#if defined(__GNUC__)
#define EQPI_PRINTF(a, b) __attribute__((format(printf, a, b)))
#else
#define EQPI_PRINTF(a, b)
#endif

/* ---------------------------------------------------------- memory */

void *eqpi_malloc(eqp_ctx *ctx, size_t n);
void *eqpi_calloc(eqp_ctx *ctx, size_t count, size_t n);
void *eqpi_realloc(eqp_ctx *ctx, void *p, size_t old, size_t n);
void eqpi_free(eqp_ctx *ctx, void *p, size_t n);
char *eqpi_strdup(eqp_ctx *ctx, const char *s);
void eqpi_strfree(eqp_ctx *ctx, char *s);
/* Room for at least need elements of elem bytes in the array whose address
** is arrp (a T **) and whose capacity is *cap elements: grows to at least
** twice the capacity (8 at first). 0, or -1 when out of memory or too large
** (the array and *cap are then unchanged). The one doubling loop of the
** engine. */
int eqpi_grow(eqp_ctx *ctx, void *arrp, int *cap, int need, size_t elem);
int eqpi_grow_size(eqp_ctx *ctx, void *arrp, size_t *cap, size_t need, size_t elem);

/* Bump allocator for the species data: freed all at once. */
typedef struct eqpi_arena eqpi_arena;
void *eqpi_arena_alloc(eqp_ctx *ctx, eqpi_arena **a, size_t n);
char *eqpi_arena_strdup(eqp_ctx *ctx, eqpi_arena **a, const char *s);
void eqpi_arena_free(eqp_ctx *ctx, eqpi_arena **a);
void eqpi_arena_splice(eqpi_arena **dst, eqpi_arena **src);

/* ---------------------------------------------------------- errors */

/* Record a message and return status (always negative). */
int eqpi_fail(eqp_ctx *ctx, int status, const char *fmt, ...) EQPI_PRINTF(3, 4);
int eqpi_vfail(eqp_ctx *ctx, int status, const char *fmt, va_list ap);

/* ---------------------------------------------------------- options */

/* Bytes of a struct up to and including member: the size a struct had when
** member was its last. */
#define EQPI_SIZE_UPTO(type, member) (offsetof(type, member) + sizeof(((type *)0)->member))
/* Read an option struct that begins with its size (equipoise.h) into
** *local, which holds the defaults (its INIT macro): as much of the
** caller's struct as its size covers replaces them. EQP_E_ARG for a size
** of 0, below first_size (the first published size) or above local_size. */
int eqpi_opts_read(eqp_ctx *ctx, const char *type, const void *user, void *local,
                   size_t local_size, size_t first_size);
/* The first published sizes (version 0.1). */
#define EQPI_SOLUTION_OPTS_0_1 EQPI_SIZE_UPTO(eqp_solution_opts, activity)
#define EQPI_TITRATION_0_1 EQPI_SIZE_UPTO(eqp_titration, nspecies)
#define EQPI_DISTRIBUTION_SPEC_0_1 EQPI_SIZE_UPTO(eqp_distribution_spec, medium)
#define EQPI_CAPACITY_SPEC_0_1 EQPI_SIZE_UPTO(eqp_capacity_spec, window_hi)
#define EQPI_RECIPE_SPEC_0_1 EQPI_SIZE_UPTO(eqp_recipe_spec, titrant_molar)
#define EQPI_OBSERVER_0_1 EQPI_SIZE_UPTO(eqp_observer, on_caution)
#define EQPI_BUDGET_SPEC_0_1 EQPI_SIZE_UPTO(eqp_budget_spec, base)
#define EQPI_COMPARE_SPEC_0_1 EQPI_SIZE_UPTO(eqp_compare_spec, window)
/* Structs first published after 0.1.0: their first sizes. */
#define EQPI_TARGET_FIRST EQPI_SIZE_UPTO(eqp_target, litres)
#define EQPI_HEADSPACE_FIRST EQPI_SIZE_UPTO(eqp_headspace, p_atm)

/* ---------------------------------------------------------- formulas */

typedef struct eqpi_comp {
  int n;                          /* distinct elements */
  unsigned char el[EQPI_MAX_ELEM]; /* atomic number */
  double cnt[EQPI_MAX_ELEM];
  double charge;
} eqpi_comp;

/* Parse "Na2HPO4.7H2O", "Ca(OH)2", "HPO4^2-", "NH4+". On error writes a
** reason into err and returns -1. hydrate, if not NULL, receives the waters
** of crystallisation after a '.' (0 if none). */
int eqpi_formula_parse(const char *f, eqpi_comp *out, double *hydrate,
                       char *err, size_t errlen);
/* Add k times b into a. Returns -1 if too many elements. */
int eqpi_comp_add(eqpi_comp *a, const eqpi_comp *b, double k);
/* Standard atomic weight (g/mol) of element Z, 0 if not tabulated. */
double eqpi_atomic_weight(int z);
const char *eqpi_element_symbol(int z);
int eqpi_element_lookup(const char *sym, size_t len);
double eqpi_comp_mass(const eqpi_comp *c);
/* "elements differ: C 2 vs 1; charge 0 vs -1" style description of a-b;
** returns 0 if equal within 1e-9. */
int eqpi_comp_diff(const eqpi_comp *a, const eqpi_comp *b, char *buf, size_t len);

/* fopen(path, "rb") of a regular file only, without waiting on a FIFO;
** NULL with errno (EINVAL: not a regular file). */
#include <stdio.h>
FILE *eqpi_fopen_regular(const char *path);

/* ---------------------------------------------------------- notation */

/* Fold Unicode sub- and superscripts ("HPO₄²⁻") and ASCII variants ("Na^+")
** into the canonical ASCII name ("HPO4^2-", "Na+"). Returns 1 if the name
** changed, 0 if not, -1 if out is too small. */
int eqpi_name_normalize(const char *in, char *out, size_t len);
/* If name uses the sign-first charge ("HPO4-2"), write the IUPAC spelling
** into buf and return 1. */
int eqpi_name_old_style(const char *name, char *buf, size_t len);
/* " (did you mean 'HPO4^2-'? ...)" for a sign-first name, else "". */
const char *eqpi_name_hint(const char *name, char *buf, size_t len);
/* The display form with Unicode sub- and superscripts ("HPO₄²⁻"). */
int eqpi_name_pretty(const char *name, char *out, size_t len);

/* ---------------------------------------------------------- units */

/* A plain decimal at p read exactly as strtod reads it, by the exact fast
** path; the end of the number, or NULL when strtod must decide (units.c). */
const char *eqpi_fast_decimal(const char *p, double *out);
int eqpi_parse_quantity(const char *text, unsigned allowed, double *value,
                        eqp_quantity *kind, char *err, size_t errlen);

/* ---------------------------------------------------------- water */

double eqpi_water_density(double T);     /* kg/L at 0.101325 MPa, Kell 1975 */
double eqpi_water_permittivity(double T);/* Malmberg & Maryott 1956 */
void eqpi_debye_huckel_AB(double T, double *A, double *B);
/* -log10 Kw on the molal scale, IAPWS R11-07 (Bandura & Lvov 2006) at the
** density of liquid water at 0.101325 MPa (Kell 1975); 0-100 C. */
double eqpi_water_pKw(double T);
/* Same formulation at a given density (g/cm3), for the published checks. */
double eqpi_water_pKw_rho(double T, double rho);

/* ---------------------------------------------------------- index */

/* A map from borrowed strings to non-negative ints (uthash, index.c): any
** number of keys, each looked up in constant time. Zero-initialised is
** empty. */
typedef struct eqpi_index_item eqpi_index_item;
typedef struct eqpi_index {
  eqpi_index_item *head;
} eqpi_index;

/* Insert key -> val unless key is present (the first stays). Returns 0
** when inserted, 1 when present (*old, if not NULL, gets its value), -1
** when memory is exhausted. key must outlive the index. */
int eqpi_index_put(eqp_ctx *ctx, eqpi_index *ix, const char *key, int val, int *old);
/* The value of key, or -1. */
int eqpi_index_get(const eqpi_index *ix, const char *key);
/* Remove key if present. */
void eqpi_index_del(eqp_ctx *ctx, eqpi_index *ix, const char *key);
size_t eqpi_index_count(const eqpi_index *ix);
void eqpi_index_free(eqp_ctx *ctx, eqpi_index *ix);

/* ---------------------------------------------------------- database */

enum { EQPI_T_VANTHOFF = 0, EQPI_T_FUNCTION = 1, EQPI_T_WATER = 2 };

/* What a temperature correction had to do without: counted per system. */
typedef struct eqpi_tnotes {
  int missing;          /* constants lacking temperature data, used at 25 C */
  int outside;          /* functions evaluated outside their stated range */
} eqpi_tnotes;

/* The conditions a published constant was measured at (a file's or an
** entry's 'measured'): I in mol/L or mol/kg, t in C, the medium, and how
** the value was taken to I = 0 (NULL when it was published for I = 0). */
typedef struct eqpi_measured {
  int given;            /* 0: the file does not say */
  double I, t;
  const char *medium, *to_I0;
} eqpi_measured;

typedef struct eqpi_reaction {
  int product;          /* species index */
  int n;
  int *reactant;        /* species indexes */
  double *nu;
  double logK;          /* log10 K at 298.15 K of product = sum nu reactant */
  double dH;            /* kJ/mol of the formation reaction; NaN if absent */
  double dCp;           /* J/(K mol); NaN if absent */
  int tmodel;           /* EQPI_T_* */
  double fn[6];         /* EQPI_T_FUNCTION: log10 K = a + bT + c/T + d lnT + e/T^2 + fT^2 */
  double Tmin, Tmax;    /* stated range of the function, K; NaN if none */
  const char *source;
  eqpi_measured measured;
  const char *file;
  int line;
} eqpi_reaction;

typedef struct eqpi_species {
  const char *name;
  const char *formula;
  eqpi_comp comp;
  double size;          /* Angstrom; NaN if unknown */
  const char *size_source;
  const char *file;
  int line;
  int rxn;              /* defining reaction, -1 for a component */
  int component;        /* component index, or -1 */
  /* Resolved onto components: species = sum term_nu * component */
  int nterm;
  int *term_comp;
  double *term_nu;
  /* log K = sum rx_c * logK(reaction rx_idx) */
  int nrx;
  int *rx_idx;
  double *rx_c;
  /* activity-model parameters from the species file (e.g. tj_size,
  ** tj_linear) and their source */
  int nparam;
  const char **pkey;
  double *pval;
  const char *params_source;
} eqpi_species;

/* A parameter of a pair of species (e.g. an SIT interaction coefficient). */
typedef struct eqpi_pairparam {
  int a, b;             /* species indexes */
  const char *key;
  double value;
  const char *source, *file;
  int line;
} eqpi_pairparam;

typedef struct eqpi_reagent {
  const char *name;     /* formula or name used in s:add */
  const char *formula;
  const char **aliases;
  int naliases;
  double molar_mass;    /* g/mol */
  double density;       /* g/mL for liquids; NaN otherwise */
  double hydrate;       /* waters of crystallisation per formula unit */
  int n;                /* species released (water of hydration excluded) */
  int *sp;
  double *nu;
  /* resolved onto components */
  int nterm;
  int *term_comp;
  double *term_nu;
  const char **hazards;
  int nhazards;
  const char *file;
  int line;
} eqpi_reagent;

/* A buffer system a recipe can make: a pair of reagents (acid form, base
** form) and/or a free acid or base with its titrant. */
typedef struct eqpi_buffer {
  const char *name;
  int acid, base;       /* reagents, -1 if not given */
  int free, titrant;    /* reagents, -1 if not given */
  const char **notes;   /* interferences and cautions, "kind: text" */
  int nnotes;
  const char *file;
  int line;
} eqpi_buffer;

/* A gas that dissolves as a species: a(species) = K_H p (p in atm), with
** log10 K_H and its temperature data held as a reaction. */
typedef struct eqpi_gas {
  const char *name;
  int species;
  eqpi_reaction kh;
} eqpi_gas;

/* A solid phase: formula = sum nu species; log10 Ksp of that dissolution
** and its temperature data held as a reaction. */
typedef struct eqpi_solid {
  const char *name, *formula;
  int n;
  int *sp;
  double *nu;
  eqpi_reaction ksp;
} eqpi_solid;

#define EQPI_MAX_SOLIDS_PRESENT 8   /* phases present at once in a result */

typedef struct eqpi_source {
  const char *path;
} eqpi_source;
/* A source already loaded: its key (real path, or source name) and a hash
** of its content, so that loading it again is a no-op. */
typedef struct eqpi_loaded {
  const char *key;
  unsigned long long hash;
} eqpi_loaded;

typedef struct eqpi_store eqpi_store;

/* A species library (the public eqp_library): an immutable, reference-
** counted snapshot (snapshot.c). Nothing below changes once it is made;
** loading more species makes a new library. The arrays are views of a
** store that it may share with the libraries it extends and that extend
** it: their first n entries never change. Solutions and results hold the
** library they were made with. */
typedef struct eqp_library eqpi_db;
struct eqp_library {
  eqpi_species *sp;
  int nsp;
  eqpi_reaction *rx;
  int nrx;
  eqpi_reagent *rg;
  int nrg;
  int ncomp;
  int *comp_species;    /* component -> species */
  eqpi_pairparam *pairs;
  int npairs;
  eqpi_buffer *buffers;
  int nbuffers;
  eqpi_gas *gases;
  int ngases;
  eqpi_solid *solids;
  int nsolids;
  const char **files;
  int nfiles;
  eqpi_loaded *loaded;  /* sources loaded, in order */
  int nloaded;
  int h_plus, water;    /* species indexes, -1 until loaded */
  unsigned generation;  /* unique among the libraries of a context */
  /* bookkeeping, snapshot.c only */
  eqp_ctx *ctx;
  int refs;             /* holders: the context, solutions, results, callers */
  int kids;             /* libraries made from this one, which use its strings */
  eqpi_store *store;    /* NULL once no holder is left */
  eqpi_db *parent;      /* the library this one was made from (kept while this lives) */
  eqpi_arena *arena;    /* strings and arrays of the entries this one added */
  eqpi_db *derived;     /* libraries made from this one, by what made them (weak) */
  eqpi_db *next_derived;
  unsigned long long how;
  eqpi_db *live_prev, *live_next; /* the context's list of libraries held (weak) */
};

/* 1 if r forms a complex of a metal ion (a cation with a metal element
** among its reactants, with a ligand other than H+; conditions.c). */
int eqpi_reaction_metal_ligand(const eqpi_db *db, const eqpi_reaction *r);

/* A library with nothing in it (a new reference), NULL when out of memory. */
eqpi_db *eqpi_db_new_empty(eqp_ctx *ctx);
/* One more holder of db; returns db. Release each with eqpi_db_release
** (NULL is a no-op); the last release frees it, and a library another
** one was made from lives until that one goes. */
eqpi_db *eqpi_db_ref(const eqpi_db *db);
void eqpi_db_release(const eqpi_db *db);
/* The library made from base by what `how` stands for, if one is alive:
** a new reference; NULL otherwise. */
eqpi_db *eqpi_db_derived(const eqpi_db *base, unsigned long long how);
/* Remember that lib was made from its parent by `how` (eqpi_db_derived). */
void eqpi_db_remember(eqpi_db *lib, unsigned long long how);
/* Whether source key with content hash is loaded in db. */
int eqpi_db_loaded(const eqpi_db *db, const char *key, unsigned long long hash);
/* Make the context's library lib (taking over the reference). */
void eqpi_ctx_set_library(eqp_ctx *ctx, eqpi_db *lib);
/* The libraries of the context that something holds, newest first: for
** finding what a name means in any library in use (provenance). */
const eqpi_db *eqpi_ctx_libraries(const eqp_ctx *ctx);

/* ---------------------------------------------------------- provenance */

/* Species that the named species and reagents (with water) can form: a
** calloc'd flag per species of the context's library (nsp + 1 bytes). */
int eqpi_constants_mark(eqp_ctx *ctx, const eqpi_db *db, const char *const *names, size_t n,
                        char *found, unsigned char **sp);
/* The library to look in for the names not yet found: the context's first
** (after NULL), then each other library in use that has one of them; NULL
** when none has. */
const eqpi_db *eqpi_constants_library(eqp_ctx *ctx, const eqpi_db *after,
                                      const char *const *names, size_t n, const char *found);
/* A reaction as `species show` writes it (describe.c): its equation, the
** name of its constant, and the signs that turn the stored log K and
** dH, dCp into the shown ones. */
int eqpi_describe_reaction(const eqpi_db *db, const eqpi_reaction *r, char *eq, size_t len,
                           const char **constant, double *sign, double *dsign);


int eqpi_db_find_species(const eqpi_db *db, const char *name);
int eqpi_db_find_reagent(const eqpi_db *db, const char *name);
/* A solid by its name ("calcite"), or by its formula with the state symbol
** ("CaCO3(s)") where one solid of the library has that formula; Unicode
** spellings fold. -1 if none, -2 if the formula names several solids. */
int eqpi_db_find_solid(const eqpi_db *db, const char *name);
/* A gas by name ("CO2(g)", "CO₂(g)"); -1 if none. */
int eqpi_db_find_gas(const eqpi_db *db, const char *name);
/* a[c] += coef x (the units of component c in species sp), for the
** components below n, water's own component left out (as for reagents):
** the direction of a gas dissolving or a solid leaving the solution. */
void eqpi_db_add_composition(const eqpi_db *db, int sp, double coef, double *a, int n);
/* "calcite, aragonite": the solids with formula f (for a message). */
void eqpi_db_solids_with_formula(const eqpi_db *db, const char *f, char *buf, size_t len);
/* Parameter key of species i, or of the pair (i, j) in either order:
** 0 and *v set when present, -1 otherwise. */
int eqpi_db_species_param(const eqpi_db *db, int i, const char *key, double *v);
int eqpi_db_pair_param(const eqpi_db *db, int i, int j, const char *key, double *v);
/* The buffer system called name, or -1. */
int eqpi_db_find_buffer(const eqpi_db *db, const char *name);
/* log10 K of species i at T (K) by the integrated van't Hoff equation;
** *missing counts contributions lacking temperature data away from 25 C. */
double eqpi_species_logK(const eqpi_db *db, int i, double T, eqpi_tnotes *notes);
double eqpi_reaction_logK(const eqpi_reaction *r, double T, eqpi_tnotes *notes);

/* Loading species onto a library (stage.c owns the staging area: nothing
** else makes, fills or frees one). Each load reads its sources, checks them
** as a whole, and on success sets *out to a new reference to the library
** made of base and them: base itself again when every source is loaded in
** base already. On failure *out is NULL, nothing is kept, and the message
** reads "file:line: what is wrong". */
typedef struct eqpi_stage eqpi_stage;
int eqpi_load_file(eqp_ctx *ctx, const eqpi_db *base, const char *path, eqpi_db **out);
int eqpi_load_dir(eqp_ctx *ctx, const eqpi_db *base, const char *dir, eqpi_db **out);
int eqpi_load_text(eqp_ctx *ctx, const eqpi_db *base, const char *text, size_t len,
                   const char *source, eqpi_db **out);
struct lua_State;
/* The species table at idx of L (a script's inline species) under the
** source name where: read with raw access under lua_pcall, so neither a
** metamethod nor a memory error can leave anything behind. The same table
** (the same entries) loaded again onto base is a no-op. */
int eqpi_load_table(eqp_ctx *ctx, const eqpi_db *base, struct lua_State *L, int idx,
                    const char *where, eqpi_db **out);
/* The library of base restricted to the named species files and what they
** build on (only), or without the named files (subset.c). */
int eqpi_db_only(eqp_ctx *ctx, const eqpi_db *base, const char *const *files, size_t n,
                 eqpi_db **out);
int eqpi_db_without(eqp_ctx *ctx, const eqpi_db *base, const char *const *files, size_t n,
                    eqpi_db **out);

/* ---------------------------------------------------------- plugins */

typedef struct eqpi_model {
  const eqp_plugin_desc *desc;
  const eqp_activity_ops *ops;
  void *state;
  void *handle;         /* borrowed from the registry */
  const char *path;
  eqp_ctx *ctx;         /* whose log the plugin's lines go to */
} eqpi_model;

int eqpi_model_open(eqp_ctx *ctx, const char *name, eqpi_model *out);
void eqpi_model_close(eqp_ctx *ctx, eqpi_model *m);
/* Calls into the model whose messages (err, warn) are cut at their buffer's
** end whatever the plugin wrote. bind is 0 when the model has none. */
int eqpi_model_set_param(eqpi_model *m, const char *name, double value, char *err, size_t len);
int eqpi_model_bind(eqpi_model *m, const eqp_species_info *info, char *warn, size_t wlen,
                    char *err, size_t elen);
int eqpi_model_log_gamma(eqpi_model *m, const eqp_activity_in *in, double *lg, char *err,
                         size_t len);
/* Which derivatives the model gives (ABI 1.1): none, d lg / dI of a model
** of the ionic strength alone, or directional derivatives. */
enum { EQPI_DERIV_NONE = 0, EQPI_DERIV_I = 1, EQPI_DERIV_TANGENT = 2 };
int eqpi_model_derivs(const eqpi_model *m);
int eqpi_model_dlog_gamma_dI(eqpi_model *m, const eqp_activity_in *in, double *dlg, char *err,
                             size_t len);
int eqpi_model_tangent(eqpi_model *m, const eqp_activity_in *in, const double *dm, double dI,
                       double *dlg, char *err, size_t len);
void eqpi_plugins_free(eqp_ctx *ctx);
/* Check a descriptor as loaded from path; 0 or an error message in err. */
int eqpi_plugin_check(const eqp_plugin_desc *d, const char *path, char *err, size_t len);

/* ---------------------------------------------------------- cautions */

/* Index of a hazard key in the fixed list (caution.c), or -1. */
int eqpi_hazard_find(const char *key);
/* A hint for an unknown hazard key: the nearest key, or where the list is. */
void eqpi_hazard_hint(const char *key, char *buf, size_t len);
/* The caution for reagent (its classes and what to do); 0 and "" when it
** has no hazards. */
int eqpi_caution_text(const eqpi_db *db, int reagent, char *buf, size_t len);
void eqpi_cautions_free(eqp_ctx *ctx);
/* While held (delta +1, then -1), solutions still record the hazardous
** reagents they receive but the context does not: for sweeps that make
** every buffer of the library only to draw its curve. */
void eqpi_cautions_hold(eqp_ctx *ctx, int delta);

/* ---------------------------------------------------------- library */

unsigned long long eqpi_hash_bytes(const void *p, size_t n, unsigned long long h);
/* The key of a file: its real path when it exists, else the path. */
void eqpi_file_key(const char *path, char *buf, size_t len);
/* Read a whole file through the context's allocator (ctx.c); free text with
** eqpi_free(ctx, text, *cap). */
int eqpi_read_file(eqp_ctx *ctx, const char *path, char **text, size_t *len, size_t *cap);
/* The *.lua files of a folder (not hidden), sorted; free with
** eqpi_free_names. EQP_E_IO if dir is not a readable folder. */
int eqpi_list_species_files(eqp_ctx *ctx, const char *dir, char ***names, int *n);
void eqpi_free_names(eqp_ctx *ctx, char **names, int n);
/* A note for an unknown name defined by a species file that was left out
** of the library, or NULL. */
const char *eqpi_library_note(const eqp_ctx *ctx, const char *name);
void eqpi_library_free(eqp_ctx *ctx);

/* ---------------------------------------------------------- context */

/* The host's copies of a plugin's descriptor and operations, full size:
** members the plugin's ABI lacks read as NULL (plugins.c). */
typedef struct eqpi_plugin_copy {
  eqp_plugin_desc desc;
  eqp_activity_ops ops;
} eqpi_plugin_copy;

typedef struct eqpi_plugin_handle {
  char *name;
  char *path;
  void *dl;
  const eqp_plugin_desc *desc;  /* &copy->desc */
  eqpi_plugin_copy *copy;       /* its own allocation: the handle array moves */
} eqpi_plugin_handle;

struct eqp_ctx {
  eqp_alloc_fn alloc;
  void *ud;
  char errmsg[EQPI_ERRLEN];
  int errcode;
  eqpi_db *db;          /* the library as loaded so far (one reference) */
  eqpi_db *live;        /* every library something holds, newest first (weak) */
  unsigned next_generation;
  bool default_loaded;
  char **plugin_dirs;
  int nplugin_dirs;
  eqpi_plugin_handle *plugins;
  int nplugins, capplugins;
  eqp_host_api host;
  eqp_progress_fn progress;   /* long operations report here (eqp_ctx_set_progress) */
  void *progress_ud;
  /* species path and what loading left behind (library.c) */
  char **species_dirs;
  int nspecies_dirs;
  char **notices;       /* replaced systems, files left out */
  int nnotices, capnotices;
  char **broken;        /* per file left out: "path: what is wrong" */
  int nbroken, capbroken;
  eqpi_index broken_names; /* names staged by those files -> broken[] */
  eqpi_arena *broken_arena;
  /* hazardous reagents used, in order of first use (caution.c): names,
  ** since solutions may use libraries of their own */
  char **caution_rg;
  char **caution_text;
  int ncautions, capcautions, capcaution_rg;
  unsigned caution_seen_gen; /* the last reagent recorded: library generation, index */
  int caution_seen_rg;
  int caution_hold;     /* > 0: record on solutions only (eqpi_cautions_hold) */
  eqp_warning_fn warn_fn;   /* warn.c: the host's observer of warnings */
  void *warn_ud;
  int quiet;                /* > 0: results made now are internal, not observed */
  /* the default configuration (paths.c): copies of the environment as
  ** eqp_ctx_default_config read it; NULL when unset or never read */
  char *env_species_path, *env_plugin_path, *user_species_dir;
  /* the log (log.c): messages up to log_level go to log_fn */
  eqp_log_fn log_fn;
  void *log_ud;
  int log_level;
  eqp_observer obs;         /* observer.c: the host's callbacks (all NULL: none) */
  void *obs_ud;
  struct eqpi_newton *newton_pool;   /* idle Newton workspaces (newton.c) */
  int newton_pooled;
  void *spare_result;       /* the last result block freed, for the next (result.c) */
  size_t spare_bytes;
  struct eqpi_tableau *tableaux[EQPI_TABLEAU_CACHE];  /* the last tableaux made (tableau.c) */
  char **gases_used;    /* gases a solution was opened to, for the provenance */
  int ngases_used, capgases_used;
};

/* Record that a solution was opened to gas name (its K_H joins the
** provenance of the run). */
void eqpi_gas_used(eqp_ctx *ctx, const char *name);
int eqpi_gas_was_used(const eqp_ctx *ctx, const char *name);
/* A caution of the run not tied to a reagent (a sealed vessel), recorded
** once under its label, as a reagent's is (caution.c). */
int eqpi_caution_note(eqp_ctx *ctx, const char *label, const char *text);

/* ---------------------------------------------------------- log */

/* Whether a message of level would reach the log: test it before work
** that only the message needs. */
static inline bool eqpi_log_on(const eqp_ctx *ctx, int level)
{
  return ctx && level <= ctx->log_level;
}
/* Index of v in the ascending a[0..n), or -1: a tableau's species are its
** library indexes in ascending order (tableau.c, result.c). */
static inline int eqpi_find_sorted(const int *a, int n, int v)
{
  int lo = 0, hi = n - 1;
  while (lo <= hi) {
    int mid = lo + (hi - lo) / 2;
    if (a[mid] == v) return mid;
    if (a[mid] < v) lo = mid + 1;
    else hi = mid - 1;
  }
  return -1;
}
/* Short vectors of the solver (a few unknowns): copied and compared in
** line, without a call into the C library for a handful of doubles. */
static inline void eqpi_vcopy(double *restrict dst, const double *restrict src, int n)
{
  for (int i = 0; i < n; i++) dst[i] = src[i];
}
/* Whether a and b hold the same bits (memcmp's equality: -0 is not 0). */
static inline bool eqpi_vsame(const double *a, const double *b, int n)
{
  for (int i = 0; i < n; i++) {
    uint64_t x, y;
    memcpy(&x, &a[i], sizeof x);
    memcpy(&y, &b[i], sizeof y);
    if (x != y) return false;
  }
  return true;
}

/* One line (no newline) to the context's log at level (EQP_LOG_*); nothing
** when no callback takes that level. Lines longer than 1 KiB are cut. */
void eqpi_log(eqp_ctx *ctx, int level, const char *fmt, ...) EQPI_PRINTF(3, 4);
void eqpi_vlog(eqp_ctx *ctx, int level, const char *fmt, va_list ap);

/* ---------------------------------------------------------- paths */

enum { EQPI_DIR_PLUGINS = 1, EQPI_DIR_SPECIES = 2 };
/* The folder of the plugins or species that came with the library, found
** from the library's own location (paths.c); -1 if it cannot be told. */
int eqpi_builtin_dir(int which, char *buf, size_t len);
void eqpi_config_free(eqp_ctx *ctx);

/* Tell the progress callback, if any, how far a long operation is. */
void eqpi_progress(eqp_ctx *ctx, const char *what, size_t done, size_t total);

extern const eqp_host_api eqpi_host_template;

/* ---------------------------------------------------------- solver */

typedef struct eqpi_system eqpi_system;

typedef struct eqpi_solve_stats {
  long iterations;
  double residual;      /* max relative balance residual after the solve */
  int missing_T;        /* constants used at 25 C values away from 25 C */
  int outside_T;        /* temperature functions used outside their range */
  const char *model_note; /* the activity model's note from bind, or "" */
  /* filled by the caller, for the warnings of the state (warn.c) */
  double solute_L;      /* estimated volume of the solutes (volume.c), L */
  double unknown_g;     /* g of solutes whose volume is not known */
  const eqp_plugin_desc *replaced; /* the default model this state's model replaced */
} eqpi_solve_stats;

/* ---------------------------------------------------------- observer */

/* Tell the host's observer (observer.c); each does nothing without one. */
void eqpi_observe_result(eqp_ctx *ctx, const eqp_result *r);
void eqpi_observe_curve(eqp_ctx *ctx, const eqp_curve *c);
void eqpi_observe_reagent(eqp_ctx *ctx, const char *reagent);
void eqpi_observe_caution(eqp_ctx *ctx, const char *reagent, const char *text);

/* ---------------------------------------------------------- warnings */

/* Pass one warning to the host's observer, unless the context is quiet. */
void eqpi_warn(eqp_ctx *ctx, const char *kind, const char *text);
/* An `add` for eqpi_state_warnings that passes "prefix: text" to the observer. */
typedef struct eqpi_prefixed { eqp_ctx *ctx; const char *prefix; } eqpi_prefixed;
void eqpi_warn_prefixed(void *ud, const char *kind, const char *text);
/* The warnings of a solved state (model range, temperature data,
** concentration scale, a replaced default model): each goes to add with
** its kind. model: the model used; I in mol/kg; T in K. */
void eqpi_state_warnings(const eqpi_model *model, double I, double T, double water_kg,
                         const eqpi_solve_stats *st,
                         void (*add)(void *ud, const char *kind, const char *text), void *ud);

/* ---------------------------------------------------------- volumes */

/* Volume the reagent takes per mol as a solid (crystal density) or a pure
** liquid (its density), less its water of crystallisation, which joins the
** solvent: L/mol into *L. Returns 1 when known, 0 when not (*L = 0). */
int eqpi_reagent_volume(const eqpi_reagent *r, double *L);
/* The source of the crystal densities, for messages and docs. */
extern const char eqpi_density_source[];

/* ---------------------------------------------------------- default model */

/* The default activity model ("davies") gives way, beyond its stated range,
** to the next of this chain whose stated range covers the ionic strength. */
#define EQPI_DEFAULT_CHAIN 3
extern const char *const eqpi_default_chain[EQPI_DEFAULT_CHAIN];

/* Build (or reuse) the active system for totals (mol/kg) at T and solve.
** On success the system holds the molalities. */
int eqpi_system_solve(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp,
                      const double *totals, double T, eqpi_model *model,
                      eqpi_solve_stats *stats);
/* The same with the mask of the components present given, as
** eqpi_system_molalities made it for these totals. */
int eqpi_system_solve_mask(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp,
                           const double *totals, const unsigned char *mask, double T,
                           eqpi_model *model, eqpi_solve_stats *stats);
/* One pass over the library's components: mol = total / water_kg (mol/kg),
** the mask of those present for eqpi_system_solve_mask, and *big when a
** molality is beyond EQPI_MAX_MOLALITY or not finite. A negative total
** (other than of water or H+) is an error. */
int eqpi_system_molalities(eqp_ctx *ctx, const eqpi_db *db, const double *total,
                           double water_kg, double *mol, unsigned char *mask, int *big);
void eqpi_system_free(eqp_ctx *ctx, eqpi_system *sys);
/* Whether the system holds the solution for these totals (mol over the
** database's components, in water_kg) at T (K). */
bool eqpi_system_current(const eqpi_system *s, const double *total, double water_kg, double T);
/* The next solve starts cold. NULL ok. */
void eqpi_system_forget(eqpi_system *s);
/* A system for a copy of a solution, with model (the copy's): the same
** tableau and the last solution as its warm start. NULL when src holds no
** solution or memory is short (the copy then starts cold). */
eqpi_system *eqpi_system_clone(eqp_ctx *ctx, const eqpi_system *src, eqpi_model *model);
/* The model the system was last prepared with. */
const eqpi_model *eqpi_system_model(const eqpi_system *s);
/* Free the idle Newton workspaces of the context (newton.c), and its
** cached tableaux (tableau.c; one a system still uses goes with it). */
void eqpi_newton_pool_free(eqp_ctx *ctx);
/* Free the result block the context keeps for the next result (result.c). */
void eqpi_result_spare_free(eqp_ctx *ctx);
void eqpi_tableau_cache_free(eqp_ctx *ctx);

/* What an adjustment holds: the pH, the activity of a species, or the
** ionic strength. */
enum { EQPI_ADJ_PH = 0, EQPI_ADJ_ACTIVITY = 1, EQPI_ADJ_IONIC = 2, EQPI_ADJ_FREE = 3 };

/* One target of an adjustment: v units of a direction (a: moles per unit,
** over the database's components; w: kg of water per unit) added to N0
** moles in W0 kg of water until the target holds. The targets of one
** adjustment share N0, W0, T and the model (those of the first). */
typedef struct eqpi_adjust {
  const double *N0, *a;
  double W0, w, T;
  eqpi_model *model;
  double pH;            /* target of EQPI_ADJ_PH */
  double v0;            /* where the search starts (solved first) */
  double vmin, vmax;    /* what v may be; vmin <= v0 */
  const char *what;     /* the reagent, for messages */
  const char *vmax_text;/* "5 mol per kg of water", for messages */
  int kind;             /* EQPI_ADJ_* (0, the pH, when left out) */
  int species;          /* EQPI_ADJ_ACTIVITY: the species (database index) */
  double value;         /* its activity; free molality or ionic strength, mol/kg */
  int floor_ok;         /* vmin is an answer when even it overshoots (a gas all gone) */
} eqpi_adjust;

/* Find the amounts v[0..n-1] that meet the n targets together: one solve of
** the problem with the amounts as unknowns and a fixed-activity (or ionic
** strength) row each (KINSOL), with Brent's method on ordinary solves as
** the fallback. On success the system holds the solution at v. EQP_E_INPUT
** when a target cannot be reached. */
int eqpi_system_adjust(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp,
                       const eqpi_adjust *aj, int n, double *v, eqpi_solve_stats *st);
/* Hold the activity of component comp (database index) at exp(lna), the
** charge balanced by component counter: one solve with those two rows; the
** totals (mol/kg over the database's components, as solved before) of both
** become outputs in *tc and *tq. On success the system holds the solution. */
int eqpi_system_fix(eqp_ctx *ctx, const eqpi_db *db, eqpi_system **sysp, const double *totals,
                    double T, eqpi_model *model, int comp, double lna, int counter, double *tc,
                    double *tq);
/* dpH/dv of the solved system for a direction (global components). */
int eqpi_system_dpH(eqp_ctx *ctx, eqpi_system *s, const double *a_global, double w, double W,
                    double *dpH);
/* d(ln a of library species `species`)/dv along a direction, as eqpi_system_dpH. */
int eqpi_system_dlna(eqp_ctx *ctx, eqpi_system *s, const double *a_global, double w, double W,
                     int species, double *d);
/* After a successful solve: species count, global index, molality, log10 g,
** and the ionic strength. */
int eqpi_system_nspecies(const eqpi_system *sys);
int eqpi_system_species(const eqpi_system *sys, int i, double *m, double *lg);
double eqpi_system_ionic_strength(const eqpi_system *sys);

/* Small dense LU with partial pivoting (SUNDIALS's, newton.c): A is n x n
** row-major, n <= 64; after eqpi_lu_factor it holds the factors in
** SUNDIALS's order, for eqpi_lu_solve only. */
int eqpi_lu_factor(double *A, int *piv, int n);
void eqpi_lu_solve(const double *A, const int *piv, int n, double *b);

#endif
