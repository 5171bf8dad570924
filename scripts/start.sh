#!/usr/bin/env bash
# `npm start`: everything a fresh machine needs, then the app on http://127.0.0.1:3000.
set -euo pipefail
ROOT="$(cd "$(dirname "$0")/.." && pwd)"
cd "$ROOT"
PG_PORT="${STERADIAN_PG_PORT:-54329}"
PG_DIR="$ROOT/.data/pg"
DB_NAME="${STERADIAN_DB_NAME:-steradian}"
source scripts/lib/setup.sh

pids=()
cleanup() {
  local code=$?
  trap - INT TERM EXIT
  # The terminal (or a pipe such as tee) may already be gone: never let a failed write stop
  # the shutdown half-way.
  trap '' PIPE
  log "shutting down" 2>/dev/null || true
  for p in "${pids[@]}"; do kill -TERM "$p" 2>/dev/null || true; done
  for p in "${pids[@]}"; do wait "$p" 2>/dev/null || true; done
  stop_postgres
  exit "$code"
}
# Set before anything starts, so that a failure or Ctrl-C during set-up stops PostgreSQL too.
trap cleanup INT TERM EXIT

ensure_node_modules
start_postgres
ensure_database "$DB_NAME"

export NODE_ENV="${NODE_ENV:-production}"
export PORT="${PORT:-3000}"
export HOST="${HOST:-127.0.0.1}"
export DATABASE_URL="${DATABASE_URL:-$(database_url "$DB_NAME")}"
export SMTP_URL="${SMTP_URL:-smtp://127.0.0.1:1025}"
export MAIL_CATCHER_URL="${MAIL_CATCHER_URL:-http://127.0.0.1:1080}"
export STORAGE_DIR="${STORAGE_DIR:-$ROOT/storage}"
export APP_URL="${APP_URL:-http://$HOST:$PORT}"
if [ -z "${SESSION_SECRET:-}" ]; then
  # A local secret kept in .data so sessions survive a restart; a real deployment sets its own.
  [ -f .data/session-secret ] || (umask 077; head -c 32 /dev/urandom | base64 > .data/session-secret)
  SESSION_SECRET="$(cat .data/session-secret)"; export SESSION_SECRET
fi

log "migrating the database"
npx tsx db/migrate.ts
log "seeding the demo scenario"
npx tsx db/seed.ts

if [ ! -f build/server/index.js ] || [ -n "$(find app -newer build/server/index.js -print -quit)" ] \
   || [ package-lock.json -nt build/server/index.js ]; then
  log "building the app"
  npx react-router build > .data/build.log 2>&1 || { cat .data/build.log; exit 1; }
fi

node_modules/.bin/tsx scripts/mail-catcher.ts --smtp "${SMTP_URL##*:}" --http "${MAIL_CATCHER_URL##*:}" &
pids+=($!)
node_modules/.bin/tsx scripts/prepare-storage.ts
node scripts/serve.js > >(tee .data/server.log) 2>&1 &
pids+=($!)
wait_healthy "$!" "$APP_URL" .data/server.log

cat <<MSG

  Steradian is running at $APP_URL

  Demo sign-ins (invented collaboration, password for all: demo-steradian-2026):
    contributor          ada.contributor@example.org
    co-author            bruno.coauthor@example.org
    corresponding author carla.corresponding@example.org
    site admin           admin@example.org
  Captured e-mail: sign in as the site admin and open "Mail".
  Ctrl-C stops the app, the mail catcher and PostgreSQL.

MSG
# Ctrl-C, or either process ending, stops everything.
wait -n "${pids[@]}" || true
