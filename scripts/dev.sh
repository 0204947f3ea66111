#!/usr/bin/env bash
# npm run dev: the API with tsx watch on PORT (3000) and Vite with hot reload on 5173, /api proxied.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules
DB_NAME="${PW_DB_NAME:-placewright}"
bash scripts/db.sh ensure-db "$DB_NAME"
export DATABASE_URL="${DATABASE_URL:-$(bash scripts/db.sh url "$DB_NAME")}"
node --import tsx server/db/migrate.ts
node --import tsx server/db/seed.ts
node --import tsx --watch server/index.ts &
API=$!
trap 'kill $API 2>/dev/null' EXIT
log "client with hot reload: http://localhost:5173/"
npx vite
