#!/usr/bin/env bash
# npm run demo: install, reset and seed the demo, build the web app, start the app with its local stand-ins (packages/stand-ins).
# npm start (demo.sh --keep): the same, but serve the data folder as it is and seed only when it is empty.
set -euo pipefail
cd "$(dirname "$0")/.."
keep=false
[ "${1:-}" = "--keep" ] && keep=true
bash scripts/ensure-deps.sh
export NODE_ENV="${NODE_ENV:-development}"
export PORT="${PORT:-8080}"
# A second demo on another PORT gets its own data folder, payment stand-in (PORT+1) and SMTP port (any free one).
if [ "$PORT" = 8080 ]; then export DATA_DIR="${DATA_DIR:-./data}"; else export DATA_DIR="${DATA_DIR:-./data/port-$PORT}"; fi
export SMTP_PORT="${SMTP_PORT:-0}"
export APP_ORIGIN="${APP_ORIGIN:-http://localhost:$PORT}"
export WEB_DIST_DIR="${WEB_DIST_DIR:-apps/web/dist}"
export LOG_LEVEL="${LOG_LEVEL:-warn}"
if [ "$keep" = false ] || [ ! -f "$DATA_DIR/revloop.db" ]; then
  npx tsx seeds/reset-demo.ts
else
  echo "Keeping the data in $DATA_DIR (npm run demo resets it)."
fi
echo "Building the web app…"
npm run build -w @revloop/web --silent -- --logLevel warn
node apps/api/scripts/build-node.mjs
npx tsx apps/api/src/server.ts &
server=$!
trap 'kill "$server" 2>/dev/null' INT TERM EXIT
node scripts/wait-for.mjs "http://127.0.0.1:$PORT/api/health" 60
echo "Ports: app $PORT, payment stand-in ${STRIPE_FAKE_PORT:-$((PORT + 1))}, SMTP ${SMTP_PORT} (0 = a free port picked at start). Data: $DATA_DIR"
npx tsx seeds/print-sign-ins.ts
wait "$server"
