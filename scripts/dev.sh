#!/usr/bin/env bash
# npm run dev: the API in watch mode and Vite's dev server (proxying /api to it).
set -euo pipefail
. "$(dirname "$0")/env.sh"

ensure_deps
start_db
STOP_DB_ON_EXIT=1
start_redis
trap 'kill $(jobs -p) 2>/dev/null; cleanup_services' EXIT
trap 'exit 130' INT TERM
ensure_database "$DB_NAME"
npx --no-install tsx scripts/migrate.ts
npx --no-install tsx scripts/seed.ts
export NODE_ENV=development
npx --no-install tsx watch server/index.ts &
npx --no-install vite --host "$HOST"
