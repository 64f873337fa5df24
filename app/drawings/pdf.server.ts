// Reading PDFs on the server with pdf.js: open from a local file or straight from object storage by byte ranges
// (so a large set is never read whole), check that an upload really is a usable PDF, pull out page sizes and
// positioned text, and render pages onto @napi-rs/canvas for thumbnails and comparison.
import { open } from "node:fs/promises";
import path from "node:path";
import { createRequire } from "node:module";
import { createCanvas, type Canvas } from "@napi-rs/canvas";
import type { PDFDocumentProxy, PDFPageProxy } from "pdfjs-dist/types/src/display/api";
import type { PageSize, TextRun } from "../../db/models";
import { getObjectRange } from "../platform/storage.server";

const require = createRequire(import.meta.url);
const pdfjsDir = path.dirname(require.resolve("pdfjs-dist/package.json"));
const assets = {
  standardFontDataUrl: path.join(pdfjsDir, "standard_fonts") + "/",
  cMapUrl: path.join(pdfjsDir, "cmaps") + "/",
  wasmUrl: path.join(pdfjsDir, "wasm") + "/",
};

type PdfJs = typeof import("pdfjs-dist/legacy/build/pdf.mjs");
let pdfjsPromise: Promise<PdfJs> | undefined;
function pdfjs() {
  pdfjsPromise ??= loadPdfjs();
  return pdfjsPromise;
}

/**
 * pdf.js and its worker (which runs in this thread), loaded once with stack traces left unmapped meanwhile. The
 * server maps every stack trace through source maps, and pdf.js reads a stack while it loads: that alone would
 * parse its 7 MB of source maps into some 130 MB held for the life of the process, and take seconds.
 */
async function loadPdfjs(): Promise<PdfJs> {
  const stacks = Error as { prepareStackTrace?: unknown };
  const mapStack = stacks.prepareStackTrace;
  stacks.prepareStackTrace = undefined;
  try {
    const [lib, worker] = await Promise.all([import("pdfjs-dist/legacy/build/pdf.mjs"), import("pdfjs-dist/legacy/build/pdf.worker.mjs")]);
    // Found here, the worker is not imported again by pdf.js itself.
    (globalThis as { pdfjsWorker?: unknown }).pdfjsWorker = worker;
    return lib;
  } finally {
    stacks.prepareStackTrace = mapStack;
  }
}

/** Where a PDF's bytes come from: a length and a way to read any range of them. */
export interface ByteSource {
  length: number;
  read(start: number, end: number): Promise<Uint8Array>;
  close?(): Promise<void>;
}

export async function fileSource(file: string): Promise<ByteSource> {
  const handle = await open(file, "r");
  const { size } = await handle.stat();
  return {
    length: size,
    async read(start, end) {
      const buf = Buffer.alloc(Math.max(0, Math.min(end, size) - start));
      await handle.read(buf, 0, buf.length, start);
      return new Uint8Array(buf.buffer, buf.byteOffset, buf.length);
    },
    close: () => handle.close(),
  };
}

export function objectSource(key: string, length: number): ByteSource {
  return { length, read: (start, end) => getObjectRange(key, start, Math.min(end, length)) };
}

export async function openPdf(source: ByteSource): Promise<PDFDocumentProxy> {
  const lib = await pdfjs();
  let fail: (error: unknown) => void = () => {};
  const failed = new Promise<never>((_, reject) => (fail = reject));
  failed.catch(() => {});
  class Transport extends lib.PDFDataRangeTransport {
    override requestDataRange(begin: number, end: number) {
      source.read(begin, end).then(
        // pdf.js may detach what it is given: hand it a buffer of its own.
        (chunk) => this.onDataRange(begin, chunk.slice()),
        // pdf.js would wait for the bytes for ever: end the document instead.
        (error) => {
          fail(error);
          void task.destroy();
        },
      );
    }
  }
  const task = lib.getDocument({
    range: new Transport(source.length, new Uint8Array(0)),
    length: source.length,
    rangeChunkSize: 256 * 1024,
    disableAutoFetch: true,
    disableStream: true,
    isEvalSupported: false,
    stopAtErrors: true,
    verbosity: 0,
    ...assets,
  });
  return Promise.race([task.promise, failed]);
}

export class PdfProblem extends Error {
  constructor(
    message: string,
    readonly code: "not_pdf" | "empty" | "truncated" | "encrypted" | "damaged" | "too_many_pages" | "no_pages",
  ) {
    super(message);
  }
}

export interface PdfFacts {
  pageCount: number;
  pages: PageSize[];
}

/**
 * Checks that the bytes are a whole, readable, unencrypted PDF within the page limit — by looking inside it,
 * never at its name — and returns its page sizes.
 */
export async function inspectPdf(source: ByteSource, maxPages: number): Promise<PdfFacts> {
  if (source.length === 0) throw new PdfProblem("The file is empty (0 bytes).", "empty");
  const head = Buffer.from(await source.read(0, Math.min(1024, source.length)));
  if (head.indexOf("%PDF-") === -1) {
    throw new PdfProblem("This file is not a PDF, whatever its name says. Export the sheet as PDF and upload that.", "not_pdf");
  }
  const tail = Buffer.from(await source.read(Math.max(0, source.length - 2048), source.length));
  if (tail.indexOf("%%EOF") === -1) {
    throw new PdfProblem("This PDF is incomplete (it ends before the end of the file). Upload it again from the original.", "truncated");
  }
  let pdf: PDFDocumentProxy;
  try {
    pdf = await openPdf(source);
  } catch (error) {
    if ((error as Error).name === "PasswordException") {
      throw new PdfProblem("This PDF is password-protected. Upload a copy without a password or encryption.", "encrypted");
    }
    throw new PdfProblem("This PDF is damaged and cannot be read. Export it again and upload the new file.", "damaged");
  }
  try {
    const meta = await pdf.getMetadata().catch(() => null);
    const info = meta?.info as { EncryptFilterName?: string | null } | undefined;
    if (info?.EncryptFilterName) {
      throw new PdfProblem("This PDF is encrypted. Upload a copy saved without encryption or restrictions.", "encrypted");
    }
    if (pdf.numPages < 1) throw new PdfProblem("This PDF has no pages.", "no_pages");
    if (pdf.numPages > maxPages) {
      throw new PdfProblem(`This PDF has ${pdf.numPages} pages; the most Countersign accepts in one file is ${maxPages}. Split the set and upload it in parts.`, "too_many_pages");
    }
    const pages: PageSize[] = [];
    for (let n = 1; n <= pdf.numPages; n++) {
      try {
        pages.push(pageSize(await pdf.getPage(n)));
      } catch {
        throw new PdfProblem(`Page ${n} of this PDF is damaged and cannot be read.`, "damaged");
      }
    }
    return { pageCount: pdf.numPages, pages };
  } finally {
    await pdf.destroy();
  }
}

export function pageSize(page: PDFPageProxy): PageSize {
  const vp = page.getViewport({ scale: 1 });
  return { widthPt: round(vp.width), heightPt: round(vp.height) };
}

const round = (n: number) => Math.round(n * 100) / 100;

/** The page's text as runs with their boxes in PDF points, origin top-left (as the viewer draws). */
export async function pageText(page: PDFPageProxy): Promise<TextRun[]> {
  const vp = page.getViewport({ scale: 1 });
  const content = await page.getTextContent();
  const runs: TextRun[] = [];
  for (const item of content.items) {
    if (!("str" in item) || !item.str.trim()) continue;
    const [a, b, , , e, f] = item.transform as number[];
    const [x, y] = vp.convertToViewportPoint(e!, f!) as [number, number];
    const h = Math.hypot(a!, b!) || item.height;
    runs.push({ s: item.str, x: round(x), y: round(y - h), w: round(item.width), h: round(h) });
  }
  return runs;
}

/** Renders a page at `scale` (1 = 72 dpi) on a white canvas of at least `minWidth`×`minHeight` pixels. */
export async function renderPage(page: PDFPageProxy, scale: number, minWidth = 0, minHeight = 0): Promise<Canvas> {
  const viewport = page.getViewport({ scale });
  const canvas = createCanvas(Math.max(minWidth, Math.ceil(viewport.width)), Math.max(minHeight, Math.ceil(viewport.height)));
  const ctx = canvas.getContext("2d");
  ctx.fillStyle = "#ffffff";
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  await page.render({ canvas: canvas as unknown as HTMLCanvasElement, canvasContext: ctx as unknown as CanvasRenderingContext2D, viewport, background: "#ffffff" }).promise;
  return canvas;
}
