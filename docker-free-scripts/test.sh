#!/usr/bin/env bash
# Runs every test of the workspace and ends with one line: "N passed, N failed[, N skipped]".
# Needs only Node.js 20 and npm: installs dependencies, PostgreSQL, Chromium and NLTK (Debian) when
# missing. Each suite starts its own throwaway PostgreSQL on a free port; nothing is left running.
source "$(dirname "$0")/lib/common.sh"

bootstrap_dependencies
ensure_debian_packages postgresql chromium python3-nltk

RUN_DIR="$(mktemp -d /tmp/tagloom-test-XXXXXX)"
chmod 755 "$RUN_DIR"
export TAGLOOM_TEST_TMP="$RUN_DIR"
RESULTS="$RUN_DIR/results"
mkdir -p "$RESULTS"

cleanup() {
  # Stop any cluster a crashed suite left behind in this run's folder, then remove the folder.
  for pid_file in "$RUN_DIR"/*/data/postmaster.pid; do
    [ -f "$pid_file" ] || continue
    local pid; pid=$(head -n 1 "$pid_file")
    kill -QUIT "$pid" 2>/dev/null || true
  done
  sleep 0.3
  rm -rf "$RUN_DIR"
}
trap cleanup EXIT

say "building the web app for the browser tests"
(cd "$ROOT/apps/web" && node scripts/copy-fonts.mjs && npx vite build --logLevel warn) || fail "web build failed"

reports=()
for suite in packages/contracts packages/tagger apps/fakes apps/api apps/web; do
  name="${suite##*/}"
  say "testing $suite"
  set +e
  (cd "$ROOT/$suite" && npx vitest run --reporter=default --reporter=json --outputFile.json="$RESULTS/$name.json")
  code=$?
  set -e
  reports+=("$name=$RESULTS/$name.json=$code")
done

# Type checks and lint count as one check each in the totals.
static_check() {
  local name="$1"; shift
  say "checking: $name"
  if (cd "$ROOT" && "$@"); then
    printf '{"numPassedTests":1,"numFailedTests":0,"numPendingTests":0,"numTodoTests":0,"testResults":[]}' > "$RESULTS/$name.json"
    reports+=("$name=$RESULTS/$name.json=0")
  else
    printf '{"numPassedTests":0,"numFailedTests":1,"numPendingTests":0,"numTodoTests":0,"testResults":[]}' > "$RESULTS/$name.json"
    reports+=("$name=$RESULTS/$name.json=1")
  fi
}
static_check typecheck npx --yes "pnpm@$PNPM_VERSION" -r --reporter=append-only run typecheck
static_check lint ./node_modules/.bin/eslint .

node "$ROOT/docker-free-scripts/lib/summarize-tests.mjs" "${reports[@]}"
