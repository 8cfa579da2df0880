#!/usr/bin/env bash
# Shared helpers for infra/start.sh and infra/test.sh. Source it; do not run it.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export PGPORT="${PGPORT:-54329}"
export PGHOST_ADDR="127.0.0.1"
PG_USER_NAME="app"

log() { printf '\033[36m[barmkeep]\033[0m %s\n' "$*"; }

as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }

pg_bin_dir() { ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1; }

ensure_postgres_installed() {
  if [ -n "${DATABASE_URL:-}" ]; then return 0; fi
  if [ -z "$(pg_bin_dir)" ] || [ ! -x "$(pg_bin_dir)/initdb" ]; then
    log "installing PostgreSQL from Debian"
    as_root apt-get update -qq
    DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq postgresql >/dev/null
  fi
}

ensure_chromium_installed() {
  if ! command -v chromium >/dev/null 2>&1; then
    log "installing Chromium from Debian"
    as_root apt-get update -qq
    DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq chromium >/dev/null
  fi
}

ensure_nginx_installed() { # the two-instance test puts nginx in front of two API processes
  if [ ! -x /usr/sbin/nginx ] && ! command -v nginx >/dev/null 2>&1; then
    log "installing nginx from Debian"
    as_root apt-get update -qq
    DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq nginx >/dev/null
  fi
}

ensure_node_deps() {
  if ! command -v pnpm >/dev/null 2>&1 || [ "$(pnpm -v 2>/dev/null)" != "10.34.9" ]; then
    log "installing pnpm 10.34.9"
    npm i -g pnpm@10.34.9 >/dev/null 2>&1
  fi
  log "installing npm packages (frozen lockfile)"
  (cd "$ROOT" && pnpm install --frozen-lockfile --reporter=silent)
}

# The data folder must be reachable by the postgres system user; a checkout under a private
# home folder is not, so fall back to a folder under /var/lib named after the checkout.
pg_data_root() {
  if [ -n "${BARMKEEP_PGDATA:-}" ]; then echo "$BARMKEEP_PGDATA"; return; fi
  local d="$ROOT/.data/pg"
  mkdir -p "$d"
  if [ "$(id -u)" = 0 ] && ! runuser -u postgres -- test -x "$d" 2>/dev/null; then
    chown postgres "$d" 2>/dev/null || true
    if ! runuser -u postgres -- test -x "$d" 2>/dev/null; then
      d="/var/lib/barmkeep-pg/$(printf '%s' "$ROOT" | md5sum | cut -c1-12)"
      mkdir -p "$d"
    fi
  fi
  echo "$d"
}

run_pg() { # run a postgres binary as the postgres user when we are root (from / : it may not enter the checkout)
  if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

pg_ready() { "$(pg_bin_dir)/pg_isready" -h "$PGHOST_ADDR" -p "$PGPORT" -q 2>/dev/null; }

start_postgres() {
  if [ -n "${DATABASE_URL:-}" ]; then log "using DATABASE_URL"; return 0; fi
  ensure_postgres_installed
  local bin; bin="$(pg_bin_dir)"
  if pg_ready; then log "PostgreSQL already running on $PGHOST_ADDR:$PGPORT"; return 0; fi
  local root; root="$(pg_data_root)"
  [ "$(id -u)" = 0 ] && chown postgres "$root"
  if [ ! -f "$root/data/PG_VERSION" ]; then
    log "initialising PostgreSQL data in $root/data"
    run_pg "$bin/initdb" -D "$root/data" -A trust -U "$PG_USER_NAME" -E UTF8 --locale=C.UTF-8 >/dev/null
  fi
  log "starting PostgreSQL on $PGHOST_ADDR:$PGPORT"
  run_pg "$bin/pg_ctl" -D "$root/data" -l "$root/log" -w -t 30 \
    -o "-p $PGPORT -k $root -c listen_addresses=$PGHOST_ADDR -c fsync=${PG_FSYNC:-on}" start >/dev/null
}

stop_postgres() {
  if [ -n "${DATABASE_URL:-}" ]; then return 0; fi
  local root; root="$(pg_data_root)"
  if [ -f "$root/data/postmaster.pid" ]; then
    run_pg "$(pg_bin_dir)/pg_ctl" -D "$root/data" -m fast -w stop >/dev/null && log "PostgreSQL stopped"
  fi
}

psql_admin() { psql -h "$PGHOST_ADDR" -p "$PGPORT" -U "$PG_USER_NAME" -d postgres -v ON_ERROR_STOP=1 -qAt "$@"; }

ensure_database() { # ensure_database NAME
  if [ -n "${DATABASE_URL:-}" ]; then return 0; fi
  if [ -z "$(psql_admin -c "select 1 from pg_database where datname='$1'")" ]; then
    psql_admin -c "create database \"$1\"" >/dev/null
  fi
}

db_url() { # db_url NAME
  if [ -n "${DATABASE_URL:-}" ]; then echo "$DATABASE_URL"; else echo "postgres://$PG_USER_NAME@$PGHOST_ADDR:$PGPORT/$1"; fi
}
