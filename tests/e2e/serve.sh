#!/usr/bin/env bash
# Starts the built app + API for the browser tests on its own database (never the dev one).
set -euo pipefail
ROOT="$(cd "$(dirname "$0")/../.." && pwd)"
PORT="${E2E_PORT:-3100}"
if [ -z "${E2E_DATABASE_URL:-}" ]; then
  psql -h 127.0.0.1 -p "${PGPORT:-54329}" -U app -d postgres -qAt \
    -c "select 1 from pg_database where datname='barmkeep_e2e'" | grep -q 1 ||
    psql -h 127.0.0.1 -p "${PGPORT:-54329}" -U app -d postgres -q -c 'create database barmkeep_e2e'
  E2E_DATABASE_URL="postgres://app@127.0.0.1:${PGPORT:-54329}/barmkeep_e2e"
fi
[ -f "$ROOT/apps/web/dist/index.html" ] || pnpm --dir "$ROOT" --filter @barmkeep/web build >/dev/null
cd "$ROOT/apps/api"
export NODE_ENV=production DATABASE_URL="$E2E_DATABASE_URL" PORT="$PORT" HOST=127.0.0.1 \
  APP_URL="http://127.0.0.1:$PORT" FAKE_SMTP=1 SEED_DEMO=0 AUTH_RATE_LIMIT=1000 LOG_LEVEL=warn
exec pnpm exec tsx src/server.ts
