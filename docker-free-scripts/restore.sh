#!/usr/bin/env bash
# Restores a backup made by backup.sh into a new, empty database on the project's cluster.
# Usage: bash docker-free-scripts/restore.sh FILE [DATABASE]
# DATABASE defaults to $PGDATABASE (kerfline). It must not exist yet, or be empty: a restore never mixes a
# backup into live data. To replace the live database, stop Kerfline, rename or drop the old database
# (psql -c 'ALTER DATABASE kerfline RENAME TO kerfline_old'), restore, and start Kerfline again.
source "$(dirname "$0")/lib.sh"

[ $# -ge 1 ] && [ $# -le 2 ] && [ -n "$1" ] || die "usage: bash docker-free-scripts/restore.sh FILE [DATABASE]"
FILE=$1
[ -f "$FILE" ] || die "no backup file at $FILE"
DB=${2:-${PGDATABASE:-kerfline}}
[[ "$DB" =~ ^[A-Za-z_][A-Za-z0-9_]*$ ]] || die "the database name may hold letters, digits and _ only: $DB"

BIN=$(pg_bin)
pg_start
"$BIN/pg_restore" --list "$FILE" >/dev/null 2>&1 || die "$FILE is not a backup made by backup.sh (pg_restore cannot read it)"

exists=$("$BIN/psql" -d postgres -tAc "SELECT 1 FROM pg_database WHERE datname = '$DB'")
if [ "$exists" = 1 ]; then
  tables=$("$BIN/psql" -d "$DB" -tAc \
    "SELECT count(*) FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema')")
  [ "$tables" = 0 ] || die "database $DB already holds $tables tables; restore into a new name (bash docker-free-scripts/restore.sh $FILE ${DB}_restored) or move $DB aside first"
else
  log "creating database $DB"
  "$BIN/createdb" "$DB"
fi

log "restoring $FILE into database $DB on 127.0.0.1:$PGPORT"
# One transaction: a restore that fails leaves the database empty, never half restored.
"$BIN/pg_restore" --no-owner --no-privileges --exit-on-error --single-transaction --dbname "$DB" "$FILE"
if [ "${PG_STARTED_HERE:-0}" = 1 ]; then pg_stop >/dev/null; fi
log "restored into $DB; run Kerfline on it with PGDATABASE=$DB"
