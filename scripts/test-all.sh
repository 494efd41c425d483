#!/usr/bin/env bash
# The one test command (npm test): types, lint, unit, integration on SQLite (and PostgreSQL when
# TEST_PG_URL is set), a production build, then the browser journeys in Debian's Chromium.
# Any part that cannot run here says so on a line starting with "SKIPPED:".
set -euo pipefail
cd "$(dirname "$0")/.."
step() { printf '\n== %s\n' "$1"; }
start=$(date +%s)

step "type check"
npx tsc --noEmit -p tsconfig.json

step "format (prettier --check)"
npx prettier --check . --log-level warn

step "lint (including the layer rule)"
npx eslint .

step "import rules (dependency-cruiser: no cycles in lib/, no reaching into another domain's store)"
npx depcruise --config .dependency-cruiser.cjs lib app

step "unit tests"
npx vitest run --project unit

step "integration tests"
# PostgreSQL: TEST_PG_URL, or the local server these machines run, when it answers.
if [ -z "${TEST_PG_URL:-}" ] && command -v pg_isready >/dev/null && pg_isready -q -h 127.0.0.1 -p 5432; then
  export TEST_PG_URL="postgresql://postgres@127.0.0.1:5432/test"
fi
if [ -n "${TEST_PG_URL:-}" ]; then
  echo "SQLite and PostgreSQL (TEST_PG_URL=${TEST_PG_URL}; each run creates and drops its own databases)"
elif [ -n "${REQUIRE_PG:-}" ]; then
  echo "PostgreSQL is required (REQUIRE_PG is set) but no server answers on 127.0.0.1:5432 and TEST_PG_URL is unset" >&2
  exit 1
else
  echo "SKIPPED: PostgreSQL integration suite (no server on 127.0.0.1:5432; set TEST_PG_URL to run it)"
fi
npx vitest run --project integration

step "production build"
npx next build

step "browser journeys (Playwright)"
if [ -x /usr/bin/chromium ]; then
  npx playwright test
else
  echo "SKIPPED: browser journeys (Debian's Chromium is not installed: apt-get install -y chromium)"
fi

printf '\nAll test steps finished in %ss.\n' "$(( $(date +%s) - start ))"
