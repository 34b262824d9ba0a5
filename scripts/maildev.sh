#!/usr/bin/env bash
# The local fake SMTP server (maildev, from npm) that catches Jogwise's mail in the demo and the
# tests; nothing leaves the machine. Listens on 127.0.0.1 only.
#   scripts/maildev.sh start <name> <smtp-port> <web-port> [fresh]   mail kept in .data/<name>
#   scripts/maildev.sh stop  <name>
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

cmd="${1:-}"
name="${2:-maildev}"
pidfile="$DATA_DIR/$name.pid"

case "$cmd" in
  start)
    smtp="${3:?smtp port}"; web="${4:?web port}"; dir="$DATA_DIR/$name"
    if pid_alive "$pidfile"; then log "the fake mail server is already running (pid $(cat "$pidfile"))"; exit 0; fi
    [ "${5:-}" = fresh ] && rm -rf "$dir"
    mkdir -p "$dir"
    log "starting the fake mail server (SMTP 127.0.0.1:$smtp, web 127.0.0.1:$web)"
    setsid node "$ROOT/node_modules/maildev/dist/bin/maildev.js" --smtp "$smtp" --web "$web" --ip 127.0.0.1 --web-ip 127.0.0.1 \
      --mail-directory "$dir" > "$DATA_DIR/$name.log" 2>&1 < /dev/null &
    echo $! > "$pidfile"
    node -e '
      const until = Date.now() + 30000
      const tick = async () => {
        try { if ((await fetch(process.argv[1])).ok) process.exit(0) } catch {}
        if (Date.now() > until) process.exit(1)
        setTimeout(tick, 200)
      }
      tick()' "http://127.0.0.1:$web/api/healthz" || { tail -20 "$DATA_DIR/$name.log"; die "the fake mail server did not start (log: .data/$name.log)"; }
    ;;
  stop) stop_pidfile "$pidfile" "the fake mail server" ;;
  *) die "usage: scripts/maildev.sh start <name> <smtp-port> <web-port> [fresh] | stop <name>" ;;
esac
