#!/usr/bin/env bash
# The client as users get it: a production bundle in dist/client, whatever NODE_ENV the shell has.
# `npm start`, `npm test` and the browser tests' global setup all build through this script, so
# the tests exercise exactly the bundle `npm start` serves.
#   scripts/build-client.sh               production bundle (minified, React's production build)
#   scripts/build-client.sh development   a development bundle (React's development build, with
#                                         StrictMode's double mount), for checking that mode only
# Writes dist/client/.build (not served: express.static ignores dot files) with the mode, so the
# browser tests can tell which bundle is there.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

MODE="${1:-production}"
case "$MODE" in
  production|development) ;;
  *) die "build-client.sh: mode must be production or development, not '$MODE'" ;;
esac
# Vite takes NODE_ENV from the environment when it is set: an exported NODE_ENV=development would
# turn `vite build` into a development bundle. Set it for the build alone.
NODE_ENV="$MODE" npx vite build --mode "$MODE" --logLevel error >&2
printf '%s\n' "$MODE" > dist/client/.build
