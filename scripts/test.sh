#!/usr/bin/env bash
# Every test layer against a real PostgreSQL: a private test cluster on 127.0.0.1, a fresh
# throwaway database per run, then typecheck, unit, component, integration and end-to-end tests.
# Ends with one line: "N passed, N failed" (", N skipped" when any).
source "$(dirname "$0")/lib/common.sh"
source "$(dirname "$0")/lib/fake-s3.sh"
source "$(dirname "$0")/lib/fake-mail.sh"
source "$(dirname "$0")/lib/replica.sh"

PG_PORT="${DENTATE_TEST_PG_PORT:-54339}"
REPLICA_PORT="${DENTATE_TEST_REPLICA_PORT:-$((PG_PORT + 1))}"
APP_PORT="${DENTATE_TEST_PORT:-3100}"
S3_PORT="${DENTATE_TEST_S3_PORT:-4579}"
SMTP_TEST_PORT="${DENTATE_TEST_SMTP_PORT:-1035}"
MAIL_WEB_TEST_PORT="${DENTATE_TEST_MAIL_WEB_PORT:-1090}"
RUN_ID="$(date +%s)_$$"
DB="dentate_t_$RUN_ID"
OUT="$(mktemp -d /tmp/dentate-test-XXXXXX)"
chmod 755 "$OUT"

ensure_postgres_installed
ensure_chromium_installed
ensure_node_modules
# The cluster is stopped again at the end when this run started it (another checkout's test run
# may want the port next); one that was already running is left as it was found.
CLUSTER_WAS_UP=0
cluster_running test && CLUSTER_WAS_UP=1
start_cluster test "$PG_PORT" fast
ensure_role "$PG_PORT" dentate_test dentate_test
psql_super "$PG_PORT" -d postgres -c "create database $DB owner dentate_test"
# A streaming replica of the test cluster (made afresh each run): the replica test reads from it.
start_replica test "$PG_PORT" "$REPLICA_PORT" fast
export DENTATE_TEST_REPLICA_PORT="$REPLICA_PORT" DENTATE_TEST_REPLICA_SOCKET="$REPLICA_SOCK_DIR"

use_cluster_database "$PG_PORT" dentate_test "$DB"
export DENTATE_TEST_PG_PORT="$PG_PORT" DENTATE_TEST_PG_SOCKET="$PGSOCK_DIR" DENTATE_TEST_PG_DATA="$PGDATA_DIR" PGBIN
export DENTATE_BASE_URL="http://127.0.0.1:$APP_PORT"
export DENTATE_DIST_DIR=".next-test"
# The test database holds the demo scenario: a demonstration install as far as the server is concerned.
export DENTATE_DEMO=1

APP_PID=""
WORKER_PID=""
cleanup() {
  local rc=$?
  set +e  # a killed child's status must not abort the clean-up half way
  [ -n "$APP_PID" ] && kill "$APP_PID" 2>/dev/null && wait "$APP_PID" 2>/dev/null
  [ -n "$WORKER_PID" ] && kill "$WORKER_PID" 2>/dev/null && wait "$WORKER_PID" 2>/dev/null
  stop_s3_fake
  stop_mail_fake
  psql_super "$PG_PORT" -d postgres -c "drop database if exists $DB with (force)" >/dev/null 2>&1 || true
  stop_replica test
  [ "$CLUSTER_WAS_UP" = 1 ] || stop_cluster test
  exit "$rc"
}
trap cleanup EXIT

cd "$ROOT"
rm -rf "$OUT/s3"
start_s3_fake "$S3_PORT" "$OUT/s3" "dentate-test"
export APP_BASE_URL="$DENTATE_BASE_URL"
extra_failed=0
# A step without its own test report (typecheck, build) counts as one failure when it fails.
step() { local name="$1"; shift; log "$name"; if ! "$@"; then log "FAILED: $name"; extra_failed=$((extra_failed + 1)); fi; }
# A vitest layer's failures are counted from its JSON report (a missing report counts as one).
layer() { local name="$1"; shift; log "$name"; "$@" || log "FAILED: $name"; }

node_modules/.bin/tsx db/migrate.ts
node_modules/.bin/tsx --conditions=react-server db/seed/index.ts

step "typecheck" node_modules/.bin/tsc --noEmit
# The layering is a lint rule (tests/eslint.config.mjs): a forbidden import fails the run.
step "lint (layering and code rules)" node_modules/.bin/eslint -c tests/eslint.config.mjs --max-warnings=0 .
VITEST="node_modules/.bin/vitest run -c tests/vitest.config.ts"
layer "unit and component tests" $VITEST --project unit --project component --reporter=default --reporter=json --outputFile.json="$OUT/unit.json"
layer "integration tests" $VITEST --project integration --reporter=default --reporter=json --outputFile.json="$OUT/int.json"

log "building the app for end-to-end tests"
if node_modules/.bin/next build >"$OUT/build.log" 2>&1; then
  # The end-to-end layer gets its own fake inbox and the mail worker (integration tests that need
  # SMTP start private ones, and no worker may drain their outbox meanwhile).
  start_mail_fake "$SMTP_TEST_PORT" "$MAIL_WEB_TEST_PORT" "$OUT/mail"
  NODE_OPTIONS="$APP_NODE_OPTIONS" node_modules/.bin/next start -H 127.0.0.1 -p "$APP_PORT" >"$OUT/app.log" 2>&1 &
  APP_PID=$!
  MAIL_WORKER_INTERVAL_MS=500 node_modules/.bin/tsx --conditions=react-server scripts/mail-worker.ts >"$OUT/mail-worker.log" 2>&1 &
  WORKER_PID=$!
  wait_http "$DENTATE_BASE_URL/sign-in" 60
  layer "end-to-end tests" $VITEST --project e2e --reporter=default --reporter=json --outputFile.json="$OUT/e2e.json"
else
  tail -40 "$OUT/build.log"
  log "FAILED: next build"
  extra_failed=$((extra_failed + 1))
fi

status=0
node scripts/lib/count-results.mjs "$extra_failed" "$OUT"/unit.json "$OUT"/int.json "$OUT"/e2e.json || status=$?
exit "$status"
