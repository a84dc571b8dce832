#!/bin/sh
# `cmake --install` gives a relocatable install: install into a temporary
# prefix, move the prefix elsewhere, then build a program against the moved
# files twice (CMake package, pkg-config) and run it, and run the installed
# command and Lua module, all with no EQUIPOISE_* variable set.
# Usage: run.sh BUILD_DIR SOURCE_DIR [SANITIZER_FLAGS]
set -u
BUILD=$1; SRC=$2; SAN=${3:-}
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
pass=0; fail=0
ok() { echo "ok   $1"; pass=$((pass + 1)); }
bad() { echo "FAIL $1"; [ -f "$TMP/log" ] && sed 's/^/  | /' "$TMP/log" | head -20; fail=$((fail + 1)); }
# a run that depends on nothing but the install
clean() { env -u EQUIPOISE_SPECIES_PATH -u EQUIPOISE_PLUGIN_PATH -u XDG_DATA_HOME \
            HOME="$TMP/home" "$@"; }

if cmake --install "$BUILD" --prefix "$TMP/stage" >"$TMP/log" 2>&1; then ok install
else bad install; echo "0 passed, 1 failed"; exit 1; fi
mkdir -p "$TMP/elsewhere"
mv "$TMP/stage" "$TMP/elsewhere/moved"      # nothing may point back at stage
P=$TMP/elsewhere/moved
LIBDIR=$(dirname "$(find "$P" -name 'libequipoise.so.*' -type f | head -1)")

# No absolute path of the build or source tree, nor of the first prefix, in
# the run-time search paths; none in the read-only strings either (a
# sanitizer build keeps source names there for its reports).
for f in "$LIBDIR"/libequipoise.so.* "$P"/bin/equipoise "$LIBDIR"/lua/5.4/equipoise.so \
         "$LIBDIR"/equipoise/plugins/*.so; do
  [ -f "$f" ] && [ ! -L "$f" ] || continue
  name=${f#"$P"/}
  rp=$(readelf -d "$f" | sed -n 's/.*\(RPATH\|RUNPATH\).*\[\(.*\)\]/\2/p')
  case "$rp" in
    *"$SRC"*|*"$TMP"*) echo "$rp" >"$TMP/log"; bad "search path of $name" ;;
    *) ok "search path of $name${rp:+ ($rp)}" ;;
  esac
  if [ -z "$SAN" ] && readelf -p .rodata "$f" 2>/dev/null | grep -F -e "$SRC" -e "$TMP" >"$TMP/log"; then
    bad "strings of $name"
  fi
done

# The command finds its plugins and species beside the moved library.
if clean "$P/bin/equipoise" plugins >"$TMP/log" 2>&1 &&
   grep -q "from $LIBDIR/equipoise/plugins/davies.so" "$TMP/log"; then ok "moved command: plugins"
else bad "moved command: plugins"; fi
if clean "$P/bin/equipoise" species show KH2PO4 >"$TMP/log" 2>&1 &&
   grep -q "$P/share/equipoise/species/phosphate.lua" "$TMP/log"; then ok "moved command: species"
else bad "moved command: species"; fi

# The example against the CMake package, then against the pkg-config file;
# each computes the IUPAC phosphate standard (it checks pH 6.865 +- 0.02; Buck et al., Pure Appl. Chem. 74, 2169 (2002)).
if cmake -S "$SRC/tests/install" -B "$TMP/cm" -DCMAKE_PREFIX_PATH="$P" \
     -DCMAKE_C_FLAGS="$SAN" >"$TMP/log" 2>&1 &&
   cmake --build "$TMP/cm" >>"$TMP/log" 2>&1; then ok "find_package(equipoise) build"
else bad "find_package(equipoise) build"; fi
if clean "$TMP/cm/example" >"$TMP/log" 2>&1; then ok "find_package example: $(cat "$TMP/log")"
else bad "find_package example"; fi

export PKG_CONFIG_PATH="$LIBDIR/pkgconfig"
if cc $SAN -Wall -Werror "$SRC/tests/install/example.c" -o "$TMP/example-pc" \
     $(pkg-config --cflags --libs equipoise) -lm \
     -Wl,-rpath,"$(pkg-config --variable=libdir equipoise)" >"$TMP/log" 2>&1; then
  ok "pkg-config build ($(pkg-config --modversion equipoise))"
else bad "pkg-config build"; fi
if clean "$TMP/example-pc" >"$TMP/log" 2>&1; then ok "pkg-config example: $(cat "$TMP/log")"
else bad "pkg-config example"; fi

# The program of the README's "Embedding in C", as printed there: the IUPAC
# phosphate standard, pH(S) 6.865 at 25 C (Buck et al., Pure Appl. Chem.
# 74, 2169 (2002)), within 0.02.
awk '/^## Embedding in C/ { on = 1 } on && /^```c$/ { c = 1; next } c && /^```$/ { exit }
     c { print }' "$SRC/README.md" >"$TMP/readme.c"
if [ -s "$TMP/readme.c" ] &&
   cc $SAN -Wall -Werror "$TMP/readme.c" -o "$TMP/readme" $(pkg-config --cflags --libs equipoise) \
     -Wl,-rpath,"$(pkg-config --variable=libdir equipoise)" >"$TMP/log" 2>&1 &&
   clean "$TMP/readme" >"$TMP/log" 2>&1 &&
   awk '/^pH / { d = $2 - 6.865; ok = d <= 0.02 && d >= -0.02 } END { exit !ok }' "$TMP/log"; then
  ok "README's C program: $(cat "$TMP/log")"
else bad "README's C program"; fi

# The Lua module from the moved prefix in a stock lua5.4, on the same
# standard (not for a sanitizer build, whose module needs the sanitizer
# runtime preloaded).
if [ -z "$SAN" ] && command -v lua5.4 >/dev/null; then
  if clean env LUA_CPATH="$LIBDIR/lua/5.4/?.so" lua5.4 -e '
      local eq = require "equipoise"
      local s = eq.solution{}
      s:add("KH2PO4", "25 mmol"); s:add("Na2HPO4", "25 mmol")
      local pH = s:equilibrate().pH
      assert(math.abs(pH - 6.865) <= 0.02, "pH " .. pH)
      print(string.format("pH %.3f", pH))' >"$TMP/log" 2>&1; then
    ok "moved Lua module: $(cat "$TMP/log")"
  else bad "moved Lua module"; fi
fi

echo "$pass passed, $fail failed"
[ "$fail" -eq 0 ]
