#!/usr/bin/env bash
# npm start: set everything up on this machine, then serve Ripplehall on one port.
set -euo pipefail
cd "$(dirname "$0")/.."
export DB_NAME=${DB_NAME:-ripplehall}
bash scripts/setup.sh
npx tsx seed-data/load.ts
echo "Building the client..."
npx ng build --configuration production >/tmp/ripplehall-build.log 2>&1 || { tail -n 40 /tmp/ripplehall-build.log; echo "The client build failed (full log: /tmp/ripplehall-build.log)." >&2; exit 1; }
PORT=${PORT:-4300}
cat <<MSG

  Ripplehall is starting on http://127.0.0.1:${PORT}
  Demo admin:        ${ADMIN_EMAIL:-admin@ripplehall.local} / ${ADMIN_PASSWORD:-admin-demo-2026}
  Demo facilitator:  facilitator@ripplehall.local / facilitate-demo-2026
  Stop with Ctrl-C. The database keeps running in the background (bash scripts/db.sh stop ends it).

MSG
export PORT
exec npx tsx server/main.ts
