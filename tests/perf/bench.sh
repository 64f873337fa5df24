#!/usr/bin/env bash
# `npm run bench`: every benchmark in one go, each BENCH_RUNS times (3), then one report with the ratios to the
# baselines measured in the same run (tests/perf/report.ts → docs/perf/bench.md, docs/perf/bench.json and the
# table in README.md). Figures, not pass/fail: a benchmark that fails makes its rows say "failed" and the rest
# still run and are reported. Raw figures and each benchmark's log: .run/bench/.
#   BENCH_RUNS=3            runs of each benchmark
#   BENCH_HEAVY_RUNS=1      runs of the large upload and of the 60 s load (each takes minutes)
#   BENCH_UPLOAD_MB=500     size of the large upload
#   BENCH_SLOT=7, LOAD_SLOT=6   the test slots used (own database, fakes, build folder, app; recreated here)
#   BENCH_ONLY="balance signing drawings markups routes-js load start"   rerun a subset: the others' figures of
#                           the last run stay in .run/bench/ and the report combines them (it lists every row)
#   BENCH_PARTS=upload,viewer,compare   parts of the drawings benchmark
#   BENCH_README=0          leave README.md alone
set -uo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$ROOT"
export PATH="$ROOT/node_modules/.bin:$PATH"
export BENCH_DIR="$ROOT/.run/bench"
export BENCH_RUNS=${BENCH_RUNS:-3}
HEAVY=${BENCH_HEAVY_RUNS:-1}
ONLY=" ${BENCH_ONLY:-balance signing drawings markups routes-js load start} "
if [ -z "${BENCH_ONLY:-}" ]; then rm -rf "$BENCH_DIR"; fi
mkdir -p "$BENCH_DIR"
for name in $ONLY; do rm -f "$BENCH_DIR/$name.json" "$BENCH_DIR/$name.log"; done
if [[ "$ONLY" == *" load "* ]]; then rm -f "$BENCH_DIR"/load-*.json; fi
rm -f "$BENCH_DIR/failed.txt"

log() { printf '\033[1m▸ %s\033[0m\n' "$*"; }
wanted() { [[ "$ONLY" == *" $1 "* ]]; }
# Runs one benchmark with its output kept in .run/bench/<name>.log; a failure is noted and the run goes on.
step() {
  local name=$1
  shift
  wanted "$name" || return 0
  log "$name"
  "$@" 2>&1 | tee "$BENCH_DIR/$name.log"
  local status=${PIPESTATUS[0]}
  if [ "$status" != 0 ]; then echo "$name failed (exit $status); see .run/bench/$name.log" | tee -a "$BENCH_DIR/failed.txt"; fi
  return 0
}

# In-process benchmarks first, on a quiet stack. Shorter batches than by hand: three sweeps instead of one.
step balance env BENCH_MS=${BENCH_MS:-800} BENCH_SUGGEST=0 tsx tests/perf/balance.bench.ts
step signing tsx tests/perf/signing.perf.ts

# The drawing register and the markup canvas on one fresh slot stack (stopped when the subshell ends).
if wanted drawings || wanted markups || wanted routes-js; then
  (
    export TEST_SLOT=${BENCH_SLOT:-7}
    # shellcheck source=storage/profile.sh
    source storage/profile.sh test
    export BENCH_UPLOAD_MB=${BENCH_UPLOAD_MB:-500} BENCH_UPLOAD_RUNS=$HEAVY
    export UPLOAD_MAX_BYTES=$(( (BENCH_UPLOAD_MB + 50) * 1024 * 1024 ))
    log "slot $TEST_SLOT: fresh database, fakes, build and app"
    # shellcheck source=tests/perf/slot-stack.sh
    source tests/perf/slot-stack.sh
    step routes-js tsx tests/perf/routes-js.ts "$COUNTERSIGN_BUILD_DIR"
    step drawings env APP_PID="$APP_PID" tsx tests/perf/drawings.perf.ts
    step markups tsx tests/perf/markups.perf.ts
  ) || echo "slot ${BENCH_SLOT:-7}: the stack did not start (its rows say failed)" | tee -a "$BENCH_DIR/failed.txt"
fi

# The large-project load on its own slot: seeded once, then loaded BENCH_HEAVY_RUNS times.
if wanted load; then
  (
    export TEST_SLOT=${LOAD_SLOT:-6}
    # shellcheck source=storage/profile.sh
    source storage/profile.sh test
    export LOAD_CONNECTIONS=${LOAD_CONNECTIONS:-50} LOAD_DURATION=${LOAD_DURATION:-60}
    log "slot $TEST_SLOT: fresh database, fakes, build and app"
    # shellcheck source=tests/perf/slot-stack.sh
    source tests/perf/slot-stack.sh
    load_runs() {
      tsx tests/load/seed-large.ts "${LOAD_SIZE:-full}" >"$BENCH_DIR/seeded.json" || return 1
      for n in $(seq 1 "$HEAVY"); do tsx tests/load/load.ts full --seeded "$BENCH_DIR/seeded.json" --out "$BENCH_DIR/load-$n.json" || return 1; done
    }
    step load load_runs
  ) || echo "slot ${LOAD_SLOT:-6}: the stack did not start (its rows say failed)" | tee -a "$BENCH_DIR/failed.txt"
fi

step start tsx tests/perf/start-time.ts

log "report"
if [ "${BENCH_README:-1}" = 1 ]; then tsx tests/perf/report.ts --readme; else tsx tests/perf/report.ts; fi
echo
echo "Written: docs/perf/bench.md and docs/perf/bench.json (raw figures and logs in .run/bench/)"
[ -f "$BENCH_DIR/failed.txt" ] && cat "$BENCH_DIR/failed.txt"
exit 0
