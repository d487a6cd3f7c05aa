#!/usr/bin/env bash
# npm run bench:load: the private MariaDB (started here if it is not running), a fresh bench
# database, then scripts/bench/load.ts, which starts the app itself and loads it.
set -euo pipefail
. "$(dirname "$0")/env.sh"

ensure_deps
start_db
start_redis
trap cleanup_services EXIT
BENCH_DB="${DB_NAME}_bench"
log "recreating the bench database $BENCH_DB"
recreate_database "$BENCH_DB"
export DB_NAME="$BENCH_DB"
export DATA_DIR="$DATA_DIR/bench"
rm -rf "$DATA_DIR"; mkdir -p "$DATA_DIR"
npx --no-install tsx scripts/bench/load.ts "$@"
