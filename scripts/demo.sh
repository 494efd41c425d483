#!/usr/bin/env bash
# Builds the app if needed, creates the SQLite database with the demo plant on first start, and serves it.
set -euo pipefail
cd "$(dirname "$0")/.."
export DATABASE_URL="${DATABASE_URL:-file:./data/tracevat.db}"
port="${PORT:-3100}"
if [ ! -f .next/BUILD_ID ] || [ -n "$(find app lib -newer .next/BUILD_ID -name '*.ts*' -print -quit)" ]; then
  echo "Building the app (about a minute on 2 cores)…"
  mkdir -p data
  npx next build > data/build.log 2>&1 || { cat data/build.log; exit 1; }
fi
npx tsx prisma/migrate.ts deploy
node --conditions=react-server --import tsx seeds/load.ts
cat <<TXT

Tracevat is running for the demo plant "Quillmoor Fuel Works":  http://127.0.0.1:${port}/
Database: ${DATABASE_URL}   (npm run db:reset-demo rebuilds the demo)
Demo accounts (password for all: quillmoor-demo):
  collector.ivo, collector.mira, collector.odo   collectors
  production.tess, production.rafe               production
  compliance.nell                                compliance
  admin.jory                                     administrator
Stop with Ctrl+C.
TXT
exec node_modules/.bin/next start -H 127.0.0.1 -p "$port"
