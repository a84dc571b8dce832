/* Limits on Lua code: a memory cap and an instruction budget, shared by the
** species-file sandbox and the experiment-script sandbox. */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_LIMITS_IMPL_H
#define EQP_LIMITS_IMPL_H

#include <equipoise/equipoise.h>
#include <lua.h>
#include <time.h>

enum { EQPI_TRIP_NONE, EQPI_TRIP_STEPS, EQPI_TRIP_MEMORY, EQPI_TRIP_CPU };

/*
** One per Lua state. The allocator counts every byte it hands out against
** max_mem; the count hook counts VM instructions against max_steps. The hook
** cannot see work done inside C functions, so the allocator also charges the
** bytes it hands out, and eqpi_limits_wrap_libs replaces the library calls
** that do bulk work (pattern matching, string.rep, table.insert, ...) by ones
** that charge it. Once a limit is reached it stays reached: the hook raises
** again at every instruction, so pcall cannot catch it and carry on.
*/
typedef struct eqpi_limits {
  eqp_alloc_fn base;          /* where memory really comes from */
  void *base_ud;
  size_t max_mem;             /* bytes; 0: no cap */
  size_t used;                /* bytes live, Lua and engine */
  size_t peak;
  size_t engine_live, engine_at_gc;   /* engine bytes live; at the last forced collection */
  long long max_steps;        /* instructions; 0: no limit */
  long long steps;            /* instructions run plus work charged */
  double max_cpu;             /* seconds of processor time; 0: no limit. A backstop for
                                 work no count sees (comparing long strings) */
  clock_t cpu_start;
  int tripped;                /* EQPI_TRIP_*; once set it stays */
  int refusals;               /* allocations the cap refused */
  int oom;                    /* the system refused an allocation */
  const void *pend_ptr;       /* a refusal Lua may retry after a collection */
  size_t pend_size;
  int pending;
  lua_State *L;               /* the thread to stop at once when memory runs out */
  const char *steps_hint;     /* appended to the messages: how to raise the limit */
  const char *mem_hint;
  char where[256];            /* "file:line" where a limit was reached, if known */
  /* told of each object Lua makes (type: LUA_TTABLE, ...), after it is
  ** allocated; NULL: nobody asks (the species sandbox notes its tables) */
  void (*on_object)(void *ud, void *block, int type);
  void *on_object_ud;
} eqpi_limits;

/* base NULL: malloc. max_mem 0 and max_steps 0 mean no limit. */
void eqpi_limits_init(eqpi_limits *lim, eqp_alloc_fn base, void *base_ud, size_t max_mem,
                      long long max_steps);
/* The allocator of a Lua state (ud = lim): memory cap, and work charged. */
void *eqpi_limits_lua_alloc(void *ud, void *ptr, size_t osize, size_t nsize);
/* The allocator of an engine context run from that state: memory cap only. */
void *eqpi_limits_engine_alloc(void *ud, void *ptr, size_t osize, size_t nsize);

/* The limits of L (its allocator's ud), or NULL if L's allocator is not ours. */
eqpi_limits *eqpi_limits_of(lua_State *L);
/* A count hook that does only the limits; install it with eqpi_limits_hook. */
void eqpi_limits_hookfn(lua_State *L, lua_Debug *ar);
/* Install hook (eqpi_limits_hookfn or a host's own that calls
** eqpi_limits_on_count for count events) on L with extra event bits. */
void eqpi_limits_hook(lua_State *L, lua_Hook hook, int extra_mask);
/* The work of a count event; raises when a limit is reached. */
void eqpi_limits_on_count(lua_State *L, eqpi_limits *lim, lua_Debug *ar);
/* Collect garbage if the engine's memory has grown a lot since the last time
** (the collector does not see it). At a safe point: a hook, a binding. */
void eqpi_limits_collect(lua_State *L, eqpi_limits *lim);
/* Charge n units of work done in C; raises when the budget is spent. */
void eqpi_limits_charge(lua_State *L, eqpi_limits *lim, long long n);
/* The message for the limit reached, "where: what (hint)". */
void eqpi_limits_message(const eqpi_limits *lim, char *buf, size_t len);
/* "file:line" of the innermost Lua function running on L, or "". */
void eqpi_lua_where(lua_State *L, char *buf, size_t len);

/* Replace the bulk functions of the loaded string, table, utf8 and base
** libraries (in L's global table) by counted ones: string.find, match,
** gmatch and gsub by the counted matcher, the others by wrappers that charge
** the work before calling the original. */
void eqpi_limits_wrap_libs(lua_State *L, eqpi_limits *lim);
/* Put the counted find, match, gmatch and gsub into the table at the top. */
void eqpi_patterns_register(lua_State *L, eqpi_limits *lim);

#endif
