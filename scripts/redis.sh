#!/usr/bin/env bash
# Private Redis on loopback for Ripplehall's job queue: data (append-only file) in .data/redis,
# pid file and log beside it. Usage: scripts/redis.sh start | stop | status
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$(pwd)
DATA_DIR=${REDIS_DATA_DIR:-$ROOT/.data/redis}
PORT=${REDIS_PORT:-6389}
PIDFILE=$DATA_DIR/redis.pid

ping() { [ "$(redis-cli -h 127.0.0.1 -p "$PORT" ping 2>/dev/null)" = "PONG" ]; }
ours() { [ -f "$PIDFILE" ] && kill -0 "$(cat "$PIDFILE")" 2>/dev/null; }

start() {
  mkdir -p "$DATA_DIR"
  if ping; then
    ours || echo "Port $PORT already answers as a Redis server that is not this folder's; using it." >&2
    return 0
  fi
  if ! command -v redis-server >/dev/null 2>&1; then
    echo "Redis is not installed: run 'npm start' (it installs redis-server) or 'apt-get install redis-server'." >&2
    exit 1
  fi
  if (exec 3<>/dev/tcp/127.0.0.1/"$PORT") 2>/dev/null; then
    echo "Port $PORT on 127.0.0.1 is taken by another program: set REDIS_PORT to a free port." >&2
    exit 1
  fi
  # A pid file left by a process killed with kill -9 would stop redis-server from writing its own.
  ours || rm -f "$PIDFILE"
  # noeviction: the queue's keys must never be evicted. appendfsync always: a write is on disk
  # before its reply, so kill -9 of redis-server (or of the machine) loses no acknowledged job.
  redis-server --bind 127.0.0.1 --port "$PORT" --dir "$DATA_DIR" --daemonize yes --pidfile "$PIDFILE" \
    --logfile "$DATA_DIR/redis.log" --appendonly yes --appendfsync always --save "" \
    --maxmemory-policy noeviction --protected-mode yes >/dev/null
  for _ in $(seq 1 100); do
    if ping; then return 0; fi
    sleep 0.1
  done
  echo "Redis did not start on 127.0.0.1:$PORT; see $DATA_DIR/redis.log" >&2
  tail -n 20 "$DATA_DIR/redis.log" >&2 || true
  exit 1
}

stop() {
  if ours && ping; then redis-cli -h 127.0.0.1 -p "$PORT" shutdown >/dev/null 2>&1 || true; fi
  for _ in $(seq 1 50); do
    ping || return 0
    sleep 0.1
  done
}

case "${1:-start}" in
  start) start ;;
  stop) stop ;;
  status) if ping; then echo "Redis running on 127.0.0.1:$PORT"; else echo "Redis not running"; exit 1; fi ;;
  *) echo "usage: scripts/redis.sh start|stop|status" >&2; exit 2 ;;
esac
