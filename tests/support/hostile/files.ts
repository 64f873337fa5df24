// Hostile files: a real two-page sheet (made with pdf-lib) mutated in known ways, files of other types wearing a
// .pdf name, and hand-written multipart bodies that break the format. `mustRefuse` says whether any upload target
// has to refuse the file; a file with a few flipped bits may still be a readable PDF, so it only must not crash.
import { PDFArray, PDFDocument, PDFName, PDFString } from "pdf-lib";
import sharp from "sharp";
import fc from "fast-check";
import { encrypt, makeSheet } from "../drawings";

export interface HostileFile {
  name: string;
  bytes: Uint8Array;
  filename: string;
  type: string;
  mustRefuse: boolean;
}

const enc = new TextEncoder();
const concat = (...parts: (Uint8Array | string)[]) => {
  const bufs = parts.map((p) => (typeof p === "string" ? enc.encode(p) : p));
  const out = new Uint8Array(bufs.reduce((n, b) => n + b.length, 0));
  let at = 0;
  for (const b of bufs) {
    out.set(b, at);
    at += b.length;
  }
  return out;
};

/** Flips `count` bits chosen by fast-check from `seed` (after the 8-byte header, so it still claims to be a PDF). */
export function flipBits(bytes: Uint8Array, count: number, seed: number): Uint8Array {
  const out = new Uint8Array(bytes);
  const spots = fc.sample(fc.tuple(fc.integer({ min: 8, max: bytes.length - 1 }), fc.integer({ min: 0, max: 7 })), { seed, numRuns: count });
  for (const [at, bit] of spots) out[at]! ^= 1 << bit;
  return out;
}

/** Replaces text in the PDF's bytes (latin1), keeping everything else byte for byte. */
function patch(bytes: Uint8Array, from: RegExp, to: string) {
  const text = Buffer.from(bytes).toString("latin1");
  if (!from.test(text)) throw new Error(`pattern ${from} not in the sheet`);
  return new Uint8Array(Buffer.from(text.replace(from, to), "latin1"));
}

async function withJavaScript(base: Uint8Array) {
  const doc = await PDFDocument.load(base);
  const ctx = doc.context;
  const js = ctx.obj({ Type: "Action", S: "JavaScript", JS: PDFString.of("app.alert('hostile');") });
  doc.catalog.set(PDFName.of("OpenAction"), ctx.register(js));
  const names = ctx.obj({ JavaScript: ctx.obj({ Names: [PDFString.of("hostile"), ctx.register(ctx.obj({ S: "JavaScript", JS: PDFString.of("this.exportDataObject({cName:'x'});") }))] }) });
  doc.catalog.set(PDFName.of("Names"), names);
  return doc.save({ useObjectStreams: false });
}

async function withDeepNesting(base: Uint8Array, depth: number, open: string, close: string) {
  // A junk entry in the catalogue whose value nests `depth` levels: a parser that recurses naively overflows.
  const text = Buffer.from(base).toString("latin1");
  const at = text.indexOf("/Type /Catalog");
  if (at < 0) throw new Error("no catalogue in the sheet");
  const junk = `/Junk ${open.repeat(depth)}${close.repeat(depth)} `;
  return new Uint8Array(Buffer.from(text.slice(0, at) + junk + text.slice(at), "latin1"));
}

async function withAnnotationAction(base: Uint8Array) {
  const doc = await PDFDocument.load(base);
  const ctx = doc.context;
  const page = doc.getPage(0);
  const annot = ctx.register(
    ctx.obj({ Type: "Annot", Subtype: "Link", Rect: [0, 0, 100, 100], A: ctx.obj({ S: "JavaScript", JS: PDFString.of("app.alert(1)") }) }),
  );
  const annots = page.node.lookupMaybe(PDFName.of("Annots"), PDFArray) ?? ctx.obj([]);
  annots.push(annot);
  page.node.set(PDFName.of("Annots"), annots);
  return doc.save({ useObjectStreams: false });
}

/** Every hostile file, built once per run (deterministic: fixed sheet content and fixed seeds). */
export async function hostileFiles(): Promise<HostileFile[]> {
  const sheet = await makeSheet({ pages: 2, tag: "hostile-base" });
  const png = new Uint8Array(await sharp({ create: { width: 16, height: 16, channels: 3, background: "#123456" } }).png().toBuffer());
  const jpeg = new Uint8Array(await sharp({ create: { width: 16, height: 16, channels: 3, background: "#654321" } }).jpeg().toBuffer());
  const pdf = (name: string, bytes: Uint8Array, mustRefuse = true): HostileFile => ({ name, bytes, filename: `${name}.pdf`, type: "application/pdf", mustRefuse });
  const files: HostileFile[] = [
    pdf("empty", new Uint8Array()),
    pdf("header-only", enc.encode("%PDF-")),
    pdf("header-line", enc.encode("%PDF-1.7\n")),
    pdf("zeros-4k", new Uint8Array(4096)),
    pdf("header-then-zeros", concat("%PDF-1.7\n", new Uint8Array(8192))),
    pdf("truncated-1pct", sheet.slice(0, Math.floor(sheet.length * 0.01))),
    pdf("truncated-10pct", sheet.slice(0, Math.floor(sheet.length * 0.1))),
    pdf("truncated-50pct", sheet.slice(0, Math.floor(sheet.length * 0.5))),
    pdf("truncated-90pct", sheet.slice(0, Math.floor(sheet.length * 0.9))),
    pdf("truncated-no-eof", sheet.slice(0, sheet.length - 7)),
    pdf("truncated-last-byte", sheet.slice(0, sheet.length - 1), false),
    pdf("bitflip-1", flipBits(sheet, 1, 101), false),
    pdf("bitflip-8", flipBits(sheet, 8, 102), false),
    pdf("bitflip-64", flipBits(sheet, 64, 103), false),
    pdf("bitflip-512", flipBits(sheet, 512, 104), false),
    pdf("bitflip-4096", flipBits(sheet, 4096, 105), false),
    pdf("header-flipped", (() => { const b = new Uint8Array(sheet); b[1] = 0x51; return b; })()),
    // A broken cross-reference table is rebuilt by the reader from the objects themselves: a readable sheet.
    pdf("xref-garbage", patch(sheet, /xref[\s\S]*?trailer/, "xref\n0 999999\nGARBAGE\ntrailer"), false),
    pdf("encrypted-user-password", encrypt(sheet, "u")),
    pdf("encrypted-owner-only", encrypt(sheet, "")),
    // /Count is only a hint: the page tree itself holds two pages, and that is what is counted and stored.
    pdf("count-1000000", patch(sheet, /\/Count 2\b/, "/Count 1000000"), false),
    pdf("count-negative", patch(sheet, /\/Count 2\b/, "/Count -5"), false),
    pdf("count-zero-kids-empty", patch(sheet, /\/Kids \[[^\]]*\]/, "/Kids []")),
    pdf("nested-arrays-100k", await withDeepNesting(sheet, 100_000, "[", "]"), false),
    pdf("nested-dicts-20k", await withDeepNesting(sheet, 20_000, "<< /A ", ">> "), false),
    // Scripts inside a sheet are kept as sent (the register stores drawings byte for byte) and never run: the
    // viewer's pdf.js has scripting off, and downloads are attachments. Stored, not refused.
    pdf("javascript-openaction", await withJavaScript(sheet), false),
    pdf("javascript-link-annotation", await withAnnotationAction(sheet), false),
    pdf("polyglot-html-after-header", concat("%PDF-1.7\n<!doctype html><script>window.__hostile=1</script>\n%%EOF\n")),
    { name: "png-named-pdf", bytes: png, filename: "sheet.pdf", type: "application/pdf", mustRefuse: true },
    { name: "jpeg-named-pdf", bytes: jpeg, filename: "sheet.pdf", type: "application/pdf", mustRefuse: true },
    { name: "zip-named-pdf", bytes: concat("PK\u0003\u0004", new Uint8Array(26), "PK\u0005\u0006", new Uint8Array(18)), filename: "sheet.pdf", type: "application/pdf", mustRefuse: true },
    { name: "html-named-pdf", bytes: enc.encode("<!doctype html><html><body><script>window.__hostile=1</script></body></html>"), filename: "sheet.pdf", type: "application/pdf", mustRefuse: true },
    { name: "svg-named-pdf", bytes: enc.encode(`<svg xmlns="http://www.w3.org/2000/svg" onload="window.__hostile=1"/>`), filename: "sheet.pdf", type: "image/svg+xml", mustRefuse: true },
    { name: "elf-named-pdf", bytes: concat("\u007fELF\u0002\u0001\u0001", new Uint8Array(57)), filename: "sheet.pdf", type: "application/pdf", mustRefuse: true },
    { name: "utf16-bom-text", bytes: concat(new Uint8Array([0xff, 0xfe]), "%\u0000P\u0000D\u0000F\u0000"), filename: "sheet.pdf", type: "application/pdf", mustRefuse: true },
  ];
  return files;
}

/** The untouched sheet (for cases about names and fields rather than bytes). */
export const baseSheet = () => makeSheet({ pages: 1, tag: `hostile-ok-${Date.now().toString(36)}-${Math.random().toString(36).slice(2)}` });

/** Hand-written multipart bodies that break the format (boundary `XB`), each with what must come back. */
export function brokenMultiparts(pdfBytes: Uint8Array): { name: string; contentType: string; body: Uint8Array }[] {
  const b = "XB";
  const type = `multipart/form-data; boundary=${b}`;
  const field = (name: string, value: string) => `--${b}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`;
  const fileHead = (filename = "sheet.pdf", extra = "") => `--${b}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"${extra}\r\nContent-Type: application/pdf\r\n\r\n`;
  const sheetField = field("sheetNumber", "HX-MP-1");
  return [
    { name: "no-closing-boundary", contentType: type, body: concat(sheetField, fileHead(), pdfBytes, "\r\n") },
    { name: "no-parts", contentType: type, body: concat(`--${b}--\r\n`) },
    { name: "empty-body", contentType: type, body: new Uint8Array() },
    { name: "wrong-boundary", contentType: "multipart/form-data; boundary=OTHER", body: concat(sheetField, fileHead(), pdfBytes, `\r\n--${b}--\r\n`) },
    { name: "boundary-too-long", contentType: `multipart/form-data; boundary=${"x".repeat(200)}`, body: concat(sheetField, `--${b}--\r\n`) },
    { name: "no-boundary-param", contentType: "multipart/form-data", body: concat(sheetField, `--${b}--\r\n`) },
    { name: "no-disposition", contentType: type, body: concat(`--${b}\r\nContent-Type: text/plain\r\n\r\nhello\r\n--${b}--\r\n`) },
    { name: "headers-never-end", contentType: type, body: concat(`--${b}\r\nContent-Disposition: form-data; name="sheetNumber"\r\n`, "X-Filler: a\r\n".repeat(2000)) },
    { name: "huge-field", contentType: type, body: concat(field("sheetNumber", "S".repeat(2 * 1024 * 1024)), fileHead(), pdfBytes, `\r\n--${b}--\r\n`) },
    { name: "many-fields", contentType: type, body: concat(...Array.from({ length: 3000 }, (_, i) => field(`f${i}`, "v")), `--${b}--\r\n`) },
    { name: "two-files", contentType: type, body: concat(sheetField, fileHead("a.pdf"), pdfBytes, "\r\n", fileHead("b.pdf"), pdfBytes, `\r\n--${b}--\r\n`) },
    { name: "file-without-fields", contentType: type, body: concat(fileHead(), pdfBytes, `\r\n--${b}--\r\n`) },
    { name: "filename-crlf", contentType: type, body: concat(sheetField, fileHead("a\r\nContent-Type: text/html"), pdfBytes, `\r\n--${b}--\r\n`) },
    { name: "filename-nul-traversal", contentType: type, body: concat(sheetField, fileHead("../../../etc/passwd\u0000.pdf"), pdfBytes, `\r\n--${b}--\r\n`) },
    { name: "filename-star-encoding", contentType: type, body: concat(sheetField, fileHead("x.pdf", "; filename*=UTF-8''%E0%A4%A"), pdfBytes, `\r\n--${b}--\r\n`) },
    { name: "garbage", contentType: type, body: new Uint8Array(Buffer.from(fc.sample(fc.uint8Array({ minLength: 4000, maxLength: 4000 }), { seed: 7, numRuns: 1 })[0]!)) },
  ];
}
