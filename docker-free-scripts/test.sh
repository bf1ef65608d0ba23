#!/usr/bin/env bash
# Runs every test of the workspace, the type check and lint. Prints "typecheck: ok|failed" and
# "lint: ok|failed" and ends with one line counting tests only: "N passed, N failed[, N skipped]".
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

# The type check and lint are not tests: they get lines of their own ("typecheck: ok"), the totals
# line counts tests only, and a failing check still fails the run.
checks=()
static_check() {
  local name="$1"; shift
  say "checking: $name"
  set +e
  (cd "$ROOT" && "$@")
  local code=$?
  set -e
  checks+=("--check=$name=$code")
}
static_check typecheck npx --yes "pnpm@$PNPM_VERSION" -r --reporter=append-only run typecheck
static_check lint ./node_modules/.bin/eslint .

node "$ROOT/docker-free-scripts/lib/summarize-tests.mjs" "${checks[@]}" "${reports[@]}"
