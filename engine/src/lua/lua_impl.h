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
#define EQPL_CURVES "equipoise.curves"      /* registry: curves of the run, in order */
#define EQPL_LASTERR "equipoise.lasterr"    /* registry: {message, status} */
#define EQPL_LOG "equipoise.log"            /* registry: results of the run, in order */
#define EQPL_USED "equipoise.used"          /* registry: set of reagent names added */
#define EQPL_HOOKS "equipoise.hooks"        /* registry: host callbacks (CLI) */

typedef struct eqpl_ctx { eqp_ctx *ctx; } eqpl_ctx;
typedef struct eqpl_solution { eqp_solution *s; } eqpl_solution;
typedef struct eqpl_result { eqp_result *r; } eqpl_result;
typedef struct eqpl_curve { eqp_curve *c; } eqpl_curve;

/* Push a new handle userdata of the given size, zeroed, with its metatable
** and a link to the context (the caller's upvalue 1) so that the context
** outlives it. The handle exists before the C object it will hold, so a
** failure in between leaves a closed handle, never a dangling one. */
void *eqpl_new_handle(lua_State *L, size_t size, const char *meta);
/* The context of this Lua state (upvalue 1 of every binding). */
eqp_ctx *eqpl_ctx_of(lua_State *L);
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
void eqpl_push_curve(lua_State *L, eqp_curve *c);
/* A volume string ("10 mL") at idx, in L; raises on anything else. */
double eqpl_check_volume(lua_State *L, int idx, const char *what);
/* Push a new result object for r (takes ownership); links it to the ctx. */
void eqpl_push_result(lua_State *L, eqp_result *r);
eqpl_solution *eqpl_check_solution(lua_State *L, int idx);
/* Load species given as a file name or an inline table at idx. */
void eqpl_load_species(lua_State *L, eqp_ctx *ctx, int idx);

#endif
