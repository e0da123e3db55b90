#!/usr/bin/env bash
# npm run demo: install, migrate and seed the demo, build the web app, start the app with its local fakes.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
export NODE_ENV="${NODE_ENV:-development}"
export PORT="${PORT:-8080}"
export DATA_DIR="${DATA_DIR:-./data}"
export APP_ORIGIN="${APP_ORIGIN:-http://localhost:$PORT}"
export WEB_DIST_DIR="${WEB_DIST_DIR:-apps/web/dist}"
export LOG_LEVEL="${LOG_LEVEL:-warn}"
npx tsx seeds/reset-demo.ts
npm run build -w @revloop/web --silent
node scripts/build-node.mjs
npx tsx apps/api/src/server.ts &
server=$!
trap 'kill "$server" 2>/dev/null' INT TERM EXIT
node scripts/wait-for.mjs "http://127.0.0.1:$PORT/api/health" 60
npx tsx seeds/print-sign-ins.ts
wait "$server"
