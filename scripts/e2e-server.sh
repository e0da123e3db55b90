#!/usr/bin/env bash
# The app as the browser tests see it: built web app, fresh demo data in .tmp, local stand-ins (packages/stand-ins) on free ports.
set -euo pipefail
cd "$(dirname "$0")/.."
export NODE_ENV=development
export PORT="${E2E_PORT:-8181}"
# One data folder per port, so two browser-test runs at once never share a database.
export DATA_DIR=.tmp/e2e-data-$PORT
export APP_ORIGIN="http://localhost:$PORT"
export WEB_DIST_DIR=apps/web/dist
export SMTP_PORT=0
export LOG_LEVEL=warn
rm -rf "$DATA_DIR"
npx tsx seeds/reset-demo.ts
node apps/api/scripts/build-node.mjs
exec npx tsx apps/api/src/server.ts
