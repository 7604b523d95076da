# A streaming replica of a local cluster, for research reads (db/replica.ts). Sourced after
# lib/common.sh; do not run.
# shellcheck shell=bash

# start_replica PRIMARY_NAME PRIMARY_PORT REPLICA_PORT [fast]: a hot standby of the running
# PRIMARY_NAME cluster on 127.0.0.1:REPLICA_PORT, made afresh with pg_basebackup -R (which writes
# primary_conninfo and standby.signal), streaming over the primary's private socket. The primary
# needs wal_level replica (PostgreSQL's default) and a free WAL sender (max_wal_senders, default
# 10); initdb's pg_hba.conf lets the local superuser replicate over the socket. Sets
# REPLICA_SOCK_DIR and REPLICA_DATA_DIR.
start_replica() {
  local primary="$1" pport="$2" rport="$3" fast="${4:-}"
  cluster_paths "$primary"
  local psock="$PGSOCK_DIR"
  local level
  level="$(psql_super "$pport" -d postgres -c "show wal_level")"
  [ "$level" != minimal ] || die "the $primary cluster runs with wal_level=minimal: a replica needs replica or logical"
  stop_cluster "$primary-replica"
  cluster_paths "$primary-replica"
  rm -rf "$PGDATA_DIR"
  mkdir -p "$PGDATA_DIR" "$PGSOCK_DIR"
  chown postgres:postgres "$PGDATA_DIR" "$PGSOCK_DIR"
  chmod 700 "$PGDATA_DIR"
  log "copying the $primary cluster for its replica (pg_basebackup)"
  pg_as_postgres "$PGBIN/pg_basebackup" -h "$psock" -p "$pport" -U postgres -D "$PGDATA_DIR" -R -X stream -c fast \
    || die "pg_basebackup from the $primary cluster failed"
  # Long research reads on the standby should not be cancelled by the replay of vacuum on the
  # primary: the standby tells the primary which rows its queries still need.
  printf "hot_standby = on\nhot_standby_feedback = on\n" >>"$PGDATA_DIR/postgresql.auto.conf"
  start_cluster "$primary-replica" "$rport" "$fast"
  REPLICA_SOCK_DIR="$PGSOCK_DIR"
  REPLICA_DATA_DIR="$PGDATA_DIR"
  export REPLICA_SOCK_DIR REPLICA_DATA_DIR
  # Leave PGSOCK_DIR/PGDATA_DIR naming the primary, as the callers expect.
  cluster_paths "$primary"
}

stop_replica() { stop_cluster "$1-replica"; }
