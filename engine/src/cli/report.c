/* What a run leaves for its reader: JSON document, warnings, cautions. */
/* SPDX-License-Identifier: MIT */
#include "cli_impl.h"
#include "../lua/lua_impl.h"
#include <cjson/cJSON.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

static const char general_caution[] =
  "Results are model estimates: confirm the pH of every preparation with a calibrated "
  "meter. For clinical, pharmaceutical or food use follow validated methods and local "
  "regulations.";

static eqp_ctx *ctx_of(lua_State *L)
{
  eqp_ctx *ctx = NULL;
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_CTX ".ptr") == LUA_TLIGHTUSERDATA)
    ctx = lua_touserdata(L, -1);
  lua_pop(L, 1);
  return ctx;
}

/* The engine records every hazardous reagent a run used, whichever way it
** entered a solution, once per reagent. */
void cli_each_caution(lua_State *L, void (*f)(void *, const char *), void *ud)
{
  eqp_ctx *ctx = ctx_of(L);
  for (size_t i = 0; ctx && i < eqp_ctx_caution_count(ctx); i++) f(ud, eqp_ctx_caution(ctx, i));
}

/* What loading the species library had to say (a file left out, a file
** replaced), as warnings. */
static void each_notice(lua_State *L, void (*f)(void *, const char *), void *ud)
{
  eqp_ctx *ctx = ctx_of(L);
  for (size_t i = 0; ctx && i < eqp_ctx_notice_count(ctx); i++) f(ud, eqp_ctx_notice(ctx, i));
}

static void print_caution(void *ud, const char *text)
{
  fprintf(stderr, "caution: %s\n", text);
}

/* Each distinct warning once, in order of appearance. */
static void each_warning(lua_State *L, void (*f)(void *, const char *), void *ud)
{
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_LOG) != LUA_TTABLE) {
    lua_pop(L, 1);
    return;
  }
  lua_newtable(L);   /* seen */
  lua_Integer n = (lua_Integer)lua_rawlen(L, -2);
  for (lua_Integer i = 1; i <= n; i++) {
    lua_rawgeti(L, -2, i);
    eqpl_result *u = luaL_testudata(L, -1, EQPL_RESULT);
    lua_pop(L, 1);
    if (!u || !u->r) continue;
    for (size_t w = 0; w < eqp_result_warning_count(u->r); w++) {
      const char *text = eqp_result_warning(u->r, w);
      if (lua_getfield(L, -1, text) == LUA_TNIL) {
        lua_pushboolean(L, 1);
        lua_setfield(L, -3, text);
        f(ud, text);
      }
      lua_pop(L, 1);
    }
  }
  lua_pop(L, 2);
}

static void print_warning(void *ud, const char *text)
{
  fprintf(stderr, "warning: %s\n", text);
}

void cli_report_text(lua_State *L)
{
  each_notice(L, print_warning, NULL);
  each_warning(L, print_warning, NULL);
  cli_each_caution(L, print_caution, NULL);
}

static const char water_sources[] =
  "density: G. S. Kell, 'Density, thermal expansivity, and compressibility of liquid water "
  "from 0 to 150 C', J. Chem. Eng. Data 20, 97-105 (1975); relative permittivity: C. G. "
  "Malmberg, A. A. Maryott, 'Dielectric constant of water from 0 to 100 C', J. Res. Natl. "
  "Bur. Stand. 56, 1-8 (1956) [titles from memory]";

static void add_string(void *ud, const char *text)
{
  cJSON_AddItemToArray(ud, cJSON_CreateString(text));
}

static cJSON *result_json(const eqp_result *r, const eqp_ctx *ctx)
{
  cJSON *o = cJSON_CreateObject();
  cJSON_AddNumberToObject(o, "pH", eqp_result_pH(r));
  cJSON_AddNumberToObject(o, "ionic_strength", eqp_result_ionic_strength(r));
  cJSON_AddNumberToObject(o, "temperature", eqp_result_temperature_K(r) - 273.15);
  cJSON_AddNumberToObject(o, "water", eqp_result_water(r));
  cJSON_AddStringToObject(o, "activity_model", eqp_result_activity_model(r));
  cJSON_AddNumberToObject(o, "residual", eqp_result_residual(r));
  cJSON_AddNumberToObject(o, "iterations", (double)eqp_result_iterations(r));
  cJSON *sp = cJSON_AddArrayToObject(o, "species");
  for (size_t i = 0; i < eqp_result_species_count(r); i++) {
    cJSON *e = cJSON_CreateObject();
    cJSON_AddStringToObject(e, "name", eqp_result_species_name(r, i));
    cJSON_AddNumberToObject(e, "molality", eqp_result_species_molality(r, i));
    cJSON_AddNumberToObject(e, "gamma", pow(10.0, eqp_result_species_log_gamma(r, i)));
    cJSON_AddItemToArray(sp, e);
  }
  cJSON *sat = cJSON_AddObjectToObject(o, "saturation_index");
  for (size_t i = 0; ctx && i < eqp_ctx_solid_count(ctx); i++) {
    double si;
    if (eqp_result_saturation(r, eqp_ctx_solid_name(ctx, i), &si) == EQP_OK && isfinite(si))
      cJSON_AddNumberToObject(sat, eqp_ctx_solid_name(ctx, i), si);
  }
  cJSON *w = cJSON_AddArrayToObject(o, "warnings");
  for (size_t i = 0; i < eqp_result_warning_count(r); i++)
    cJSON_AddItemToArray(w, cJSON_CreateString(eqp_result_warning(r, i)));
  return o;
}

void cli_write_json(lua_State *L, const cli_run *run, int exit_code, const char *error,
                    lua_State *unused)
{
  eqp_ctx *ctx = NULL;
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_CTX ".ptr") == LUA_TLIGHTUSERDATA)
    ctx = lua_touserdata(L, -1);
  lua_pop(L, 1);
  cJSON *doc = cJSON_CreateObject();
  cJSON_AddNumberToObject(doc, "schema_version", CLI_JSON_SCHEMA_VERSION);
  cJSON_AddStringToObject(doc, "equipoise", EQP_VERSION_STRING);
  cJSON_AddStringToObject(doc, "script", run->script);
  cJSON *params = cJSON_AddObjectToObject(doc, "params");
  for (int i = 0; i < run->nparams; i++)
    cJSON_AddStringToObject(params, run->param_names[i], run->param_values[i]);
  cJSON_AddStringToObject(doc, "status", exit_code == 0 ? "ok" : "error");
  cJSON_AddNumberToObject(doc, "exit_code", exit_code);
  if (error) cJSON_AddStringToObject(doc, "error", error);
  else cJSON_AddNullToObject(doc, "error");
  cJSON *results = cJSON_AddArrayToObject(doc, "results");
  const eqp_result *used[256];
  size_t nused = 0;
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_LOG) == LUA_TTABLE) {
    lua_Integer n = (lua_Integer)lua_rawlen(L, -1);
    for (lua_Integer i = 1; i <= n; i++) {
      lua_rawgeti(L, -1, i);
      eqpl_result *u = luaL_testudata(L, -1, EQPL_RESULT);
      if (u && u->r) cJSON_AddItemToArray(results, result_json(u->r, ctx));
      if (u && u->r && nused < sizeof used / sizeof used[0]) used[nused++] = u->r;
      lua_pop(L, 1);
    }
  }
  lua_pop(L, 1);
  cJSON *curves = cJSON_AddArrayToObject(doc, "curves");
  if (lua_getfield(L, LUA_REGISTRYINDEX, EQPL_CURVES) == LUA_TTABLE) {
    lua_Integer n = (lua_Integer)lua_rawlen(L, -1);
    for (lua_Integer i = 1; i <= n; i++) {
      lua_rawgeti(L, -1, i);
      eqpl_curve *u = luaL_testudata(L, -1, EQPL_CURVE);
      char *text = u && u->c ? eqp_curve_to_json(u->c) : NULL;
      cJSON *one = text ? cJSON_Parse(text) : NULL;
      if (one) cJSON_AddItemToArray(curves, one);
      eqp_free_string(text);
      lua_pop(L, 1);
    }
  }
  lua_pop(L, 1);
  cJSON *out = cJSON_AddArrayToObject(doc, "output");
  if (lua_getfield(L, LUA_REGISTRYINDEX, "equipoise.output") == LUA_TTABLE) {
    lua_Integer n = (lua_Integer)lua_rawlen(L, -1);
    for (lua_Integer i = 1; i <= n; i++) {
      lua_rawgeti(L, -1, i);
      cJSON_AddItemToArray(out, cJSON_CreateString(lua_tostring(L, -1)));
      lua_pop(L, 1);
    }
  }
  lua_pop(L, 1);
  cJSON *warnings = cJSON_AddArrayToObject(doc, "warnings");
  each_notice(L, add_string, warnings);
  each_warning(L, add_string, warnings);
  cJSON *cautions = cJSON_AddArrayToObject(doc, "cautions");
  cJSON_AddItemToArray(cautions, cJSON_CreateString(general_caution));
  cli_each_caution(L, add_string, cautions);
  cJSON *prov = cJSON_AddObjectToObject(doc, "provenance");
  cJSON *files = cJSON_AddArrayToObject(prov, "species_files");
  for (size_t i = 0; ctx && i < eqp_ctx_source_count(ctx); i++)
    cJSON_AddItemToArray(files, cJSON_CreateString(eqp_ctx_source_path(ctx, i)));
  cJSON_AddStringToObject(prov, "water_properties", water_sources);
  char *constants = ctx ? eqp_ctx_constants_to_json(ctx, used, nused) : NULL;
  cJSON *list = constants ? cJSON_Parse(constants) : NULL;
  cJSON_AddItemToObject(prov, "constants", list ? list : cJSON_CreateArray());
  eqp_free_string(constants);
  char *text = cJSON_Print(doc);
  if (text) {
    fputs(text, stdout);
    fputc('\n', stdout);
    cJSON_free(text);
  }
  cJSON_Delete(doc);
}
