#!/usr/bin/env bash
# The load and budget measurements (not part of infra/test.sh): the web bundle budget from the Vite
# manifest, then autocannon against two API instances behind nginx with a seeded club of 10,000
# cultures, beside a bare Express endpoint. Writes docs/performance.md (load section) and
# .data/bench/load.json. Loopback only.
#   BENCH_SECONDS=60 (5…300) BENCH_CONNECTIONS=200 BENCH_ROUNDS=3 bash infra/bench.sh
#   BENCH_SKIP_BUILD=1 reuses apps/web/dist.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
export TZ=UTC
ensure_postgres_installed
ensure_nginx_installed
ensure_node_deps
started_pg=0
if [ -z "${DATABASE_URL:-}" ] && ! pg_ready; then started_pg=1; fi
start_postgres
cleanup() { if [ "$started_pg" = 1 ]; then stop_postgres || true; fi; }
trap cleanup EXIT
export BENCH_ADMIN_DATABASE_URL="$(db_url postgres)"

status=0
if [ "${BENCH_SKIP_BUILD:-0}" != 1 ]; then pnpm --filter @barmkeep/web --silent build >/dev/null; fi
log "web bundle budget"
node infra/bundle-budget.mjs || status=1
log "load: two API instances behind nginx, ${BENCH_SECONDS:-60} s × ${BENCH_ROUNDS:-3} rounds at ${BENCH_CONNECTIONS:-200} connections"
(cd apps/api && pnpm exec tsx bench/load.ts) || status=1
exit $status
