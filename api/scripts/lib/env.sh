# shellcheck shell=bash
# Shared settings and helpers for api/scripts/*.sh, so start, dev, test and bench agree.
# Sourced, not run. Every setting has a development default and can be overridden by the
# environment (e.g. `PGPORT=55433 npm start`).

STAVEMARK_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../../.." && pwd)"
STAVEMARK_SCRIPTS="$STAVEMARK_ROOT/api/scripts"
LOCAL_DIR="$STAVEMARK_ROOT/.local" # ignored by git
LOG_DIR="$LOCAL_DIR/log"
RUN_DIR="$LOCAL_DIR/run"

# PostgreSQL (a cluster of our own on loopback; see pg.sh).
export PGPORT="${PGPORT:-55432}"
DB_HOST=127.0.0.1
DB_USER=stavemark
DB_PASSWORD=stavemark-dev
DB_NAME=stavemark
db_url() { printf 'postgres://%s:%s@%s:%s/%s' "$DB_USER" "$DB_PASSWORD" "$DB_HOST" "$PGPORT" "${1:-$DB_NAME}"; }
export DATABASE_URL="${DATABASE_URL:-$(db_url)}"

# Mail: the app sends through SMTP to the local catcher (see mail.sh).
export MAIL_CATCHER_PORT="${MAIL_CATCHER_PORT:-2525}"
export MAIL_CATCHER_DIR="${MAIL_CATCHER_DIR:-$LOCAL_DIR/mail}"
export SMTP_HOST="${SMTP_HOST:-127.0.0.1}"
export SMTP_PORT="${SMTP_PORT:-$MAIL_CATCHER_PORT}"

# The server.
export PORT="${PORT:-3000}"
export WEB_DIST="${WEB_DIST:-$STAVEMARK_ROOT/web/dist}"

NODE_BIN_DIR="$STAVEMARK_ROOT/node_modules/.bin"

DEMO_PASSWORD=stavemark-demo
DEMO_SIGN_INS=(admin@demo.example teacher@demo.example examiner@demo.example student@demo.example)

# ---------------------------------------------------------------------------------------------
say() { printf '\033[1m==>\033[0m %s\n' "$*"; }
warn() { printf 'warning: %s\n' "$*" >&2; }
die() {
  printf 'error: %s\n' "$*" >&2
  exit 1
}

# Step timings, printed by print_timings. `timed "label" cmd args...` returns the command's status.
SCRIPT_START="$EPOCHREALTIME"
STEP_NAMES=()
STEP_SECONDS=()
STEP_STATUS=()
elapsed_since() { awk -v a="$1" -v b="$EPOCHREALTIME" 'BEGIN { printf "%.1f", b - a }'; }
timed() {
  local label="$1" start rc
  shift
  start="$EPOCHREALTIME"
  "$@"
  rc=$?
  STEP_NAMES+=("$label")
  STEP_SECONDS+=("$(elapsed_since "$start")")
  STEP_STATUS+=("$rc")
  return "$rc"
}
print_timings() {
  local i
  printf '\nStep durations:\n'
  for i in "${!STEP_NAMES[@]}"; do
    printf '  %-28s %7s s%s\n' "${STEP_NAMES[$i]}" "${STEP_SECONDS[$i]}" \
      "$([ "${STEP_STATUS[$i]}" = 0 ] || echo "  (exit ${STEP_STATUS[$i]})")"
  done
  printf '  %-28s %7s s\n' "total so far" "$(elapsed_since "$SCRIPT_START")"
}

# Closes every descriptor above 2 that this script inherited (a caller's lock file, for one), so
# that daemons started from here (PostgreSQL, the mail catcher) never hold it open for their life.
close_inherited_fds() {
  local fd
  for fd in $(ls /proc/$$/fd 2>/dev/null); do
    # 255 is bash's own handle on the script being read.
    if [ "$fd" -gt 2 ] && [ "$fd" -lt 255 ]; then eval "exec $fd>&-" 2>/dev/null || true; fi
  done
}

# Root privileges for apt: as root directly, otherwise through sudo when there is one.
as_root() {
  if [ "$(id -u)" = 0 ]; then
    "$@"
  elif command -v sudo >/dev/null 2>&1; then
    sudo "$@"
  else
    die "need root to run: $* (no sudo found). Run it as root, then try again."
  fi
}

# Installs Debian packages; `apt-get update` runs once per script run, before the first install.
APT_UPDATED=0
apt_install() {
  command -v apt-get >/dev/null 2>&1 ||
    die "apt-get not found: install $* with your system's package manager, then try again."
  if [ "$APT_UPDATED" = 0 ]; then
    say "apt-get update"
    as_root env DEBIAN_FRONTEND=noninteractive apt-get update -q </dev/null ||
      die "apt-get update failed (no network to the Debian mirror?)"
    APT_UPDATED=1
  fi
  say "apt-get install $*"
  as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -q --no-install-recommends "$@" </dev/null
}

# npm packages: `npm ci` when node_modules is missing, or when the lock file is newer than what
# npm last installed and its package set really differs (lock-in-sync.mjs).
ensure_npm_packages() {
  local marker="$STAVEMARK_ROOT/node_modules/.package-lock.json"
  if [ ! -f "$marker" ] || { [ "$STAVEMARK_ROOT/package-lock.json" -nt "$marker" ] &&
    ! node "$STAVEMARK_SCRIPTS/lib/lock-in-sync.mjs" "$STAVEMARK_ROOT"; }; then
    say "Installing npm packages (npm ci)"
    # Never --omit=optional: native parts (rolldown, lightningcss) arrive as optional deps.
    (cd "$STAVEMARK_ROOT" && npm ci --no-audit --no-fund) || die "npm ci failed"
  else
    echo "npm packages are up to date."
  fi
}

# True when something accepts TCP connections on 127.0.0.1:$1.
port_in_use() {
  (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null
}

# Waits until $1 answers HTTP 200, for at most $2 seconds; $3 (optional) is a pid that must stay alive.
wait_for_http() {
  node "$STAVEMARK_SCRIPTS/lib/wait-http.mjs" "$@"
}

# Highest installed PostgreSQL major version's bin folder (Debian layout), or nothing.
pg_latest_bin() {
  local d best=""
  for d in /usr/lib/postgresql/*/bin; do
    [ -x "$d/initdb" ] || continue
    if [ -z "$best" ] || [ "$(basename "$(dirname "$d")")" -gt "$(basename "$(dirname "$best")")" ]; then
      best="$d"
    fi
  done
  printf '%s' "$best"
}

# Builds one workspace (shared, api or web) with its own build script.
build_workspace() {
  (cd "$STAVEMARK_ROOT" && npm run --silent build -w "$1")
}
