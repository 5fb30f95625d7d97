#!/usr/bin/env bash
# Fresh test database: drop, create, migrate. Never touches the demo database.
set -euo pipefail
cd "$(dirname "$0")/.."
name=${DB_NAME:?set DB_NAME (a test database name)}
case "$name" in ripplehall) echo "Refusing to reset the demo database; use a test name." >&2; exit 2 ;; esac
bash scripts/db.sh reset "$name" >/dev/null
npx tsx db/migrate.ts >/dev/null
