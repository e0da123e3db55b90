#!/usr/bin/env bash
# npm test: install what is missing, then typecheck, lint, unit + API tests, build, browser tests, and a summary line.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
bash scripts/ensure-chromium.sh
bash scripts/ensure-postgres.sh
mkdir -p .tmp
rm -f .tmp/vitest.json .tmp/playwright.json

echo "== compile the CLI and datalog workers"; node apps/api/scripts/build-node.mjs
echo "== typecheck"; npm run -s typecheck
echo "== lint"; npm run -s lint
echo "== unit and API tests (the db-pg project on a throwaway PostgreSQL cluster, or PG_TEST_URL)"
status=0
npx vitest run --reporter=default --reporter=json --outputFile.json=.tmp/vitest.json || status=$?
echo "== build web app"; npm run -s build
echo "== browser tests"
PLAYWRIGHT_JSON_OUTPUT_NAME=.tmp/playwright.json npx playwright test --reporter=list,json || status=$?
node scripts/test-summary.mjs .tmp/vitest.json .tmp/playwright.json
exit "$status"
