#!/usr/bin/env bash
# npm run soak:cluster: two app servers on a three-node MariaDB Galera cluster, all on loopback,
# with a database node and an app server killed under load (bench/soak-cluster.ts). About five
# minutes plus a build when the source changed. Everything is its own and stopped on exit, even
# after a failure: nodes in .data/galera-soak-{1,2,3} (SQL 127.0.0.1:4411/4421/4431, group
# communication :4412/4422/4432, IST :4413/…, SST :4414/…), database jogwise_cluster made afresh,
# app servers on 127.0.0.1:4501 and :4502 from the soak's build (.data/soak-output).
# Knobs: SOAK_TABLETS (50), SOAK_SECONDS (60), SOAK_TAP_MS (700), SOAK_READ_RATE (1),
# SOAK_NODE_KILL_AT (8 s), SOAK_NODE_DOWN_FOR (5 s), SOAK_KILLED_NODE (1), SOAK_APP_KILL_AT (30 s),
# SOAK_APP_PORTS (4501,4502), GALERA_BASE_PORT (4400), JOGWISE_SOAK_OUTPUT_DIR (a build to use).
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"
ensure_apt_packages
[ -f /usr/lib/galera/libgalera_smm.so ] || die "Galera is missing: apt-get install galera-4"

export GALERA_PREFIX="${GALERA_PREFIX:-galera-soak}" GALERA_BASE_PORT="${GALERA_BASE_PORT:-4400}" GALERA_NODES=3
export JOGWISE_DB_NAME="${SOAK_DB_NAME:-jogwise_cluster}"
OUT_DIR="${JOGWISE_SOAK_OUTPUT_DIR:-$DATA_DIR/soak-output}"
ports=()
for n in 1 2 3; do ports+=("$((GALERA_BASE_PORT + 10 * n + 1))"); done

cleanup() {
  for app in A B; do stop_pidfile "$DATA_DIR/soak-cluster-app-$app.pid" "soak:cluster app server $app"; done
  for n in 3 2 1; do bash scripts/galera.sh stop "$n" >/dev/null 2>&1 || bash scripts/galera.sh kill "$n" || true; done
  # A node that did not shut down within the wait is killed by its own pid file.
  sleep 1
  for n in 1 2 3; do
    pidfile="$DATA_DIR/$GALERA_PREFIX-$n/mariadb.pid"
    if pid_alive "$pidfile"; then
      for _ in $(seq 1 40); do pid_alive "$pidfile" || break; sleep 0.5; done
      pid_alive "$pidfile" && bash scripts/galera.sh kill "$n"
    fi
  done
  return 0
}
trap cleanup EXIT
trap 'exit 130' INT TERM

build_if_stale "$OUT_DIR" "$DATA_DIR/soak-build.log"

log "making a new 3-node Galera cluster on 127.0.0.1:${ports[*]}"
timeout 300 bash scripts/galera.sh create
timeout 120 bash scripts/galera.sh start 1 bootstrap
timeout 180 bash scripts/galera.sh start 2
timeout 180 bash scripts/galera.sh start 3
bash scripts/galera.sh status 3

use_db "${ports[0]}" "$JOGWISE_DB_NAME"
node --import tsx scripts/migrate.ts >/dev/null

# The same session secret on every app server; mail waits in the outbox (no SMTP server here).
mkdir -p "$DATA_DIR/soak-cluster-uploads"
for app in A B; do : > "$DATA_DIR/soak-cluster-app-$app.log"; done
export NUXT_UPLOADS_DIR="$DATA_DIR/soak-cluster-uploads" NUXT_SESSION_PASSWORD=soak-cluster-session-secret-0123456789abcdef \
  NUXT_DEMO_PASSWORD="$JOGWISE_DEMO_PASSWORD" NUXT_MAIL_SMTP_HOST= \
  SOAK_NODE_PORTS="$(IFS=,; echo "${ports[*]}")" SOAK_SERVER_ENTRY="$OUT_DIR/server/index.mjs" SOAK_LOG_DIR="$DATA_DIR"
log "soak on the cluster (app logs: .data/soak-cluster-app-A.log and -B.log)"
# A hard limit, so a hung run never outlives its welcome.
timeout --signal=INT 480 node --import tsx bench/soak-cluster.ts
