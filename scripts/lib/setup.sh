#!/usr/bin/env bash
# Shared set-up for `npm start` and `npm test`: dependencies, a private PostgreSQL cluster on
# loopback, the database and its migrations. Sourced, not executed; expects ROOT and a profile
# (PG_PORT, PG_DIR, DB_NAME) set by the caller.
set -euo pipefail

# Debian 12 ships PostgreSQL 15 (docs/conventions.md, "Stack facts"); on another release take the newest installed major.
pg_bin_dir() {
  if [ -x /usr/lib/postgresql/15/bin/postgres ]; then echo /usr/lib/postgresql/15/bin; return; fi
  local newest; newest=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n1)
  echo "${newest:-/usr/lib/postgresql/15/bin}"
}
PG_BIN="${PG_BIN:-$(pg_bin_dir)}"
DB_USER="${DB_USER:-steradian}"
DB_PASSWORD="${DB_PASSWORD:-steradian}"

log() { printf '\033[2m[steradian]\033[0m %s\n' "$*"; }

as_root() {
  if [ "$(id -u)" = 0 ]; then "$@"; elif command -v sudo >/dev/null; then sudo "$@"; else
    echo "This step needs root: $*" >&2; return 1; fi
}

ensure_node_modules() {
  # npm ci only when the lock file changed since the last install, so a second start is quick.
  if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    log "installing npm dependencies (npm ci)"
    npm ci --no-audit --no-fund --loglevel=error
  fi
}

apt_install() {
  if [ -z "${APT_UPDATED:-}" ]; then as_root apt-get update -qq; APT_UPDATED=1; fi
  DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq "$@" >/dev/null
}

ensure_postgres_binaries() {
  if [ ! -x "$PG_BIN/postgres" ]; then
    log "installing Debian's PostgreSQL server (apt-get install postgresql)"
    apt_install postgresql
    PG_BIN="$(pg_bin_dir)"
  fi
}

# PostgreSQL refuses to run as root: the server runs as an unprivileged system user.
pg_system_user() {
  if [ "$(id -u)" != 0 ]; then id -un; return; fi
  if ! id -u postgres >/dev/null 2>&1; then
    as_root useradd --system --no-create-home --shell /usr/sbin/nologin postgres
  fi
  echo postgres
}

run_pg() {
  local u; u=$(pg_system_user)
  # From /, which the server's user can always enter (the checkout may not be readable to it).
  if [ "$(id -un)" = "$u" ]; then "$@"; else (cd / && runuser -u "$u" -- "$@"); fi
}

# The cluster lives in .data/ unless the server's user cannot reach the checkout (a home folder
# with mode 700, say); then it moves to /var/tmp under a name derived from the checkout's path.
resolve_pg_dir() {
  local u; u=$(pg_system_user)
  mkdir -p "$(dirname "$PG_DIR")"
  if [ "$(id -u)" = 0 ] && ! runuser -u "$u" -- test -x "$(dirname "$PG_DIR")" 2>/dev/null; then
    local tag; tag=$(printf '%s' "$ROOT" | sha256sum | cut -c1-12)
    PG_DIR="/var/tmp/steradian-$tag/$(basename "$PG_DIR")"
    log "the checkout is not readable by '$u': using $PG_DIR for the cluster"
  fi
  PG_SOCKET_DIR="$PG_DIR/socket"
}

ensure_cluster() {
  resolve_pg_dir
  local u; u=$(pg_system_user)
  if [ ! -f "$PG_DIR/data/PG_VERSION" ]; then
    log "creating a private PostgreSQL cluster in $PG_DIR"
    mkdir -p "$PG_DIR/data" "$PG_DIR/socket"
    chown -R "$u" "$PG_DIR"
    chmod 700 "$PG_DIR/data"
    run_pg "$PG_BIN/initdb" -D "$PG_DIR/data" -U postgres --auth-local=trust --auth-host=scram-sha-256 \
      --encoding=UTF8 --locale=C.UTF-8 >/dev/null
  fi
  mkdir -p "$PG_DIR/socket"; chown "$u" "$PG_DIR/socket"
}

pg_running() {
  run_pg "$PG_BIN/pg_ctl" -D "$PG_DIR/data" status >/dev/null 2>&1
}

clear_stale_pid() {
  local pidfile="$PG_DIR/data/postmaster.pid"
  [ -f "$pidfile" ] || return 0
  local pid state; pid=$(head -n1 "$pidfile")
  state=$( [ -n "$pid" ] && awk '{print $3}' "/proc/$pid/stat" 2>/dev/null || true)
  # After a crash the PID may be gone, a zombie, or reused by an unrelated process.
  if [ -z "$pid" ] || [ -z "$state" ] || [ "$state" = Z ] || [ "$state" = X ] \
     || ! tr '\0' ' ' < "/proc/$pid/cmdline" 2>/dev/null | grep -q -- "$PG_DIR/data"; then
    log "removing a stale postmaster.pid (PID ${pid:-?} is not this cluster's running server)"
    rm -f "$pidfile" "$PG_DIR/socket/.s.PGSQL.$PG_PORT" "$PG_DIR/socket/.s.PGSQL.$PG_PORT.lock"
    # Backends of a killed server leave on their own; give them a moment to release memory.
    for _ in $(seq 1 20); do pgrep -f "postgres: .*" -u "$(pg_system_user)" >/dev/null 2>&1 || break; sleep 0.25; done
  fi
}

start_postgres() {
  ensure_postgres_binaries
  ensure_cluster
  clear_stale_pid
  if pg_running; then
    log "PostgreSQL already running on 127.0.0.1:$PG_PORT"
  else
    log "starting PostgreSQL on 127.0.0.1:$PG_PORT"
    run_pg "$PG_BIN/pg_ctl" -D "$PG_DIR/data" -l "$PG_DIR/server.log" -w -t 60 \
      -o "-p $PG_PORT -k $PG_SOCKET_DIR -c listen_addresses=127.0.0.1 -c fsync=${PG_FSYNC:-on}" start >/dev/null
  fi
}

stop_postgres() {
  if pg_running; then
    log "stopping PostgreSQL" 2>/dev/null || true
    run_pg "$PG_BIN/pg_ctl" -D "$PG_DIR/data" -m fast -w stop >/dev/null || true
  fi
}

psql_admin() {
  run_pg psql -X -q -v ON_ERROR_STOP=1 -h "$PG_SOCKET_DIR" -p "$PG_PORT" -U postgres -d postgres "$@"
}

ensure_database() {
  local db="$1"
  psql_admin -tAc "SELECT 1 FROM pg_roles WHERE rolname = '$DB_USER'" | grep -q 1 ||
    psql_admin -c "CREATE ROLE $DB_USER LOGIN CREATEDB PASSWORD '$DB_PASSWORD'"
  psql_admin -tAc "SELECT 1 FROM pg_database WHERE datname = '$db'" | grep -q 1 ||
    psql_admin -c "CREATE DATABASE $db OWNER $DB_USER"
}

database_url() {
  printf 'postgres://%s:%s@127.0.0.1:%s/%s' "$DB_USER" "$DB_PASSWORD" "$PG_PORT" "$1"
}

# Waits until the app answers /healthz, and fails early if its process died (a port already in
# use, say) instead of trusting whatever else answers on that port.
wait_healthy() {
  local pid="$1" url="$2" log_file="$3"
  for _ in $(seq 1 150); do
    if ! kill -0 "$pid" 2>/dev/null; then
      echo "the app did not start:" >&2; cat "$log_file" >&2; return 1
    fi
    node -e "fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))" "$url/healthz" && return 0
    sleep 0.2
  done
  echo "the app did not answer on $url within 30 s:" >&2; cat "$log_file" >&2; return 1
}

port_free() {
  ! node -e "const s=require('net').connect(+process.argv[1],'127.0.0.1');s.on('connect',()=>process.exit(0));s.on('error',()=>process.exit(1))" "$1"
}
