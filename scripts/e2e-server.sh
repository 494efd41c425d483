#!/usr/bin/env bash
# Serves the built app on a fresh demo database for the browser journeys.
set -euo pipefail
cd "$(dirname "$0")/.."
port="${1:-3100}"
export DATABASE_URL="file:./data/e2e.db"
export DEMO_ANCHOR="${DEMO_ANCHOR:-2026-12-02}"
rm -f data/e2e.db data/e2e.db-wal data/e2e.db-shm
node --conditions=react-server --import tsx seeds/load.ts
exec node_modules/.bin/next start -H 127.0.0.1 -p "$port"
