#!/bin/sh
# Set-up on a fresh Debian 12 machine as root: install the Debian packages
# that are missing, configure and build. Quick when nothing changed.
# Usage: scripts/setup.sh [BUILD_DIR [extra cmake arguments]]
set -eu
cd "$(dirname "$0")/.."
build=${1:-build}
[ $# -gt 0 ] && shift

# plots: PLplot with its cairo driver, a font with sub- and superscript
# digits, libpng for the test that reads the report's screenshot
packages="build-essential cmake pkg-config liblua5.4-dev lua5.4 libsundials-dev libcmocka-dev libcjson-dev
  python3 python3-jsonschema libplplot-dev plplot-driver-cairo fonts-dejavu-core libpng-dev
  uthash-dev"
missing=""
for p in $packages; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing="$missing $p"
done
if [ -n "$missing" ]; then
  echo "setup: installing$missing" >&2
  if [ "$(id -u)" -ne 0 ]; then
    echo "setup: these Debian packages are missing and installing them needs root:$missing" >&2
    exit 1
  fi
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq $missing >/dev/null
fi

if [ ! -f "$build/CMakeCache.txt" ]; then
  cmake -S . -B "$build" -DCMAKE_BUILD_TYPE=RelWithDebInfo "$@" >/dev/null
fi
cmake --build "$build" -j"$(nproc)" >/dev/null
