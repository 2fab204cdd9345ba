#!/usr/bin/env bash
# npm run bench: benchmarks against a throwaway MariaDB (never the demo data).
# Prints a table and writes the figures to .data/bench/results.json.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
export DATA_DIR=$(realpath -m "${BENCH_DATA_DIR:-$ROOT/.data/bench}")
export NODE_ENV=test SEED=none DB_NAME=tinctoria_bench
# Files written by the benchmarks stay inside the throwaway data directory.
export UPLOADS_DIR="${UPLOADS_DIR:-$DATA_DIR/uploads}"
if [ -z "${DATABASE_URL:-}" ]; then bash scripts/db.sh stop 2>/dev/null || true; rm -rf "$DATA_DIR"; fi
mkdir -p "$DATA_DIR"
ensure_deps
ensure_db
build_server
trap stop_db EXIT
trap 'exit 130' INT TERM
node --import tsx tests/bench/run.ts "$@"
