#!/usr/bin/env bash
# Load on a large project (figures, not pass/fail — except that every response must be a 2xx):
#   bash tests/load/run.sh            # TEST_SLOT 5 by default: its own database, fakes and app, started here, stopped after
# Recreates the slot's database, seeds the full-size project, loads the main pages and API reads with
# LOAD_CONNECTIONS (50) for LOAD_DURATION seconds (60) beside the bare-SQL baseline, and writes docs/perf/load.md
# and docs/perf/load.json. LOAD_SIZE=tiny for a quick check.
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$ROOT"
export PATH="$ROOT/node_modules/.bin:$PATH"
export TEST_SLOT=${TEST_SLOT:-5}
# shellcheck source=storage/profile.sh
source storage/profile.sh test
export LOAD_CONNECTIONS=${LOAD_CONNECTIONS:-50} LOAD_DURATION=${LOAD_DURATION:-60}
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
tsx tests/load/load.ts "${LOAD_SIZE:-full}" --write
