#!/bin/sh
# The report in a real browser: headless Chromium loads the report of the
# titration example, lays it out (the page's own script counts the figures
# that got a size) and takes a screenshot, which must show the plots.
# Skips (exit 77) only where Chromium is not installed.
# Usage: browser.sh EQUIPOISE SOURCE_DIR PNG_CHECK
set -u
EQP=$1; SRC=$2; PNG_CHECK=$3
BROWSER=$(command -v chromium || command -v chromium-browser || true)
if [ -z "$BROWSER" ]; then
  echo "SKIP: Chromium is not installed (Debian package 'chromium'; scripts/test.sh installs it as root)"
  exit 77
fi
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
cd "$TMP"
"$EQP" run "$SRC/scripts/examples/unknown_acid.lua" --report report.html >/dev/null 2>&1 ||
  { echo "FAIL: the example did not run"; exit 1; }
flags="--headless --no-sandbox --disable-gpu --disable-quic --no-first-run
  --disable-background-networking --disable-component-update --disable-sync
  --disable-dev-shm-usage --hide-scrollbars"
# shellcheck disable=SC2086
timeout 60 "$BROWSER" $flags --user-data-dir="$TMP/profile-dom" --dump-dom \
  "file://$TMP/report.html" > dom.html 2> dom.err
# shellcheck disable=SC2086
timeout 60 "$BROWSER" $flags --user-data-dir="$TMP/profile-shot" --window-size=1000,1600 \
  --screenshot="$TMP/shot.png" "file://$TMP/report.html" > shot.out 2>&1
want=$(sed -n 's/.*data-plots="\([0-9]*\)".*/\1/p' report.html)
got=$(sed -n 's/.*data-plots-rendered="\([0-9]*\)".*/\1/p' dom.html)
svgs=$(grep -o '<svg class="plot"' dom.html | wc -l)
echo "report embeds ${want:-?} figure(s); the browser laid out ${got:-none} with a size; $svgs svg elements in the DOM"
status=0
if [ -z "$want" ] || [ "$want" -lt 1 ] || [ "${got:-x}" != "$want" ] || [ "$svgs" -ne "$want" ]; then
  echo "FAIL: the page did not load with its plots"; head -5 dom.err; status=1
fi
grep -q '<h2 id="procedure">Procedure</h2>' dom.html || { echo "FAIL: no procedure section"; status=1; }
if [ -f shot.png ]; then
  "$PNG_CHECK" shot.png 1000 1600 || { echo "FAIL: the screenshot is blank or shows no curve"; status=1; }
else
  echo "FAIL: no screenshot"; cat shot.out | head -5; status=1
fi
[ "$status" -eq 0 ] && echo "1 passed, 0 failed"
exit "$status"
