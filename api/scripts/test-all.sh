#!/usr/bin/env bash
# Every test suite, as `npm test` and .ci/run run it. Installs what is missing (npm packages,
# PostgreSQL, chromium), builds once, runs the suites, and ends with one line `N passed, N failed`
# totalled over all of them. Exit status is non-zero when anything failed.
#
#   npm test                      all suites
#   npm test -- shared web        a subset; names: shared web api e2e browser
#
# Suites (each writes a JSON report into .local/test-reports/):
#   shared   vitest in shared/                       (unit)
#   web      vitest in web/                          (unit, jsdom)
#   api      vitest in api/                          (in-process, real PostgreSQL; creates its own databases)
#   e2e      jest in api/ against `node api/dist/main.js` on $E2E_PORT (default 3100), fresh database
#   browser  vitest --config e2e/vitest.config.ts in web/, playwright-core + /usr/bin/chromium, same server
# A suite whose config file does not exist yet is reported as "skipped (not present)".
set -uo pipefail
# shellcheck source=lib/env.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/env.sh"

ALL_SUITES=(shared web api e2e browser)
TEST_MAIL_CATCHER_PORT="${TEST_MAIL_CATCHER_PORT:-2526}"
TEST_MAIL_CATCHER_DIR="${TEST_MAIL_CATCHER_DIR:-$LOCAL_DIR/mail-test}"
TEST_STORAGE_DIR="${TEST_STORAGE_DIR:-$LOCAL_DIR/storage-test}"
E2E_PORT="${E2E_PORT:-3100}"
E2E_URL="http://127.0.0.1:$E2E_PORT"
E2E_ACCESS_TOKEN_TTL_SECONDS=5 # short, so the browser tests see a silent refresh
E2E_API_ACCESS_TOKEN_TTL_SECONDS=900 # the default, for the jest e2e suite
# e2e and browser suites share the server and sign the demo people in many times a minute.
E2E_LOGIN_LIMIT_PER_EMAIL=30
REPORT_DIR="$LOCAL_DIR/test-reports" # the latest report of each suite, copied at the end
CHROMIUM=/usr/bin/chromium

usage() {
  sed -n '2,17p' "${BASH_SOURCE[0]}" | sed 's/^# \{0,1\}//'
}

# --- which suites ------------------------------------------------------------------------------
SELECTED=()
FULL_RUN=1
for arg in "$@"; do
  case "$arg" in
  -h | --help)
    usage
    exit 0
    ;;
  shared | web | api | e2e | browser)
    SELECTED+=("$arg")
    FULL_RUN=0
    ;;
  *)
    echo "unknown suite '$arg' (suites: ${ALL_SUITES[*]})" >&2
    exit 64
    ;;
  esac
done
[ "$FULL_RUN" = 1 ] && SELECTED=("${ALL_SUITES[@]}")

suite_config() {
  local f
  case "$1" in
  shared) f="shared/vitest.config.ts" ;;
  web) for f in web/vitest.config.ts web/vite.config.ts; do [ -f "$STAVEMARK_ROOT/$f" ] && break; done ;;
  api) f="api/vitest.config.ts" ;;
  e2e) f="api/test/jest-e2e.config.cjs" ;;
  browser) f="web/e2e/vitest.config.ts" ;;
  esac
  printf '%s' "$f"
}

declare -A RUN=() # suites to run (selected and present)
mkdir -p "$REPORT_DIR" "$LOG_DIR"
# This run's own reports, so a run beside it (npm test -- shared) never mixes into its totals.
RUN_REPORTS="$(mktemp -d "$REPORT_DIR/.run-XXXXXX")"
RESULTS="$RUN_REPORTS/results.tsv"
: >"$RESULTS"
record() { printf '%s\t%s\t%s\t%s\t%s\t%s\n' "$1" "$2" "${3:-}" "${4:-}" "${5:-}" "${6:-}" >>"$RESULTS"; }
# Results are written in suite order at the end; until then they wait here.
declare -A RESULT_LINE=()
set_result() { RESULT_LINE[$1]="$(printf '%s\t%s\t%s\t%s\t%s\t%s' "$1" "$2" "${3:-}" "${4:-}" "${5:-}" "${6:-}")"; }
not_run() {
  [ -n "${RUN[$1]:-}" ] || return 0
  unset "RUN[$1]"
  set_result "$1" not-run "" "" "" "$2"
}

for s in "${SELECTED[@]}"; do
  if [ -f "$STAVEMARK_ROOT/$(suite_config "$s")" ]; then
    RUN[$s]=1
  else
    set_result "$s" skipped "" "" "" "not present: no $(suite_config "$s") yet"
  fi
done
wants() { [ -n "${RUN[$1]:-}" ]; }
wants_any() {
  local s
  for s in "$@"; do wants "$s" && return 0; done
  return 1
}

# --- services that belong to this run, stopped before the summary (or on any exit) ---------------
SERVER_PID=""
E2E_DB=""
STARTED_CATCHER=0
cleanup() {
  if [ -n "$SERVER_PID" ]; then
    kill -TERM "$SERVER_PID" 2>/dev/null
    for _ in $(seq 1 50); do kill -0 "$SERVER_PID" 2>/dev/null || break; sleep 0.2; done
    kill -KILL "$SERVER_PID" 2>/dev/null
    wait "$SERVER_PID" 2>/dev/null
    SERVER_PID=""
  fi
  if [ -n "$E2E_DB" ]; then
    bash "$STAVEMARK_SCRIPTS/pg.sh" dropdb "$E2E_DB" >/dev/null || warn "could not drop database $E2E_DB"
    E2E_DB=""
  fi
  if [ "$STARTED_CATCHER" = 1 ]; then
    MAIL_CATCHER_PORT="$TEST_MAIL_CATCHER_PORT" MAIL_CATCHER_DIR="$TEST_MAIL_CATCHER_DIR" \
      bash "$STAVEMARK_SCRIPTS/mail.sh" stop >/dev/null
    STARTED_CATCHER=0
  fi
}
trap 'cleanup; rm -rf "$RUN_REPORTS"' EXIT
trap 'echo; echo "interrupted" >&2; exit 130' INT TERM

# The builds, the test catcher and the e2e server (fixed ports) are shared: one such run at a
# time per checkout. (`npm test -- shared` needs none of them and never waits.)
if [ "$FULL_RUN" = 1 ] || wants_any web api e2e browser; then
  exec 8>"$LOCAL_DIR/test-all.lock"
  if ! flock -n 8; then
    say "Another test run holds $LOCAL_DIR/test-all.lock; waiting for it to finish"
    flock -w 1800 8 || die "gave up after 30 min waiting for the other test run"
  fi
fi

# --- preparation -------------------------------------------------------------------------------
timed "npm packages" ensure_npm_packages || die "npm packages could not be installed"

if wants browser && [ ! -x "$CHROMIUM" ]; then
  # In a subshell: a failed install marks the browser suite, it does not end the whole run.
  timed "install chromium" bash -c "source '$STAVEMARK_SCRIPTS/lib/env.sh' && apt_install chromium" || true
  [ -x "$CHROMIUM" ] || not_run browser "Debian's chromium could not be installed"
fi

if wants_any api e2e browser; then
  if ! timed "PostgreSQL" bash "$STAVEMARK_SCRIPTS/pg.sh" start; then
    for s in api e2e browser; do not_run "$s" "PostgreSQL did not start"; done
  fi
fi

# Builds: each workspace once, only those the chosen suites need (all of them on a full run, which
# is also the type check).
declare -A NEED_BUILD=()
[ "$FULL_RUN" = 1 ] && NEED_BUILD=([shared]=1 [api]=1 [web]=1)
wants web && NEED_BUILD[shared]=1
wants_any api e2e && NEED_BUILD+=([shared]=1 [api]=1)
wants browser && NEED_BUILD+=([shared]=1 [api]=1 [web]=1)
declare -A BUILT=()
BUILD_FAILURES=()
for ws in shared api web; do
  [ -n "${NEED_BUILD[$ws]:-}" ] || continue
  if [ "$ws" = web ] && [ ! -f "$STAVEMARK_ROOT/web/index.html" ]; then
    echo "build web: skipped (not present: no web/index.html yet)"
    continue
  fi
  if [ "$ws" != shared ] && [ -z "${BUILT[shared]:-}" ]; then
    echo "build $ws: not run (the shared build failed)"
    continue
  fi
  say "Building $ws"
  if timed "build $ws" build_workspace "$ws"; then
    BUILT[$ws]=1
  else
    echo "build $ws FAILED (output above)" >&2
    # A failed build counts as a failure even when no chosen suite needs it (a full run
    # type-checks every workspace).
    BUILD_FAILURES+=("$ws")
  fi
done
build_ok() { [ -n "${BUILT[$1]:-}" ]; }
if ! build_ok shared; then
  [ -n "${NEED_BUILD[shared]:-}" ] && for s in web api e2e browser; do not_run "$s" "the shared build failed"; done
fi
if ! build_ok api; then
  for s in api e2e browser; do not_run "$s" "the api build failed"; done
fi
if wants browser && ! build_ok web; then not_run browser "the web build failed or web/ is not present"; fi

if wants_any api e2e browser; then
  rm -rf "$TEST_STORAGE_DIR" # under the run lock: no other run of this checkout is using it
  mkdir -p "$TEST_MAIL_CATCHER_DIR"
  MAIL_CATCHER_DIR="$TEST_MAIL_CATCHER_DIR" bash "$STAVEMARK_SCRIPTS/mail.sh" clear >/dev/null
  if MAIL_CATCHER_PORT="$TEST_MAIL_CATCHER_PORT" MAIL_CATCHER_DIR="$TEST_MAIL_CATCHER_DIR" \
    timed "test mail catcher" bash "$STAVEMARK_SCRIPTS/mail.sh" start; then
    STARTED_CATCHER=1
  else
    for s in api e2e browser; do not_run "$s" "the test mail catcher did not start"; done
  fi
fi

# Settings every service-using suite shares: the test catcher.
TEST_ENV=(
  "SMTP_HOST=127.0.0.1" "SMTP_PORT=$TEST_MAIL_CATCHER_PORT"
  "MAIL_CATCHER_PORT=$TEST_MAIL_CATCHER_PORT" "MAIL_CATCHER_DIR=$TEST_MAIL_CATCHER_DIR"
  # Stored files of test runs (recordings) stay apart from the demo's, emptied per run.
  "STORAGE_DIR=$TEST_STORAGE_DIR"
)

# run_suite NAME DIR REPORT CMD...: runs one suite and records how it ended.
run_suite() {
  local name="$1" dir="$2" report="$3" start rc secs
  shift 3
  rm -f "$report"
  say "Suite $name"
  start="$EPOCHREALTIME"
  (cd "$dir" && "$@")
  rc=$?
  secs="$(elapsed_since "$start")"
  STEP_NAMES+=("suite $name")
  STEP_SECONDS+=("$secs")
  STEP_STATUS+=("$rc")
  set_result "$name" ran "$report" "$rc" "$secs"
}
VITEST=("$NODE_BIN_DIR/vitest" run --reporter=default --reporter=json)

# --- unit suites ---------------------------------------------------------------------------------
if wants shared; then
  r="$RUN_REPORTS/shared.json"
  run_suite shared "$STAVEMARK_ROOT/shared" "$r" "${VITEST[@]}" "--outputFile=$r"
fi
if wants web; then
  r="$RUN_REPORTS/web.json"
  run_suite web "$STAVEMARK_ROOT/web" "$r" "${VITEST[@]}" "--outputFile=$r"
fi
if wants api; then
  r="$RUN_REPORTS/api.json"
  run_suite api "$STAVEMARK_ROOT/api" "$r" env "${TEST_ENV[@]}" \
    "TEST_DATABASE_ADMIN_URL=$(db_url postgres)" "${VITEST[@]}" "--outputFile=$r"
fi

# --- a server for e2e and browser suites -------------------------------------------------------
prepare_e2e_database() {
  local db_url_e2e
  # A run that was killed (kill -9) may have left its database behind. Only names this script
  # makes (stavemark_e2e_<timestamp>_<pid>) whose run is gone are dropped; nothing else is touched.
  local name pid
  for name in $(bash "$STAVEMARK_SCRIPTS/pg.sh" list-dbs 'stavemark\_e2e\_%'); do
    [[ "$name" =~ ^stavemark_e2e_[0-9]{14}_([0-9]+)$ ]] || continue
    pid="${BASH_REMATCH[1]}"
    if [ "$pid" != "$$" ] && ! tr '\0' ' ' <"/proc/$pid/cmdline" 2>/dev/null | grep -q test-all.sh; then
      bash "$STAVEMARK_SCRIPTS/pg.sh" dropdb "$name" >/dev/null && echo "Dropped leftover database $name."
    fi
  done
  if port_in_use "$E2E_PORT"; then
    echo "port $E2E_PORT on 127.0.0.1 is taken by another program; set E2E_PORT=<free port>" >&2
    return 1
  fi
  E2E_DB="stavemark_e2e_$(date +%Y%m%d%H%M%S)_$$"
  db_url_e2e="$(db_url "$E2E_DB")"
  timed "e2e database" bash "$STAVEMARK_SCRIPTS/pg.sh" createdb "$E2E_DB" || return 1
  # SEED_TODAY unset: the demo is seeded relative to the real today.
  timed "e2e migrate" env -u SEED_TODAY DATABASE_URL="$db_url_e2e" \
    node "$STAVEMARK_ROOT/api/dist/database/migrate.js" || return 1
  timed "e2e seed" env -u SEED_TODAY DATABASE_URL="$db_url_e2e" \
    node "$STAVEMARK_ROOT/api/dist/seed/seed.js" || return 1
  E2E_DATABASE_URL="$db_url_e2e"
}

# Starts the server on the e2e database with the given access-token lifetime (seconds).
start_e2e_server() {
  local ttl="$1" db_url_e2e="$E2E_DATABASE_URL"
  local start="$EPOCHREALTIME"
  (cd "$STAVEMARK_ROOT" && exec env -u SEED_TODAY "${TEST_ENV[@]}" NODE_ENV=test PORT="$E2E_PORT" \
    DATABASE_URL="$db_url_e2e" ACCESS_TOKEN_TTL_SECONDS="$ttl" \
    PUBLIC_URL="$E2E_URL" WEB_DIST="$WEB_DIST" LOGIN_LIMIT_PER_EMAIL="$E2E_LOGIN_LIMIT_PER_EMAIL" \
    node api/dist/main.js >"$LOG_DIR/e2e-server.log" 2>&1 8>&- </dev/null) &
  SERVER_PID=$!
  if ! wait_for_http "$E2E_URL/api/health" 60 "$SERVER_PID"; then
    tail -n 30 "$LOG_DIR/e2e-server.log" >&2
    echo "the e2e server did not become healthy (log: $LOG_DIR/e2e-server.log)" >&2
    return 1
  fi
  STEP_NAMES+=("e2e server start")
  STEP_SECONDS+=("$(elapsed_since "$start")")
  STEP_STATUS+=(0)
  echo "e2e server is up at $E2E_URL (database $E2E_DB, token lifetime ${ttl} s, log: $LOG_DIR/e2e-server.log)"
}

stop_e2e_server() {
  [ -n "$SERVER_PID" ] || return 0
  kill -TERM "$SERVER_PID" 2>/dev/null
  for _ in $(seq 1 50); do kill -0 "$SERVER_PID" 2>/dev/null || break; sleep 0.2; done
  kill -KILL "$SERVER_PID" 2>/dev/null
  wait "$SERVER_PID" 2>/dev/null
  SERVER_PID=""
}

if wants_any e2e browser; then
  say "Preparing the e2e database"
  if ! prepare_e2e_database; then
    for s in e2e browser; do not_run "$s" "the e2e database could not be prepared (output above)"; done
  fi
fi

# The HTTP suites use the server's usual token lifetime; the browser suite restarts it with a
# short one, so the journeys see a silent refresh.
if wants e2e; then
  say "Starting the e2e server"
  start_e2e_server "$E2E_API_ACCESS_TOKEN_TTL_SECONDS" || not_run e2e "the e2e server did not start (output above)"
fi
if wants e2e; then
  r="$RUN_REPORTS/e2e.json"
  run_suite e2e "$STAVEMARK_ROOT/api" "$r" env "${TEST_ENV[@]}" API_URL="$E2E_URL" LOGIN_LIMIT_PER_EMAIL="$E2E_LOGIN_LIMIT_PER_EMAIL" \
    DATABASE_URL="$E2E_DATABASE_URL" ACCESS_TOKEN_TTL_SECONDS="$E2E_API_ACCESS_TOKEN_TTL_SECONDS" \
    "$NODE_BIN_DIR/jest" --config test/jest-e2e.config.cjs --json "--outputFile=$r"
fi
if wants browser; then
  stop_e2e_server
  say "Starting the e2e server for the browser suite"
  start_e2e_server "$E2E_ACCESS_TOKEN_TTL_SECONDS" || not_run browser "the e2e server did not start (output above)"
fi
if wants browser; then
  r="$RUN_REPORTS/browser.json"
  # Vitest overwrites process.env.BASE_URL with Vite's base path ('/') inside the tests, so the
  # same URL also goes as E2E_BASE_URL (or read BASE_URL in the vitest config file itself).
  run_suite browser "$STAVEMARK_ROOT/web" "$r" env "${TEST_ENV[@]}" BASE_URL="$E2E_URL" E2E_BASE_URL="$E2E_URL" \
    ACCESS_TOKEN_TTL_SECONDS="$E2E_ACCESS_TOKEN_TTL_SECONDS" CHROMIUM_PATH="$CHROMIUM" \
    "${VITEST[@]}" "--outputFile=$r" --config e2e/vitest.config.ts
fi

# --- summary -------------------------------------------------------------------------------------
cleanup
print_timings
for s in "${ALL_SUITES[@]}"; do
  [ -n "${RESULT_LINE[$s]:-}" ] && printf '%s\n' "${RESULT_LINE[$s]}" >>"$RESULTS"
done
for ws in "${BUILD_FAILURES[@]}"; do record "build $ws" failed "" "" "" "compile or type errors (output above)"; done
cp "$RUN_REPORTS"/*.json "$REPORT_DIR"/ 2>/dev/null
node "$STAVEMARK_SCRIPTS/lib/sum-reports.mjs" "$RESULTS"
