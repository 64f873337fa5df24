// Benchmark for the pressure-balance solve: median wall time for synthetic networks of 10 to 5,000 outlets.
// Run with `npx tsx app/engineering/bench/balance.bench.ts`. Timing lives here, not in unit tests.

import { pressureBalance } from "../balance";
import { syntheticNetwork } from "./networks";

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}

function time(run: () => unknown, repeats: number): number {
  for (let i = 0; i < 3; i++) run();
  const samples: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    run();
    samples.push(performance.now() - t0);
  }
  return median(samples);
}

const rows: string[] = [];
rows.push("outlets  segments  solve (ms)  solve + suggestions (ms)");
for (const outlets of [10, 100, 1000, 5000]) {
  const network = syntheticNetwork(outlets / 2);
  const repeats = outlets >= 5000 ? 15 : 41;
  const solve = time(() => pressureBalance(network, { suggest: false }), repeats);
  const withSuggestions = time(() => pressureBalance(network), outlets >= 5000 ? 5 : 11);
  rows.push(
    `${String(outlets).padStart(7)}  ${String(network.segments.length).padStart(8)}  ${solve.toFixed(2).padStart(10)}  ${withSuggestions
      .toFixed(2)
      .padStart(24)}`,
  );
}
console.log(rows.join("\n"));
