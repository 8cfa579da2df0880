#!/usr/bin/env bash
# Back up the database (pg_dump custom format) and the uploaded photos into one folder.
#   bash infra/backup.sh [OUT_DIR]      (default: .data/backups/<UTC timestamp>)
# DATABASE_URL selects the database (default: the project's own on 127.0.0.1:54329).
source "$(dirname "$0")/lib.sh"
url="${DATABASE_URL:-$(db_url barmkeep)}"
uploads="${UPLOADS_DIR:-$ROOT/.data/uploads}"
out="${1:-$ROOT/.data/backups/$(date -u +%Y%m%dT%H%M%SZ)}"
mkdir -p "$out"
pg_dump --format=custom --no-owner --no-privileges --file="$out/database.dump" "$url"
if [ -d "$uploads" ]; then tar -C "$uploads" -czf "$out/uploads.tar.gz" .; else tar -czf "$out/uploads.tar.gz" -T /dev/null; fi
( cd "$out" && sha256sum database.dump uploads.tar.gz > SHA256SUMS )
log "backup written to $out"
