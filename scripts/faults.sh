#!/usr/bin/env bash
# npm run test:faults: two web processes, two worker processes, Redis and MariaDB on loopback,
# all of their own (ports, data folders, database), then kill -9 of each during a rehearsal
# (tests/faults/faults.test.ts). Stops what it started. Set FAULTS_REPORTER=tap for the runner.
set -euo pipefail
cd "$(dirname "$0")/.."
export FAULTS_DB_PORT=${FAULTS_DB_PORT:-3499} FAULTS_REDIS_PORT=${FAULTS_REDIS_PORT:-6499}
export FAULTS_WEB_PORTS=${FAULTS_WEB_PORTS:-4491,4492}
export DB_PORT=$FAULTS_DB_PORT REDIS_PORT=$FAULTS_REDIS_PORT DB_NAME=rh_faults
export DB_DATA_DIR=$PWD/.data/faults/mariadb DB_RUN_DIR=$PWD/.data/faults/run REDIS_DATA_DIR=$PWD/.data/faults/redis
unset REDIS_URL
export NODE_ENV=development LOG_LEVEL=${LOG_LEVEL:-warn}
cleanup() {
  bash scripts/redis.sh stop || true
  bash scripts/db.sh stop || true
}
trap cleanup EXIT
bash scripts/db.sh reset "$DB_NAME" >/dev/null
bash scripts/redis.sh start
redis-cli -h 127.0.0.1 -p "$REDIS_PORT" flushall >/dev/null
npx tsx db/migrate.ts >/dev/null
node --import tsx --test --test-concurrency=1 --test-timeout=300000 --test-reporter="${FAULTS_REPORTER:-spec}" tests/faults/faults.test.ts tests/faults/rehearsals-restart.test.ts
