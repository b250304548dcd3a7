#!/usr/bin/env bash
# Whole-register timings (docs/benchmarks.md, "Whole-register runs"): an invented register, a cold register assess,
# a rerun after logging a finding on 1 % of the components (inspection dated before the evidence date, recorded now,
# so the rerun's evidence date is today), a rerun with nothing changed, and the register report from stored results.
# Each step runs under /usr/bin/time -v (wall, CPU, peak memory); the figures go to OUT/timings.txt.
#
#   bench/register-timing.sh [COMPONENTS] [ROUTE] [OUT]      e.g. bench/register-timing.sh 10000 auto /tmp/bench
#
# Builds the command line in Release first. Invented data only: no real asset is meant.
set -euo pipefail
N=${1:-10000}
ROUTE=${2:-auto}
OUT=${3:-/tmp/iu-register-timing}
ROOT=$(cd "$(dirname "$0")/.." && pwd)
AS_OF=$(date -u +%Y-%m-%d)
dotnet build -c Release "$ROOT/src/InspectionUpdate.Cli" >/dev/null
TOOL=(dotnet "$ROOT/src/InspectionUpdate.Cli/bin/Release/net10.0/inspection-update.dll")
mkdir -p "$OUT"
cd "$OUT"
rm -f r.register r.register-wal r.register-shm timings.txt
: >timings.txt

timed() {
  local name=$1
  shift
  /usr/bin/time -v "$@" >"$name.out" 2>"$name.time" || true
  {
    echo "== $name: $*"
    grep -E "Elapsed \(wall|User time|System time|Percent of CPU|Maximum resident" "$name.time"
    grep -E '"(components|assessed|not_converged|reused|failed|elapsed_seconds|results|stale)"' "$name.out" || true
  } | tee -a timings.txt
}

timed invent "${TOOL[@]}" register invent r.register --components "$N" --recorded 2025-01-01 --json
timed cold "${TOOL[@]}" register assess -r r.register --as-of "$AS_OF" --route "$ROUTE" --json

# 1 % of the components get a finding (no indication) dated before the evidence date, in one import.
python3 - "$N" <<'EOF'
import sqlite3, sys
codes = [r[0] for r in sqlite3.connect("file:r.register?mode=ro", uri=True).execute("SELECT code FROM component ORDER BY code")]
step = max(1, len(codes) // max(1, len(codes) // 100))
with open("change.csv", "w") as f:
    f.write("component_code,inspection_date,kind,method,location,note\n")
    for code in codes[::step]:
        f.write(f"{code},2025-03-01,no-indication,INV-UT,timing dig,benchmark change\n")
EOF
timed import "${TOOL[@]}" finding import change.csv -r r.register --by bench --json
timed rerun-1pct "${TOOL[@]}" register assess -r r.register --as-of "$AS_OF" --route "$ROUTE" --json
timed rerun-none "${TOOL[@]}" register assess -r r.register --as-of "$AS_OF" --route "$ROUTE" --json
timed report "${TOOL[@]}" register report -r r.register --as-of "$AS_OF" --route "$ROUTE" -o report --json
echo "Figures in $OUT/timings.txt"
