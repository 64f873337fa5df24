// Inter Tight, embedded (subset) in every PDF Countersign generates, so printed records use the product's type.
import { readFile } from "node:fs/promises";
import { createRequire } from "node:module";
import { inflateSync } from "node:zlib";
import fontkit from "@pdf-lib/fontkit";
import type { PDFDocument, PDFFont } from "pdf-lib";

const require = createRequire(import.meta.url);
const files = {
  regular: "@fontsource/inter-tight/files/inter-tight-latin-400-normal.woff",
  semibold: "@fontsource/inter-tight/files/inter-tight-latin-600-normal.woff",
  bold: "@fontsource/inter-tight/files/inter-tight-latin-700-normal.woff",
} as const;

/**
 * The font as a plain TrueType file, unwrapped from its WOFF container once per process. fontkit reads WOFF
 * tables by inflating them on every access, and it reads the glyph table once per glyph it lays out or
 * subsets, so embedding straight from the WOFF inflates the whole glyph table hundreds of times per document.
 * WOFF 1.0 only zips each table: the unwrapped tables are the original font's, byte for byte.
 */
export function sfntFromWoff(woff: Buffer): Buffer {
  if (woff.toString("latin1", 0, 4) !== "wOFF") return woff;
  const flavor = woff.readUInt32BE(4);
  const count = woff.readUInt16BE(12);
  const tables = Array.from({ length: count }, (_, i) => {
    const at = 44 + i * 20;
    const [offset, compLength, length] = [woff.readUInt32BE(at + 4), woff.readUInt32BE(at + 8), woff.readUInt32BE(at + 12)];
    const stored = woff.subarray(offset, offset + compLength);
    const data = compLength < length ? inflateSync(stored) : stored;
    if (data.length !== length) throw new Error(`WOFF table ${woff.toString("latin1", at, at + 4)} unpacks to ${data.length} bytes, not ${length}`);
    return { tag: woff.subarray(at, at + 4), checksum: woff.readUInt32BE(at + 16), data };
  });
  const pow2 = 2 ** Math.floor(Math.log2(count));
  const header = Buffer.alloc(12 + 16 * count);
  header.writeUInt32BE(flavor, 0);
  header.writeUInt16BE(count, 4);
  header.writeUInt16BE(pow2 * 16, 6);
  header.writeUInt16BE(Math.log2(pow2), 8);
  header.writeUInt16BE(count * 16 - pow2 * 16, 10);
  const parts: Buffer[] = [header];
  let offset = header.length;
  tables.forEach((t, i) => {
    t.tag.copy(header, 12 + i * 16);
    header.writeUInt32BE(t.checksum, 16 + i * 16);
    header.writeUInt32BE(offset, 20 + i * 16);
    header.writeUInt32BE(t.data.length, 24 + i * 16);
    const padded = Buffer.alloc((t.data.length + 3) & ~3);
    t.data.copy(padded);
    parts.push(padded);
    offset += padded.length;
  });
  return Buffer.concat(parts);
}

const cache = new Map<string, Promise<Buffer>>();
function bytes(path: string) {
  if (!cache.has(path)) cache.set(path, readFile(require.resolve(path)).then(sfntFromWoff));
  return cache.get(path)!;
}

export interface PdfFonts {
  regular: PDFFont;
  semibold: PDFFont;
  bold: PDFFont;
}

type Fontkit = Parameters<PDFDocument["registerFontkit"]>[0];
type ParsedFont = ReturnType<Fontkit["create"]>;

/**
 * Laying out a line with Inter Tight's contextual alternates costs about a millisecond, and pdf-lib lays a line
 * out twice: once when we measure it to wrap, again when it is drawn. The font remembers its last few layouts,
 * so the drawing reuses the measuring; a handful is enough, as a line is drawn right after it is measured.
 */
function rememberRecentLayouts(font: ParsedFont, size = 16): ParsedFont {
  const layout = font.layout.bind(font);
  const recent = new Map<string, ReturnType<ParsedFont["layout"]>>();
  font.layout = (text, features) => {
    if (features !== undefined) return layout(text, features);
    let run = recent.get(text);
    if (run) recent.delete(text);
    else run = layout(text);
    recent.set(text, run);
    if (recent.size > size) recent.delete(recent.keys().next().value!);
    return run;
  };
  return font;
}

/**
 * fontkit, handing out one parsed font per file for the life of the process. Each document still gets its own
 * subset; what is shared is the parsed tables (glyph substitution and positioning above all), which fontkit
 * otherwise reads again for every document before it lays out its first line.
 */
const parsed = new WeakMap<Uint8Array, ParsedFont>();
const sharedFontkit: Fontkit = {
  create(data, postscriptName) {
    if (postscriptName) return fontkit.create(data, postscriptName);
    if (!parsed.has(data)) parsed.set(data, rememberRecentLayouts(fontkit.create(data)));
    return parsed.get(data)!;
  },
};

export async function embedFonts(doc: PDFDocument): Promise<PdfFonts> {
  doc.registerFontkit(sharedFontkit);
  const [regular, semibold, bold] = await Promise.all(
    (Object.values(files) as string[]).map(async (f) => doc.embedFont(await bytes(f), { subset: true })),
  );
  return { regular: regular!, semibold: semibold!, bold: bold! };
}

/** The latin subset has no arrows or maths signs: say them in words so nothing silently drops out of a record. */
export function printable(text: string) {
  return text
    .replace(/≤/g, "at most ")
    .replace(/≥/g, "at least ")
    .replace(/→/g, "->")
    .replace(/[✓✔]/g, "OK")
    .replace(/[⚠]/g, "!")
    .replace(/×/g, "x")
    .replace(/[^\x20-\x7e\u00a0-\u017f\u2013\u2014\u2018\u2019\u201c\u201d\u2022\u2026\n]/g, "?");
}
