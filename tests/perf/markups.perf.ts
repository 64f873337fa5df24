// Figures for docs/perf/markups.md: 2,000 markups on one A1 sheet in Chromium — first draw of the markup layer
// (from navigation start) and frame times while panning the sheet at 200 %. Needs the app running for its slot:
//   TEST_SLOT=6 bash storage/stack.sh up test
//   (export TEST_SLOT=6; source storage/profile.sh test; npx tsx tests/perf/markups.perf.ts)
// One cold load (scripts and chunks not cached) is reported apart, then BENCH_RUNS warm loads and BENCH_RUNS pan
// passes of 240 frames; with BENCH_DIR set the figures go to tests/perf/report.ts.
import { chromium } from "@playwright/test";
import { DeviationRequest, Markup, sequelize } from "../../db/models";
import type { MarkupShape } from "../../app/review/markups";
import { A1_LANDSCAPE, makeSheet, upload } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { api, CONTENT } from "../support/requests";
import { benchRuns, writeBench } from "./bench-out";

const N = Number(process.env.BENCH_MARKUPS ?? 2000);
const APP_URL = process.env.APP_URL!;
const pct = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor((p / 100) * xs.length))]!;

async function main() {
  const team = await makeProjectTeam();
  const architect = new Client();
  const plumber = new Client();
  await architect.signIn(team.users.architect.email, PASSWORD);
  await plumber.signIn(team.users.site_plumber.email, PASSWORD);
  const up = await upload(architect, team.project.id, await makeSheet({ size: A1_LANDSCAPE, tag: "perf" }), { sheetNumber: "PERF-1", title: "Bench", scaleText: "1:50" });
  const revisionId = up.body.stored[0].revisionId as string;
  const created = await api(plumber, "POST", `/api/projects/${team.project.id}/requests`, CONTENT);
  const id = created.body.request.id as string;
  const current = (await DeviationRequest.findByPk(id))!;
  await api(plumber, "POST", `/api/projects/${team.project.id}/requests/${id}/transitions`, { action: "submit", lockVersion: current.lockVersion });
  const kinds: MarkupShape["kind"][] = ["cloud", "rectangle", "ellipse", "arrow", "line", "freehand", "polyline", "measure"];
  const [W, H] = A1_LANDSCAPE;
  const rows = Array.from({ length: N }, (_, i) => {
    const kind = kinds[i % kinds.length]!;
    const x = 20 + ((i * 97) % (W - 200));
    const y = 20 + ((i * 61) % (H - 200));
    const points = kind === "freehand" || kind === "polyline" ? Array.from({ length: 20 }, (_, k) => (k % 2 ? y + Math.sin(k) * 30 + 30 : x + k * 6)) : [x, y, x + 60 + (i % 90), y + 40 + (i % 50)];
    const shape: MarkupShape = { kind, points, color: "#9a4a20", strokeWidthPt: 1.5, ...(kind === "measure" || kind === "polyline" ? { text: "1.20 m" } : {}) };
    return { projectId: team.project.id, requestId: id, revisionId, page: 1, kind, shape, authorId: team.users.engineer.id };
  });
  await Markup.bulkCreate(rows);

  const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"] });
  const context = await browser.newContext({ viewport: { width: 1600, height: 1000 }, baseURL: APP_URL });
  const page = await context.newPage();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail address").fill(team.users.engineer.email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
  const firstDraws: number[] = [];
  const layerDraws: number[] = [];
  const runs = benchRuns();
  for (let run = 0; run <= runs; run++) {
    await page.goto(`/projects/${team.project.id}/requests/${id}/sheet`);
    await page.waitForFunction(() => document.querySelector<HTMLElement>("[data-testid=sheet-scroller]")?.dataset.drawnAt, null, { timeout: 60_000 });
    firstDraws.push(Number(await page.getByTestId("sheet-scroller").getAttribute("data-drawn-at")));
    layerDraws.push(Number(await page.getByTestId("sheet-scroller").getAttribute("data-draw-ms")));
  }
  await page.getByLabel("Zoom").selectOption("2");
  await page.waitForTimeout(1500);
  const pan = () =>
    page.evaluate(async () => {
      const el = document.querySelector<HTMLElement>("[data-testid=sheet-scroller]")!;
      const out: number[] = [];
      let last = performance.now();
      for (let i = 0; i < 240; i++) {
        await new Promise((r) => requestAnimationFrame(r));
        const now = performance.now();
        out.push(now - last);
        last = now;
        el.scrollBy(i % 120 < 60 ? 25 : -25, i % 120 < 60 ? 12 : -12);
      }
      return out.slice(5);
    });
  const passes: number[][] = [];
  for (let run = 0; run < runs; run++) passes.push(await pan());
  const frames = passes.flat();
  const result = { markups: N, firstDrawMs: firstDraws.map(Math.round), medianFrameMs: +pct(frames, 50).toFixed(1), p95FrameMs: +pct(frames, 95).toFixed(1), maxFrameMs: +Math.max(...frames).toFixed(1) };
  console.log(JSON.stringify(result));
  writeBench(
    "markups",
    {
      "first_draw_ms": firstDraws.slice(1).map(Math.round),
      "layer_draw_ms": layerDraws.slice(1).map((v) => +v.toFixed(1)),
      "cold_first_draw_ms": firstDraws.slice(0, 1).map(Math.round),
      "pan_p95_frame_ms": passes.map((f) => +pct(f, 95).toFixed(1)),
      "pan_median_frame_ms": passes.map((f) => +pct(f, 50).toFixed(1)),
    },
    { markups: N, framesPerPass: passes[0]?.length },
  );
  await browser.close();
  await sequelize.close();
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
