#!/usr/bin/env bash
# Runs the benchmarks (never part of the test run): the tagger's speed and accuracy against the
# C reference and the open data in ../shared, then the API's import, query, export and autosave
# benchmarks, then the annotation screen's timing in Chromium. Each prints its own figures.
#   npm run bench [-- tagger|api|web]   (default: all)
source "$(dirname "$0")/lib/common.sh"

bootstrap_dependencies
ensure_debian_packages postgresql chromium gcc

what="${1:-all}"
if [ "$what" = all ] || [ "$what" = tagger ]; then
  say "tagger benchmarks"
  (cd "$ROOT/packages/tagger" && "$ROOT/node_modules/.bin/tsx" bench/run.ts)
  say "tagger benchmark: active learning on wikigold (uncertainty vs random picks)"
  (cd "$ROOT/packages/tagger" && "$ROOT/node_modules/.bin/tsx" bench/active-learning.ts)
fi
if [ "$what" = all ] || [ "$what" = api ]; then
  for f in "$ROOT"/apps/api/bench/*.ts; do
    [ -e "$f" ] || continue
    case "$(basename "$f")" in run.ts|_*) continue ;; esac
    say "api benchmark: $(basename "$f")"
    (cd "$ROOT/apps/api" && "$ROOT/node_modules/.bin/tsx" "bench/$(basename "$f")")
  done
fi
if [ "$what" = all ] || [ "$what" = web ]; then
  for f in "$ROOT"/apps/web/e2e/bench/*.ts; do
    [ -e "$f" ] || continue
    say "web benchmark: $(basename "$f")"
    (cd "$ROOT/apps/web" && npx vite build --logLevel warn && "$ROOT/node_modules/.bin/tsx" "e2e/bench/$(basename "$f")")
  done
fi
