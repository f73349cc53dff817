#!/usr/bin/env bash
# Browser check of the evaluation record (issue 7): generate the demo report with the built binary,
# render report.html in Debian's chromium (headless) to a PNG and dump its DOM, then assert the
# page rendered (non-blank image with the map's colours, png_check.py) and the map is in the DOM.
# Exit 77 (CTest SKIP_RETURN_CODE) when chromium or python3 is not installed.
# Issue 13 adds, on copies of report.html: the print layout on A4 and US Letter (the A4 record is
# at most 8 pages; both print), nothing clipped at the printable width (layout_probe.js compares
# element boxes with the page width), and the badges read apart in greyscale (grey_check.py).
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

here=$(dirname "$png_check")
html="$work/demo/report.html"
# Print layout: A4 and Letter, page counts from the PDF's page objects.
for size in A4 letter; do
  sed "s/@page { size: auto;/@page { size: $size;/" "$html" >"$work/demo/print-$size.html"
  timeout 180 "$browser" "${flags[@]}" --no-pdf-header-footer --print-to-pdf="$work/print-$size.pdf" \
    "file://$work/demo/print-$size.html" >>"$work/chromium.log" 2>&1 || { cat "$work/chromium.log"; exit 1; }
  pages=$(python3 -c "import re,sys; print(len(re.findall(rb'/Type\s*/Page[^s]', open(sys.argv[1],'rb').read())))" \
          "$work/print-$size.pdf")
  echo "printed on $size: $pages pages"
  [ "$pages" -ge 1 ] || { echo "no pages printed on $size"; exit 1; }
  if [ "$size" = A4 ] && [ "$pages" -gt 8 ]; then echo "the A4 record takes $pages pages (at most 8)"; exit 1; fi
done
# Clipping: the print styles applied on screen at the printable width of A4 with 14 mm margins
# (182 mm = 688 CSS px; Letter's is wider), the probe script injected before </body>.
python3 - "$html" "$work/demo/probe.html" "$here/layout_probe.js" <<'PY'
import sys
src, dst, js = sys.argv[1], sys.argv[2], open(sys.argv[3]).read()
h = open(src, encoding="utf-8").read().replace("@media print", "@media all")
h = h.replace("</body>", "<script>" + js + "</script></body>")
open(dst, "w", encoding="utf-8").write(h)
PY
timeout 180 "$browser" "${flags[@]}" --window-size=688,1400 --virtual-time-budget=5000 --dump-dom \
  "file://$work/demo/probe.html" >"$work/probe-dom.html" 2>>"$work/chromium.log" || { cat "$work/chromium.log"; exit 1; }
clip=$(python3 -c "import re,sys; m=re.search(r'<pre id=\"clip-result\">(.*?)</pre>', open(sys.argv[1]).read(), re.S); print(m.group(1) if m else 'NO RESULT')" "$work/probe-dom.html")
echo "clipping probe: $clip"
case "$clip" in OK*) ;; *) echo "something is clipped at the printable width"; exit 1;; esac
# Greyscale: the same page through a greyscale filter; badges measured where the probe found them.
sed 's|</style>|html { filter: grayscale(1); }</style>|' "$work/demo/probe.html" >"$work/demo/grey.html"
timeout 180 "$browser" "${flags[@]}" --window-size=688,1400 --virtual-time-budget=5000 --dump-dom \
  "file://$work/demo/grey.html" >"$work/grey-dom.html" 2>>"$work/chromium.log" || { cat "$work/chromium.log"; exit 1; }
rects=$(python3 -c "import re,sys; m=re.search(r'<pre id=\"badge-rects\">(.*?)</pre>', open(sys.argv[1]).read(), re.S); print(m.group(1) if m else '')" "$work/grey-dom.html")
timeout 180 "$browser" "${flags[@]}" --window-size=688,1400 --virtual-time-budget=5000 --screenshot="$work/grey.png" \
  "file://$work/demo/grey.html" >>"$work/chromium.log" 2>&1 || { cat "$work/chromium.log"; exit 1; }
python3 "$here/grey_check.py" "$work/grey.png" "$rects"
echo "browser check passed"
