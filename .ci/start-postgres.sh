#!/usr/bin/env bash
# Starts a throw-away PostgreSQL cluster for the register tests (PostgreSQL store, docs/register.md).
# Installs Debian's postgresql with apt-get when no initdb/pg_ctl is found (as root), runs initdb into a temporary
# folder as a non-root user (PostgreSQL refuses to run as root: the 'postgres' user when it exists, else a dedicated
# user 'iu-ci-pg' is created), starts the server with pg_ctl on a local port (Unix socket in the same folder and
# 127.0.0.1), creates a login role with CREATEROLE and CREATEDB for the tests, and waits until it answers.
#
# Environment: PG_PORT (default 55432), PG_DIR (default a new folder under /tmp).
# Prints, as its last line, either
#   INSPECTION_UPDATE_PG_URI=postgresql://iu_ci@127.0.0.1:PORT/postgres
# or
#   INSPECTION_UPDATE_PG_URI=unavailable: <why>
# and exits 0 in both cases: .ci/run exports the value so that the PostgreSQL tests run or say why they skipped.
# The tests authenticate with trust on 127.0.0.1 (a throw-away cluster): no password anywhere.
# Stop it with: .ci/start-postgres.sh stop   (same PG_PORT; reads the folder from /tmp/iu-ci-pg.PORT.dir)
set -uo pipefail

say_unavailable() {
  echo "INSPECTION_UPDATE_PG_URI=unavailable: $*"
  exit 0
}

find_bin() {
  for d in /usr/local/bin /usr/lib/postgresql/*/bin /usr/local/pgsql/bin; do
    [ -x "$d/$1" ] && { echo "$d/$1"; return 0; }
  done
  command -v "$1" 2>/dev/null
}

PORT="${PG_PORT:-55432}"
STATE=/tmp/iu-ci-pg.$PORT.dir

run_as() { # user, command...
  local user=$1
  shift
  if [ "$(id -u)" = 0 ]; then runuser -u "$user" -- "$@"; else "$@"; fi
}

if [ "${1:-}" = stop ]; then
  [ -s "$STATE" ] || { echo "no cluster recorded in $STATE"; exit 0; }
  read -r DIR USER_NAME <"$STATE"
  PG_CTL=$(find_bin pg_ctl)
  run_as "$USER_NAME" "$PG_CTL" -D "$DIR/data" -m fast -w stop >/dev/null 2>&1 && echo "PostgreSQL stopped ($DIR)."
  rm -rf "$DIR" "$STATE"
  exit 0
fi

INITDB=$(find_bin initdb)
PG_CTL=$(find_bin pg_ctl)
if [ -z "$INITDB" ] || [ -z "$PG_CTL" ]; then
  [ "$(id -u)" = 0 ] || say_unavailable "initdb/pg_ctl not found and not root (cannot apt-get install postgresql)"
  command -v apt-get >/dev/null || say_unavailable "postgresql is not installed and there is no apt-get"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update >/tmp/start-postgres-apt.log 2>&1 || say_unavailable "apt-get update failed (see /tmp/start-postgres-apt.log)"
  apt-get install -y --no-install-recommends postgresql >>/tmp/start-postgres-apt.log 2>&1 \
    || say_unavailable "apt-get install postgresql failed (see /tmp/start-postgres-apt.log)"
  INITDB=$(find_bin initdb)
  PG_CTL=$(find_bin pg_ctl)
  [ -n "$INITDB" ] && [ -n "$PG_CTL" ] || say_unavailable "postgresql installed but initdb/pg_ctl not found"
fi
PSQL=$(find_bin psql)
[ -n "$PSQL" ] || say_unavailable "psql not found"

# PostgreSQL will not run as root: use the postgres user, or create a dedicated one.
if [ "$(id -u)" = 0 ]; then
  if id postgres >/dev/null 2>&1; then
    USER_NAME=postgres
  else
    USER_NAME=iu-ci-pg
    id "$USER_NAME" >/dev/null 2>&1 || useradd --system --no-create-home --shell /usr/sbin/nologin "$USER_NAME" \
      || say_unavailable "could not create the non-root user $USER_NAME for the server"
  fi
else
  USER_NAME=$(id -un)
fi

# An earlier cluster of this script still running on the port: stop it first.
if [ -s "$STATE" ]; then "$0" stop >/dev/null 2>&1; fi

DIR=${PG_DIR:-$(mktemp -d /tmp/iu-ci-pg.XXXXXX)}
mkdir -p "$DIR"
chmod 0755 "$DIR"
[ "$(id -u)" = 0 ] && chown "$USER_NAME" "$DIR"
echo "$DIR $USER_NAME" >"$STATE"

run_as "$USER_NAME" "$INITDB" -D "$DIR/data" -U postgres --auth=trust --encoding=UTF8 --locale=C.UTF-8 >"$DIR/initdb.log" 2>&1 \
  || run_as "$USER_NAME" "$INITDB" -D "$DIR/data" -U postgres --auth=trust --encoding=UTF8 --no-locale >"$DIR/initdb.log" 2>&1 \
  || say_unavailable "initdb failed: $(tail -n 3 "$DIR/initdb.log" | tr '\n' ' ')"

run_as "$USER_NAME" "$PG_CTL" -D "$DIR/data" -l "$DIR/server.log" -w -t 60 \
  -o "-p $PORT -k $DIR -c listen_addresses=127.0.0.1 -c fsync=on -c max_connections=60" start >/dev/null 2>&1 \
  || say_unavailable "pg_ctl start failed on port $PORT: $(tail -n 3 "$DIR/server.log" 2>/dev/null | tr '\n' ' ')"

# The test login: may create roles (register create makes the reader/recorder/modeller roles) and databases.
run_as "$USER_NAME" "$PSQL" -h "$DIR" -p "$PORT" -U postgres -d postgres -v ON_ERROR_STOP=1 -q \
  -c "CREATE ROLE iu_ci LOGIN CREATEROLE CREATEDB" >"$DIR/psql.log" 2>&1 \
  || say_unavailable "could not create the test role: $(tail -n 3 "$DIR/psql.log" | tr '\n' ' ')"

echo "PostgreSQL $("$PSQL" --version | awk '{print $3}') is up: cluster $DIR, port $PORT, server user $USER_NAME."
echo "INSPECTION_UPDATE_PG_URI=postgresql://iu_ci@127.0.0.1:$PORT/postgres"
