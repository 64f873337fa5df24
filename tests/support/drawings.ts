// Test sheets made with pdf-lib (so every test knows exactly what is on them), and an upload helper that
// posts them the way the upload panel does: fields first, then the file, one file per request.
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { PDFDocument, rgb, StandardFonts } from "pdf-lib";
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
