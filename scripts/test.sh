#!/bin/sh
# Install what is missing, build, and run the whole test suite twice: the
# normal build, then the AddressSanitizer + UndefinedBehaviorSanitizer build.
# The last line printed is ctest's summary of the sanitizer run.
set -eu
cd "$(dirname "$0")/.."
scripts/setup.sh build
scripts/setup.sh build-asan -DEQP_SANITIZE=ON -DCMAKE_BUILD_TYPE=Debug
# Headless Chromium renders the HTML report in one test. It is large, so it
# is installed here for the test suite, not by the set-up; without it (no
# root, no package) that one test is skipped with a message.
if ! command -v chromium >/dev/null 2>&1 && [ "$(id -u)" -eq 0 ]; then
  echo "test: installing chromium for the report's browser test" >&2
  { DEBIAN_FRONTEND=noninteractive apt-get update -qq &&
    DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium; } >/dev/null 2>&1 ||
    echo "test: chromium could not be installed; the browser test will be skipped" >&2
fi
echo "== tests, normal build"
ctest --test-dir build --output-on-failure -j2
echo "== tests, sanitizer build"
ASAN_OPTIONS=detect_leaks=1:abort_on_error=1 UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir build-asan --output-on-failure -j2
