#!/usr/bin/env bash
# Every benchmark in one go (figures, not pass/fail): the solve, the drawing register (its own test slot), and
# the large-project load against a bare-SQL baseline.
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$ROOT"
export PATH="$ROOT/node_modules/.bin:$PATH"
tsx tests/perf/balance.bench.ts
bash tests/perf/run.sh
bash tests/load/run.sh
