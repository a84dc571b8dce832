#!/bin/sh
# A long run (a capacity sweep of every buffer system) shows a progress line
# on stderr when stderr is a terminal (a pseudo-terminal from script(1)),
# and nothing when stderr is piped. A run that fails still writes its
# report, with the error. Usage: progress.sh EQUIPOISE SOURCE_DIR
set -u
EQP=$1; SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
cd "$TMP"
cat > long.lua <<'LUA'
local c = eq.capacity{ total = "50 mM", pH = { 4, 10 }, points = 301 }
print(#c .. " rows")
LUA
pass=0; fail=0
"$EQP" run long.lua > out.txt 2> err.txt
if [ -s err.txt ] || ! grep -q "301 rows" out.txt; then
  echo "FAIL: piped stderr is not silent"; cat -v err.txt | head -3; fail=$((fail + 1))
else
  echo "ok   piped: nothing on stderr"; pass=$((pass + 1))
fi
if command -v script >/dev/null 2>&1; then
  script -qec "$EQP run long.lua" /dev/null > tty.txt 2>&1
  if grep -q "buffer capacity: *[0-9]* %" tty.txt && grep -q "301 rows" tty.txt; then
    echo "ok   terminal: a progress line"; pass=$((pass + 1))
  else
    echo "FAIL: no progress line on a terminal"; cat -v tty.txt | head -3; fail=$((fail + 1))
  fi
else
  echo "skip terminal check: script(1) is not installed"
fi
"$EQP" run "$SRC/tests/e2e/cases/runtime_error.lua" --report failed.html >/dev/null 2>&1
code=$?
if [ "$code" -ne 0 ] && grep -q "The run stopped" failed.html; then
  echo "ok   a failed run (exit $code) still writes its report"; pass=$((pass + 1))
else
  echo "FAIL: no report of the failed run (exit $code)"; fail=$((fail + 1))
fi
echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
