#!/bin/sh
# Build and run the benchmarks; prints the figures. Optional argument: the
# number of warm solves (default 20000).
set -eu
cd "$(dirname "$0")/.."
scripts/setup.sh build
export EQUIPOISE_SPECIES_PATH="$PWD/species"
./build/tests/bench_phosphate "${1:-20000}" ./build/equipoise tests/bench/warm.lua
./build/equipoise run tests/bench/titration.lua 2>/dev/null
if command -v valgrind >/dev/null; then tests/bench/lua_overhead.sh build; fi
