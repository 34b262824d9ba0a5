#!/usr/bin/env bash
# npm run soak: load and faults on loopback, about three to four minutes (plus a build when the
# source changed). Its own MariaDB (.data/mariadb-soak on 127.0.0.1:3434, database jogwise_soak,
# emptied each run), its own build (.data/soak-output) and its own app server (port 3134), which
# bench/soak.ts starts, kills and starts again. Everything started here is stopped on exit.
# Knobs (environment): SOAK_TABLETS (50), SOAK_SECONDS (60), SOAK_TAP_MS (700), SOAK_READ_RATE (2
# reads per tablet per second), SOAK_DB_DOWN_AT (12 s), SOAK_DB_DOWN_FOR (6 s), SOAK_APP_KILL_AT (36 s).
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"
ensure_apt_packages
ensure_node_modules

DB_DIR_NAME="${SOAK_DB_DIR:-mariadb-soak}"
DB_PORT="$SOAK_DB_PORT"
DB_NAME="${SOAK_DB_NAME:-jogwise_soak}"
APP_PORT="$SOAK_PORT"
OUT_DIR="$DATA_DIR/soak-output"
PIDFILE="$DATA_DIR/soak-server.pid"
started_db=0
bash scripts/db.sh status "$DB_DIR_NAME" | grep -q running || started_db=1
cleanup() {
  stop_pidfile "$PIDFILE" "the soak app server"
  [ "$started_db" = 1 ] && bash scripts/db.sh stop "$DB_DIR_NAME"
  return 0
}
trap cleanup EXIT

prepare_app "$DB_DIR_NAME" "$DB_PORT" "$DB_NAME" "$OUT_DIR" "$DATA_DIR/soak-build.log" fresh >/dev/null

# Photos of the soak stay in their own folder; mail waits in the outbox (no SMTP server here).
mkdir -p "$DATA_DIR/soak-uploads"
: > "$DATA_DIR/soak-server.log"
export NUXT_UPLOADS_DIR="$DATA_DIR/soak-uploads" NUXT_SESSION_PASSWORD=soak-session-secret-0123456789abcdef \
  NUXT_DEMO_PASSWORD="$JOGWISE_DEMO_PASSWORD" NUXT_MAIL_SMTP_HOST= \
  SOAK_PORT="$APP_PORT" SOAK_DB_DIR="$DB_DIR_NAME" SOAK_SERVER_ENTRY="$OUT_DIR/server/index.mjs" \
  SOAK_SERVER_LOG="$DATA_DIR/soak-server.log" SOAK_SERVER_PIDFILE="$PIDFILE"
log "soak against http://127.0.0.1:$APP_PORT (server log: .data/soak-server.log)"
# A hard limit, so a hung run never outlives its welcome.
timeout --signal=INT 330 node --import tsx bench/soak.ts
