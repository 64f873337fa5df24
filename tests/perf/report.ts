// The report of `npm run bench`: reads what each benchmark wrote to $BENCH_DIR (.run/bench by default; see
// tests/perf/bench-out.ts, and load-<n>.json from tests/load/load.ts --out) and writes docs/perf/bench.md and
// docs/perf/bench.json: per row the min / median / max over the runs, the baseline measured in the same run, the
// ratio, the budget and whether it is met. The ratio and the verdict use medians. A row whose figures are missing
// (its benchmark failed or was not run) says "failed" and the rest are still reported.
//   npx tsx tests/perf/report.ts [--readme]   — --readme also puts the table in README.md's Performance section,
//   between the bench:latest markers.
import { existsSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import type { BenchFile } from "./bench-out";
import type { LoadResults } from "../load/load";

const ROOT = path.resolve(import.meta.dirname, "../..");
export const BENCH_DIR = process.env.BENCH_DIR ?? path.join(ROOT, ".run/bench");

export interface Stat {
  min: number;
  median: number;
  max: number;
  runs: number;
}

export interface ReportRow {
  what: string;
  unit: string;
  figure: Stat | null;
  baseline: { label: string; stat: Stat | null } | null;
  ratio: string;
  budget: string;
  met: boolean | null;
  /** Why the figures are missing, when they are. */
  failed?: string;
  note?: string;
}

export const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
};
export const stat = (xs: number[]): Stat => ({ min: Math.min(...xs), median: median(xs), max: Math.max(...xs), runs: xs.length });

class Missing extends Error {}

/** Readers of one run's folder of figures; each throws Missing when a benchmark left nothing. */
function reader(dir: string) {
  const logOf = (name: string) => path.relative(ROOT, path.join(dir, `${name}.log`));
  const bench = (name: string): BenchFile => {
    const file = path.join(dir, `${name}.json`);
    if (!existsSync(file)) throw new Missing(`${name} wrote no figures (see ${logOf(name)})`);
    return JSON.parse(readFileSync(file, "utf8")) as BenchFile;
  };
  const fig = (name: string, key: string) => {
    const xs = bench(name).figures[key];
    if (!xs?.length) throw new Missing(`${name}: no ${key} (see ${logOf(name)})`);
    return xs;
  };
  const loads = (): LoadResults[] => {
    const files = existsSync(dir) ? readdirSync(dir).filter((f) => /^load-\d+\.json$/.test(f)) : [];
    if (!files.length) throw new Missing(`the load wrote no figures (see ${logOf("load")})`);
    return files.map((f) => JSON.parse(readFileSync(path.join(dir, f), "utf8")) as LoadResults);
  };
  return { bench, fig, loads };
}

const x = (a: number, b: number) => `${(a / b).toFixed(2)}×`;

/** Builds one row; a missing benchmark makes it a "failed" row instead of stopping the report. */
function row(what: string, unit: string, budget: string, build: () => Omit<ReportRow, "what" | "unit" | "budget">): ReportRow {
  try {
    return { what, unit, budget, ...build() };
  } catch (error) {
    if (!(error instanceof Missing)) throw error;
    return { what, unit, budget, figure: null, baseline: null, ratio: "—", met: null, failed: error.message };
  }
}

export function rows(dir = BENCH_DIR): ReportRow[] {
  const { bench, fig, loads } = reader(dir);
  const out: ReportRow[] = [];
  out.push(
    // In-process benchmarks are judged on process CPU time: on a shared machine their wall time mostly measures
    // the neighbours (both are in the notes and in .run/bench/).
    row("pressure-balance solve, 1,000 outlets (CPU time)", "ms", "≤ 5 ms median", () => {
      const f = stat(fig("balance", "solve_cpu_ms.1000"));
      return { figure: f, baseline: null, ratio: "—", met: f.median <= 5, note: `wall time median ${median(fig("balance", "solve_ms.1000")).toFixed(2)} ms` };
    }),
    row("pressure-balance growth, 10 → 5,000 outlets (CPU time)", "ms at 5,000", "growth ~linear (exponent ≤ 1.2 from 100 to 5,000)", () => {
      const sizes = [10, 100, 1000, 5000];
      const m = Object.fromEntries(sizes.map((n) => [n, median(fig("balance", `solve_cpu_ms.${n}`))]));
      const wall = sizes.map((n) => median(fig("balance", `solve_ms.${n}`)).toFixed(2)).join(" / ");
      const exponent = Math.log(m[5000]! / m[100]!) / Math.log(50);
      return {
        figure: stat(fig("balance", "solve_cpu_ms.5000")),
        baseline: null,
        ratio: `exponent ${exponent.toFixed(2)}`,
        met: exponent <= 1.2,
        note: `CPU medians 10 / 100 / 1,000 / 5,000 outlets: ${sizes.map((n) => m[n]!.toFixed(2)).join(" / ")} ms (wall ${wall} ms)`,
      };
    }),
  );
  const loadShape = () => {
    try {
      const r = loads()[0]!;
      return `${r.connections} connections × ${r.durationSec} s`;
    } catch {
      return "50 connections";
    }
  };
  for (const name of ["review desk loader", "GET requests", "GET drawings", "GET markups"]) {
    out.push(
      row(`${name}, ${loadShape()}, large project`, "ms p95", "p95 ≤ 25 ms; ≤ 3× the bare query", () => {
        const runs = loads().map((r) => {
          const e = r.endpoints.find((e) => e.name === name);
          if (!e?.bare) throw new Missing(`the load has no ${name} figures`);
          return e;
        });
        const f = stat(runs.map((e) => e.p95));
        const b = stat(runs.map((e) => e.bare!.p95));
        const ratio = f.median / b.median;
        const idle = median(runs.map((e) => e.idleP50));
        return { figure: f, baseline: { label: "bare SQL through pg, p95", stat: b }, ratio: x(f.median, b.median), met: f.median <= 25 && ratio <= 3, note: `one request at a time: app p50 ${idle.toFixed(1)} ms vs bare ${median(runs.map((e) => e.bare!.idleP50)).toFixed(1)} ms` };
      }),
    );
  }
  const markupCount = () => {
    try {
      return Number(bench("markups").notes?.markups ?? 2000).toLocaleString("en");
    } catch {
      return "2,000";
    }
  };
  const upMb = () => (bench("drawings").notes?.uploadMb as number | undefined) ?? "?";
  out.push(
    row("upload through the app", "MB/s", "≥ 70 % of raw throughput", () => {
      const f = stat(fig("drawings", "upload.app_mb_s"));
      const b = stat(fig("drawings", "upload.raw_mb_s"));
      return { figure: f, baseline: { label: "raw @aws-sdk/lib-storage multipart Upload, same file, same S3 fake", stat: b }, ratio: `${Math.round((f.median / b.median) * 100)} %`, met: f.median / b.median >= 0.7, note: `${upMb()} MB file` };
    }),
    row("app memory growth during that upload", "MB", "≤ 100 MB", () => {
      const f = stat(fig("drawings", "upload.rss_growth_mb"));
      return { figure: f, baseline: null, ratio: "—", met: f.median <= 100, note: "peak RSS minus RSS before the upload, sampled every 100 ms" };
    }),
    row("first visible page of an A1 sheet in the viewer (warm)", "ms", "≤ 1.1×", () => {
      const f = stat(fig("drawings", "viewer.first_page_ms"));
      const b = stat(fig("drawings", "pdfjs.first_page_ms"));
      return { figure: f, baseline: { label: "pdf.js rendering that page directly, same browser", stat: b }, ratio: x(f.median, b.median), met: f.median / b.median <= 1.1, note: `cold first load ${fig("drawings", "viewer.cold_first_page_ms")[0]} ms vs pdf.js ${fig("drawings", "pdfjs.cold_first_page_ms")[0]} ms` };
    }),
    row(`${markupCount()} markups on one page: first draw of the markup layer (warm)`, "ms", "≤ 100 ms", () => {
      const f = stat(fig("markups", "layer_draw_ms"));
      return { figure: f, baseline: null, ratio: "—", met: f.median <= 100, note: `the layer's own draw; from navigation start to that draw ${median(fig("markups", "first_draw_ms")).toFixed(0)} ms (cold first load ${fig("markups", "cold_first_draw_ms")[0]} ms)` };
    }),
    row(`${markupCount()} markups: pan at 200 %, p95 frame`, "ms", "≤ 16.7 ms", () => {
      const f = stat(fig("markups", "pan_p95_frame_ms"));
      return { figure: f, baseline: { label: "one 60 Hz frame", stat: { min: 16.7, median: 16.7, max: 16.7, runs: 1 } }, ratio: x(f.median, 16.7), met: f.median <= 16.7, note: `median frame ${median(fig("markups", "pan_median_frame_ms")).toFixed(1)} ms` };
    }),
    row("compare two A1 revisions (cold)", "ms", "diff adds ≤ 30 % (≤ 1.30×)", () => {
      const f = stat(fig("drawings", "compare.cold_ms"));
      const b = stat(fig("drawings", "compare.render_alone_ms"));
      const n = bench("drawings").notes ?? {};
      const parts = ["render", "diff", "encode"].map((k) => `${k} ${median(fig("drawings", `compare.server_${k}_ms`))}`).join(" · ");
      return { figure: f, baseline: { label: "rendering the two pages alone, same renderer and scale", stat: b }, ratio: x(f.median, b.median), met: f.median / b.median <= 1.3, note: `${n.compareDpi} dpi (${n.compareRenderPx} px); server: ${parts} ms; cached ${median(fig("drawings", "compare.cached_ms"))} ms` };
    }),
    row("stamp + sign a 50-page pack (CPU time)", "ms", "≤ 1 s", () => {
      const f = stat(fig("signing", "stamp_sign_cpu_ms"));
      const b = stat(fig("signing", "sha256_ms"));
      return { figure: f, baseline: { label: "SHA-256 of the same bytes", stat: b }, ratio: `${Math.round(f.median / b.median).toLocaleString("en")}×`, met: f.median <= 1000, note: `wall time: build + stamp ${median(fig("signing", "build_ms")).toFixed(0)} ms, sign ${median(fig("signing", "sign_ms")).toFixed(0)} ms; ${bench("signing").notes?.packMb} MB` };
    }),
    row("verify that pack", "ms", "≤ 300 ms", () => {
      const f = stat(fig("signing", "verify_ms"));
      const b = stat(fig("signing", "sha256_ms"));
      return { figure: f, baseline: { label: "SHA-256 of the same bytes", stat: b }, ratio: `${Math.round(f.median / b.median).toLocaleString("en")}×`, met: f.median <= 300 };
    }),
    row("JavaScript of the sign-in page, gzip", "KB", "≤ 100 KB", () => {
      const f = stat(fig("routes-js", "sign-in.initial_kb"));
      const counted = (bench("routes-js").notes?.["sign-in"] as { countedFrom?: string } | undefined)?.countedFrom ?? "manifest";
      const from = counted === "manifest" ? "entry, root and route chunks" : `the scripts the ${counted.replace(/^served /, "")} document names (a plain page: forms post without script)`;
      return { figure: f, baseline: null, ratio: "—", met: f.median <= 100, note: `${from}; may load later ${fig("routes-js", "sign-in.lazy_kb")[0]} KB` };
    }),
    row("JavaScript of the review desk, gzip", "KB", "≤ 400 KB without the pdf.js worker", () => {
      const f = stat(fig("routes-js", "review.initial_kb"));
      const lazy = fig("routes-js", "review.lazy_kb")[0]!;
      return { figure: f, baseline: null, ratio: "—", met: f.median + lazy <= 400, note: `entry, root, parents and route chunks; may load later ${lazy} KB (counted against the budget)` };
    }),
    row("`npm start`, everything installed, until :3000 answers", "s", "≤ 15 s", () => {
      const f = stat(fig("start", "serving_s"));
      const n = bench("start").notes ?? {};
      return { figure: f, baseline: null, ratio: "—", met: f.median <= 15, note: `first start (creates, seeds, builds) ${fig("start", "first_start_s")[0]} s${n.rebuilt ? `; ${n.rebuilt} timed start(s) had to rebuild` : ""}` };
    }),
  );
  return out;
}

export function machine() {
  const cpuinfo = existsSync("/proc/cpuinfo") ? readFileSync("/proc/cpuinfo", "utf8") : "";
  const model = cpuinfo.match(/^model name\s*:\s*(.+)$/m)?.[1]?.trim() ?? os.cpus()[0]?.model ?? "?";
  return { cores: os.cpus().length, cpu: model, node: process.version, memoryGb: Math.round(os.totalmem() / 2 ** 30), loadAverage: os.loadavg().map((l) => +l.toFixed(1)), date: new Date().toISOString().slice(0, 10) };
}

const num = (n: number) => (n >= 100 ? Math.round(n).toLocaleString("en") : n >= 10 ? n.toFixed(1) : n.toFixed(2));
const triple = (s: Stat) => (s.runs === 1 ? `${num(s.median)} (1 run)` : `${num(s.min)} / **${num(s.median)}** / ${num(s.max)}`);

export function markdown(list: ReportRow[], m: ReturnType<typeof machine>) {
  const lines = [
    `Machine: ${m.cores} cores (${m.cpu}), ${m.memoryGb} GB, Node ${m.node}, Debian Chromium, PostgreSQL and s3rver on loopback; ${m.date}.`,
    `Shared with other work while it ran (load average at the end ${m.loadAverage.join(" / ")}): treat the figures as noisy.`,
    "",
    "| what | runs | min / **median** / max | baseline in the same run (median) | ratio | budget | met |",
    "|---|---:|---|---|---|---|---|",
    ...list.map((r) =>
      r.figure
        ? `| ${r.what} | ${r.figure.runs} | ${triple(r.figure)} ${r.unit} | ${r.baseline ? `${r.baseline.label}: ${r.baseline.stat ? num(r.baseline.stat.median) : "—"}` : "—"} | ${r.ratio} | ${r.budget} | ${r.met === null ? "—" : r.met ? "yes" : "**no**"} |`
        : `| ${r.what} | — | failed | — | — | ${r.budget} | **failed** |`,
    ),
    "",
    ...list.filter((r) => r.note || r.failed).map((r) => `- ${r.what}: ${r.failed ?? r.note}`),
  ];
  return lines.join("\n");
}

const START = "<!-- bench:latest -->";
const END = "<!-- /bench:latest -->";

if (import.meta.url === `file://${process.argv[1]}`) {
  const list = rows();
  const m = machine();
  const md = markdown(list, m);
  const rerun = "Rerun: `npm run bench` (BENCH_RUNS runs each, 3 by default; the large upload and the 60 s load run BENCH_HEAVY_RUNS times, 1 by default). Raw figures per benchmark: `.run/bench/`.";
  writeFileSync(path.join(ROOT, "docs/perf/bench.md"), `# Benchmarks — latest \`npm run bench\`\n\n${md}\n\n${rerun}\n`);
  writeFileSync(path.join(ROOT, "docs/perf/bench.json"), `${JSON.stringify({ machine: m, rows: list }, null, 2)}\n`);
  console.log(md);
  if (process.argv.includes("--readme")) {
    const readme = path.join(ROOT, "README.md");
    const text = readFileSync(readme, "utf8");
    if (text.includes(START)) writeFileSync(readme, text.replace(new RegExp(`${START}[\\s\\S]*?${END}`), `${START}\n${md}\n${END}`));
    else console.error("README.md has no bench:latest markers; table not copied there");
  }
  const failed = list.filter((r) => !r.figure).length;
  if (failed) console.error(`${failed} row(s) failed`);
}
