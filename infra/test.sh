#!/usr/bin/env bash
# The whole test command: installs what is missing, starts PostgreSQL on loopback, then runs
# typecheck, lint, unit, API-integration and browser tests, and ends with "N passed, N failed".
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
export TZ=UTC
export CI="${CI:-}"
ensure_postgres_installed
ensure_chromium_installed
ensure_nginx_installed
ensure_node_deps

started_pg=0
if [ -z "${DATABASE_URL:-}" ] && ! pg_ready; then started_pg=1; fi
start_postgres
E2E_DB="barmkeep_e2e_$(date +%s)_$$"
cleanup() {
  psql_admin -c "drop database if exists \"$E2E_DB\" with (force)" >/dev/null 2>&1 || true
  if [ "$started_pg" = 1 ]; then stop_postgres || true; fi
}
trap cleanup EXIT

OUT="$ROOT/.data/test-results"
rm -rf "$OUT"; mkdir -p "$OUT"
suites=()

check() { # check NAME CMD... — a pass/fail gate recorded as one result
  local name=$1; shift
  log "$name"
  if "$@"; then echo '{"ok":true}' > "$OUT/$name.json"; else echo '{"ok":false}' > "$OUT/$name.json"; fi
  suites+=("$name:check")
}
vitest_suite() { # vitest_suite NAME FILTER
  log "tests: $1"
  pnpm --filter "$2" exec vitest run --reporter=default --reporter=json --outputFile.json="$OUT/$1.json" || true
  suites+=("$1:vitest")
}

check typecheck pnpm -r --reporter=append-only typecheck
check lint pnpm --silent exec eslint .
check format pnpm --silent exec prettier --check . --log-level warn
vitest_suite core @barmkeep/core
vitest_suite web @barmkeep/web
export TEST_ADMIN_DATABASE_URL="$(db_url postgres)"
vitest_suite api @barmkeep/api
check build pnpm --filter @barmkeep/web --silent build
check bundle-budget node infra/bundle-budget.mjs

log "browser tests (Playwright + Debian chromium)"
psql_admin -c "create database \"$E2E_DB\"" >/dev/null
export E2E_DATABASE_URL="$(db_url "$E2E_DB")"
PLAYWRIGHT_JSON_OUTPUT_NAME="$OUT/e2e.json" pnpm --filter @barmkeep/e2e exec playwright test --reporter=list,json || true
suites+=("e2e:playwright")

echo
node infra/summarize.mjs "$OUT" "${suites[@]}"
