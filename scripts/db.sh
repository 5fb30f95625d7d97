#!/usr/bin/env bash
# Private MariaDB on loopback for Ripplehall: data in .data/mariadb, sockets and logs in .data/run.
# Usage: scripts/db.sh start | stop | status | reset DBNAME | ensure DBNAME
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$(pwd)
DATA_DIR=${DB_DATA_DIR:-$ROOT/.data/mariadb}
RUN_DIR=${DB_RUN_DIR:-$ROOT/.data/run}
PORT=${DB_PORT:-3407}
SOCK=$RUN_DIR/mysqld.sock
APP_USER=${DB_USER:-ripplehall}
APP_PASS=${DB_PASSWORD:-ripplehall}

client() { mariadb --no-defaults --protocol=socket --socket="$SOCK" -uroot "$@"; }
ping() { mariadb-admin --no-defaults --socket="$SOCK" -uroot ping >/dev/null 2>&1; }

start() {
  mkdir -p "$RUN_DIR"
  if ping; then return 0; fi
  if ! command -v mariadbd >/dev/null 2>&1; then
    echo "MariaDB is not installed: run 'npm start' (it installs mariadb-server) or 'apt-get install mariadb-server'." >&2
    exit 1
  fi
  if [ ! -d "$DATA_DIR/mysql" ]; then
    mkdir -p "$DATA_DIR"
    mariadb-install-db --no-defaults --user=root --auth-root-authentication-method=socket \
      --skip-test-db --datadir="$DATA_DIR" >"$RUN_DIR/install.log" 2>&1 \
      || { echo "Could not initialise the database folder $DATA_DIR; see $RUN_DIR/install.log" >&2; exit 1; }
  fi
  if (exec 3<>/dev/tcp/127.0.0.1/"$PORT") 2>/dev/null; then
    echo "Port $PORT on 127.0.0.1 is taken by another program: set DB_PORT to a free port." >&2
    exit 1
  fi
  rm -f "$SOCK"
  # setsid: the database outlives the shell that started it (npm start, npm test).
  setsid mariadbd --no-defaults --user=root --datadir="$DATA_DIR" --bind-address=127.0.0.1 \
    --port="$PORT" --socket="$SOCK" --pid-file="$RUN_DIR/mysqld.pid" --log-error="$RUN_DIR/error.log" \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci --default-time-zone=+00:00 \
    --innodb-buffer-pool-size=256M --max-connections=300 </dev/null >/dev/null 2>&1 &
  for _ in $(seq 1 100); do
    if ping; then break; fi
    sleep 0.2
  done
  ping || { echo "MariaDB did not start; see $RUN_DIR/error.log" >&2; tail -n 20 "$RUN_DIR/error.log" >&2 || true; exit 1; }
  client -e "CREATE USER IF NOT EXISTS '$APP_USER'@'127.0.0.1' IDENTIFIED BY '$APP_PASS';
             CREATE USER IF NOT EXISTS '$APP_USER'@'localhost' IDENTIFIED BY '$APP_PASS';"
}

ensure() {
  local name=$1
  client -e "CREATE DATABASE IF NOT EXISTS \`$name\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
             GRANT ALL PRIVILEGES ON \`$name\`.* TO '$APP_USER'@'127.0.0.1';
             GRANT ALL PRIVILEGES ON \`$name\`.* TO '$APP_USER'@'localhost';"
}

case "${1:-start}" in
  start) start ;;
  stop) ping && mariadb-admin --no-defaults --socket="$SOCK" -uroot shutdown || true ;;
  status) if ping; then echo "MariaDB running on 127.0.0.1:$PORT"; else echo "MariaDB not running"; exit 1; fi ;;
  ensure) start; ensure "${2:?database name}" ;;
  reset) start; client -e "DROP DATABASE IF EXISTS \`${2:?database name}\`;"; ensure "$2" ;;
  *) echo "usage: scripts/db.sh start|stop|status|ensure NAME|reset NAME" >&2; exit 2 ;;
esac
