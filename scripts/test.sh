#!/usr/bin/env bash
# npm test: sets itself up (dependencies, Chromium, PostgreSQL, test databases), then runs
#   1. the type check over client, server and shared (one check), and the import-layer rules
#      of .dependency-cruiser.cjs (one check)
#   2. the migration drift check (one check: entities and migrations agree)
#   3. vitest: shared (engine) unit tests, client component tests, server integration tests
#      against the real PostgreSQL, and the browser tests in Chromium (playwright-core)
# and prints as its last line the total over all of them: "N passed, N failed[, N skipped]".
set -uo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_node_modules
ensure_chromium

was_running=0
if [ -z "${DATABASE_URL_TEST_BASE:-}" ]; then
  if PGBIN_CHECK="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | head -n1)" && [ -n "$PGBIN_CHECK" ] && [ "$(bash scripts/db.sh status 2>/dev/null)" = running ]; then was_running=1; fi
  bash scripts/db.sh start || die "could not start PostgreSQL"
fi

passed=0; failed=0; skipped=0
check() { # name, command...
  local name="$1"; shift
  log "$name"
  if "$@"; then passed=$((passed + 1)); else failed=$((failed + 1)); log "FAILED: $name"; fi
}

check "type check (tsc --noEmit)" npx tsc --noEmit -p tsconfig.json
check "import layers (dependency-cruiser: no loops, shared/ framework-free, barrels only)" npx depcruise --validate .dependency-cruiser.cjs shared server src

log "building the client for the browser tests"
bash scripts/build-client.sh production || { failed=$((failed + 1)); log "FAILED: client build"; }

mkdir -p .data
# Two vitest runs: unit and integration first, then the browser tests alone, so that Chromium
# does not compete with the server tests for the machine's cores.
run_vitest() { # label, results file, vitest args...
  local label="$1" results="$2"; shift 2
  rm -f "$results"
  log "vitest: $label"
  npx vitest run --reporter=default --reporter=json --outputFile.json="$results" "$@"
  local rc=$?
  if [ -f "$results" ]; then
    read -r vp vf vs < <(node -e '
      const r = JSON.parse(require("fs").readFileSync(process.argv[1], "utf8"));
      // Files that failed to load count as failures too.
      const fileErrors = (r.testResults || []).filter(f => f.status === "failed" && (f.assertionResults || []).length === 0).length;
      console.log(r.numPassedTests, r.numFailedTests + fileErrors, (r.numPendingTests || 0) + (r.numTodoTests || 0));
    ' "$results")
    passed=$((passed + vp)); failed=$((failed + vf)); skipped=$((skipped + vs))
    if [ "$rc" != 0 ] && [ "$vf" = 0 ]; then failed=$((failed + 1)); log "FAILED: vitest ($label) exited $rc"; fi
  else
    failed=$((failed + 1)); log "FAILED: vitest ($label) wrote no results (exit $rc)"
  fi
}
run_vitest "shared, client, server" .data/vitest-unit.json --project shared --project client --project server
run_vitest "browser (e2e)" .data/vitest-e2e.json --project e2e

if [ -z "${DATABASE_URL_TEST_BASE:-}" ]; then
  export DATABASE_URL="$(bash scripts/db.sh url "${PW_TEST_DB_NAME:-placewright_test}")"
else
  export DATABASE_URL="${DATABASE_URL_TEST_BASE%/}/${PW_TEST_DB_NAME:-placewright_test}"
fi
check "migration drift check (entities match migrations)" \
  node --import tsx ./node_modules/typeorm/cli.js migration:generate --check --dryrun -d server/db/data-source.ts server/db/migrations/DriftCheck

if [ "$was_running" = 0 ] && [ -z "${DATABASE_URL_TEST_BASE:-}" ]; then bash scripts/db.sh stop; fi

line="$passed passed, $failed failed"
[ "$skipped" -gt 0 ] && line="$line, $skipped skipped"
echo "$line"
[ "$failed" = 0 ]
