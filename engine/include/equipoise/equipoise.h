/* Equipoise: the C API of the aqueous equilibrium engine. */
/* SPDX-License-Identifier: MIT */
#ifndef EQUIPOISE_H
#define EQUIPOISE_H

#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include "version.h"

#ifdef __cplusplus
extern "C" {
#endif

#if defined(__GNUC__)
#define EQP_API __attribute__((visibility("default")))
#else
#define EQP_API
#endif

/*
** Status codes. 0 is success, negative values are errors. Every failing call
** also leaves a message in its context, read with eqp_ctx_errmsg().
*/
#define EQP_STATUS_LIST(X)                                              \
  X(EQP_OK,         0,  "ok")                                           \
  X(EQP_E_NOMEM,   -1,  "out of memory")                                \
  X(EQP_E_ARG,     -2,  "invalid argument")                             \
  X(EQP_E_INPUT,   -3,  "invalid input value")                          \
  X(EQP_E_UNKNOWN, -4,  "unknown name")                                 \
  X(EQP_E_DATA,    -5,  "malformed species data")                       \
  X(EQP_E_IO,      -6,  "cannot read file")                             \
  X(EQP_E_PLUGIN,  -7,  "plugin missing or refused")                    \
  X(EQP_E_CONVERGE,-8,  "no convergence")                               \
  X(EQP_E_VERIFY,  -9,  "balances do not close after the solve")        \
  X(EQP_E_WRITE,  -10,  "cannot write an output file")

typedef enum eqp_status {
#define EQP_X_ENUM(name, value, text) name = value,
  EQP_STATUS_LIST(EQP_X_ENUM)
#undef EQP_X_ENUM
} eqp_status;

/* "EQP_E_INPUT" for EQP_E_INPUT; "EQP_UNKNOWN_STATUS" otherwise. Static. */
EQP_API const char *eqp_status_name(int status);
/* A short English description of a status. Static. */
EQP_API const char *eqp_status_str(int status);

/* The version of the library that runs, which may be newer than the
** headers a program was built with: EQP_VERSION_STRING and
** EQP_VERSION_NUMBER as the library was built. Static. */
EQP_API const char *eqp_version(void);
EQP_API int eqp_version_number(void);

/* Allocator with lua_Alloc's shape: nsize 0 frees, otherwise realloc. */
typedef void *(*eqp_alloc_fn)(void *ud, void *ptr, size_t osize, size_t nsize);

/*
** Option structs begin with their own size, so that the library can grow
** them at their end and still read a struct compiled against older
** headers. Start every one from its INIT macro, which sets the size and
** the defaults, then set the members you need:
**   eqp_titration t = EQP_TITRATION_INIT;
**   t.reagent = "NaOH"; t.step = 0.1e-3; t.to = 20e-3;
** A struct whose size is 0 (`= {0}`), smaller than the first published
** one, or larger than this library knows is refused with EQP_E_ARG.
*/

typedef struct eqp_ctx eqp_ctx;           /* allocator, species, plugins, errors */
typedef struct eqp_solution eqp_solution; /* a composition being equilibrated */
typedef struct eqp_result eqp_result;     /* an immutable snapshot of one solve */
typedef struct eqp_curve eqp_curve;       /* the rows of a titration */
typedef struct eqp_library eqp_library;   /* an immutable species library */

/* ------------------------------------------------------------------ ctx */

/* New context. alloc NULL uses malloc/realloc/free. Returns NULL only when
** memory is exhausted. Nothing is loaded yet. */
EQP_API eqp_ctx *eqp_ctx_new(eqp_alloc_fn alloc, void *ud);
/* Frees the context. All its solutions and results must be freed first.
** NULL is a no-op. */
EQP_API void eqp_ctx_free(eqp_ctx *ctx);
/* The message of the last failing call on ctx or on anything it owns.
** Borrowed; valid until the next call on the context. */
EQP_API const char *eqp_ctx_errmsg(const eqp_ctx *ctx);
/* The status of the last failing call (EQP_OK if none failed since the
** last eqp_ctx_clear_error). */
EQP_API int eqp_ctx_errcode(const eqp_ctx *ctx);
EQP_API void eqp_ctx_clear_error(eqp_ctx *ctx);

/* Diagnostics. The library never writes to stderr and never reads the
** environment on its own: what it has to say goes to the context's log
** callback, if one is set, and a program chooses what to show. Levels, most
** severe first: */
#define EQP_LOG_ERROR 1   /* something failed (also returned as a status) */
#define EQP_LOG_WARN  2   /* a result may be less than it seems */
#define EQP_LOG_INFO  3   /* what was loaded from where; plugins' own lines */
#define EQP_LOG_DEBUG 4   /* search paths, decisions of the solver */
#define EQP_LOG_TRACE 5   /* one line per KINSOL call and per start iteration */
/* msg is one line without its newline, borrowed for the call. The callback
** must not call back into the context. */
typedef void (*eqp_log_fn)(void *ud, int level, const char *msg);
/* Send messages of level <= max_level to fn (NULL fn or max_level 0: none,
** the default). */
EQP_API void eqp_ctx_set_log(eqp_ctx *ctx, eqp_log_fn fn, void *ud, int max_level);
/* "error", "warn", "info", "debug", "trace"; "?" otherwise. Static. */
EQP_API const char *eqp_log_level_name(int level);

/* The default configuration, the one place the library reads the
** environment: EQUIPOISE_SPECIES_PATH and EQUIPOISE_PLUGIN_PATH (folders,
** colon-separated) and the user's species folder ($XDG_DATA_HOME/
** equipoise/species, else ~/.local/share/equipoise/species), each copied
** now and used in its place on the paths below. The command and the Lua
** module call it; a program embedding the library calls it to behave as
** they do, or leaves it out to depend on its own calls only. Call it before
** the library loads. EQP_OK or EQP_E_NOMEM. */
EQP_API int eqp_ctx_default_config(eqp_ctx *ctx);

/* Load one species file (path) or every *.lua file in a folder, checking
** the whole set before any of it becomes visible. On failure nothing of the
** file or folder is kept and the message reads "file:line: what is wrong".
** Returns EQP_OK, EQP_E_IO, EQP_E_DATA, EQP_E_NOMEM. */
EQP_API int eqp_ctx_load_species_file(eqp_ctx *ctx, const char *path);
EQP_API int eqp_ctx_load_species_dir(eqp_ctx *ctx, const char *dir);
/* Load Lua species text (the same format) under the given source name. */
EQP_API int eqp_ctx_load_species_text(eqp_ctx *ctx, const char *text,
                                      size_t len, const char *source);
/* Loading the same file, or the same text under the same source name, a
** second time is a no-op (EQP_OK). */

/* Load the species library: every *.lua file on the species path, a list
** of folders searched in this order:
**   1. folders added with eqp_ctx_add_species_dir (the last added first);
**   2. EQUIPOISE_SPECIES_PATH, colon-separated (each must be a folder), and
**   3. the user's folder, $XDG_DATA_HOME/equipoise/species or
**      ~/.local/share/equipoise/species, when it exists: both only after
**      eqp_ctx_default_config;
**   4. the built-in library, found from where the library file is:
**      <libdir>/../share/equipoise/species in the install layout (the
**      build tree has the same layout).
** A file in an earlier folder replaces the file of the same name in a later
** one (a notice says so). A file with problems, and a file that needs what
** such a file defines, is left out with a notice naming it; the rest loads,
** and a run that asks for a name the left-out file defines gets an error
** that names the file. EQP_E_DATA only when nothing at all could be loaded.
** Idempotent. */
EQP_API int eqp_ctx_load_default_library(eqp_ctx *ctx);
/* Put a folder first on the species path (copied); before the library loads. */
EQP_API int eqp_ctx_add_species_dir(eqp_ctx *ctx, const char *dir);
/* Check a species file against the library: load the library with path
** first on the species path (so that an edited copy of a library file
** replaces the original), or, if the library is already loaded, load path.
** EQP_OK and *nspecies (if not NULL) the number of species the file
** defines, or the file's own problems as with eqp_ctx_load_species_file. */
EQP_API int eqp_ctx_check_species_file(eqp_ctx *ctx, const char *path, size_t *nspecies);
/* What loading the library had to say (a replaced file, a file left out),
** one line each, in order. Borrowed. */
EQP_API size_t eqp_ctx_notice_count(const eqp_ctx *ctx);
EQP_API const char *eqp_ctx_notice(const eqp_ctx *ctx, size_t i);

/* Prepend a folder to the plugin search path (copied). The path is, in
** order: folders added here, EQUIPOISE_PLUGIN_PATH (colon-separated; after
** eqp_ctx_default_config), and the plugins that came with the library,
** <libdir>/equipoise/plugins beside the library file. */
EQP_API int eqp_ctx_add_plugin_dir(eqp_ctx *ctx, const char *dir);

/* ------------------------------------------------------------ library */

/* A species library is immutable: loading species into the context makes
** a new library, and whatever was made with the old one (a solution, a
** result) keeps it. A library stays valid while anything holds it.
**
** The context's library as loaded so far. Borrowed: valid until the next
** load into the context (eqp_ctx_load_*), or for longer with
** eqp_library_ref. NULL only for a NULL ctx. */
EQP_API const eqp_library *eqp_ctx_library(const eqp_ctx *ctx);
/* The library a solution was made with; borrowed, valid while s lives. */
EQP_API const eqp_library *eqp_solution_library(const eqp_solution *s);
/* One more holder of lib: returns lib, to be released with
** eqp_library_free. */
EQP_API const eqp_library *eqp_library_ref(const eqp_library *lib);
/* Release a library returned by eqp_library_ref, _extend_* or _only /
** _without. NULL is a no-op. Every library must be released before its
** context is freed. */
EQP_API void eqp_library_free(const eqp_library *lib);
/* A new library: base and a species file, or species text under a source
** name, checked as a whole as by eqp_ctx_load_species_file; the context's
** library and every other library are unchanged. *out is released with
** eqp_library_free. Making the same from the same base again gives the
** same library while it lives. EQP_E_IO, EQP_E_DATA, EQP_E_NOMEM. */
EQP_API int eqp_library_extend_file(eqp_ctx *ctx, const eqp_library *base, const char *path,
                                    const eqp_library **out);
EQP_API int eqp_library_extend_text(eqp_ctx *ctx, const eqp_library *base, const char *text,
                                    size_t len, const char *source, const eqp_library **out);
/* A new library restricted by species files, each named as a file name
** without its folder and ".lua" ("phosphate" for species/phosphate.lua):
** _only keeps the named files and the files they build on, _without
** leaves the named files out and refuses (EQP_E_INPUT, naming what needs
** them) when a file kept builds on one of them. The file that defines the
** solvent (H2O, H+) is always kept. A species file's entries come or go
** together. EQP_E_UNKNOWN for a name that is no file of base. */
EQP_API int eqp_library_only(eqp_ctx *ctx, const eqp_library *base, const char *const *files,
                             size_t n, const eqp_library **out);
EQP_API int eqp_library_without(eqp_ctx *ctx, const eqp_library *base, const char *const *files,
                                size_t n, const eqp_library **out);
/* What a library holds, for listing. Indexes run from 0 to count-1; the
** strings are borrowed from the library. */
EQP_API size_t eqp_library_species_count(const eqp_library *lib);
EQP_API const char *eqp_library_species_name(const eqp_library *lib, size_t i);
EQP_API size_t eqp_library_reagent_count(const eqp_library *lib);
EQP_API const char *eqp_library_reagent_name(const eqp_library *lib, size_t i);
EQP_API size_t eqp_library_source_count(const eqp_library *lib);
EQP_API const char *eqp_library_source_path(const eqp_library *lib, size_t i);
EQP_API size_t eqp_library_buffer_count(const eqp_library *lib);
EQP_API const char *eqp_library_buffer_name(const eqp_library *lib, size_t i);
EQP_API size_t eqp_library_solid_count(const eqp_library *lib);
EQP_API const char *eqp_library_solid_name(const eqp_library *lib, size_t i);
EQP_API size_t eqp_library_gas_count(const eqp_library *lib);
EQP_API const char *eqp_library_gas_name(const eqp_library *lib, size_t i);

/* The contents of the context's library, as eqp_library_* on
** eqp_ctx_library(ctx). Borrowed from that library. */
EQP_API size_t eqp_ctx_species_count(const eqp_ctx *ctx);
EQP_API const char *eqp_ctx_species_name(const eqp_ctx *ctx, size_t i);
EQP_API size_t eqp_ctx_reagent_count(const eqp_ctx *ctx);
EQP_API const char *eqp_ctx_reagent_name(const eqp_ctx *ctx, size_t i);
/* How a description is written: text for a reader, or a JSON document
** (docs/json-output.md). */
typedef enum eqp_format { EQP_FORMAT_TEXT = 0, EQP_FORMAT_JSON = 1 } eqp_format;
/* Every library entry called `name` -- species, reagent (by name or alias),
** buffer system, solid, gas -- with its source and each of its constants at
** 25 C and at T (K): acid steps as dissociations with pKa, complexes as
** formations with log beta, solids with log Ksp, gases with log K_H. *out
** is a new string the caller frees with eqp_free_string. EQP_E_UNKNOWN if
** nothing has that name, EQP_E_INPUT for T outside 273.15..373.15 K. */
EQP_API int eqp_ctx_describe(eqp_ctx *ctx, const char *name, double T, eqp_format fmt,
                             char **out);
/* The library: species, reagents with their aliases, buffer systems,
** solids, gases and the files they came from. *out as above. */
EQP_API int eqp_ctx_list(eqp_ctx *ctx, eqp_format fmt, char **out);
/* Hazard classes recorded for a reagent (name or alias): count, and the
** i-th as a borrowed string. 0 / NULL for unknown names. */
EQP_API size_t eqp_ctx_reagent_hazard_count(const eqp_ctx *ctx, const char *name);
EQP_API const char *eqp_ctx_reagent_hazard(const eqp_ctx *ctx, const char *name, size_t i);
/* The hazard keys species files may use (docs/species-format.md): count,
** i-th key, and the UN GHS (Rev. 9) hazard class a key stands for (NULL for
** an unknown key). Static strings. */
EQP_API size_t eqp_hazard_key_count(void);
EQP_API const char *eqp_hazard_key(size_t i);
EQP_API const char *eqp_hazard_class(const char *key);
/* Hazardous reagents used in this context so far, each once under its
** library name in order of first use, whichever way it entered a solution:
** added, used to adjust the pH, titrated, put in a recipe, or inside a
** stock that was poured or mixed (a capacity sweep, which makes every
** candidate only to draw its curve, records none). The caution names its
** hazard classes and what to do. Borrowed. */
EQP_API size_t eqp_ctx_caution_count(const eqp_ctx *ctx);
EQP_API const char *eqp_ctx_caution(const eqp_ctx *ctx, size_t i);
EQP_API const char *eqp_ctx_caution_reagent(const eqp_ctx *ctx, size_t i);
/* The chemical formula of a species or reagent by name or alias, as its
** species file gives it ("C4H11NO3", "HPO4^2-", "Na2HPO4.7H2O"); borrowed
** from the context. NULL for an unknown name. */
EQP_API const char *eqp_ctx_formula(const eqp_ctx *ctx, const char *name);
/* Molar mass (g/mol) of a reagent by name or alias; EQP_E_UNKNOWN if none. */
EQP_API int eqp_ctx_reagent_molar_mass(eqp_ctx *ctx, const char *name, double *gmol);
/* Number of species files loaded and the path of the i-th. Borrowed. */
EQP_API size_t eqp_ctx_source_count(const eqp_ctx *ctx);
EQP_API const char *eqp_ctx_source_path(const eqp_ctx *ctx, size_t i);

/* An observer of warnings: called once for each warning the engine attaches
** to a result, a recipe or a pH adjustment, at the moment it is made (also
** for the results a titration or a buffer comparison makes inside), so a
** host can show it beside the step that caused it. kind is a stable short
** name: "ionic-strength" (beyond the model's stated range), "temperature"
** (constants without temperature data or beyond their stated range),
** "concentration-scale" (solutes take a noticeable part of the volume, so
** molarity = molality x density of water no longer holds), "default-model"
** (the default model gave way to another, see docs/activity-models.md),
** "model" (a note of the activity model), "recipe-volume" (the solids of a
** recipe take part of its volume). A titration reports each of its points:
** show one warning per kind and step. text is borrowed for the call. fn
** NULL removes the observer. */
typedef void (*eqp_warning_fn)(void *ud, const char *kind, const char *text);
/* The same calls as the observer's on_warning (below); both are told when
** both are set. */
EQP_API void eqp_ctx_set_warning_fn(eqp_ctx *ctx, eqp_warning_fn fn, void *ud);

/*
** An observer: what a host wants to hear about as the engine makes it, as
** callbacks, each optional (NULL: not told, and nothing is kept for it).
** This is how a program learns, at the moment they happen, of the results,
** curves, reagents, warnings and cautions of a run, wherever they come
** from: its own calls, or a Lua script it runs through the module. The
** engine keeps none of them for the observer; what a callback does not copy
** is gone when it returns. Objects are borrowed for the call: keep a result
** with eqp_result_copy, a curve as its JSON (eqp_curve_to_json). A callback
** may read what it is given and the context, but must not free or change
** it nor call back into the engine to make anything.
** The struct begins with its size, so that it can grow at its end: start
** from EQP_OBSERVER_INIT, then set the callbacks you want.
*/
typedef struct eqp_observer {
  size_t size;                  /* sizeof(eqp_observer): set by EQP_OBSERVER_INIT */
  /* every result eqp_solution_equilibrate returns to its caller (not the
  ** states a titration, recipe, comparison or budget solves inside) */
  void (*on_result)(void *ud, const eqp_result *r);
  /* every curve eqp_solution_titrate returns */
  void (*on_curve)(void *ud, const eqp_curve *c);
  /* a reagent of the library went into a solution: added, used to adjust
  ** the pH, titrated with, or put into a recipe's solution (each time;
  ** not for the candidates of a capacity sweep). reagent is its library
  ** name (eqp_ctx_constants takes it). */
  void (*on_reagent_used)(void *ud, const char *reagent);
  /* a warning, exactly as eqp_warning_fn above */
  void (*on_warning)(void *ud, const char *kind, const char *text);
  /* the first use in this context of a hazardous reagent: its library name
  ** and its caution, as eqp_ctx_caution gives it */
  void (*on_caution)(void *ud, const char *reagent, const char *text);
} eqp_observer;
#define EQP_OBSERVER_INIT                                                                  \
  { .size = sizeof(eqp_observer), .on_result = NULL, .on_curve = NULL,                    \
    .on_reagent_used = NULL, .on_warning = NULL, .on_caution = NULL }
/* Register an observer (the struct is copied; ud is passed to every
** callback), replacing the one before; obs NULL removes it. EQP_E_ARG for a
** size of 0 or below the first published size, or above this library's. */
EQP_API int eqp_ctx_set_observer(eqp_ctx *ctx, const eqp_observer *obs, void *ud);

/* Plugin listing: every activity-model plugin found on the search path.
** The callback gets name, version, summary and the file it came from, or
** for a refused file name NULL and the reason in summary. */
typedef void (*eqp_plugin_list_fn)(void *ud, const char *name, const char *version,
                                   const char *summary, const char *path);
EQP_API int eqp_ctx_list_plugins(eqp_ctx *ctx, eqp_plugin_list_fn fn, void *ud);

/* -------------------------------------------------------------- units */

/* What kind of quantity an amount string holds. */
typedef enum eqp_quantity {
  EQP_Q_NONE = 0,
  EQP_Q_AMOUNT = 1 << 0,      /* mol */
  EQP_Q_MASS = 1 << 1,        /* kg */
  EQP_Q_MOLARITY = 1 << 2,    /* mol/L */
  EQP_Q_MOLALITY = 1 << 3,    /* mol/kg of water */
  EQP_Q_VOLUME = 1 << 4,      /* L */
  EQP_Q_TEMPERATURE = 1 << 5, /* K */
  EQP_Q_PRESSURE = 1 << 6     /* atm */
} eqp_quantity;

/* Parse "12.5 mmol", "1.42 g", "25 mM", "10 mL", "37 C", ... into a value in
** the base unit of its kind (mol, kg, mol/L, mol/kg, L, K). allowed is a mask
** of eqp_quantity; a unit of another kind, a missing or unknown unit, a
** negative, non-finite or malformed number is EQP_E_INPUT with a message
** that quotes the string. */
EQP_API int eqp_parse_quantity(eqp_ctx *ctx, const char *text, unsigned allowed,
                               double *value, eqp_quantity *kind);

/* Density of liquid water in kg/L at T (K) and 0.101325 MPa (Kell 1975). */
EQP_API double eqp_water_density(double T);
/* The scales of a dilute solution, whose volume is taken as that of its
** water (docs/user-guide.md): the kg of water in litres of solution at T
** (K), for a solution given by its volume; and mol/kg from mol/L at T, for
** an ionic strength or a concentration given on the molar scale. */
EQP_API double eqp_water_of_volume(double litres, double T);
EQP_API double eqp_molal_of_molar(double molar, double T);

/* An amount of a reagent given as amount (mol) or mass (kg, through its
** molar mass) in mol. EQP_E_UNKNOWN for an unknown reagent, EQP_E_INPUT
** for another kind of quantity or a negative or non-finite value. */
EQP_API int eqp_ctx_reagent_mol(eqp_ctx *ctx, const char *reagent, double value,
                                eqp_quantity kind, double *mol);

/* Molar mass in g/mol of a formula such as "Na2HPO4.7H2O" or "Ca(OH)2",
** from the IUPAC standard atomic weights. EQP_E_INPUT on a bad formula. */
EQP_API int eqp_formula_molar_mass(eqp_ctx *ctx, const char *formula, double *gmol);

/* ----------------------------------------------------------- solution */

typedef struct eqp_solution_opts {
  size_t size;              /* sizeof(eqp_solution_opts): set by the INIT macro */
  double water;             /* mass of water, kg; > 0 */
  double temperature_K;     /* 273.15 .. 373.15 */
  const char *activity;     /* plugin name; NULL means "davies" */
} eqp_solution_opts;
/* 1 kg of water at 25 C, the Davies model. */
#define EQP_SOLUTION_OPTS_INIT \
  { .size = sizeof(eqp_solution_opts), .water = 1.0, .temperature_K = 298.15, .activity = NULL }

/* New solution of pure water. Loads the default library if nothing is
** loaded yet and the activity plugin named in opts. The solution holds the
** context's library as it is now for its life: a later load into the
** context does not change it. */
EQP_API int eqp_solution_new(eqp_ctx *ctx, const eqp_solution_opts *opts,
                             eqp_solution **out);
/* The same with the species of lib (which the solution holds) instead:
** a library extended or restricted for this solution only. */
EQP_API int eqp_solution_new_in(eqp_ctx *ctx, const eqp_library *lib,
                                const eqp_solution_opts *opts, eqp_solution **out);
EQP_API void eqp_solution_free(eqp_solution *s);
/* A deep copy (composition, temperature, model, last solution as warm start). */
EQP_API int eqp_solution_copy(const eqp_solution *s, eqp_solution **out);

/* Add a reagent by name or formula. The quantity kinds accepted are amount
** (mol), mass (kg), molarity (raises the concentration in the current volume,
** approximated as the volume of the water) and molality. value is in the
** base unit of kind. EQP_E_UNKNOWN for an unknown reagent, EQP_E_INPUT for a
** negative or non-finite value. */
EQP_API int eqp_solution_add(eqp_solution *s, const char *reagent, double value,
                             eqp_quantity kind);
/* Same, with an amount string such as "12.5 mmol". */
EQP_API int eqp_solution_add_str(eqp_solution *s, const char *reagent, const char *amount);

/* Set a parameter of the solution's activity model (e.g. "coefficient" of
** davies). EQP_E_PLUGIN with the model's message if it refuses. */
EQP_API int eqp_solution_set_activity_param(eqp_solution *s, const char *name, double value);
/* Change the temperature (K, 273.15 .. 373.15); the composition is kept. */
EQP_API int eqp_solution_set_temperature(eqp_solution *s, double T);

/* Add litres of another solution (a stock) with its water: a portion of its
** composition in proportion to the volume of its water at its temperature.
** The stock is a reservoir and is not changed. */
EQP_API int eqp_solution_pour(eqp_solution *s, const eqp_solution *stock, double litres);
/* A new solution from n parts: litres[i] of parts[i] (litres NULL: all of
** each). Its temperature is the water-weighted mean (no heat of mixing), its
** activity model and parameters those of parts[0]. Parts are unchanged. */
EQP_API int eqp_solution_mix(size_t n, eqp_solution *const *parts, const double *litres,
                             eqp_solution **out);
/* Multiply the water by factor (>= 1); solutes stay. */
EQP_API int eqp_solution_dilute(eqp_solution *s, double factor);
/* Make the solution up to litres with water: the factor is litres over its
** volume. EQP_E_INPUT when litres is less than its volume (water cannot be
** taken away). */
EQP_API int eqp_solution_dilute_to(eqp_solution *s, double litres);
/* Hazardous reagents a solution holds, added to it or to a stock poured
** into it: count and the i-th reagent's library name. Borrowed. */
EQP_API size_t eqp_solution_hazard_count(const eqp_solution *s);
EQP_API const char *eqp_solution_hazard_reagent(const eqp_solution *s, size_t i);
/* Total moles of a component ("Na+", "PO4^3-", "H+"; docs/methods.md). */
EQP_API int eqp_solution_total(const eqp_solution *s, const char *component, double *mol);

/* dpH per mol of reagent added, at the present equilibrium, by implicit
** differentiation of the equilibrium equations (no re-solving). */
EQP_API int eqp_solution_dpH(eqp_solution *s, const char *reagent, double *dpH_dmol);
/* Buffer capacity beta = dC(base)/dpH, strong base NaOH, per litre of
** solution (mol/(L . pH)) and per kg of water (mol/(kg . pH)), from the same
** derivative; either pointer may be NULL. Lua returns them in this order. */
EQP_API int eqp_solution_buffer_capacity(eqp_solution *s, double *per_L, double *per_kg);
/* Add exactly enough of a reagent, or of a stock solution (reagent NULL),
** to bring the pH to target, solved with the H+ activity held fixed and the
** amount as the unknown. On success the addition is made and *mol (reagent;
** NaN for a stock) and *litres (stock, or a liquid reagent with a density;
** NaN otherwise) say how much. EQP_E_INPUT when the target is out of reach
** with that reagent or needs more than 5 mol per kg of water (20 times the
** solution's water for a stock). */
EQP_API int eqp_solution_adjust_pH(eqp_solution *s, double pH, const char *reagent,
                                   const eqp_solution *stock, double *mol, double *litres);

/* How much a solution takes of acid or base before its pH leaves a window
** around its present pH: the amounts that move it by exactly -window (acid)
** and +window (base), each solved on a copy (s keeps its composition). */
typedef struct eqp_budget_spec {
  size_t size;                  /* sizeof(eqp_budget_spec): set by the INIT macro */
  double window;                /* pH units either way; > 0 */
  const char *acid, *base;      /* reagents of the library */
} eqp_budget_spec;
#define EQP_BUDGET_SPEC_INIT \
  { .size = sizeof(eqp_budget_spec), .window = 0.1, .acid = "HCl", .base = "NaOH" }
typedef struct eqp_budget {
  double pH;                    /* the solution's pH now */
  double window;
  double acid_mol, base_mol;    /* amounts that reach pH - window and pH + window */
  double acid_molar, base_molar;/* the same per litre of the solution, mol/L */
} eqp_budget;
/* spec NULL: the defaults of EQP_BUDGET_SPEC_INIT. EQP_E_INPUT when a side
** cannot be reached with its reagent (eqp_solution_adjust_pH). */
EQP_API int eqp_solution_load_budget(eqp_solution *s, const eqp_budget_spec *spec,
                                     eqp_budget *out);
/* What a target of eqp_solution_adjust holds. */
typedef enum eqp_target_kind {
  EQP_TARGET_PH = 0,              /* value: the pH */
  EQP_TARGET_ACTIVITY = 1,        /* value: the activity of species */
  EQP_TARGET_FREE = 2,            /* value: the free molality of species, mol/kg */
  EQP_TARGET_IONIC_STRENGTH = 3   /* value: mol/kg */
} eqp_target_kind;

/* One target of an adjustment and the reagent (or stock) that meets it. */
typedef struct eqp_target {
  size_t size;                  /* sizeof(eqp_target): set by the INIT macro */
  eqp_target_kind kind;
  const char *species;          /* EQP_TARGET_ACTIVITY and EQP_TARGET_FREE: "Ca^2+", "CO2" */
  double value;
  const char *reagent;          /* adjusted with this reagent ... */
  const eqp_solution *stock;    /* ... or with this stock solution (exactly one) */
  double mol;                   /* out: mol of the reagent added (NaN for a stock) */
  double litres;                /* out: L of the stock, or of a liquid reagent (NaN otherwise) */
} eqp_target;
/* A pH target with no value or reagent yet (set them). */
#define EQP_TARGET_INIT \
  { .size = sizeof(eqp_target), .kind = EQP_TARGET_PH, .species = NULL, .value = NAN, \
    .reagent = NULL, .stock = NULL, .mol = NAN, .litres = NAN }

#define EQP_MAX_TARGETS 4

/* Add the amounts of reagents (or stocks) that meet n targets together
** (1 <= n <= EQP_MAX_TARGETS): the pH with KOH and the free Ca^2+ with
** CaCl2, say. Each element starts from EQP_TARGET_INIT (the elements are
** read with the size the first one gives). One solve of the equilibrium
** with each amount an unknown and each target a fixed activity (or free
** molality, or ionic strength);
** Brent's method on ordinary solves when that fails. On success every
** addition is made and each target's mol and litres say how much. Each
** amount is at most 5 mol per kg of water (20 times the solution's water
** for a stock). EQP_E_INPUT when a target is out of reach. */
EQP_API int eqp_solution_adjust(eqp_solution *s, eqp_target *targets, size_t n);
/* Hold the activity of a component (a free ion: "Ca^2+", "H+") at a value,
** with counter_ion (a charged component: "Cl-", "Na+") balancing the
** charge: one solve with the component's row a fixed activity and the
** counter-ion's row the charge balance, both totals outputs. The solution
** keeps the totals found; *mol and *mol_counter (either may be NULL)
** receive what was added, negative for what was taken away. EQP_E_INPUT
** when a total would have to be negative (name a counter-ion of the other
** charge). */
EQP_API int eqp_solution_fix_activity(eqp_solution *s, const char *component, double activity,
                                      const char *counter_ion, double *mol, double *mol_counter);

/* Open the solution to a gas of the library at a partial pressure (atm):
** the gas dissolves, or leaves, until its dissolved species has the
** activity Henry's law gives (a = K_H p at the solution's temperature).
** *mol receives the amount taken up (negative: released). */
EQP_API int eqp_solution_expose(eqp_solution *s, const char *gas, double p_atm, double *mol);

/* A closed headspace over the solution: a sealed vial, bottle or flask.
** Every gas of the library (CO2(g), NH3(g), O2(g), N2(g), ...) then
** partitions between the solution and the headspace at each equilibrium:
** the headspace is an ideal gas (n = pV/RT at the solution's temperature)
** and the dissolved species has the activity Henry's law gives, a = K_H p,
** while the total of each component (solution + headspace) is conserved.
** The vessel's volume is fixed at sealing (headspace + liquid): what is
** added later (through a septum) takes headspace away. Design, equations
** and their limits: docs/methods.md. */
typedef struct eqp_headspace {
  size_t size;                  /* sizeof(eqp_headspace): set by the INIT macro */
  double litres;                /* the headspace's volume at sealing, L; > 0 */
  size_t ngases;                /* gases in the headspace when it is sealed */
  const char *const *gases;     /* their names, such as "CO2(g)" (ngases) */
  const double *p_atm;          /* their partial pressures at sealing, atm, >= 0 (ngases) */
} eqp_headspace;
#define EQP_HEADSPACE_INIT \
  { .size = sizeof(eqp_headspace), .litres = 0, .ngases = 0, .gases = NULL, .p_atm = NULL }
/* Seal s under a headspace; gases not named start at zero partial pressure.
** The initial gas (p V / R T at the solution's temperature) joins the
** vessel's totals. Sealed, a solution takes additions, stocks poured into
** it, temperature changes, titrations (each point partitions) and the
** derivatives (dpH, buffer capacity: the headspace follows); it
** refuses eqp_solution_expose, the adjustments (adjust, adjust_pH,
** fix_activity, load budgets), and being poured or mixed from, with
** EQP_E_INPUT: open it first (eqp_solution_unseal). EQP_E_INPUT also for a
** solution already sealed, a volume <= 0 or a pressure out of range;
** EQP_E_UNKNOWN for a gas the library does not define. A result of a sealed
** solution warns when the headspace's total pressure (its gases and water
** vapour) exceeds 2 atm, and a run that seals a vessel carries the caution
** that gas evolution pressurizes closed vessels. */
EQP_API int eqp_solution_seal(eqp_solution *s, const eqp_headspace *opts);
/* Open a sealed solution: the gas in the headspace at equilibrium is let go
** (vented), the solution keeps what is dissolved. A no-op when open. */
EQP_API int eqp_solution_unseal(eqp_solution *s);
/* 1 when s is sealed under a headspace, 0 when open (or s NULL). */
EQP_API int eqp_solution_sealed(const eqp_solution *s);

EQP_API double eqp_solution_water(const eqp_solution *s);         /* kg */
EQP_API double eqp_solution_temperature_K(const eqp_solution *s);
/* Volume in L, approximated as the volume of its water at T (dilute). */
EQP_API double eqp_solution_volume(const eqp_solution *s);

/* Solve for equilibrium and verify every balance. On success *out is a new
** result owned by the caller (eqp_result_free). EQP_E_CONVERGE or
** EQP_E_VERIFY leave no result and a message naming the system and the last
** residuals. */
EQP_API int eqp_solution_equilibrate(eqp_solution *s, eqp_result **out);

/* Solids that may form (or, added as reagents, stay undissolved) at
** equilibrium: the n named solids of the library (n = 0: none, the
** default, since supersaturated media are often metastable for days), or
** all of them. EQP_E_UNKNOWN for a name not in the library. Replaces the
** previous choice. An inconsistent set (two solids fixing the same ion
** activities) makes equilibrate fail with EQP_E_INPUT. */
EQP_API int eqp_solution_allow_solids(eqp_solution *s, const char *const *names, size_t n);
EQP_API int eqp_solution_allow_all_solids(eqp_solution *s, int on);

/* --------------------------------------------------------- titration */

typedef struct eqp_titration {
  size_t size;                  /* sizeof(eqp_titration): set by the INIT macro */
  const char *reagent;          /* titrant by reagent name ... */
  const eqp_solution *stock;    /* ... or a stock solution (exactly one) */
  double step;                  /* largest step: mol (reagent) or L (stock) */
  double to;                    /* total to add (same unit); 0: until_pH only */
  double until_pH;              /* stop exactly at this pH; NaN: none */
  double max_dpH;               /* largest pH change per step; 0: 0.1 */
  const char *const *species;   /* extra columns: molality of each */
  size_t nspecies;
} eqp_titration;
/* No titrant, step or end yet (set them); no pH stop; steps of at most 0.1 pH. */
#define EQP_TITRATION_INIT \
  { .size = sizeof(eqp_titration), .reagent = NULL, .stock = NULL, .step = 0, .to = 0, \
    .until_pH = NAN, .max_dpH = 0.1, .species = NULL, .nspecies = 0 }

/* Titrate a copy of s (s is unchanged). Steps shrink so that no step moves
** the pH by more than max_dpH (a step that moves it by more than twice that
** is taken again, shorter). Equivalence points are the interior maxima of
** |dpH/dv| (v: mol or L of titrant), refined by Brent's minimiser on
** the analytic slope, whose slope is at least EQP_EQ_MIN_SHARPNESS times the
** lowest slope between it and the next steeper point or the end of the
** curve on either side (methods.md). Columns (the names Lua, JSON and CSV
** share): amount (mol of titrant; NaN for a stock), volume (L of titrant;
** 0 for a solid reagent), total_volume (L), pH, slope (dpH per mol of a
** reagent, per L of a stock), then the requested species (mol/kg). *out is
** owned by the caller (eqp_curve_free). */
#define EQP_EQ_MIN_SHARPNESS 2.0
EQP_API int eqp_solution_titrate(eqp_solution *s, const eqp_titration *t, eqp_curve **out);
EQP_API void eqp_curve_free(eqp_curve *c);
EQP_API size_t eqp_curve_rows(const eqp_curve *c);
EQP_API size_t eqp_curve_cols(const eqp_curve *c);
EQP_API const char *eqp_curve_col_name(const eqp_curve *c, size_t j);
EQP_API double eqp_curve_value(const eqp_curve *c, size_t row, size_t col);
EQP_API size_t eqp_curve_equivalence_count(const eqp_curve *c);
/* k-th equivalence point: titrant amount (mol; NaN for a stock), volume
** (L; NaN for a solid reagent) and pH. */
EQP_API int eqp_curve_equivalence(const eqp_curve *c, size_t k, double *amount, double *litres,
                                  double *pH);
/* Its sharpness: |dpH/dv| at the point over the lowest |dpH/dv| of its
** flanks (>= EQP_EQ_MIN_SHARPNESS); NaN when k is out of range. */
EQP_API double eqp_curve_equivalence_sharpness(const eqp_curve *c, size_t k);
/* Write the curve as CSV (header line, then one line per row). */
EQP_API int eqp_curve_write_csv(const eqp_curve *c, FILE *f);
/* Write the curve as a table for a reader: a line of column names, a line
** of units (mmol, mL, mM), the rows, then the equivalence points. */
EQP_API int eqp_curve_write_text(const eqp_curve *c, FILE *f);
/* Save the curve as CSV or as its JSON text in the file path, atomically:
** written to a temporary file in the same folder, then renamed over path,
** so a failed write never leaves a truncated file where a good one was.
** Returns EQP_OK, EQP_E_ARG, EQP_E_NOMEM or EQP_E_WRITE. */
EQP_API int eqp_curve_save_csv(const eqp_curve *c, const char *path);
EQP_API int eqp_curve_save_json(const eqp_curve *c, const char *path);
/* The curve as a JSON text {columns, rows, equivalence_points}; free it
** with eqp_free_string. NULL when memory is exhausted. */
EQP_API char *eqp_curve_to_json(const eqp_curve *c);
EQP_API void eqp_free_string(char *s);

/* ----------------------------------------------------- sweeps, progress */

/* Fractions of each form of an acid or ligand system against pH, in a
** constant ionic medium: the activity coefficients of the chosen model at
** the stated ionic strength (set by the medium salt), log K at T. */
typedef struct eqp_distribution_spec {
  size_t size;               /* sizeof(eqp_distribution_spec): set by the INIT macro */
  const char *system;        /* any species or reagent of the system: "HPO4^2-", "citric acid" */
  double pH_lo, pH_hi;       /* 0, 0: 0 .. 14 */
  size_t points;             /* 0: 281 */
  double T;                  /* K; 0: 298.15 */
  double ionic_strength;     /* mol/kg; 0: infinite dilution */
  const char *activity;      /* model; NULL: "davies" */
  const char *medium;        /* salt setting the ionic strength; NULL: "NaCl" */
} eqp_distribution_spec;
/* No system yet (set it); pH 0 .. 14 in 281 points at 25 C, infinite dilution. */
#define EQP_DISTRIBUTION_SPEC_INIT \
  { .size = sizeof(eqp_distribution_spec), .system = NULL, .pH_lo = 0, .pH_hi = 14, \
    .points = 281, .T = 298.15, .ionic_strength = 0, .activity = NULL, .medium = NULL }

/* Columns: pH, then the fraction (0..1) of each form, most protonated
** first. A system with a polynuclear form (two or more of the ligand in one
** species) is EQP_E_INPUT: its fractions depend on the total. */
EQP_API int eqp_distribution(eqp_ctx *ctx, const eqp_distribution_spec *d, eqp_curve **out);

/* Buffer capacity against pH of buffer systems made by recipe (eqp_recipe_make)
** at the same total, one column each after pH; NaN where a buffer cannot be
** made at that pH. */
typedef struct eqp_capacity_spec {
  size_t size;               /* sizeof(eqp_capacity_spec): set by the INIT macro */
  const char *const *buffers; /* buffer systems; NULL: all of the library */
  size_t nbuffers;
  double total;              /* mol/L */
  double volume;             /* L; 0: 1 */
  double T;                  /* K; 0: 298.15 */
  const char *activity;      /* NULL: davies */
  double pH_lo, pH_hi;       /* range swept */
  size_t points;             /* 0: 61 */
  double window_lo, window_hi; /* the working window, shaded in plots; NaN: none */
} eqp_capacity_spec;
/* Every buffer of the library, no total yet (set it), 1 L at 25 C, pH 3 .. 11
** in 61 points, no window. */
#define EQP_CAPACITY_SPEC_INIT \
  { .size = sizeof(eqp_capacity_spec), .buffers = NULL, .nbuffers = 0, .total = NAN, \
    .volume = 1.0, .T = 298.15, .activity = NULL, .pH_lo = 3, .pH_hi = 11, .points = 61, \
    .window_lo = NAN, .window_hi = NAN }
EQP_API int eqp_capacity_sweep(eqp_ctx *ctx, const eqp_capacity_spec *c, eqp_curve **out);

/* pH of s at points temperatures from T0 to T1 (K), the composition kept
** (s unchanged); points 0: one per degree (at least 2). Columns:
** temperature (C), pH, ionic_strength (mol/kg). */
EQP_API int eqp_solution_temperature_sweep(eqp_solution *s, double T0, double T1, size_t points,
                                           eqp_curve **out);

/* Progress of long operations (titrations, sweeps): what, and done of
** total steps (total 0 when unknown). Called from inside the operation;
** it must not call back into the engine. NULL removes the callback. */
typedef void (*eqp_progress_fn)(void *ud, const char *what, size_t done, size_t total);
EQP_API void eqp_ctx_set_progress(eqp_ctx *ctx, eqp_progress_fn fn, void *ud);

/* Provenance: every constant that the species formed by the given names
** (species or reagents, plus water) depend on. The callback sees each once. */
typedef struct eqp_constant {
  const char *kind;          /* "pKa", "log β", "log Ksp", "log K_H", "ion size", "interaction" */
  const char *equation;      /* "H2PO4- ⇌ H+ + HPO4^2-"; borrowed for the call */
  double value;              /* at 25 C (Angstrom for ion sizes, kg/mol for interactions) */
  double dH, dCp;            /* kJ/mol, J/(K mol) of the reaction as written; NaN: none */
  const char *temperature;   /* how it changes with temperature, in words */
  const char *source;        /* the citation the species file gives */
  const char *file;
  int line;
} eqp_constant;
typedef void (*eqp_constant_fn)(void *ud, const eqp_constant *c);
EQP_API int eqp_ctx_constants(eqp_ctx *ctx, const char *const *names, size_t n,
                              eqp_constant_fn fn, void *ud);

/* ---------------------------------------------------------------- plots */

/* A figure: lines, markers, shaded bands, axes with units and a legend,
** drawn with PLplot's cairo drivers in our colour-blind-safe palette.
** Species names given as labels are shown with sub- and superscripts. */
typedef struct eqp_plot eqp_plot;
typedef enum eqp_plot_format { EQP_PLOT_SVG = 1, EQP_PLOT_PNG = 2, EQP_PLOT_PDF = 3 } eqp_plot_format;

EQP_API int eqp_plot_new(eqp_ctx *ctx, eqp_plot **out);
EQP_API void eqp_plot_free(eqp_plot *p);
EQP_API int eqp_plot_set_title(eqp_plot *p, const char *title);
/* axis 0 is x, 1 is y: the quantity ("added volume"), its unit ("mL"; NULL:
** none) and the range (NaN, NaN: from the data). */
EQP_API int eqp_plot_set_axis(eqp_plot *p, int axis, const char *label, const char *unit,
                              double lo, double hi);
/* Size in points (1/72 in; pixels for PNG); default 720 x 480. */
EQP_API int eqp_plot_set_size(eqp_plot *p, int width, int height);
/* A line through n points; a NaN breaks it. label NULL: no legend entry.
** The arrays are copied. EQP_E_INPUT for an infinite value. */
EQP_API int eqp_plot_add_line(eqp_plot *p, const char *label, size_t n, const double *x,
                              const double *y);
/* The same, with a dot at every point (few points, such as rounds). */
EQP_API int eqp_plot_add_points(eqp_plot *p, const char *label, size_t n, const double *x,
                                const double *y);
/* A marked point with a dashed vertical rule through it, labelled. */
EQP_API int eqp_plot_add_marker(eqp_plot *p, double x, double y, const char *label);
/* A shaded band from x0 to x1 (a working window), in the legend as label. */
EQP_API int eqp_plot_add_band(eqp_plot *p, double x0, double x1, const char *label);
/* A dotted horizontal reference line, labelled at its right end. */
EQP_API int eqp_plot_add_hline(eqp_plot *p, double y, const char *label);
/* EQP_PLOT_* from a file name's extension (.svg, .png, .pdf); 0 if none. */
EQP_API int eqp_plot_format_of(const char *path);
/* Draw into memory: *data is malloc'd (free with eqp_free_buffer). */
EQP_API int eqp_plot_render(eqp_plot *p, eqp_plot_format fmt, char **data, size_t *len);
/* Draw and write path atomically (a temporary file in the same folder,
** then rename); the format from the extension. EQP_E_WRITE on failure. */
EQP_API int eqp_plot_write(eqp_plot *p, const char *path);
EQP_API void eqp_free_buffer(void *p);
/* The display form of a species name with Unicode sub- and superscripts
** ("HPO4^2-" -> "HPO₄²⁻"). EQP_E_ARG if out is too small. */
EQP_API int eqp_name_display(const char *name, char *out, size_t len);

/* A curve from a table of numbers of the caller's own (nrows x ncols,
** row-major, NaN for a gap), for plotting, CSV or JSON. */
EQP_API int eqp_curve_from_table(eqp_ctx *ctx, size_t ncols, const char *const *names,
                                 size_t nrows, const double *values, eqp_curve **out);

/* Ready-made figures. The curve is borrowed for the call. */
/* pH against the titrant added (mL of a stock or of a liquid reagent,
** otherwise mmol), each equivalence point marked. */
EQP_API int eqp_plot_titration(const eqp_curve *c, const char *title, eqp_plot **out);
/* Fractions (in %) of each form against pH, with the 50 % line. */
EQP_API int eqp_plot_distribution(const eqp_curve *c, const eqp_distribution_spec *d,
                                  eqp_plot **out);
/* beta against pH of each buffer, the window shaded. */
EQP_API int eqp_plot_capacity(const eqp_curve *c, const eqp_capacity_spec *s, eqp_plot **out);
/* Columns of any curve against one column: ycols NULL plots every other
** column. Units follow the column names (volume in mL, amount in mmol,
** temperature in degrees C, species in mol/kg). */
EQP_API int eqp_plot_columns(const eqp_curve *c, const char *xcol, const char *const *ycols,
                             size_t ny, const char *title, eqp_plot **out);

/* ------------------------------------------------------------ recipes */

typedef struct eqp_recipe eqp_recipe;

typedef struct eqp_recipe_spec {
  size_t size;                    /* sizeof(eqp_recipe_spec): set by the INIT macro */
  const char *buffer;             /* a buffer system of the library ("phosphate"), or NULL */
  const char *const *reagents;    /* or the two reagents to use: acid and base form, or the
                                     buffer substance and a strong acid or base titrant */
  size_t nreagents;               /* 0 or 2 */
  double pH;                      /* target at T */
  double total;                   /* buffer concentration, mol/L */
  double volume;                  /* final volume, L (0: 1 L) */
  double T;                       /* working temperature, K (0: 298.15) */
  const char *activity;           /* model; NULL: davies */
  double ionic_strength;          /* target, mol/kg; NaN: no salt */
  const char *salt;               /* for the ionic strength; NULL: NaCl */
  double titrant_molar;           /* titrant stock, mol/L; 0: 1 M */
} eqp_recipe_spec;
/* No buffer, pH or total yet (set them); 1 L at 25 C, no salt, a 1 M titrant. */
#define EQP_RECIPE_SPEC_INIT \
  { .size = sizeof(eqp_recipe_spec), .buffer = NULL, .reagents = NULL, .nreagents = 0, \
    .pH = NAN, .total = NAN, .volume = 1.0, .T = 298.15, .activity = NULL, \
    .ionic_strength = NAN, .salt = NULL, .titrant_molar = 1.0 }

enum { EQP_ROLE_SOLID = 1, EQP_ROLE_TITRANT = 2, EQP_ROLE_SALT = 3, EQP_ROLE_WATER = 4 };

typedef struct eqp_recipe_item {
  const char *reagent;            /* name; "water" for the make-up water */
  double mol;
  double grams;                   /* solids and salt; NaN otherwise */
  double mL;                      /* titrant stock and water; NaN otherwise */
  int role;                       /* EQP_ROLE_* */
  const char *printed;            /* the quantity as the procedure prints it: "6.0570 g",
                                     "12.34 mL" (titrant), "987.6 mL" (water) */
} eqp_recipe_item;

/* Design a preparation that gives spec->pH at spec->T. The amounts are
** solved in one solve with a(H+) fixed and, for the ionic strength, the salt
** as a second unknown amount, in the water the solids leave of the final volume (crystal
** densities, docs/methods.md); the solution made from them is equilibrated
** once more and its pH reported. EQP_E_INPUT when the pH is out of reach of
** the reagents, when the solids alone would fill the volume, or when the
** default model's chain has no model for the ionic strength. */
EQP_API int eqp_recipe_make(eqp_ctx *ctx, const eqp_recipe_spec *spec, eqp_recipe **out);
EQP_API void eqp_recipe_free(eqp_recipe *r);
EQP_API size_t eqp_recipe_item_count(const eqp_recipe *r);
EQP_API const eqp_recipe_item *eqp_recipe_item_at(const eqp_recipe *r, size_t i);
EQP_API double eqp_recipe_pH(const eqp_recipe *r);
EQP_API double eqp_recipe_ionic_strength(const eqp_recipe *r);
/* The solution the recipe describes (copy it to work on it). Borrowed. */
EQP_API const eqp_solution *eqp_recipe_solution(const eqp_recipe *r);
/* The numbered bench procedure with its warnings and cautions. Borrowed. */
EQP_API const char *eqp_recipe_procedure(const eqp_recipe *r);
/* The activity model the amounts were computed with (for the default model,
** the one its chain settled on). Borrowed. */
EQP_API const char *eqp_recipe_activity_model(const eqp_recipe *r);
/* Warnings of the recipe: its solution beyond the model's range, a default
** model that gave way, the volume its solids take. Borrowed. */
EQP_API size_t eqp_recipe_warning_count(const eqp_recipe *r);
EQP_API const char *eqp_recipe_warning(const eqp_recipe *r, size_t i);
/* Buffer comparison: every buffer system of the library made by recipe at
** the same pH, total, volume and temperature, then loaded with an acid or
** base; ranked by how little its pH moves. */
typedef struct eqp_compare_spec {
  size_t size;                    /* sizeof(eqp_compare_spec): set by the INIT macro */
  const eqp_recipe_spec *recipe;  /* pH, total, volume, T, activity, ionic strength, salt
                                     and titrant of every candidate (its buffer and
                                     reagents are not used); borrowed for the call */
  double load;                    /* the load, mol per L of buffer; > 0 */
  const char *load_with;          /* the reagent of the load: "HCl" (acid), "NaOH", ... */
  double window;                  /* the tolerated pH change either way; > 0 */
} eqp_compare_spec;
#define EQP_COMPARE_SPEC_INIT \
  { .size = sizeof(eqp_compare_spec), .recipe = NULL, .load = 0, .load_with = "HCl", \
    .window = 0.1 }
/* One candidate. Strings and lists are borrowed from the comparison. */
typedef struct eqp_candidate {
  const char *buffer;             /* the buffer system */
  int possible;                   /* 0: it cannot be made at this pH (why says so) */
  double beta;                    /* buffer capacity before the load, mol/(L . pH) */
  double shift;                   /* pH under the load minus pH made */
  int within_window;              /* |shift| <= window */
  double pH;                      /* pH as made */
  double ionic_strength;          /* under the load, mol/kg */
  const char *why;                /* a line for a reader: the capacity and the shift, or
                                     why it cannot be made */
  size_t nnotes;                  /* the buffer system's notes (interferences, cautions) */
  const char *const *notes;
  size_t nwarnings;               /* the recipe's warnings, then those of the loaded
                                     solution ("under the load: ...") */
  const char *const *warnings;
} eqp_candidate;
typedef struct eqp_comparison eqp_comparison;
/* Possible candidates first, by |shift|, then those that cannot be made, by
** name. EQP_E_INPUT for a bad spec; a candidate that cannot be made is a
** row, not an error. The caller frees *out with eqp_comparison_free. */
EQP_API int eqp_compare_buffers(eqp_ctx *ctx, const eqp_compare_spec *spec, eqp_comparison **out);
EQP_API void eqp_comparison_free(eqp_comparison *c);
EQP_API size_t eqp_comparison_count(const eqp_comparison *c);
EQP_API const eqp_candidate *eqp_comparison_at(const eqp_comparison *c, size_t i);
/* The ranking as a reader sees it: a heading line, then one line per
** candidate and its notes, each ending in a newline. Borrowed. */
EQP_API const char *eqp_comparison_text(const eqp_comparison *c);

/* Buffer systems of the library, for listing and comparing. */
EQP_API size_t eqp_ctx_buffer_count(const eqp_ctx *ctx);
EQP_API const char *eqp_ctx_buffer_name(const eqp_ctx *ctx, size_t i);
EQP_API size_t eqp_ctx_buffer_note_count(const eqp_ctx *ctx, size_t i);
EQP_API const char *eqp_ctx_buffer_note(const eqp_ctx *ctx, size_t i, size_t k);

/* ------------------------------------------------------------- result */

EQP_API void eqp_result_free(eqp_result *r);
EQP_API double eqp_result_pH(const eqp_result *r);            /* -log10 a(H+) */
EQP_API double eqp_result_ionic_strength(const eqp_result *r); /* mol/kg */
EQP_API double eqp_result_temperature_K(const eqp_result *r);
EQP_API double eqp_result_water(const eqp_result *r);         /* kg */
EQP_API double eqp_result_water_density(const eqp_result *r); /* kg/L */
/* Largest relative residual of the balances re-evaluated after the solve. */
EQP_API double eqp_result_residual(const eqp_result *r);
EQP_API long eqp_result_iterations(const eqp_result *r);
EQP_API const char *eqp_result_activity_model(const eqp_result *r);

/* Per-species values. A species of the library absent from the solution
** reads 0 (gamma 1); a name not in the library is EQP_E_UNKNOWN. */
EQP_API int eqp_result_molality(const eqp_result *r, const char *sp, double *out);
EQP_API int eqp_result_molarity(const eqp_result *r, const char *sp, double *out);
EQP_API int eqp_result_activity(const eqp_result *r, const char *sp, double *out);
EQP_API int eqp_result_gamma(const eqp_result *r, const char *sp, double *out);

/* Saturation index log10(IAP/Ksp) of a solid of the library at the
** result's temperature (-inf when one of its ions is absent). Positive:
** supersaturated; 0 for a solid present. */
EQP_API int eqp_result_saturation(const eqp_result *r, const char *solid, double *si);
/* mol of a solid present at equilibrium (0 when it is not, or when solids
** were not allowed to form: eqp_solution_allow_solids). */
EQP_API int eqp_result_solid(const eqp_result *r, const char *solid, double *mol);
/* The solids present, by index 0 .. count-1: name (borrowed) and *mol. */
EQP_API size_t eqp_result_solid_count(const eqp_result *r);
EQP_API const char *eqp_result_solid_name(const eqp_result *r, size_t i, double *mol);
/* The headspace of a result of a sealed solution: its volume (L), its
** total pressure (atm: the gases that partition plus water vapour) and the
** water vapour's partial pressure (atm); any pointer may be NULL. Returns
** 1 for a sealed solution, 0 (the outputs untouched) for an open one. */
EQP_API int eqp_result_headspace(const eqp_result *r, double *litres, double *p_total_atm,
                                 double *p_water_atm);
/* A gas of the headspace: partial pressure (atm) and mol in the gas phase
** (both 0 when the headspace holds none of it, or for an open solution).
** EQP_E_UNKNOWN for a gas the library does not define. */
EQP_API int eqp_result_gas(const eqp_result *r, const char *gas, double *p_atm, double *mol);
/* The gases of the headspace, by index 0 .. count-1 (those the vessel
** holds any of): name (borrowed), *p_atm and *mol, either may be NULL. */
EQP_API size_t eqp_result_gas_count(const eqp_result *r);
EQP_API const char *eqp_result_gas_name(const eqp_result *r, size_t i, double *p_atm,
                                        double *mol);
EQP_API size_t eqp_ctx_solid_count(const eqp_ctx *ctx);
EQP_API const char *eqp_ctx_solid_name(const eqp_ctx *ctx, size_t i);

/* Species present, by index: 0 .. count-1. Names borrowed from the context. */
EQP_API size_t eqp_result_species_count(const eqp_result *r);
EQP_API const char *eqp_result_species_name(const eqp_result *r, size_t i);
EQP_API double eqp_result_species_molality(const eqp_result *r, size_t i);
EQP_API double eqp_result_species_log_gamma(const eqp_result *r, size_t i);

/* Warnings attached to the result (a model beyond its range, ...). */
EQP_API size_t eqp_result_warning_count(const eqp_result *r);
EQP_API const char *eqp_result_warning(const eqp_result *r, size_t i);

/* A copy of a result, for an observer that keeps what it is shown; free it
** with eqp_result_free. EQP_E_NOMEM, EQP_E_ARG. */
EQP_API int eqp_result_copy(const eqp_result *r, eqp_result **out);
/* The result as a JSON text: pH, ionic_strength, temperature (C), water,
** activity_model, residual, iterations, species [{name, molality, gamma}],
** saturation_index {solid: SI} for the library's solids whose ions are
** present, warnings (docs/json-output.md). Free with eqp_free_string; NULL
** when memory is exhausted. */
EQP_API char *eqp_result_to_json(const eqp_result *r);
/* The result as a table for a reader: a line of pH, ionic strength,
** temperature and model, then each species, largest molality first, in mM
** (molality x density of water), mol/kg and gamma, then its warnings. Free
** with eqp_free_string; NULL when memory is exhausted. */
EQP_API char *eqp_result_to_text(const eqp_result *r);

/* The constants n results of this context used -- the reactions of every
** species present, the solids with a saturation index, the gases a
** solution was opened to -- each with what it is, its value at 25 C and at
** every temperature of the results, and its source: a JSON array
** (docs/json-output.md, "constants"). Free it with eqp_free_string; NULL
** when memory is exhausted. */
/* The constants of every species the named species and reagents can form
** (with water): {"constants": [...], "parameters": [...]}, the constants
** with their values at 25 C and at each temperature T_K (kelvin), the
** parameters (ion sizes, model coefficients, interactions) with their
** sources (docs/json-output.md). Free with eqp_free_string; NULL on error. */
EQP_API char *eqp_ctx_constants_of_json(eqp_ctx *ctx, const char *const *names, size_t n,
                                        const double *T_K, size_t nT);
EQP_API char *eqp_ctx_constants_to_json(eqp_ctx *ctx, const eqp_result *const *results,
                                        size_t n);

/* ---------------------------------------------------------------- Lua */

struct lua_State;
/* Opens the "equipoise" Lua module: pushes its table. Creates a context
** owned by the Lua state. This is also the entry point for require. */
EQP_API int luaopen_equipoise(struct lua_State *L);
/* The same, under a name of our prefix (used by the loadable module). */
EQP_API int eqp_lua_open(struct lua_State *L);
/* The context of the module opened in L (NULL before it is opened), owned
** by the Lua state: a host registers its observer on it (eqp_ctx_set_observer)
** to hear of what the script makes. */
EQP_API eqp_ctx *eqp_lua_context(struct lua_State *L);

#ifdef __cplusplus
}
#endif
#endif
