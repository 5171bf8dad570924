#!/usr/bin/env bash
# `npm test`: the same set-up as `npm start` with its own cluster and databases, then every test
# (unit, integration against the real PostgreSQL, browser end-to-end) in one vitest run.
set -euo pipefail
ROOT="$(cd "$(dirname "$0")/.." && pwd)"
cd "$ROOT"
PG_PORT="${STERADIAN_TEST_PG_PORT:-54339}"
PG_DIR="$ROOT/.data/pg-test"
PG_FSYNC=off
source scripts/lib/setup.sh

APP_PORT="${STERADIAN_TEST_APP_PORT:-3100}"
SMTP_PORT="${STERADIAN_TEST_SMTP_PORT:-2526}"
MAIL_HTTP_PORT="${STERADIAN_TEST_MAIL_HTTP_PORT:-2527}"

ensure_node_modules
log "lint and typecheck"
npx eslint app db scripts tests
npx react-router typegen >/dev/null 2>&1
npx tsc --noEmit
ensure_browser() {
  if [ ! -x /usr/bin/chromium ] || ! command -v pdffonts >/dev/null; then
    log "installing Debian's chromium and poppler-utils for the browser tests"
    apt_install chromium poppler-utils
  fi
}
ensure_browser
start_postgres

pids=()
cleanup() {
  local code=$?
  trap - INT TERM EXIT
  for p in "${pids[@]}"; do kill -TERM "$p" 2>/dev/null || true; done
  for p in "${pids[@]}"; do wait "$p" 2>/dev/null || true; done
  stop_postgres >/dev/null 2>&1
  # The runner's summary is the very last line of the run.
  [ -f "$ROOT/.data/test-results.json" ] && node scripts/lib/test-summary.mjs "$ROOT/.data/test-results.json" || true
  exit "$code"
}
trap cleanup INT TERM EXIT

# A fresh template database, migrated once; integration tests clone one database per test file.
for db in steradian_test_template steradian_test_app; do
  psql_admin -c "DROP DATABASE IF EXISTS $db WITH (FORCE)" >/dev/null
  ensure_database "$db"
done
export MIGRATE_QUIET=1
DATABASE_URL="$(database_url steradian_test_template)" npx tsx db/migrate.ts
DATABASE_URL="$(database_url steradian_test_app)" npx tsx db/migrate.ts

export NODE_ENV=production
export SESSION_SECRET="test-secret-$(head -c 12 /dev/urandom | base64)"
export APP_URL="http://127.0.0.1:$APP_PORT"
export STORAGE_DIR="$ROOT/.data/test-storage"
rm -rf "$STORAGE_DIR"; mkdir -p "$STORAGE_DIR"
DATABASE_URL="$(database_url steradian_test_app)" npx tsx db/seed.ts >/dev/null

log "building the app"
npx react-router build >/dev/null 2>&1 || npx react-router build

for port in "$APP_PORT" "$SMTP_PORT" "$MAIL_HTTP_PORT"; do
  port_free "$port" || { echo "port $port is in use (a test run left running?): stop it first" >&2; exit 1; }
done
node_modules/.bin/tsx scripts/mail-catcher.ts --smtp "$SMTP_PORT" --http "$MAIL_HTTP_PORT" >/dev/null &
pids+=($!)
DATABASE_URL="$(database_url steradian_test_app)" node_modules/.bin/tsx scripts/prepare-storage.ts
PORT="$APP_PORT" DATABASE_URL="$(database_url steradian_test_app)" SMTP_URL="smtp://127.0.0.1:$SMTP_PORT" \
  MAIL_CATCHER_URL="http://127.0.0.1:$MAIL_HTTP_PORT" SIGN_IN_MAX_FAILURES_PER_ADDRESS=1000 \
  UPLOAD_MAX_BYTES="${TEST_UPLOAD_MAX_BYTES:-2097152}" UPLOAD_MAX_ROWS="${TEST_UPLOAD_MAX_ROWS:-20000}" \
  node scripts/serve.js > "$ROOT/.data/test-server.log" 2>&1 &
pids+=($!)
wait_healthy "$!" "http://127.0.0.1:$APP_PORT" "$ROOT/.data/test-server.log"

export TEST_APP_URL="http://127.0.0.1:$APP_PORT"
export TEST_APP_DATABASE_URL="$(database_url steradian_test_app)"
export TEST_TEMPLATE_DATABASE_URL="$(database_url steradian_test_template)"
export TEST_MAIL_URL="http://127.0.0.1:$MAIL_HTTP_PORT"
export TEST_SMTP_PORT="$SMTP_PORT"
export TEST_STORAGE_DIR="$STORAGE_DIR"
export TEST_UPLOAD_MAX_BYTES="${TEST_UPLOAD_MAX_BYTES:-2097152}" TEST_UPLOAD_MAX_ROWS="${TEST_UPLOAD_MAX_ROWS:-20000}"

rm -f "$ROOT/.data/test-results.json"
set +e
npx vitest run --reporter=default --reporter=json --outputFile.json="$ROOT/.data/test-results.json" "$@"
status=$?
set -e
if [ "$status" != 0 ]; then
  echo "server log (last 40 lines):"; tail -n 40 "$ROOT/.data/test-server.log" || true
fi
exit "$status"
