#!/bin/sh
# End-to-end checks of the equipoise command: output, exit codes, messages.
# Usage: run.sh EQUIPOISE JSON_CHECK SOURCE_DIR BUILD_DIR
set -u
EQP=$1; JSON=$2; SRC=$3; BUILD=$4
CASES=$SRC/tests/e2e/cases
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
pass=0; fail=0

# check NAME EXPECTED_EXIT PATTERN -- command...
check() {
  name=$1; want=$2; pattern=$3; shift 4
  "$@" >"$TMP/out" 2>"$TMP/err"
  got=$?
  if [ "$got" -ne "$want" ]; then
    echo "FAIL $name: exit $got, expected $want"; sed 's/^/  | /' "$TMP/out" "$TMP/err" | head -20
    fail=$((fail + 1)); return
  fi
  if [ -n "$pattern" ] && ! grep -q -- "$pattern" "$TMP/out" "$TMP/err"; then
    echo "FAIL $name: no '$pattern' in output"; sed 's/^/  | /' "$TMP/out" "$TMP/err" | head -20
    fail=$((fail + 1)); return
  fi
  echo "ok   $name"
  pass=$((pass + 1))
}

# check_near NAME REF TOL REGEX -- command...: the first number after REGEX in
# the output lies within TOL of REF, a value from outside the project.
check_near() {
  name=$1; ref=$2; tol=$3; re=$4; shift 5
  "$@" >"$TMP/out" 2>"$TMP/err"
  got=$(awk -v re="$re" '{ i = re == "" ? 1 : index($0, re); if (!i) next
         s = substr($0, i + length(re)); if (match(s, /-?[0-9][0-9.]*([eE][-+]?[0-9]+)?/)) {
         print substr(s, RSTART, RLENGTH); exit } }' "$TMP/out")
  if [ -n "$got" ] && awk -v g="$got" -v r="$ref" -v t="$tol" 'BEGIN { d = g - r; if (d < 0) d = -d; exit !(d <= t) }'; then
    echo "ok   $name ($got, reference $ref +- $tol)"; pass=$((pass + 1))
  else
    echo "FAIL $name: got '$got', reference $ref +- $tol"; sed 's/^/  | /' "$TMP/out" "$TMP/err" | head -10
    fail=$((fail + 1))
  fi
}

check help 0 "exit codes" -- "$EQP" --help
check version 0 "equipoise 0.1.0" -- "$EQP" --version
check no_args 2 "usage" -- "$EQP"
check bad_command 2 "unknown command" -- "$EQP" frobnicate
check bad_option 2 "unknown option '--frob'" -- "$EQP" run "$CASES/params.lua" --frob
check missing_script 2 "cannot open" -- "$EQP" run "$TMP/nope.lua"
check bad_param 2 "NAME=VALUE" -- "$EQP" run "$CASES/params.lua" --param acid

# the demo and the published standards (Buck et al. 2002) through the command
check demo 0 "after 2 mmol HCl" -- "$EQP" run "$SRC/scripts/examples/demo.lua"
check demo_caution 0 "caution: HCl (hydrochloric acid): skin corrosion" -- "$EQP" run "$SRC/scripts/examples/demo.lua"
check iupac_standards 0 "all within 0.02 pH" -- "$EQP" run "$SRC/tests/published/iupac_standards.lua"
# the buffer catalogue, metal complexes, chelators and gases against published
# values (sources named beside each check in the script)
check catalogue 0 "all catalogue checks passed" -- "$EQP" run "$SRC/tests/published/catalogue.lua"
# the solids: gypsum, calcite in air, saturated Ca(OH)2 and a calcium
# phosphate mixture against published values (sources beside each check)
check solids 0 "all solids checks passed" -- "$EQP" run "$SRC/tests/published/solids.lua"
check solids_library 0 "ok solids library" -- "$EQP" run "$CASES/solids_library.lua"
check calcium_phosphate_brushite 0 "calcium_phosphate.lua:6: brushite (CaHPO4.2H2O) is supersaturated" -- "$EQP" run "$CASES/calcium_phosphate.lua"
check calcium_phosphate_apatite 0 "calcium_phosphate.lua:6: hydroxyapatite (Ca5(PO4)3OH) is supersaturated" -- "$EQP" run "$CASES/calcium_phosphate.lua"
"$EQP" run "$CASES/calcium_phosphate.lua" --json >"$TMP/caphos.json" 2>/dev/null
for solid in "brushite (CaHPO4.2H2O)" "hydroxyapatite (Ca5(PO4)3OH)"; do
  check "calcium_phosphate_json $solid" 0 "$solid is supersaturated" -- sh -c "for i in 0 1 2 3 4 5 6 7 8 9; do '$JSON' warnings.\$i < '$TMP/caphos.json' 2>/dev/null; done; true"
done
check result_fields 0 "^ok" -- "$EQP" run "$CASES/result_fields.lua"
check inline_species 0 "pH 5.500" -- "$EQP" run "$CASES/inline_species.lua"
# 0.025 m KH2PO4 + 0.025 m Na2HPO4 and 0.008695 m + 0.03043 m are the IUPAC
# primary phosphate standards, pH(S) 6.865 and 7.413 at 25 C (Buck et al.,
# Pure Appl. Chem. 74, 2169 (2002)); the design bar is 0.02 pH
check_near params 6.865 0.02 "pH" -- "$EQP" run "$CASES/params.lua"
check_near params_set 7.413 0.02 "pH" -- "$EQP" run "$CASES/params.lua" --param acid="8.695 mmol" --param base=30.43mmol
check high_ionic_warning 0 "beyond the stated range of the 'davies'" -- "$EQP" run "$CASES/high_ionic.lua"

# bad input: message with the script's file and line, documented exit code
check unknown_reagent 3 "unknown_reagent.lua:3: unknown reagent 'NaCL' (did you mean 'NaCl'?)" -- "$EQP" run "$CASES/unknown_reagent.lua"
check unitless 3 "unitless.lua:2: amount of NaCl: 10 has no unit" -- "$EQP" run "$CASES/unitless.lua"
check negative 3 "negative.lua:3: amount of KCl: '-5 mmol' is negative" -- "$EQP" run "$CASES/negative.lua"
check negative_keeps_output 3 "before the error" -- "$EQP" run "$CASES/negative.lua"
check bad_unit 3 "unknown unit 'furlongs'" -- "$EQP" run "$CASES/bad_unit.lua"
check mismatched_unit 3 "'2 kg' is a mass (kg, g, mg, ug), expected a volume" -- "$EQP" run "$CASES/mismatched_unit.lua"
check charged_species 3 "'Na+' is a charged species, not a reagent" -- "$EQP" run "$CASES/charged_species.lua"
check unknown_option 3 "unknown option 'temprature'" -- "$EQP" run "$CASES/unknown_option.lua"
check strict_recipe 3 "strict_recipe.lua:3: eq.recipe: unknown option 'temprature' (did you mean 'temperature'?)" -- "$EQP" run "$CASES/strict_recipe.lua"
check strict_keeps_output 3 "before the error" -- "$EQP" run "$CASES/strict_recipe.lua"
check strict_hot_recipe 3 "strict_hot_recipe.lua:2: eq.recipe: temperature 500 C is outside 0..100 C" -- "$EQP" run "$CASES/strict_hot_recipe.lua"
check strict_nul 3 "strict_nul.lua:3: add: the reagent: 'NaCl' is followed by a NUL character" -- "$EQP" run "$CASES/strict_nul.lua"
check bad_species_line 4 "bad_species.lua:6: acids\[2\].pKa" -- "$EQP" run "$CASES/bad_species_file.lua" --param dir="$CASES"
check bad_species_line2 4 "bad_species.lua:9: unknown species 'Y-'" -- "$EQP" run "$CASES/bad_species_file.lua" --param dir="$CASES"
check missing_plugin 6 "no activity model 'no-such-model'" -- "$EQP" run "$CASES/missing_plugin.lua"
check syntax_error 1 "syntax_error.lua:3:" -- "$EQP" run "$CASES/syntax_error.lua"
check runtime_error 1 "runtime_error.lua:3: attempt to perform arithmetic" -- "$EQP" run "$CASES/runtime_error.lua"
check no_traceback 1 "" -- "$EQP" run "$CASES/runtime_error.lua"
if grep -q "stack traceback" "$TMP/err"; then echo "FAIL traceback shown without --verbose"; fail=$((fail + 1)); fi
check traceback_verbose 1 "stack traceback" -- "$EQP" run "$CASES/runtime_error.lua" --verbose

# JSON for automation
"$EQP" run "$CASES/params.lua" --json >"$TMP/j1"; code=$?
check json_valid 0 "ok" -- "$JSON" status < "$TMP/j1"
check_near json_pH 6.865 0.02 "" -- "$JSON" results.0.pH < "$TMP/j1"    # Buck et al. 2002, as above
check json_output 0 "^pH [0-9]" -- "$JSON" output.0 < "$TMP/j1"
check json_provenance 0 "phosphate.lua" -- sh -c "grep -o 'species/phosphate.lua' '$TMP/j1'"
check json_caution 0 "calibrated meter" -- "$JSON" cautions.0 < "$TMP/j1"
# the provenance names each constant used, with its source (Goldberg et al. 2002)
check json_constants 0 "H2PO4- ⇌ H+ + HPO4^2-" -- grep -o '"equation":[[:space:]]*"H2PO4- ⇌ H+ + HPO4^2-"' "$TMP/j1"
check json_constants_source 0 "Goldberg" -- grep -A12 '"equation":[[:space:]]*"H2PO4- ⇌ H+ + HPO4^2-"' "$TMP/j1"
[ "$code" -eq 0 ] || { echo "FAIL json exit $code"; fail=$((fail + 1)); }
"$EQP" run "$CASES/negative.lua" --json >"$TMP/j2"; code=$?
check json_error_status 0 "error" -- "$JSON" status < "$TMP/j2"
check json_error_message 0 "negative.lua:3:" -- "$JSON" error < "$TMP/j2"
check json_error_code 0 "^3$" -- "$JSON" exit_code < "$TMP/j2"
check json_error_keeps_output 0 "before the error" -- "$JSON" output.0 < "$TMP/j2"
[ "$code" -eq 3 ] || { echo "FAIL json error exit $code"; fail=$((fail + 1)); }

# the library from the command line
check species_list 0 "KH2PO4" -- "$EQP" species list
check species_show 0 "goldberg\|Goldberg" -- "$EQP" species show H2PO4-
check species_show_unknown 3 "no species, reagent, buffer system, solid or gas named 'Nope'" -- "$EQP" species show Nope
# entries read as a chemist writes them: the second dissociation of phosphoric
# acid with its pKa, Goldberg, Kishore & Lennen, J. Phys. Chem. Ref. Data 31,
# 231 (2002), 7.198 at 25 C; at 37 C from their temperature equation with
# dH 3.6 kJ/mol and dCp -230 J/(K mol), computed here independently
pK37=$(awk 'BEGIN { R = 8.314462618 * log(10); t = 298.15; T = 310.15
  printf "%.3f", 7.198 + 3600 / R * (1 / T - 1 / t) + 230 / R * (t / T - 1 + log(T / t)) }')
check species_show_pKa 0 "H2PO4- ⇌ H+ + HPO4^2-   pKa 7.198 at 25 °C, ΔrH° 3.6 kJ/mol" -- "$EQP" species show H2PO4-
check species_show_37 0 "at 37 °C: pKa $pK37 (van't Hoff)" -- "$EQP" species show H2PO4- --temperature 37
check species_show_kelvin 0 "at 37 °C: pKa $pK37" -- "$EQP" species show H2PO4- --temperature "310.15 K"
check species_show_no_components 0 "" -- "$EQP" species show H3PO4
if grep -q "basis\|component" "$TMP/out"; then echo "FAIL species show speaks of components"; fail=$((fail + 1)); fi
# solids with log Ksp and gases with log K_H (Plummer & Busenberg 1982: -8.48, -1.468)
check species_show_solid 0 "CaCO3(s) ⇌ Ca^2+ + CO3^2-   log Ksp -8.48 at 25 °C" -- "$EQP" species show calcite
check species_show_gas 0 "CO2(g) ⇌ CO2   log K_H -1.468 at 25 °C" -- "$EQP" species show "CO2(g)"
check species_show_buffer 0 "made from NaH2PO4 (acid form) and Na2HPO4 (base form)" -- "$EQP" species show phosphate
check species_show_buffer_step 0 "H2PO4- ⇌ H+ + HPO4^2-" -- "$EQP" species show phosphate
check species_show_water 0 "H2O ⇌ H+ + OH-   pKw 13.995" -- "$EQP" species show OH-
"$EQP" species show H2PO4- --json --temperature 37 >"$TMP/show.json"
check species_show_json 0 "^H2PO4- ⇌ H+ + HPO4^2-$" -- "$JSON" entries.0.reactions.1.equation < "$TMP/show.json"
check species_show_json_37 0 "^$pK37$" -- sh -c "'$JSON' entries.0.reactions.1.values.1.value < '$TMP/show.json' | awk '{ printf \"%.3f\\n\", \$1 }'"
check species_show_json_source 0 "Goldberg" -- "$JSON" entries.0.reactions.1.source < "$TMP/show.json"
"$EQP" species list --json >"$TMP/list.json"
check species_list_json_solid 0 "^calcite$" -- "$JSON" solids.0.name < "$TMP/list.json"
check species_list_json_gas 0 "CO2(g)" -- sh -c "for i in 0 1 2 3 4 5; do '$JSON' gases.\$i.name < '$TMP/list.json'; done; true"
check species_list_text 0 "sodium dihydrogen phosphate" -- "$EQP" species list
check species_list_solids 0 "calcite" -- "$EQP" species list
check species_list_bogus 2 "unknown option '--bogus' for 'species list'" -- "$EQP" species list --bogus
check species_show_bogus 2 "unknown option '--bogus'" -- "$EQP" species show H2PO4- --bogus
check species_show_no_name 2 "takes one argument" -- "$EQP" species show
check species_show_bad_T 3 "temperature" -- "$EQP" species show H2PO4- --temperature 150
check plugins_bogus 2 "'plugins' takes no arguments ('--bogus')" -- "$EQP" plugins --bogus
check species_unknown_command 2 "unknown species command 'lsit'" -- "$EQP" species lsit
check describe_lua 0 "at 37 °C: pKa $pK37" -- "$EQP" run "$CASES/describe.lua"
check describe_lua_option 3 "unknown option 'temprature'" -- "$EQP" run "$CASES/describe.lua" --param bad=1
check species_check_good 0 "ok, 2 species added" -- "$EQP" species check "$CASES/good_species.lua"
# a metal complex without its conditions: a warning at its line, exit 0
check species_check_conditions 0 "complex_no_conditions.lua:7: log K of CaOHq+ has no conditions" -- "$EQP" species check "$CASES/complex_no_conditions.lua"
# IUPAC charge notation (number then sign after a caret); Unicode accepted
check notation_unicode 3 "ok notation" -- "$EQP" run "$CASES/notation.lua"
check notation_old_style 3 "notation.lua:17: unknown species 'HPO4-2' (did you mean 'HPO4^2-'?" -- "$EQP" run "$CASES/notation.lua"
check supersaturated_warns 0 "supersaturated.lua:5: calcite (CaCO3) is supersaturated" -- "$EQP" run "$CASES/supersaturated.lua"
check supersaturated_json 0 "calcite (CaCO3) is supersaturated" -- sh -c "'$EQP' run '$CASES/supersaturated.lua' --json | '$JSON' warnings.0"
check print_replaced 0 "Check with a pH meter" -- "$EQP" run "$CASES/print_replaced.lua"
check notation_more 0 "ok notation more" -- "$EQP" run "$CASES/notation_more.lua"
check notation_total_hint 3 "not a component (did you mean 'Na+'?" -- "$EQP" run "$CASES/notation_total.lua"
check notation_show_solid_formula 0 "aragonite" -- "$EQP" species show "CaCO3(s)"
check notation_show_unicode 0 "HPO4^2-" -- "$EQP" species show "HPO₄²⁻"
check notation_show_unicode_gas 0 "CO2(g) ⇌ CO2   log K_H" -- "$EQP" species show "CO₂(g)"
check notation_show_old_style 3 "named 'HPO4-2' (did you mean 'HPO4^2-'?" -- "$EQP" species show HPO4-2
check notation_show_old_style_ion 3 "(did you mean 'Ca^2+'?" -- "$EQP" species show Ca+2
check notation_file_old 4 "old.lua:7: .*write 'X^2-'" -- "$EQP" species check "$CASES/old_notation/old.lua"
check notation_file_formula 4 "write 'SeO4^2-'" -- "$EQP" species check "$CASES/old_notation/old.lua"
# a FIFO is refused at once, not waited on; a UTF-8 byte-order mark is read past
mkfifo "$TMP/fifo.lua" && check species_check_fifo 4 "not a regular file" -- timeout 120 "$EQP" species check "$TMP/fifo.lua"
printf '\357\273\277' > "$TMP/bom.lua" && cat "$CASES/good_species.lua" >> "$TMP/bom.lua"
check species_check_bom 0 "ok, 2 species added" -- "$EQP" species check "$TMP/bom.lua"
check species_check_bad 4 "bad_species.lua:6:" -- "$EQP" species check "$CASES/bad_species.lua"
check plugins 0 "davies" -- "$EQP" plugins

# a hazardous reagent's caution, once per run, whichever way it came in
for path in add adjust titrate budget recipe pour mix; do
  "$EQP" run "$CASES/caution_paths.lua" --param path=$path >"$TMP/cp.out" 2>"$TMP/cp.err"
  n=$(grep -c "^caution: NaOH (sodium hydroxide): skin corrosion" "$TMP/cp.err")
  "$EQP" run "$CASES/caution_paths.lua" --param path=$path --json >"$TMP/cp.json" 2>/dev/null
  nj=$(grep -c '"NaOH (sodium hydroxide): skin corrosion' "$TMP/cp.json")
  if [ "$n" = 1 ] && [ "$nj" = 1 ]; then echo "ok   caution_$path"; pass=$((pass + 1))
  else echo "FAIL caution_$path: $n cautions for NaOH in text, $nj in JSON (want 1 each)"; fail=$((fail + 1)); fi
done

# loading that forgives what it should: the same file twice, a table whose
# metamethods raise, a broken file in the user's folder, a replaced system
check load_twice 0 "loaded twice ok" -- "$EQP" run "$CASES/load_twice.lua" --param species="$SRC/species"
check inline_metatable 0 "inline metatable ok" -- "$EQP" run "$CASES/inline_metatable.lua"
# a library for one solution; the IUPAC phosphate standard with only the phosphate
# system loaded, pH(S) 6.865 at 25 C (Buck et al., Pure Appl. Chem. 74, 2169 (2002))
check library_option 0 "library ok" -- "$EQP" run "$CASES/library_option.lua"
check_near library_only 6.865 0.02 "phosphate pH" -- "$EQP" run "$CASES/library_option.lua"
# the constants of a solution's own library reach the run's provenance
check inline_species_json 0 "HZ ⇌ H+ + Z-" -- "$EQP" run "$CASES/inline_species.lua" --json
U=$TMP/xdg/equipoise/species
mkdir -p "$U" "$TMP/edit" "$TMP/xdg2/equipoise/species"
cat >"$U/mine.lua" <<'LUA'
return {
  species = { { "Zq+", formula = "Na+" } },
  reagents = { { "ZqCl", formula = "NaCl", gives = { ["Zq+"] = 1, ["Cl-"] = 1 }, hazards = { "corossive" } } },
}
LUA
printf 'return {\n  species = { { "Yq+", formula = "K+" } }\n' >"$U/typo.lua"   # a syntax error
sed 's/corossive/skin-corrosion/' "$U/mine.lua" >"$TMP/edit/mine.lua"
# the run still gives the phosphate standard, pH(S) 6.865 (Buck et al. 2002, as above)
check_near user_broken_run 6.865 0.02 "pH" -- env XDG_DATA_HOME="$TMP/xdg" "$EQP" run "$CASES/params.lua"
check user_broken_warns 0 "warning: species file .*typo.lua was left out" -- env XDG_DATA_HOME="$TMP/xdg" "$EQP" run "$CASES/params.lua"
check user_broken_needed 3 "unknown reagent 'ZqCl': it is defined in .*mine.lua" -- env XDG_DATA_HOME="$TMP/xdg" "$EQP" run "$CASES/needs_user.lua"
check user_broken_list 0 "KH2PO4" -- env XDG_DATA_HOME="$TMP/xdg" "$EQP" species list
check user_broken_list_warns 0 "warning: species file .*mine.lua" -- env XDG_DATA_HOME="$TMP/xdg" "$EQP" species list
check user_broken_check 4 "mine.lua:3: reagents\[1\].hazards\[1\]: unknown hazard class 'corossive'" -- env XDG_DATA_HOME="$TMP/xdg" "$EQP" species check "$U/mine.lua"
check user_edited_check 0 "ok, 1 species added" -- env XDG_DATA_HOME="$TMP/xdg" "$EQP" species check "$TMP/edit/mine.lua"
sed 's/"KHP" }/"KHP", "our KHP" }/' "$SRC/species/phthalate.lua" >"$TMP/xdg2/equipoise/species/phthalate.lua"
check user_replaces 0 "phthalate.lua replaces the built-in" -- env -u EQUIPOISE_SPECIES_PATH XDG_DATA_HOME="$TMP/xdg2" "$EQP" species list
check user_replaced_value 0 "our KHP" -- env -u EQUIPOISE_SPECIES_PATH XDG_DATA_HOME="$TMP/xdg2" "$EQP" species show "our KHP"
check library_check 0 "phosphate.lua: ok, " -- "$EQP" species check "$SRC/species/phosphate.lua"

# temperature and models
check example_temperature 0 "sit" -- "$EQP" run "$SRC/scripts/examples/temperature_models.lua"
check standards_table 0 "| dh-extended |" -- "$EQP" run "$SRC/tests/published/standards_table.lua"
check set_temperature_bad 3 "outside 0..100 C" -- "$EQP" run "$CASES/bad_temperature.lua"
check activity_param_bad 6 "unknown parameter 'kappa'" -- "$EQP" run "$CASES/bad_activity_param.lua"

# the plugin ABI from outside: build plugins with the compiler alone
mkdir -p "$TMP/plugins"
for p in guntelberg bad_abi truncated; do
  cc -shared -fPIC -O2 -I"$SRC/engine/include" "$SRC/tests/plugins/$p.c" -o "$TMP/plugins/$p.so" -lm ||
    { echo "FAIL cannot build $p out of tree"; fail=$((fail + 1)); }
done
check outside_plugin 0 "outside plugin ok" -- env EQUIPOISE_PLUGIN_PATH="$TMP/plugins" "$EQP" run "$CASES/outside_plugin.lua"
check outside_listed 0 "$TMP/plugins/guntelberg.so" -- env EQUIPOISE_PLUGIN_PATH="$TMP/plugins" "$EQP" plugins
check outside_bad_abi 6 "plugin ABI 2.0, this engine needs 1.x" -- env EQUIPOISE_PLUGIN_PATH="$TMP/plugins" "$EQP" run "$CASES/outside_plugin.lua" --param model=bad_abi
check outside_truncated 6 "descriptor is" -- env EQUIPOISE_PLUGIN_PATH="$TMP/plugins" "$EQP" run "$CASES/outside_plugin.lua" --param model=truncated
check outside_refused_listed 0 "(refused)" -- env EQUIPOISE_PLUGIN_PATH="$TMP/plugins" "$EQP" plugins

# experiments: volumes, titrations, capacity, adjustment, recipes
EX=$SRC/scripts/examples
check ex_exchange 0 "after round 2 .*Tris 0.200 mM" -- "$EQP" run "$EX/protein_buffer_exchange.lua"
# HEPES from 22 to 37 C: van't Hoff with dH = 20.4 kJ/mol (Goldberg, Kishore &
# Lennen, J. Phys. Chem. Ref. Data 31, 231 (2002); from memory) moves pKa by -0.175
check_near ex_warming -0.175 0.01 "shift" -- "$EQP" run "$EX/culture_medium_warming.lua"
# 0.85 mmol of acid and 0.1 M NaOH: 8.500 mL by stoichiometry
check ex_unknown_acid 0 "equivalence at 8.500 mL" -- "$EQP" run "$EX/unknown_acid.lua" --param csv="$TMP/curve.csv" --allow-write "$TMP"
check ex_unknown_csv 0 "amount,volume,total_volume,pH,slope,CH3COO-" -- head -1 "$TMP/curve.csv"
check ex_recipe 0 "re-made from the printed amounts: pH 7.40" -- "$EQP" run "$EX/physiological_recipe.lua"
check ex_recipe_caution 0 "Check with a pH meter" -- "$EQP" run "$EX/physiological_recipe.lua"
check ex_assay 0 "best: " -- "$EQP" run "$EX/enzyme_assay_buffer.lua"
# 26 mM HCO3- under 5 % CO2 (38.0 mmHg) at 37 C: pH = 6.1 + log10(26 / (0.0307 x 38.0))
# = 7.45 by the clinical Henderson-Hasselbalch form (pK' 6.1, CO2 solubility
# 0.0307 mM/mmHg; common practice); activity and ionic strength account for 0.1
check_near ex_incubator 7.45 0.1 "pH" -- "$EQP" run "$EX/incubator_air.lua"
check ex_incubator_text 0 "in the incubator (5 % CO2, 37 C)" -- "$EQP" run "$EX/incubator_air.lua"
check expose_bad_unit 3 "is a volume" -- "$EQP" run "$CASES/expose_bad.lua"
check sealed_vial 0 "ok sealed: pCO2 0.368 atm" -- "$EQP" run "$CASES/sealed_vial.lua"
check sealed_vial_caution 0 "caution: sealed vessel: gas evolution" -- "$EQP" run "$CASES/sealed_vial.lua"
check sealed_vial_json 0 "^0.367" -- sh -c "'$EQP' run '$CASES/sealed_vial.lua' --json | '$JSON' results.1.headspace.gases.0.pressure"
check expose_pressure 0 "expose_pressure.lua:5: CO2(g) at 5 atm: beyond 2 atm Henry's law" -- "$EQP" run "$CASES/expose_pressure.lua"
check expose_temperature 0 "expose_pressure.lua:8: Henry's law constant of CO2(g) used outside the temperature range" -- "$EQP" run "$CASES/expose_pressure.lua"
check seal_bad_option 3 "seal_bad.lua:2: seal: unknown option 'headspce' (did you mean 'headspace'?)" -- "$EQP" run "$CASES/seal_bad.lua"
check seal_bad_gas 3 "seal_bad_gas.lua:2: seal: unknown gas 'C02(g)' (did you mean 'CO2(g)'?)" -- "$EQP" run "$CASES/seal_bad_gas.lua"
check recipe_remake 0 "all recipes re-made" -- "$EQP" run "$CASES/recipe_remake.lua"
check ten_lines 0 "capacity" -- "$EQP" run "$CASES/ten_lines.lua"
check adjust_unreachable 3 "adjust_unreachable.lua:3: pH 10.000 is out of reach with HCl" -- "$EQP" run "$CASES/adjust_unreachable.lua"
check titrate_bad_end 3 "needs an end" -- "$EQP" run "$CASES/titrate_no_end.lua"
"$EQP" run "$EX/unknown_acid.lua" --json --param csv="$TMP/c2.csv" --allow-write "$TMP" >"$TMP/j3"
check json_saturation 0 "^[0-9.-]" -- sh -c "'$EQP' run '$CASES/calcite.lua' --json | '$JSON' results.0.saturation_index.calcite"
# provenance names the constants behind a titration that made no result:
# acetic acid's pKa with its source (Goldberg, Kishore & Lennen 2002)
check json_provenance_titration 0 "^CH3COOH ⇌ H+ + CH3COO-$" -- "$JSON" provenance.constants.0.equation < "$TMP/j3"
check json_provenance_source 0 "Goldberg" -- "$JSON" provenance.constants.0.source < "$TMP/j3"
check json_provenance_parameters 0 "ion_size" -- "$JSON" provenance.parameters.0.name < "$TMP/j3"
check json_curve 0 "^1$" -- "$JSON" curves.0.equivalence_points < "$TMP/j3"
# acetate at the equivalence point: C = 0.85 mmol / 58.5 mL; a(OH-) = g sqrt(Kb C),
# Kb = Kw/Ka, pKa 4.756 (Goldberg et al. 2002, from memory), pKw 13.995 (IAPWS
# R11-07), Davies g with A = 0.5108 at I = C: pH 8.404 (closed form)
check_near json_curve_pH 8.404 0.01 "" -- "$JSON" curves.0.equivalence_points.0.pH < "$TMP/j3"
# every point carries its sharpness (a number; >= 2 by the rule of docs/methods.md)
check json_curve_sharpness 0 "^[0-9]" -- "$JSON" curves.0.equivalence_points.0.sharpness < "$TMP/j3"

# warnings of titrations and pH adjustments, beside the line that made them:
# in the text, the JSON document, the stream and the report; each kind once
# per line, however many points the titration has
"$EQP" run "$CASES/warn_paths.lua" >"$TMP/wp.out" 2>"$TMP/wp.err"; code=$?
n=$(grep -c "^warning: .*warn_paths.lua:5: ionic strength .* beyond the stated range of the 'davies'" "$TMP/wp.err")
if [ "$code" -eq 0 ] && [ "$n" = 1 ]; then echo "ok   warn_titration_text"; pass=$((pass + 1))
else echo "FAIL warn_titration_text: exit $code, $n warnings for line 5 (want 1)"; sed 's/^/  | /' "$TMP/wp.err" | head; fail=$((fail + 1)); fi
check warn_adjust_text 0 "warn_paths.lua:6: pH adjustment to 5.00 with NaOH: ionic strength" -- "$EQP" run "$CASES/warn_paths.lua"
"$EQP" run "$CASES/warn_paths.lua" --json >"$TMP/wp.json"
check warn_titration_json 0 "warn_paths.lua:5: ionic strength" -- "$JSON" warnings.0 warnings.1 warnings.2 warnings.3 < "$TMP/wp.json"
check warn_adjust_json 0 "warn_paths.lua:6: pH adjustment" -- "$JSON" warnings.0 warnings.1 warnings.2 warnings.3 < "$TMP/wp.json"
"$EQP" run "$CASES/warn_paths.lua" --jsonl >"$TMP/wp.jsonl"
check warn_jsonl 0 '"type":"warning","where":"[^"]*warn_paths.lua:5","kind":"ionic-strength"' -- cat "$TMP/wp.jsonl"
"$EQP" run "$CASES/warn_paths.lua" --report "$TMP/wp.html" >/dev/null 2>&1
check warn_report 0 "warn_paths.lua:6: pH adjustment to 5.00 with NaOH" -- cat "$TMP/wp.html"
# a usage error before the script is named, in the streamed form
check json_jsonl_usage 2 '"exit_code":2' -- "$EQP" run --jsonl

# the same module in a stock lua5.4
if command -v lua5.4 >/dev/null; then
  # a sanitizer build's module needs the sanitizer runtime loaded first
  pre=""
  if ldd "$BUILD/lua/equipoise.so" 2>/dev/null | grep -q libasan; then
    pre="$(gcc -print-file-name=libasan.so) $(gcc -print-file-name=libubsan.so)"
  fi
  check stock_lua5.4 0 "stock lua ok" -- env LD_PRELOAD="$pre" ASAN_OPTIONS=detect_leaks=0 \
    LUA_CPATH="$BUILD/lua/?.so;;" lua5.4 "$CASES/stock_lua.lua"
else
  echo "FAIL stock_lua5.4: no lua5.4 interpreter (scripts/setup.sh installs it)"; fail=$((fail + 1))
fi

echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
