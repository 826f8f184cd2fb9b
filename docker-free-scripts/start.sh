#!/usr/bin/env bash
# Runs Kerfline with its demo data on http://127.0.0.1:${PORT:-3000}. Safe to run again.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_node_modules
pg_start
export PGDATABASE=${PGDATABASE:-kerfline}
pg_ensure_db "$PGDATABASE"

mkdir -p .data
if [ -z "${SESSION_SECRET:-}" ]; then
  [ -f .data/session-secret ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("hex"))' >.data/session-secret
  SESSION_SECRET=$(cat .data/session-secret)
  export SESSION_SECRET
fi
export NODE_ENV=production PORT=${PORT:-3000}

log "building"
npm run --silent build >/dev/null
log "applying migrations"
node --enable-source-maps apps/api/dist/db/migrate-cli.js
log "loading the demo scenario if the database is empty"
node --enable-source-maps apps/api/dist/db/seed-cli.js

# Stop what this script started, however it ends (Ctrl+C, a kill, the server exiting).
SERVER_PID=
stop_children() {
  if [ -n "$SERVER_PID" ] && kill -0 "$SERVER_PID" 2>/dev/null; then
    kill "$SERVER_PID" 2>/dev/null || true
    wait "$SERVER_PID" 2>/dev/null || true
  fi
  mail_catcher_stop
}
trap stop_children EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

# Mail: a real server when SMTP_HOST is set (see README), otherwise the local catcher, whose mail the
# administrators read on the Mail page.
if [ -z "${SMTP_HOST:-}" ]; then
  export SMTP_HOST=127.0.0.1 MAIL_CATCHER_DIR=${MAIL_CATCHER_DIR:-$ROOT/.data/mail}
  mail_catcher_start --enable-source-maps apps/api/dist/mail/catcher-cli.js
fi
export PUBLIC_URL=${PUBLIC_URL:-http://127.0.0.1:$PORT}
if [ -n "${MAIL_CATCHER_DIR:-}" ]; then
  MAIL_LINE="caught by the local mail catcher on 127.0.0.1:$SMTP_PORT; sign in as the admin and open Mail"
else
  MAIL_LINE="sent through $SMTP_HOST:${SMTP_PORT:-2525}, links to $PUBLIC_URL"
fi

cat <<INFO

  Kerfline is starting on http://127.0.0.1:$PORT
  Demo sign-ins (password for all: $(node -e 'import("./apps/api/dist/db/demo-scenario.js").then(m=>process.stdout.write(m.DEMO_PASSWORD))')):
$(node -e 'import("./apps/api/dist/db/demo-scenario.js").then(m=>{for (const u of m.DEMO_SIGN_INS) console.log("    " + u.role.padEnd(16) + u.email)})')
  Mail: $MAIL_LINE
  Stop with Ctrl+C (stops the app and the mail catcher), then: bash docker-free-scripts/stop.sh

INFO
node --enable-source-maps apps/api/dist/server.js &
SERVER_PID=$!
wait "$SERVER_PID"
