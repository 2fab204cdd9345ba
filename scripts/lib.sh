# Shared set-up for scripts/start.sh and scripts/test.sh (sourced, not run).
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$ROOT"
say() { echo "[tinctoria] $*" >&2; }

# Install npm dependencies when node_modules is missing or older than the lockfile.
ensure_deps() {
  local stamp=node_modules/.package-lock.json
  if [ ! -d node_modules ] || [ ! -f "$stamp" ] || [ package-lock.json -nt "$stamp" ] || [ package.json -nt "$stamp" ]; then
    say "installing npm dependencies (npm ci)"
    npm ci --no-audit --no-fund >&2
    touch "$stamp"
  fi
}

# The server as one ES module (esbuild; packages stay in node_modules): `npm start`, the tests' and the benchmark's
# server processes run it, so a server starts in about a second instead of compiling TypeScript on every start.
build_server() {
  node_modules/.bin/esbuild server/index.ts --bundle --platform=node --format=esm --packages=external \
    --target=node20 --sourcemap --outfile=dist/server/index.mjs --log-level=warning >&2
}

# Debian's Chromium drives the browser tests; never a downloaded browser.
ensure_chromium() {
  [ -x /usr/bin/chromium ] && return 0
  if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null 2>&1; then
    say "installing Debian's chromium for the browser tests"
    DEBIAN_FRONTEND=noninteractive apt-get update -qq >&2
    DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >&2
  else
    say "Debian's chromium is needed for the browser tests: sudo apt-get install chromium"; exit 1
  fi
}

# Start the project-local MariaDB unless DATABASE_URL points at an existing one.
STARTED_DB=0
ensure_db() {
  if [ -n "${DATABASE_URL:-}" ]; then say "using DATABASE_URL (no local MariaDB started)"; return 0; fi
  local envs; envs=$(bash scripts/db.sh start) || exit 1
  eval "$envs"
  STARTED_DB=1
}
stop_db() { if [ "$STARTED_DB" = 1 ]; then bash scripts/db.sh stop || true; STARTED_DB=0; fi; }
