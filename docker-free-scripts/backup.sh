#!/usr/bin/env bash
# Writes a backup of Kerfline's database to the file you name, in PostgreSQL's custom format (compressed;
# restore it with restore.sh). Usage: bash docker-free-scripts/backup.sh FILE
# The database is $PGDATABASE (default kerfline) on the project's cluster, or $DATABASE_URL when set. The
# backup is consistent (one snapshot) and can be taken while Kerfline runs.
source "$(dirname "$0")/lib.sh"

[ $# -eq 1 ] && [ -n "$1" ] || die "usage: bash docker-free-scripts/backup.sh FILE   (for example backups/kerfline-$(date +%F).dump)"
FILE=$1
[ ! -e "$FILE" ] || die "$FILE exists already; name a new file (a backup never overwrites one)"
mkdir -p "$(dirname "$FILE")"

BIN=$(pg_bin)
if [ -n "${DATABASE_URL:-}" ]; then
  TARGET=(--dbname "$DATABASE_URL")
  WHAT="the database at DATABASE_URL"
else
  pg_start
  export PGDATABASE=${PGDATABASE:-kerfline}
  TARGET=(--dbname "$PGDATABASE")
  WHAT="database $PGDATABASE on 127.0.0.1:$PGPORT"
fi

log "backing up $WHAT to $FILE"
# Written beside the target first and moved into place only when complete, so FILE is never half a backup.
PARTIAL="$FILE.partial-$$"
trap 'rm -f "$PARTIAL"' EXIT
"$BIN/pg_dump" --format=custom --no-owner --no-privileges --file "$PARTIAL" "${TARGET[@]}"
mv "$PARTIAL" "$FILE"
trap - EXIT
if [ "${PG_STARTED_HERE:-0}" = 1 ]; then pg_stop >/dev/null; fi
log "backup written: $FILE ($(du -h "$FILE" | cut -f1)); restore it with: bash docker-free-scripts/restore.sh $FILE"
