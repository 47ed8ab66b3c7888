#!/usr/bin/env bash
# `npm start`: everything a newcomer needs on a fresh Debian machine with Node 20, then the server
# in the foreground at http://localhost:$PORT (default 3000), web and API together.
#   npm packages → PostgreSQL (installed from Debian's packages if missing) → build shared, api,
#   web → mail catcher → migrate → seed the demo school → serve.
# Ctrl-C stops the server; PostgreSQL keeps running (stop it with: bash api/scripts/pg.sh stop).
set -euo pipefail
# shellcheck source=lib/env.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/env.sh"
cd "$STAVEMARK_ROOT"

timed "npm packages" ensure_npm_packages
timed "PostgreSQL" bash "$STAVEMARK_SCRIPTS/pg.sh" start
for ws in shared api web; do
  say "Building $ws"
  timed "build $ws" build_workspace "$ws" || die "the $ws build failed (output above)"
done

STARTED_CATCHER=0
if ! bash "$STAVEMARK_SCRIPTS/mail.sh" status >/dev/null 2>&1; then
  timed "mail catcher" bash "$STAVEMARK_SCRIPTS/mail.sh" start
  STARTED_CATCHER=1
else
  bash "$STAVEMARK_SCRIPTS/mail.sh" status
fi

say "Migrating the database"
timed "migrate" node api/dist/database/migrate.js || die "migration failed (output above)"
say "Seeding the demo school"
timed "seed" node api/dist/seed/seed.js || die "seeding the demo failed (output above)"

port_in_use "$PORT" && die "port $PORT is taken by another program; stop it or choose another: PORT=3001 npm start"

SERVER_PID=""
stop_all() {
  trap - INT TERM EXIT
  if [ -n "$SERVER_PID" ] && kill -0 "$SERVER_PID" 2>/dev/null; then
    kill -TERM "$SERVER_PID" 2>/dev/null
    wait "$SERVER_PID" 2>/dev/null
  fi
  [ "$STARTED_CATCHER" = 1 ] && bash "$STAVEMARK_SCRIPTS/mail.sh" stop >/dev/null
  echo
  echo "Server stopped. PostgreSQL is still running; stop it with: bash api/scripts/pg.sh stop"
}
trap stop_all EXIT
trap 'exit 130' INT TERM

export PUBLIC_URL="${PUBLIC_URL:-http://localhost:$PORT}"
say "Starting the server"
SERVER_START="$EPOCHREALTIME"
node api/dist/main.js </dev/null 9>&- &
SERVER_PID=$!
wait_for_http "http://127.0.0.1:$PORT/api/health" 60 "$SERVER_PID" || die "the server did not start (output above)"
STEP_NAMES+=("server start")
STEP_SECONDS+=("$(elapsed_since "$SERVER_START")")
STEP_STATUS+=(0)
print_timings

cat <<EOF

  Stavemark is running at http://localhost:$PORT   (API under /api, docs at /api/docs)

  Demo sign-ins (password for each: $DEMO_PASSWORD):
$(printf '    %s\n' "${DEMO_SIGN_INS[@]}")

  Mail the app sends is caught locally (Outbox), stored in $MAIL_CATCHER_DIR.
  Press Ctrl-C to stop the server. PostgreSQL keeps running: bash api/scripts/pg.sh stop

EOF
wait "$SERVER_PID"
