#!/usr/bin/env bash
# npm start: install what is missing, start MariaDB, build the client, then the
# server (which migrates, seeds the demo into an empty database, starts the
# local mail fake and listens). Ctrl-C stops everything started here.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
DEV=0; [ "${1:-}" = "--dev" ] && DEV=1
export DATA_DIR=$(realpath -m "${DATA_DIR:-$ROOT/.data}")
mkdir -p "$DATA_DIR"
ensure_deps
ensure_db
PIDS=()
cleanup() {
  trap - INT TERM EXIT
  for p in "${PIDS[@]}"; do kill -TERM "$p" 2>/dev/null || true; done
  for p in "${PIDS[@]}"; do wait "$p" 2>/dev/null || true; done
  stop_db
}
trap cleanup EXIT
trap 'exit 130' INT TERM
if [ "$DEV" = 1 ]; then
  export APP_DEV=1
  node --import tsx --watch-path=server --watch-path=shared server/index.ts & PIDS+=($!)
  node_modules/.bin/vite --host 127.0.0.1 & PIDS+=($!)
else
  say "building the client and the server"
  node_modules/.bin/vite build --logLevel warn >&2
  build_server
  node --enable-source-maps dist/server/index.mjs & PIDS+=($!)
fi
wait -n "${PIDS[@]}"
