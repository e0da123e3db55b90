#!/usr/bin/env bash
# npm run bench: speed and memory targets, measured (not asserted by the test suite).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
status=0
for bench in scripts/bench/*.ts; do
  echo "== $bench"
  npx tsx "$bench" || status=$?
done
exit "$status"
