#!/bin/sh
# For each example experiment, the C program of tests/examples_c/ and the Lua
# script of scripts/examples/ give identical results (compare.py).
# Usage: run.sh EQUIPOISE SOURCE_DIR BIN_DIR (where the C programs are)
set -u
EQP=$1; SRC=$2; BIN=$3
PY=${PYTHON:-$( [ -x /usr/bin/python3 ] && echo /usr/bin/python3 || echo python3 )}
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail=0; n=0
for ex in "$SRC"/scripts/examples/*.lua; do
  name=$(basename "$ex" .lua)
  n=$((n + 1))
  if [ ! -x "$BIN/example_$name" ]; then
    echo "FAIL $name: no C program (tests/examples_c/$name.c)"; fail=1; continue
  fi
  mkdir -p "$TMP/$name/lua" "$TMP/$name/c"
  (cd "$TMP/$name/lua" && "$EQP" run "$ex" --json >doc.json 2>err.txt)
  code=$?
  (cd "$TMP/$name/c" && "$BIN/example_$name" record.jsonl >out.txt 2>err.txt)
  ccode=$?
  if [ "$code" -ne 0 ] || [ "$ccode" -ne 0 ]; then
    echo "FAIL $name: exit $code (Lua), $ccode (C)"
    sed 's/^/  | /' "$TMP/$name/lua/err.txt" "$TMP/$name/c/err.txt" | head -5
    fail=1; continue
  fi
  rm -f "$TMP/$name/lua/err.txt" "$TMP/$name/c/err.txt"
  "$PY" "$SRC/tests/examples_c/compare.py" "$name" "$TMP/$name/lua" "$TMP/$name/c" || fail=1
done
[ "$n" -gt 0 ] || { echo "FAIL no examples"; fail=1; }
exit $fail
