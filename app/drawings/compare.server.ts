// Comparing two revisions of one sheet: a visual overlay (both pages rendered at the same scale, aligned at
// the top-left corner, removed and added ink told apart, changed regions boxed and listed), a word diff of
// the page text, and the two change descriptions. Computed on the server (see docs/decisions) and cached in
// object storage by the two revisions' SHA-256, so a second look costs one read.
import type { Canvas } from "@napi-rs/canvas";
import { indexedPng } from "../platform/png-writer.server";
import { getObjectBytes, putObject } from "../platform/storage.server";
import { DrawingError, keys } from "./errors";
import { objectSource, openPdf, renderPage } from "./pdf.server";
import { diffRasters, OVERLAY_PALETTE, overlayIndices, type RasterImage, type RegionKind } from "./raster-diff";
import { findRevision, toRevisionView, type RevisionView } from "./register.server";
import { diffText, pageTextInOrder, type TextDiff } from "./text-diff";

/** Rendering for comparison: at most this resolution, and at most this many pixels on the long side. */
export const COMPARE_DPI = 100;
export const COMPARE_MAX_PX = 3400;

export interface VisualRegion {
  n: number;
  kind: RegionKind;
  /** In PDF points from the page's top-left corner. */
  xPt: number;
  yPt: number;
  wPt: number;
  hPt: number;
  added: number;
  removed: number;
}

export interface VisualCompare {
  page: number;
  scale: number;
  widthPx: number;
  heightPx: number;
  widthPt: number;
  heightPt: number;
  addedPixels: number;
  removedPixels: number;
  regions: VisualRegion[];
  timingsMs: { render: number; diff: number; encode: number };
  sameSize: boolean;
}

export interface CompareResult {
  drawing: { id: string; sheetNumber: string; title: string };
  from: RevisionView;
  to: RevisionView;
  page: number;
  pageCount: number;
  visual: VisualCompare;
  text: (TextDiff & { available: true }) | { available: false; reason: string };
  descriptions: { from: string; to: string };
}

const round = (n: number) => Math.round(n * 10) / 10;

/**
 * A rendering's own pixel buffer, not a copy (premultiplied RGBA, which getImageData would convert). The canvas
 * draws lazily: this first read is where its pixels are made.
 */
const pixelsOf = (canvas: Canvas): RasterImage => ({ width: canvas.width, height: canvas.height, data: canvas.data(), premultiplied: true });

type Source = { objectKey: string; byteSize: number; sha256: string };

/** The overlay and its figures, from the cache unless `fresh` (the overlay image itself is wanted and missing). */
async function renderVisual(projectId: string, from: Source, to: Source, page: number, fresh = false): Promise<VisualCompare> {
  const k = keys(projectId);
  const cached = fresh ? null : await getObjectBytes(k.compare(from.sha256, to.sha256, page, "json"));
  if (cached) return JSON.parse(Buffer.from(cached).toString("utf8")) as VisualCompare;

  const [a, b] = await Promise.all([openPdf(objectSource(from.objectKey, from.byteSize)), openPdf(objectSource(to.objectKey, to.byteSize))]);
  try {
    const t0 = performance.now();
    const [pa, pb] = await Promise.all([a.getPage(page), b.getPage(page)]);
    const va = pa.getViewport({ scale: 1 });
    const vb = pb.getViewport({ scale: 1 });
    const widthPt = Math.max(va.width, vb.width);
    const heightPt = Math.max(va.height, vb.height);
    const scale = Math.min(COMPARE_DPI / 72, COMPARE_MAX_PX / Math.max(widthPt, heightPt));
    const w = Math.ceil(widthPt * scale);
    const h = Math.ceil(heightPt * scale);
    const [ca, cb] = [await renderPage(pa, scale, w, h), await renderPage(pb, scale, w, h)];
    const t1 = performance.now();
    const diff = diffRasters(pixelsOf(ca), pixelsOf(cb));
    const t2 = performance.now();
    // A handful of flat colours: an indexed PNG, exact, and cheap to write and to send.
    const png = await indexedPng(overlayIndices(diff), diff.width, diff.height, OVERLAY_PALETTE);
    await putObject(k.compare(from.sha256, to.sha256, page, "png"), png, { contentType: "image/png", contentLength: png.length });
    const t3 = performance.now();
    const result: VisualCompare = {
      page,
      scale,
      widthPx: w,
      heightPx: h,
      widthPt: round(widthPt),
      heightPt: round(heightPt),
      addedPixels: diff.addedPixels,
      removedPixels: diff.removedPixels,
      regions: diff.regions.map((r, i) => ({ n: i + 1, kind: r.kind, xPt: round(r.x / scale), yPt: round(r.y / scale), wPt: round(r.w / scale), hPt: round(r.h / scale), added: r.added, removed: r.removed })),
      timingsMs: { render: Math.round(t1 - t0), diff: Math.round(t2 - t1), encode: Math.round(t3 - t2) },
      sameSize: Math.abs(va.width - vb.width) < 1 && Math.abs(va.height - vb.height) < 1,
    };
    const json = Buffer.from(JSON.stringify(result));
    await putObject(k.compare(from.sha256, to.sha256, page, "json"), json, { contentType: "application/json", contentLength: json.length });
    return result;
  } finally {
    await Promise.all([a.destroy(), b.destroy()]);
  }
}

export async function compareRevisions(projectId: string, drawingId: string, fromId: string, toId: string, page = 1): Promise<CompareResult> {
  if (fromId === toId) throw new DrawingError("Choose two different revisions to compare.", 422, "same_revision");
  const [from, to] = await Promise.all([findRevision(projectId, drawingId, fromId, true), findRevision(projectId, drawingId, toId, true)]);
  const pageCount = Math.min(from.pageCount, to.pageCount);
  if (page > pageCount) throw new DrawingError(`Both revisions have only ${pageCount} page(s) in common.`, 422, "no_such_page");
  const visual = await renderVisual(projectId, from, to, page);
  const ready = from.processing === "done" && to.processing === "done" && from.text && to.text;
  return {
    drawing: { id: from.drawingId, sheetNumber: from.drawing.sheetNumber, title: from.drawing.title },
    from: toRevisionView(from),
    to: toRevisionView(to),
    page,
    pageCount,
    visual,
    text: ready
      ? { available: true, ...diffText(pageTextInOrder(from.text![page - 1]), pageTextInOrder(to.text![page - 1])) }
      : { available: false, reason: "The text comparison appears once both revisions have been processed." },
    descriptions: { from: from.description, to: to.description },
  };
}

/** The overlay image of a comparison already made (the compare call stores it). */
export async function compareOverlay(projectId: string, drawingId: string, fromId: string, toId: string, page: number) {
  const [from, to] = await Promise.all([findRevision(projectId, drawingId, fromId), findRevision(projectId, drawingId, toId)]);
  const key = keys(projectId).compare(from.sha256, to.sha256, page, "png");
  let bytes = await getObjectBytes(key);
  if (!bytes) {
    await renderVisual(projectId, from, to, page, true);
    bytes = await getObjectBytes(key);
  }
  if (!bytes) throw new DrawingError("The comparison image is not available.", 404);
  return new Response(Buffer.from(bytes), { headers: { "Content-Type": "image/png", "Cache-Control": "private, max-age=86400, immutable" } });
}
