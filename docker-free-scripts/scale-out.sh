#!/usr/bin/env bash
# Kerfline past one process, on loopback, with Debian's own engines:
#   - a PostgreSQL streaming replica of the project's cluster (pg_basebackup -R, hot standby) on $PGREPLICA_PORT;
#   - two API processes on $SCALE_OUT_API_PORTS, reads on the replica and writes on the primary (Sequelize's
#     read replication; a session's own writes are read back from the primary), both running the job workers;
#   - nginx from Debian balancing between them on 127.0.0.1:$SCALE_OUT_PORT (installed with apt-get when missing).
#
#   bash docker-free-scripts/scale-out.sh          # start (or start what is not running yet)
#   bash docker-free-scripts/scale-out.sh stop     # stop nginx, the API processes and the replica
#
# PGDATABASE (default kerfline) is migrated and given the demo when empty. SCALE_OUT_FROM_SOURCE=1 runs the API
# from the TypeScript source (tsx) instead of the build. Exits 3 when nginx is missing and cannot be installed.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

export PGREPLICA_PORT=${PGREPLICA_PORT:-55459}
export SCALE_OUT_PORT=${SCALE_OUT_PORT:-3240}
SCALE_OUT_API_PORTS=${SCALE_OUT_API_PORTS:-"3241 3242"}
export PGDATABASE=${PGDATABASE:-kerfline}
STATE="$ROOT/.data/scale-out-$SCALE_OUT_PORT"

replica_dir() { echo "$(pg_dir)-replica-$PGREPLICA_PORT"; }

nginx_bin() {
  if command -v nginx >/dev/null; then command -v nginx; elif [ -x /usr/sbin/nginx ]; then echo /usr/sbin/nginx; fi
}

stop_all() {
  local bin dir pidfile
  if [ -f "$STATE/nginx/nginx.pid" ] && [ -n "$(nginx_bin)" ]; then
    log "stopping nginx on 127.0.0.1:$SCALE_OUT_PORT"
    "$(nginx_bin)" -c "$STATE/nginx/nginx.conf" -p "$STATE/nginx/" -e "$STATE/nginx/logs/error.log" -s quit 2>/dev/null || true
    for _ in $(seq 1 50); do [ -f "$STATE/nginx/nginx.pid" ] || break; sleep 0.1; done
  fi
  for pidfile in "$STATE"/api-*.pid; do
    [ -f "$pidfile" ] || continue
    if kill -0 "$(cat "$pidfile")" 2>/dev/null; then
      log "stopping the API process $(basename "$pidfile" .pid)"
      kill "$(cat "$pidfile")" 2>/dev/null || true
      for _ in $(seq 1 50); do kill -0 "$(cat "$pidfile")" 2>/dev/null || break; sleep 0.1; done
    fi
    rm -f "$pidfile"
  done
  bin=$(pg_bin)
  dir=$(replica_dir)
  if [ -f "$dir/data/PG_VERSION" ] && as_pg "$bin/pg_ctl" -D "$dir/data" status >/dev/null 2>&1; then
    log "stopping the replica on 127.0.0.1:$PGREPLICA_PORT"
    as_pg "$bin/pg_ctl" -D "$dir/data" -m fast -w stop >/dev/null
  fi
}

if [ "${1:-start}" = stop ]; then
  stop_all
  exit 0
fi
[ "${1:-start}" = start ] || die "usage: scale-out.sh [start|stop]"

# nginx first: without it there is nothing to balance, and the caller (the test) must know why.
if [ -z "$(nginx_bin)" ]; then
  if is_root; then
    log "installing nginx from Debian's packages"
    apt_install nginx || { echo "nginx could not be installed" >&2; exit 3; }
  fi
  [ -n "$(nginx_bin)" ] || { echo "nginx is not installed (and this user cannot install it)" >&2; exit 3; }
fi

ensure_node_modules
pg_start
pg_ensure_db "$PGDATABASE"
mkdir -p "$STATE"
if [ -z "${SESSION_SECRET:-}" ]; then
  [ -f .data/session-secret ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("hex"))' >.data/session-secret
  SESSION_SECRET=$(cat .data/session-secret)
  export SESSION_SECRET
fi

if [ "${SCALE_OUT_FROM_SOURCE:-0}" = 1 ]; then
  RUN=(node --conditions=source --import tsx)
  SRC=apps/api/src
  EXT=ts
else
  if [ ! -f apps/api/dist/server.js ] || [ ! -f dist/web/index.html ]; then
    log "building"
    npm run --silent build >/dev/null
  fi
  RUN=(node --enable-source-maps)
  SRC=apps/api/dist
  EXT=js
fi
log "applying migrations to $PGDATABASE and loading the demo if it is empty"
"${RUN[@]}" "$SRC/db/migrate-cli.$EXT" >/dev/null
"${RUN[@]}" "$SRC/db/seed-cli.$EXT" >/dev/null

# The replica: a base backup of the whole cluster streamed from the primary, started as a hot standby.
BIN=$(pg_bin)
RDIR=$(replica_dir)
if ! { [ -f "$RDIR/data/PG_VERSION" ] && as_pg "$BIN/pg_ctl" -D "$RDIR/data" status >/dev/null 2>&1; }; then
  rm -rf "$RDIR"
  mkdir -p "$RDIR/run"
  if is_root; then chown -R postgres:postgres "$RDIR"; fi
  log "taking a base backup of 127.0.0.1:$PGPORT for the replica"
  as_pg "$BIN/pg_basebackup" -h 127.0.0.1 -p "$PGPORT" -U postgres -D "$RDIR/data" -R -X stream -c fast
  chmod 700 "$RDIR/data"
  log "starting the replica on 127.0.0.1:$PGREPLICA_PORT"
  as_pg "$BIN/pg_ctl" -D "$RDIR/data" -l "$RDIR/server.log" -w -t 60 \
    -o "-p $PGREPLICA_PORT -c listen_addresses=127.0.0.1 -c unix_socket_directories=$RDIR/run -c hot_standby=on" \
    start >/dev/null || { tail -n 20 "$RDIR/server.log" >&2; die "the replica did not start (log above)"; }
fi
# The replica answers reads only once it has caught up with the primary's current position.
LSN=$("$BIN/psql" -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres -tAc 'SELECT pg_current_wal_lsn()')
for _ in $(seq 1 100); do
  if "$BIN/psql" -h 127.0.0.1 -p "$PGREPLICA_PORT" -U postgres -d postgres -tAc \
    "SELECT pg_last_wal_replay_lsn() >= '$LSN'::pg_lsn" 2>/dev/null | grep -q t; then break; fi
  sleep 0.1
done

# Two API processes: same secret, reads on the replica, job workers in both (pg-boss runs each job once).
for port in $SCALE_OUT_API_PORTS; do
  pidfile="$STATE/api-$port.pid"
  if [ -f "$pidfile" ] && kill -0 "$(cat "$pidfile")" 2>/dev/null; then continue; fi
  log "starting an API process on 127.0.0.1:$port"
  PORT=$port HOST=127.0.0.1 NODE_ENV=production PGREPLICA_PORT=$PGREPLICA_PORT JOBS_WORKERS=true \
    PUBLIC_URL=${PUBLIC_URL:-http://127.0.0.1:$SCALE_OUT_PORT} LOG_LEVEL=${LOG_LEVEL:-warn} \
    "${RUN[@]}" "$SRC/server.$EXT" >"$STATE/api-$port.log" 2>&1 &
  echo $! >"$pidfile"
  # One at a time: the first sets up the job queue's tables, so the next finds them ready.
  for _ in $(seq 1 600); do
    if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then break; fi
    kill -0 "$(cat "$pidfile")" 2>/dev/null || { cat "$STATE/api-$port.log" >&2; die "the API process on $port stopped (log above)"; }
    sleep 0.1
  done
done

# nginx in front, in its own prefix under .data (no system service, no /var/log).
mkdir -p "$STATE/nginx/logs" "$STATE/nginx/tmp"
{
  echo "pid $STATE/nginx/nginx.pid;"
  echo "error_log $STATE/nginx/logs/error.log warn;"
  echo "worker_processes 1;"
  echo "events { worker_connections 1024; }"
  echo "http {"
  echo "  access_log off;"
  # The balancer compresses the API's JSON and CSV for browsers that accept it (level 1: most of the gain for little
  # CPU), so the API processes spend none on it; the web app's files come already compressed from the build.
  echo "  gzip on;"
  echo "  gzip_comp_level 1;"
  echo "  gzip_min_length 1024;"
  echo "  gzip_types application/json text/csv;"
  echo "  gzip_proxied any;"
  echo "  gzip_vary on;"
  for t in client_body proxy fastcgi uwsgi scgi; do echo "  ${t}_temp_path $STATE/nginx/tmp/$t;"; done
  echo "  upstream kerfline_api {"
  for port in $SCALE_OUT_API_PORTS; do echo "    server 127.0.0.1:$port max_fails=1 fail_timeout=5s;"; done
  echo "    keepalive 32;"
  echo "  }"
  echo "  server {"
  echo "    listen 127.0.0.1:$SCALE_OUT_PORT;"
  echo "    client_max_body_size 60m;"
  echo "    location / {"
  echo "      proxy_pass http://kerfline_api;"
  echo "      proxy_http_version 1.1;"
  echo "      proxy_set_header Connection \"\";"
  echo "      proxy_set_header Host \$http_host;"
  echo "      proxy_set_header X-Forwarded-For \$proxy_add_x_forwarded_for;"
  echo "      proxy_set_header X-Forwarded-Proto \$scheme;"
  echo "      proxy_next_upstream error timeout http_502 http_503;"
  echo "    }"
  echo "  }"
  echo "}"
} >"$STATE/nginx/nginx.conf"
NGINX=$(nginx_bin)
if [ -f "$STATE/nginx/nginx.pid" ] && kill -0 "$(cat "$STATE/nginx/nginx.pid")" 2>/dev/null; then
  "$NGINX" -c "$STATE/nginx/nginx.conf" -p "$STATE/nginx/" -e "$STATE/nginx/logs/error.log" -s reload
else
  log "starting nginx on 127.0.0.1:$SCALE_OUT_PORT"
  "$NGINX" -c "$STATE/nginx/nginx.conf" -p "$STATE/nginx/" -e "$STATE/nginx/logs/error.log"
fi

cat <<INFO

  Kerfline on http://127.0.0.1:$SCALE_OUT_PORT (nginx) → API processes on $(echo "$SCALE_OUT_API_PORTS" | sed 's/ /, /g')
  database $PGDATABASE: writes on 127.0.0.1:$PGPORT, reads on the replica 127.0.0.1:$PGREPLICA_PORT
  logs in ${STATE#"$ROOT"/}; stop with: bash docker-free-scripts/scale-out.sh stop

INFO
