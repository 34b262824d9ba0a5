#!/usr/bin/env bash
# Runs a benchmark that needs the server: its own database (jogwise_bench) on the test MariaDB,
# the test build, a server on port 3150; stops what it started afterwards.
#   scripts/bench-server.sh bench/sync.ts
# While the test suite or other work uses those, point it elsewhere (defaults in brackets):
#   JOGWISE_BENCH_DB_DIR [mariadb-test]  JOGWISE_BENCH_DB_PORT [3418]  JOGWISE_BENCH_DB_NAME [jogwise_bench]
#   JOGWISE_BENCH_PORT [3150]  JOGWISE_BENCH_OUTPUT_DIR [.data/test-output]
# To profile the server: JOGWISE_BENCH_NODE_FLAGS="--cpu-prof --cpu-prof-dir=/tmp/prof" (node
# refuses --cpu-prof in NODE_OPTIONS; the profile is written when the server stops).
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"
ensure_apt_packages
ensure_node_modules
OUT_DIR="${JOGWISE_BENCH_OUTPUT_DIR:-$ROOT/.data/test-output}"
DB_DIR="${JOGWISE_BENCH_DB_DIR:-mariadb-test}"
DB_PORT="$JOGWISE_BENCH_DB_PORT"
DB_NAME="${JOGWISE_BENCH_DB_NAME:-jogwise_bench}"
PORT_BENCH="$JOGWISE_BENCH_PORT"
# A port of its own gets a pid file of its own, so two benchmarks never stop each other's server.
PID="$DATA_DIR/bench-server-$PORT_BENCH.pid"
export JOGWISE_BENCH_SERVER_PID_FILE="$PID"

started_db=0
bash scripts/db.sh status "$DB_DIR" "$DB_PORT" | grep -q running || started_db=1
cleanup() {
  stop_pidfile "$PID" "the benchmark server"
  [ "$started_db" = 1 ] && bash scripts/db.sh stop "$DB_DIR" "$DB_PORT"
  return 0
}
trap cleanup EXIT
prepare_app "$DB_DIR" "$DB_PORT" "$DB_NAME" "$OUT_DIR" "$DATA_DIR/bench-build.log" fresh >/dev/null
# The server reaches this machine's MariaDB through its Unix socket (db.ts), as a local install
# would; JOGWISE_BENCH_TCP=1 keeps it on loopback TCP, as the plain-INSERT comparison is.
[ "${JOGWISE_BENCH_TCP:-0}" = 1 ] || export NUXT_DB_SOCKET="$DATA_DIR/$DB_DIR/mariadb.sock"
NUXT_SESSION_PASSWORD=bench-session-secret-0123456789abcdef NUXT_DEMO_SEED=1 NUXT_DEMO_PASSWORD="$JOGWISE_DEMO_PASSWORD" \
  PORT="$PORT_BENCH" HOST=127.0.0.1 setsid node ${JOGWISE_BENCH_NODE_FLAGS:-} "$OUT_DIR/server/index.mjs" > "$DATA_DIR/bench-server.log" 2>&1 < /dev/null &
echo $! > "$PID"
wait_for_ready "http://127.0.0.1:$PORT_BENCH/api/health" 90 || die "the benchmark server did not start"
JOGWISE_BASE_URL="http://127.0.0.1:$PORT_BENCH" node --import tsx "$@"
