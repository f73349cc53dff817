#!/usr/bin/env bash
# Runs each libFuzzer target for SECONDS (default 60) under ASan/UBSan, seeded with the bad-input
# corpus (tests/data/bad/cases.toml applied to the demo station), the examples and the tables.
# Exits non-zero on any crash, leak or sanitizer report. Usage: run_fuzz.sh BUILD_DIR [SECONDS]
set -euo pipefail
build=$(cd "${1:?usage: run_fuzz.sh BUILD_DIR [SECONDS]}" && pwd)
seconds=${2:-60}
src=$(cd "$(dirname "$0")/../.." && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
mkdir -p "$work"/{quantity,station,tables}

# Seeds: whole station files and their one-defect variants; table files; every quoted quantity.
cp "$src"/docs/examples/*.toml "$src"/tests/data/bad/mini-station.toml "$work/station/"
python3 - "$src" "$work/station" <<'PY'
import sys, tomllib, pathlib
src, out = pathlib.Path(sys.argv[1]), pathlib.Path(sys.argv[2])
demo = (src / "docs/examples/demo-station.toml").read_text()
cases = tomllib.loads((src / "tests/data/bad/cases.toml").read_text())
for i, c in enumerate(cases.get("station", [])):
    (out / f"case-{i:03d}.toml").write_text(demo.replace(c["find"], c.get("replace", ""), 1))
PY
cp "$src"/tables/*.toml "$work/tables/"
grep -oh '"[^"]*"' "$src"/docs/examples/*.toml "$src"/tests/data/bad/cases.toml | tr -d '"' | sort -u |
  head -2000 | split -l 1 - "$work/quantity/q-"

status=0
for t in quantity station tables; do
  echo "::: fuzz_$t for ${seconds}s"
  mkdir -p "$work/$t-out"
  if ! (cd "$work" && "$build/tests/fuzz/fuzz_$t" -max_total_time="$seconds" -max_len=16384 -timeout=10 \
          -rss_limit_mb=2048 -print_final_stats=1 "$work/$t-out" "$work/$t"); then
    echo "fuzz_$t: FAILED (crash, leak, timeout or sanitizer report); reproducer in the log above" >&2
    status=1
    mkdir -p "$src/build/fuzz-findings"
    cp "$work"/crash-* "$work"/leak-* "$work"/timeout-* "$work"/oom-* "$src/build/fuzz-findings/" 2>/dev/null || true
  fi
done
exit $status
