#!/bin/sh
# What a solve costs through Lua beyond the same solve in C: instructions
# (callgrind) of `equipoise run` with N add+equilibrate steps and of the C
# loop, each less its own start-up (N = 0), per step.
# Usage: lua_overhead.sh BUILD_DIR [N]
set -eu
BUILD=$1; N=${2:-20000}
SRC=$(cd "$(dirname "$0")/../.." && pwd)
export EQUIPOISE_SPECIES_PATH=${EQUIPOISE_SPECIES_PATH:-$SRC/species}
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
refs() {
  valgrind --tool=callgrind --callgrind-out-file="$TMP/cg" "$@" 2>&1 >/dev/null |
    awk '/refs:/ { gsub(",", "", $NF); print $NF }'
}
lua0=$(refs "$BUILD/equipoise" run "$SRC/tests/bench/solve_loop.lua" --param n=0)
luaN=$(refs "$BUILD/equipoise" run "$SRC/tests/bench/solve_loop.lua" --param n="$N")
c0=$(refs "$BUILD/tests/solve_loop" 0)
cN=$(refs "$BUILD/tests/solve_loop" "$N")
awk -v l0="$lua0" -v ln="$luaN" -v c0="$c0" -v cn="$cN" -v n="$N" 'BEGIN {
  l = (ln - l0) / n; c = (cn - c0) / n
  printf "per add+equilibrate, %d steps (callgrind instructions, start-up subtracted):\n", n
  printf "  through Lua (equipoise run) %8.0f\n  in C                        %8.0f\n", l, c
  printf "  Lua overhead                %8.0f (%.1f %%)\n", l - c, 100 * (l - c) / c }'
