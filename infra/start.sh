#!/usr/bin/env bash
# One command for a fresh machine: install what is missing, start PostgreSQL, migrate, seed the
# demo scenario into an empty database, build the web app and serve app + API on :3000, with the
# reminders worker (apps/api/src/worker.ts) running beside it; stopping the API stops the worker.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_postgres_installed
ensure_node_deps
start_postgres
ensure_database barmkeep
log "building the web app"
pnpm --filter @barmkeep/web build >/dev/null
export DATABASE_URL="$(db_url barmkeep)"
export NODE_ENV="${NODE_ENV:-production}"
export PORT="${PORT:-3000}"
export HOST="${HOST:-127.0.0.1}"
export APP_URL="${APP_URL:-http://127.0.0.1:$PORT}"
export FAKE_SMTP="${FAKE_SMTP:-1}"
export SEED_DEMO="${SEED_DEMO:-1}"
# A fixed port for the fake inbox, so the worker can deliver reminder mail into the API's inbox.
export FAKE_SMTP_PORT="${FAKE_SMTP_PORT:-2525}"
cd apps/api
log "starting the reminders worker"
node --import tsx src/worker.ts &
WORKER_PID=$!
stop_worker() { kill "$WORKER_PID" 2>/dev/null && wait "$WORKER_PID" 2>/dev/null; }
trap stop_worker EXIT
trap 'exit 130' INT
trap 'exit 143' TERM
pnpm exec tsx src/server.ts
