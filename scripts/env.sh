#!/usr/bin/env bash
# Shared set-up helpers for start.sh, test.sh and dev.sh. Source it; do not run it.
# Reads .env (if present) and fills in safe defaults for everything it does not set.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

if [ -f .env ]; then
  set -a
  # shellcheck disable=SC1091
  . ./.env
  set +a
fi

export PORT="${PORT:-3000}"
export HOST="${HOST:-127.0.0.1}"
export DB_HOST="${DB_HOST:-127.0.0.1}"
export DB_PORT="${DB_PORT:-3307}"
export DB_NAME="${DB_NAME:-sheetsmith}"
export DB_TEST_NAME="${DB_TEST_NAME:-sheetsmith_test}"
export DB_USER="${DB_USER:-sheetsmith}"
export DB_PASSWORD="${DB_PASSWORD:-sheetsmith-local-db}"
export DATA_DIR="${DATA_DIR:-.data}"
case "$DATA_DIR" in /*) ;; *) DATA_DIR="$ROOT/$DATA_DIR" ;; esac
export DATA_DIR

DB_DIR="$DATA_DIR/mariadb"
DB_DATADIR="$DB_DIR/data"
DB_RUN="$DB_DIR/run"
DB_PIDFILE="$DB_RUN/mariadbd.pid"
DB_LOG="$DB_DIR/mariadbd.log"
DB_SOCKET="$DB_RUN/mariadbd.sock"
# A Unix socket path must stay under about 107 bytes; fall back to /tmp for deep checkouts.
if [ "${#DB_SOCKET}" -gt 100 ]; then
  DB_SOCKET="/tmp/sheetsmith-$(printf '%s' "$DB_DIR" | md5sum | cut -c1-12).sock"
fi
export DB_SOCKET

# Redis for the job queues: our own on 127.0.0.1:$REDIS_PORT unless REDIS_URL points elsewhere.
export REDIS_PORT="${REDIS_PORT:-6390}"
REDIS_OWN_URL="redis://127.0.0.1:$REDIS_PORT"
export REDIS_URL="${REDIS_URL:-$REDIS_OWN_URL}"
REDIS_DIR="$DATA_DIR/redis"
REDIS_PIDFILE="$REDIS_DIR/redis.pid"
REDIS_LOG="$REDIS_DIR/redis.log"

log() { printf '\033[36m[sheetsmith]\033[0m %s\n' "$*"; }

as_root() {
  if [ "$(id -u)" -eq 0 ]; then "$@"; else sudo "$@"; fi
}

# npm ci when node_modules is missing or older than the lock file.
ensure_deps() {
  local stamp=node_modules/.package-lock.json
  if [ ! -d node_modules ] || [ ! -f "$stamp" ] || [ package-lock.json -nt "$stamp" ]; then
    log "installing npm packages (npm ci)"
    npm ci --no-audit --no-fund
    touch "$stamp"
  fi
}

ensure_mariadb_installed() {
  if command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ]; then return 0; fi
  log "installing MariaDB from Debian's mariadb-server package"
  as_root apt-get update -qq
  DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq mariadb-server >/dev/null
}

mariadbd_bin() { command -v mariadbd 2>/dev/null || echo /usr/sbin/mariadbd; }

db_admin() { mariadb --no-defaults --protocol=SOCKET --socket="$DB_SOCKET" -uroot "$@"; }

db_ping() {
  mariadb-admin --no-defaults --protocol=SOCKET --socket="$DB_SOCKET" -uroot ping >/dev/null 2>&1
}

db_running() {
  [ -f "$DB_PIDFILE" ] && kill -0 "$(cat "$DB_PIDFILE")" 2>/dev/null && db_ping
}

# Initialise into a temporary folder and rename it, so an interrupted first start
# never leaves a half-made data folder behind.
ensure_db_initialised() {
  if [ -d "$DB_DATADIR/mysql" ]; then return 0; fi
  log "initialising a private MariaDB data folder in $DB_DATADIR"
  mkdir -p "$DB_DIR"
  local tmp="$DB_DIR/data.init.$$"
  rm -rf "$tmp"
  mariadb-install-db --no-defaults --user="$(id -un)" --datadir="$tmp" \
    --auth-root-authentication-method=normal --skip-test-db >"$DB_DIR/install.log" 2>&1 \
    || { cat "$DB_DIR/install.log"; return 1; }
  rm -rf "$DB_DATADIR"
  mv "$tmp" "$DB_DATADIR"
}

# Starts our own mariadbd on 127.0.0.1:$DB_PORT. Sets DB_STARTED_HERE=1 when this call started it.
DB_STARTED_HERE=0
start_db() {
  ensure_mariadb_installed
  ensure_db_initialised
  mkdir -p "$DB_RUN"
  if db_running; then
    log "MariaDB already running on 127.0.0.1:$DB_PORT"
    return 0
  fi
  if [ "$DB_PORT" = "3306" ]; then
    log "DB_PORT=3306 is the system MariaDB's port; pick another (default 3307)"; return 1
  fi
  rm -f "$DB_PIDFILE" "$DB_SOCKET"
  log "starting MariaDB on 127.0.0.1:$DB_PORT"
  # setsid + nohup + no inherited pipes: the server never holds a CI pipe open.
  setsid nohup "$(mariadbd_bin)" --no-defaults --user="$(id -un)" --datadir="$DB_DATADIR" \
    --bind-address=127.0.0.1 --port="$DB_PORT" --socket="$DB_SOCKET" --pid-file="$DB_PIDFILE" \
    --log-error="$DB_LOG" --skip-name-resolve \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --innodb-buffer-pool-size=128M --max-connections=200 \
    </dev/null >/dev/null 2>&1 &
  local i
  for i in $(seq 1 120); do
    if db_ping; then DB_STARTED_HERE=1; return 0; fi
    sleep 0.25
  done
  log "MariaDB did not come up; its log follows"; tail -n 40 "$DB_LOG" || true
  return 1
}

# For EXIT traps: stops the database even when the terminal or a pipe reading our output is gone.
cleanup_db() {
  trap '' PIPE INT TERM
  set +e
  stop_db >/dev/null 2>&1
}

# Stops the server whose pid file is $2 (named $1 in the log), waiting up to $3 quarter seconds.
stop_by_pidfile() {
  if [ -f "$2" ]; then
    local pid; pid="$(cat "$2")"
    if kill -0 "$pid" 2>/dev/null; then
      log "stopping $1"
      kill "$pid" 2>/dev/null || true
      local i
      for i in $(seq 1 "$3"); do kill -0 "$pid" 2>/dev/null || return 0; sleep 0.25; done
    fi
  fi
}

stop_db() { stop_by_pidfile MariaDB "$DB_PIDFILE" 60; }

ensure_redis_installed() {
  if command -v redis-server >/dev/null 2>&1; then return 0; fi
  log "installing Redis from Debian's redis-server package"
  as_root apt-get update -qq >/dev/null
  DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq redis-server >/dev/null
}

redis_ping() { [ "$(redis-cli -p "$REDIS_PORT" -h 127.0.0.1 ping 2>/dev/null)" = "PONG" ]; }

# Starts our own redis-server on 127.0.0.1:$REDIS_PORT (never the system one on 6379), unless
# REDIS_URL names another Redis. Sets REDIS_STARTED_HERE=1 when this call started it.
REDIS_STARTED_HERE=0
start_redis() {
  if [ "$REDIS_URL" != "$REDIS_OWN_URL" ]; then log "using the Redis at $REDIS_URL"; return 0; fi
  if [ "$REDIS_PORT" = "6379" ]; then log "REDIS_PORT=6379 is the system Redis's port; pick another (default 6390)"; return 1; fi
  ensure_redis_installed
  mkdir -p "$REDIS_DIR"
  if redis_ping; then log "Redis already running on 127.0.0.1:$REDIS_PORT"; return 0; fi
  rm -f "$REDIS_PIDFILE"
  log "starting Redis on 127.0.0.1:$REDIS_PORT"
  # BullMQ needs noeviction: a queue must never lose a job to memory pressure.
  setsid nohup redis-server --port "$REDIS_PORT" --bind 127.0.0.1 --dir "$REDIS_DIR" --daemonize no \
    --save "" --appendonly yes --pidfile "$REDIS_PIDFILE" --logfile "$REDIS_LOG" --maxmemory-policy noeviction \
    </dev/null >/dev/null 2>&1 &
  local i
  for i in $(seq 1 80); do
    if redis_ping; then REDIS_STARTED_HERE=1; return 0; fi
    sleep 0.25
  done
  log "Redis did not come up; its log follows"; tail -n 40 "$REDIS_LOG" || true
  return 1
}

stop_redis() { stop_by_pidfile Redis "$REDIS_PIDFILE" 40; }

# For EXIT traps: stops what this script started, even when the terminal or pipe is gone.
cleanup_services() {
  trap '' PIPE INT TERM
  set +e
  if [ "${DB_STARTED_HERE:-0}" = "1" ] || [ "${STOP_DB_ON_EXIT:-0}" = "1" ]; then stop_db >/dev/null 2>&1; fi
  if [ "${REDIS_STARTED_HERE:-0}" = "1" ] || [ "${STOP_REDIS_ON_EXIT:-0}" = "1" ]; then stop_redis >/dev/null 2>&1; fi
}

sql_quote() { printf "%s" "$1" | sed "s/'/''/g"; }

# Creates a database and grants the application user on it (user created or its password reset).
ensure_database() {
  local name="$1" pw
  pw="$(sql_quote "$DB_PASSWORD")"
  db_admin <<SQL
CREATE DATABASE IF NOT EXISTS \`$name\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$pw';
CREATE USER IF NOT EXISTS '$DB_USER'@'localhost' IDENTIFIED BY '$pw';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$pw';
ALTER USER '$DB_USER'@'localhost' IDENTIFIED BY '$pw';
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$DB_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$DB_USER'@'localhost';
FLUSH PRIVILEGES;
SQL
}

# Lets the application user create and drop databases named PREFIX_… (tests make scratch ones).
grant_scratch_databases() {
  local prefix="$1"
  db_admin <<SQL
GRANT ALL PRIVILEGES ON \`${prefix}\\_%\`.* TO '$DB_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`${prefix}\\_%\`.* TO '$DB_USER'@'localhost';
FLUSH PRIVILEGES;
SQL
}

drop_scratch_databases() {
  local prefix="$1" name
  for name in $(db_admin -N -e "SHOW DATABASES LIKE '${prefix}\\_%'"); do
    db_admin -e "DROP DATABASE \`$name\`;"
  done
}

recreate_database() {
  db_admin -e "DROP DATABASE IF EXISTS \`$1\`;"
  ensure_database "$1"
}

# Debian's Chromium for the browser suites (never a browser download of a test tool's own).
ensure_chromium() {
  if [ -x /usr/bin/chromium ]; then return 0; fi
  log "installing Chromium from Debian's chromium package (browser tests)"
  as_root apt-get update -qq
  DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq chromium >/dev/null
}

# Rebuilds the client only when a source file is newer than the last build.
ensure_client_build() {
  if [ ! -f dist/index.html ] || [ -n "$(find src shared public index.html vite.config.ts tailwind.config.ts package-lock.json -newer dist/index.html -print -quit 2>/dev/null)" ]; then
    log "building the client"
    npx --no-install vite build --logLevel warn
  fi
}
