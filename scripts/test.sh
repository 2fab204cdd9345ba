#!/usr/bin/env bash
# npm test: the same set-up as npm start against a throwaway data directory and
# database, then every suite (unit, API, browser). Leaves no process running.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
export DATA_DIR=$(realpath -m "${TEST_DATA_DIR:-$ROOT/.data/test}")
export NODE_ENV=test
# Photos uploaded by the tests and the demo seed stay inside the throwaway data directory.
export UPLOADS_DIR="${UPLOADS_DIR:-$DATA_DIR/uploads}"
if [ -z "${DATABASE_URL:-}" ]; then bash scripts/db.sh stop 2>/dev/null || true; rm -rf "$DATA_DIR"; fi
mkdir -p "$DATA_DIR"
export DB_NAME=tinctoria_test
ensure_deps
ensure_chromium
ensure_db
trap stop_db EXIT
trap 'exit 130' INT TERM
say "building the client and the server"
node_modules/.bin/vite build --logLevel warn >&2
build_server
set +e
node_modules/.bin/vitest run --reporter=default --reporter=json --outputFile.json="$DATA_DIR/vitest-report.json" "$@"
status=$?
set -e
exit $status
