#!/usr/bin/env bash
# Browser tests drive Debian's chromium; Playwright's own browser downloads are not used.
set -euo pipefail
if command -v chromium >/dev/null 2>&1; then exit 0; fi
if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
  echo "Installing Debian chromium for the browser tests…"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq chromium >/dev/null
else
  echo "chromium is missing: install Debian's 'chromium' package (needs root), then run npm test again." >&2
  exit 1
fi
