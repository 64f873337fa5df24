// Figures for docs/perf/drawings.md (run by tests/perf/run.sh, which starts the app for it):
//  1. a large upload through the app vs a raw @aws-sdk/lib-storage multipart Upload of the same file to the same
//     S3 fake, and the app's memory meanwhile (BENCH_UPLOAD_RUNS times, 1 by default: each writes and sends a
//     fresh file of BENCH_UPLOAD_MB);
//  2. first visible page of an A1 sheet in the viewer vs pdf.js rendering the same page directly (one cold load
//     each, not counted, then BENCH_RUNS warm ones);
//  3. compare of two A1 pages, cold, vs rendering the same two pages alone with the same renderer at the same
//     scale (BENCH_RUNS fresh pairs, since a pair once compared is cached), and the cached second look.
// BENCH_PARTS=upload,viewer,compare picks parts; with BENCH_DIR set the figures go to tests/perf/report.ts.
import { createReadStream, createWriteStream, readFileSync, statSync } from "node:fs";
import { createRequire } from "node:module";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { finished } from "node:stream/promises";
import { DeleteObjectCommand } from "@aws-sdk/client-s3";
import { Upload } from "@aws-sdk/lib-storage";
import { chromium } from "@playwright/test";
import { PDFDocument, rgb, StandardFonts } from "pdf-lib";
import { COMPARE_DPI, COMPARE_MAX_PX } from "../../app/drawings/compare.server";
import { fileSource, openPdf, renderPage } from "../../app/drawings/pdf.server";
import { s3 } from "../../app/platform/storage.server";
import { DrawingRevision, sequelize } from "../../db/models";
import { A1_LANDSCAPE, until, upload } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { benchRuns, writeBench } from "./bench-out";

const require = createRequire(import.meta.url);
const APP_URL = process.env.APP_URL!;
const APP_PID = Number(process.env.APP_PID);
const MB = 1024 * 1024;
const uploadMb = Number(process.env.BENCH_UPLOAD_MB ?? 500);
const results: Record<string, unknown> = {};
const runs = benchRuns();
const uploadRuns = Math.max(1, Number(process.env.BENCH_UPLOAD_RUNS ?? 1));
const parts = new Set((process.env.BENCH_PARTS ?? "upload,viewer,compare").split(","));
const figures: Record<string, number[]> = {};
const keep = (k: string, v: number) => (figures[k] ??= []).push(v);
const log = (k: string, v: unknown) => {
  results[k] = v;
  console.log(k.padEnd(44), typeof v === "object" ? JSON.stringify(v) : v);
};

/** A valid one-page PDF of about `bytes`, written by hand and streamed (the filler is an unused stream object). */
async function writeBigPdf(file: string, bytes: number) {
  const out = createWriteStream(file);
  let at = 0;
  const offsets: number[] = [];
  const w = (s: string | Buffer) => {
    at += typeof s === "string" ? Buffer.byteLength(s) : s.length;
    return out.write(s) ? Promise.resolve() : new Promise<void>((r) => out.once("drain", () => r()));
  };
  await w("%PDF-1.7\n%\xE2\xE3\xCF\xD3\n");
  const content = "0 0 0 RG 4 w 100 100 2184 1484 re S BT /F1 48 Tf 150 1500 Td (Large upload benchmark) Tj ET";
  const objs = [
    "<< /Type /Catalog /Pages 2 0 R >>",
    "<< /Type /Pages /Kids [3 0 R] /Count 1 >>",
    `<< /Type /Page /Parent 2 0 R /MediaBox [0 0 ${A1_LANDSCAPE[0]} ${A1_LANDSCAPE[1]}] /Contents 4 0 R /Resources << /Font << /F1 << /Type /Font /Subtype /Type1 /BaseFont /Helvetica >> >> >> >>`,
    `<< /Length ${content.length} >>\nstream\n${content}\nendstream`,
  ];
  for (let i = 0; i < objs.length; i++) {
    offsets.push(at);
    await w(`${i + 1} 0 obj\n${objs[i]}\nendobj\n`);
  }
  const filler = bytes - at - 400;
  offsets.push(at);
  await w(`5 0 obj\n<< /Length ${filler} >>\nstream\n`);
  const chunk = Buffer.alloc(4 * MB);
  let seed = Date.now() >>> 0;
  for (let left = filler; left > 0; left -= chunk.length) {
    for (let i = 0; i < chunk.length; i += 4) chunk.writeUInt32LE((seed = (seed * 1664525 + 1013904223) >>> 0), i);
    await w(left >= chunk.length ? chunk : chunk.subarray(0, left));
  }
  await w("\nendstream\nendobj\n");
  const xref = at;
  await w(`xref\n0 6\n0000000000 65535 f \n${offsets.map((o) => `${String(o).padStart(10, "0")} 00000 n \n`).join("")}trailer\n<< /Size 6 /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`);
  out.end();
  await finished(out);
}

const rssKb = (pid: number) => Number(readFileSync(`/proc/${pid}/status`, "utf8").match(/VmRSS:\s+(\d+)/)![1]);

/** The app's resident memory in MB: the launcher and every server process it started (storage/serve.mjs). */
function rssMb(pid: number) {
  try {
    const children = readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean).map(Number);
    let kb = rssKb(pid);
    for (const child of children) {
      try {
        kb += rssKb(child);
      } catch {
        // Gone since it was listed.
      }
    }
    return Math.round(kb / 1024);
  } catch {
    return NaN;
  }
}

async function streamUpload(client: Client, projectId: string, file: string, sheetNumber: string) {
  const boundary = "----countersign-bench";
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="sheetNumber"\r\n\r\n${sheetNumber}\r\n--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.pdf"\r\nContent-Type: application/pdf\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const size = statSync(file).size;
  const body = new ReadableStream<Uint8Array>({
    async start(c) {
      c.enqueue(head);
      for await (const chunk of createReadStream(file, { highWaterMark: MB })) c.enqueue(chunk as Buffer);
      c.enqueue(tail);
      c.close();
    },
  });
  const res = await client.request(`/projects/${projectId}/drawings/upload`, {
    method: "POST",
    body,
    headers: { "content-type": `multipart/form-data; boundary=${boundary}`, "content-length": String(head.length + size + tail.length), accept: "application/json" },
    duplex: "half",
  } as RequestInit);
  return { status: res.status, body: await res.json() };
}

/** A heavy A1 sheet: a grid of pipe runs, fittings and labels, like a services layout. */
async function heavyA1(seed: number, extra = false) {
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const page = doc.addPage(A1_LANDSCAPE);
  let s = seed;
  const rnd = () => ((s = (s * 1103515245 + 12345) >>> 0) / 2 ** 32);
  for (let i = 0; i < 4000; i++) {
    const x = 60 + rnd() * 2200, y = 60 + rnd() * 1500;
    page.drawLine({ start: { x, y }, end: { x: x + (rnd() - 0.5) * 200, y: y + (rnd() - 0.5) * 200 }, thickness: 0.5 + rnd() * 2, color: rgb(0, 0, 0) });
  }
  for (let i = 0; i < 600; i++) page.drawText(`DN${15 + Math.floor(rnd() * 40)} run ${i}`, { x: 60 + rnd() * 2200, y: 60 + rnd() * 1500, size: 7, font });
  if (extra) page.drawRectangle({ x: 1500, y: 900, width: 300, height: 150, borderWidth: 4, borderColor: rgb(0, 0, 0) });
  return doc.save();
}

/** The two pages rendered alone, as the compare does it (same library, same scale rule), from local files. */
async function renderTwoAlone(fileA: string, fileB: string) {
  const t0 = performance.now();
  const [a, b] = await Promise.all([openPdf(await fileSource(fileA)), openPdf(await fileSource(fileB))]);
  try {
    const [pa, pb] = await Promise.all([a.getPage(1), b.getPage(1)]);
    const [va, vb] = [pa.getViewport({ scale: 1 }), pb.getViewport({ scale: 1 })];
    const widthPt = Math.max(va.width, vb.width);
    const heightPt = Math.max(va.height, vb.height);
    const scale = Math.min(COMPARE_DPI / 72, COMPARE_MAX_PX / Math.max(widthPt, heightPt));
    const w = Math.ceil(widthPt * scale);
    const h = Math.ceil(heightPt * scale);
    // The canvas paints lazily, when its pixels are first read: read them, or "rendering" would time only the
    // recording of pdf.js's drawing commands (the compare pays for the painting, in its diff step).
    (await renderPage(pa, scale, w, h)).data();
    (await renderPage(pb, scale, w, h)).data();
    return Math.round(performance.now() - t0);
  } finally {
    await Promise.all([a.destroy(), b.destroy()]);
  }
}

async function uploadBench(client: Client, projectId: string, dir: string) {
  for (let run = 1; run <= uploadRuns; run++) {
    const file = path.join(dir, `big-${run}.pdf`);
    await writeBigPdf(file, uploadMb * MB);
    const size = statSync(file).size;
    log("upload.file_mb", Math.round(size / MB));
    // The baseline: the SDK's own multipart upload, straight from the file to the same bucket of the same fake.
    const rawKey = `bench/raw-${Date.now()}.pdf`;
    let t0 = performance.now();
    await new Upload({ client: s3, params: { Bucket: process.env.S3_BUCKET, Key: rawKey, Body: createReadStream(file), ContentType: "application/pdf" } }).done();
    const rawS = (performance.now() - t0) / 1000;
    await s3.send(new DeleteObjectCommand({ Bucket: process.env.S3_BUCKET, Key: rawKey }));
    log("upload.raw_sdk_multipart_mb_per_s", Math.round(size / MB / rawS));
    const idle = rssMb(APP_PID);
    let peak = idle;
    const sampler = setInterval(() => (peak = Math.max(peak, rssMb(APP_PID))), 100);
    t0 = performance.now();
    const res = await streamUpload(client, projectId, file, `BENCH-${run}`);
    const appS = (performance.now() - t0) / 1000;
    clearInterval(sampler);
    await rm(file, { force: true });
    if (res.status !== 201) throw new Error(`upload failed: ${JSON.stringify(res.body)}`);
    log("upload.through_app_mb_per_s", Math.round(size / MB / appS));
    log("upload.through_app_seconds", Math.round(appS * 10) / 10);
    log("upload.raw_sdk_seconds", Math.round(rawS * 10) / 10);
    log("upload.app_rss_mb_idle_vs_peak", { idle, peak });
    keep("upload.app_mb_s", +(size / MB / appS).toFixed(1));
    keep("upload.raw_mb_s", +(size / MB / rawS).toFixed(1));
    keep("upload.rss_growth_mb", peak - idle);
  }
}

/**
 * Once more if the request never got out: after the long upload, a pooled keep-alive socket the server has just
 * closed (its idle timeout) can be picked for the next POST, which fetch does not retry by itself.
 */
async function retryStale<T>(send: () => Promise<T>): Promise<T> {
  try {
    return await send();
  } catch (error) {
    const code = (error as { cause?: { code?: string } }).cause?.code;
    if (!(error instanceof TypeError) || !["EPIPE", "ECONNRESET", "UND_ERR_SOCKET"].includes(code ?? "")) throw error;
    return send();
  }
}

/** Uploads a pair of revisions of one heavy A1 sheet and waits until both are processed. */
async function a1Pair(client: Client, projectId: string, seed: number, sheetNumber: string) {
  const a = await heavyA1(seed);
  const b = await heavyA1(seed, true);
  const ua = await retryStale(() => upload(client, projectId, a, { sheetNumber, title: "Heavy A1" }));
  const ub = await retryStale(() => upload(client, projectId, b, { sheetNumber }));
  const [ra, rb] = [ua.body.stored[0], ub.body.stored[0]];
  for (const r of [ra, rb]) await until(async () => (await DrawingRevision.findByPk(r.revisionId))?.processing === "done", 60_000);
  return { a, b, ra, rb };
}

async function viewerBench(client: Client, projectId: string) {
  const { a, ra } = await a1Pair(client, projectId, 1, "BENCH-A1");
  log("a1.sheet_kb", Math.round(a.length / 1024));
  const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: ["--no-sandbox", "--disable-gpu"] });
  try {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    await context.addCookies([{ name: "countersign_session", value: client.sessionCookie!, url: APP_URL }]);
    const page = await context.newPage();
    // One cold load (worker and chunks not yet cached) is reported apart; the budget compares warm loads.
    const viewerMs: number[] = [];
    for (let i = 0; i <= runs; i++) {
      await page.goto(`${APP_URL}/projects/${projectId}/drawings/${ra.drawingId}?rev=${ra.revisionId}`);
      const ms = await page.evaluate(async () => {
        const start = performance.timeOrigin;
        for (;;) {
          const c = document.querySelector<HTMLCanvasElement>(".react-pdf__Page__canvas");
          if (c && c.width > 0 && c.closest(".react-pdf__Page")?.getAttribute("data-page-number")) {
            // wait for the paint after the canvas got its pixels
            await new Promise((r) => requestAnimationFrame(() => r(null)));
            return Date.now() - start;
          }
          await new Promise((r) => setTimeout(r, 10));
        }
      });
      viewerMs.push(Math.round(ms));
    }
    log("viewer.first_page_ms_from_navigation", viewerMs);

    // pdf.js alone: the same build of pdf.js, the same bytes, the same canvas width, no app around it.
    const pdfjsDir = path.dirname(require.resolve("pdfjs-dist/package.json"));
    await page.route("http://bench.local/**", async (route) => {
      const url = new URL(route.request().url());
      if (url.pathname === "/") return route.fulfill({ contentType: "text/html", body: "<!doctype html><body></body>" });
      if (url.pathname === "/sheet.pdf") return route.fulfill({ contentType: "application/pdf", body: Buffer.from(a) });
      return route.fulfill({ contentType: "text/javascript", body: await readFile(path.join(pdfjsDir, "build", path.basename(url.pathname))) });
    });
    const directMs: number[] = [];
    for (let i = 0; i <= runs; i++) {
      await page.goto("http://bench.local/");
      directMs.push(
        await page.evaluate(async () => {
          const t = performance.now();
          const lib: any = await import("http://bench.local/pdf.min.mjs" as string);
          lib.GlobalWorkerOptions.workerSrc = "http://bench.local/pdf.worker.min.mjs";
          const pdf = await lib.getDocument("http://bench.local/sheet.pdf").promise;
          const p = await pdf.getPage(1);
          const vp1 = p.getViewport({ scale: 1 });
          const vp = p.getViewport({ scale: (1280 - 340) / vp1.width * devicePixelRatio });
          const canvas = document.createElement("canvas");
          canvas.width = vp.width;
          canvas.height = vp.height;
          document.body.append(canvas);
          await p.render({ canvasContext: canvas.getContext("2d"), viewport: vp }).promise;
          return Math.round(performance.now() - t);
        }),
      );
    }
    log("pdfjs_direct.first_page_ms", directMs);
    figures["viewer.first_page_ms"] = viewerMs.slice(1);
    figures["pdfjs.first_page_ms"] = directMs.slice(1);
    figures["viewer.cold_first_page_ms"] = viewerMs.slice(0, 1);
    figures["pdfjs.cold_first_page_ms"] = directMs.slice(0, 1);
  } finally {
    await browser.close();
  }
}

async function compareBench(client: Client, projectId: string, dir: string) {
  // The app's renderer is warm (it has processed every upload): warm this process's pdf.js, fonts and canvas too,
  // so the baseline does not carry a first-use cost the compare does not pay.
  const [wa, wb] = [path.join(dir, "warm-a.pdf"), path.join(dir, "warm-b.pdf")];
  await Promise.all([writeFile(wa, await heavyA1(7)), writeFile(wb, await heavyA1(7, true))]);
  await renderTwoAlone(wa, wb);
  for (let run = 1; run <= runs; run++) {
    // A fresh pair each run: a pair once compared is answered from the cache.
    const { a, b, ra, rb } = await a1Pair(client, projectId, 100 + run, `BENCH-CMP-${run}`);
    const url = `/api/projects/${projectId}/drawings/${ra.drawingId}/compare?from=${ra.revisionId}&to=${rb.revisionId}`;
    let t0 = performance.now();
    const cold = await client.json(url);
    const coldMs = Math.round(performance.now() - t0);
    if (cold.status !== 200) throw new Error(`compare answered ${cold.status}`);
    t0 = performance.now();
    await client.json(url);
    const warmMs = Math.round(performance.now() - t0);
    const [fa, fb] = [path.join(dir, "a.pdf"), path.join(dir, "b.pdf")];
    await Promise.all([writeFile(fa, a), writeFile(fb, b)]);
    const aloneMs = await renderTwoAlone(fa, fb);
    log("compare.a1_cold_ms", coldMs);
    log("compare.a1_cached_ms", warmMs);
    log("compare.render_two_pages_alone_ms", aloneMs);
    log("compare.server_breakdown_ms", cold.body.visual.timingsMs);
    log("compare.render_px", `${cold.body.visual.widthPx}x${cold.body.visual.heightPx}`);
    log("compare.regions_found", cold.body.visual.regions.length);
    keep("compare.cold_ms", coldMs);
    keep("compare.cached_ms", warmMs);
    keep("compare.render_alone_ms", aloneMs);
    for (const [k, v] of Object.entries(cold.body.visual.timingsMs as Record<string, number>)) keep(`compare.server_${k}_ms`, v);
    results.compareRenderPx = `${cold.body.visual.widthPx}x${cold.body.visual.heightPx}`;
    results.compareDpi = Math.round(cold.body.visual.scale * 72);
  }
}

async function main() {
  const team = await makeProjectTeam();
  const client = new Client(APP_URL);
  await client.signIn(team.users.architect.email, PASSWORD);
  const dir = await mkdtemp(path.join(tmpdir(), "cs-bench-"));
  // Each part reports on its own: one failing leaves the others' figures standing.
  const failed: string[] = [];
  const part = async (name: string, run: () => Promise<void>) => {
    if (!parts.has(name)) return;
    try {
      await run();
    } catch (error) {
      console.error(`${name} failed:`, error);
      failed.push(name);
    }
  };
  try {
    await part("upload", () => uploadBench(client, team.project.id, dir));
    await part("viewer", () => viewerBench(client, team.project.id));
    await part("compare", () => compareBench(client, team.project.id, dir));
  } finally {
    await rm(dir, { recursive: true, force: true });
    await sequelize.close();
  }
  console.log("\nJSON", JSON.stringify(results));
  writeBench("drawings", figures, { uploadMb, uploadRuns, failed, compareRenderPx: results.compareRenderPx, compareDpi: results.compareDpi });
  if (failed.length) process.exitCode = 1;
}

await main();
