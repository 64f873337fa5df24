#!/usr/bin/env bash
# Local fakes of the hosted services: s3rver for S3 and maildev for SMTP, both on loopback only, started and
# stopped by PID. Usage: storage/fakes.sh up dev|test | down dev|test
# Ports come from the environment the caller exported (storage/profile.sh).
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$ROOT"
PROFILE=${2:-dev}
RUN=$ROOT/.run/$PROFILE
DATA=$ROOT/storage/.data/$PROFILE
mkdir -p "$RUN" "$DATA/s3"

alive() { [ -f "$1" ] && kill -0 "$(cat "$1")" 2>/dev/null; }

wait_port() {
  local port=$1 name=$2
  for _ in $(seq 1 100); do
    if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then return 0; fi
    sleep 0.1
  done
  echo "$name did not start on port $port; see $RUN/$name.log" >&2
  exit 1
}

up() {
  if ! alive "$RUN/s3.pid"; then
    node node_modules/s3rver/bin/s3rver.js -d "$DATA/s3" -a 127.0.0.1 -p "$S3_PORT" -s \
      --configure-bucket "$S3_BUCKET" storage/cors.xml >"$RUN/s3.log" 2>&1 &
    echo $! >"$RUN/s3.pid"
  fi
  if ! alive "$RUN/mail.pid"; then
    node node_modules/maildev/dist/bin/maildev.js --ip 127.0.0.1 --web-ip 127.0.0.1 \
      -s "$SMTP_PORT" -w "$MAIL_WEB_PORT" >"$RUN/mail.log" 2>&1 &
    echo $! >"$RUN/mail.pid"
  fi
  wait_port "$S3_PORT" s3
  wait_port "$SMTP_PORT" mail
  wait_port "$MAIL_WEB_PORT" mail
}

down() {
  for name in s3 mail; do
    if alive "$RUN/$name.pid"; then kill "$(cat "$RUN/$name.pid")" && echo "$name fake: stopped"; fi
    rm -f "$RUN/$name.pid"
  done
}

case "${1:-up}" in
  up) up ;;
  down) down ;;
  *) echo "usage: $0 up|down dev|test" >&2; exit 2 ;;
esac
