#!/usr/bin/env bash
# A fresh, migrated and seeded database on the private test cluster, for running one test file
# by hand. Prints the settings as shell exports; use it as
#   eval "$(bash scripts/test-db.sh)"
#   node_modules/.bin/vitest run -c tests/vitest.config.ts tests/integration/lesions.test.ts
# The cluster keeps running (scripts/test.sh leaves a running cluster running); the port comes
# from DENTATE_TEST_PG_PORT as in scripts/test.sh. Old databases of this script are dropped.
source "$(dirname "$0")/lib/common.sh"

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

cat <<EXPORTS
export DATABASE_URL='$DATABASE_URL' DATABASE_SOCKET_DIR='$DATABASE_SOCKET_DIR'
export DENTATE_TEST_PG_PORT='$PG_PORT' DENTATE_TEST_PG_SOCKET='$PGSOCK_DIR' DENTATE_TEST_PG_DATA='$PGDATA_DIR' PGBIN='$PGBIN'
EXPORTS
