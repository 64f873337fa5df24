// Visual comparison of two renderings of a sheet at the same scale: which ink was removed, which was added, and
// the boxes around the changed regions; and the overlay drawn from it as palette indices (one byte a pixel, a
// handful of colours) so it encodes as a small indexed PNG. Works on raw RGBA (no image encoding) and tolerates
// one pixel of anti-aliasing shift. Pure: the server runs it on @napi-rs/canvas pixels, tests on hand-made arrays.
//
// An A1 sheet at 100 dpi is some 7.7 million pixels, so the passes are plain loops over typed arrays: white
// paper is skipped a whole pixel (one 32-bit read) at a time, both sheets' ink sits in one byte per pixel (bit 0
// older, bit 1 newer) and is grown by one pixel with shifts and ORs four pixels at a time. The word-wise passes
// take the byte order of x86 and ARM as run by Node (little-endian).

export interface RasterImage {
  width: number;
  height: number;
  /** RGBA, 4 bytes a pixel, rows without padding. */
  data: Uint8ClampedArray | Uint8Array;
  /** Colour already multiplied by alpha (a canvas's own buffer); straight RGBA when absent. */
  premultiplied?: boolean;
}

export type RegionKind = "added" | "removed" | "changed";

export interface Region {
  /** Box in pixels of the rendering. */
  x: number;
  y: number;
  w: number;
  h: number;
  added: number;
  removed: number;
  kind: RegionKind;
}

export interface RasterDiff {
  width: number;
  height: number;
  addedPixels: number;
  removedPixels: number;
  regions: Region[];
  /** 0 = no change, 1 = removed ink, 2 = added ink, 3 = unchanged ink; one byte per pixel. */
  mask: Uint8Array;
}

export interface DiffOptions {
  /** Luminance below which a pixel counts as ink (0–255). */
  inkThreshold?: number;
  /** Grid cell size used to gather changed pixels into regions. */
  cell?: number;
  /** Changed pixels a cell needs before it counts (filters speckle). */
  minPixelsPerCell?: number;
  /** Changed-cell gap still joined into one region. */
  joinCells?: number;
  maxRegions?: number;
}

/** An opaque white pixel read as one signed 32-bit word (Int32Array: small integers to the JIT). */
const WHITE = -1;
const LOW_BITS = 0x01010101;

/**
 * Working layout of the ink bytes: a row stride of whole 32-bit words with at least one empty byte at its end,
 * and one empty row above and below, so growing by a pixel never needs a bounds check (the empty bytes are the
 * neighbours across every edge).
 */
function layout(width: number, height: number) {
  const stride = (width + 4) & ~3;
  return { stride, words: stride >> 2, bytes: stride * (height + 2) };
}

/**
 * Sets `bit` where the image has ink: luminance (0.299 R + 0.587 G + 0.114 B, transparent counting as white
 * paper) below the threshold. Integer arithmetic scaled by 1000 (and by 255 for partial alpha), so exact.
 */
function markInk(img: RasterImage, ink: Uint8Array, stride: number, width: number, height: number, threshold: number, bit: number) {
  const d = img.data;
  if (d.length < img.width * img.height * 4) throw new RangeError(`Expected ${img.width} × ${img.height} RGBA pixels.`);
  const px = d.byteOffset % 4 === 0 ? new Int32Array(d.buffer, d.byteOffset, d.length >> 2) : new Int32Array(Uint8Array.from(d).buffer);
  const w = Math.min(width, img.width);
  const h = Math.min(height, img.height);
  const limit = threshold * 1000;
  for (let y = 0; y < h; y++) {
    const src = y * img.width;
    const dst = (y + 1) * stride;
    for (let x = 0; x < w; x++) {
      if (px[src + x] === WHITE) continue;
      const i = (src + x) << 2;
      const a = d[i + 3]!;
      const weighted = 299 * d[i]! + 587 * d[i + 1]! + 114 * d[i + 2]!;
      const dark =
        a === 255 ? weighted < limit
        : img.premultiplied ? weighted + 1000 * (255 - a) < limit
        : weighted * a + 255000 * (255 - a) < limit * 255;
      if (dark) ink[dst + x]! |= bit;
    }
  }
}

/** Row `r` of the ink bytes with each byte ORed with its left and right neighbours (four bytes a step). */
function growAlongRow(ink: Int32Array, r: number, words: number, out: Int32Array, at: number) {
  const first = r * words;
  const end = Math.min(first + words, ink.length - 1);
  for (let j = Math.max(first, 1); j < end; j++) {
    const w = ink[j]!;
    const prev = ink[j - 1]!;
    const next = ink[j + 1]!;
    out[at + j - first] = w | (w << 8) | ((prev >> 24) & 0xff) | ((w >> 8) & 0xffffff) | (next << 24);
  }
}

/**
 * The ink bytes' buffer, kept from one diff to the next: a fresh one would be a fresh 8 MB for an A1 sheet,
 * and the first write to each of its pages costs more than clearing it.
 */
let scratch = new Uint8Array(0);
function inkBuffer(bytes: number) {
  if (scratch.length < bytes) scratch = new Uint8Array(bytes);
  else scratch.fill(0, 0, bytes);
  return scratch.subarray(0, bytes);
}

export function diffRasters(before: RasterImage, after: RasterImage, options: DiffOptions = {}): RasterDiff {
  const threshold = options.inkThreshold ?? 180;
  const cell = options.cell ?? 12;
  const minPixels = options.minPixelsPerCell ?? 3;
  const join = options.joinCells ?? 2;
  const maxRegions = options.maxRegions ?? 200;
  const width = Math.max(before.width, after.width);
  const height = Math.max(before.height, after.height);
  const { stride, words, bytes } = layout(width, height);

  // Bit 0: ink in the older image, bit 1: in the newer. Grown by one pixel in every direction (rows here,
  // columns below), the same bits say "ink within a pixel of here", so a one-pixel shift is not a change.
  const ink = inkBuffer(bytes);
  markInk(before, ink, stride, width, height, threshold, 1);
  markInk(after, ink, stride, width, height, threshold, 2);
  const ink32 = new Int32Array(ink.buffer, 0, bytes >> 2);
  // Rows grown along, three at a time (the row above, this one, the one below), by row number modulo 3.
  const grown = new Int32Array(words * 3);
  growAlongRow(ink32, 1, words, grown, words);

  const mask = new Uint8Array(width * height);
  const cols = Math.ceil(width / cell);
  const rows = Math.ceil(height / cell);
  const cellAdded = new Uint32Array(cols * rows);
  const cellRemoved = new Uint32Array(cols * rows);
  let addedPixels = 0;
  let removedPixels = 0;
  const classes = new Int32Array(words);
  const classBytes = new Uint8Array(classes.buffer);
  for (let y = 0; y < height; y++) {
    const row = (y + 1) * words;
    const above = (y % 3) * words;
    const here = ((y + 1) % 3) * words;
    const below = ((y + 2) % 3) * words;
    grown.fill(0, below, below + words);
    if (y + 2 <= height) growAlongRow(ink32, y + 2, words, grown, below);
    const cellRow = Math.floor(y / cell) * cols;
    let any = false;
    for (let k = 0; k < words; k++) {
      const w = ink32[row + k]!;
      if (w === 0) {
        classes[k] = 0;
        continue;
      }
      const near = grown[above + k]! | grown[here + k]! | grown[below + k]!;
      const removed = w & ~(near >> 1) & LOW_BITS; // older ink with no newer ink near it
      const added = (w >> 1) & ~near & LOW_BITS; // newer ink with no older ink near it
      const unchanged = (w | (w >> 1)) & LOW_BITS & ~(removed | added);
      classes[k] = removed | (added << 1) | (unchanged * 3);
      any = true;
      if ((removed | added) === 0) continue;
      for (let b = 0; b < 4; b++) {
        const v = ((removed | (added << 1)) >> (b * 8)) & 3;
        if (!v) continue;
        const c = cellRow + Math.floor((k * 4 + b) / cell);
        if (v === 1) {
          removedPixels++;
          cellRemoved[c]!++;
        } else {
          addedPixels++;
          cellAdded[c]!++;
        }
      }
    }
    if (any) mask.set(classBytes.subarray(0, width), y * width);
  }

  // Connected components over changed cells, joining across small gaps.
  const changed = new Uint8Array(cols * rows);
  for (let c = 0; c < changed.length; c++) changed[c] = cellAdded[c]! + cellRemoved[c]! >= minPixels ? 1 : 0;
  const label = new Int32Array(cols * rows).fill(-1);
  const regions: Region[] = [];
  const stack: number[] = [];
  for (let start = 0; start < cols * rows; start++) {
    if (label[start] !== -1 || !changed[start]) continue;
    const id = regions.length;
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, added = 0, removed = 0;
    stack.push(start);
    label[start] = id;
    while (stack.length) {
      const c = stack.pop()!;
      const cx = c % cols, cy = Math.floor(c / cols);
      minX = Math.min(minX, cx); maxX = Math.max(maxX, cx); minY = Math.min(minY, cy); maxY = Math.max(maxY, cy);
      added += cellAdded[c]!;
      removed += cellRemoved[c]!;
      for (let ny = Math.max(0, cy - join); ny <= Math.min(rows - 1, cy + join); ny++) {
        for (let nx = Math.max(0, cx - join); nx <= Math.min(cols - 1, cx + join); nx++) {
          const n = ny * cols + nx;
          if (label[n] === -1 && changed[n]) {
            label[n] = id;
            stack.push(n);
          }
        }
      }
    }
    const x = minX * cell, y = minY * cell;
    regions.push({
      x,
      y,
      w: Math.min(width, (maxX + 1) * cell) - x,
      h: Math.min(height, (maxY + 1) * cell) - y,
      added,
      removed,
      kind: removed === 0 ? "added" : added === 0 ? "removed" : added / (added + removed) > 0.8 ? "added" : removed / (added + removed) > 0.8 ? "removed" : "changed",
    });
  }
  // Reading order: top to bottom, then left to right; the largest first when there are too many.
  const kept = regions.length > maxRegions ? [...regions].sort((p, q) => q.added + q.removed - (p.added + p.removed)).slice(0, maxRegions) : regions;
  kept.sort((p, q) => p.y - q.y || p.x - q.x);
  return { width, height, addedPixels, removedPixels, regions: kept, mask };
}

/**
 * The overlay's colours, our own (RGB), by palette index: paper, removed ink (copper), added ink (blue-slate),
 * unchanged ink (faint), and the gaps of the broken line removed ink is drawn in (added ink is solid).
 */
export const OVERLAY_PALETTE = [
  [255, 255, 255],
  [178, 86, 34],
  [52, 84, 122],
  [196, 190, 180],
  [240, 214, 196],
] as const satisfies readonly (readonly [number, number, number])[];

const REMOVED_GAP = 4;

/**
 * The overlay as palette indices into OVERLAY_PALETTE, one byte a pixel: the mask's own codes, with removed ink
 * broken into a diagonal dash (two pixels in six are the gap colour).
 */
export function overlayIndices(diff: RasterDiff): Uint8Array {
  const { width, mask } = diff;
  const out = mask.slice();
  const whole = out.length >> 2;
  const words = new Int32Array(out.buffer, 0, whole);
  for (let k = 0; k <= whole; k++) {
    // Removed is code 1: bit 0 without bit 1. Whole words without it are passed over.
    if (k < whole) {
      const w = words[k]!;
      if ((w & ~(w >> 1) & LOW_BITS) === 0) continue;
    }
    for (let i = k * 4; i < Math.min(k * 4 + 4, out.length); i++) {
      if (out[i] !== 1) continue;
      const x = i % width;
      const y = (i - x) / width;
      if ((x + y) % 6 >= 4) out[i] = REMOVED_GAP;
    }
  }
  return out;
}

/** RGBA pixels of the overlay (the palette looked up), for checks and previews. */
export function overlayPixels(diff: RasterDiff): Uint8ClampedArray {
  const indices = overlayIndices(diff);
  const out = new Uint8ClampedArray(indices.length * 4);
  for (let i = 0; i < indices.length; i++) {
    const rgb = OVERLAY_PALETTE[indices[i]!]!;
    out[i * 4] = rgb[0];
    out[i * 4 + 1] = rgb[1];
    out[i * 4 + 2] = rgb[2];
    out[i * 4 + 3] = 255;
  }
  return out;
}
