#!/usr/bin/env bash
# Browser check of the evaluation record (issue 7): generate the demo report with the built binary,
# render report.html in Debian's chromium (headless) to a PNG and dump its DOM, then assert the
# page rendered (non-blank image with the map's colours, png_check.py) and the map is in the DOM.
# Exit 77 (CTest SKIP_RETURN_CODE) when chromium or python3 is not installed.
# Usage: render_check.sh STANDOFF_BINARY PNG_CHECK_SCRIPT
set -euo pipefail
standoff=$1
png_check=$2
browser=$(command -v chromium || command -v chromium-browser || true)
if [ -z "$browser" ]; then echo "chromium not installed: browser check skipped"; exit 77; fi
if ! command -v python3 >/dev/null; then echo "python3 not installed: browser check skipped"; exit 77; fi

work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
rc=0
"$standoff" demo --out "$work/demo" >"$work/stdout.txt" 2>"$work/stderr.txt" || rc=$?
if [ "$rc" -ne 0 ] && [ "$rc" -ne 1 ]; then
  echo "standoff demo failed with exit $rc"; cat "$work/stderr.txt"; exit 1
fi
test -s "$work/demo/report.html"

flags=(--headless --no-sandbox --disable-gpu --disable-quic --no-first-run --disable-background-networking
       --disable-component-update --disable-sync --hide-scrollbars --disable-extensions
       --user-data-dir="$work/profile")
url="file://$work/demo/report.html"
timeout 180 "$browser" "${flags[@]}" --window-size=1000,2600 --screenshot="$work/page.png" "$url" \
  >"$work/chromium.log" 2>&1 || { cat "$work/chromium.log"; exit 1; }
timeout 180 "$browser" "${flags[@]}" --dump-dom "$url" >"$work/dom.html" 2>>"$work/chromium.log" \
  || { cat "$work/chromium.log"; exit 1; }

test -s "$work/page.png" || { echo "no screenshot written"; cat "$work/chromium.log"; exit 1; }
grep -q '<svg[^>]*id="site-map"' "$work/dom.html" || { echo "the site map is not in the rendered DOM"; exit 1; }
grep -q 'id="cautions"' "$work/dom.html" || { echo "the cautions are not in the rendered DOM"; exit 1; }
python3 "$png_check" "$work/page.png"
echo "browser check passed"
