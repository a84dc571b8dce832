/* The loadable Lua module (equipoise.so): a stock lua5.4 finds
** luaopen_equipoise here; the code lives in libequipoise. */
/* SPDX-License-Identifier: MIT */
#include <equipoise/equipoise.h>
/* luaopen_equipoise is exported by libequipoise, which this module links;
** nothing else is needed, but an object must exist for the module target. */
int eqp_lua_module_anchor(void);
__attribute__((visibility("default"))) int eqp_lua_module_anchor(void) { return 0; }
