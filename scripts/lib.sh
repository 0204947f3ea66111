#!/usr/bin/env bash
# Shared helpers for the start, test and db scripts. Source it; do not run it.
# Every step checks before it acts, so a second run is quick and a fresh machine sets itself up.

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export ROOT

log() { printf '\033[1;33m[placewright]\033[0m %s\n' "$*" >&2; }
die() { printf '\033[1;31m[placewright] %s\033[0m\n' "$*" >&2; exit 1; }

as_root_apt() {
  # apt-get, non-interactive; `apt-get update` once per script run.
  if [ "$(id -u)" != 0 ]; then die "Installing $* needs root (apt-get). Install it yourself or re-run as root."; fi
  if [ -z "${PW_APT_UPDATED:-}" ]; then
    log "apt-get update"
    DEBIAN_FRONTEND=noninteractive apt-get update -qq </dev/null >&2 || die "apt-get update failed"
    export PW_APT_UPDATED=1
  fi
  log "apt-get install $*"
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "$@" </dev/null >&2 || die "apt-get install $* failed"
}

ensure_node_modules() {
  # Install when node_modules is missing or older than the lock file.
  if [ ! -d "$ROOT/node_modules" ] || [ ! -f "$ROOT/node_modules/.package-lock.json" ] \
     || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "npm ci"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error </dev/null >&2) || die "npm ci failed"
  fi
}

ensure_chromium() {
  if [ -x /usr/bin/chromium ]; then return 0; fi
  as_root_apt chromium fonts-liberation
}
