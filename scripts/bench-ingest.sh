#!/usr/bin/env bash
# `npm run bench:ingest`: its own cluster and server, then scripts/bench-ingest.ts prints the figures.
set -euo pipefail
ROOT="$(cd "$(dirname "$0")/.." && pwd)"
cd "$ROOT"
PG_PORT="${STERADIAN_BENCH_PG_PORT:-54349}"
PG_DIR="$ROOT/.data/pg-bench"
source scripts/lib/setup.sh
APP_PORT="${STERADIAN_BENCH_APP_PORT:-3200}"

ensure_node_modules >&2
start_postgres >&2
pids=()
cleanup() {
  trap - INT TERM EXIT
  for p in "${pids[@]}"; do kill -TERM "$p" 2>/dev/null || true; done
  for p in "${pids[@]}"; do wait "$p" 2>/dev/null || true; done
  stop_postgres >&2
}
trap cleanup INT TERM EXIT
psql_admin -c "DROP DATABASE IF EXISTS steradian_bench WITH (FORCE)" >/dev/null
ensure_database steradian_bench
export DATABASE_URL="$(database_url steradian_bench)"
MIGRATE_QUIET=1 npx tsx db/migrate.ts
[ -f build/server/index.js ] || npx react-router build > .data/build.log 2>&1
export STORAGE_DIR="$ROOT/.data/bench-storage"
rm -rf "$STORAGE_DIR"; mkdir -p "$STORAGE_DIR"
# The product's default limits (50 MiB, 2·10⁶ rows), so that the figures are those a user gets.
NODE_ENV=production SESSION_SECRET="bench-secret-$(head -c 12 /dev/urandom | base64)" PORT="$APP_PORT" \
  APP_URL="http://127.0.0.1:$APP_PORT" SMTP_URL="smtp://127.0.0.1:9" node scripts/serve.js > .data/bench-server.log 2>&1 &
SERVER_PID=$!
pids+=("$SERVER_PID")
for _ in $(seq 1 100); do curl -fs "http://127.0.0.1:$APP_PORT/healthz" >/dev/null 2>&1 && break; sleep 0.2; done
BENCH_APP_URL="http://127.0.0.1:$APP_PORT" BENCH_SERVER_PID="$SERVER_PID" BENCH_PSQL_HOST="$PG_SOCKET_DIR" BENCH_PSQL_PORT="$PG_PORT" \
  npx tsx scripts/bench-ingest.ts "$@"
