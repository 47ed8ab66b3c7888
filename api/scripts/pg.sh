#!/usr/bin/env bash
# A PostgreSQL cluster of our own on 127.0.0.1:$PGPORT (default 55432), for development, the demo
# and tests. Data in <checkout>/.local/pg, or, when the `postgres` user cannot reach the checkout
# (a parent folder such as /root without execute for others), in /var/tmp/stavemark-pg-<hash>.
#
#   bash api/scripts/pg.sh start     install PostgreSQL if missing, initdb once, start, create the
#                                    app role and database when missing (idempotent)
#   bash api/scripts/pg.sh stop      stop the cluster
#   bash api/scripts/pg.sh status    exit 0 when running, 3 when not
#   bash api/scripts/pg.sh url       print the app's DATABASE_URL
#   bash api/scripts/pg.sh psql [args]        psql as the app role (database stavemark)
#   bash api/scripts/pg.sh createdb NAME | dropdb NAME   as the app role (used by the tests)
set -euo pipefail
# shellcheck source=lib/env.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/env.sh"
close_inherited_fds

IS_ROOT=0
[ "$(id -u)" = 0 ] && IS_ROOT=1

# Where the cluster lives. As root, the server runs as `postgres` and must be able to enter it.
pg_base_dir() {
  if [ -n "${STAVEMARK_PG_DIR:-}" ]; then
    printf '%s' "$STAVEMARK_PG_DIR"
  elif [ "$IS_ROOT" = 0 ] || runuser -u postgres -- test -x "$STAVEMARK_ROOT" 2>/dev/null; then
    printf '%s' "$LOCAL_DIR/pg"
  else
    printf '/var/tmp/stavemark-pg-%s' "$(printf '%s' "$STAVEMARK_ROOT" | sha256sum | cut -c1-12)"
  fi
}

# Runs a server-side command as the cluster's owner (from / so `postgres` never lacks a cwd).
as_owner() {
  if [ "$IS_ROOT" = 1 ]; then
    (cd / && runuser -u postgres -- "$@")
  else
    "$@"
  fi
}

BASE="$(pg_base_dir)"
DATA="$BASE/data"
SOCK="$BASE/sock"
PGLOG="$BASE/log/postgres.log"
PWFILE="$BASE/superuser-password"
BIN=""

# Picks the server binaries: those of the cluster's own version once it exists, else the newest.
find_bin() {
  if [ -f "$DATA/PG_VERSION" ]; then
    local v
    v="$(cat "$DATA/PG_VERSION")"
    BIN="/usr/lib/postgresql/$v/bin"
    [ -x "$BIN/postgres" ] || die "the cluster in $DATA was made by PostgreSQL $v, which is not installed.
  Install it (apt-get install postgresql-$v), or remove $BASE to start afresh (its data is lost)."
  else
    BIN="$(pg_latest_bin)"
  fi
}

ensure_installed() {
  find_bin
  [ -n "$BIN" ] && return 0
  say "PostgreSQL is not installed; installing Debian's postgresql package"
  apt_install postgresql || die "installing PostgreSQL failed (see the apt output above).
  Install it by hand (apt-get install postgresql) and run this again."
  find_bin
  [ -n "$BIN" ] || die "the postgresql package installed, but no /usr/lib/postgresql/*/bin/initdb was found."
}

is_running() {
  [ -n "$BIN" ] && [ -f "$DATA/PG_VERSION" ] && as_owner "$BIN/pg_ctl" -D "$DATA" status >/dev/null 2>&1
}

# The port a running cluster listens on (4th line of postmaster.pid).
running_port() { sed -n 4p "$DATA/postmaster.pid" 2>/dev/null; }

init_cluster() {
  [ -f "$DATA/PG_VERSION" ] && return 0
  if [ "$IS_ROOT" = 1 ]; then
    id postgres >/dev/null 2>&1 || die "the 'postgres' OS user is missing (it comes with Debian's postgresql package)."
  fi
  local start="$EPOCHREALTIME" owner=()
  say "Initialising a PostgreSQL cluster in $BASE"
  if [ "$IS_ROOT" = 1 ]; then
    # `postgres` must be able to pass through our .local folder (only ours: never chmod others').
    if [ "$BASE" = "$LOCAL_DIR/pg" ]; then
      mkdir -p "$LOCAL_DIR"
      chmod o+x "$LOCAL_DIR"
    fi
    owner=(-o postgres -g postgres)
  fi
  install -d "${owner[@]}" -m 700 "$BASE" "$BASE/sock" "$BASE/log"
  # The superuser password is generated here and never committed (it lives beside the data).
  if [ ! -s "$PWFILE" ]; then
    (umask 077 && head -c 24 /dev/urandom | base64 | tr -d '/+=\n' >"$PWFILE")
    [ "$IS_ROOT" = 1 ] && chown postgres:postgres "$PWFILE"
  fi
  # initdb into a side folder and rename, so an interrupted initdb never looks like a cluster.
  rm -rf "$BASE/data.init"
  as_owner "$BIN/initdb" -D "$BASE/data.init" -U postgres -E UTF8 --locale=C.UTF-8 \
    --auth-local=trust --auth-host=scram-sha-256 --pwfile="$PWFILE" >"$BASE/log/initdb.log" 2>&1 || {
    tail -n 20 "$BASE/log/initdb.log" >&2
    die "initdb failed (full log: $BASE/log/initdb.log)"
  }
  mv "$BASE/data.init" "$DATA"
  echo "Cluster initialised in $(elapsed_since "$start") s."
}

psql_super() {
  "$BIN/psql" -X -q -v ON_ERROR_STOP=1 -h "$SOCK" -p "$PGPORT" -U postgres -d postgres "$@"
}
psql_app() {
  PGPASSWORD="$DB_PASSWORD" "$BIN/psql" -X -v ON_ERROR_STOP=1 -h "$DB_HOST" -p "$PGPORT" -U "$DB_USER" "$@"
}

ensure_role_and_db() {
  # The DO block makes role creation safe when two starts race.
  psql_super <<SQL
DO \$\$ BEGIN
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '$DB_USER') THEN
    CREATE ROLE $DB_USER LOGIN CREATEDB PASSWORD '$DB_PASSWORD';
  END IF;
EXCEPTION WHEN duplicate_object THEN NULL;
END \$\$;
SQL
  if [ -z "$(psql_super -tAc "SELECT 1 FROM pg_database WHERE datname = '$DB_NAME'")" ]; then
    psql_super -c "CREATE DATABASE $DB_NAME OWNER $DB_USER" 2>/dev/null ||
      [ -n "$(psql_super -tAc "SELECT 1 FROM pg_database WHERE datname = '$DB_NAME'")" ] ||
      die "could not create the database $DB_NAME"
    echo "Created database $DB_NAME (owner $DB_USER)."
  fi
}

wait_ready() {
  local i
  for i in $(seq 1 120); do
    "$BIN/pg_isready" -q -h "$DB_HOST" -p "$PGPORT" -d postgres && return 0
    sleep 0.25
  done
  die "PostgreSQL started but does not accept connections on $DB_HOST:$PGPORT (log: $PGLOG)"
}

cmd_start() {
  ensure_installed
  # One start at a time per cluster (other scripts may start it concurrently).
  mkdir -p "$(dirname "$BASE")"
  # (The server must not inherit fd 9, or it would hold the lock for its whole life.)
  exec 9>"$BASE.lock"
  flock -w 120 9 || die "another pg.sh start has held $BASE.lock for 2 minutes"
  init_cluster
  if is_running; then
    local p
    p="$(running_port)"
    [ "$p" = "$PGPORT" ] || die "the cluster in $DATA is already running on port $p, not PGPORT=$PGPORT.
  Stop it first (PGPORT=$p bash api/scripts/pg.sh stop) or use PGPORT=$p."
    echo "PostgreSQL is already running on $DB_HOST:$PGPORT (data: $DATA)."
  else
    if port_in_use "$PGPORT"; then
      die "port $PGPORT on $DB_HOST is taken by another program (not this project's cluster in $DATA).
  Stop that program, or pick another port for ours, e.g. PGPORT=$((PGPORT + 1)) npm start"
    fi
    local start="$EPOCHREALTIME"
    as_owner "$BIN/pg_ctl" -D "$DATA" -l "$PGLOG" -w -t 60 \
      -o "-c listen_addresses=$DB_HOST -p $PGPORT -k $SOCK" start >/dev/null 9>&- || {
      tail -n 20 "$PGLOG" >&2 || true
      die "PostgreSQL did not start (log: $PGLOG)"
    }
    wait_ready
    echo "PostgreSQL started on $DB_HOST:$PGPORT in $(elapsed_since "$start") s (data: $DATA)."
  fi
  wait_ready
  ensure_role_and_db
}

cmd_stop() {
  find_bin
  if is_running; then
    as_owner "$BIN/pg_ctl" -D "$DATA" -m fast -w -t 60 stop >/dev/null
    echo "PostgreSQL stopped (data kept in $DATA)."
  else
    echo "PostgreSQL is not running (data: $DATA)."
  fi
}

cmd_status() {
  find_bin
  if is_running; then
    echo "PostgreSQL is running on $DB_HOST:$(running_port) (data: $DATA)."
    echo "DATABASE_URL=$(db_url)"
  else
    if [ -f "$DATA/PG_VERSION" ]; then
      echo "PostgreSQL is not running (data: $DATA). Start it: bash api/scripts/pg.sh start"
    else
      echo "PostgreSQL is not set up yet (would be in $DATA). Start it: bash api/scripts/pg.sh start"
    fi
    exit 3
  fi
}

valid_db_name() {
  [[ "$1" =~ ^[a-z_][a-z0-9_]{0,62}$ ]] || die "not a plain database name: '$1' (lower-case letters, digits, _)"
}

need_running() {
  find_bin
  is_running || die "PostgreSQL is not running. Start it: bash api/scripts/pg.sh start"
}

case "${1:-}" in
start) cmd_start ;;
stop) cmd_stop ;;
status) cmd_status ;;
url) db_url && echo ;;
psql)
  shift
  need_running
  psql_app -d "$DB_NAME" "$@"
  ;;
createdb)
  valid_db_name "${2:-}"
  need_running
  psql_app -q -d postgres -c "CREATE DATABASE $2"
  ;;
dropdb)
  valid_db_name "${2:-}"
  need_running
  psql_app -q -d postgres -c "DROP DATABASE IF EXISTS $2 WITH (FORCE)"
  ;;
list-dbs)
  need_running
  psql_app -d postgres -tAc "SELECT datname FROM pg_database WHERE datname LIKE '${2:-%}' ORDER BY 1"
  ;;
*)
  echo "usage: bash api/scripts/pg.sh start|stop|status|url|psql|createdb NAME|dropdb NAME|list-dbs [LIKE]" >&2
  exit 64
  ;;
esac
