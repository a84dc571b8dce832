#!/bin/sh
# Build and run the benchmarks; prints the figures.
set -eu
cd "$(dirname "$0")/.."
scripts/setup.sh build
EQUIPOISE_SPECIES_PATH="$PWD/species" ./build/tests/bench_phosphate "$@"
EQUIPOISE_SPECIES_PATH="$PWD/species" ./build/equipoise run tests/bench/titration.lua
if command -v valgrind >/dev/null; then tests/bench/lua_overhead.sh build; fi
