#!/usr/bin/env bash
# npm run restore FILE: puts a backup made by `npm run backup` back.
#   1. checks the file (a gzip tar with manifest.json, database.sql and uploads.sha256 of our format)
#   2. replaces every table of the target database with the dump (the `npm start` database unless
#      NUXT_DB_HOST/PORT/USER/PASSWORD/NAME say otherwise; JOGWISE_RESTORE_DB_NAME picks another
#      database on the same server, created when the user may)
#   3. replaces the photo folder (NUXT_UPLOADS_DIR, default .data/uploads) after checking every
#      photo's sha256 against the backup's list
#   4. counts the rows of every table and compares them with the manifest
# Running it twice gives the same result. It refuses to replace the database of a running app:
# npm run stop, then npm run db:start (MariaDB alone), then npm run restore FILE, then npm start.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"

file="${1:-}"
[ -n "$file" ] || die "usage: npm run restore FILE   (FILE: a backup such as .data/backups/jogwise-20260101T080000Z.tar.gz)"
[ -f "$file" ] || die "no such backup file: $file"
[ -r "$file" ] || die "cannot read the backup file $file"

DB_HOST="${NUXT_DB_HOST:-127.0.0.1}"
DB_PORT="${NUXT_DB_PORT:-$JOGWISE_DB_PORT}"
DB_USER="${NUXT_DB_USER:-$JOGWISE_DB_USER}"
DB_NAME="${JOGWISE_RESTORE_DB_NAME:-${NUXT_DB_NAME:-jogwise}}"
UPLOADS_DIR="${NUXT_UPLOADS_DIR:-$DATA_DIR/uploads}"
export MYSQL_PWD="${NUXT_DB_PASSWORD:-$JOGWISE_DB_PASSWORD}"
[[ "$DB_NAME" =~ ^[A-Za-z0-9_]{1,64}$ ]] || die "the target database name \"$DB_NAME\" may only hold letters, digits and _ (at most 64)"

# 1. The file.
listing="$(tar -tzf "$file" 2>/dev/null)" || die "$file is not a Jogwise backup: it is not a readable .tar.gz file"
for part in manifest.json database.sql uploads.sha256; do
  grep -qx "$part" <<<"$listing" || die "$file is not a Jogwise backup: $part is missing from it"
done
work="$(mktemp -d "${TMPDIR:-/tmp}/jogwise-restore-XXXXXX")"
staged=""
trap 'rm -rf "$work"; [ -n "$staged" ] && rm -rf "$staged"; true' EXIT
tar -C "$work" -xzf "$file" 2>/dev/null || die "$file is damaged: it could not be unpacked"
about="$(node --import tsx scripts/backup-manifest.ts check "$work/manifest.json" 2> "$work/manifest.err")" \
  || die "$file is not a usable backup: $(cat "$work/manifest.err")"
IFS=$'\t' read -r created version source_db <<<"$about"
tail -n 1 "$work/database.sql" | grep -q '^-- Dump completed' || die "$file is damaged: its database dump is cut short"
log "backup ${file#$ROOT/}: made $created by Jogwise $version from database $source_db"

# Replacing the tables under a running app would mix its writes with the backup's rows.
if [ "$DB_PORT" = "$JOGWISE_DB_PORT" ] && [ "$DB_NAME" = "${NUXT_DB_NAME:-jogwise}" ] && pid_alive "$DATA_DIR/server.pid"; then
  die "the app is running (pid $(cat "$DATA_DIR/server.pid")) on the database this would replace: npm run stop, npm run db:start, then restore again"
fi

sql() { mariadb --no-defaults --host="$DB_HOST" --port="$DB_PORT" --user="$DB_USER" --batch --skip-column-names "$@"; }

# 2. The database.
sql -e 'SELECT 1' >/dev/null 2> "$work/connect.err" \
  || die "cannot reach MariaDB on $DB_HOST:$DB_PORT as $DB_USER: $(head -1 "$work/connect.err") (is it running? npm start or npm run db:start)"
if ! sql -e "CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci" 2> "$work/create.err"; then
  die "database $DB_NAME does not exist and $DB_USER may not create it; as MariaDB's root: CREATE DATABASE \`$DB_NAME\`; GRANT ALL ON \`$DB_NAME\`.* TO '$DB_USER'@'$DB_HOST';"
fi
# Every table and view already there goes, so the result is exactly the backup.
listed() { sql -e "SELECT CONCAT('\`', table_name, '\`') FROM information_schema.tables WHERE table_schema = '$DB_NAME' AND table_type $1" | paste -sd, -; }
old_tables="$(listed "<> 'VIEW'")"
old_views="$(listed "= 'VIEW'")"
if [ -n "$old_tables$old_views" ]; then
  log "replacing the tables of database $DB_NAME on $DB_HOST:$DB_PORT"
  { [ -z "$old_views" ] || echo "DROP VIEW IF EXISTS $old_views;"
    [ -z "$old_tables" ] || echo "SET FOREIGN_KEY_CHECKS = 0; DROP TABLE IF EXISTS $old_tables;"
  } | sql --database="$DB_NAME" 2> "$work/drop.err" || die "could not clear database $DB_NAME: $(head -1 "$work/drop.err")"
else
  log "loading into the empty database $DB_NAME on $DB_HOST:$DB_PORT"
fi
sql --database="$DB_NAME" < "$work/database.sql" 2> "$work/load.err" \
  || die "loading the dump into $DB_NAME failed: $(head -1 "$work/load.err")"

# 3. The photos: checked in a folder beside the target, then swapped in.
photos="$(grep -c . "$work/uploads.sha256" || true)"
mkdir -p "$work/uploads"
(cd "$work/uploads" && sha256sum --quiet --strict -c "$work/uploads.sha256" >/dev/null 2> "$work/sha.err") \
  || die "the photos in $file do not match their sha256 list: $(head -1 "$work/sha.err")"
mkdir -p "$(dirname "$UPLOADS_DIR")"
staged="$(mktemp -d "$(dirname "$UPLOADS_DIR")/.uploads-restore-XXXXXX")"
cp -a "$work/uploads/." "$staged/"
(cd "$staged" && sha256sum --quiet --strict -c "$work/uploads.sha256" >/dev/null 2>&1) || die "copying the photos to $UPLOADS_DIR failed"
old=""
if [ -e "$UPLOADS_DIR" ]; then old="$staged.old"; mv "$UPLOADS_DIR" "$old"; fi
mv "$staged" "$UPLOADS_DIR"; staged=""
[ -n "$old" ] && rm -rf "$old"
chmod 755 "$UPLOADS_DIR"
log "restored $photos photos into ${UPLOADS_DIR#$ROOT/} (sha256 checked)"

# 4. Rows per table against the manifest.
node --import tsx scripts/backup-manifest.ts count-sql "$work/manifest.json" > "$work/count.sql"
sql --database="$DB_NAME" < "$work/count.sql" > "$work/counts.txt" 2> "$work/count.err" \
  || die "counting the restored rows failed: $(head -1 "$work/count.err")"
node --import tsx scripts/backup-manifest.ts verify "$work/manifest.json" "$work/counts.txt" > "$work/verify.txt" || die "the restored database $DB_NAME does not match the backup's row counts (above)"
log "database $DB_NAME restored and checked: $(cat "$work/verify.txt") match the manifest"
