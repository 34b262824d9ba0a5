#!/usr/bin/env bash
# npm run dev: MariaDB (as for npm start) and Nuxt's dev server with hot reload.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"
ensure_apt_packages
ensure_node_modules
bash scripts/db.sh start mariadb 3417
export NUXT_DB_HOST=127.0.0.1 NUXT_DB_PORT=3417 NUXT_DB_USER=jogwise NUXT_DB_PASSWORD=jogwise-local NUXT_DB_NAME=jogwise
node --import tsx scripts/migrate.ts
NUXT_SESSION_PASSWORD="$(ensure_session_secret)" NUXT_DEMO_SEED=1 NUXT_DEMO_PASSWORD="${JOGWISE_DEMO_PASSWORD:-shopfloor-demo-1}" exec npx nuxt dev
