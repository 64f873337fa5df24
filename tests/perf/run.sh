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
# shellcheck source=tests/perf/slot-stack.sh
source tests/perf/slot-stack.sh
APP_PID=$APP_PID tsx tests/perf/drawings.perf.ts
