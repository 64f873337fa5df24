#!/usr/bin/env bash
# Benchmarks of the drawing register (figures, not pass/fail): bash tests/perf/run.sh
# Uses its own test slot (TEST_SLOT, default 7): its own database, fakes and app, started here and stopped after.
# BENCH_UPLOAD_MB sets the large upload (default 500); the app is started with a limit above it.
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$ROOT"
export PATH="$ROOT/node_modules/.bin:$PATH"
export TEST_SLOT=${TEST_SLOT:-7}
# shellcheck source=storage/profile.sh
source storage/profile.sh test
export BENCH_UPLOAD_MB=${BENCH_UPLOAD_MB:-500}
export UPLOAD_MAX_BYTES=$(( (BENCH_UPLOAD_MB + 50) * 1024 * 1024 ))
bash db/postgres.sh up
bash db/postgres.sh recreatedb "$COUNTERSIGN_DB"
bash storage/fakes.sh down "$COUNTERSIGN_RUN" >/dev/null || true
rm -rf "storage/.data/$COUNTERSIGN_RUN"
bash storage/fakes.sh up "$COUNTERSIGN_RUN"
tsx db/migrate.ts up
mkdir -p ".run/$COUNTERSIGN_RUN"
react-router build >".run/build-$COUNTERSIGN_RUN.log" 2>&1 || { cat ".run/build-$COUNTERSIGN_RUN.log"; exit 1; }
HOST=127.0.0.1 PORT=$APP_PORT node node_modules/@react-router/serve/bin.js "$COUNTERSIGN_BUILD_DIR/server/index.js" >".run/$COUNTERSIGN_RUN/app.log" 2>&1 &
APP_PID=$!
trap 'kill $APP_PID 2>/dev/null || true; bash storage/fakes.sh down "$COUNTERSIGN_RUN" >/dev/null || true' EXIT
for _ in $(seq 1 150); do (exec 3<>"/dev/tcp/127.0.0.1/$APP_PORT") 2>/dev/null && break; sleep 0.1; done
APP_PID=$APP_PID tsx tests/perf/drawings.perf.ts
