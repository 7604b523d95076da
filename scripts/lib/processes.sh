# Stopping a background process this shell started. Sourced by the fakes' scripts (and so
# available wherever they are); do not run.
# shellcheck shell=bash

# stop_background PID [PID_FILE]: TERM, up to 5 s to go, then KILL; removes PID_FILE if given.
# An empty PID or one already gone is fine.
stop_background() {
  local pid="${1:-}" file="${2:-}"
  if [ -n "$pid" ] && kill -0 "$pid" 2>/dev/null; then
    kill "$pid" 2>/dev/null || true
    for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
    kill -0 "$pid" 2>/dev/null && kill -9 "$pid" 2>/dev/null || true
  fi
  if [ -n "$file" ]; then rm -f "$file"; fi
  return 0
}

# recorded_pid PID PID_FILE: prints PID, or else the one in PID_FILE when it exists.
recorded_pid() {
  local pid="${1:-}" file="${2:-}"
  if [ -z "$pid" ] && [ -n "$file" ] && [ -f "$file" ]; then pid="$(cat "$file")"; fi
  printf '%s' "$pid"
}
