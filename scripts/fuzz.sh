#!/bin/sh
# Build the fuzz targets with clang and run each for SECONDS (default 60).
set -eu
cd "$(dirname "$0")/.."
secs=${1:-60}
scripts/setup.sh build >/dev/null    # packages
[ -f build-fuzz/CMakeCache.txt ] ||
  CC=clang cmake -S . -B build-fuzz -DEQP_FUZZ=ON -DEQP_TESTS=OFF -DCMAKE_BUILD_TYPE=RelWithDebInfo >/dev/null
cmake --build build-fuzz -j"$(nproc)" >/dev/null
mkdir -p build-fuzz/corpus-species build-fuzz/corpus-parsers
cp species/*.lua build-fuzz/corpus-species/
printf 'Na2HPO4.7H2O' > build-fuzz/corpus-parsers/a; printf '12.5 mmol' > build-fuzz/corpus-parsers/b
export ASAN_OPTIONS=detect_leaks=1
./build-fuzz/tests/fuzz/fuzz_parsers -max_total_time="$secs" build-fuzz/corpus-parsers
./build-fuzz/tests/fuzz/fuzz_species -max_total_time="$secs" -max_len=8192 build-fuzz/corpus-species
