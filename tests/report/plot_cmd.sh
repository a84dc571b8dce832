#!/bin/sh
# equipoise plot: each figure kind writes its file in the format its name
# asks for; bad requests exit with the documented codes (2 usage, 3 input).
# Usage: plot_cmd.sh EQUIPOISE SOURCE_DIR
set -u
EQP=$1; SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
cd "$TMP"
pass=0; fail=0
check() {   # expected-exit file-magic description -- command...
  want=$1; magic=$2; what=$3; shift 4
  "$@" > out.txt 2> err.txt
  got=$?
  if [ "$got" -ne "$want" ]; then
    echo "FAIL $what: exit $got, expected $want"; head -3 err.txt; fail=$((fail + 1)); return
  fi
  if [ -n "$magic" ] && ! head -c 8 "$OUT" | grep -q "$magic"; then
    echo "FAIL $what: $OUT is not $magic"; fail=$((fail + 1)); return
  fi
  echo "ok   $what"; pass=$((pass + 1))
}
OUT=d.svg; check 0 "<?xml" "distribution, SVG" -- "$EQP" plot distribution phosphate --ionic-strength 0.1 -o d.svg
OUT=c.png; check 0 "PNG" "capacity, PNG" -- "$EQP" plot capacity phosphate HEPES --total 50mM --window 7.1:7.3 --pH 6:8.5 -o c.png
printf 'pH,x\n1,2\n2,3\n3,5\n' > t.csv
OUT=t.pdf; check 0 "%PDF" "csv, PDF" -- "$EQP" plot csv t.csv -o t.pdf
OUT=; check 3 "" "unknown system" -- "$EQP" plot distribution nosuch -o x.svg
check 3 "" "unknown format" -- "$EQP" plot distribution phosphate -o x.gif
check 2 "" "unknown figure" -- "$EQP" plot bogus -o x.svg
check 2 "" "no output" -- "$EQP" plot distribution phosphate
check 2 "" "unknown option" -- "$EQP" plot distribution phosphate --colour red -o x.svg
printf 'pH,x\n1,oops\n' > bad.csv
check 3 "" "csv with text" -- "$EQP" plot csv bad.csv -o b.svg
[ ! -e x.svg ] && [ ! -e x.gif ] && [ ! -e b.svg ] || { echo "FAIL: a failed plot left a file"; fail=$((fail + 1)); }
echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
