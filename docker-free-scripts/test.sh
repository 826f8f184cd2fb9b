#!/usr/bin/env bash
# Every check Kerfline has: lint, types, unit tests (with domain coverage), API tests against a real
# PostgreSQL, and browser journeys in headless Chromium. Exits non-zero on any failure.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_node_modules
if ! command -v chromium >/dev/null && [ ! -x /usr/bin/chromium ]; then
  log "installing Debian's chromium for the browser tests"
  apt_install chromium
fi

pg_start
trap 'if [ "${PG_STARTED_HERE:-0}" = 1 ]; then pg_stop >/dev/null 2>&1; fi' EXIT
export PGDATABASE=kerfline_test
pg_ensure_db "$PGDATABASE"
export SESSION_SECRET=test-secret-not-for-production NODE_ENV=test

node docker-free-scripts/run-checks.mjs
