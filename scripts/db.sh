#!/usr/bin/env bash
# MariaDB for Jogwise: Debian's server, data under .data/, listening on 127.0.0.1 only.
#   scripts/db.sh start [name] [port]   initialise if needed, start, create database and user
#   scripts/db.sh stop  [name]          shut down cleanly
#   scripts/db.sh status [name]
# "name" picks a separate data folder, so the test suite's database never touches the demo's.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

cmd="${1:-status}"
name="${2:-mariadb}"
port="${3:-${JOGWISE_DB_PORT:-3417}}"
dir="$DATA_DIR/$name"
sock="$dir/mariadb.sock"
pidfile="$dir/mariadb.pid"
dbname="${JOGWISE_DB_NAME:-jogwise}"
dbuser="$JOGWISE_DB_USER"
dbpass="$JOGWISE_DB_PASSWORD"

mysqld_bin() { command -v mariadbd || echo /usr/sbin/mariadbd; }
client() { mariadb --no-defaults --socket="$sock" -uroot "$@"; }
running() { [ -S "$sock" ] && mariadb-admin --no-defaults --socket="$sock" -uroot ping >/dev/null 2>&1; }

start() {
  ensure_apt_packages
  mkdir -p "$dir"
  if [ ! -d "$dir/data/mysql" ]; then
    log "initialising MariaDB data in ${dir#$ROOT/}/data"
    mariadb-install-db --no-defaults --datadir="$dir/data" --user=root --auth-root-authentication-method=socket >"$dir/install.log" 2>&1 \
      || { cat "$dir/install.log"; die "mariadb-install-db failed"; }
  fi
  if running; then
    log "MariaDB already running on 127.0.0.1:$port (${dir#$ROOT/})"
  else
    log "starting MariaDB on 127.0.0.1:$port (${dir#$ROOT/})"
    # setsid: the server outlives this script and is stopped by `scripts/db.sh stop`.
    setsid "$(mysqld_bin)" --no-defaults --datadir="$dir/data" --user=root \
      --bind-address=127.0.0.1 --port="$port" --socket="$sock" --pid-file="$pidfile" \
      --log-error="$dir/error.log" --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
      --innodb-buffer-pool-size=256M --innodb-flush-log-at-trx-commit=2 --max-connections=300 \
      </dev/null >/dev/null 2>&1 &
    local i=0
    until running; do
      i=$((i + 1)); [ "$i" -ge 120 ] && { tail -20 "$dir/error.log"; die "MariaDB did not start"; }
      sleep 0.5
    done
  fi
  client -e "CREATE DATABASE IF NOT EXISTS \`$dbname\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
    CREATE USER IF NOT EXISTS '$dbuser'@'127.0.0.1' IDENTIFIED BY '$dbpass';
    GRANT ALL PRIVILEGES ON \`$dbname\`.* TO '$dbuser'@'127.0.0.1';
    CREATE USER IF NOT EXISTS '$dbuser'@'localhost' IDENTIFIED BY '$dbpass';
    GRANT ALL PRIVILEGES ON \`$dbname\`.* TO '$dbuser'@'localhost';
    FLUSH PRIVILEGES;"
}

stop() {
  if running; then
    log "stopping MariaDB (${dir#$ROOT/})"
    mariadb-admin --no-defaults --socket="$sock" -uroot shutdown
  fi
}

case "$cmd" in
  start) start ;;
  stop) stop ;;
  status) if running; then echo "running (${dir#$ROOT/}, port $port)"; else echo "stopped"; fi ;;
  reset-db) # drop and recreate the named database (the test suite's own)
    running || die "MariaDB is not running"
    client -e "DROP DATABASE IF EXISTS \`$dbname\`;"
    start ;;
  *) die "usage: scripts/db.sh start|stop|status|reset-db [name] [port]" ;;
esac
