#!/usr/bin/env bash
# npm run stop: stops what npm start started (the app server, the fake mail server and the demo MariaDB).
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
stop_pidfile "$DATA_DIR/server.pid" "the app server"
bash "$ROOT/scripts/maildev.sh" stop maildev
bash "$ROOT/scripts/db.sh" stop mariadb
