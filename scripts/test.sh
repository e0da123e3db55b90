#!/usr/bin/env bash
# npm test: install what is missing, then typecheck, lint, unit + API tests, build, browser tests, and a summary line.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
bash scripts/ensure-chromium.sh
bash scripts/ensure-postgres.sh
mkdir -p .tmp
rm -f .tmp/vitest.json .tmp/playwright.json

# Each phase's wall time, printed before the summary line (DEVELOPERS.md keeps the figures).
times=""
current=""
mark=$SECONDS
phase() {
  if [ -n "$current" ]; then times="$times${times:+, }$current $((SECONDS - mark)) s"; fi
  current="$1"
  mark=$SECONDS
  if [ -n "$1" ]; then echo "== $1"; fi
}

phase "compile the CLI and datalog workers"; node apps/api/scripts/build-node.mjs
phase "typecheck"; npm run -s typecheck
phase "lint"; npm run -s lint
phase "unit and API tests (db-pg, api-pg and api-crash-pg on one throwaway PostgreSQL cluster, or PG_TEST_URL)"
status=0
npx vitest run --reporter=default --reporter=json --outputFile.json=.tmp/vitest.json || status=$?
phase "build web app"; npm run -s build
phase "browser tests"
PLAYWRIGHT_JSON_OUTPUT_NAME=.tmp/playwright.json npx playwright test --reporter=list,json || status=$?
phase ""
echo "phases: $times"
node scripts/test-summary.mjs .tmp/vitest.json .tmp/playwright.json
exit "$status"
