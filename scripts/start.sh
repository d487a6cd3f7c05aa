#!/usr/bin/env bash
# npm start: every set-up step, then the app on http://$HOST:$PORT. Ctrl-C stops app and database.
set -euo pipefail
. "$(dirname "$0")/env.sh"

ensure_deps
start_db
STOP_DB_ON_EXIT=1
start_redis
STOP_REDIS_ON_EXIT=$REDIS_STARTED_HERE
trap cleanup_services EXIT
trap 'exit 130' INT TERM
ensure_database "$DB_NAME"

log "running migrations"
npx --no-install tsx scripts/migrate.ts
log "seeding the demo shop"
npx --no-install tsx scripts/seed.ts

ensure_client_build

export NODE_ENV="${NODE_ENV:-production}"
npx --no-install tsx server/index.ts
