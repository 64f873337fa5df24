#!/usr/bin/env bash
# The two commands behind the README: `npm start` (set up everything, load the demo, serve on :3000) and
# `npm test` (the same set-up for a separate test database and fakes, then every test). `npm run stop` ends what
# start began, by PID. Every step is idempotent: it installs, creates or starts only what is missing.
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$ROOT"
export PATH="$ROOT/node_modules/.bin:$PATH"

log() { printf '\033[1m▸ %s\033[0m\n' "$*"; }

need_root_for() {
  if [ "$(id -u)" != 0 ]; then echo "Countersign needs $1; install it (sudo apt-get install $1) or run as root." >&2; exit 1; fi
}

apt_updated=
apt_install() {
  need_root_for "$*"
  if [ -z "$apt_updated" ]; then apt-get update -qq; apt_updated=1; fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}

npm_deps() {
  if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    log "installing npm dependencies (npm ci)"
    npm ci --no-audit --no-fund
  fi
}

os_deps() {
  local missing=()
  command -v pdftoppm >/dev/null || missing+=(poppler-utils)
  command -v qpdf >/dev/null || missing+=(qpdf)
  if [ "${1:-}" = test ] && [ ! -x /usr/bin/chromium ]; then missing+=(chromium); fi
  if [ ${#missing[@]} -gt 0 ]; then log "installing Debian packages: ${missing[*]}"; apt_install "${missing[@]}"; fi
}

# Starts PostgreSQL and the fakes side by side. `services_up PROFILE` also migrates; `start` migrates itself (in
# the same process as the demo) and passes "no-migrate".
services_up() {
  local profile=$1
  # shellcheck source=storage/profile.sh
  source storage/profile.sh "$profile"
  log "PostgreSQL, S3 and mail fakes"
  if [ "$profile" = test ]; then bash storage/fakes.sh down "$COUNTERSIGN_RUN" >/dev/null; rm -rf "storage/.data/$COUNTERSIGN_RUN"; fi
  bash storage/fakes.sh up "$COUNTERSIGN_RUN" &
  local fakes=$!
  bash db/postgres.sh up
  if [ "$profile" = test ]; then bash db/postgres.sh recreatedb "$COUNTERSIGN_DB"; else bash db/postgres.sh createdb "$COUNTERSIGN_DB"; fi
  wait "$fakes"
  if [ "${2:-}" != no-migrate ]; then
    log "migrations"
    tsx db/migrate.ts up
  fi
}

build_if_stale() {
  local out=$COUNTERSIGN_BUILD_DIR/server/index.js
  if [ -f "$out" ] && [ -z "$(find app public db react-router.config.ts vite.config.ts package-lock.json -newer "$out" -print -quit)" ]; then
    return 0
  fi
  log "building the app"
  react-router build >".run/build-$COUNTERSIGN_RUN.log" 2>&1 || { cat ".run/build-$COUNTERSIGN_RUN.log"; exit 1; }
}

serve_background() {
  local profile=$COUNTERSIGN_RUN
  mkdir -p ".run/$profile"
  local pidfile=".run/$profile/app.pid"
  if [ -f "$pidfile" ] && kill -0 "$(cat "$pidfile")" 2>/dev/null; then kill "$(cat "$pidfile")"; sleep 0.3; fi
  HOST=127.0.0.1 PORT=$APP_PORT node storage/serve.mjs "$COUNTERSIGN_BUILD_DIR/server/index.js" \
    >".run/$profile/app.log" 2>&1 &
  echo $! >"$pidfile"
  for _ in $(seq 1 150); do
    if (exec 3<>"/dev/tcp/127.0.0.1/$APP_PORT") 2>/dev/null; then return 0; fi
    if ! kill -0 "$(cat "$pidfile")" 2>/dev/null; then cat ".run/$profile/app.log"; exit 1; fi
    sleep 0.1
  done
  echo "the app did not answer on :$APP_PORT; see .run/$profile/app.log" >&2
  exit 1
}

start() {
  npm_deps
  os_deps
  mkdir -p .run/dev
  services_up dev no-migrate
  log "migrations and demo data"
  tsx db/start.ts .run/dev/sign-ins.txt
  build_if_stale
  serve_background
  cat <<MSG

  Countersign is running at $APP_URL
  Mail inbox (local fake): $MAIL_API_URL
$(cat .run/dev/sign-ins.txt)

  Stop with Ctrl-C (the app) and \`npm run stop\` (database and fakes).
MSG
  trap 'kill "$(cat .run/dev/app.pid)" 2>/dev/null; exit 0' INT TERM
  wait "$(cat .run/dev/app.pid)" || true
}

run_tests() {
  npm_deps
  os_deps test
  services_up test
  mkdir -p ".run/$COUNTERSIGN_RUN"
  build_if_stale
  serve_background
  local status=0
  trap 'kill "$(cat ".run/$COUNTERSIGN_RUN/app.pid")" 2>/dev/null || true; bash storage/fakes.sh down "$COUNTERSIGN_RUN" >/dev/null || true' EXIT
  local reports=".run/$COUNTERSIGN_RUN"
  rm -f "$reports/vitest.json" "$reports/playwright.json"
  log "unit and integration tests (vitest)"
  vitest run --reporter=default --reporter=json --outputFile.json="$reports/vitest.json" "$@" || status=$?
  if [ "${SKIP_E2E:-}" != 1 ]; then
    log "end-to-end tests (Playwright on Debian Chromium)"
    PLAYWRIGHT_JSON_OUTPUT_NAME="$reports/playwright.json" playwright test --reporter=list,json || status=$?
  fi
  echo
  tsx tests/support/summary.ts "$reports/vitest.json" "$reports/playwright.json"
  return $status
}

stop() {
  for profile in $(ls .run 2>/dev/null); do
    [ -d ".run/$profile" ] || continue
    if [ -f ".run/$profile/app.pid" ] && kill -0 "$(cat ".run/$profile/app.pid")" 2>/dev/null; then
      kill "$(cat ".run/$profile/app.pid")" && echo "app ($profile): stopped"
    fi
    rm -f ".run/$profile/app.pid"
    bash storage/fakes.sh down "$profile"
  done
  bash db/postgres.sh down
}

case "${1:-}" in
  start) start ;;
  test) shift; run_tests "$@" ;;
  stop) stop ;;
  services) npm_deps; services_up "${2:-dev}" ;;
  # Bring a profile up and leave it running (for running one test file at a time).
  up) npm_deps; services_up "${2:-test}"; mkdir -p ".run/$COUNTERSIGN_RUN"; build_if_stale; serve_background; echo "up: $APP_URL" ;;
  *) echo "usage: $0 start|test|stop|services [dev|test]" >&2; exit 2 ;;
esac
