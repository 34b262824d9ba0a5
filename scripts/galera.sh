#!/usr/bin/env bash
# A MariaDB Galera cluster on loopback for npm run soak:cluster: each node has its own data folder
# under .data/<prefix>-<n> and its own ports, all on 127.0.0.1.
#   scripts/galera.sh create                a new cluster: node 1's data made once, with the database
#                                           and user, and copied to every node while it is stopped
#   scripts/galera.sh start N [bootstrap]   start node N (1..3); bootstrap = first node of the cluster
#   scripts/galera.sh kill N                SIGKILL node N (a crash, no clean shutdown)
#   scripts/galera.sh stop N                clean shutdown of node N
#   scripts/galera.sh status N              prints wsrep_local_state_comment and cluster size
# Ports of node N (GALERA_BASE_PORT, default 4400): SQL base+10N+1, group communication +2,
# IST +3, SST (rsync) +4; so node 1 is 4411-4414, node 2 4421-4424, node 3 4431-4434.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

cmd="${1:-}"
n="${2:-}"
[ "$cmd" = create ] && n=1
[[ "$n" =~ ^[1-9]$ ]] || die "usage: scripts/galera.sh start|kill|stop|status N [bootstrap]"
prefix="${GALERA_PREFIX:-galera-soak}"
base="${GALERA_BASE_PORT:-4400}"
nodes="${GALERA_NODES:-3}"
dir="$DATA_DIR/$prefix-$n"
sock="$dir/mariadb.sock"
pidfile="$dir/mariadb.pid"
sql_port=$((base + 10 * n + 1))
gcomm_port=$((base + 10 * n + 2))
ist_port=$((base + 10 * n + 3))
sst_port=$((base + 10 * n + 4))
peers=""
for i in $(seq 1 "$nodes"); do peers+="${peers:+,}127.0.0.1:$((base + 10 * i + 2))"; done

client() { mariadb --no-defaults --socket="$sock" -uroot "$@"; }
running() { [ -S "$sock" ] && mariadb-admin --no-defaults --socket="$sock" -uroot ping >/dev/null 2>&1; }

start() {
  mkdir -p "$dir"
  if [ ! -d "$dir/data/mysql" ]; then
    mariadb-install-db --no-defaults --datadir="$dir/data" --user=root --auth-root-authentication-method=socket >"$dir/install.log" 2>&1 \
      || { cat "$dir/install.log"; die "mariadb-install-db failed for node $n"; }
  fi
  running && { log "Galera node $n already running"; return 0; }
  local address="gcomm://$peers"
  local position=()
  # After a crash grastate.dat says seqno -1: recover the last committed position from InnoDB
  # first (what the packaged galera_recovery does), so the node asks for IST, not a full SST.
  if [ "${1:-}" != "bootstrap" ] && grep -q '^seqno: *-1' "$dir/data/grastate.dat" 2>/dev/null; then
    "$(command -v mariadbd || echo /usr/sbin/mariadbd)" --no-defaults --datadir="$dir/data" --user=root \
      --innodb-buffer-pool-size=64M --innodb-log-file-size=48M --binlog-format=ROW --default-storage-engine=InnoDB \
      --wsrep-on=ON --wsrep-provider=/usr/lib/galera/libgalera_smm.so --wsrep-cluster-address="gcomm://$peers" --wsrep-recover --skip-networking \
      --socket="$dir/recover.sock" --pid-file="$dir/recover.pid" --log-error="$dir/recover.log" >/dev/null 2>&1 || true
    local recovered
    # The position line may run straight into the next line's date.
    recovered="$(perl -ne 'print "$1\n" if /Recovered position: ([0-9a-f-]{36}:-?\d+?)(?=\d{4}-\d\d-\d\d|\s|$)/' "$dir/recover.log" 2>/dev/null | tail -1)"
    if [ -n "$recovered" ]; then
      position=(--wsrep-start-position="$recovered")
      log "node $n recovered its position $recovered"
    fi
  fi
  if [ "${1:-}" = "bootstrap" ]; then
    address="gcomm://"
    # A new cluster starts from this node's data, which must be marked safe to do so.
    [ -f "$dir/data/grastate.dat" ] && sed -i 's/^safe_to_bootstrap: 0/safe_to_bootstrap: 1/' "$dir/data/grastate.dat"
  fi
  # wsrep options: row-based replication and interleaved auto-increment locks as Galera needs;
  # wsrep_sync_wait=1 makes every read wait until this node has applied what the cluster
  # committed before it (read-your-writes across nodes); gcache large enough that a node away
  # for a minute rejoins by IST instead of a full copy (SST by rsync, on its own port).
  PATH="$ROOT/scripts/galera-rsync:$PATH" setsid "$(command -v mariadbd || echo /usr/sbin/mariadbd)" --no-defaults --datadir="$dir/data" --user=root \
    --bind-address=127.0.0.1 --port="$sql_port" --socket="$sock" --pid-file="$pidfile" \
    --log-error="$dir/error.log" --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --innodb-buffer-pool-size=64M --innodb-log-file-size=48M --innodb-flush-log-at-trx-commit=2 --max-connections=200 \
    --binlog-format=ROW --default-storage-engine=InnoDB --innodb-autoinc-lock-mode=2 \
    --wsrep-on=ON --wsrep-provider=/usr/lib/galera/libgalera_smm.so \
    --wsrep-cluster-name="$prefix" --wsrep-cluster-address="$address" \
    --wsrep-node-name="node$n" --wsrep-node-address="127.0.0.1:$gcomm_port" \
    --wsrep-provider-options="gmcast.listen_addr=tcp://127.0.0.1:$gcomm_port;ist.recv_addr=127.0.0.1:$ist_port;gcache.size=128M;pc.wait_prim_timeout=PT30S" \
    --wsrep-sst-method=jogwise_rsync --wsrep-sst-receive-address="127.0.0.1:$sst_port" \
    --wsrep-sync-wait=1 --wsrep-slave-threads=2 --log-bin-trust-function-creators=1 ${position[@]+"${position[@]}"} \
    </dev/null >/dev/null 2>&1 &
  local i=0
  until running && [ "$(client -N -e "SHOW STATUS LIKE 'wsrep_ready'" 2>/dev/null | awk '{print $2}')" = "ON" ]; do
    i=$((i + 1)); [ "$i" -ge 240 ] && { tail -30 "$dir/error.log"; die "Galera node $n did not become ready"; }
    sleep 0.5
  done
  if [ "${1:-}" = "bootstrap" ]; then
    local dbname="${JOGWISE_DB_NAME:-jogwise_cluster}"
    client -e "CREATE DATABASE IF NOT EXISTS \`$dbname\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
      CREATE USER IF NOT EXISTS 'jogwise'@'127.0.0.1' IDENTIFIED BY '${JOGWISE_DB_PASSWORD:-jogwise-local}';
      GRANT ALL PRIVILEGES ON \`$dbname\`.* TO 'jogwise'@'127.0.0.1';"
  fi
}

# A new cluster from one node's data copied while stopped (the way a node is seeded from a
# physical backup), so the first joins need no full state transfer; a node that was away
# later catches up by IST from the others' gcache.
create() {
  local first="$DATA_DIR/$prefix-1"
  for i in $(seq 1 "$nodes"); do rm -rf "$DATA_DIR/$prefix-$i"; done
  dir="$first"; sock="$dir/mariadb.sock"; pidfile="$dir/mariadb.pid"
  start bootstrap
  mariadb-admin --no-defaults --socket="$sock" -uroot shutdown
  for _ in $(seq 1 120); do [ -S "$sock" ] || break; sleep 0.5; done
  for i in $(seq 2 "$nodes"); do mkdir -p "$DATA_DIR/$prefix-$i"; cp -a "$first/data" "$DATA_DIR/$prefix-$i/data"; done
}

case "$cmd" in
  create) create ;;
  start) start "${3:-}" ;;
  kill) [ -f "$pidfile" ] && kill -KILL "$(cat "$pidfile")" 2>/dev/null; rm -f "$sock" ;;
  stop) running && mariadb-admin --no-defaults --socket="$sock" -uroot shutdown || true ;;
  status) running && client -N -e "SHOW STATUS WHERE Variable_name IN ('wsrep_local_state_comment','wsrep_cluster_size','wsrep_last_committed')" || echo stopped ;;
  port) echo "$sql_port" ;;
  *) die "usage: scripts/galera.sh start|kill|stop|status|port N [bootstrap]" ;;
esac
