#!/usr/bin/env bash
# Local PostgreSQL 15 on loopback, in a git-ignored folder of the project.
#   scripts/db.sh start [dev|test]   create the cluster on first use, start it, create the database
#   scripts/db.sh stop  [dev|test]
#   scripts/db.sh url   [dev|test]   print the DATABASE_URL
# dev:  .data/pg       port 54329, fsync on (durable)
# test: .data/pg-test  port 54339, fsync off (throwaway, wiped at every start)
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$PWD
ACTION=${1:-start}
KIND=${2:-dev}
PGBIN=/usr/lib/postgresql/15/bin
if [ "$KIND" = test ]; then
  PGDATA=$ROOT/.data/pg-test; PGPORT=${TEST_PGPORT:-54339}; DB=filmtrail_test; EXTRA="-c fsync=off -c synchronous_commit=off -c full_page_writes=off"
else
  PGDATA=$ROOT/.data/pg; PGPORT=${PGPORT:-54329}; DB=filmtrail; EXTRA=""
fi

as_pg() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }

ensure_postgres_installed() {
  if [ -x "$PGBIN/initdb" ]; then return; fi
  echo "PostgreSQL 15 is missing: installing it with apt-get" >&2
  if [ "$(id -u)" != 0 ]; then echo "Run as root, or install the Debian package postgresql-15 first" >&2; exit 1; fi
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq postgresql-15 >/dev/null
  # Debian's package starts its own cluster on 5432; Filmtrail does not use it.
  (pg_ctlcluster 15 main stop 2>/dev/null || true)
}

start() {
  ensure_postgres_installed
  if [ "$KIND" = test ] && [ -d "$PGDATA" ]; then stop_quiet; rm -rf "$PGDATA"; fi
  mkdir -p "$ROOT/.data"
  if [ ! -s "$PGDATA/PG_VERSION" ]; then
    mkdir -p "$PGDATA"
    if [ "$(id -u)" = 0 ]; then
      chown postgres:postgres "$PGDATA"
      # every parent must be enterable by the postgres user
      d=$PGDATA; while [ "$d" != / ]; do d=$(dirname "$d"); chmod o+x "$d" 2>/dev/null || true; done
    fi
    chmod 700 "$PGDATA"
    as_pg "$PGBIN/initdb" -D "$PGDATA" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
  fi
  if ! as_pg "$PGBIN/pg_ctl" -D "$PGDATA" status >/dev/null 2>&1; then
    as_pg "$PGBIN/pg_ctl" -D "$PGDATA" -l "$PGDATA/server.log" -w -t 30 \
      -o "-p $PGPORT -c listen_addresses=127.0.0.1 -c unix_socket_directories=$PGDATA $EXTRA" start >/dev/null
  fi
  if ! as_pg "$PGBIN/psql" -h 127.0.0.1 -p "$PGPORT" -U postgres -tAc "SELECT 1 FROM pg_database WHERE datname='$DB'" | grep -q 1; then
    as_pg "$PGBIN/psql" -h 127.0.0.1 -p "$PGPORT" -U postgres -qc "CREATE DATABASE $DB" >/dev/null
  fi
  echo "PostgreSQL ($KIND) on 127.0.0.1:$PGPORT, database $DB" >&2
}

stop_quiet() {
  if [ -s "$PGDATA/PG_VERSION" ] && as_pg "$PGBIN/pg_ctl" -D "$PGDATA" status >/dev/null 2>&1; then
    as_pg "$PGBIN/pg_ctl" -D "$PGDATA" -m fast -w stop >/dev/null
  fi
}

case "$ACTION" in
  start) start ;;
  stop) stop_quiet; echo "PostgreSQL ($KIND) stopped" >&2 ;;
  url) echo "postgres://postgres@127.0.0.1:$PGPORT/$DB" ;;
  *) echo "usage: scripts/db.sh start|stop|url [dev|test]" >&2; exit 2 ;;
esac
