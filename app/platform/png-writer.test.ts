import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { indexedPng, type Rgb } from "./png-writer.server";

const palette: Rgb[] = [[255, 255, 255], [178, 86, 34], [52, 84, 122], [196, 190, 180], [240, 214, 196]];

describe("indexed PNG", () => {
  it("decodes to the palette colour of every pixel, with a size that is not a multiple of anything", async () => {
    const [width, height] = [37, 19];
    const indices = Uint8Array.from({ length: width * height }, (_, i) => (i * 7 + Math.floor(i / width)) % palette.length);
    const png = await indexedPng(indices, width, height, palette);
    expect(png.subarray(1, 4).toString("latin1")).toBe("PNG");
    expect([png[24], png[25]]).toEqual([8, 3]); // 8 bits an index, indexed colour
    const { data, info } = await sharp(png).raw().toBuffer({ resolveWithObject: true });
    expect([info.width, info.height, info.channels]).toEqual([width, height, 3]);
    expect([...data]).toEqual([...indices].flatMap((i) => palette[i]!));
  });

  it("stays small for a large, mostly blank sheet", async () => {
    const [width, height] = [3312, 2339];
    const indices = new Uint8Array(width * height);
    indices.fill(2, 1000 * width + 500, 1000 * width + 900);
    const png = await indexedPng(indices, width, height, palette);
    expect(png.length).toBeLessThan(40_000);
    const data = await sharp(png).extract({ left: 0, top: 1000, width, height: 1 }).raw().toBuffer();
    expect([...data.subarray(499 * 3, 501 * 3)]).toEqual([...palette[0]!, ...palette[2]!]);
  });

  it("refuses indices that do not fill the picture, and an empty or oversized palette", async () => {
    await expect(indexedPng(new Uint8Array(5), 2, 3, palette)).rejects.toThrow(RangeError);
    await expect(indexedPng(new Uint8Array(6), 2, 3, [])).rejects.toThrow(RangeError);
    await expect(indexedPng(new Uint8Array(6), 2, 3, Array.from({ length: 257 }, (): Rgb => [0, 0, 0]))).rejects.toThrow(RangeError);
  });
});
