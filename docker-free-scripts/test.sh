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
cleanup() {
  mail_catcher_stop
  if [ "${PG_STARTED_HERE:-0}" = 1 ]; then pg_stop >/dev/null 2>&1; fi
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM
export PGDATABASE=kerfline_test
pg_ensure_db "$PGDATABASE"
export SESSION_SECRET=test-secret-not-for-production NODE_ENV=test

# The local mail catcher for the browser journeys (the API tests start their own on a free port). It runs
# from the TypeScript source, since the build comes later in the checks.
export MAIL_CATCHER_DIR="$ROOT/.data/mail-test-${SMTP_PORT:-2525}"
rm -rf "$MAIL_CATCHER_DIR"
mail_catcher_start --import tsx apps/api/src/mail/catcher-cli.ts

node docker-free-scripts/run-checks.mjs
