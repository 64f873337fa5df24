// Inter Tight, embedded (subset) in every PDF Countersign generates, so printed records use the product's type.
import { readFile } from "node:fs/promises";
import { createRequire } from "node:module";
import fontkit from "@pdf-lib/fontkit";
import type { PDFDocument, PDFFont } from "pdf-lib";

const require = createRequire(import.meta.url);
const files = {
  regular: "@fontsource/inter-tight/files/inter-tight-latin-400-normal.woff",
  semibold: "@fontsource/inter-tight/files/inter-tight-latin-600-normal.woff",
  bold: "@fontsource/inter-tight/files/inter-tight-latin-700-normal.woff",
} as const;

const cache = new Map<string, Promise<Buffer>>();
function bytes(path: string) {
  if (!cache.has(path)) cache.set(path, readFile(require.resolve(path)));
  return cache.get(path)!;
}

export interface PdfFonts {
  regular: PDFFont;
  semibold: PDFFont;
  bold: PDFFont;
}

export async function embedFonts(doc: PDFDocument): Promise<PdfFonts> {
  doc.registerFontkit(fontkit);
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
