#!/usr/bin/env bash
# npm run backup: one file, .data/backups/jogwise-<UTC time>.tar.gz, holding
#   database.sql    mariadb-dump of the app database in one consistent snapshot
#                   (--single-transaction: InnoDB MVCC, so the running app is never locked out)
#   uploads/        the photo folder (local storage driver)
#   uploads.sha256  sha256sum of every photo, checked again on restore
#   manifest.json   created at, app version, rows per table in the dump, photo count and bytes
# The database is the one `npm start` uses unless NUXT_DB_HOST/PORT/USER/PASSWORD/NAME say
# otherwise; NUXT_UPLOADS_DIR moves the photo folder and JOGWISE_BACKUP_DIR the output folder.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"

DB_HOST="${NUXT_DB_HOST:-127.0.0.1}"
DB_PORT="${NUXT_DB_PORT:-$JOGWISE_DB_PORT}"
DB_USER="${NUXT_DB_USER:-$JOGWISE_DB_USER}"
DB_PASSWORD="${NUXT_DB_PASSWORD:-$JOGWISE_DB_PASSWORD}"
DB_NAME="${NUXT_DB_NAME:-jogwise}"
UPLOADS_DIR="${NUXT_UPLOADS_DIR:-$DATA_DIR/uploads}"
OUT_DIR="${JOGWISE_BACKUP_DIR:-$DATA_DIR/backups}"

command -v mariadb-dump >/dev/null || die "mariadb-dump is missing: install Debian's mariadb-client (npm start installs it)."
if [ "${NUXT_STORAGE_DRIVER:-local}" = "s3" ]; then
  log "note: photos are in an S3 bucket (NUXT_STORAGE_DRIVER=s3); back the bucket up with its own tools"
fi

mkdir -p "$OUT_DIR" || die "cannot create the backup folder $OUT_DIR"
work="$(mktemp -d "$OUT_DIR/.backup-XXXXXX")"
trap 'rm -rf "$work"' EXIT
# The password goes through the environment, never the command line (ps would show it).
export MYSQL_PWD="$DB_PASSWORD"

log "dumping database $DB_NAME from $DB_HOST:$DB_PORT"
# One INSERT per row (--skip-extended-insert) so the manifest can count the rows in the file
# itself; --no-autocommit wraps each table's rows in one transaction so restoring stays quick.
if ! mariadb-dump --no-defaults --host="$DB_HOST" --port="$DB_PORT" --user="$DB_USER" \
  --single-transaction --skip-lock-tables --routines --triggers --events --no-tablespaces \
  --skip-extended-insert --no-autocommit --hex-blob --default-character-set=utf8mb4 \
  --databases "$DB_NAME" --skip-add-drop-database --no-create-db \
  > "$work/database.sql" 2> "$work/dump.err"; then
  grep -v '^$' "$work/dump.err" | head -5 >&2
  die "the database dump failed: is MariaDB running on $DB_HOST:$DB_PORT with database $DB_NAME? (npm start or npm run db:start)"
fi
# --databases wrote a USE line for the source name; restore picks its own target.
sed -i '/^USE `/d' "$work/database.sql"

mkdir -p "$work/uploads"
if [ -d "$UPLOADS_DIR" ]; then
  log "copying photos from ${UPLOADS_DIR#$ROOT/}"
  # Photos are written aside as *.part and renamed, so a half-written one is never copied.
  tar -C "$UPLOADS_DIR" --exclude='*.part' -cf - . | tar -C "$work/uploads" -xf - \
    || die "copying the photos from $UPLOADS_DIR failed"
fi
(cd "$work/uploads" && find . -type f -print0 | sort -z | xargs -0 -r sha256sum) > "$work/uploads.sha256"

app_version="$(node -p "require('./package.json').version")"
commit="$(git -C "$ROOT" rev-parse --short HEAD 2>/dev/null || echo unknown)"
# Rows per table, counted from the dump's own INSERT lines (one per row).
awk 'match($0, /^INSERT INTO `[^`]+`/) { t = substr($0, 14, RLENGTH - 14); n[t]++ }
     match($0, /^CREATE TABLE `[^`]+`/) { t = substr($0, 15, RLENGTH - 15); if (!(t in n)) n[t] = 0 }
     END { for (t in n) print t, n[t] }' "$work/database.sql" | sort > "$work/counts.txt"
summary="$(node --import tsx scripts/backup-manifest.ts write "$work" "$DB_NAME" "$app_version" "$commit")" || die "writing the manifest failed"
rm -f "$work/counts.txt" "$work/dump.err"

stamp="$(date -u +%Y%m%dT%H%M%S)Z"
file="$OUT_DIR/jogwise-$stamp.tar.gz"
n=1
while [ -e "$file" ]; do n=$((n + 1)); file="$OUT_DIR/jogwise-$stamp-$n.tar.gz"; done
# Written aside and renamed: a backup file that exists is always complete.
tar -C "$work" -czf "$work/backup.tar.gz" manifest.json database.sql uploads.sha256 uploads || die "writing the archive failed"
mv "$work/backup.tar.gz" "$file"

log "backup written: ${file#$ROOT/} ($(du -h "$file" | cut -f1), $summary)"
echo "$file"
