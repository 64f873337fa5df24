// Test sheets made with pdf-lib (so every test knows exactly what is on them), and an upload helper that
// posts them the way the upload panel does: fields first, then the file, one file per request.
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { PDFDocument, PDFName, rgb, StandardFonts } from "pdf-lib";
import { listKeys } from "../../app/platform/storage.server";
import type { Client } from "./http";

export const A1_LANDSCAPE: [number, number] = [2384, 1684];
export const A3_LANDSCAPE: [number, number] = [1191, 842];

export interface SheetSpec {
  size?: [number, number];
  pages?: number;
  /** Text lines drawn top-down from near the top-left corner (PDF points). */
  lines?: string[];
  /** Boxes in PDF points, origin bottom-left as pdf-lib draws. */
  boxes?: { x: number; y: number; w: number; h: number }[];
  /** Makes otherwise identical sheets differ in their bytes. */
  tag?: string;
}

export async function makeSheet(spec: SheetSpec = {}): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.setCreationDate(new Date("2026-01-01T00:00:00Z"));
  doc.setModificationDate(new Date("2026-01-01T00:00:00Z"));
  doc.setProducer("countersign tests");
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const [w, h] = spec.size ?? A3_LANDSCAPE;
  for (let p = 0; p < (spec.pages ?? 1); p++) {
    const page = doc.addPage([w, h]);
    page.drawRectangle({ x: 20, y: 20, width: w - 40, height: h - 40, borderColor: rgb(0, 0, 0), borderWidth: 1.5 });
    (spec.lines ?? [`Test sheet page ${p + 1}`]).forEach((line, i) => page.drawText(line, { x: 60, y: h - 80 - i * 36, size: 24, font }));
    for (const b of spec.boxes ?? []) page.drawRectangle({ x: b.x, y: b.y, width: b.w, height: b.h, borderColor: rgb(0, 0, 0), borderWidth: 4 });
    if (spec.tag) page.drawText(spec.tag, { x: w - 300, y: 40, size: 10, font });
  }
  return doc.save({ useObjectStreams: false });
}

/** Encrypts with qpdf (a Debian package the stack installs): with a user password, or owner-only restrictions. */
export function encrypt(bytes: Uint8Array, userPassword: string): Uint8Array {
  const dir = mkdtempSync(path.join(tmpdir(), "cs-enc-"));
  writeFileSync(path.join(dir, "in.pdf"), bytes);
  execFileSync("qpdf", ["--encrypt", userPassword, "owner-secret", "256", "--", path.join(dir, "in.pdf"), path.join(dir, "out.pdf")]);
  return new Uint8Array(readFileSync(path.join(dir, "out.pdf")));
}

export interface UploadFields {
  sheetNumber: string;
  title?: string;
  label?: string;
  description?: string;
  discipline?: string;
  scaleText?: string;
  mode?: "single" | "split";
}

export async function upload(client: Client, projectId: string, bytes: Uint8Array, fields: UploadFields, filename = "sheet.pdf", type = "application/pdf") {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) if (v !== undefined) form.append(k, v);
  form.append("file", new Blob([new Uint8Array(bytes)], { type }), filename);
  const res = await client.request(`/projects/${projectId}/drawings/upload`, { method: "POST", body: form, headers: { accept: "application/json" } });
  const text = await res.text();
  let body: any;
  try {
    body = JSON.parse(text);
  } catch {
    body = { raw: text };
  }
  return { status: res.status, body };
}

/** A valid one-page sheet carrying an unused stream of `fillerBytes`, to make it as large as a test needs. */
export async function largeSheet(fillerBytes: number, tag = `large-${Date.now()}`): Promise<Uint8Array> {
  const doc = await PDFDocument.load(await makeSheet({ tag }));
  const filler = new Uint8Array(fillerBytes);
  for (let i = 0; i < filler.length; i += 4096) filler[i] = i & 0xff;
  doc.catalog.set(PDFName.of("Filler"), doc.context.register(doc.context.stream(filler)));
  return doc.save({ useObjectStreams: false });
}

/**
 * Posts a sheet as `upload` does, but streamed, keeping its last `heldBytes` back until `release` settles: a test
 * can wait, while the upload is still arriving, for what the server must already be doing with it. If `release`
 * fails, so does the upload, with that reason.
 */
export async function uploadHolding(client: Client, projectId: string, bytes: Uint8Array, fields: UploadFields, release: Promise<unknown>, heldBytes = 1024 * 1024) {
  const boundary = `----countersign-held-${Date.now().toString(36)}`;
  const head = Object.entries(fields)
    .filter(([, v]) => v !== undefined)
    .map(([k, v]) => `--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`)
    .join("");
  const whole = Buffer.concat([
    Buffer.from(`${head}--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="sheet.pdf"\r\nContent-Type: application/pdf\r\n\r\n`),
    bytes,
    Buffer.from(`\r\n--${boundary}--\r\n`),
  ]);
  const held = whole.length - heldBytes;
  let failure: unknown;
  const body = new ReadableStream<Uint8Array>({
    start(c) {
      for (let at = 0; at < held; at += 1024 * 1024) c.enqueue(whole.subarray(at, Math.min(at + 1024 * 1024, held)));
    },
    async pull(c) {
      try {
        await release;
      } catch (error) {
        failure = error;
        return c.error(error);
      }
      c.enqueue(whole.subarray(held));
      c.close();
    },
  });
  const res = await client
    .request(`/projects/${projectId}/drawings/upload`, {
      method: "POST",
      body,
      headers: { "content-type": `multipart/form-data; boundary=${boundary}`, "content-length": String(whole.length), accept: "application/json" },
      duplex: "half",
    } as RequestInit)
    .catch((error) => {
      throw failure ?? error;
    });
  const text = await res.text();
  try {
    return { status: res.status, body: JSON.parse(text) };
  } catch {
    return { status: res.status, body: { raw: text } as any };
  }
}

export async function objectKeys(prefix: string): Promise<string[]> {
  const out: string[] = [];
  for await (const key of listKeys(prefix, process.env.S3_BUCKET ?? "countersign-test")) out.push(key);
  return out;
}

export async function until<T>(check: () => Promise<T | null | undefined | false>, timeoutMs = 20_000, what = "condition"): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await check();
    if (v) return v;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}
