#!/usr/bin/env bash
# One-time and every-time set-up shared by `npm start` and `npm test`:
# Debian packages, node_modules, the private MariaDB and Redis, migrations.
# Usage: scripts/setup.sh [--with-browser]
set -euo pipefail
cd "$(dirname "$0")/.."

need_pkgs=()
command -v mariadbd >/dev/null 2>&1 || need_pkgs+=(mariadb-server)
command -v redis-server >/dev/null 2>&1 || need_pkgs+=(redis-server)
if [ "${1:-}" = "--with-browser" ]; then
  [ -x /usr/bin/chromium ] || need_pkgs+=(chromium)
fi
if [ ${#need_pkgs[@]} -gt 0 ]; then
  echo "Installing Debian packages: ${need_pkgs[*]}"
  if [ "$(id -u)" -ne 0 ]; then
    echo "Installing ${need_pkgs[*]} needs root: run 'sudo apt-get install ${need_pkgs[*]}' once, then try again." >&2
    exit 1
  fi
  export DEBIAN_FRONTEND=noninteractive
  # Another apt-get or unattended upgrade may hold the dpkg lock: wait for it (up to 10 minutes)
  # instead of failing at once.
  apt_wait() {
    local out
    for attempt in $(seq 1 120); do
      if out=$(apt-get -o DPkg::Lock::Timeout=5 "$@" 2>&1); then return 0; fi
      if ! grep -qiE 'could not get lock|unable to lock|lock-frontend|is another process using it' <<<"$out"; then
        echo "$out" >&2
        return 1
      fi
      [ "$attempt" -eq 1 ] && echo "Another program is installing packages (the dpkg lock is taken); waiting for it to finish..."
      sleep 5
    done
    echo "The dpkg lock stayed taken for 10 minutes; finish the other installation, then run this again." >&2
    return 1
  }
  apt_wait update -qq
  apt_wait install -y -qq --no-install-recommends "${need_pkgs[@]}" >/dev/null
  # The Debian package starts a system server on 3306; ours runs privately, so stop that one.
  # The same for Redis on 6379.
  (service mariadb stop >/dev/null 2>&1 || true)
  (service redis-server stop >/dev/null 2>&1 || true)
fi

# npm ci when node_modules is missing or was installed from another lock file.
lock_hash=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ ! -f node_modules/.ripplehall-lock ] || [ "$(cat node_modules/.ripplehall-lock)" != "$lock_hash" ]; then
  echo "Installing npm packages (npm ci)..."
  npm ci --no-audit --no-fund --loglevel=error
  echo "$lock_hash" > node_modules/.ripplehall-lock
fi

bash scripts/redis.sh start
bash scripts/db.sh ensure "${DB_NAME:-ripplehall}"
npx tsx db/migrate.ts
