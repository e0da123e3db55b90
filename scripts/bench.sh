#!/usr/bin/env bash
# npm run bench: speed and memory targets, measured (not asserted by the test suite).
# BENCH_ONLY=reports (or a comma-separated list, e.g. BENCH_ONLY=board,reports) runs only those scripts/bench/*.ts.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
status=0
ran=0
for bench in scripts/bench/*.ts; do
  name="$(basename "$bench" .ts)"
  if [[ -n "${BENCH_ONLY:-}" && ",${BENCH_ONLY}," != *",${name},"* ]]; then continue; fi
  echo "== $bench"
  ran=$((ran + 1))
  npx tsx "$bench" || status=$?
done
if [[ "$ran" -eq 0 ]]; then
  echo "BENCH_ONLY=${BENCH_ONLY:-} names no benchmark; choose from: $(ls scripts/bench/*.ts | xargs -n1 basename | sed 's/\.ts$//' | paste -sd, -)" >&2
  exit 2
fi
exit "$status"
