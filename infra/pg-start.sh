#!/usr/bin/env bash
# Start the project's PostgreSQL on loopback (idempotent).
source "$(dirname "$0")/lib.sh"
start_postgres
ensure_database barmkeep
log "database: $(db_url barmkeep)"
