// A plain flowing-text writer for Countersign's own A4 documents (approval records, compliance records,
// non-compliance notices): paragraphs that wrap and break across pages, section headings, our type and colours.
import { rgb, type PDFDocument, type PDFFont, type PDFPage } from "pdf-lib";
import { printable, type PdfFonts } from "./pdf-fonts.server";

export const INK = rgb(0.114, 0.102, 0.086);
export const SOFT = rgb(0.353, 0.322, 0.282);
export const COPPER = rgb(0.604, 0.29, 0.125);

/**
 * Greedy wrapping: each line takes as many words as fit in `width`, and a word too long for any line stands
 * alone. Laying out text with our font is the costly part of writing a PDF, so rather than measuring the line
 * again after every word, a paragraph that fits is measured once and a longer one is cut by halving. That gives
 * the same lines as adding word by word because a line only grows wider as words join it.
 */
export function wrap(text: string, font: PDFFont, size: number, width: number): string[] {
  const out: string[] = [];
  const fits = (words: string[]) => font.widthOfTextAtSize(words.join(" "), size) <= width;
  for (const paragraph of text.split("\n")) {
    let words = paragraph.split(/\s+/).filter(Boolean);
    if (!words.length) out.push("");
    while (words.length) {
      let take = words.length;
      if (!fits(words)) {
        // words[0..low) fits (one word always goes), words[0..high) does not.
        let [low, high] = [1, words.length];
        while (high - low > 1) {
          const mid = (low + high) >> 1;
          if (fits(words.slice(0, mid))) low = mid;
          else high = mid;
        }
        take = low;
      }
      out.push(words.slice(0, take).join(" "));
      words = words.slice(take);
    }
  }
  return out;
}

export function a4Writer(doc: PDFDocument, fonts: PdfFonts) {
  const [W, H, M] = [595.28, 841.89, 48];
  let page: PDFPage = doc.addPage([W, H]);
  let y = H - M;
  const ensure = (needed: number) => {
    if (y - needed < M) {
      page = doc.addPage([W, H]);
      y = H - M;
    }
  };
  const para = (s: string, size = 9.5, font = fonts.regular, color = INK, indent = 0) => {
    for (const line of wrap(printable(s), font, size, W - 2 * M - indent)) {
      ensure(size + 4);
      y -= size;
      page.drawText(line, { x: M + indent, y, size, font, color });
      y -= 4;
    }
  };
  const heading = (s: string) => {
    y -= 10;
    ensure(30);
    y -= 12;
    page.drawText(printable(s), { x: M, y, size: 12, font: fonts.bold, color: COPPER });
    y -= 8;
  };
  const gap = (pt: number) => {
    y -= pt;
  };
  return { para, heading, gap, fonts };
}
