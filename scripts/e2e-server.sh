#!/usr/bin/env bash
# Serves the built app on a fresh PostgreSQL demo database (a shorter demo) for the browser journeys'
# PostgreSQL project. The SQLite journeys start their own plants (e2e/support/plant.ts).
#   e2e-server.sh <port>
set -euo pipefail
cd "$(dirname "$0")/.."
port="${1:-3100}"
export DEMO_ANCHOR="${DEMO_ANCHOR:-2026-12-02}"
base="${TEST_PG_URL:-postgresql://postgres@127.0.0.1:5432/test}"
name="tracevat_e2e_${port}"
node -e '
  const pg = require("pg");
  const c = new pg.Client({ connectionString: process.argv[1] });
  c.connect().then(() => c.query(`DROP DATABASE IF EXISTS "${process.argv[2]}" WITH (FORCE)`)).then(() => c.query(`CREATE DATABASE "${process.argv[2]}"`)).then(() => c.end());
' "$base" "$name"
export DATABASE_URL="${base%/*}/${name}"
export DEMO_DAYS="${DEMO_DAYS:-20}"
node --conditions=react-server --import tsx seeds/load.ts
exec node_modules/.bin/next start -H 127.0.0.1 -p "$port"
