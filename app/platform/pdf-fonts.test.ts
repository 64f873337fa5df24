// Our PDFs embed Inter Tight from its unwrapped TrueType form: the same font, glyph for glyph, as the WOFF the
// package ships, and one parsed font serves every document without one document's text leaking into another.
import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { readFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { createRequire } from "node:module";
import fontkit from "@pdf-lib/fontkit";
import { PDFDocument } from "pdf-lib";
import { describe, expect, it } from "vitest";
import { embedFonts, sfntFromWoff } from "./pdf-fonts.server";

const require = createRequire(import.meta.url);
const woffOf = (weight: number) => readFile(require.resolve(`@fontsource/inter-tight/files/inter-tight-latin-${weight}-normal.woff`));

describe("Inter Tight unwrapped from WOFF", () => {
  it.each([400, 600, 700])("has the same tables and shaping at weight %i", async (weight) => {
    const woff = await woffOf(weight);
    const sfnt = sfntFromWoff(woff);
    expect(sfnt.readUInt32BE(0)).toBe(woff.readUInt32BE(4)); // the WOFF's flavour: TrueType outlines
    const [packed, plain] = [fontkit.create(woff), fontkit.create(sfnt)];
    expect(plain.postscriptName).toBe(packed.postscriptName);
    expect(plain.numGlyphs).toBe(packed.numGlyphs);
    expect(plain.characterSet).toEqual(packed.characterSet);
    // Every table as fontkit's own WOFF reader inflates it, byte for byte, where the TrueType directory puts it.
    type Tables = { directory: { tables: Record<string, { offset: number; length: number }> }; stream: { buffer: Buffer } };
    const [inWoff, inSfnt] = [packed as unknown as Tables & { _getTableStream(tag: string): { buffer: Buffer; pos: number } }, plain as unknown as Tables];
    expect(Object.keys(inSfnt.directory.tables).sort()).toEqual(Object.keys(inWoff.directory.tables).sort());
    for (const [tag, { length }] of Object.entries(inWoff.directory.tables)) {
      const unpacked = inWoff._getTableStream(tag);
      const at = inSfnt.directory.tables[tag]!;
      expect(at.offset % 4, tag).toBe(0);
      expect(inSfnt.stream.buffer.subarray(at.offset, at.offset + at.length).equals(unpacked.buffer.subarray(unpacked.pos, unpacked.pos + length)), tag).toBe(true);
    }
    const text = "Approved with conditions · DR-042 v3 — 28 mm × 6.5 m, “office” fi fl -> 0123456789";
    const shape = (font: typeof packed) => {
      const run = font.layout(text);
      return { glyphs: run.glyphs.map((g) => g.id), positions: run.positions.map((p) => [p.xAdvance, p.xOffset, p.yOffset]) };
    };
    expect(shape(plain)).toEqual(shape(packed));
  });

  it("leaves a file that is not WOFF as it is", () => {
    const bytes = Buffer.from([0, 1, 0, 0, 0, 0]);
    expect(sfntFromWoff(bytes)).toBe(bytes);
  });
});

describe("fonts shared between documents", () => {
  it("give each document its own subset, built from its own text", async () => {
    const texts = ["Sheet P-101 approved", "Zygote quartz vexing jumbo"];
    const docs = await Promise.all(texts.map(() => PDFDocument.create()));
    const fonts = await Promise.all(docs.map((d) => embedFonts(d)));
    // Interleaved on purpose: one parsed font, and its remembered layouts, serve both documents in turn.
    for (const y of [700, 680]) {
      for (const [i, doc] of docs.entries()) {
        const page = doc.getPageCount() ? doc.getPage(0) : doc.addPage();
        page.drawText(texts[i]!, { x: 40, y, size: 12, font: fonts[i]!.regular });
      }
    }
    const dir = mkdtempSync(path.join(tmpdir(), "fonts-"));
    for (const [i, doc] of docs.entries()) {
      const file = path.join(dir, `${i}.pdf`);
      writeFileSync(file, await doc.save());
      const text = execFileSync("pdftotext", [file, "-"], { encoding: "utf8" });
      expect(text.split("\n").map((l) => l.trim()).filter(Boolean)).toEqual([texts[i], texts[i]]);
      expect(execFileSync("pdffonts", [file], { encoding: "utf8" })).toMatch(/InterTight-Regular\S*\s+CID TrueType\s+Identity-H\s+yes/);
    }
  });
});
