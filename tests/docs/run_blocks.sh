#!/bin/sh
# Every ```lua block in README.md and docs/*.md runs (the convention is in
# docs/user-guide.md, "Examples in these docs"):
#   - the experiment blocks of one page run in order as one script, so a
#     later block may use what an earlier one made;
#   - a block whose first line is "-- species file" is checked with
#     `equipoise species check`;
#   - a block whose first line is "-- fragment" is a piece of a larger table
#     or script: it is only compiled (as a table body if it is one).
# Usage: run_blocks.sh EQUIPOISE SOURCE_DIR
set -u
EQP=$1; SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
pass=0; fail=0

for doc in "$SRC/README.md" "$SRC"/docs/*.md; do
  name=$(basename "$doc" .md)
  dir="$TMP/$name"; mkdir -p "$dir"
  # split the page: block files b001.lua ... and a map "file docline" per script line
  awk -v dir="$dir" -v doc="$doc" '
    /^```lua[ \t]*$/ { inb = 1; n++; f = sprintf("%s/b%03d.lua", dir, n); start = NR + 1; next }
    /^```/ && inb { inb = 0; close(f); print start > (dir "/start" n); close(dir "/start" n); next }
    inb { print > f }
  ' "$doc"
  script="$dir/page.lua"; map="$dir/page.map"
  : > "$script"; : > "$map"
  for b in "$dir"/b*.lua; do
    [ -f "$b" ] || continue
    k=$(basename "$b" .lua | sed 's/^b0*//')
    start=$(cat "$dir/start$k")
    first=$(head -n 1 "$b")
    where="$(basename "$doc"):$start"
    case "$first" in
      "-- species file"*)
        if out=$(cd "$dir" && "$EQP" species check "$b" 2>&1); then
          echo "ok   $where (species file)"; pass=$((pass + 1))
        else
          echo "FAIL $where (species file)"; echo "$out" | sed 's/^/  | /' | head -10; fail=$((fail + 1))
        fi ;;
      "-- fragment"*)
        if luac5.4 -p "$b" 2>/dev/null || { printf 'return {\n' > "$b.t"; cat "$b" >> "$b.t";
             printf '}\n' >> "$b.t"; luac5.4 -p "$b.t" 2>/dev/null; }; then
          echo "ok   $where (fragment, compiled)"; pass=$((pass + 1))
        else
          echo "FAIL $where (fragment does not compile)"; luac5.4 -p "$b" 2>&1 | sed 's/^/  | /'
          fail=$((fail + 1))
        fi ;;
      *)
        lines=$(wc -l < "$b")
        i=0
        while [ "$i" -lt "$lines" ]; do echo "$start" >> "$map"; i=$((i + 1)); start=$((start + 1)); done
        cat "$b" >> "$script" ;;
    esac
  done
  [ -s "$script" ] || continue
  if out=$(cd "$dir" && "$EQP" run "$script" 2>&1); then
    echo "ok   $(basename "$doc") (experiment blocks)"; pass=$((pass + 1))
  else
    echo "FAIL $(basename "$doc") (experiment blocks, exit $?)"
    # point at the page's own line numbers
    echo "$out" | awk -v map="$map" -v doc="$(basename "$doc")" '
      BEGIN { while ((getline l < map) > 0) m[++n] = l }
      { while (match($0, /page\.lua:[0-9]+/)) {
          ln = substr($0, RSTART + 9, RLENGTH - 9)
          $0 = substr($0, 1, RSTART - 1) doc ":" m[ln + 0] substr($0, RSTART + RLENGTH) }
        print "  | " $0 }' | head -20
    fail=$((fail + 1))
  fi
done
echo "doc blocks: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
