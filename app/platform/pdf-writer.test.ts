// Wrapping with our font: the same lines as filling each line word by word, measured with fewer layouts.
import fc from "fast-check";
import { PDFDocument } from "pdf-lib";
import { beforeAll, describe, expect, it } from "vitest";
import { embedFonts, type PdfFonts } from "./pdf-fonts.server";
import { wrap } from "./pdf-writer.server";

/** The plain greedy fill: add the next word while the line still fits; a word wider than a line stands alone. */
function wordByWord(text: string, font: PdfFonts["regular"], size: number, width: number) {
  const out: string[] = [];
  for (const paragraph of text.split("\n")) {
    let line = "";
    for (const word of paragraph.split(/\s+/).filter(Boolean)) {
      const next = line ? `${line} ${word}` : word;
      if (font.widthOfTextAtSize(next, size) > width && line) {
        out.push(line);
        line = word;
      } else line = next;
    }
    out.push(line);
  }
  return out;
}

let fonts: PdfFonts;
beforeAll(async () => {
  fonts = await embedFonts(await PDFDocument.create());
});

const WORDS = ["a", "to", "run", "28 mm", "valve", "outlet", "—", "discharge", "termination", "SHA-256", "0".repeat(64), "P-101", "rev", "Ö", "“fi”", "->", "1.", "(clause", "x.y)", "WWWWWWWW", "iiiiiiii"];

describe("wrap", () => {
  it("gives the same lines as filling word by word", () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.constantFrom(...WORDS), fc.constantFrom("\n", "  ", " \n\n ")), { maxLength: 60 }),
        fc.constantFrom(6.5, 8.5, 9.5, 12),
        fc.integer({ min: 20, max: 520 }),
        fc.constantFrom<keyof PdfFonts>("regular", "semibold", "bold"),
        (parts, size, width, weight) => {
          const text = parts.join(" ");
          expect(wrap(text, fonts[weight], size, width)).toEqual(wordByWord(text, fonts[weight], size, width));
        },
      ),
      { numRuns: 150 },
    );
  });

  it("keeps empty paragraphs and puts a word wider than the line on a line of its own", () => {
    expect(wrap("one\n\ntwo", fonts.regular, 9, 200)).toEqual(["one", "", "two"]);
    expect(wrap(`see ${"0".repeat(64)} here`, fonts.regular, 9, 60)).toEqual(["see", "0".repeat(64), "here"]);
  });
});
