#!/bin/sh
# Install what is missing, build, and run the whole test suite twice: the
# normal build, then the AddressSanitizer + UndefinedBehaviorSanitizer build.
# The last line printed is ctest's summary of the sanitizer run.
set -eu
cd "$(dirname "$0")/.."
scripts/setup.sh build
scripts/setup.sh build-asan -DEQP_SANITIZE=ON -DCMAKE_BUILD_TYPE=Debug
echo "== tests, normal build"
ctest --test-dir build --output-on-failure -j2
echo "== tests, sanitizer build"
ASAN_OPTIONS=detect_leaks=1:abort_on_error=1 UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir build-asan --output-on-failure -j2
