#!/usr/bin/env bash
# npm test: the whole suite. Starts what it needs (its own MariaDB on 127.0.0.1:3418 with a
# fresh database, a built app server on port 3100) and stops everything it started on exit.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"

# Several checkouts can run the suite at once when each sets its own ports (scripts/lib.sh).
TEST_PORT="$JOGWISE_TEST_PORT"
DB_PORT="$JOGWISE_TEST_DB_PORT"
SMTP_PORT="$JOGWISE_TEST_SMTP_PORT"
MAIL_WEB_PORT="$JOGWISE_TEST_MAIL_WEB_PORT"
OUT_DIR="$ROOT/.data/test-output"
SERVER_PID="$DATA_DIR/test-server-$TEST_PORT.pid"
DB_NAME="${JOGWISE_TEST_DB:-jogwise_test}"
use_db "$DB_PORT" "$DB_NAME"
# The backup and restore test creates its scratch database as MariaDB root, on this socket.
export JOGWISE_TEST_DB_SOCKET="$DATA_DIR/mariadb-test/mariadb.sock"
export JOGWISE_BASE_URL="http://127.0.0.1:$TEST_PORT"
# Photos of the suite's server go to a folder of their own, emptied with its database, so a
# running `npm start` keeps its photos apart.
export NUXT_UPLOADS_DIR="$DATA_DIR/test-uploads"

ensure_apt_packages with-browser
ensure_node_modules

started_db=0
cleanup() {
  stop_pidfile "$SERVER_PID" "the test app server"
  bash scripts/maildev.sh stop maildev-test
  [ "$started_db" = 1 ] && [ -z "${JOGWISE_KEEP_DB:-}" ] && bash scripts/db.sh stop mariadb-test
  return 0
}
trap cleanup EXIT

# 1. Pure code and components: no server needed.
# JOGWISE_TEST_PARTS (default "unit api e2e") and JOGWISE_TEST_FILTER (file filters passed to
# vitest and Playwright) narrow a run while working on one thing; CI always runs everything.
PARTS="${JOGWISE_TEST_PARTS:-unit api e2e}"
read -r -a FILTER <<< "${JOGWISE_TEST_FILTER:-}"
VITEST_FILTER=() PW_FILTER=()
if [ ${#FILTER[@]} -gt 0 ]; then VITEST_FILTER=(--passWithNoTests "${FILTER[@]}"); PW_FILTER=(--pass-with-no-tests "${FILTER[@]}"); fi
has_part() { [[ " $PARTS " == *" $1 "* ]]; }
if has_part unit; then
  # Types (vue-tsc over .vue files, server/ and shared/) and the code style come first: either
  # failing fails the build, like a failing test.
  log "type-check"
  npm run --silent typecheck
  log "lint"
  npm run --silent lint -- --quiet
  log "unit and component tests"
  npx vitest run --project unit --project nuxt ${VITEST_FILTER[@]+"${VITEST_FILTER[@]}"}
fi

# 2. The suite's own database, emptied each run, and 3. a production build of its own (so a
# running `npm start` server is never disturbed).
if ! bash scripts/db.sh status mariadb-test | grep -q running; then started_db=1; fi
rm -rf "$NUXT_UPLOADS_DIR"
prepare_app mariadb-test "$DB_PORT" "$DB_NAME" "$OUT_DIR" "$DATA_DIR/test-build.log" fresh
stop_pidfile "$SERVER_PID" "a leftover test app server"
# The suite's own fake SMTP server, emptied each run; the tests read what it caught through its
# REST API (JOGWISE_MAIL_API_URL). A short worker interval and retry waits keep the tests quick.
bash scripts/maildev.sh stop maildev-test
bash scripts/maildev.sh start maildev-test $SMTP_PORT $MAIL_WEB_PORT fresh
export NUXT_MAIL_SMTP_HOST=127.0.0.1 NUXT_MAIL_SMTP_PORT=$SMTP_PORT NUXT_MAIL_SMTP_SECURE=false \
  NUXT_MAIL_FROM='Jogwise <jogwise@test.jogwise.test>' NUXT_MAIL_FAKE_API_URL=http://127.0.0.1:$MAIL_WEB_PORT \
  NUXT_MAIL_WORKER_INTERVAL_MS=500 NUXT_MAIL_RETRY_BASE_MS=500 NUXT_MAIL_RETRY_CAP_MS=3000 \
  NUXT_SITE_URL="$JOGWISE_BASE_URL"
export JOGWISE_MAIL_API_URL=http://127.0.0.1:$MAIL_WEB_PORT
# The API tests start a second server from the same build (crash and restart checks).
export NUXT_SESSION_PASSWORD="test-session-secret-0123456789abcdef" JOGWISE_SERVER_ENTRY="$OUT_DIR/server/index.mjs"
NUXT_DEMO_SEED=1 NUXT_DEMO_PASSWORD="$JOGWISE_DEMO_PASSWORD" \
  PORT="$TEST_PORT" HOST=127.0.0.1 setsid node "$OUT_DIR/server/index.mjs" > "$DATA_DIR/test-server.log" 2>&1 < /dev/null &
echo $! > "$SERVER_PID"
wait_for_ready "$JOGWISE_BASE_URL/api/health" 90 || { tail -30 "$DATA_DIR/test-server.log"; die "the test server did not become ready"; }

# 4. HTTP against the real server and MariaDB, then real Chromium.
if has_part api; then
  log "API tests against MariaDB"
  npx vitest run --project api ${VITEST_FILTER[@]+"${VITEST_FILTER[@]}"}
fi
if has_part e2e; then
  log "browser tests in Chromium"
  npx playwright test ${PW_FILTER[@]+"${PW_FILTER[@]}"}
fi
log "all tests passed"
