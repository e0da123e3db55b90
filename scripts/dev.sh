#!/usr/bin/env bash
# npm run dev: the API with its local stand-ins (packages/stand-ins) on :8080 (data kept between runs) and Vite's hot reload on :5173.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
export NODE_ENV=development PORT="${PORT:-8080}" DATA_DIR="${DATA_DIR:-./data}" APP_ORIGIN="${APP_ORIGIN:-http://localhost:5173}"
[ -f "$DATA_DIR/revloop.db" ] || npx tsx seeds/reset-demo.ts
node apps/api/scripts/build-node.mjs
npx tsx watch apps/api/src/server.ts &
api=$!
trap 'kill "$api" 2>/dev/null' INT TERM EXIT
npm run dev -w @revloop/web
