/* The loadable Lua module (equipoise.so): a stock lua5.4 finds
** luaopen_equipoise here; the code lives in libequipoise. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/equipoise.h>

/* The call into libequipoise also keeps the linker's --as-needed from
** dropping the library from this module. */
EQP_API int luaopen_equipoise(struct lua_State *L) { return eqp_lua_open(L); }
