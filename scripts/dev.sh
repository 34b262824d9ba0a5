#!/usr/bin/env bash
# npm run dev: MariaDB (as for npm start) and Nuxt's dev server with hot reload.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"
ensure_apt_packages
ensure_node_modules
prepare_app mariadb "$JOGWISE_DB_PORT" jogwise
NUXT_SESSION_PASSWORD="$(ensure_session_secret)" NUXT_DEMO_SEED=1 NUXT_DEMO_PASSWORD="$JOGWISE_DEMO_PASSWORD" exec npx nuxt dev
