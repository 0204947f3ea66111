#!/usr/bin/env bash
# npm start: set everything up that is missing, then serve API and client on one port.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_node_modules
DB_NAME="${PW_DB_NAME:-placewright}"
bash scripts/db.sh ensure-db "$DB_NAME"
export DATABASE_URL="${DATABASE_URL:-$(bash scripts/db.sh url "$DB_NAME")}"

log "migrating"
node --import tsx server/db/migrate.ts
# The demo seed runs on a new database only (PW_DEMO_SEED=force: every start; 0: never).
node --import tsx server/db/seed.ts
if [ "${PW_SKIP_BUILD:-0}" != 1 ]; then
  log "building the client (production bundle)"
  bash scripts/build-client.sh production
fi
# The server's own mode (development: no SESSION_SECRET needed on a workstation). It is exported
# only now: the client bundle above is always built for production.
export NODE_ENV="${NODE_ENV:-development}"

PORT="${PORT:-3000}"
cat >&2 <<MSG

  Placewright  →  http://localhost:$PORT/

  Demo sign-ins (password for all: harrow-creek-demo; they exist only because the demo seed ran):
    admin      ada@harrowcreek.example
    engineer   ellis@harrowcreek.example   (author)
    engineer   rowan@harrowcreek.example   (reviewer)
    librarian  lena@harrowcreek.example
    operator   otto@harrowcreek.example

  Stop with Ctrl-C; \`npm run db:stop\` stops the database.

MSG
export PORT
exec node --import tsx server/index.ts
