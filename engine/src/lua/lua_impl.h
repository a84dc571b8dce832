/* Shared declarations of the Lua bindings. The bindings hold no chemistry. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_LUA_IMPL_H
#define EQP_LUA_IMPL_H

#include <equipoise/equipoise.h>
#include <lauxlib.h>
#include <lua.h>

#define EQPL_CTX "equipoise.ctx"
#define EQPL_SOLUTION "equipoise.solution"
#define EQPL_RESULT "equipoise.result"
#define EQPL_CURVE "equipoise.curve"
#define EQPL_LASTERR "equipoise.lasterr"    /* registry: {message, status} */
#define EQPL_HOOKS "equipoise.hooks"        /* registry: host callbacks (CLI) */
#define EQPL_PLOT "equipoise.plot"
#define EQPL_CURVEKIND "equipoise.curvekind" /* registry: curve -> how it was made (weak) */
#define EQPL_LIBHOLD "equipoise.library"    /* a library being made, released by __gc */

/* The kinds of handle, each with its metatable registered under its name
** (eqpl_handle_name). */
enum { EQPL_K_SOLUTION, EQPL_K_RESULT, EQPL_K_CURVE, EQPL_K_PLOT, EQPL_K_LIBRARY, EQPL_K_N };
extern const char *const eqpl_handle_name[EQPL_K_N];

/* The module's context: a full userdata, so its address is stable for the
** allocator that counts the engine's memory through it (lua_host.c). Its
** user value k + 1 is the metatable of handle kind k, and meta[k] that
** table's identity (lua_topointer: Lua never moves an object, and the
** registry keeps these alive), so that a binding checks or sets a handle's
** metatable without looking its name up in the registry. */
typedef struct eqpl_ctx {
  eqp_ctx *ctx;
  eqp_alloc_fn alloc;         /* where the engine's memory comes from */
  void *alloc_ud;
  long long grown;            /* bytes the engine took since the collector was told */
  const void *meta[EQPL_K_N]; /* NULL until the module has made them all */
  const void *held_lib;       /* the library of the holder in user value EQPL_UV_HOLDER */
  eqp_result *pending;        /* a result being pushed (lua_result.c), owned here until placed */
} eqpl_ctx;
/* The context's user values: the metatables (1 .. EQPL_K_N), then a holder
** of the library results were last made with (lua_result.c). */
#define EQPL_UV_HOLDER (EQPL_K_N + 1)
typedef struct eqpl_solution { eqp_solution *s; } eqpl_solution;
/* A result in its handle's memory (lua_result.c); hold and c: the holder of
** its library and the context, which the handle's user values keep as
** memory, but which a finalizer run before one reading the result may have
** closed. */
typedef struct eqpl_result {
  eqp_result *r;
  const struct eqpl_library *hold;
  const struct eqpl_ctx *c;
} eqpl_result;
typedef struct eqpl_curve { eqp_curve *c; } eqpl_curve;
typedef struct eqpl_plot { eqp_plot *p; } eqpl_plot;

/* The allocator the host wants the engine to use (registry EQPL_HOOKS.alloc,
** a light userdata pointing to this). */
typedef struct eqpl_host_alloc { eqp_alloc_fn fn; void *ud; } eqpl_host_alloc;
/* The path argument at idx, as the host allows it for reading (mode 'r') or
** writing ('w'); it replaces the argument. Raises when the host refuses it. */
const char *eqpl_host_path(lua_State *L, int idx, int mode);
/* A new context with the host's allocator (or the Lua state's), counted
** through c. */
eqp_ctx *eqpl_host_ctx_new(lua_State *L, eqpl_ctx *c);
/* Tell the collector of the memory the engine has taken since the last time. */
void eqpl_account(lua_State *L, eqpl_ctx *c);

/* Push a new handle userdata of the given size, zeroed, with the metatable
** of kind and a link to the context (the caller's upvalue 1) so that the
** context outlives it. The handle exists before the C object it will hold,
** so a failure in between leaves a closed handle, never a dangling one. */
void *eqpl_new_handle(lua_State *L, size_t size, int kind);
/* The same with nuv user values (the first is the context). */
void *eqpl_new_handle_uv(lua_State *L, size_t size, int kind, int nuv);
/* The handle of kind at idx: what luaL_testudata (luaL_checkudata, with its
** message) gives for the kind's name, found through the context when the
** running binding has it as upvalue 1. */
void *eqpl_test_handle(lua_State *L, int idx, int kind);
void *eqpl_check_handle(lua_State *L, int idx, int kind);
/* eqpl_test_handle with the context c (NULL: not known) already at hand. */
void *eqpl_handle_in(lua_State *L, const eqpl_ctx *c, int idx, int kind);
/* An engine object the binding owns while it builds Lua values from it: a
** memory error in between frees it through the holder's __gc. Set p; clear
** it (after freeing) when done. */
typedef struct eqpl_hold { void *p; void (*free_fn)(void *p); } eqpl_hold;
eqpl_hold *eqpl_hold_new(lua_State *L, void (*free_fn)(void *p));
void eqpl_hold_free(eqpl_hold *h);
/* The block of the context (upvalue 1 of every binding), or NULL. */
static inline eqpl_ctx *eqpl_self(lua_State *L)
{
  return lua_touserdata(L, lua_upvalueindex(1));
}
/* The engine context of c; raises when it is closed or missing. */
static inline eqp_ctx *eqpl_ctx_in(lua_State *L, const eqpl_ctx *c)
{
  if (!c || !c->ctx) luaL_error(L, "equipoise: context is closed");
  return c->ctx;
}
/* The context of this Lua state. */
static inline eqp_ctx *eqpl_ctx_of(lua_State *L)
{
  return eqpl_ctx_in(L, eqpl_self(L));
}
/* Raise a Lua error with the context's message; remembers the engine status
** so the command can map it to an exit code. Never returns. */
int eqpl_fail(lua_State *L, eqp_ctx *ctx, int status);
/* Raise an input error of our own (not from the engine). */
int eqpl_input_error(lua_State *L, const char *fmt, ...);

/* The metatable `name` of an object whose fields come from `index` (upvalues:
** the context, then the table of `methods`) and whose other metamethods are
** `meta` (upvalue: the context). The context userdata is at index ctx. */
void eqpl_create_meta(lua_State *L, int ctx, const char *name, const luaL_Reg *methods,
                      lua_CFunction index, const luaL_Reg *meta);
void eqpl_open_solution(lua_State *L);
void eqpl_open_result(lua_State *L);
void eqpl_open_curve(lua_State *L);
void eqpl_open_procedure(lua_State *L);
int eqpl_mix(lua_State *L);
void eqpl_open_recipe(lua_State *L, int ctx);
void eqpl_open_plot(lua_State *L, int ctx);
/* curve:plot (lua_plot.c) */
int eqpl_curve_plot(lua_State *L);
void eqpl_push_curve(lua_State *L, eqp_curve *c);
/* A volume string ("10 mL") at idx, in L; raises on anything else. */
double eqpl_check_volume(lua_State *L, int idx, const char *what);
/* Push a new result object for r (takes ownership); links it to the ctx. */
void eqpl_push_result(lua_State *L, eqp_result *r);
eqpl_solution *eqpl_check_solution(lua_State *L, int idx);
eqpl_solution *eqpl_check_solution_in(lua_State *L, const eqpl_ctx *c, int idx);
#define EQPL_PRINT "equipoise.print"
/* Push the print the module writes text through: the host's, as found when
** the module opened, else the present global one. */
void eqpl_push_print(lua_State *L);

/* A species library held while a binding makes it: its __gc releases it,
** so that an error raised meanwhile loses nothing. */
typedef struct eqpl_library { const eqp_library *lib; } eqpl_library;
/* Push a holder of a new reference to lib. */
eqpl_library *eqpl_push_library(lua_State *L, const eqp_library *lib);
/* Replace the library in h with it plus the species file name or inline
** table at idx; raises on a problem. */
void eqpl_extend_library(lua_State *L, eqp_ctx *ctx, eqpl_library *h, int idx);

/* ---- checks of arguments and options (lua_options.c) ----
** Each raises an input error naming `what` (the user's word for the value,
** such as "eq.recipe: temperature") and returns only a good value. Strings
** returned are those at idx: they live while that stack slot does. */

#define EQPL_T_MIN 273.15            /* K: liquid water at about 1 bar */
#define EQPL_T_MAX 373.15
#define EQPL_MAX_WATER 1e6           /* kg (and L): the engine's bound */
#define EQPL_PH_MIN (-1.0)           /* targets: the recipe engine's bounds */
#define EQPL_PH_MAX 15.0
#define EQPL_MAX_PRESSURE 100.0      /* atm: far beyond Henry's law already */
#define EQPL_MAX_COLUMNS 24          /* species columns of a titration */

enum { EQPL_ANY, EQPL_NUMBER, EQPL_NAME, EQPL_BOOLEAN, EQPL_TEMPERATURE, EQPL_QUANTITY,
       EQPL_NAMES };
enum { EQPL_REQUIRED = 1, EQPL_ABOVE = 2 /* min is excluded */, EQPL_LIST = 4 };

/* One option of a call: its name, type, accepted units (EQP_Q_* mask) and
** range [min, max] (quantities in base units; for EQPL_NAMES max is the
** largest count); hint says what is expected, in "NAME is required: HINT"
** and, for names, "NAME must be HINT". */
typedef struct eqpl_opt {
  const char *name;
  int type;
  unsigned units;
  double min, max;
  unsigned flags;
  const char *hint;
} eqpl_opt;

/* What was given for one option; idx is its stack slot, which anchors str
** and names until the binding returns. */
typedef struct eqpl_val {
  int given, idx;
  double num;                 /* number, boolean, quantity (base units), temperature (K) */
  eqp_quantity unit;          /* the kind of quantity given */
  const char *str;            /* EQPL_NAME */
  const char *const *names;   /* EQPL_NAMES */
  size_t count;
} eqpl_val;

/* Read the options table at idx (none or nil: all defaults) against spec
** (ended by a NULL name) into out[i] for spec[i]. An unknown key is refused
** with the nearest known name; EQPL_LIST also allows positions 1..n and
** returns n. Pushes one slot per option. */
size_t eqpl_options(lua_State *L, int idx, const char *call, const eqpl_opt *spec, eqpl_val *out,
                    unsigned flags);
/* Raise when the call has more than max arguments (a method's object
** counts as one): an argument the binding would not read is a mistake to
** report, not to ignore. signature is the call as documented, such as
** "s:add(reagent, amount)"; a ':' before the '(' marks a method. */
void eqpl_nargs_error(lua_State *L, int max, const char *signature);
static inline void eqpl_check_nargs(lua_State *L, int max, const char *signature)
{
  if (lua_gettop(L) > max) eqpl_nargs_error(L, max, signature);
}
/* A string without NUL characters, not empty. */
const char *eqpl_check_name(lua_State *L, int idx, const char *what);
double eqpl_check_number(lua_State *L, int idx, const char *what, double min, double max,
                         unsigned flags);
int eqpl_check_boolean(lua_State *L, int idx, const char *what);
/* A number in C or a string with its unit; returns K, within 0..100 C. */
double eqpl_check_temperature(lua_State *L, int idx, const char *what);
/* A string "value unit" of one of units; returns base units, in range. */
double eqpl_check_quantity(lua_State *L, int idx, const char *what, unsigned units, double min,
                           double max, unsigned flags, eqp_quantity *kind);
/* A list of at most max names; pushes the anchor of the copies it returns. */
const char *const *eqpl_check_names(lua_State *L, int idx, const char *what, size_t max,
                                    size_t *n);
/* A number as a script would read it ("nan" for any NaN); returns buf. */
const char *eqpl_fmt(double v, char *buf, size_t len);
/* How the value at idx reads in a message: "the number 3", "a table". */
const char *eqpl_describe(lua_State *L, int idx, char *buf, size_t len);
/* The name in names[0..n) nearest to key (edit distance), or NULL if none is near. */
const char *eqpl_nearest(const char *key, size_t len, const char *const *names, size_t n);

#endif
