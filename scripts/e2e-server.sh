#!/usr/bin/env bash
# Serves the built app on a fresh demo database for the browser journeys.
#   e2e-server.sh <port> [sqlite|postgresql]
set -euo pipefail
cd "$(dirname "$0")/.."
port="${1:-3100}"
provider="${2:-sqlite}"
export DEMO_ANCHOR="${DEMO_ANCHOR:-2026-12-02}"
if [ "$provider" = "postgresql" ]; then
  base="${TEST_PG_URL:-postgresql://postgres@127.0.0.1:5432/test}"
  name="tracevat_e2e_${port}"
  node -e '
    const pg = require("pg");
    const c = new pg.Client({ connectionString: process.argv[1] });
    c.connect().then(() => c.query(`DROP DATABASE IF EXISTS "${process.argv[2]}" WITH (FORCE)`)).then(() => c.query(`CREATE DATABASE "${process.argv[2]}"`)).then(() => c.end());
  ' "$base" "$name"
  export DATABASE_URL="${base%/*}/${name}"
  export DEMO_DAYS="${DEMO_DAYS:-20}"
else
  export DATABASE_URL="file:./data/e2e-${port}.db"
  rm -f "data/e2e-${port}.db" "data/e2e-${port}.db-wal" "data/e2e-${port}.db-shm"
fi
node --conditions=react-server --import tsx seeds/load.ts
exec node_modules/.bin/next start -H 127.0.0.1 -p "$port"
