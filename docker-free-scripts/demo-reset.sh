#!/usr/bin/env bash
# Drops the demo organization and its users, then loads the demo again (a new API token is
# printed). Other organizations are not touched. Needs Tagloom running (`npm start`, with the
# same PORT / PGPORT / PAYMENTS_PORT / TAGLOOM_DATA_DIR): the demo loads beside the product.
source "$(dirname "$0")/lib/common.sh"

export PORT="${PORT:-8080}"
export PGPORT="${PGPORT:-54329}"
export PAYMENTS_PORT="${PAYMENTS_PORT:-2590}"
export STRIPE_API_PORT="${STRIPE_API_PORT:-$PAYMENTS_PORT}"
export NODE_ENV="${NODE_ENV:-development}"
export PUBLIC_URL="${PUBLIC_URL:-http://127.0.0.1:$PORT}"
export UPLOAD_DIR="$DATA_DIR/uploads"

PID_FILE="$DATA_DIR/run/supervisor.pid"
if ! { [ -f "$PID_FILE" ] && kill -0 "$(cat "$PID_FILE")" 2>/dev/null; }; then
  fail "Tagloom is not running; start it with npm start (which loads the demo) first"
fi
if ! node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' "$PUBLIC_URL/api/health"; then
  fail "Tagloom does not answer on $PUBLIC_URL; run this with the PORT that npm start used"
fi
DATABASE_URL="$(bash "$ROOT/docker-free-scripts/pg.sh" url)"
export DATABASE_URL

say "removing the demo organization"
(cd "$ROOT/apps/api" && "$ROOT/node_modules/.bin/tsx" src/seed/demo-reset-cli.ts) || fail "could not remove the demo organization"
say "loading the demo again (trains two taggers, a minute or two)"
SEED_OUT="$(cd "$ROOT/apps/api" && "$ROOT/node_modules/.bin/tsx" src/seed/seed-cli.ts)" || fail "demo data failed to load (run npm run demo:reset again)"
printf '%s\n' "$SEED_OUT" | grep -v '^DEMO_' || true
say "demo reset; sign in as admin@demo.tagloom.test / demo-password-1"
print_demo_token "$SEED_OUT"
