#!/usr/bin/env bash
# npm run bench:search: MariaDB (started here if not running), the bench database migrated,
# then scripts/bench/search.ts.
set -euo pipefail
. "$(dirname "$0")/env.sh"

ensure_deps
start_db
trap cleanup_services EXIT
BENCH_DB="${DB_NAME}_bench"
recreate_database "$BENCH_DB"
export DB_NAME="$BENCH_DB"
export DATA_DIR="$DATA_DIR/bench"
mkdir -p "$DATA_DIR"
npx --no-install tsx scripts/migrate.ts
npx --no-install tsx scripts/bench/search.ts
