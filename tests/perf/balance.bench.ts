// Pressure-balance benchmark as a Markdown table: median solve time for synthetic networks of 10 to 5,000
// outlets (app/engineering/bench/networks.ts), without and with suggestions. Each size is warmed up until the
// JIT settles, then timed in batches; wall time and process CPU time are both reported, because on a shared
// machine wall time mostly measures the neighbours. Run: npx tsx tests/perf/balance.bench.ts
// BENCH_RUNS repeats the whole sweep (1 by hand); BENCH_SUGGEST=0 leaves out the suggestion search, which has no
// budget and is the slow part; with BENCH_DIR set the figures go to the report (tests/perf/report.ts).
import { pressureBalance } from "../../app/engineering/balance";
import { syntheticNetwork } from "../../app/engineering/bench/networks";
import { benchRuns, writeBench } from "./bench-out";

const median = (values: number[]) => {
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
};

function measure(run: () => unknown, budgetMs: number): { wallMs: number; cpuMs: number; runs: number } {
  const warmUntil = performance.now() + budgetMs / 3;
  while (performance.now() < warmUntil) run();
  const first = performance.now();
  run();
  const once = Math.max(performance.now() - first, 0.01);
  const perBatch = Math.max(1, Math.round(2 / once)); // batches of about 2 ms, so the CPU clock can resolve them
  const wall: number[] = [];
  const cpu: number[] = [];
  const stop = performance.now() + budgetMs;
  let runs = 0;
  while (performance.now() < stop || wall.length < 5) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    for (let i = 0; i < perBatch; i++) run();
    const c = process.cpuUsage(c0);
    wall.push((performance.now() - t0) / perBatch);
    cpu.push((c.user + c.system) / 1000 / perBatch);
    runs += perBatch;
  }
  return { wallMs: median(wall), cpuMs: median(cpu), runs };
}

const fmt = (ms: number) => (ms < 10 ? ms.toFixed(2) : ms.toFixed(1));
const budget = Number(process.env.BENCH_MS ?? 1500);
const suggestToo = process.env.BENCH_SUGGEST !== "0";
const SIZES = [10, 100, 1000, 5000];
const figures: Record<string, number[]> = {};
const keep = (k: string, v: number) => (figures[k] ??= []).push(+v.toFixed(3));
const runs = benchRuns(1);
for (let run = 1; run <= runs; run++) {
  const rows = ["| outlets | segments | solve, wall (ms) | solve, CPU (ms) | with suggestions, wall (ms) | runs |", "|---:|---:|---:|---:|---:|---:|"];
  for (const outlets of SIZES) {
    const network = syntheticNetwork(outlets / 2);
    const solve = measure(() => pressureBalance(network, { suggest: false }), budget);
    const suggest = suggestToo ? measure(() => pressureBalance(network), outlets >= 5000 ? budget * 2 : budget) : null;
    keep(`solve_ms.${outlets}`, solve.wallMs);
    keep(`solve_cpu_ms.${outlets}`, solve.cpuMs);
    rows.push(`| ${outlets.toLocaleString("en")} | ${network.segments.length.toLocaleString("en")} | ${fmt(solve.wallMs)} | ${fmt(solve.cpuMs)} | ${suggest ? fmt(suggest.wallMs) : "—"} | ${solve.runs} |`);
  }
  if (runs > 1) console.log(`\nrun ${run} of ${runs}`);
  console.log(rows.join("\n"));
}
console.log(`\nNode ${process.version}, ${process.platform}/${process.arch}; median of ~2 ms batches after warm-up (BENCH_MS=${budget}).`);
writeBench("balance", figures, { sizes: SIZES, budgetMsPerSize: budget });
