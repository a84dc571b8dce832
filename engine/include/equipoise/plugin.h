/* Equipoise plugin ABI: the only header a plugin includes. */
/* SPDX-License-Identifier: MIT */
#ifndef EQUIPOISE_PLUGIN_H
#define EQUIPOISE_PLUGIN_H

#include <stddef.h>
#include <stdint.h>

#ifdef __cplusplus
extern "C" {
#endif

/*
** Versioning. abi_version packs major (high 16 bits) and minor (low 16 bits).
** Within one major version, structs only grow at their end; a reader checks
** struct_size (EQP_PLUGIN_HAS) before touching a member added in a later
** minor version. The sizes of 1.0 are frozen below the structs.
*/
#define EQP_PLUGIN_ABI_MAJOR 1
#define EQP_PLUGIN_ABI_MINOR 2
#define EQP_PLUGIN_ABI_VERSION \
  ((uint32_t)EQP_PLUGIN_ABI_MAJOR << 16 | (uint32_t)EQP_PLUGIN_ABI_MINOR)

/* Sizes of the engine's number and index types, checked on load. */
#define EQP_PLUGIN_SIZES ((uint32_t)(sizeof(double) << 8 | sizeof(size_t)))

#define EQP_PLUGIN_ENTRY "eqp_plugin_entry"

#if defined(__GNUC__)
#define EQP_PLUGIN_EXPORT __attribute__((visibility("default")))
#else
#define EQP_PLUGIN_EXPORT
#endif

/* Levels of ctx_log, as in equipoise.h (most severe first). */
#define EQP_LOG_ERROR 1
#define EQP_LOG_WARN  2
#define EQP_LOG_INFO  3
#define EQP_LOG_DEBUG 4
#define EQP_LOG_TRACE 5

/* What the host offers a plugin: one table per context, read-only, living
** as long as the context that loaded the plugin. */
typedef struct eqp_host_api {
  uint32_t abi_version;
  uint32_t struct_size;          /* sizeof(eqp_host_api) as the host built it */
  /* 1.0 */
  void *(*alloc)(size_t n);      /* malloc-like; NULL on exhaustion */
  void (*free)(void *p);         /* frees what alloc returned; NULL ok */
  void (*log)(const char *msg);  /* a line to the log of the context that is
                                    calling the plugin, at EQP_LOG_INFO */
  /* 1.1: test EQP_PLUGIN_HAS(host, ud) before use */
  void *ud;                      /* the host's data: pass it to the calls below */
  /* The context's own allocator, lua_Alloc's shape: nsize 0 frees ptr
  ** (osize bytes) and returns NULL; otherwise (re)allocates, NULL on
  ** exhaustion. Memory from it counts against the program's allocator. */
  void *(*ctx_alloc)(void *ud, void *ptr, size_t osize, size_t nsize);
  /* A line to the context's log at a level (EQP_LOG_*). */
  void (*ctx_log)(void *ud, int level, const char *msg);
} eqp_host_api;

typedef enum eqp_plugin_kind {
  EQP_PLUGIN_ACTIVITY = 1
} eqp_plugin_kind;

/*
** Input to an activity model for one evaluation. All arrays have n entries,
** one per species in solution, borrowed for the duration of the call.
*/
typedef struct eqp_activity_in {
  size_t n;
  const double *charge;     /* z */
  const double *size;       /* ion-size parameter, Angstrom; NaN if unknown */
  const double *molality;   /* mol/kg, mass action at the current iterate with
                               unit activity coefficients (see docs/plugin-abi.md) */
  double ionic_strength;    /* mol/kg, the solver's current value */
  double temperature;       /* K */
  double A;                 /* Debye-Hueckel A, kg^1/2 mol^-1/2, log10 basis */
  double B;                 /* Debye-Hueckel B, kg^1/2 mol^-1/2 per Angstrom */
} eqp_activity_in;

/*
** The species of a solution, given to a model's bind() whenever the set of
** species present changes. Index i here is index i of every later
** eqp_activity_in. Borrowed for the duration of the call.
*/
typedef struct eqp_species_info {
  size_t n;
  const char *const *name;  /* as in the species files */
  const double *charge;
  const double *size;       /* ion-size parameter, Angstrom; NaN if unknown */
  const void *ud;           /* pass back to param() and pair() */
  /* A numeric parameter of species i from its file (e.g. "tj_linear"): 0 and
  ** *value set, or -1 if the files do not give it. */
  int (*param)(const void *ud, size_t i, const char *key, double *value);
  /* A parameter of the pair (i, j), in either order (e.g. "sit"). */
  int (*pair)(const void *ud, size_t i, size_t j, const char *key, double *value);
} eqp_species_info;

/* Operations of an activity model. Required members first. */
typedef struct eqp_activity_ops {
  uint32_t struct_size;     /* sizeof(eqp_activity_ops) as the plugin built it */
  /* 1.0, required */
  /* Make per-solution state (*state may stay NULL). Return 0, or non-zero
  ** after writing a reason into err (errlen bytes, caller-owned). */
  int (*create)(const eqp_host_api *host, void **state, char *err, size_t errlen);
  void (*destroy)(const eqp_host_api *host, void *state);
  /* Write log10 gamma of every species into lg[0..n-1]. Must be a smooth
  ** deterministic function of its input. Return 0 or non-zero with err. */
  int (*log_gamma)(void *state, const eqp_activity_in *in, double *lg,
                   char *err, size_t errlen);
  /* 1.0, optional (NULL: no parameters) */
  /* Set a named parameter; return non-zero with err if unknown or bad. */
  int (*set_param)(void *state, const char *name, double value, char *err, size_t errlen);
  /* 1.0, optional (NULL: the model needs nothing but charges and sizes) */
  /* Take the species present and read their parameters. A note for the
  ** user (e.g. a default used for a missing parameter) goes into warn
  ** (warnlen bytes, empty if none). Return 0, or non-zero with err. */
  int (*bind)(void *state, const eqp_species_info *info, char *warn, size_t warnlen,
              char *err, size_t errlen);
  /* 1.2, optional: derivatives (both NULL: the host differentiates by
  ** difference quotients). A model gives at most one of the two. */
  /* For a model whose log gamma reads the ionic strength but not the
  ** molalities: dlg[i] = d log10 gamma_i / dI at the point in describes.
  ** Giving it declares that in->molality is not read. Return 0 or non-zero
  ** with err. */
  int (*dlog_gamma_dI)(void *state, const eqp_activity_in *in, double *dlg, char *err,
                       size_t errlen);
  /* For any model: the derivative of log10 gamma along a direction at the
  ** point in describes, dlg[i] = sum_j (d lg_i / d m_j) dm[j] + (d lg_i / dI) dI,
  ** m being in->molality; dm is NULL when the molalities do not move.
  ** Return 0 or non-zero with err. */
  int (*log_gamma_tangent)(void *state, const eqp_activity_in *in, const double *dm, double dI,
                           double *dlg, char *err, size_t errlen);
} eqp_activity_ops;

/* The descriptor a plugin's entry returns. Static and read-only. */
typedef struct eqp_plugin_desc {
  uint32_t abi_version;     /* EQP_PLUGIN_ABI_VERSION the plugin was built with */
  uint32_t struct_size;     /* sizeof(eqp_plugin_desc) as the plugin built it */
  uint32_t sizes;           /* EQP_PLUGIN_SIZES */
  uint32_t kind;            /* eqp_plugin_kind */
  const char *name;         /* script-visible name, e.g. "davies" */
  const char *version;      /* the plugin's own version string */
  const char *summary;      /* one line */
  const void *ops;          /* eqp_activity_ops for EQP_PLUGIN_ACTIVITY */
  /* 1.0: validity range of the model; beyond it results carry a warning */
  double max_ionic_strength; /* mol/kg; 0 means no stated limit */
} eqp_plugin_desc;

/*
** The sizes of ABI 1.0, frozen: a descriptor smaller than
** EQP_PLUGIN_DESC_SIZE_1_0 or operations smaller than their required part
** are refused; a plugin must not read a host table beyond
** EQP_HOST_API_SIZE_1_0 without EQP_PLUGIN_HAS. Each is the end of the last
** member 1.0 had, so members appended later never change them (on LP64:
** 32, 56, 32 and 48 bytes).
*/
#define EQP_HOST_API_SIZE_1_0 (offsetof(eqp_host_api, log) + sizeof(void (*)(void)))
#define EQP_PLUGIN_DESC_SIZE_1_0 (offsetof(eqp_plugin_desc, max_ionic_strength) + sizeof(double))
#define EQP_ACTIVITY_OPS_REQUIRED (offsetof(eqp_activity_ops, log_gamma) + sizeof(void (*)(void)))
#define EQP_ACTIVITY_OPS_SIZE_1_0 (offsetof(eqp_activity_ops, bind) + sizeof(void (*)(void)))

/*
** Whether the struct at p, which records its size in struct_size (the host
** table, a descriptor, operations), was built with member m. Anything added
** after 1.0 is read only when this holds:
**   if (EQP_PLUGIN_HAS(host, ctx_log)) host->ctx_log(host->ud, EQP_LOG_DEBUG, "...");
** EQP_PLUGIN_HAS_OP also requires the member (an optional operation or a
** host function) to be non-NULL, which is what a caller needs.
*/
#define EQP_PLUGIN_HAS(p, m)                                                     \
  ((size_t)(p)->struct_size >=                                                   \
   (size_t)((const char *)&(p)->m - (const char *)(p)) + sizeof((p)->m))
#define EQP_PLUGIN_HAS_OP(p, m) (EQP_PLUGIN_HAS(p, m) && (p)->m != NULL)

/* The one symbol a plugin exports. Return the descriptor, or NULL after
** writing a reason into err. */
typedef const eqp_plugin_desc *(*eqp_plugin_entry_fn)(const eqp_host_api *host,
                                                       char *err, size_t errlen);

/* Define the entry of a plugin whose descriptor is the static desc:
**   EQP_PLUGIN_DEFINE(my_desc)
** A plugin that must refuse at load time writes its own entry instead. */
#define EQP_PLUGIN_DEFINE(desc)                                                    \
  EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *host, \
                                                            char *err, size_t errlen); \
  EQP_PLUGIN_EXPORT const eqp_plugin_desc *eqp_plugin_entry(const eqp_host_api *host, \
                                                            char *err, size_t errlen)  \
  {                                                                                \
    (void)host; (void)err; (void)errlen;                                           \
    return &(desc);                                                                \
  }

#ifdef __cplusplus
}
#endif
#endif
