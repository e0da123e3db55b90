#!/usr/bin/env bash
# The PostgreSQL test projects (db-pg, api-pg, api-crash-pg) start a throwaway cluster from Debian's postgresql
# package. With PG_TEST_URL set they use that server instead and need nothing installed here.
set -euo pipefail
if [ -n "${PG_TEST_URL:-}" ]; then exit 0; fi
if ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1 || command -v initdb >/dev/null 2>&1; then exit 0; fi
if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
  echo "Installing Debian postgresql for the PostgreSQL test runs…"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq postgresql >/dev/null
else
  echo "PostgreSQL is missing: install Debian's 'postgresql' package (needs root) or set PG_TEST_URL, then run npm test again." >&2
  exit 1
fi
