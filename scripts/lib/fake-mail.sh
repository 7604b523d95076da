# A local fake SMTP server with a web inbox (maildev from node_modules), on loopback only.
# Source it, do not run it.
# shellcheck shell=bash
#
#   start_mail_fake SMTP_PORT WEB_PORT [DATA_DIR]   starts maildev in the background, records its
#                                                   PID, waits until both ports answer, exports
#                                                   the variables below
#   stop_mail_fake                                  stops the one this shell started (by its PID)
#
# Exports for the app, the mail worker and the tests:
#   SMTP_HOST=127.0.0.1 SMTP_PORT SMTP_SECURE=false SMTP_USER= SMTP_PASS= (maildev takes no auth)
#   MAIL_FROM (kept when already set)
#   MAILDEV_WEB_URL=http://127.0.0.1:WEB_PORT   the inbox page; its JSON API is $MAILDEV_WEB_URL/api/email
# APP_BASE_URL (links inside mails) is not set here: start.sh knows the app's address.
source "$(dirname "${BASH_SOURCE[0]}")/processes.sh"

MAIL_FAKE_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"

_mail_log() { printf '\033[36m[dentate]\033[0m %s\n' "$*" >&2; }

start_mail_fake() {
  local smtp="${1:?start_mail_fake SMTP_PORT WEB_PORT [DATA_DIR]}" web="${2:?start_mail_fake SMTP_PORT WEB_PORT [DATA_DIR]}"
  local dir="${3:-${TMPDIR:-/tmp}/dentate-mail-$smtp}"
  local bin="$MAIL_FAKE_ROOT/node_modules/.bin/maildev"
  [ -x "$bin" ] || { _mail_log "maildev is missing: run npm ci"; return 1; }
  mkdir -p "$dir/mails"
  MAIL_FAKE_PID_FILE="$dir/maildev.pid"
  if [ -f "$MAIL_FAKE_PID_FILE" ] && kill -0 "$(cat "$MAIL_FAKE_PID_FILE")" 2>/dev/null; then
    _mail_log "mail fake already running (pid $(cat "$MAIL_FAKE_PID_FILE"))"
  else
    # Mails are kept in DATA_DIR/mails so a restart of the fake keeps its inbox.
    "$bin" --smtp "$smtp" --web "$web" --ip 127.0.0.1 --web-ip 127.0.0.1 \
      --mail-directory "$dir/mails" --silent >"$dir/maildev.log" 2>&1 &
    echo $! >"$MAIL_FAKE_PID_FILE"
  fi
  MAIL_FAKE_PID="$(cat "$MAIL_FAKE_PID_FILE")"

  export SMTP_HOST=127.0.0.1 SMTP_PORT="$smtp" SMTP_SECURE=false SMTP_USER="" SMTP_PASS=""
  export MAIL_FROM="${MAIL_FROM:-Dentate <no-reply@dentate.example>}"
  export MAILDEV_WEB_URL="http://127.0.0.1:$web"

  # Ready when the SMTP port accepts a connection and the inbox API answers.
  node -e '
    const net = require("node:net");
    const [smtp, web, pid] = process.argv.slice(1).map(Number);
    const end = Date.now() + 30000;
    const smtpUp = () => new Promise((res) => { const s = net.connect(smtp, "127.0.0.1", () => { s.destroy(); res(true); }); s.on("error", () => res(false)); });
    (async () => {
      while (Date.now() < end) {
        try { process.kill(pid, 0); } catch { process.exit(2); }
        let webUp = false;
        try { webUp = (await fetch(`http://127.0.0.1:${web}/api/email`)).ok; } catch {}
        if (webUp && (await smtpUp())) process.exit(0);
        await new Promise((r) => setTimeout(r, 200));
      }
      process.exit(1);
    })();' "$smtp" "$web" "$MAIL_FAKE_PID" || {
    _mail_log "mail fake did not answer on SMTP $smtp / web $web (log: $dir/maildev.log)"
    return 1
  }
  _mail_log "mail fake: SMTP 127.0.0.1:$smtp, inbox $MAILDEV_WEB_URL (pid $MAIL_FAKE_PID)"
}

stop_mail_fake() {
  stop_background "$(recorded_pid "${MAIL_FAKE_PID:-}" "${MAIL_FAKE_PID_FILE:-}")" "${MAIL_FAKE_PID_FILE:-}"
  MAIL_FAKE_PID=""
}
