// Runs a hostile-input corpus against the app and judges every answer: never a 5xx; a case that must be refused
// gets a 4xx whose message a person can read (not empty, no stack trace, no SQL); a case that may be stored
// (odd but legal text) gets any non-5xx answer, and if refused, the same clear message.

export type Expectation = "refuse" | "no-crash";

export interface HostileCase {
  /** What is attacked, e.g. "api:requests.create". */
  target: string;
  /** What is sent, e.g. "title=script1"; includes the fast-check seed for generated values. */
  name: string;
  expect: Expectation;
  send: () => Promise<Response>;
}

export interface CaseResult {
  target: string;
  name: string;
  status: number;
  problem?: string;
  ms: number;
}

export interface CorpusReport {
  total: number;
  refuseCases: number;
  serverErrors: CaseResult[];
  problems: CaseResult[];
  byStatus: Record<number, number>;
  byTarget: Record<string, number>;
  /** Time spent per target (summed over concurrent workers), to see where a run's time goes. */
  msByTarget: Record<string, number>;
  ms: number;
}

const STACK = /\n\s+at [\w$.<> ]+[( ]|node_modules\/|\/app\/[\w/.-]+\.tsx?:\d+|\bat async\b|TypeError:|ReferenceError:|RangeError:/;
const SQL = /Sequelize\w*Error|syntax error at or near|invalid input syntax for|violates [\w ]*constraint|relation "|column "[\w]+" (does not exist|of relation)|unsupported Unicode escape|invalid byte sequence|pg_catalog|INSERT INTO "|SELECT "/;

/** The message a person would see in the answer: JSON `message`/`detail`, or the page's text. */
function messageOf(text: string, type: string): string {
  if (type.includes("json")) {
    try {
      const body = JSON.parse(text) as { message?: unknown; detail?: unknown; error?: unknown };
      const m = body.message ?? body.detail ?? body.error;
      return typeof m === "string" ? m : "";
    } catch {
      return "";
    }
  }
  // An HTML page (error boundary or a form with its messages): its visible text.
  return text
    .replace(/<script[\s\S]*?<\/script>/gi, " ")
    .replace(/<style[\s\S]*?<\/style>/gi, " ")
    .replace(/<[^>]+>/g, " ")
    .replace(/\s+/g, " ")
    .trim();
}

export function judge(c: Pick<HostileCase, "expect">, status: number, text: string, type: string): string | undefined {
  if (status >= 500) return `server error ${status}: ${text.slice(0, 300)}`;
  if (c.expect === "refuse" && (status < 400 || status >= 500)) return `accepted (${status}) though it must be refused: ${text.slice(0, 200)}`;
  if (status >= 400) {
    const message = messageOf(text, type);
    if (message.length < 8) return `refused (${status}) without a readable message: ${text.slice(0, 200)}`;
    // The visible message only: the page may echo back the hostile text the case sent.
    const visible = type.includes("json") ? message : text.replace(/<script[\s\S]*?<\/script>/gi, "");
    if (STACK.test(visible)) return `refused (${status}) with a stack trace: ${visible.match(STACK)![0]}`;
    if (SQL.test(visible)) return `refused (${status}) with database text: ${visible.match(SQL)![0]}`;
  }
  return undefined;
}

/** Runs cases a few at a time (the machine is small and shared) and gathers what went wrong. */
export async function runCorpus(cases: HostileCase[], concurrency = 4): Promise<CorpusReport> {
  const started = Date.now();
  const results: CaseResult[] = [];
  let next = 0;
  async function worker() {
    for (;;) {
      const c = cases[next++];
      if (!c) return;
      let status = 0;
      let problem: string | undefined;
      const t0 = Date.now();
      try {
        const res = await c.send();
        status = res.status;
        const text = await res.text();
        problem = judge(c, status, text, res.headers.get("content-type") ?? "");
      } catch (error) {
        problem = `request failed: ${(error as Error).message}`;
      }
      results.push({ target: c.target, name: c.name, status, problem, ms: Date.now() - t0 });
    }
  }
  await Promise.all(Array.from({ length: concurrency }, worker));
  const byStatus: Record<number, number> = {};
  const byTarget: Record<string, number> = {};
  const msByTarget: Record<string, number> = {};
  for (const r of results) {
    byStatus[r.status] = (byStatus[r.status] ?? 0) + 1;
    byTarget[r.target] = (byTarget[r.target] ?? 0) + 1;
    msByTarget[r.target] = (msByTarget[r.target] ?? 0) + r.ms;
  }
  return {
    total: results.length,
    refuseCases: cases.filter((c) => c.expect === "refuse").length,
    serverErrors: results.filter((r) => r.status >= 500 || r.status === 0),
    problems: results.filter((r) => r.problem),
    byStatus,
    byTarget,
    msByTarget,
    ms: Date.now() - started,
  };
}

export function describeReport(r: CorpusReport) {
  const lines = [
    `hostile corpus: ${r.total} cases (${r.refuseCases} must be refused), ${r.serverErrors.length} server errors, ${r.problems.length} problems, ${(r.ms / 1000).toFixed(1)} s`,
    `  by status: ${Object.entries(r.byStatus).map(([s, n]) => `${s}×${n}`).join(" ")}`,
    `  by target: ${Object.entries(r.byTarget).map(([t, n]) => `${t}×${n} (${((r.msByTarget[t] ?? 0) / 1000).toFixed(1)} s)`).join(" ")}`,
  ];
  for (const p of r.problems.slice(0, 60)) lines.push(`  ✗ ${p.target} ${p.name}: ${p.problem}`);
  if (r.problems.length > 60) lines.push(`  … and ${r.problems.length - 60} more`);
  return lines.join("\n");
}
