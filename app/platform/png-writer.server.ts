// Indexed-colour PNG (colour type 3, one byte a pixel) from palette indices. For large flat pictures of a few
// colours, such as the compare overlay: the image libraries here take RGBA and look for a palette themselves
// (a quantiser over millions of pixels) or cannot write one, and the pure-JS PNG encoders deflate in
// JavaScript; this is the four chunks around node:zlib, which deflates a mostly blank A1 sheet in milliseconds.
import { promisify } from "node:util";
import { constants, crc32, deflate } from "node:zlib";

const deflateAsync = promisify(deflate);
const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

export type Rgb = readonly [number, number, number];

function chunk(type: string, body: Uint8Array) {
  const out = Buffer.alloc(12 + body.length);
  out.writeUInt32BE(body.length, 0);
  out.write(type, 4, "latin1");
  out.set(body, 8);
  out.writeUInt32BE(crc32(out.subarray(4, 8 + body.length)), 8 + body.length);
  return out;
}

/** `indices` holds width × height palette indices, row after row; the palette has 1 to 256 colours. */
export async function indexedPng(indices: Uint8Array, width: number, height: number, palette: readonly Rgb[]): Promise<Buffer> {
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) throw new RangeError(`Bad PNG size ${width} × ${height}.`);
  if (indices.length !== width * height) throw new RangeError(`Expected ${width * height} palette indices, got ${indices.length}.`);
  if (palette.length < 1 || palette.length > 256) throw new RangeError("A PNG palette has 1 to 256 colours.");
  // Each row behind its filter byte, 0 (none): flat colour compresses as well unfiltered, and faster.
  const rows = Buffer.alloc((width + 1) * height);
  for (let y = 0; y < height; y++) rows.set(indices.subarray(y * width, (y + 1) * width), y * (width + 1) + 1);
  // Runs of one colour are what there is to find: run-length matching at the fastest level.
  const idat = await deflateAsync(rows, { level: 1, strategy: constants.Z_RLE, chunkSize: 1 << 20 });
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 8; // bits per index
  header[9] = 3; // indexed colour
  return Buffer.concat([SIGNATURE, chunk("IHDR", header), chunk("PLTE", Uint8Array.from(palette.flat())), chunk("IDAT", idat), chunk("IEND", new Uint8Array(0))]);
}
