#!/usr/bin/env bash
# Local PostgreSQL for Countersign, on loopback only: install it from Debian's packages if missing, create the
# cluster once, start it if it is not running (also after a killed server), create databases, stop it.
# Usage: db/postgres.sh up | down | status | createdb NAME | recreatedb NAME
set -euo pipefail

ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
PGPORT=${COUNTERSIGN_PGPORT:-54329}
KEY=$(printf %s "$ROOT" | sha1sum | cut -c1-10)
BASE=${COUNTERSIGN_PGBASE:-/var/tmp/countersign-$KEY}
PGDATA=$BASE/pg
LOG=$BASE/postgres.log
SUPERUSER=countersign

pg_bin() { ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1; }

as_pg() {
  if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi
}

install_if_missing() {
  if [ -z "$(pg_bin)" ] || [ ! -x "$(pg_bin)/pg_ctl" ]; then
    echo "postgres: installing Debian's postgresql package"
    if [ "$(id -u)" != 0 ]; then echo "postgres: not installed; run as root or: sudo apt-get install postgresql" >&2; exit 1; fi
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql >/dev/null
  fi
}

# The PID in postmaster.pid, if that process is alive (a zombie counts as stopped).
running_pid() {
  local pidfile=$PGDATA/postmaster.pid pid state
  [ -f "$pidfile" ] || return 1
  pid=$(head -n 1 "$pidfile")
  [ -n "$pid" ] && [ -r "/proc/$pid/stat" ] || return 1
  state=$(awk '{print $3}' "/proc/$pid/stat")
  [ "$state" != Z ] || return 1
  echo "$pid"
}

init_if_missing() {
  [ -f "$PGDATA/PG_VERSION" ] && return 0
  echo "postgres: creating cluster in $PGDATA"
  mkdir -p "$BASE"
  chmod 755 "$BASE"
  mkdir -p "$PGDATA"
  if [ "$(id -u)" = 0 ]; then chown postgres: "$BASE" "$PGDATA"; fi
  chmod 700 "$PGDATA"
  as_pg "$(pg_bin)/initdb" -D "$PGDATA" -U "$SUPERUSER" --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
  cat >>"$PGDATA/postgresql.conf" <<CONF
# Countersign: loopback only, a project port, the socket inside the data folder.
listen_addresses = '127.0.0.1'
port = $PGPORT
unix_socket_directories = '$PGDATA'
max_connections = 200
CONF
}

up() {
  install_if_missing
  init_if_missing
  if running_pid >/dev/null; then return 0; fi
  rm -f "$PGDATA/postmaster.pid"
  touch "$LOG"; [ "$(id -u)" = 0 ] && chown postgres: "$LOG"
  as_pg "$(pg_bin)/pg_ctl" -D "$PGDATA" -l "$LOG" -w -t 30 start >/dev/null
  echo "postgres: running on 127.0.0.1:$PGPORT"
}

down() {
  if running_pid >/dev/null; then as_pg "$(pg_bin)/pg_ctl" -D "$PGDATA" -m fast -w stop >/dev/null && echo "postgres: stopped"; fi
}

psql_q() { "$(pg_bin)/psql" -h 127.0.0.1 -p "$PGPORT" -U "$SUPERUSER" -d postgres -v ON_ERROR_STOP=1 -tAc "$1"; }

createdb_if_missing() {
  local name=$1
  if [ "$(psql_q "SELECT 1 FROM pg_database WHERE datname = '$name'")" != 1 ]; then
    psql_q "CREATE DATABASE \"$name\"" >/dev/null
    echo "postgres: created database $name"
  fi
}

case "${1:-up}" in
  up) up ;;
  down) down ;;
  status) if pid=$(running_pid); then echo "running (pid $pid) on 127.0.0.1:$PGPORT"; else echo "stopped"; fi ;;
  createdb) createdb_if_missing "$2" ;;
  recreatedb) psql_q "DROP DATABASE IF EXISTS \"$2\" WITH (FORCE)" >/dev/null; createdb_if_missing "$2" ;;
  *) echo "usage: $0 up|down|status|createdb NAME|recreatedb NAME" >&2; exit 2 ;;
esac
