#!/usr/bin/env bash
# Shared settings and helpers for Jogwise's start, test and database scripts.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA_DIR="$ROOT/.data"

# ---------------------------------------------------------------- ports and credentials
# Every port and local credential of the scripts, in one place. Each can be overridden from the
# environment (several checkouts can then run side by side). All listen on loopback only.
: "${JOGWISE_APP_PORT:=3000}"        # npm start: the app
: "${JOGWISE_DB_PORT:=3417}"         # npm start and npm run dev: MariaDB (.data/mariadb)
: "${JOGWISE_MAIL_SMTP_PORT:=3425}"  # npm start: the fake SMTP server
: "${JOGWISE_MAIL_WEB_PORT:=3426}"   #   and its web API
: "${JOGWISE_TEST_PORT:=3100}"       # npm test: the app
: "${JOGWISE_TEST_DB_PORT:=3418}"    #   its MariaDB (.data/mariadb-test)
: "${JOGWISE_TEST_SMTP_PORT:=3427}"  #   its fake SMTP server
: "${JOGWISE_TEST_MAIL_WEB_PORT:=3428}"
: "${JOGWISE_BENCH_PORT:=3150}"      # benchmarks: the app (on the test MariaDB by default)
: "${JOGWISE_BENCH_DB_PORT:=$JOGWISE_TEST_DB_PORT}"
: "${SOAK_PORT:=3134}"               # npm run soak: the app
: "${SOAK_DB_PORT:=3434}"            #   its MariaDB (.data/mariadb-soak)
# Local-only credentials: MariaDB listens on 127.0.0.1 and the demo shop is invented.
: "${JOGWISE_DB_USER:=jogwise}"
: "${JOGWISE_DB_PASSWORD:=jogwise-local}"
: "${JOGWISE_DEMO_PASSWORD:=shopfloor-demo-1}"
export JOGWISE_DB_USER JOGWISE_DB_PASSWORD JOGWISE_DEMO_PASSWORD

log() { printf '\033[1m[jogwise]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[jogwise] %s\033[0m\n' "$*" >&2; exit 1; }

# Debian packages a fresh machine may lack. apt-get runs only when something is missing.
ensure_apt_packages() {
  local missing=()
  command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ] || missing+=(mariadb-server)
  if [ "${1:-}" = "with-browser" ]; then
    [ -x /usr/bin/chromium ] || missing+=(chromium)
  fi
  [ ${#missing[@]} -eq 0 ] && return 0
  log "installing Debian packages: ${missing[*]}"
  local sudo=""
  [ "$(id -u)" -ne 0 ] && sudo="sudo"
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
}

# npm dependencies, installed from the lockfile when node_modules is missing or stale.
ensure_node_modules() {
  if [ ! -d "$ROOT/node_modules" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "installing npm dependencies (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
  fi
}

# A random secret kept under .data/ so sessions survive restarts of the server.
ensure_session_secret() {
  mkdir -p "$DATA_DIR"
  local f="$DATA_DIR/session-secret"
  [ -s "$f" ] || node -e "process.stdout.write(require('crypto').randomBytes(32).toString('hex'))" > "$f"
  cat "$f"
}


# Waits until GET url answers 2xx (the app's /api/health does once the database answers and a
# shop exists). wait-on does the polling.
wait_for_ready() { # url seconds
  "$ROOT/node_modules/.bin/wait-on" --timeout "$(( ${2:-90} * 1000 ))" --interval 300 --httpTimeout 5000 "http-get://${1#http://}"
}

# Is the build in .output older than any source file?
# Every source Nuxt builds from with srcDir '.': its root files and folders (utils/ holds the
# app's auto-imported helpers); names that do not exist yet are passed over.
BUILD_SOURCES=(app.vue app.config.ts error.vue nuxt.config.ts pwa.config.ts tailwind.config.ts package-lock.json
  assets components composables constants i18n layouts middleware modules pages plugins public server shared stores utils)

build_is_stale() { # output-dir
  local out="$1/nitro.json"
  [ -f "$out" ] || return 0
  [ -n "$(cd "$ROOT" && find "${BUILD_SOURCES[@]}" -newer "$out" -type f 2>/dev/null | head -n 1)" ]
}

pid_alive() { [ -f "$1" ] && kill -0 "$(cat "$1")" 2>/dev/null; }

stop_pidfile() { # pidfile label
  if pid_alive "$1"; then
    log "stopping $2 (pid $(cat "$1"))"
    kill -- -"$(cat "$1")" 2>/dev/null || kill "$(cat "$1")" 2>/dev/null || true
    for _ in $(seq 1 40); do pid_alive "$1" || break; sleep 0.25; done
  fi
  rm -f "$1"
}

# The app's settings for one MariaDB database (NUXT_DB_* are read by server/utils/db.ts).
use_db() { # port database
  export NUXT_DB_HOST=127.0.0.1 NUXT_DB_PORT="$1" NUXT_DB_USER="$JOGWISE_DB_USER" NUXT_DB_PASSWORD="$JOGWISE_DB_PASSWORD" NUXT_DB_NAME="$2"
}

# Builds the app into out-dir when any source is newer than the build there. Sets `rebuilt`.
build_if_stale() { # out-dir log-file
  rebuilt=0
  build_is_stale "$1" || return 0
  log "building the app into ${1#$ROOT/} (a few minutes on two cores)"
  JOGWISE_OUTPUT_DIR="$1" npx nuxt build > "$2" 2>&1 || { tail -40 "$2"; die "build failed (full log: ${2#$ROOT/})"; }
  rebuilt=1
}

# The block every entry point shares: start this checkout's MariaDB in data folder db-dir, empty
# the database first when asked ("fresh"), migrate it, and build the app into out-dir if stale
# (no out-dir: no build, as for `npm run dev`).
prepare_app() { # db-dir db-port db-name [out-dir build-log] [fresh]
  local db_dir="$1" db_port="$2" db_name="$3" out="${4:-}" build_log="${5:-}" fresh="${6:-}"
  JOGWISE_DB_NAME="$db_name" bash "$ROOT/scripts/db.sh" start "$db_dir" "$db_port"
  [ "$fresh" = fresh ] && JOGWISE_DB_NAME="$db_name" bash "$ROOT/scripts/db.sh" reset-db "$db_dir" "$db_port" >/dev/null
  use_db "$db_port" "$db_name"
  node --import tsx "$ROOT/scripts/migrate.ts"
  if [ -n "$out" ]; then build_if_stale "$out" "$build_log"; else rebuilt=0; fi
}
