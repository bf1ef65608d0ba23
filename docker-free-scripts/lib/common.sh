# Shared helpers for the docker-free scripts. Sourced, not run.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
PNPM_VERSION="12.4.2"
DATA_DIR="${TAGLOOM_DATA_DIR:-$ROOT/.data}"

say() { printf '[tagloom] %s\n' "$*"; }
fail() { printf '[tagloom] error: %s\n' "$*" >&2; exit 1; }

pnpm_run() { npx --yes "pnpm@$PNPM_VERSION" "$@"; }

as_root() {
  if [ "$(id -u)" = 0 ]; then "$@"; elif command -v sudo >/dev/null; then sudo "$@"; else
    fail "need root (or sudo) to run: $*"; fi
}

# Installs Debian packages that are missing; prints what it installs.
ensure_debian_packages() {
  local missing=()
  for p in "$@"; do
    dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
  done
  [ ${#missing[@]} -eq 0 ] && return 0
  say "installing from Debian: ${missing[*]} (one-time, may take a minute)"
  as_root apt-get update -q >/dev/null || fail "apt-get update failed; check the Debian package mirror"
  as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -q -o DPkg::Lock::Timeout=900 "${missing[@]}" >/dev/null \
    || fail "apt-get install ${missing[*]} failed"
}

# Is anything listening on 127.0.0.1:$1?
port_in_use() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

# Installs the workspace's dependencies with the pinned pnpm (fast when nothing changed).
bootstrap_dependencies() {
  say "installing dependencies (pnpm $PNPM_VERSION)"
  (cd "$ROOT" && pnpm_run install --frozen-lockfile --reporter=silent) || fail "dependency install failed"
}

# Prints the demo API token from the seed's output (only on the run that created it) with a
# ready curl call of the tagging API; prints a hint otherwise.
print_demo_token() {
  local out="$1" token corpus
  token="$(printf '%s\n' "$out" | sed -n 's/^DEMO_API_TOKEN=//p')"
  corpus="$(printf '%s\n' "$out" | sed -n 's/^DEMO_CORPUS_ID=//p')"
  if [ -z "$token" ]; then
    say "the demo API token was printed when the demo was first loaded; admins create new ones under API tokens"
    return 0
  fi
  say "demo API token (shown only now; keep it): $token"
  say "try the tagging API:"
  printf "  curl -s -X POST http://127.0.0.1:%s/api/v1/corpora/%s/tag \\\\\n    -H 'Authorization: Bearer %s' -H 'Content-Type: application/json' \\\\\n    -d '{\"text\": \"Orvel Castrane of Brindlewick Freight signed the order for Sallowmere.\"}'\n" "$PORT" "$corpus" "$token"
}
