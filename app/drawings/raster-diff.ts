// Visual comparison of two renderings of a sheet at the same scale: which ink was removed, which was added, and
// the boxes around the changed regions. Works on raw RGBA (no image encoding) and tolerates one pixel of
// anti-aliasing shift. Pure: the server runs it on @napi-rs/canvas pixels, tests on hand-made arrays.

export interface RasterImage {
  width: number;
  height: number;
  data: Uint8ClampedArray | Uint8Array;
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
  /** Cells of gap still joined into one region. */
  joinCells?: number;
  maxRegions?: number;
}

function inkMask(img: RasterImage, width: number, height: number, threshold: number) {
  const mask = new Uint8Array(width * height);
  for (let y = 0; y < Math.min(height, img.height); y++) {
    for (let x = 0; x < Math.min(width, img.width); x++) {
      const i = (y * img.width + x) * 4;
      const d = img.data;
      const a = d[i + 3]! / 255;
      // Transparent counts as white paper.
      const lum = (0.299 * d[i]! + 0.587 * d[i + 1]! + 0.114 * d[i + 2]!) * a + 255 * (1 - a);
      if (lum < threshold) mask[y * width + x] = 1;
    }
  }
  return mask;
}

/** The mask grown by one pixel in every direction, so a one-pixel shift is not a change. */
function dilate(mask: Uint8Array, width: number, height: number) {
  const out = new Uint8Array(mask.length);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      if (!mask[y * width + x]) continue;
      for (let dy = -1; dy <= 1; dy++) {
        const yy = y + dy;
        if (yy < 0 || yy >= height) continue;
        for (let dx = -1; dx <= 1; dx++) {
          const xx = x + dx;
          if (xx >= 0 && xx < width) out[yy * width + xx] = 1;
        }
      }
    }
  }
  return out;
}

export function diffRasters(before: RasterImage, after: RasterImage, options: DiffOptions = {}): RasterDiff {
  const threshold = options.inkThreshold ?? 180;
  const cell = options.cell ?? 12;
  const minPixels = options.minPixelsPerCell ?? 3;
  const join = options.joinCells ?? 2;
  const maxRegions = options.maxRegions ?? 200;
  const width = Math.max(before.width, after.width);
  const height = Math.max(before.height, after.height);
  const a = inkMask(before, width, height, threshold);
  const b = inkMask(after, width, height, threshold);
  const aWide = dilate(a, width, height);
  const bWide = dilate(b, width, height);

  const mask = new Uint8Array(width * height);
  const cols = Math.ceil(width / cell);
  const rows = Math.ceil(height / cell);
  const cellAdded = new Uint32Array(cols * rows);
  const cellRemoved = new Uint32Array(cols * rows);
  let addedPixels = 0;
  let removedPixels = 0;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      const c = Math.floor(y / cell) * cols + Math.floor(x / cell);
      if (a[i] && !bWide[i]) {
        mask[i] = 1;
        removedPixels++;
        cellRemoved[c]!++;
      } else if (b[i] && !aWide[i]) {
        mask[i] = 2;
        addedPixels++;
        cellAdded[c]!++;
      } else if (a[i] || b[i]) {
        mask[i] = 3;
      }
    }
  }

  // Connected components over changed cells, joining across small gaps.
  const label = new Int32Array(cols * rows).fill(-1);
  const regions: Region[] = [];
  const changed = (c: number) => cellAdded[c]! + cellRemoved[c]! >= minPixels;
  for (let start = 0; start < cols * rows; start++) {
    if (label[start] !== -1 || !changed(start)) continue;
    const id = regions.length;
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, added = 0, removed = 0;
    const stack = [start];
    label[start] = id;
    while (stack.length) {
      const c = stack.pop()!;
      const cx = c % cols, cy = Math.floor(c / cols);
      minX = Math.min(minX, cx); maxX = Math.max(maxX, cx); minY = Math.min(minY, cy); maxY = Math.max(maxY, cy);
      added += cellAdded[c]!;
      removed += cellRemoved[c]!;
      for (let dy = -join; dy <= join; dy++) {
        for (let dx = -join; dx <= join; dx++) {
          const nx = cx + dx, ny = cy + dy;
          if (nx < 0 || ny < 0 || nx >= cols || ny >= rows) continue;
          const n = ny * cols + nx;
          if (label[n] === -1 && changed(n)) {
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

/** Colours of our own for the overlay (RGB). Removed ink is also drawn broken (dashed), added ink solid. */
export const OVERLAY_COLOURS = {
  removed: [178, 86, 34] as const, // copper
  added: [52, 84, 122] as const, // blue-slate
  unchanged: [196, 190, 180] as const,
};

/** RGBA pixels of the overlay: faint unchanged ink, removed ink copper in a diagonal dash, added ink blue-slate. */
export function overlayPixels(diff: RasterDiff): Uint8ClampedArray {
  const { width, height, mask } = diff;
  const out = new Uint8ClampedArray(width * height * 4);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      const m = mask[i]!;
      let rgb: readonly number[] = [255, 255, 255];
      if (m === 3) rgb = OVERLAY_COLOURS.unchanged;
      else if (m === 2) rgb = OVERLAY_COLOURS.added;
      else if (m === 1) rgb = (x + y) % 6 < 4 ? OVERLAY_COLOURS.removed : [240, 214, 196];
      out[i * 4] = rgb[0]!;
      out[i * 4 + 1] = rgb[1]!;
      out[i * 4 + 2] = rgb[2]!;
      out[i * 4 + 3] = 255;
    }
  }
  return out;
}
