#!/usr/bin/env bash
# The project-local PostgreSQL cluster on loopback.
#   scripts/db.sh start            start (initdb on first use); prints nothing on stdout
#   scripts/db.sh ensure-db NAME   start, then create database NAME if missing
#   scripts/db.sh stop             stop the cluster
#   scripts/db.sh status
# Environment: PW_DB_PORT (default 54329), PW_DB_DATA (default .data/pg), PW_DB_SOCKET_DIR.
# With DATABASE_URL set, this script leaves databases alone: you run your own server.
set -euo pipefail
source "$(dirname "$0")/lib.sh"

PORT="${PW_DB_PORT:-54329}"
DATA="${PW_DB_DATA:-$ROOT/.data/pg}"
# Unix socket paths are limited to ~100 bytes: keep the socket folder short, under /tmp.
SOCK="${PW_DB_SOCKET_DIR:-/tmp/pw-pg-$PORT}"
PGUSER_OS=postgres

find_pg_bin() {
  local d
  for d in $(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V -r); do
    if [ -x "$d/pg_ctl" ] && [ -x "$d/initdb" ] && [ -x "$d/postgres" ]; then echo "$d"; return 0; fi
  done
  return 1
}

ensure_pg_installed() {
  if ! PGBIN="$(find_pg_bin)"; then
    as_root_apt postgresql postgresql-client
    PGBIN="$(find_pg_bin)" || die "PostgreSQL binaries not found after install"
  fi
  export PGBIN
}

run_pg() {
  # postgres refuses to run as root: run its tools as the postgres system user.
  if [ "$(id -u)" = 0 ]; then runuser -u "$PGUSER_OS" -- "$@"; else "$@"; fi
}

ensure_os_user() {
  if [ "$(id -u)" = 0 ] && ! id "$PGUSER_OS" >/dev/null 2>&1; then
    useradd --system --home-dir /var/lib/postgresql --shell /bin/bash "$PGUSER_OS"
  fi
}

prepare_dirs() {
  mkdir -p "$DATA" "$SOCK"
  if [ "$(id -u)" = 0 ]; then
    chown "$PGUSER_OS": "$DATA" "$SOCK"
    # The postgres user must be able to reach the data folder through its parents.
    if ! runuser -u "$PGUSER_OS" -- test -x "$DATA"; then
      local p="$DATA"
      while [ "$p" != "/" ]; do p="$(dirname "$p")"; chmod o+x "$p" 2>/dev/null || true; done
      runuser -u "$PGUSER_OS" -- test -x "$DATA" || die "user $PGUSER_OS cannot reach $DATA; set PW_DB_DATA to a reachable folder"
    fi
  fi
  chmod 700 "$DATA"
}

clear_stale_pid() {
  # A pid file counts as live only when its process is this cluster's postmaster.
  local pidfile="$DATA/postmaster.pid" pid cmd
  [ -f "$pidfile" ] || return 0
  pid="$(head -n1 "$pidfile" 2>/dev/null || true)"
  if [ -n "$pid" ] && [ -r "/proc/$pid/cmdline" ]; then
    cmd="$(tr '\0' ' ' < "/proc/$pid/cmdline")"
    if [[ "$cmd" == *postgres* ]] && [ "$(readlink -f "/proc/$pid/cwd" 2>/dev/null)" = "$(readlink -f "$DATA")" ]; then
      return 0
    fi
  fi
  log "removing stale pid file $pidfile (process ${pid:-?} is not this cluster)"
  rm -f "$pidfile"
}

is_running() {
  [ -f "$DATA/PG_VERSION" ] && run_pg "$PGBIN/pg_ctl" -D "$DATA" status >/dev/null 2>&1
}

start() {
  if [ -n "${DATABASE_URL:-}" ]; then return 0; fi
  ensure_pg_installed
  ensure_os_user
  prepare_dirs
  if [ ! -f "$DATA/PG_VERSION" ]; then
    log "initdb $DATA"
    run_pg "$PGBIN/initdb" -D "$DATA" -U postgres --auth=trust --encoding=UTF8 --locale=C.UTF-8 >/dev/null \
      || run_pg "$PGBIN/initdb" -D "$DATA" -U postgres --auth=trust --encoding=UTF8 --locale=C >/dev/null
  fi
  clear_stale_pid
  if is_running; then return 0; fi
  log "starting PostgreSQL on 127.0.0.1:$PORT"
  run_pg "$PGBIN/pg_ctl" -D "$DATA" -l "$DATA/server.log" -w -t 60 \
    -o "-c listen_addresses=127.0.0.1 -p $PORT -k $SOCK -c fsync=${PW_DB_FSYNC:-on}" start >/dev/null \
    || { tail -n 20 "$DATA/server.log" >&2; die "PostgreSQL did not start (log above: $DATA/server.log)"; }
}

ensure_db() {
  local name="$1"
  start
  if [ -n "${DATABASE_URL:-}" ]; then return 0; fi
  local exists
  exists="$("$PGBIN/psql" -h 127.0.0.1 -p "$PORT" -U postgres -d postgres -tAc "select 1 from pg_database where datname='$name'")"
  if [ "$exists" != 1 ]; then
    log "creating database $name"
    "$PGBIN/psql" -h 127.0.0.1 -p "$PORT" -U postgres -d postgres -qc "create database \"$name\"" >/dev/null
  fi
}

stop() {
  if ! PGBIN="$(find_pg_bin)"; then return 0; fi
  if [ -f "$DATA/PG_VERSION" ]; then
    clear_stale_pid
    if is_running; then run_pg "$PGBIN/pg_ctl" -D "$DATA" -m fast -w stop >/dev/null && log "PostgreSQL stopped"; else log "PostgreSQL was not running"; fi
  fi
}

case "${1:-}" in
  start) start ;;
  ensure-db) ensure_db "${2:?database name}" ;;
  stop) stop ;;
  status) PGBIN="$(find_pg_bin)" || die "PostgreSQL not installed"; if is_running; then echo running; else echo stopped; fi ;;
  url) echo "postgres://postgres@127.0.0.1:$PORT/${2:-placewright}" ;;
  *) die "usage: scripts/db.sh start|ensure-db NAME|stop|status|url [NAME]" ;;
esac
