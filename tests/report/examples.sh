#!/bin/sh
# Every example experiment runs with --report: it exits 0, writes its
# figures and a report that embeds at least one figure.
# Usage: examples.sh EQUIPOISE SOURCE_DIR
set -u
EQP=$1; SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
pass=0; fail=0
for ex in "$SRC"/scripts/examples/*.lua; do
  name=$(basename "$ex" .lua)
  dir="$TMP/$name"; mkdir -p "$dir"
  if ! out=$(cd "$dir" && "$EQP" run "$ex" --report report.html 2>&1 >/dev/null); then
    echo "FAIL $name: exit $?"; echo "$out" | sed 's/^/  | /' | head -10
    fail=$((fail + 1)); continue
  fi
  figs=$(find "$dir" -maxdepth 1 \( -name '*.svg' -o -name '*.png' -o -name '*.pdf' \) | wc -l)
  embedded=$(sed -n 's/.*data-plots="\([0-9]*\)".*/\1/p' "$dir/report.html" 2>/dev/null)
  svgs=$(grep -o '<svg class="plot"' "$dir/report.html" 2>/dev/null | wc -l)
  if [ "$figs" -ge 1 ] && [ "${embedded:-0}" -ge 1 ] && [ "$svgs" -eq "${embedded:-0}" ] &&
     grep -q 'id=provenance' "$dir/report.html" && grep -q 'id=procedure' "$dir/report.html"; then
    echo "ok   $name: $figs figure file(s), $embedded figure(s) in the report"
    pass=$((pass + 1))
  else
    echo "FAIL $name: $figs figure file(s), report embeds ${embedded:-none} ($svgs svg)"
    fail=$((fail + 1))
  fi
done
echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
