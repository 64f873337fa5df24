// Load on the main pages and API reads of one (large) project, signed in, beside a bare-SQL baseline.
//
//   runLoad({ baseUrl, cookie, connections = 50, durationSec = 60, target?, databaseUrl? }) → Promise<LoadResults>
//
// Two runs of durationSec each, `connections` shared out between the endpoints of the run (mixed traffic, as a busy
// project sees it): first what carries the budget — the review desk's loader (its data request, as the browser
// makes it on navigation) and the main API reads — then the whole pages, documents rendered on the server, which
// are reported beside it. Every response time is kept, so p50/p95/p99 are exact. After each run, unless
// databaseUrl is null, the same rows each endpoint reads are fetched by bare SQL through node-postgres on the same
// database, by a pool of `connections` clients shared out the same way, for the same duration: `ratioP95` = app
// p95 / bare p95.
// `target` (project, request in review, a revision it has markups on, the signed-in user) is found through the
// API when not given (the caller's project with the most requests).
//
// LoadResults (also what docs/perf/load.json holds):
//   { at, baseUrl, connections, durationSec, target,
//     endpoints: [{ name, path, requests, rps, idleP50, errors, non2xx, timeouts, p50, p95, p99,
//                   bare: { runs, idleP50, p50, p95, p99 } | null,
//                   ratioP95: number | null, withinBudget: boolean | null }],
//     total: { requests, errors, non2xx, timeouts, p50, p95, p99, bare, ratioP95 },
//     budget: { p95Ms: 25, ratio: 3 } }
// idleP50: the median of ten requests made one at a time before the load (what the endpoint itself costs); under
// load a closed loop of N connections waits about N / throughput, so p95 there is mostly queueing.
// Times in milliseconds. `errors` counts socket errors and timeouts; `non2xx` anything but a 2xx (a redirect to
// sign-in included). Both must be zero.
//
// As a script, from a running slot (storage/profile.sh test sets APP_URL and DATABASE_URL):
//   npx tsx tests/load/load.ts [tiny|full] [--seeded file.json] [--write]   — seeds a project of that size (or
//   takes one seeded before), signs in as its engineer, runs the load (LOAD_CONNECTIONS, LOAD_DURATION; default 50 and 60, tiny 5 and 2) and with --write puts the
//   figures in docs/perf/load.json and the generated part of docs/perf/load.md; --out <file> writes the LoadResults
//   there instead (what npm run bench does, one file per run).
import autocannon from "autocannon";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import os from "node:os";
import pg from "pg";
import { bareQueries } from "./bare-queries";
import type { SeededProject } from "./seed-large";

export const BUDGET = { p95Ms: 25, ratio: 3 };

export interface LoadTarget {
  projectId: string;
  requestId: string;
  revisionId: string;
  userId: string;
}

export interface LoadOptions {
  baseUrl: string;
  cookie: string;
  connections?: number;
  durationSec?: number;
  target?: LoadTarget;
  /** The app's database, for the bare-SQL baseline; null skips it. Defaults to DATABASE_URL. */
  databaseUrl?: string | null;
}

export interface Percentiles {
  p50: number;
  p95: number;
  p99: number;
}

export interface EndpointResult extends Percentiles {
  name: string;
  path: string;
  requests: number;
  /** Requests per second over the run. */
  rps: number;
  /** Median of requests made one at a time before the load (the endpoint's own cost, no queueing). */
  idleP50: number;
  errors: number;
  non2xx: number;
  timeouts: number;
  bare: (Percentiles & { runs: number; idleP50: number }) | null;
  ratioP95: number | null;
  withinBudget: boolean | null;
}

export interface LoadResults {
  at: string;
  baseUrl: string;
  connections: number;
  durationSec: number;
  target: LoadTarget;
  endpoints: EndpointResult[];
  total: Omit<EndpointResult, "name" | "path" | "withinBudget" | "idleP50"> & { idleP50?: number };
  budget: typeof BUDGET;
  machine: string;
}

export interface Endpoint {
  name: string;
  path: string;
  /** The review loader and the main API reads carry the latency budget (and are loaded together); the pages are reported. */
  budgeted: boolean;
  /** The bare-SQL statements it is compared with (bareQueries), when not its own name. */
  bareAs?: string;
}

export function endpoints(t: LoadTarget): Endpoint[] {
  const p = `/projects/${t.projectId}`;
  const api = `/api/projects/${t.projectId}`;
  return [
    { name: "review desk loader", path: `${p}/requests/${t.requestId}/review.data`, budgeted: true, bareAs: "review desk" },
    { name: "GET requests", path: `${api}/requests`, budgeted: true },
    { name: "GET drawings", path: `${api}/drawings`, budgeted: true },
    { name: "GET markups", path: `${api}/requests/${t.requestId}/markups`, budgeted: true },
    { name: "project page", path: p, budgeted: false },
    { name: "drawings register", path: `${p}/drawings`, budgeted: false },
    { name: "requests list", path: `${p}/requests`, budgeted: false },
    { name: "review desk page", path: `${p}/requests/${t.requestId}/review`, budgeted: false, bareAs: "review desk" },
    { name: "request sheet", path: `${p}/requests/${t.requestId}/sheet?rev=${t.revisionId}`, budgeted: false },
  ];
}

export function percentiles(xs: number[]): Percentiles {
  if (!xs.length) return { p50: 0, p95: 0, p99: 0 };
  const s = Float64Array.from(xs).sort();
  const at = (q: number) => Math.round(s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)]! * 10) / 10;
  return { p50: at(0.5), p95: at(0.95), p99: at(0.99) };
}

const IDLE_RUNS = 10;
const acceptFor = (e: Endpoint) => (e.path.startsWith("/api/") ? "application/json" : e.path.includes(".data") ? "*/*" : "text/html");

/** `n` connections shared out over `k` endpoints, none left without one. */
function shares(n: number, k: number) {
  return Array.from({ length: k }, (_, i) => Math.max(1, Math.floor(n / k) + (i < n % k ? 1 : 0)));
}

async function getJson(baseUrl: string, cookie: string, path: string) {
  const res = await fetch(new URL(path, baseUrl), { headers: { cookie, accept: "application/json" }, redirect: "manual" });
  if (res.status !== 200) throw new Error(`GET ${path} answered ${res.status}; is the cookie a signed-in session?`);
  return res.json() as Promise<any>;
}

/** The caller's busiest project, a request in review in it with markups, and a revision they lie on. */
export async function findTarget(baseUrl: string, cookie: string): Promise<LoadTarget> {
  const me = (await getJson(baseUrl, cookie, "/api/me")).user;
  const { projects } = await getJson(baseUrl, cookie, "/api/projects");
  let best: { projectId: string; total: number; rows: { id: string; state: string }[] } | null = null;
  for (const p of projects as { id: string }[]) {
    const list = await getJson(baseUrl, cookie, `/api/projects/${p.id}/requests?state=in_review`);
    if (!best || list.total > best.total) best = { projectId: p.id, total: list.total, rows: list.rows };
  }
  for (const r of best?.rows ?? []) {
    const { markups } = await getJson(baseUrl, cookie, `/api/projects/${best!.projectId}/requests/${r.id}/markups`);
    if (markups.length) return { projectId: best!.projectId, requestId: r.id, revisionId: markups[0].revisionId, userId: me.id };
  }
  throw new Error("None of the caller's projects has a request in review with markups; seed one with tests/load/seed-large.ts.");
}

async function loadApp(baseUrl: string, cookie: string, list: Endpoint[], connections: number, durationSec: number) {
  const split = shares(connections, list.length);
  return Promise.all(
    list.map(async (e, i) => {
      const times: number[] = [];
      const instance = autocannon({
        url: new URL(e.path, baseUrl).href,
        connections: split[i],
        duration: durationSec,
        timeout: 30,
        headers: { cookie, accept: acceptFor(e) },
      });
      instance.on("response", (_client: unknown, _status: number, _bytes: number, ms: number) => times.push(ms));
      const r = await instance;
      return { requests: r.requests.total, errors: r.errors, timeouts: r.timeouts, non2xx: r.non2xx, times };
    }),
  );
}

async function loadBare(databaseUrl: string, target: LoadTarget, list: Endpoint[], connections: number, durationSec: number, rowsOf: Map<string, number>) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: connections });
  const queries = bareQueries(target, rowsOf);
  const split = shares(connections, list.length);
  try {
    // One at a time first (which also fails loudly on a broken query rather than timing nothing).
    const idle = new Map<string, number>();
    for (const e of list) {
      const times: number[] = [];
      for (let i = 0; i < IDLE_RUNS; i++) {
        const t0 = performance.now();
        for (const q of queries[e.bareAs ?? e.name]!) await pool.query(q.sql, q.params);
        times.push(performance.now() - t0);
      }
      idle.set(e.name, percentiles(times).p50);
    }
    const until = performance.now() + durationSec * 1000;
    return await Promise.all(
      list.map(async (e, i) => {
        const times: number[] = [];
        await Promise.all(
          Array.from({ length: split[i]! }, async () => {
            while (performance.now() < until) {
              const t0 = performance.now();
              for (const q of queries[e.bareAs ?? e.name]!) await pool.query(q.sql, q.params);
              times.push(performance.now() - t0);
            }
          }),
        );
        return { times, idleP50: idle.get(e.name)! };
      }),
    );
  } finally {
    await pool.end();
  }
}

export async function runLoad(options: LoadOptions): Promise<LoadResults> {
  const { baseUrl, cookie, connections = 50, durationSec = 60 } = options;
  const databaseUrl = options.databaseUrl === undefined ? process.env.DATABASE_URL ?? null : options.databaseUrl;
  const target = options.target ?? (await findTarget(baseUrl, cookie));
  const list = endpoints(target);
  // Warm up, check that every endpoint answers 200 signed in, and note how many requests the list returns (the
  // bare baseline fetches as many).
  const rowsOf = new Map<string, number>();
  const idle = new Map<string, number>();
  for (const e of list) {
    const times: number[] = [];
    for (let i = 0; i < 3 + IDLE_RUNS; i++) {
      const t0 = performance.now();
      const res = await fetch(new URL(e.path, baseUrl), { headers: { cookie, accept: acceptFor(e) }, redirect: "manual" });
      const body = await res.text();
      if (i >= 3) times.push(performance.now() - t0);
      if (res.status !== 200) throw new Error(`${e.name} (${e.path}) answered ${res.status} before the load began.`);
      if (e.name === "GET requests") rowsOf.set("requests", (JSON.parse(body) as { rows: unknown[] }).rows.length);
    }
    idle.set(e.name, percentiles(times).p50);
  }
  // The budgeted endpoints are loaded together, then the pages; each run followed by its bare-SQL baseline.
  const groups = [list.filter((e) => e.budgeted), list.filter((e) => !e.budgeted)];
  const loaded = groups.flat();
  const app: Awaited<ReturnType<typeof loadApp>> = [];
  const bare: Awaited<ReturnType<typeof loadBare>> | null = databaseUrl ? [] : null;
  for (const group of groups) {
    app.push(...(await loadApp(baseUrl, cookie, group, connections, durationSec)));
    if (bare) bare.push(...(await loadBare(databaseUrl!, target, group, connections, durationSec, rowsOf)));
  }
  const ratio = (a: number, b: number | undefined) => (b ? Math.round((a / b) * 10) / 10 : null);
  const rows: EndpointResult[] = loaded.map((e, i) => {
    const a = app[i]!;
    const pa = percentiles(a.times);
    const b = bare ? { runs: bare[i]!.times.length, idleP50: bare[i]!.idleP50, ...percentiles(bare[i]!.times) } : null;
    const r = ratio(pa.p95, b?.p95);
    return {
      name: e.name,
      path: e.path,
      requests: a.requests,
      rps: Math.round((a.requests / durationSec) * 10) / 10,
      idleP50: idle.get(e.name)!,
      errors: a.errors,
      non2xx: a.non2xx,
      timeouts: a.timeouts,
      ...pa,
      bare: b,
      ratioP95: r,
      withinBudget: e.budgeted && r !== null ? pa.p95 <= BUDGET.p95Ms && r <= BUDGET.ratio : null,
    };
  });
  const all = percentiles(app.flatMap((a) => a.times));
  const allBare = bare ? { runs: bare.reduce((n, t) => n + t.times.length, 0), idleP50: 0, ...percentiles(bare.flatMap((t) => t.times)) } : null;
  const sum = (k: "requests" | "errors" | "non2xx" | "timeouts") => rows.reduce((n, r) => n + r[k], 0);
  return {
    at: new Date().toISOString(),
    baseUrl,
    connections,
    durationSec,
    target,
    endpoints: rows,
    total: { requests: sum("requests"), rps: Math.round((sum("requests") / durationSec) * 10) / 10, errors: sum("errors"), non2xx: sum("non2xx"), timeouts: sum("timeouts"), ...all, bare: allBare, ratioP95: ratio(all.p95, allBare?.p95) },
    budget: BUDGET,
    machine: `${os.cpus().length} cores (${os.cpus()[0]?.model.trim() ?? "?"}), shared; Node ${process.version}; app, PostgreSQL and load generator on one box`,
  };
}

export function markdownTable(r: LoadResults): string {
  const ms = (x: number | undefined) => (x === undefined ? "—" : x.toFixed(1));
  const line = (name: string, x: LoadResults["total"] & { withinBudget?: boolean | null }) =>
    `| ${name} | ${x.requests} | ${x.rps} | ${x.errors + x.non2xx + x.timeouts} | ${ms(x.idleP50)} / ${x.bare?.idleP50 ? ms(x.bare.idleP50) : "—"} | ${ms(x.p50)} | ${ms(x.p95)} | ${ms(x.p99)} | ${ms(x.bare?.p95)} | ${x.ratioP95 ?? "—"} | ${x.withinBudget === undefined || x.withinBudget === null ? "—" : x.withinBudget ? "yes" : "**no**"} |`;
  return [
    `${r.connections} connections for ${r.durationSec} s, all endpoints at once (${r.at}). ${r.machine}.`,
    "",
    "| endpoint | requests | req/s | errors | one at a time p50 ms, app / bare | p50 ms | p95 ms | p99 ms | bare SQL p95 ms | app/bare p95 | budget met |",
    "|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|---|",
    ...r.endpoints.map((e) => line(e.name, e)),
    line("**total**", r.total),
  ].join("\n");
}

const START = "<!-- load:latest -->";
const END = "<!-- /load:latest -->";

/** Writes docs/perf/load.json and the generated section of docs/perf/load.md (the rest of that file is kept). */
export function writeDocs(r: LoadResults, root = new URL("../../", import.meta.url)) {
  writeFileSync(new URL("docs/perf/load.json", root), `${JSON.stringify(r, null, 2)}\n`);
  const mdUrl = new URL("docs/perf/load.md", root);
  const section = `${START}\n${markdownTable(r)}\n${END}`;
  const md = existsSync(mdUrl) ? readFileSync(mdUrl, "utf8") : `# Load on a large project\n\n${START}\n${END}\n`;
  writeFileSync(mdUrl, md.includes(START) ? md.replace(new RegExp(`${START}[\\s\\S]*?${END}`), section) : `${md}\n${section}\n`);
}

/** Signs in as the seeded project's engineer and loads it. */
export async function loadSeeded(seeded: SeededProject, options: { baseUrl: string; connections?: number; durationSec?: number }) {
  const { Client } = await import("../support/http");
  const client = new Client(options.baseUrl);
  await client.signIn(seeded.users.engineer.email, seeded.password);
  return runLoad({
    baseUrl: options.baseUrl,
    cookie: client.cookieHeader(),
    connections: options.connections,
    durationSec: options.durationSec,
    target: { projectId: seeded.projectId, requestId: seeded.requestId, revisionId: seeded.revisionId, userId: seeded.users.engineer.id },
  });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const size = process.argv[2] === "full" ? "full" : "tiny";
  const tiny = size === "tiny";
  // --seeded <file>: load a project seeded before (the JSON the seeder printed) instead of seeding a new one.
  const from = process.argv.indexOf("--seeded");
  const seeded: SeededProject = from > 0 ? JSON.parse(readFileSync(process.argv[from + 1]!, "utf8")) : await (await import("./seed-large")).seedLarge(size);
  const results = await loadSeeded(seeded, {
    baseUrl: process.env.APP_URL ?? "http://127.0.0.1:3100",
    connections: Number(process.env.LOAD_CONNECTIONS ?? (tiny ? 5 : 50)),
    durationSec: Number(process.env.LOAD_DURATION ?? (tiny ? 2 : 60)),
  });
  console.log(`project: ${JSON.stringify(seeded.counts)}${from > 0 ? "" : ` (seeded in ${seeded.seconds} s)`}`);
  console.log(markdownTable(results));
  if (process.argv.includes("--write")) writeDocs(results);
  const out = process.argv.indexOf("--out");
  if (out > 0) writeFileSync(process.argv[out + 1]!, `${JSON.stringify(results, null, 2)}\n`);
  const { sequelize } = await import("../../db/models");
  await sequelize.close();
  const bad = results.total.errors + results.total.non2xx + results.total.timeouts;
  if (bad) {
    console.error(`${bad} failed responses`);
    process.exitCode = 1;
  }
}
