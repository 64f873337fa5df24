// The benchmark harness still works (npm run bench is too slow for npm test, and no time is asserted here): the
// report turns a run's figures into rows with baselines, ratios and verdicts, marks a benchmark that left
// nothing as failed without losing the others, and the JavaScript-per-route count reads the build this test
// stack serves.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { markdown, machine, rows } from "../perf/report";
import { documentScripts, ROUTES, routeJs, SERVED_PATHS } from "../perf/routes-js";

const dir = mkdtempSync(path.join(tmpdir(), "cs-bench-report-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const put = (name: string, figures: Record<string, number[]>, notes: Record<string, unknown> = {}) =>
  writeFileSync(path.join(dir, `${name}.json`), JSON.stringify({ name, at: "", figures, notes }));

describe("npm run bench, at toy size", () => {
  it("reports min / median / max, the baseline and the verdict, and 'failed' where a benchmark left nothing", () => {
    const solve = { "10": [0.1], "100": [1], "1000": [4, 6, 5], "5000": [50] };
    put("balance", Object.fromEntries(Object.entries(solve).flatMap(([n, xs]) => [[`solve_ms.${n}`, xs.map((x) => x * 2)], [`solve_cpu_ms.${n}`, xs]])));
    put("signing", { stamp_sign_ms: [2000], stamp_sign_cpu_ms: [900, 1200, 1100], build_ms: [800], sign_ms: [300], verify_ms: [20], sha256_ms: [0.5] }, { packMb: 0.5 });
    const list = rows(dir);
    const solveRow = list.find((r) => r.what.startsWith("pressure-balance solve"))!;
    expect(solveRow.figure).toEqual({ min: 4, median: 5, max: 6, runs: 3 });
    expect(solveRow.met).toBe(true);
    const growth = list.find((r) => r.what.startsWith("pressure-balance growth"))!;
    expect(growth.ratio).toBe("exponent 1.00");
    const sign = list.find((r) => r.what.startsWith("stamp + sign"))!;
    expect(sign).toMatchObject({ met: false, ratio: "2,200×" });
    expect(sign.baseline?.stat?.median).toBe(0.5);
    const upload = list.find((r) => r.what.startsWith("upload through the app"))!;
    expect(upload).toMatchObject({ figure: null, met: null });
    expect(upload.failed).toMatch(/drawings wrote no figures/);
    const md = markdown(list, machine());
    expect(md).toContain("| upload through the app | — | failed |");
    expect(md).toContain("4.00 / **5.00** / 6.00 ms");
  });

  it("counts the gzip JavaScript of the sign-in page and the review desk in the served build", () => {
    const build = process.env.COUNTERSIGN_BUILD_DIR ?? "build";
    for (const id of Object.values(ROUTES)) {
      const r = routeJs(build, id);
      expect(r.initialKb).toBeGreaterThan(10);
      expect(r.initialFiles).toBeGreaterThan(3);
    }
  });

  it("counts a page from the scripts its served document names: none on the plain sign-in pages, the whole entry elsewhere", async () => {
    const build = process.env.COUNTERSIGN_BUILD_DIR ?? "build";
    const served = async (at: string) => (await fetch(new URL(at, process.env.APP_URL))).text();
    for (const at of [SERVED_PATHS["sign-in"]!, "/sign-up", "/reset-password"]) {
      const html = await served(at);
      expect(html, at).toContain("<form");
      expect(html, at).not.toMatch(/<script/);
      expect(routeJs(build, ROUTES["sign-in"], documentScripts(html)).initialKb, at).toBe(0);
    }
    // The landing page hydrates as before: its document names the entry and the route modules that the manifest lists.
    const landing = documentScripts(await served("/"));
    expect(landing.some((u) => /entry\.client/.test(u))).toBe(true);
    expect(routeJs(build, "routes/_index", landing).initialKb).toBeGreaterThan(50);
  });
});
