#!/usr/bin/env bash
# npm test: the same set-up as npm start (plus Chromium), on a separate test database,
# then every suite. Prints one closing "N passed, N failed" line; non-zero on any failure.
set -euo pipefail
cd "$(dirname "$0")/.."
export DB_NAME=${TEST_DB_NAME:-ripplehall_test}
export NODE_ENV=test
export CHROME_BIN=/usr/bin/chromium
export TMPDIR=${TMPDIR:-/tmp}
bash scripts/setup.sh --with-browser
exec npx tsx tests/run-suites.ts "$@"
