#!/usr/bin/env bash
# Shared settings and helpers for Jogwise's start, test and database scripts.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA_DIR="$ROOT/.data"

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


# Waits until GET url answers 200 with JSON whose `ready` is true (server up, a shop seeded).
wait_for_ready() { # url seconds
  node -e '
    const [url, limit] = [process.argv[1], Number(process.argv[2])]
    const until = Date.now() + limit * 1000
    const tick = async () => {
      try { const r = await fetch(url); if (r.ok && (await r.json()).ready === true) process.exit(0) } catch {}
      if (Date.now() > until) process.exit(1)
      setTimeout(tick, 300)
    }
    tick()' "$1" "${2:-90}"
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
