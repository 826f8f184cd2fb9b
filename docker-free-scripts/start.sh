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

cat <<INFO

  Kerfline is starting on http://127.0.0.1:$PORT
  Demo sign-ins (password for all: $(node -e 'import("./apps/api/dist/db/demo-scenario.js").then(m=>process.stdout.write(m.DEMO_PASSWORD))')):
$(node -e 'import("./apps/api/dist/db/demo-scenario.js").then(m=>{for (const u of m.DEMO_SIGN_INS) console.log("    " + u.role.padEnd(16) + u.email)})')
  Stop with Ctrl+C, then: bash docker-free-scripts/stop.sh

INFO
exec node --enable-source-maps apps/api/dist/server.js
