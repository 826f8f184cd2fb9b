# Shared by start.sh, test.sh and stop.sh: locating the repo, installing what is missing, and running a
# project-local PostgreSQL cluster on 127.0.0.1 (never the system cluster on 5432).
# shellcheck shell=bash
set -euo pipefail

ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
export PGPORT=${PGPORT:-55432}
export PGHOST=127.0.0.1
export PGUSER=${PGUSER:-postgres}

log() { printf '\033[1m[kerfline]\033[0m %s\n' "$*"; }
die() { printf '[kerfline] error: %s\n' "$*" >&2; exit 1; }

is_root() { [ "$(id -u)" = 0 ]; }

apt_install() {
  is_root || die "need root to install Debian packages: $*"
  if [ -z "${KERFLINE_APT_UPDATED:-}" ]; then
    DEBIAN_FRONTEND=noninteractive apt-get update -qq
    export KERFLINE_APT_UPDATED=1
  fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}

ensure_node_modules() {
  command -v node >/dev/null || die "Node.js 20.19 or newer is required"
  cd "$ROOT"
  local stamp=node_modules/.kerfline-lock-hash
  local want
  want=$(sha256sum package-lock.json | cut -d' ' -f1)
  if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
    log "installing npm packages (npm ci)"
    npm ci --no-audit --no-fund --loglevel=error
    echo "$want" >"$stamp"
  fi
}

pg_bin() {
  local dir
  dir=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  if [ -z "$dir" ] || [ ! -x "$dir/initdb" ]; then
    log "installing PostgreSQL from Debian's packages"
    apt_install postgresql
    # Debian starts its own cluster on 5432; we leave it alone and use our own.
    dir=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)
  fi
  echo "$dir"
}

# Runs a PostgreSQL server binary as the postgres user when we are root (it refuses to run as root).
as_pg() {
  if is_root; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

# The data folder: .data/pg in the repo, or a folder under /tmp keyed by the repo path when the postgres
# user cannot reach the repo (a clone under a mode-700 home such as /root).
pg_dir() {
  local dir="$ROOT/.data/pg-$PGPORT"
  if is_root; then
    mkdir -p "$dir"
    chown postgres:postgres "$dir"
    if ! runuser -u postgres -- test -w "$dir" 2>/dev/null; then
      dir="/tmp/kerfline-pg-$(printf '%s' "$ROOT" | sha256sum | cut -c1-12)-$PGPORT"
    fi
  fi
  echo "$dir"
}

pg_start() {
  local bin dir
  bin=$(pg_bin)
  dir=$(pg_dir)
  mkdir -p "$dir/data" "$dir/run"
  if is_root; then chown -R postgres:postgres "$dir"; fi
  chmod 700 "$dir/data"
  if [ ! -f "$dir/data/PG_VERSION" ]; then
    log "creating a PostgreSQL cluster in $dir"
    as_pg "$bin/initdb" -D "$dir/data" -U postgres --auth=trust -E UTF8 --no-locale >/dev/null
  fi
  if as_pg "$bin/pg_ctl" -D "$dir/data" status >/dev/null 2>&1; then
    log "PostgreSQL already running on 127.0.0.1:$PGPORT"
    PG_STARTED_HERE=0
  else
    log "starting PostgreSQL on 127.0.0.1:$PGPORT"
    as_pg "$bin/pg_ctl" -D "$dir/data" -l "$dir/server.log" -w -t 30 \
      -o "-p $PGPORT -c listen_addresses=127.0.0.1 -c unix_socket_directories=$dir/run" start >/dev/null \
      || { tail -n 20 "$dir/server.log" >&2; die "PostgreSQL did not start (log above)"; }
    PG_STARTED_HERE=1
  fi
  export PG_STARTED_HERE
}

pg_stop() {
  local bin dir
  bin=$(pg_bin)
  dir=$(pg_dir)
  if [ -f "$dir/data/PG_VERSION" ] && as_pg "$bin/pg_ctl" -D "$dir/data" status >/dev/null 2>&1; then
    log "stopping PostgreSQL on 127.0.0.1:$PGPORT"
    as_pg "$bin/pg_ctl" -D "$dir/data" -m fast -w stop >/dev/null
  fi
}

pg_ensure_db() {
  local name=$1 bin
  bin=$(pg_bin)
  if ! "$bin/psql" -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres -tAc "SELECT 1 FROM pg_database WHERE datname='$name'" | grep -q 1; then
    log "creating database $name"
    "$bin/createdb" -h 127.0.0.1 -p "$PGPORT" -U postgres "$name"
  fi
}

# The local mail catcher (smtp-server on 127.0.0.1:$SMTP_PORT, no TLS, no auth) keeps every message as a JSON
# file in $MAIL_CATCHER_DIR; the app's outbox page and the tests read them. Nothing is delivered anywhere.
# Usage: mail_catcher_start <node args…>  (the compiled catcher-cli.js, or the TypeScript one through tsx)
mail_catcher_start() {
  export SMTP_PORT=${SMTP_PORT:-2525}
  if (exec 3<>"/dev/tcp/127.0.0.1/$SMTP_PORT") 2>/dev/null; then
    die "port $SMTP_PORT is already taken (another Kerfline running?); set SMTP_PORT to a free port"
  fi
  mkdir -p "$MAIL_CATCHER_DIR"
  log "starting the local mail catcher on 127.0.0.1:$SMTP_PORT (mail kept in ${MAIL_CATCHER_DIR#"$ROOT"/})"
  SMTP_PORT=$SMTP_PORT MAIL_CATCHER_DIR=$MAIL_CATCHER_DIR node "$@" >"$MAIL_CATCHER_DIR.log" 2>&1 &
  MAIL_CATCHER_PID=$!
  for _ in $(seq 1 50); do
    if (exec 3<>"/dev/tcp/127.0.0.1/$SMTP_PORT") 2>/dev/null; then return 0; fi
    kill -0 "$MAIL_CATCHER_PID" 2>/dev/null || break
    sleep 0.1
  done
  cat "$MAIL_CATCHER_DIR.log" >&2 || true
  die "the local mail catcher did not start (log above)"
}

mail_catcher_stop() {
  if [ -n "${MAIL_CATCHER_PID:-}" ] && kill -0 "$MAIL_CATCHER_PID" 2>/dev/null; then
    kill "$MAIL_CATCHER_PID" 2>/dev/null || true
    wait "$MAIL_CATCHER_PID" 2>/dev/null || true
  fi
  MAIL_CATCHER_PID=
}
