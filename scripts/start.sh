#!/usr/bin/env bash
# npm start: everything from a fresh Debian machine with Node 20 to a served, seeded Jogwise.
# Starts MariaDB (127.0.0.1:3417; ports in scripts/lib.sh) and the app (http://localhost:3000) in the background;
# `npm run stop` stops both.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"

PORT="${PORT:-$JOGWISE_APP_PORT}"
DEMO_PASSWORD="$JOGWISE_DEMO_PASSWORD"
SERVER_PID="$DATA_DIR/server.pid"

ensure_apt_packages
ensure_node_modules
# MariaDB, migrations, and a build of the app when the sources changed (sets `rebuilt`)
prepare_app mariadb "$JOGWISE_DB_PORT" jogwise "$ROOT/.output" "$DATA_DIR/build.log"

# The fake SMTP server catches every mail; the owner reads them on Crew → Caught mail.
MAIL_SMTP_PORT=$JOGWISE_MAIL_SMTP_PORT MAIL_WEB_PORT=$JOGWISE_MAIL_WEB_PORT
bash scripts/maildev.sh start maildev $MAIL_SMTP_PORT $MAIL_WEB_PORT
export NUXT_MAIL_SMTP_HOST=127.0.0.1 NUXT_MAIL_SMTP_PORT=$MAIL_SMTP_PORT NUXT_MAIL_SMTP_SECURE=false \
  NUXT_MAIL_FROM='Jogwise <jogwise@demo.jogwise.test>' NUXT_MAIL_FAKE_API_URL=http://127.0.0.1:$MAIL_WEB_PORT \
  NUXT_SITE_URL="http://localhost:$PORT"

if pid_alive "$SERVER_PID" && [ "$rebuilt" = 0 ]; then
  log "the app is already running (pid $(cat "$SERVER_PID"))"
else
  stop_pidfile "$SERVER_PID" "the previous app server"
  log "starting the app on port $PORT"
  NUXT_SESSION_PASSWORD="$(ensure_session_secret)" NUXT_DEMO_SEED=1 NUXT_DEMO_PASSWORD="$DEMO_PASSWORD" \
    PORT="$PORT" HOST=0.0.0.0 setsid node .output/server/index.mjs >> "$DATA_DIR/server.log" 2>&1 < /dev/null &
  echo $! > "$SERVER_PID"
fi
wait_for_ready "http://127.0.0.1:$PORT/api/health" 90 || { tail -30 "$DATA_DIR/server.log"; die "the app did not become ready (log: .data/server.log)"; }

cat <<TXT

  Jogwise is running at http://localhost:$PORT

  Demo sign-ins (password for all: $DEMO_PASSWORD)
    owner     owner@demo.jogwise.test
    trainer   trainer@demo.jogwise.test   (sign-off PIN 2468)
    operator  operator@demo.jogwise.test
    trainee   trainee@demo.jogwise.test

  Mail is caught by a local fake SMTP server (nothing leaves this computer); the owner reads it
  at http://localhost:$PORT/crew/mail

  Started in the background: MariaDB on 127.0.0.1:$JOGWISE_DB_PORT (data in .data/mariadb), the fake mail
  server on 127.0.0.1:$MAIL_SMTP_PORT (mail in .data/maildev) and the app server (log in
  .data/server.log). Stop them all with: npm run stop

  Jogwise supplements, and never replaces, the machine maker's manual, local codes and
  competent practice.

TXT
