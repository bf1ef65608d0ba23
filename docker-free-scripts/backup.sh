#!/usr/bin/env bash
# Dump and restore the database with PostgreSQL's own tools (Debian's postgresql package).
#   backup.sh dump [FILE]      custom-format dump (pg_dump -Fc); FILE defaults to
#                              $TAGLOOM_DATA_DIR/backups/tagloom-<UTC time>.dump
#   backup.sh restore FILE     restores FILE into an EMPTY database (pg_restore); refuses a
#                              database that already holds tables, so nothing is overwritten
# The database is DATABASE_URL, or the private cluster of `npm start` (pg.sh url) when unset.
source "$(dirname "$0")/lib/common.sh"

pg_tool() {
  local d
  d=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  [ -n "$d" ] || { ensure_debian_packages postgresql; d=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1); }
  echo "$d/$1"
}

URL="${DATABASE_URL:-$(bash "$(dirname "$0")/pg.sh" url)}"
# Never print the password that may be in the URL.
SHOWN_URL="$(printf '%s' "$URL" | sed -E 's#(://[^:/@]+):[^@]*@#\1:***@#')"

case "${1:-}" in
  dump)
    FILE="${2:-$DATA_DIR/backups/tagloom-$(date -u +%Y%m%dT%H%M%SZ).dump}"
    mkdir -p "$(dirname "$FILE")"
    "$(pg_tool pg_dump)" --format=custom --no-owner --no-privileges --file="$FILE.partial" --dbname="$URL" \
      || { rm -f "$FILE.partial"; fail "pg_dump of $SHOWN_URL failed"; }
    # Renamed only when complete, so a FILE that exists is a whole dump.
    mv "$FILE.partial" "$FILE"
    say "dumped $SHOWN_URL to $FILE ($(du -h "$FILE" | cut -f1))"
    ;;
  restore)
    FILE="${2:-}"
    [ -n "$FILE" ] || fail "usage: backup.sh restore FILE"
    [ -f "$FILE" ] || fail "no dump at $FILE"
    "$(pg_tool pg_restore)" --list "$FILE" >/dev/null 2>&1 || fail "$FILE is not a dump made by backup.sh dump (pg_restore cannot read it)"
    TABLES="$("$(pg_tool psql)" --dbname="$URL" -qtAc "SELECT count(*) FROM pg_tables WHERE schemaname NOT IN ('pg_catalog','information_schema')")" \
      || fail "cannot connect to $SHOWN_URL"
    [ "$TABLES" = 0 ] || fail "$SHOWN_URL already holds $TABLES tables; restore into an empty database (createdb a new one, or pg.sh reset)"
    "$(pg_tool pg_restore)" --no-owner --no-privileges --exit-on-error --single-transaction --dbname="$URL" "$FILE" \
      || fail "pg_restore into $SHOWN_URL failed; nothing was restored (one transaction)"
    say "restored $FILE into $SHOWN_URL"
    ;;
  *) echo "usage: backup.sh dump [FILE] | restore FILE" >&2; exit 2 ;;
esac
