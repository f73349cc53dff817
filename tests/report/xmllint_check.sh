#!/usr/bin/env bash
# Well-formedness of every SVG the report writes, by an independent XML parser (xmllint from
# Debian's libxml2-utils): the committed demo report and a freshly generated one.
# Exit 77 (CTest SKIP_RETURN_CODE) when xmllint is not installed.
# Usage: xmllint_check.sh STANDOFF_BINARY COMMITTED_DEMO_DIR
set -euo pipefail
standoff=$1
committed=$2
if ! command -v xmllint >/dev/null; then echo "xmllint not installed: check skipped"; exit 77; fi
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
rc=0
"$standoff" demo --out "$work/demo" >/dev/null 2>"$work/stderr.txt" || rc=$?
if [ "$rc" -ne 0 ] && [ "$rc" -ne 1 ]; then echo "standoff demo failed with exit $rc"; cat "$work/stderr.txt"; exit 1; fi
count=0
for f in "$work"/demo/*.svg "$committed"/*.svg; do
  [ -e "$f" ] || continue
  xmllint --noout "$f"
  count=$((count + 1))
done
[ "$count" -ge 2 ] || { echo "expected SVG files, found $count"; exit 1; }
echo "$count SVG files well-formed"
