import { describe, expect, it } from "vitest";
import { diffRasters, OVERLAY_PALETTE, overlayIndices, overlayPixels, type RasterImage } from "./raster-diff";

function blank(width: number, height: number): RasterImage {
  return { width, height, data: new Uint8ClampedArray(width * height * 4).fill(255) };
}
function ink(img: RasterImage, x0: number, y0: number, w: number, h: number, rgba = [0, 0, 0, 255]) {
  for (let y = y0; y < y0 + h; y++) for (let x = x0; x < x0 + w; x++) img.data.set(rgba, (y * img.width + x) * 4);
}

/** The diff's rule stated pixel by pixel, as plainly as it can be: the fast passes must agree with it. */
function reference(before: RasterImage, after: RasterImage, threshold = 180) {
  const width = Math.max(before.width, after.width);
  const height = Math.max(before.height, after.height);
  const isInk = (img: RasterImage, x: number, y: number) => {
    if (x >= img.width || y >= img.height) return false;
    const [r, g, b, a] = img.data.slice((y * img.width + x) * 4, (y * img.width + x) * 4 + 4);
    const lum = img.premultiplied ? 0.299 * r! + 0.587 * g! + 0.114 * b! + (255 - a!) : (0.299 * r! + 0.587 * g! + 0.114 * b!) * (a! / 255) + 255 * (1 - a! / 255);
    return lum < threshold - 1e-9;
  };
  const near = (img: RasterImage, x: number, y: number) => {
    for (let dy = -1; dy <= 1; dy++) for (let dx = -1; dx <= 1; dx++) if (x + dx >= 0 && y + dy >= 0 && isInk(img, x + dx, y + dy)) return true;
    return false;
  };
  const mask = new Uint8Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const [a, b] = [isInk(before, x, y), isInk(after, x, y)];
      mask[y * width + x] = a && !near(after, x, y) ? 1 : b && !near(before, x, y) ? 2 : a || b ? 3 : 0;
    }
  }
  return mask;
}

/** Random strokes of random greys (some partly transparent) and a frame of ink, reproducible from the seed. */
function scribble(width: number, height: number, seed: number, premultiplied = false): RasterImage {
  const img = { ...blank(width, height), premultiplied };
  let s = seed;
  const rnd = (n: number) => ((s = (s * 1103515245 + 12345) >>> 0) >>> 16) % n;
  const stroke = (x0: number, y0: number, w: number, h: number, grey: number, alpha: number) => {
    const c = premultiplied ? Math.round((grey * alpha) / 255) : grey;
    ink(img, x0, y0, Math.min(w, width - x0), Math.min(h, height - y0), [c, c, c, alpha]);
  };
  for (let i = 0; i < 60; i++) stroke(rnd(width), rnd(height), 1 + rnd(12), 1 + rnd(3), rnd(256), rnd(3) === 0 ? rnd(256) : 255);
  const edge = rnd(4);
  if (edge === 0) stroke(0, 0, width, 1, 0, 255);
  if (edge === 1) stroke(0, height - 1, width, 1, 0, 255);
  if (edge === 2) stroke(0, 0, 1, height, 0, 255);
  if (edge === 3) stroke(width - 1, 0, 1, height, 0, 255);
  return img;
}

describe("raster diff", () => {
  it("finds nothing between identical images", () => {
    const a = blank(100, 80);
    ink(a, 10, 10, 30, 3);
    const d = diffRasters(a, structuredClone(a));
    expect(d.regions).toEqual([]);
    expect(d.addedPixels + d.removedPixels).toBe(0);
    expect(d.mask.filter((m) => m === 3)).toHaveLength(90);
  });

  it("tolerates a one-pixel shift from anti-aliasing", () => {
    const a = blank(100, 80);
    const b = blank(100, 80);
    ink(a, 10, 10, 30, 3);
    ink(b, 11, 11, 30, 3);
    expect(diffRasters(a, b).regions).toEqual([]);
  });

  it("counts a two-pixel shift as a change", () => {
    const a = blank(100, 80);
    const b = blank(100, 80);
    ink(a, 12, 14, 30, 1); // both lines inside one row of 12-pixel cells
    ink(b, 12, 16, 30, 1);
    const d = diffRasters(a, b);
    expect([d.removedPixels, d.addedPixels]).toEqual([30, 30]);
    expect(d.regions).toHaveLength(1);
    expect(d.regions[0]).toMatchObject({ kind: "changed", added: 30, removed: 30 });
  });

  it("boxes added and removed ink separately, in reading order", () => {
    const a = blank(200, 160);
    const b = blank(200, 160);
    ink(a, 20, 20, 40, 4); // removed line, top left
    ink(b, 120, 100, 50, 30); // added block, lower right
    const d = diffRasters(a, b, { cell: 10 });
    expect(d.regions).toHaveLength(2);
    const [first, second] = d.regions;
    expect(first).toMatchObject({ kind: "removed" });
    expect(first!.x).toBeLessThanOrEqual(20);
    expect(first!.x + first!.w).toBeGreaterThanOrEqual(60);
    expect(second).toMatchObject({ kind: "added" });
    expect(second!.x).toBeLessThanOrEqual(120);
    expect(second!.y + second!.h).toBeGreaterThanOrEqual(130);
    expect(d.removedPixels).toBe(160);
    expect(d.addedPixels).toBe(1500);
  });

  it("compares images of different sizes on the larger canvas", () => {
    const a = blank(50, 50);
    const b = blank(80, 60);
    ink(b, 60, 45, 10, 10);
    const d = diffRasters(a, b);
    expect([d.width, d.height]).toEqual([80, 60]);
    expect(d.regions[0]!.kind).toBe("added");
  });

  it("marks ink on every edge of the sheet, and does not carry it across an edge", () => {
    for (const width of [13, 16, 17]) {
      const a = blank(width, 9);
      const b = blank(width, 9);
      ink(a, 0, 0, 1, 9); // left column, only before
      ink(b, width - 1, 0, 1, 9); // right column, only after
      ink(a, 2, 8, width - 4, 1); // bottom row, in both
      ink(b, 2, 8, width - 4, 1);
      const d = diffRasters(a, b, { cell: 4, minPixelsPerCell: 1 });
      expect(d.mask).toEqual(reference(a, b));
      expect([d.removedPixels, d.addedPixels]).toEqual([9, 9]);
    }
  });

  it("agrees pixel for pixel with the rule stated plainly, on random sheets of odd sizes", () => {
    const seen = new Set<number>();
    for (const [w1, h1, w2, h2] of [[37, 23, 37, 23], [64, 40, 61, 45], [5, 3, 9, 2], [120, 90, 118, 93]] as const) {
      for (const premultiplied of [false, true]) {
        const a = scribble(w1, h1, w1 * 7 + h2, premultiplied);
        const b = scribble(w2, h2, w2 * 13 + h1, premultiplied);
        const d = diffRasters(a, b);
        const want = reference(a, b);
        want.forEach((m) => seen.add(m));
        expect(d.mask).toEqual(want);
        expect(d.removedPixels).toBe(want.filter((m) => m === 1).length);
        expect(d.addedPixels).toBe(want.filter((m) => m === 2).length);
        const boxed = d.regions.reduce((n, r) => n + r.added + r.removed, 0);
        expect(boxed).toBeLessThanOrEqual(d.addedPixels + d.removedPixels);
      }
    }
    expect([...seen].sort()).toEqual([0, 1, 2, 3]);
  });

  it("counts as ink only what is darker than the threshold", () => {
    const img = blank(9, 3);
    ink(img, 0, 1, 1, 1, [179, 179, 179, 255]);
    ink(img, 4, 1, 1, 1, [180, 180, 180, 255]); // luminance exactly 180: paper
    ink(img, 8, 1, 1, 1, [255, 0, 0, 255]); // red: luminance 76, ink
    expect([...diffRasters(blank(9, 3), img).mask.subarray(9, 18)]).toEqual([2, 0, 0, 0, 0, 0, 0, 0, 2]);
  });

  it("reads partly transparent ink the same, premultiplied or not", () => {
    const straight = blank(8, 8);
    const premultiplied = { ...blank(8, 8), premultiplied: true };
    ink(straight, 2, 2, 2, 2, [0, 0, 0, 128]); // half-transparent black: luminance 127, ink
    ink(straight, 5, 5, 2, 2, [0, 0, 0, 64]); // a quarter: luminance 191, paper
    ink(premultiplied, 2, 2, 2, 2, [0, 0, 0, 128]);
    ink(premultiplied, 5, 5, 2, 2, [0, 0, 0, 64]);
    ink(straight, 0, 5, 1, 1, [170, 170, 170, 250]); // nearly opaque grey: luminance 172, ink
    ink(straight, 0, 7, 1, 1, [200, 200, 200, 250]); // luminance 201, paper
    ink(premultiplied, 0, 5, 1, 1, [167, 167, 167, 250]);
    ink(premultiplied, 0, 7, 1, 1, [196, 196, 196, 250]);
    for (const img of [straight, premultiplied]) {
      const d = diffRasters(blank(8, 8), img);
      expect(d.addedPixels).toBe(5);
      expect(d.mask[2 * 8 + 2]).toBe(2);
      expect(d.mask[5 * 8 + 5]).toBe(0);
      expect(d.mask[5 * 8]).toBe(2);
      expect(d.mask[7 * 8]).toBe(0);
    }
  });

  it("draws removed ink broken and added ink solid in the overlay", () => {
    const a = blank(40, 40);
    const b = blank(40, 40);
    ink(a, 0, 0, 12, 12);
    ink(b, 24, 24, 12, 12);
    const px = overlayPixels(diffRasters(a, b));
    const at = (x: number, y: number) => [...px.slice((y * 40 + x) * 4, (y * 40 + x) * 4 + 3)];
    const removed = new Set(Array.from({ length: 10 }, (_, i) => at(i, 2).join()));
    expect(removed.size).toBeGreaterThan(1); // a dash pattern, not one flat colour
    const added = new Set(Array.from({ length: 10 }, (_, i) => at(25 + i, 28).join()));
    expect(added.size).toBe(1);
  });

  it("gives every pixel its palette colour: paper, removed in a diagonal dash, added, unchanged", () => {
    const a = blank(23, 11);
    const b = blank(23, 11);
    ink(a, 0, 0, 23, 4); // removed band across the whole width (odd, so rows do not line up with words)
    ink(b, 3, 7, 9, 3); // added block
    ink(a, 15, 7, 4, 3); // unchanged block
    ink(b, 15, 7, 4, 3);
    const indices = overlayIndices(diffRasters(a, b));
    const block = (y: number) => y >= 7 && y < 10;
    const want = (x: number, y: number) => (y < 4 ? ((x + y) % 6 < 4 ? 1 : 4) : block(y) && x >= 3 && x < 12 ? 2 : block(y) && x >= 15 && x < 19 ? 3 : 0);
    expect([...indices]).toEqual(Array.from({ length: 23 * 11 }, (_, i) => want(i % 23, Math.floor(i / 23))));
    const px = overlayPixels(diffRasters(a, b));
    expect([...px.slice(0, 4)]).toEqual([...OVERLAY_PALETTE[1], 255]);
    expect([...px.slice(4 * 4, 4 * 4 + 4)]).toEqual([...OVERLAY_PALETTE[4], 255]);
  });
});
