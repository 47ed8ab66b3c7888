#!/usr/bin/env bash
# The local mail catcher (api/src/mail-catcher/catcher.ts, built to api/dist/mail-catcher/) in the
# background: SMTP on 127.0.0.1:$MAIL_CATCHER_PORT (default 2525), each message stored as JSON in
# $MAIL_CATCHER_DIR (default .local/mail). One catcher per port; pid file and log in .local/.
#
#   bash api/scripts/mail.sh start|stop|status
#   bash api/scripts/mail.sh clear      delete the stored messages
set -euo pipefail
# shellcheck source=lib/env.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/env.sh"
close_inherited_fds

CATCHER_JS="$STAVEMARK_ROOT/api/dist/mail-catcher/catcher.js"
PIDFILE="$RUN_DIR/mail-catcher-$MAIL_CATCHER_PORT.pid"
LOGFILE="$LOG_DIR/mail-catcher-$MAIL_CATCHER_PORT.log"

# The pid from the pid file when that process is still our catcher.
running_pid() {
  local pid
  [ -f "$PIDFILE" ] || return 1
  pid="$(cat "$PIDFILE")"
  [ -n "$pid" ] && kill -0 "$pid" 2>/dev/null || return 1
  # Guard against a reused pid belonging to something else.
  tr '\0' ' ' <"/proc/$pid/cmdline" 2>/dev/null | grep -q 'mail-catcher/catcher.js' || return 1
  printf '%s' "$pid"
}

cmd_start() {
  local pid i
  if pid="$(running_pid)"; then
    echo "Mail catcher is already running on 127.0.0.1:$MAIL_CATCHER_PORT (pid $pid), storing in $MAIL_CATCHER_DIR."
    return 0
  fi
  [ -f "$CATCHER_JS" ] || die "$CATCHER_JS is missing: build the API first (npm run build -w api)."
  if port_in_use "$MAIL_CATCHER_PORT"; then
    die "port $MAIL_CATCHER_PORT on 127.0.0.1 is taken by another program; stop it or use MAIL_CATCHER_PORT=<port>."
  fi
  mkdir -p "$RUN_DIR" "$LOG_DIR" "$MAIL_CATCHER_DIR"
  # setsid: its own session, so a Ctrl-C in the terminal that started it does not reach it.
  # Descriptors above 2 are closed so it never holds a caller's lock file.
  MAIL_CATCHER_PORT="$MAIL_CATCHER_PORT" MAIL_CATCHER_DIR="$MAIL_CATCHER_DIR" \
    setsid node "$CATCHER_JS" </dev/null >>"$LOGFILE" 2>&1 8>&- 9>&- &
  pid=$!
  echo "$pid" >"$PIDFILE"
  for i in $(seq 1 100); do
    if ! kill -0 "$pid" 2>/dev/null; then
      tail -n 5 "$LOGFILE" >&2
      rm -f "$PIDFILE"
      die "the mail catcher exited at start (log: $LOGFILE)"
    fi
    port_in_use "$MAIL_CATCHER_PORT" && break
    sleep 0.1
  done
  port_in_use "$MAIL_CATCHER_PORT" || die "the mail catcher did not open port $MAIL_CATCHER_PORT within 10 s (log: $LOGFILE)"
  echo "Mail catcher started on 127.0.0.1:$MAIL_CATCHER_PORT (pid $pid), storing in $MAIL_CATCHER_DIR (log: $LOGFILE)."
}

cmd_stop() {
  local pid i
  if ! pid="$(running_pid)"; then
    rm -f "$PIDFILE"
    echo "Mail catcher on port $MAIL_CATCHER_PORT is not running."
    return 0
  fi
  kill -TERM "$pid"
  for i in $(seq 1 50); do
    kill -0 "$pid" 2>/dev/null || break
    sleep 0.1
  done
  kill -0 "$pid" 2>/dev/null && kill -KILL "$pid"
  rm -f "$PIDFILE"
  echo "Mail catcher on port $MAIL_CATCHER_PORT stopped (messages kept in $MAIL_CATCHER_DIR)."
}

cmd_status() {
  local pid
  if pid="$(running_pid)"; then
    echo "Mail catcher is running on 127.0.0.1:$MAIL_CATCHER_PORT (pid $pid), storing in $MAIL_CATCHER_DIR."
  else
    echo "Mail catcher on port $MAIL_CATCHER_PORT is not running."
    exit 3
  fi
}

cmd_clear() {
  # Only the catcher's own files (<13 digits>-<8 hex>.json); anything else in the folder stays.
  [ -d "$MAIL_CATCHER_DIR" ] || return 0
  find "$MAIL_CATCHER_DIR" -maxdepth 1 -type f -regextype posix-extended \
    -regex '.*/[0-9]{13}-[0-9a-f]{8}\.json' -delete
  echo "Cleared the caught mail in $MAIL_CATCHER_DIR."
}

case "${1:-}" in
start) cmd_start ;;
stop) cmd_stop ;;
status) cmd_status ;;
clear) cmd_clear ;;
*)
  echo "usage: bash api/scripts/mail.sh start|stop|status|clear" >&2
  exit 64
  ;;
esac
