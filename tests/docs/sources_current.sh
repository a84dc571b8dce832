#!/bin/sh
# docs/sources.md is what scripts/sources.py makes of the library as the
# engine loads it: a species file that gains or changes a source without the
# list being regenerated fails here, with the difference.
# Usage: sources_current.sh EQUIPOISE SOURCE_DIR
set -eu
EQP=$1; SRC=$2
TMP=$(mktemp)
trap 'rm -f "$TMP"' EXIT
python3 "$SRC/scripts/sources.py" "$EQP" "$TMP"
if ! diff -u "$SRC/docs/sources.md" "$TMP"; then
  echo "docs/sources.md is out of date: run scripts/sources.py build/bin/equipoise docs/sources.md" >&2
  exit 1
fi
echo "docs/sources.md is up to date"
