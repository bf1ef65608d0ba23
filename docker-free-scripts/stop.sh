#!/usr/bin/env bash
# Stops what `npm start` started: the app processes and the private PostgreSQL.
#   stop.sh [--keep-db]
source "$(dirname "$0")/lib/common.sh"

PID_FILE="$DATA_DIR/run/supervisor.pid"
if [ -f "$PID_FILE" ]; then
  pid="$(cat "$PID_FILE")"
  if kill -0 "$pid" 2>/dev/null; then
    # The supervisor leads its own process group (setsid): end the whole group.
    kill -TERM -- "-$pid" 2>/dev/null || kill -TERM "$pid" 2>/dev/null || true
    for _ in $(seq 1 40); do kill -0 "$pid" 2>/dev/null || break; sleep 0.25; done
    kill -KILL -- "-$pid" 2>/dev/null || true
    say "Tagloom stopped"
  else
    say "Tagloom was not running"
  fi
  rm -f "$PID_FILE"
else
  say "Tagloom was not running"
fi

if [ "${1:-}" != "--keep-db" ]; then
  bash "$ROOT/docker-free-scripts/pg.sh" stop
fi
