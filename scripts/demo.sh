#!/bin/sh
# Install what is missing, build, and run the demo experiment.
set -eu
cd "$(dirname "$0")/.."
scripts/setup.sh build
exec ./build/equipoise run scripts/examples/demo.lua "$@"
