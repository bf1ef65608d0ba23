#!/usr/bin/env bash
# Starts Tagloom with demo data on http://127.0.0.1:${PORT:-8080}: installs dependencies, starts a
# private PostgreSQL (installed from Debian if missing), migrates, seeds, builds the web app, and
# runs the API, a worker and the local fakes in the background. Safe to run again: it restarts the
# app processes and keeps the data. `npm stop` stops everything.
source "$(dirname "$0")/lib/common.sh"

export PORT="${PORT:-8080}"
export PGPORT="${PGPORT:-54329}"
export SMTP_PORT="${SMTP_PORT:-2525}"
export MAIL_CATCHER_PORT="${MAIL_CATCHER_PORT:-2580}"
export PAYMENTS_PORT="${PAYMENTS_PORT:-2590}"
# The API's payments SDK talks to the local payments fake unless pointed elsewhere.
export STRIPE_API_PORT="${STRIPE_API_PORT:-$PAYMENTS_PORT}"
RUN_DIR="$DATA_DIR/run"
PID_FILE="$RUN_DIR/supervisor.pid"
LOG_FILE="$RUN_DIR/tagloom.log"

bootstrap_dependencies
bash "$ROOT/docker-free-scripts/pg.sh" start
DATABASE_URL="$(bash "$ROOT/docker-free-scripts/pg.sh" url)"
export DATABASE_URL

# A second start replaces the running app processes (PostgreSQL and the data stay).
if [ -f "$PID_FILE" ] && kill -0 "$(cat "$PID_FILE")" 2>/dev/null; then
  say "Tagloom is already running; restarting its processes"
  bash "$ROOT/docker-free-scripts/stop.sh" --keep-db
fi

for pair in "PORT:$PORT" "SMTP_PORT:$SMTP_PORT" "MAIL_CATCHER_PORT:$MAIL_CATCHER_PORT" "PAYMENTS_PORT:$PAYMENTS_PORT"; do
  var="${pair%%:*}"; port="${pair#*:}"
  if port_in_use "$port"; then
    fail "port $port on 127.0.0.1 is taken by another program; choose another with $var=<port> npm start"
  fi
done

export NODE_ENV="${NODE_ENV:-development}"
export HOST=127.0.0.1
export PUBLIC_URL="${PUBLIC_URL:-http://127.0.0.1:$PORT}"
export WEB_DIST="$ROOT/apps/web/dist"
export MAIL_CATCHER_URL="http://127.0.0.1:$MAIL_CATCHER_PORT"
export UPLOAD_DIR="$DATA_DIR/uploads"
# The payments fake keeps the demo's subscription and invoices here, so a second start still knows them.
export PAYMENTS_STATE_FILE="${PAYMENTS_STATE_FILE:-$DATA_DIR/payments-fake.json}"

say "migrating the database"
(cd "$ROOT/apps/api" && "$ROOT/node_modules/.bin/tsx" src/db/migrate-cli.ts latest) || fail "migrations failed"
say "building the web app"
(cd "$ROOT/apps/web" && node scripts/copy-fonts.mjs && "$ROOT/apps/web/node_modules/.bin/vite" build --logLevel warn) || fail "web build failed"

mkdir -p "$RUN_DIR"
nohup setsid node "$ROOT/docker-free-scripts/lib/supervise.mjs" >>"$LOG_FILE" 2>&1 < /dev/null &
echo $! > "$PID_FILE"

up=0
for _ in $(seq 1 120); do
  if node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' "http://127.0.0.1:$PORT/api/health"; then
    up=1; break
  fi
  if ! kill -0 "$(cat "$PID_FILE")" 2>/dev/null; then break; fi
  sleep 0.5
done
if [ "$up" != 1 ]; then
  tail -n 40 "$LOG_FILE" >&2 || true
  fail "Tagloom did not answer on http://127.0.0.1:$PORT/api/health; see $LOG_FILE"
fi

# The demo loads with the product running: its seats are bought on the payments fake (whose
# webhooks reach the API) and its taggers are trained by the worker.
say "loading demo data (once; the first time trains two taggers, a few minutes)"
SEED_OUT="$(cd "$ROOT/apps/api" && "$ROOT/node_modules/.bin/tsx" src/seed/seed-cli.ts)" || fail "demo data failed to load (npm run demo:reset starts it over)"
printf '%s\n' "$SEED_OUT" | grep -v '^DEMO_' || true

say "Tagloom is running at http://127.0.0.1:$PORT"
say "demo sign-in: admin@demo.tagloom.test / demo-password-1 (more demo users in the README)"
say "e-mails sent by the app: http://127.0.0.1:$PORT/dev/outbox   logs: $LOG_FILE   stop: npm stop"
print_demo_token "$SEED_OUT"
