#!/usr/bin/env bash
# `npm run dev`: like `npm start`, but everything reloads while you edit.
#   tsc -w for shared and api → node --watch restarts the API on $PORT (default 3000) when its
#   compiled files change; Vite's dev server on $WEB_DEV_PORT (default 5173) with hot reload,
#   proxying /api to the API. Open http://localhost:5173. One Ctrl-C stops all of them.
set -euo pipefail
# shellcheck source=lib/env.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/env.sh"
cd "$STAVEMARK_ROOT"
WEB_DEV_PORT="${WEB_DEV_PORT:-5173}"

timed "npm packages" ensure_npm_packages
timed "PostgreSQL" bash "$STAVEMARK_SCRIPTS/pg.sh" start
# One full build of what the API needs, so the first server start has compiled files.
for ws in shared api; do
  say "Building $ws"
  timed "build $ws" build_workspace "$ws" || die "the $ws build failed (output above)"
done
STARTED_CATCHER=0
if ! bash "$STAVEMARK_SCRIPTS/mail.sh" status >/dev/null 2>&1; then
  bash "$STAVEMARK_SCRIPTS/mail.sh" start
  STARTED_CATCHER=1
fi
timed "migrate" node api/dist/database/migrate.js || die "migration failed (output above)"
timed "seed" node api/dist/seed/seed.js || die "seeding the demo failed (output above)"

port_in_use "$PORT" && die "port $PORT is taken by another program; choose another: PORT=3001 npm run dev"
port_in_use "$WEB_DEV_PORT" && die "port $WEB_DEV_PORT is taken; choose another: WEB_DEV_PORT=5174 npm run dev"

CHILDREN=()
stop_all() {
  trap - INT TERM EXIT
  local pid
  # Background children of a script ignore SIGINT, so each one is sent SIGTERM.
  for pid in "${CHILDREN[@]}"; do kill -TERM "$pid" 2>/dev/null || true; done
  for pid in "${CHILDREN[@]}"; do wait "$pid" 2>/dev/null || true; done
  [ "$STARTED_CATCHER" = 1 ] && bash "$STAVEMARK_SCRIPTS/mail.sh" stop >/dev/null
  echo
  echo "Dev mode stopped. PostgreSQL is still running; stop it with: bash api/scripts/pg.sh stop"
}
trap stop_all EXIT
trap 'exit 130' INT TERM

# Each child gets a prefix on its output so the four streams stay readable.
spawn() {
  local tag="$1"
  shift
  "$@" </dev/null 9>&- > >(sed -u "s/^/[$tag] /") 2>&1 &
  CHILDREN+=("$!")
}

export PUBLIC_URL="${PUBLIC_URL:-http://localhost:$WEB_DEV_PORT}"
spawn shared "$NODE_BIN_DIR/tsc" -w -p shared/tsconfig.build.json --preserveWatchOutput
spawn api "$NODE_BIN_DIR/tsc" -w -p api/tsconfig.build.json --preserveWatchOutput
# --watch follows every module main.js imports, shared/dist included.
spawn server node --watch --watch-preserve-output api/dist/main.js
(cd web && API_PORT="$PORT" exec "$NODE_BIN_DIR/vite" --port "$WEB_DEV_PORT" --strictPort) \
  </dev/null 9>&- > >(sed -u "s/^/[web] /") 2>&1 &
CHILDREN+=("$!")

wait_for_http "http://127.0.0.1:$PORT/api/health" 60 || warn "the API has not answered /api/health yet"
cat <<EOF

  Dev mode: open http://localhost:$WEB_DEV_PORT   (Vite, hot reload; /api goes to the API on :$PORT)
  Demo sign-ins (password $DEMO_PASSWORD): ${DEMO_SIGN_INS[*]}
  A new migration or seed change needs a restart of npm run dev. Ctrl-C stops everything.

EOF
# Stop everything as soon as any child ends (for example Vite failing to start).
wait -n "${CHILDREN[@]}" || true
echo "A dev process ended (or Ctrl-C was pressed); stopping the others."
