#!/usr/bin/env bash
# The load and budget measurements (not part of infra/test.sh): the web bundle budget from the Vite
# manifest, Lighthouse (desktop preset, Debian's chromium) on the library, sign-in and a culture page
# (tests/perf/lighthouse.ts), then autocannon against two API instances behind nginx with a seeded
# club of 10,000 cultures, beside a bare Express endpoint. Writes docs/performance.md (lighthouse and
# load sections), .data/bench/load.json and .data/bench/lighthouse/. Loopback only.
#   BENCH_SECONDS=60 (5…300) BENCH_CONNECTIONS=200 BENCH_ROUNDS=3 bash infra/bench.sh
#   BENCH_SKIP_BUILD=1 reuses apps/web/dist; LH_RUNS=5 Lighthouse runs per page (median kept);
#   BENCH_SKIP_LIGHTHOUSE=1 / BENCH_SKIP_LOAD=1 leave that step out.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
export TZ=UTC
ensure_postgres_installed
ensure_nginx_installed
ensure_chromium_installed
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
if [ "${BENCH_SKIP_LIGHTHOUSE:-0}" != 1 ]; then
  # before the load bench, so it measures the pages on a machine the load bench is not heating
  log "lighthouse: library, sign-in and culture pages, desktop preset, ${LH_RUNS:-5} runs each"
  (cd tests && pnpm exec tsx perf/lighthouse.ts) || status=1
fi
if [ "${BENCH_SKIP_LOAD:-0}" != 1 ]; then
  log "load: two API instances behind nginx, ${BENCH_SECONDS:-60} s × ${BENCH_ROUNDS:-3} rounds at ${BENCH_CONNECTIONS:-200} connections"
  (cd apps/api && pnpm exec tsx bench/load.ts) || status=1
fi
# the steps write tables into docs/performance.md; keep it as the format check wants it
pnpm --silent exec prettier --write docs/performance.md >/dev/null || true
exit $status
