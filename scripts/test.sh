#!/usr/bin/env bash
# npm test: the same set-up as npm start, a fresh test database, then every vitest suite.
set -euo pipefail
. "$(dirname "$0")/env.sh"

ensure_deps
ensure_chromium
ensure_client_build
start_db
start_redis
trap cleanup_services EXIT
log "recreating the test database $DB_TEST_NAME"
recreate_database "$DB_TEST_NAME"
drop_scratch_databases "$DB_TEST_NAME"
grant_scratch_databases "$DB_TEST_NAME"

export NODE_ENV=test
# Quiet test output even when .env sets a log level (TEST_LOG_LEVEL=info to see the logs).
export LOG_LEVEL="${TEST_LOG_LEVEL:-silent}"
export DB_NAME="$DB_TEST_NAME"
export DATA_DIR="$DATA_DIR/test"
rm -rf "$DATA_DIR"; mkdir -p "$DATA_DIR"
# Lint first (import boundaries included): a violation fails the run before any test does.
if [ "$#" -eq 0 ]; then
  log "linting (npm run lint), unused exports and files (npm run lint:dead), the format (npm run format:check)"
  npx --no-install eslint .
  npx --no-install knip
  npx --no-install prettier --check . --log-level warn
fi
npx --no-install vitest run "$@"
