/* The Lua bindings as a script meets them: memory safety of the strings
** they hand to the engine, strict options (unknown names with the nearest
** known one, types, ranges, non-finite numbers, NUL characters), units,
** and the script's file and line in every message. Run in the sanitizer
** build, a string used after the collector freed it aborts the test. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include <lauxlib.h>
#include <lua.h>
#include <lualib.h>

static lua_State *L;
static char errbuf[2048];

/* Run code as the chunk "snippet"; NULL if it ran, else its error message. */
static const char *run(const char *code)
{
  lua_settop(L, 0);
  if (luaL_loadbufferx(L, code, strlen(code), "=snippet", "t") != LUA_OK ||
      lua_pcall(L, 0, 0, 0) != LUA_OK) {
    snprintf(errbuf, sizeof errbuf, "%s", lua_tostring(L, -1));
    lua_settop(L, 0);
    return errbuf;
  }
  return NULL;
}

static void ok(const char *code)
{
  const char *err = run(code);
  if (err) fail_msg("%s\n  in: %s", err, code);
}

/* The error names the snippet's line first, then what is wrong. */
static void refused(const char *code, int line, const char *needle)
{
  const char *err = run(code);
  if (!err) fail_msg("accepted: %s", code);
  char where[32];
  snprintf(where, sizeof where, "snippet:%d: ", line);
  if (strncmp(err, where, strlen(where)) != 0)
    fail_msg("'%s' does not start with '%s'\n  in: %s", err, where, code);
  if (!strstr(err, needle)) fail_msg("'%s' does not contain '%s'\n  in: %s", err, needle, code);
}

/* Every allocation by Lua from here on runs a whole collection cycle (pause
** 0, a step larger than the heap), so that a string no longer on the stack
** is freed at once; the sanitizer sees any later use. */
static const char torture[] = "collectgarbage('incremental', 1, 1000, 20) collectgarbage()\n";
static const char gentle[] = "collectgarbage('incremental', 200, 100, 13) collectgarbage()";

static void tortured(const char *code, const char *needle)
{
  char buf[4096];
  snprintf(buf, sizeof buf, "%s%s", torture, code);
  const char *err = run(buf);
  char copy[2048];
  snprintf(copy, sizeof copy, "%s", err ? err : "");
  ok(gentle);
  if (!needle && err) fail_msg("%s\n  in: %s", copy, code);
  if (needle && !err) fail_msg("accepted: %s", code);
  if (needle && !strstr(copy, needle)) fail_msg("'%s' does not contain '%s'", copy, needle);
}

/* ------------------------------------------------------- memory safety */

/* A result lives in its handle's memory with no finalizer and keeps its
** library through a holder (lua_result.c): a result made from a solution
** with a library of its own must read that library after the solution,
** its library and the context's holder of it have all moved on. */
static void test_result_keeps_its_library(void **state)
{
  tortured("local r1\n"
           "do\n"
           "  local s = eq.solution{ library = { only = { 'phosphate' } } }\n"
           "  s:add('KH2PO4', '10 mmol'):add('Na2HPO4', '5 mmol')\n"
           "  r1 = s:equilibrate()\n"
           "end\n"
           "local s2 = eq.solution{}\n"
           "local r2 = s2:add('NaCl', '1 mmol'):equilibrate()\n"
           "s2 = nil\n"
           "collectgarbage() collectgarbage()\n"
           /* a bound from the 10 mmol of KH2PO4 put in (mass balance), not a
           ** published value: the point is that the library is still there */
           "local m = r1:molality('H2PO4-')\n"
           "assert(m > 0 and m < 0.011, 'H2PO4- ' .. tostring(m))\n"
           "assert(tostring(r1):find('pH'), tostring(r1))\n"
           "assert(r2:molality('Na+') > 0)\n", NULL);
}

/* A finalizer that reads a result after the collector finalized the holder
** of its library (objects are finalized newest first) finds it closed,
** where it read freed memory before. */
static void test_result_read_by_a_finalizer(void **state)
{
  ok("seen = nil\n"
     "local keep = setmetatable({}, { __gc = function(t)\n"
     "  local okk, err = pcall(function() return t.r:molality('Na+') end)\n"
     "  seen = okk and 'read' or tostring(err)\n"
     "end })\n"
     "local s = eq.solution{ library = { only = { 'phosphate' } } }\n"
     "keep.r = s:add('NaCl', '10 mmol'):equilibrate()\n"
     "s = nil\n"
     "local r2 = eq.solution{}:add('NaCl', '1 mmol'):equilibrate()\n"
     "keep = nil\n"
     "collectgarbage() collectgarbage()\n"
     "assert(seen and seen:find('result is closed'), tostring(seen))\n");
}

/* Numbers where names are expected were converted to strings on the stack,
** popped, and then used: now they are refused before any conversion. */
static void test_numbers_as_names(void **state)
{
  tortured("local s = eq.solution{}\n"
           "s:titrate{ with = 'NaOH', step = '0.1 mmol', to = '1 mmol', species = { 1.5, 2.5 } }",
           "titrate: species[1] must be a string; got the number 1.5");
  tortured("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', quiet = true,\n"
           "            using = { 1234567.5, 7654321.5 } }",
           "eq.recipe: using[1] must be a string; got the number 1234567.5");
  tortured("eq.solution{}:add(1234567.5, '1 mmol')", "add: the reagent must be a string");
  tortured("eq.solution{}:equilibrate():molality(1.5)", "species must be a string");
  /* the gases' names are the keys of the script's table, used while it lives */
  tortured("local s = eq.solution{} s:add('NaHCO3', '1 mmol')\n"
           "s:seal{ headspace = '5 mL', gases = { ['CO2' .. '(g)'] = '1e-3 atm', "
           "['O2' .. '(g)'] = '0.2 atm' } } s:equilibrate()", NULL);
}

/* Options read through __index are fresh strings that only the binding
** holds: the recipe made from them must equal the one from a plain table.
** The __index runs a full collection each time it is asked. */
static void test_strings_from_index(void **state)
{
  tortured("local plain = { buffer = 'phosphate', salt = 'KCl', activity = 'davies', pH = 7.2,\n"
           "  total = '50 mM', ionic_strength = '0.2 M', quiet = true }\n"
           "local built = { buffer = { 'phos', 'phate' }, salt = { 'K', 'Cl' },\n"
           "  activity = { 'dav', 'ies' } }\n"
           "local t = setmetatable({ pH = 7.2, total = '50 mM', ionic_strength = '0.2 M',\n"
           "  quiet = true }, { __index = function(_, k)\n"
           "    collectgarbage(); return built[k] and table.concat(built[k]) end })\n"
           "local a, b = eq.recipe(plain), eq.recipe(t)\n"
           "assert(#a.items == #b.items and a.pH == b.pH, 'same recipe')\n"
           "for i, it in ipairs(a.items) do\n"
           "  assert(it.reagent == b.items[i].reagent and it.mmol == b.items[i].mmol)\n"
           "end\n"
           "assert(b.items[3].reagent == 'KCl', 'the salt read through __index')",
           NULL);
  tortured("local function opts(lw) return setmetatable({ pH = 7, total = '50 mM',\n"
           "  load = '2 mM', quiet = true }, { __index = function(_, k)\n"
           "    collectgarbage()\n"
           "    if k == 'load_with' then return lw and table.concat(lw) end end })\n"
           "end\n"
           "local a, b = eq.compare_buffers(opts()), eq.compare_buffers(opts{ 'H', 'Cl' })\n"
           "for i = 1, #a do assert(a[i].buffer == b[i].buffer and a[i].shift == b[i].shift) end",
           NULL);
  tortured("local s = eq.solution{}\n"
           "s:add('CH3COOH', '1 mmol')\n"
           "local names = { species = { 'CH3COO-' } }\n"
           "local c = s:titrate(setmetatable({ with = 'NaOH', step = '0.2 mmol', to = '1 mmol' },\n"
           "  { __index = function(_, k) collectgarbage()\n"
           "      return names[k] and { table.concat{ 'CH3', 'COO-' } } end }))\n"
           "assert(c[#c]['CH3COO-'] > 0)\n"
           "local b = s:load_budget(setmetatable({}, { __index = function(_, k) collectgarbage()\n"
           "  return ({ acid = table.concat{ 'H', 'Cl' },\n"
           "           base = table.concat{ 'Na', 'OH' } })[k] end }))\n"
           "assert(b.acid_mmol > 0 and b.base_mmol > 0)",
           NULL);
  /* the activity table and its parameters, built on demand */
  tortured("local s = eq.solution(setmetatable({}, { __index = function(_, k) collectgarbage()\n"
           "  if k == 'activity' then return { table.concat{ 'dav', 'ies' },\n"
           "    [table.concat{ 'coeff', 'icient' }] = 0.3 } end end }))\n"
           "s:add('NaCl', '10 mmol')\n"
           "assert(s:equilibrate().activity_model == 'davies')",
           NULL);
}

/* -------------------------------------------------- unknown option names */

static void test_unknown_options(void **state)
{
  /* a misspelt option would silently design a recipe at 25 C with no salt */
  refused("eq.recipe{ buffer = 'phosphate', pH = 7.4, total = '50 mM', temprature = 4 }", 1,
          "eq.recipe: unknown option 'temprature' (did you mean 'temperature'?)");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7.4, total = '50 mM',\n"
          "  temprature = 4, ionic_strenght = '0.15 M' }", 1,
          "unknown options 'ionic_strenght' (did you mean 'ionic_strength'?), 'temprature' "
          "(did you mean 'temperature'?)");
  refused("eq.solution{ temprature = 37 }", 1,
          "eq.solution: unknown option 'temprature' (did you mean 'temperature'?)");
  refused("eq.solution{ activty = 'ideal' }", 1, "(did you mean 'activity'?)");
  refused("eq.solution{ volme = '1 L' }", 1, "(did you mean 'volume'?)");
  refused("eq.compare_buffers{ pH = 7, total = '50 mM', load = '2 mM', windw = 0.1 }", 1,
          "eq.compare_buffers: unknown option 'windw' (did you mean 'window'?)");
  refused("eq.compare_buffers{ pH = 7, total = '50 mM', load = '2 mM', lod_with = 'HCl' }", 1,
          "(did you mean 'load_with'?)");
  refused("local s = eq.solution{}\n"
          "s:titrate{ with = 'NaOH', step = '0.1 mmol', to = '1 mmol', max_dph = 0.05 }", 2,
          "titrate: unknown option 'max_dph' (did you mean 'max_dpH'?)");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '0.1 mmol', until_ph = 9 }", 1,
          "(did you mean 'until_pH'?)");
  refused("eq.solution{}:load_budget{ widow = 0.2 }", 1,
          "load_budget: unknown option 'widow' (did you mean 'window'?)");
  refused("eq.solution{}:dilute{ too = '2 L' }", 1,
          "dilute: unknown option 'too' (did you mean 'to'?)");
  refused("local s = eq.solution{}\neq.mix{ s, s, volume = '1 L' }", 2,
          "eq.mix: unknown option 'volume'; it takes no named options");
  refused("local s = eq.solution{}\neq.mix{ { s, '1 mL', scale = 2 } }", 2,
          "eq.mix: part 1: unknown option 'scale'");
  /* far from every name: the list of options instead of a guess */
  refused("eq.solution{ colour = 'blue' }", 1,
          "unknown option 'colour'; its options are volume, water, temperature, activity, species");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', using_salt = 'x' }", 1,
          "unknown option 'using_salt'");
  /* options of one call are not options of another */
  refused("eq.compare_buffers{ pH = 7, total = '50 mM', load = '2 mM', buffer = 'Tris' }", 1,
          "unknown option 'buffer'");
  refused("eq.solution{ 'davies' }", 1,
          "eq.solution: options are given by name (name = value); got a value at position 1");
  refused("eq.solution{ ['temp\\0erature'] = 25 }", 1, "followed by a NUL character");
  refused("eq.solution('1 L')", 1, "eq.solution: the options must be a table");
}

/* ------------------------------------------------------- types and ranges */

static void test_types_and_ranges(void **state)
{
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '0.1 mmol', to = '1 mmol', max_dpH = 0 }",
          1, "titrate: max_dpH must be greater than 0 and at most 14; got 0");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '0.1 mmol', to = '1 mmol', max_dpH = -1 }",
          1, "max_dpH must be greater than 0");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '0.1 mmol', to = '1 mmol',\n"
          "  species = 'OH-' }", 1, "titrate: species must be a list of names");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '0.1 mmol', to = '1 mmol',\n"
          "  species = { 'OH-', x = 'H+' } }", 1,
          "species must be a list of names; it has the key");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '0 mmol', to = '1 mmol' }", 1,
          "titrate: step = '0 mmol' is out of range (greater than 0 mol)");
  refused("eq.solution{}:titrate{ with = 42, step = '1 mmol' }", 1,
          "titrate: with must be a reagent name or a stock solution; got the number 42");
  refused("eq.solution{}:titrate{ step = '1 mmol' }", 1, "titrate: with is required");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = 0.1, to = '1 mmol' }", 1,
          "titrate: step: the number 0.1 has no unit");
  /* temperature = {37, "C"} was silently 25 C */
  refused("eq.solution{ temperature = { 37, 'C' } }", 1,
          "eq.solution: temperature must be a number in C or a string with its unit");
  refused("eq.solution{ temperature = '37' }", 1, "has no unit");
  /* activity = {"davies", 0.2}: the 0.2 was silently ignored */
  refused("eq.solution{ activity = { 'davies', 0.2 } }", 1,
          "activity parameters go by name, such as { 'davies', coefficient = 0.2 }; got the "
          "number 0.2 without a name");
  refused("eq.solution{ activity = { 'davies', coefficient = '0.3' } }", 1,
          "activity parameter 'coefficient' must be a number");
  refused("eq.solution{ activity = 7 }", 1, "activity must be a model name");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', activity = { 'sit' } }", 1,
          "eq.recipe: activity must be a model name, such as 'davies' (eq.recipe takes no model "
          "parameters)");
  refused("eq.recipe{ buffer = 'phosphate', pH = '7', total = '50 mM' }", 1,
          "eq.recipe: pH must be a number; got the string '7'");
  refused("eq.recipe{ buffer = 'phosphate', pH = 20, total = '50 mM' }", 1,
          "pH must be between -1 and 15; got 20");
  refused("eq.recipe{ buffer = 'phosphate', total = '50 mM' }", 1, "eq.recipe: pH is required");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7 }", 1, "eq.recipe: total is required");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = 50 }", 1,
          "eq.recipe: total: the number 50 has no unit");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', quiet = 1 }", 1,
          "quiet must be true or false");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', using = { 'Tris' } }", 1,
          "using lists two reagents");
  refused("eq.recipe{ pH = 7, total = '50 mM' }", 1, "name a buffer");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', salt = 'KCl' }", 1,
          "salt = 'KCl' needs an ionic_strength");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', ionic_strength = '-1 M' }",
          1, "is negative");
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', titrant = '0 M' }", 1,
          "titrant = '0 M' is out of range");
  refused("eq.compare_buffers{ pH = 7, total = '50 mM' }", 1, "load is required");
  refused("eq.compare_buffers{ pH = 7, total = '50 mM', load = '2 mM', window = 0 }", 1,
          "window must be greater than 0");
  refused("eq.solution{}:load_budget{ window = '0.1' }", 1,
          "load_budget: window must be a number; got the string '0.1'");
  refused("eq.solution{}:load_budget{ acid = 3 }", 1, "acid must be a reagent name");
  refused("eq.solution{}:dilute{ to = '1 mL' }", 1,
          "dilute: to = '1 mL' is less than the solution's volume");
  refused("eq.solution{}:dilute(0.5)", 1, "dilute: the factor must be between 1 and");
  refused("eq.solution{}:dilute('2')", 1, "dilute: a factor (2) or { to = '500 mL' }");
  refused("eq.mix{ 3 }", 1, "eq.mix: part 1 must be a solution or a pair");
  refused("eq.mix{ { eq.solution{}, '0 mL' } }", 1, "part 1: volume = '0 mL' is out of range");
  refused("eq.mix{}", 1, "eq.mix: a list of 1 to 64 solutions");
  refused("eq.solution{}:pour('stock', '1 mL')", 1, "pour: argument 2 must be a solution");
  refused("eq.solution{}.add('NaCl', '1 mmol')", 1, "with a colon (s:add(...))");
  refused("eq.solution{}:adjust_pH(7)", 1, "adjust_pH: the reagent must be a reagent name or a "
          "stock solution; got nothing");
  refused("eq.solution{}:expose('CO2(g)', '1e9 atm')", 1,
          "is out of range (between 0 and 100 atm)");
  refused("eq.solution{}:set_temperature({ 37 })", 1, "set_temperature: temperature must be");
  refused("eq.solution{}:seal{ headspce = '5 mL' }", 1,
          "seal: unknown option 'headspce' (did you mean 'headspace'?)");
  refused("eq.solution{}:seal{ gases = {} }", 1, "headspace is required");
  refused("eq.solution{}:seal{ headspace = '5 g' }", 1, "seal: headspace");
  refused("eq.solution{}:seal{ headspace = '5 mL', gases = { ['co2(g)'] = '1 atm' } }", 1,
          "unknown gas 'co2(g)' (did you mean 'CO2(g)'?)");
  refused("eq.solution{}:seal{ headspace = '5 mL', gases = { 'CO2(g)' } }", 1,
          "gases is keyed by the gases' names");
  refused("eq.solution{}:seal{ headspace = '5 mL', gases = { ['CO2(g)'] = '1 mL' } }", 1,
          "seal: the partial pressure of CO2(g)");
  refused("local s = eq.solution{} s:seal{ headspace = '5 mL' } s:expose('CO2(g)', '1 atm')", 1,
          "sealed under a headspace");
  ok("local s = eq.solution{} s:add('NaHCO3', '1 mmol') s:seal{ headspace = '5 mL' } "
     "local p, n = s:equilibrate():gas('CO2(g)') assert(p > 0 and n > 0 and s:sealed()) "
     "assert(eq.solution{}:equilibrate().headspace == nil)");
}

/* nan and inf anywhere in options or amounts */
static void test_non_finite(void **state)
{
  refused("eq.solution{ temperature = 0/0 }", 1, "temperature must be a finite number; got nan");
  refused("eq.solution{ temperature = math.huge }", 1, "must be a finite number; got inf");
  refused("eq.solution{}:set_temperature(-math.huge)", 1, "must be a finite number; got -inf");
  refused("eq.solution{ activity = { 'davies', coefficient = 0/0 } }", 1,
          "activity parameter 'coefficient' must be a finite number; got nan");
  refused("eq.recipe{ buffer = 'phosphate', pH = 0/0, total = '50 mM' }", 1,
          "pH must be a finite number");
  refused("eq.compare_buffers{ pH = 7, total = '50 mM', load = '2 mM', window = 1/0 }", 1,
          "window must be a finite number");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '1 mmol', until_pH = 0/0 }", 1,
          "until_pH must be a finite number");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '1 mmol', to = '2 mmol', max_dpH = 1/0 }",
          1, "max_dpH must be a finite number");
  refused("eq.solution{}:load_budget{ window = 0/0 }", 1, "window must be a finite number");
  refused("eq.solution{}:adjust_pH(0/0, 'NaOH')", 1, "the target pH must be a finite number");
  refused("eq.solution{}:dilute(1/0)", 1, "the factor must be a finite number");
  refused("eq.solution{}:add('NaCl', 'inf mmol')", 1, "'inf mmol' is not a number");
  refused("eq.solution{}:add('NaCl', 'nan mmol')", 1, "'nan mmol' is not a number");
  refused("eq.solution{ water = 'inf kg' }", 1, "is not a number");
  refused("eq.solution{}:titrate{ with = 'NaOH', step = 'nan mmol' }", 1, "is not a number");
}

/* "NaCl\0KCl" added NaCl: every string is checked for a NUL character */
static void test_nul_characters(void **state)
{
  const char *needle = "is followed by a NUL character";
  refused("eq.solution{}:add('NaCl\\0KCl', '1 mmol')", 1, needle);
  refused("eq.solution{}:add('NaCl', '1 mmol\\0 and more')", 1, needle);
  refused("eq.solution{ activity = 'davies\\0x' }", 1, needle);
  refused("eq.solution{ activity = { 'davies\\0x' } }", 1, needle);
  refused("eq.solution{ activity = { 'davies', ['coefficient\\0x'] = 0.2 } }", 1, needle);
  refused("eq.solution{ water = '1 kg\\0' }", 1, needle);
  refused("eq.solution{ temperature = '25 C\\0' }", 1, needle);
  refused("eq.solution{ species = { 'none.lua\\0x' } }", 1, needle);
  refused("eq.load_species('none.lua\\0x')", 1, needle);
  refused("eq.recipe{ buffer = 'phosphate\\0', pH = 7, total = '50 mM' }", 1, needle);
  refused("eq.recipe{ buffer = 'phosphate', pH = 7, total = '50 mM', using = { 'A\\0', 'B' } }",
          1, needle);
  refused("eq.compare_buffers{ pH = 7, total = '50 mM', load = '2 mM', load_with = 'HCl\\0' }", 1,
          needle);
  refused("eq.solution{}:titrate{ with = 'NaOH\\0', step = '1 mmol', to = '2 mmol' }", 1, needle);
  refused("eq.solution{}:titrate{ with = 'NaOH', step = '1 mmol', to = '2 mmol',\n"
          "  species = { 'OH-\\0' } }", 1, needle);
  refused("eq.solution{}:load_budget{ base = 'NaOH\\0' }", 1, needle);
  refused("eq.solution{}:adjust_pH(7, 'NaOH\\0')", 1, needle);
  refused("eq.solution{}:expose('CO2(g)\\0', '1 atm')", 1, needle);
  refused("eq.solution{}:total('Na+\\0')", 1, needle);
  refused("eq.solution{}:equilibrate():molality('Na+\\0')", 1, needle);
  refused("eq.molar_mass('NaCl\\0K')", 1, needle);
  refused("eq.quantity('1 mM\\0')", 1, needle);
  refused("eq.describe('NaCl\\0')", 1, needle);
  ok("assert(eq.solution{}:equilibrate()['pH\\0'] == nil)");
}

/* ---------------------------------------------------------------- units */

/* mL and ml, L and l: the same volume (CGPM 1979; SI Brochure 2019) */
static void test_litre_symbols(void **state)
{
  ok("local a, b = eq.solution{ volume = '250 mL' }, eq.solution{ volume = '250 ml' }\n"
     "assert(a:water() == b:water())\n"
     "assert(eq.solution{ volume = '1 l' }:water() == eq.solution{ volume = '1 L' }:water())\n"
     "local stock = eq.solution{}\n"
     "stock:add('NaCl', '1 mol')\n"
     "a:pour(stock, '10 mL'); b:pour(stock, '10 ml')\n"
     "assert(a:total('Na+') == b:total('Na+') and a:water() == b:water())\n"
     "assert(eq.quantity('10 ml') == eq.quantity('10 mL'))\n"
     "assert(eq.quantity('0.1 mol/l') == 0.1)");
}

/* an amount too large or too small for a double is out of range */
static void test_out_of_range_amounts(void **state)
{
  refused("eq.solution{}:add('NaCl', '1e400 mmol')", 1,
          "amount of NaCl: '1e400 mmol' is out of range (too large)");
  refused("eq.solution{}:add('NaCl', '1e-400 mmol')", 1, "'1e-400 mmol' is out of range");
  refused("eq.solution{ water = '1e400 kg' }", 1, "'1e400 kg' is out of range");
  refused("eq.quantity('1e999 M')", 1, "out of range");
}

/* The first message is about the real problem, in the user's words. */
static void test_first_message_is_the_problem(void **state)
{
  /* 500 C complained about a negative mass of water */
  refused("eq.recipe{ buffer = 'phosphate', pH = 7.4, total = '50 mM', temperature = 500 }", 1,
          "eq.recipe: temperature 500 C is outside 0..100 C");
  refused("eq.compare_buffers{ pH = 7, total = '50 mM', load = '2 mM', temperature = -5 }", 1,
          "eq.compare_buffers: temperature -5 C is outside 0..100 C");
  refused("eq.solution{ temperature = '400 K' }", 1, "temperature 126.85 C is outside 0..100 C");
  /* '1e7 kg' said "must be positive" */
  refused("eq.solution{ water = '1e7 kg' }", 1,
          "eq.solution: water = '1e7 kg' is out of range (greater than 0 kg and at most 1e+06 kg)");
  refused("eq.solution{ volume = '2e6 L' }", 1, "volume = '2e6 L' is out of range");
  refused("eq.solution{ water = '0 kg' }", 1, "water = '0 kg' is out of range");
  refused("eq.solution{ water = '1 kg', volume = '1 L' }", 1, "either 'water'");
  refused("eq.solution{}:set_temperature(120)", 1,
          "set_temperature: temperature 120 C is outside 0..100 C");
  /* an acid as the salt said "the targets could not be met together"; a
  ** salt of the buffer's own system (KH2PO4 for phosphate) was taken,
  ** making more than the 50 mM of buffer asked for */
  static const char rec[] = "eq.recipe{ buffer = 'phosphate', pH = 7.4, total = '50 mM', "
                            "ionic_strength = '0.15 M', quiet = true, salt = ";
  char code[512];
  snprintf(code, sizeof code, "%s'HCl' }", rec);
  refused(code, 1, "salt = 'HCl' is an acid (it releases H+), not a neutral salt; the ionic "
          "strength is set with a neutral salt that leaves the pH alone, such as NaCl or KCl");
  snprintf(code, sizeof code, "%s'NaOH' }", rec);
  refused(code, 1, "salt = 'NaOH' is a base (it takes up H+)");
  snprintf(code, sizeof code, "%s'KH2PO4' }", rec);
  refused(code, 1, "salt = 'KH2PO4' holds PO4^3-, of the buffer's own system");
  snprintf(code, sizeof code, "%s'Tris' }", rec);
  refused(code, 1, "Tris takes up or gives off H+ itself; the ionic strength is set with a "
          "neutral salt");
  snprintf(code, sizeof code, "%s'KCl' }", rec);
  ok(code);
  /* two reagents that make no buffer gave a "recipe" of HCl weighed in grams */
  refused("eq.recipe{ using = { 'HCl', 'NaOH' }, pH = 7, total = '50 mM', quiet = true }", 1,
          "using = { HCl, NaOH } makes no buffer: neither is a weak acid or base");
  refused("eq.recipe{ using = { 'NaCl', 'KCl' }, pH = 7, total = '50 mM', quiet = true }", 1,
          "makes no buffer");
  refused("eq.recipe{ using = { 'Tris', 'Tris' }, pH = 8, total = '50 mM', quiet = true }", 1,
          "using names Tris twice");
  /* a load of NaCl ranked every buffer by a shift of 0 */
  refused("eq.compare_buffers{ pH = 7.2, total = '50 mM', load = '2 mM', load_with = 'NaCl',\n"
          "  quiet = true }", 1, "load_with = 'NaCl' is neither an acid nor a base");
  /* an acid that is no acid said "pH 10.282 is out of reach with NaCl" */
  refused("local s = eq.solution{}\ns:add('Tris', '50 mM')\ns:load_budget{ acid = 'NaCl' }", 3,
          "load budget: acid = 'NaCl' is neither an acid nor a base; name an acid, such as HCl");
  refused("local s = eq.solution{}\ns:add('Tris', '50 mM')\n"
          "s:load_budget{ acid = 'NaOH', base = 'HCl' }", 3, "acid = 'NaOH' is a base");
}

/* Every message starts with the script's file and line, also through
** pcall and tail calls. */
static void test_file_and_line(void **state)
{
  refused("local x = 1\n\n\neq.solution{ temprature = 4 }", 4, "unknown option");
  /* a tail call into a binding keeps the caller's frame: its line is the call's */
  refused("local function make(t)\n  return eq.solution(t)\nend\nmake{ temprature = 4 }", 2,
          "unknown option");
  refused("local ok, e = pcall(eq.solution, { temprature = 4 })\nerror(e, 0)", 1,
          "unknown option");
  refused("local s = eq.solution{}\n"
          "s:titrate{\n"
          "  with = 'NaOH',\n"
          "  step = '1 mmol',\n"
          "  max_dpH = -1,\n"
          "}", 2, "max_dpH");
}

/* Extra arguments were ignored: s:add("NaCl", "1 mmol", {}) added NaCl and
** eq.solution({...}, 5) made a solution. Every call refuses them, naming
** its signature; the optional trailing arguments stay optional. */
static void test_extra_arguments(void **state)
{
  static const char setup[] =
    "local s = eq.solution{}\n"
    "local stock = eq.solution{}\n"
    "local r = s:equilibrate()\n"
    "local c = s:titrate{ with = 'NaOH', step = '1 mmol', to = '2 mmol' }\n"
    "local p = eq.plot{ lines = { { x = { 1, 2 }, y = { 1, 2 } } } }\n";
  static const struct { const char *call, *needle; } calls[] = {
    {"eq.solution({ volume = '1 L' }, 5)", "eq.solution{ options } takes 1 argument; got 2 "
                                           "(the 2nd is the number 5)"},
    {"s:add('NaCl', '1 mmol', {})", "s:add(reagent, amount) takes 2 arguments; got 3 (the 3rd "
                                    "is a table)"},
    {"s:add('NaCl', '1 mmol', nil)", "the 3rd is nil"},
    {"s:equilibrate(1)", "s:equilibrate() takes no arguments; got 1"},
    {"s:copy(s)", "s:copy() takes no arguments"},
    {"s:set_temperature(25, 'C')", "s:set_temperature(t) takes 1 argument"},
    {"s:water(1)", "s:water()"}, {"s:volume(1)", "s:volume()"},
    {"s:temperature(1)", "s:temperature()"},
    {"s:pour(stock, '1 mL', '2 mL')", "s:pour(stock, volume) takes 2 arguments"},
    {"s:dilute(2, 3)", "s:dilute("}, {"s:buffer_capacity('HCl')", "s:buffer_capacity()"},
    {"s:adjust_pH(7, 'NaOH', '1 M')", "s:adjust_pH(pH, reagent | stock) takes 2 arguments"},
    {"s:adjust({ { pH = 7, with = 'NaOH' } }, 1)", "s:adjust{ target, ... }"},
    {"s:fix_activity('Ca^2+', 1e-6, 'Cl-', 1)", "takes 3 arguments"},
    {"s:load_budget({}, 0.1)", "s:load_budget([options]) takes 1 argument"},
    {"s:expose('CO2(g)', '1 atm', 1)", "s:expose(gas, pressure)"},
    {"s:seal({ headspace = '5 mL' }, 1)", "s:seal{"}, {"s:unseal(1)", "s:unseal()"},
    {"s:sealed(1)", "s:sealed()"}, {"r:gas('CO2(g)', 1)", "r:gas(name)"},
    {"s:total('Na+', 'mol')", "s:total(component)"},
    {"s:titrate({ with = 'NaOH', step = '1 mmol', to = '2 mmol' }, 1)", "s:titrate{ options }"},
    {"s:temperature_sweep({ from = 20, to = 30 }, 1)", "s:temperature_sweep{"},
    {"r:molality('Na+', 3)", "r:molality(species) takes 1 argument; got 2"},
    {"r:molarity('Na+', 3)", "r:molarity(species)"}, {"r:activity('Na+', 3)", "r:activity("},
    {"r:gamma('Na+', 3)", "r:gamma(species)"}, {"r:saturation('calcite', 3)", "r:saturation("},
    {"r:solid('calcite', 3)", "r:solid(name)"}, {"r:species(1)", "r:species()"},
    {"c:csv(1)", "curve:csv()"}, {"c:json(1)", "curve:json()"},
    {"c:write_csv('a.csv', 1)", "curve:write_csv(path)"},
    {"c:write_json('a.json', 1)", "curve:write_json(path)"},
    {"c:plot('a.svg', {}, 1)", "curve:plot(file [, options]) takes 2 arguments"},
    {"p:svg(1)", "plot:svg()"}, {"p:write('a.svg', 1)", "plot:write(file)"},
    {"eq.mix({ s }, 1)", "eq.mix{ parts }"},
    {"eq.recipe({ buffer = 'phosphate', pH = 7, total = '50 mM' }, 1)", "eq.recipe{ options }"},
    {"eq.compare_buffers({ pH = 7, total = '50 mM', load = '2 mM' }, 1)",
     "eq.compare_buffers{ options }"},
    {"eq.load_species({}, 1)", "eq.load_species(path_or_table)"},
    {"eq.molar_mass('NaCl', 1)", "eq.molar_mass(formula)"},
    {"eq.quantity('1 mM', 1)", "eq.quantity(text)"},
    {"eq.describe('NaCl', {}, 1)", "eq.describe(name [, options]) takes 2 arguments"},
    {"eq.plot({ lines = {} }, 1)", "eq.plot{ options }"},
    {"eq.distribution({ system = 'phosphate' }, 1)", "eq.distribution{ options }"},
    {"eq.capacity({ total = '50 mM' }, 1)", "eq.capacity{ options }"},
    {"eq.pretty('Na+', 1)", "eq.pretty(name)"},
  };
  for (size_t i = 0; i < sizeof calls / sizeof calls[0]; i++) {
    char code[2048];
    snprintf(code, sizeof code, "%s%s", setup, calls[i].call);
    refused(code, 6, calls[i].needle);
  }
  /* optional trailing arguments may be left out, or given */
  ok("assert(eq.describe('NaCl'))\nassert(eq.describe('NaCl', { temperature = 37 }))\n"
     "local s = eq.solution{}\ns:add('Tris', '50 mM')\nassert(s:load_budget().pH)\n"
     "assert(s:load_budget{ window = 0.2 }.pH)");
}

/* eq.plot drew a NaN or an infinity as a gap, and cut a label at a NUL. */
static void test_plot_points_and_labels(void **state)
{
  refused("eq.plot{ lines = { { x = { 1, 2, 3 }, y = { 1, 0/0, 3 } } } }", 1,
          "eq.plot line y: item 2 is nan, not a finite number (leave a gap with nil or false)");
  refused("eq.plot{ lines = { { x = { 1, -math.huge }, y = { 1, 2 } } } }", 1,
          "eq.plot line x: item 2 is -inf");
  refused("eq.plot{ bands = { { 0/0, 1 } } , lines = {} }", 1,
          "a band's from must be a finite number; got nan");
  refused("eq.plot{ lines = { { x = { 1 }, y = { 1 }, label = 'a\\0b' } } }", 1,
          "is followed by a NUL character");
  refused("eq.plot{ title = 'a\\0b', lines = {} }", 1, "is followed by a NUL character");
  refused("eq.plot{ x = 'pH\\0', lines = {} }", 1, "is followed by a NUL character");
  refused("eq.plot{ y = { label = 'pH', unit = 'mM\\0x' }, lines = {} }", 1,
          "is followed by a NUL character");
  refused("eq.plot{ hlines = { { y = 1, label = 'x\\0y' } }, lines = {} }", 1,
          "is followed by a NUL character");
  refused("eq.plot{ width = 1e300, lines = {} }", 1, "200 to 4000");
  refused("eq.pretty('HPO4^2-\\0x')", 1, "is followed by a NUL character");
  /* a gap is asked for with nil or false */
  ok("eq.plot{ lines = { { x = { 1, 2, 3, 4 }, y = { 1, nil, false, 4 } } } }");
  /* a title an __index makes lives until the figure is made */
  tortured("local o = setmetatable({ lines = { { x = { 1, 2 }, y = { 1, 2 } } } },\n"
           "  { __index = function(t, k) if k == 'title' then return table.concat{ 'ti', 'tle' }"
           " end end })\n"
           "assert(#eq.plot(o):svg() > 0)", NULL);
}

/* The sweeps read their options with checks of their own: a NaN
** temperature made a distribution at 25 C, -40 C a capacity sweep, a volume
** of 0 L was taken, 2.5 points made 2. */
static void test_sweep_options(void **state)
{
  refused("eq.distribution{ system = 'phosphate', temperature = 0/0 }", 1,
          "eq.distribution: temperature must be a finite number; got nan");
  refused("eq.distribution{ system = 'phosphate', temperature = 500 }", 1,
          "eq.distribution: temperature 500 C is outside 0..100 C");
  refused("eq.distribution{ system = 'phosphate', ionic_strength = 0/0 }", 1,
          "ionic_strength (mol/kg) must be a finite number; got nan");
  refused("eq.distribution{ system = 'phosphate', points = 2.5 }", 1,
          "points must be a whole number; got 2.5");
  refused("eq.capacity{ total = '50 mM', temperature = -40 }", 1,
          "eq.capacity: temperature -40 C is outside 0..100 C");
  refused("eq.capacity{ total = '50 mM', volume = '0 L' }", 1,
          "eq.capacity: volume = '0 L' is out of range");
  refused("eq.capacity{ total = '6 M' }", 1, "eq.capacity: total = '6 M' is out of range");
  refused("local s = eq.solution{}\ns:temperature_sweep{ from = 20, to = 30, points = 2.7 }", 2,
          "temperature_sweep: points must be a whole number");
  refused("local s = eq.solution{}\ns:temperature_sweep{ from = 30, to = 20 }", 2,
          "from = 30 C must be below to = 20 C");
  refused("local s = eq.solution{}\ns:temperature_sweep{ from = 0/0, to = 20 }", 2,
          "must be a finite number");
  ok("assert(#eq.distribution{ system = 'phosphate', ionic_strength = '0.1 mol/kg',\n"
     "  temperature = '37 C', points = 11 } == 11)\n"
     "assert(#eq.solution{}:temperature_sweep{ from = 20, to = 30 } == 11)");
}

/* Found by trying the calls as a hostile user would. */
static void test_probed(void **state)
{
  /* the solvent's molality was 0, a wrong number rather than a missing one */
  refused("local r = eq.solution{}:equilibrate()\nprint(r:molality('H2O'))", 2,
          "H2O is the solvent: it has no molality or molarity");
  refused("local r = eq.solution{}:equilibrate()\nprint(r:molarity('H2O'))", 2,
          "H2O is the solvent");
  ok("local r = eq.solution{}:equilibrate()\nassert(r:activity('H2O') == 1)");
  /* pour refused a solution as its own stock; adjust_pH said "adding it
  ** lowers the pH" and titrate made a flat curve */
  refused("local s = eq.solution{}\ns:add('Tris', '50 mM')\ns:adjust_pH(7, s)", 3,
          "a solution cannot be adjusted with itself as the stock");
  refused("local s = eq.solution{}\ns:add('Tris', '50 mM')\n"
          "s:titrate{ with = s, step = '1 mL', to = '10 mL' }", 3,
          "a solution cannot be titrated with itself");
  /* "titration stopped at 100000 points before its end": now what to change */
  refused("local s = eq.solution{}\ns:add('CH3COOH', '1 mmol')\n"
          "s:titrate{ with = 'NaOH', step = '1e-12 mmol', to = '2 mmol' }", 3,
          "titration: 100000 rows reach only 1e-07 of the 2 mmol to add: give a step of at "
          "least 2e-05 mmol (it was 1e-12 mmol)");
  /* two targets on one quantity, or one reagent for two targets, said "the
  ** targets could not be met together" (exit 5) */
  refused("local s = eq.solution{}\ns:add('Tris', '50 mM')\n"
          "s:adjust{ { pH = 7, with = 'HCl' }, { pH = 7.5, with = 'NaOH' } }", 3,
          "targets 1 and 2 both set the pH (the activity of H+)");
  refused("local s = eq.solution{}\ns:add('Tris', '50 mM')\n"
          "s:adjust{ { pH = 7, with = 'HCl' }, { species = 'H+', activity = 1e-7, with = 'NaOH' } }",
          3, "both set the pH");
  refused("local s = eq.solution{}\ns:add('Tris', '50 mM')\n"
          "s:adjust{ { pH = 7, with = 'HCl' }, { ionic_strength = '0.15 mol/kg', with = 'HCl' } }",
          3, "targets 1 and 2 both add HCl: one amount cannot meet two targets");
  ok("local s = eq.solution{}\ns:add('Tris', '50 mM')\n"
     "assert(#s:adjust{ { pH = 7, with = 'HCl' }, { ionic_strength = '0.15 mol/kg', "
     "with = 'NaCl' } } == 2)");
  /* a recipe of 1 uL printed "Weigh 0.0000 g": now mg, and the printed
  ** quantity is the amount (re-weighed from the text, the same mmol) */
  ok("local r = eq.recipe{ buffer = 'phosphate', pH = 7.4, total = '50 mM', volume = '1 uL',\n"
     "  quiet = true }\n"
     "local it = r.items[1]\n"
     "assert(it.printed:find(' mg$'), it.printed)\n"
     "local v = eq.quantity(it.printed)\n"
     "assert(math.abs(v * 1e3 / eq.molar_mass(it.reagent) * 1e3 - it.mmol) < 1e-3 * it.mmol)\n"
     "assert(not r.procedure:find('0.0000 g', 1, true) and r.procedure:find(' uL of water', 1, true))");
  /* a figure named .bmp was refused as "not an output file" by the sandbox */
  refused("local c = eq.solution{}:titrate{ with = 'HCl', step = '1 mmol', to = '2 mmol' }\n"
          "c:plot('x.bmp')", 2, "plot file 'x.bmp': a figure is written as .svg, .png or .pdf");
}

/* Every documented option of every call is accepted. */
static void test_every_option_accepted(void **state)
{
  ok("local a = eq.solution{ water = '0.5 kg', temperature = 30, activity = 'ideal' }\n"
     "local b = eq.solution{ volume = '100 mL', temperature = '303.15 K',\n"
     "  activity = { 'davies', coefficient = 0.3 },\n"
     "  species = { { sources = { demo = 'invented for this test' },\n"
     "    species = { { 'HQd', formula = 'C3H6O2' }, { 'Qd-', formula = 'C3H5O2-' } },\n"
     "    acids = { { 'HQd', 'Qd-', pKa = 4.9, source = 'demo' } } } } }\n"
     "a:add('CH3COOH', '2 mmol')\n"
     "b:add('NaOH', '10 mmol')\n"
     "local c = a:titrate{ with = 'NaOH', step = '0.1 mmol', to = '2 mmol', max_dpH = 0.2,\n"
     "  species = { 'CH3COO-' } }\n"
     "local d = a:titrate{ with = b, step = '1 mL', until_pH = 5 }\n"
     "local lb = a:load_budget{ window = 0.2, acid = 'HCl', base = 'NaOH' }\n"
     "local m = eq.mix{ a, { b, '10 mL' } }\n"
     "m:dilute(2):dilute{ to = '2 L' }\n"
     "local r = eq.recipe{ buffer = 'phosphate', pH = 7.2, total = '20 mM', volume = '500 mL',\n"
     "  temperature = 37, ionic_strength = '0.1 M', salt = 'NaCl', titrant = '1 M',\n"
     "  activity = 'davies', quiet = true }\n"
     "local u = eq.recipe{ pH = 8, total = '20 mM', using = { 'Tris', 'HCl' }, quiet = true }\n"
     "local k = eq.compare_buffers{ pH = 7, total = '50 mM', volume = '1 L', temperature = 25,\n"
     "  load = '1 mM', load_with = 'NaOH', window = 0.2, activity = 'davies', quiet = true }\n"
     "assert(#c > 0 and #d > 0 and lb.acid_mmol > 0 and #r.items > 0 and #u.items > 0 and #k > 0)");
  ok("local v = eq.solution{ volume = '10 mL' } v:add('NaHCO3', '0.1 mmol')\n"
     "v:seal{ headspace = '5 mL', gases = { ['CO2(g)'] = '426.9 uatm', ['O2(g)'] = '0.21 atm' } }\n"
     "local h = v:equilibrate().headspace\n"
     "assert(h.volume > 0 and h.pressure > 0.2 and h.gases['CO2(g)'].mol > 0)");
  /* options inherited through a metatable are read */
  ok("local defaults = { temperature = 37 }\n"
     "local s = eq.solution(setmetatable({}, { __index = defaults }))\n"
     "assert(s:temperature() == 37)");
}

static int setup(void **state)
{
  L = luaL_newstate();
  luaL_openlibs(L);
  eqp_lua_open(L);
  lua_setglobal(L, "eq");
  return L ? 0 : -1;
}

static int teardown(void **state)
{
  lua_close(L);
  return 0;
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_result_keeps_its_library),
    cmocka_unit_test(test_result_read_by_a_finalizer),
    cmocka_unit_test(test_numbers_as_names),
    cmocka_unit_test(test_strings_from_index),
    cmocka_unit_test(test_unknown_options),
    cmocka_unit_test(test_types_and_ranges),
    cmocka_unit_test(test_non_finite),
    cmocka_unit_test(test_nul_characters),
    cmocka_unit_test(test_litre_symbols),
    cmocka_unit_test(test_out_of_range_amounts),
    cmocka_unit_test(test_first_message_is_the_problem),
    cmocka_unit_test(test_file_and_line),
    cmocka_unit_test(test_every_option_accepted),
    cmocka_unit_test(test_extra_arguments),
    cmocka_unit_test(test_plot_points_and_labels),
    cmocka_unit_test(test_sweep_options),
    cmocka_unit_test(test_probed),
  };
  return cmocka_run_group_tests(tests, setup, teardown);
}
