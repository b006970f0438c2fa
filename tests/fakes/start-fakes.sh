#!/usr/bin/env bash
# Starts the local fake services, idempotently (a second start finds them running):
#   maildev  SMTP ${FAKE_SMTP_PORT:-1025}, web UI + REST ${FAKE_MAIL_WEB_PORT:-1080}
#   s3rver   ${FAKE_S3_PORT:-4569}, data in .data/fakes/s3 (git-ignored), bucket ${S3_BUCKET:-benchtag}
#   payments ${FAKE_PAYMENTS_PORT:-12111} (tests/fakes/fake-payments.ts)
#   bash tests/fakes/start-fakes.sh [start|stop|status]
set -euo pipefail
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$root"
smtp=${FAKE_SMTP_PORT:-1025}
web=${FAKE_MAIL_WEB_PORT:-1080}
s3=${FAKE_S3_PORT:-4569}
pay=${FAKE_PAYMENTS_PORT:-12111}
dir="$root/.data/fakes"
mkdir -p "$dir/s3"

port_open() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

start_one() {
  local name=$1 port=$2
  shift 2
  if port_open "$port"; then echo "[fakes] $name already running on $port" >&2; return 0; fi
  setsid nohup "$@" >"$dir/$name-$port.log" 2>&1 < /dev/null &
  echo $! >"$dir/$name-$port.pid"
  for _ in $(seq 1 100); do
    if port_open "$port"; then echo "[fakes] $name started on $port" >&2; return 0; fi
    sleep 0.2
  done
  echo "[fakes] $name did not start on $port; log:" >&2
  tail -20 "$dir/$name-$port.log" >&2
  return 1
}

stop_one() {
  local name=$1 port=$2 f="$dir/$1-$2.pid"
  if [ -f "$f" ]; then
    kill -- "-$(cat "$f")" 2>/dev/null || kill "$(cat "$f")" 2>/dev/null || true
    rm -f "$f"
    echo "[fakes] $name on $port stopped" >&2
  fi
}

case "${1:-start}" in
  start)
    start_one maildev "$web" node_modules/.bin/maildev --smtp "$smtp" --web "$web" --ip 127.0.0.1 --web-ip 127.0.0.1
    port_open "$smtp" || { echo "[fakes] SMTP port $smtp is not answering" >&2; exit 1; }
    start_one s3rver "$s3" node_modules/.bin/s3rver -d "$dir/s3" -a 127.0.0.1 -p "$s3" --silent --configure-bucket "${S3_BUCKET:-benchtag}"
    FAKE_PAYMENTS_PORT=$pay start_one payments "$pay" node_modules/.bin/tsx tests/fakes/fake-payments.ts
    ;;
  stop)
    stop_one maildev "$web"; stop_one s3rver "$s3"; stop_one payments "$pay" ;;
  status)
    for p in "maildev $web" "s3rver $s3" "payments $pay"; do set -- $p; if port_open "$2"; then echo "$1 up on $2"; else echo "$1 down ($2)"; fi; done ;;
  *) echo "usage: start-fakes.sh [start|stop|status]" >&2; exit 2 ;;
esac
