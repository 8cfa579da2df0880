#!/usr/bin/env bash
# Restore a backup made by infra/backup.sh into an EMPTY database and uploads folder.
#   bash infra/restore.sh BACKUP_DIR
# DATABASE_URL selects the target database; UPLOADS_DIR the target uploads folder.
source "$(dirname "$0")/lib.sh"
in="${1:?usage: infra/restore.sh BACKUP_DIR}"
url="${DATABASE_URL:-$(db_url barmkeep)}"
uploads="${UPLOADS_DIR:-$ROOT/.data/uploads}"
( cd "$in" && sha256sum --quiet -c SHA256SUMS ) || { echo "backup is damaged (checksum mismatch)" >&2; exit 1; }
tables="$(psql "$url" -qAt -c "select count(*) from pg_tables where schemaname='public'")"
if [ "$tables" != "0" ]; then echo "refusing to restore into a database that already has tables" >&2; exit 1; fi
pg_restore --no-owner --no-privileges --exit-on-error --single-transaction --dbname="$url" "$in/database.dump"
mkdir -p "$uploads"
tar -C "$uploads" -xzf "$in/uploads.tar.gz"
log "restored $in"
