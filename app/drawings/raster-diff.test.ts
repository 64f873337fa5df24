import { describe, expect, it } from "vitest";
import { diffRasters, overlayPixels, type RasterImage } from "./raster-diff";

function blank(width: number, height: number): RasterImage {
  return { width, height, data: new Uint8ClampedArray(width * height * 4).fill(255) };
}
function ink(img: RasterImage, x0: number, y0: number, w: number, h: number) {
  for (let y = y0; y < y0 + h; y++) for (let x = x0; x < x0 + w; x++) img.data.set([0, 0, 0, 255], (y * img.width + x) * 4);
}

describe("raster diff", () => {
  it("finds nothing between identical images", () => {
    const a = blank(100, 80);
    ink(a, 10, 10, 30, 3);
    const d = diffRasters(a, structuredClone(a));
    expect(d.regions).toEqual([]);
    expect(d.addedPixels + d.removedPixels).toBe(0);
  });

  it("tolerates a one-pixel shift from anti-aliasing", () => {
    const a = blank(100, 80);
    const b = blank(100, 80);
    ink(a, 10, 10, 30, 3);
    ink(b, 11, 11, 30, 3);
    expect(diffRasters(a, b).regions).toEqual([]);
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
});
