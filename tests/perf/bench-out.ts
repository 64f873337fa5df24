// What each benchmark hands to the report (tests/perf/report.ts): its figures as one list of values per figure,
// one value per run, written to $BENCH_DIR/<name>.json. Without BENCH_DIR (a benchmark run by hand) nothing is
// written, so the scripts still work on their own and only print.
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";

export interface BenchFile {
  name: string;
  at: string;
  /** Figure name → one value per run (ms, MB/s, MB, KB, s as the name says). */
  figures: Record<string, number[]>;
  /** Anything the report shows beside the figures (sizes, settings, the first, cold run). */
  notes?: Record<string, unknown>;
}

/** How many times to repeat: BENCH_RUNS (3 by default) unless the script has its own default. */
export const benchRuns = (fallback = 3) => Math.max(1, Number(process.env.BENCH_RUNS ?? fallback) || fallback);

export function writeBench(name: string, figures: Record<string, number[]>, notes?: Record<string, unknown>) {
  const dir = process.env.BENCH_DIR;
  if (!dir) return;
  mkdirSync(dir, { recursive: true });
  const file: BenchFile = { name, at: new Date().toISOString(), figures, notes };
  writeFileSync(path.join(dir, `${name}.json`), `${JSON.stringify(file, null, 2)}\n`);
}
