#!/bin/sh
# Memory stays flat over N solves (default 1,000,000), in a C program and in a
# stock lua5.4 that loads the module; the figures are printed. Before the
# engine's observer replaced the registry logs, a plain Lua host kept about
# 1 KiB per solve (228 MiB after 200,000 solves).
# Usage: run.sh MEM_FLAT SOURCE_DIR BUILD_DIR [N]
set -u
C=$1; SRC=$2; BUILD=$3; N=${4:-1000000}
fail=0
"$C" "$N" || fail=1
if command -v lua5.4 >/dev/null; then
  LUA_CPATH="$BUILD/lua/?.so;;" lua5.4 "$SRC/tests/memory/mem_flat.lua" "$N" || fail=1
else
  echo "FAIL no lua5.4 interpreter (scripts/setup.sh installs it)"; fail=1
fi
exit $fail
