#!/bin/sh
# The JSON documents of the command against docs/equipoise-output.schema.json
# (python3-jsonschema), on the --json output of every example in
# scripts/examples/, of a failing run, every record of a --jsonl run, and of
# `species show` and `species list`; and the table of names shared by
# docs/lua-api.md and docs/json-output.md, which must be the same in both.
# Usage: run.sh EQUIPOISE SOURCE_DIR
set -u
EQP=$(cd "$(dirname "$1")" && pwd)/$(basename "$1"); SRC=$2
# Debian's python3-jsonschema lives beside /usr/bin/python3, which another
# python3 earlier on PATH (pyenv, a venv) would not see
PY=${PYTHON:-$( [ -x /usr/bin/python3 ] && echo /usr/bin/python3 || echo python3 )}
SCHEMA=$SRC/docs/equipoise-output.schema.json
DOC=$SRC/docs/json-output.md
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail=0

if ! "$PY" -c "import jsonschema" 2>/dev/null; then
  echo "FAIL python3-jsonschema is not installed: run scripts/setup.sh"
  exit 1
fi

# every example, run where it may write its files
n=0
for ex in "$SRC"/scripts/examples/*.lua; do
  n=$((n + 1))
  out="$TMP/run$n.json"
  (cd "$TMP" && "$EQP" run "$ex" --json >"$out" 2>"$TMP/err$n")
  code=$?
  if [ "$code" -ne 0 ]; then
    echo "FAIL $(basename "$ex"): exit $code"; sed 's/^/  | /' "$TMP/err$n" | head -5
    fail=1
  fi
done
# a sealed vessel: the headspace of its results
(cd "$TMP" && "$EQP" run "$SRC/tests/e2e/cases/sealed_vial.lua" --json >"$TMP/run_sealed.json" 2>/dev/null)
# a run that fails half-way is one valid document too
"$EQP" run "$SRC/tests/e2e/cases/negative.lua" --json >"$TMP/run_error.json"
"$PY" "$SRC/tests/schema/validate.py" "$SCHEMA" run "$DOC" "$TMP"/run*.json || fail=1
# every line of a streamed run (--jsonl) is a record
(cd "$TMP" && "$EQP" run "$SRC/scripts/examples/unknown_acid.lua" --jsonl >"$TMP/stream.jsonl" 2>/dev/null)
(cd "$TMP" && "$EQP" run "$SRC/tests/e2e/cases/high_ionic.lua" --jsonl >>"$TMP/stream.jsonl")
(cd "$TMP" && "$EQP" run "$SRC/tests/e2e/cases/negative.lua" --jsonl >>"$TMP/stream.jsonl" 2>/dev/null)
mkdir -p "$TMP/lines"
awk -v dir="$TMP/lines" '{ f = sprintf("%s/line%04d.json", dir, NR); print > f; close(f) }' "$TMP/stream.jsonl"
"$PY" "$SRC/tests/schema/validate.py" "$SCHEMA" record "$DOC" "$TMP"/lines/*.json || fail=1

for name in H2PO4- OH- phosphate Tris calcite "CO2(g)" Na2HPO4.7H2O "sodium acetate" CH3COOH \
            CaEDTA^2- MgP2O7^2-; do
  n=$((n + 1))
  "$EQP" species show "$name" --json --temperature 37 >"$TMP/show$n.json" || fail=1
done
"$PY" "$SRC/tests/schema/validate.py" "$SCHEMA" description "$DOC" "$TMP"/show*.json || fail=1
"$EQP" species list --json >"$TMP/list.json" || fail=1
"$PY" "$SRC/tests/schema/validate.py" "$SCHEMA" listing "$DOC" "$TMP/list.json" || fail=1

# the names table is one table, written twice
table() { sed -n '/<!-- names: begin -->/,/<!-- names: end -->/p' "$1"; }
table "$SRC/docs/lua-api.md" >"$TMP/t1"
table "$DOC" >"$TMP/t2"
if [ ! -s "$TMP/t1" ] || ! cmp -s "$TMP/t1" "$TMP/t2"; then
  echo "FAIL the names tables of docs/lua-api.md and docs/json-output.md differ:"
  diff "$TMP/t1" "$TMP/t2" | head -20 | sed 's/^/  | /'
  fail=1
else
  echo "ok   names table: docs/lua-api.md = docs/json-output.md"
fi
[ "$fail" -eq 0 ]
