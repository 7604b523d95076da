# A local S3-compatible store for photographs and documents (s3rver from node_modules),
# listening on loopback only. Source after common.sh (or alone), do not run.
# shellcheck shell=bash
#
#   start_s3_fake PORT DATA_DIR [BUCKET]   starts it in the background, waits until it answers,
#                                          creates the bucket, exports S3_* for the app and tests
#   stop_s3_fake                           stops the one this shell started (by its recorded PID)
#
# The app reads: S3_ENDPOINT, S3_BUCKET, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY, S3_REGION.
# s3rver accepts the fixed credentials S3RVER / S3RVER.
source "$(dirname "${BASH_SOURCE[0]}")/processes.sh"

S3_FAKE_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"

_s3_log() { printf '\033[36m[dentate]\033[0m %s\n' "$*" >&2; }

start_s3_fake() {
  local port="${1:?start_s3_fake PORT DATA_DIR [BUCKET]}" dir="${2:?start_s3_fake PORT DATA_DIR [BUCKET]}"
  local bucket="${3:-${S3_BUCKET:-dentate-media}}"
  local bin="$S3_FAKE_ROOT/node_modules/.bin/s3rver"
  [ -x "$bin" ] || { _s3_log "s3rver is missing: run npm ci"; return 1; }
  mkdir -p "$dir"
  S3_FAKE_PID_FILE="$dir/s3rver.pid"
  # Already ours and alive (a re-run of start.sh): reuse it.
  if [ -f "$S3_FAKE_PID_FILE" ] && kill -0 "$(cat "$S3_FAKE_PID_FILE")" 2>/dev/null; then
    _s3_log "S3 fake already running (pid $(cat "$S3_FAKE_PID_FILE"))"
  else
    # --configure-bucket creates the bucket at startup (idempotent when it already exists).
    "$bin" -d "$dir/data" -a 127.0.0.1 -p "$port" --silent --no-vhost-buckets \
      --configure-bucket "$bucket" >"$dir/s3rver.log" 2>&1 &
    echo $! >"$S3_FAKE_PID_FILE"
  fi
  S3_FAKE_PID="$(cat "$S3_FAKE_PID_FILE")"

  export S3_ENDPOINT="http://127.0.0.1:$port"
  export S3_BUCKET="$bucket"
  export S3_ACCESS_KEY_ID="${S3_ACCESS_KEY_ID:-S3RVER}"
  export S3_SECRET_ACCESS_KEY="${S3_SECRET_ACCESS_KEY:-S3RVER}"
  export S3_REGION="${S3_REGION:-us-east-1}"

  # Ready when the bucket answers (s3rver creates it before it listens).
  node -e '
    const [url, pid] = process.argv.slice(1);
    const end = Date.now() + 30000;
    (async () => {
      while (Date.now() < end) {
        try { process.kill(Number(pid), 0); } catch { process.exit(2); }
        try { const r = await fetch(url); if (r.status < 500) process.exit(0); } catch {}
        await new Promise((r) => setTimeout(r, 200));
      }
      process.exit(1);
    })();' "$S3_ENDPOINT/$bucket" "$S3_FAKE_PID" || {
    _s3_log "S3 fake did not answer on $S3_ENDPOINT (log: $dir/s3rver.log)"
    return 1
  }
  _s3_log "S3 fake on $S3_ENDPOINT bucket $bucket (pid $S3_FAKE_PID)"
}

stop_s3_fake() {
  stop_background "$(recorded_pid "${S3_FAKE_PID:-}" "${S3_FAKE_PID_FILE:-}")" "${S3_FAKE_PID_FILE:-}"
  S3_FAKE_PID=""
}
