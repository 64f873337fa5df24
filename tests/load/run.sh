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
# shellcheck source=tests/perf/slot-stack.sh
source tests/perf/slot-stack.sh
tsx tests/load/load.ts "${LOAD_SIZE:-full}" --write
