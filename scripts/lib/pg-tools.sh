# Finding PostgreSQL's client programs without installing anything (backup.sh, restore.sh).
# Sourced; do not run.
# shellcheck shell=bash

# pg_tool NAME: the path of a PostgreSQL program: $PGBIN's, else the newest Debian one,
# else the one on PATH; exits 2 with a message when there is none.
pg_tool() {
  local name="$1" dir
  if [ -n "${PGBIN:-}" ] && [ -x "$PGBIN/$name" ]; then echo "$PGBIN/$name"; return; fi
  dir="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1 || true)"
  if [ -n "$dir" ] && [ -x "$dir/$name" ]; then echo "$dir/$name"; return; fi
  command -v "$name" || { echo "$(basename "$0" .sh): $name not found (install the PostgreSQL client)" >&2; exit 2; }
}
