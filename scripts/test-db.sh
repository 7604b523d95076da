#!/usr/bin/env bash
# A fresh, migrated and seeded database on the private test cluster, for running one test file
# by hand. Prints the settings as shell exports; use it as
#   eval "$(bash scripts/test-db.sh)"
#   node_modules/.bin/vitest run -c tests/vitest.config.ts tests/integration/lesions.test.ts
# The cluster keeps running (scripts/test.sh leaves a running cluster running); the port comes
# from DENTATE_TEST_PG_PORT as in scripts/test.sh. Old databases of this script are dropped.
source "$(dirname "$0")/lib/common.sh"
source "$(dirname "$0")/lib/replica.sh"

PG_PORT="${DENTATE_TEST_PG_PORT:-54339}"
DB="dentate_h_$(date +%s)_$$"

ensure_postgres_installed >&2
ensure_node_modules >&2
start_cluster test "$PG_PORT" fast >&2
ensure_role "$PG_PORT" dentate_test dentate_test >&2
for old in $(psql_super "$PG_PORT" -d postgres -c "select datname from pg_database where datname like 'dentate_h_%'"); do
  psql_super "$PG_PORT" -d postgres -c "drop database if exists $old with (force)" >&2
done
psql_super "$PG_PORT" -d postgres -c "create database $DB owner dentate_test" >&2
use_cluster_database "$PG_PORT" dentate_test "$DB"
cd "$ROOT"
node_modules/.bin/tsx db/migrate.ts >&2
node_modules/.bin/tsx --conditions=react-server db/seed/index.ts >&2
# DENTATE_TEST_REPLICA=1: also a streaming replica on DENTATE_TEST_REPLICA_PORT (default the next
# port), for tests/integration/research-replica.test.ts; stop it with pg_ctl -D its data directory.
REPLICA_EXPORTS=""
if [ "${DENTATE_TEST_REPLICA:-0}" = 1 ]; then
  RPORT="${DENTATE_TEST_REPLICA_PORT:-$((PG_PORT + 1))}"
  start_replica test "$PG_PORT" "$RPORT" fast >&2
  REPLICA_EXPORTS="export DENTATE_TEST_REPLICA_PORT='$RPORT' DENTATE_TEST_REPLICA_SOCKET='$REPLICA_SOCK_DIR' DENTATE_TEST_REPLICA_DATA='$REPLICA_DATA_DIR'"
fi

cat <<EXPORTS
export DATABASE_URL='$DATABASE_URL' DATABASE_SOCKET_DIR='$DATABASE_SOCKET_DIR'
export DENTATE_TEST_PG_PORT='$PG_PORT' DENTATE_TEST_PG_SOCKET='$PGSOCK_DIR' DENTATE_TEST_PG_DATA='$PGDATA_DIR' PGBIN='$PGBIN'
$REPLICA_EXPORTS
EXPORTS
