// Lengths on a sheet: the stated scale ("1:50") or a calibration from two points of a known distance turn PDF
// points into metres on site. Pure, for the canvas and its tests alike.

/** Millimetres on paper per PDF point (a point is 1/72 inch). */
export const PAPER_MM_PER_PT = 25.4 / 72;

/** The first ratio in a sheet's stated scale ("1:50", "1 : 100 @ A1", "Scale 1:20, 1:5") — its denominator. */
export function parseScale(text: string | null | undefined): number | null {
  const m = text?.match(/1\s*:\s*(\d+(?:[.,]\d+)?)/);
  if (!m) return null;
  const n = Number(m[1]!.replace(",", "."));
  return n > 0 ? n : null;
}

/** Metres on site per PDF point at a stated scale 1:denominator. */
export function metresPerPtAtScale(denominator: number): number {
  return (PAPER_MM_PER_PT * denominator) / 1000;
}

/** Sum of the segment lengths of x, y pairs, in PDF points. */
export function pathLengthPt(points: number[]): number {
  let total = 0;
  for (let i = 2; i + 1 < points.length; i += 2) total += Math.hypot(points[i]! - points[i - 2]!, points[i + 1]! - points[i - 1]!);
  return total;
}

/** Metres per point from two points on the sheet a known distance apart; null when that cannot work. */
export function calibrate(points: [number, number, number, number], knownM: number): number | null {
  const pt = pathLengthPt(points);
  if (!(pt > 0.5) || !(knownM > 0) || !Number.isFinite(knownM)) return null;
  return knownM / pt;
}

export function formatMetres(m: number): string {
  return m < 10 ? `${m.toFixed(2)} m` : `${m.toFixed(1)} m`;
}

/** The label a measured length carries on the sheet, e.g. "3.50 m". */
export function lengthLabel(points: number[], metresPerPt: number | null): string | undefined {
  return metresPerPt ? formatMetres(pathLengthPt(points) * metresPerPt) : undefined;
}

/** The metres a stored measure or pipe run label states ("3.50 m" → 3.5); null if none. */
export function labelMetres(text: string | undefined): number | null {
  const m = text?.match(/(\d+(?:\.\d+)?)\s*m\b/);
  return m ? Number(m[1]) : null;
}
