// Owns the pipe catalogue: sizes by material series, internal diameter, roughness and Hazen–Williams C, each
// row naming its source. A project extends or corrects it with mergeCatalogue; the balance solver upsizes a
// segment to the next larger internal diameter within the same series.
//
// Roughness and C are common handbook values for new pipe (from memory): drawn copper 0.0015 mm, plastics
// 0.007 mm, galvanised steel 0.15 mm; C = 140 copper, 150 plastics, 120 galvanised. Old pipe is rougher.

import { requireFinite, requirePositive } from "./guards";

export type PipeMaterial = "copper" | "pex" | "pp-r" | "pex-al-pex" | "galvanised-steel" | (string & {});

export interface PipeSpec {
  id: string;
  /** Sizes in the same series are interchangeable for upsizing (same material, class and jointing). */
  series: string;
  material: PipeMaterial;
  label: string;
  outsideDiameterMm: number;
  wallThicknessMm: number;
  /** When given it overrides outside diameter − 2 × wall (e.g. a measured bore). */
  internalDiameterMm?: number;
  roughnessMm: number;
  hazenWilliamsC: number;
  source: string;
}

const SANS460 =
  "SANS 460 Class 0 (hard drawn), sizes and walls from a South African maker's published SANS 460 tube table";
const EN1057 = "EN 1057 R250 (half hard) (from memory)";
const PEX = "PEX to EN ISO 15875, series S 3.2 / SDR 7.4 (from memory)";
const PPR = "PP-R to EN ISO 15874 / DIN 8077, PN 20, SDR 6 (from memory)";
const MLC = "PEX-Al-PEX multilayer to ISO 21003, common trade sizes (from memory)";
const GALV = "Galvanised steel to ISO 65 medium series (EN 10255 M) (from memory)";

type Row = [id: string, label: string, od: number, wall: number];

function series(
  seriesId: string,
  material: PipeMaterial,
  source: string,
  roughnessMm: number,
  hazenWilliamsC: number,
  rows: Row[],
): PipeSpec[] {
  return rows.map(([id, label, od, wall]) => ({
    id,
    series: seriesId,
    material,
    label,
    outsideDiameterMm: od,
    wallThicknessMm: wall,
    roughnessMm,
    hazenWilliamsC,
    source,
  }));
}

export const pipeCatalogue: readonly PipeSpec[] = Object.freeze([
  ...series("copper-sans460-class0", "copper", SANS460, 0.0015, 140, [
    ["cu-c0-15", "Copper 15 × 0.5 (SANS 460 Class 0)", 15, 0.5],
    ["cu-c0-22", "Copper 22 × 0.6 (SANS 460 Class 0)", 22, 0.6],
    ["cu-c0-28", "Copper 28 × 0.6 (SANS 460 Class 0)", 28, 0.6],
    ["cu-c0-35", "Copper 35 × 0.75 (SANS 460 Class 0)", 35, 0.75],
    ["cu-c0-42", "Copper 42 × 0.9 (SANS 460 Class 0)", 42, 0.9],
    ["cu-c0-54", "Copper 54 × 1.2 (SANS 460 Class 0)", 54, 1.2],
  ]),
  ...series("copper-en1057-r250", "copper", EN1057, 0.0015, 140, [
    ["cu-r250-15", "Copper 15 × 0.7 (EN 1057 R250)", 15, 0.7],
    ["cu-r250-22", "Copper 22 × 0.9 (EN 1057 R250)", 22, 0.9],
    ["cu-r250-28", "Copper 28 × 0.9 (EN 1057 R250)", 28, 0.9],
    ["cu-r250-35", "Copper 35 × 1.2 (EN 1057 R250)", 35, 1.2],
    ["cu-r250-42", "Copper 42 × 1.2 (EN 1057 R250)", 42, 1.2],
    ["cu-r250-54", "Copper 54 × 1.2 (EN 1057 R250)", 54, 1.2],
  ]),
  ...series("pex-sdr7.4", "pex", PEX, 0.007, 150, [
    ["pex-16", "PEX 16 × 2.2", 16, 2.2],
    ["pex-20", "PEX 20 × 2.8", 20, 2.8],
    ["pex-25", "PEX 25 × 3.5", 25, 3.5],
    ["pex-32", "PEX 32 × 4.4", 32, 4.4],
    ["pex-40", "PEX 40 × 5.5", 40, 5.5],
    ["pex-50", "PEX 50 × 6.9", 50, 6.9],
  ]),
  ...series("ppr-pn20", "pp-r", PPR, 0.007, 150, [
    ["ppr-20", "PP-R 20 × 3.4 (PN 20)", 20, 3.4],
    ["ppr-25", "PP-R 25 × 4.2 (PN 20)", 25, 4.2],
    ["ppr-32", "PP-R 32 × 5.4 (PN 20)", 32, 5.4],
    ["ppr-40", "PP-R 40 × 6.7 (PN 20)", 40, 6.7],
    ["ppr-50", "PP-R 50 × 8.3 (PN 20)", 50, 8.3],
    ["ppr-63", "PP-R 63 × 10.5 (PN 20)", 63, 10.5],
  ]),
  ...series("pex-al-pex", "pex-al-pex", MLC, 0.007, 150, [
    ["mlc-16", "PEX-Al-PEX 16 × 2.0", 16, 2.0],
    ["mlc-20", "PEX-Al-PEX 20 × 2.0", 20, 2.0],
    ["mlc-26", "PEX-Al-PEX 26 × 3.0", 26, 3.0],
    ["mlc-32", "PEX-Al-PEX 32 × 3.0", 32, 3.0],
    ["mlc-40", "PEX-Al-PEX 40 × 3.5", 40, 3.5],
    ["mlc-50", "PEX-Al-PEX 50 × 4.0", 50, 4.0],
  ]),
  ...series("galv-iso65-medium", "galvanised-steel", GALV, 0.15, 120, [
    ["galv-15", "Galvanised DN 15 (21.3 × 2.6)", 21.3, 2.6],
    ["galv-20", "Galvanised DN 20 (26.9 × 2.6)", 26.9, 2.6],
    ["galv-25", "Galvanised DN 25 (33.7 × 3.2)", 33.7, 3.2],
    ["galv-32", "Galvanised DN 32 (42.4 × 3.2)", 42.4, 3.2],
    ["galv-40", "Galvanised DN 40 (48.3 × 3.2)", 48.3, 3.2],
    ["galv-50", "Galvanised DN 50 (60.3 × 3.6)", 60.3, 3.6],
  ]),
]);

export function internalDiameterMm(pipe: PipeSpec): number {
  return pipe.internalDiameterMm ?? pipe.outsideDiameterMm - 2 * pipe.wallThicknessMm;
}

/** Problems with one catalogue row, in plain words; empty when the row is usable. */
export function pipeSpecProblems(pipe: PipeSpec): string[] {
  const problems: string[] = [];
  const finitePositive = (name: string, v: number) => {
    if (!Number.isFinite(v) || v <= 0) problems.push(`${name} must be greater than zero (got ${v})`);
  };
  if (!pipe.id) problems.push("id is empty");
  if (!pipe.series) problems.push("series is empty");
  finitePositive("outsideDiameterMm", pipe.outsideDiameterMm);
  finitePositive("wallThicknessMm", pipe.wallThicknessMm);
  finitePositive("hazenWilliamsC", pipe.hazenWilliamsC);
  if (!Number.isFinite(pipe.roughnessMm) || pipe.roughnessMm < 0) {
    problems.push(`roughnessMm cannot be negative (got ${pipe.roughnessMm})`);
  }
  const id = internalDiameterMm(pipe);
  if (!Number.isFinite(id) || id <= 0) {
    problems.push(`the wall (${pipe.wallThicknessMm} mm) leaves no bore in a ${pipe.outsideDiameterMm} mm pipe`);
  } else if (id >= pipe.outsideDiameterMm) {
    problems.push(`internal diameter ${id} mm is not smaller than the outside diameter ${pipe.outsideDiameterMm} mm`);
  }
  return problems;
}

/**
 * The base catalogue with a project's rows added; a row with an existing id replaces it. Throws a RangeError
 * naming the row when an extra row is unusable.
 */
export function mergeCatalogue(base: readonly PipeSpec[], extra: readonly PipeSpec[]): PipeSpec[] {
  const merged = new Map<string, PipeSpec>();
  for (const p of base) merged.set(p.id, p);
  const seen = new Set<string>();
  for (const p of extra) {
    const problems = pipeSpecProblems(p);
    if (problems.length) throw new RangeError(`pipe "${p.id}": ${problems.join("; ")}`);
    if (seen.has(p.id)) throw new RangeError(`pipe "${p.id}" appears twice in the project catalogue`);
    seen.add(p.id);
    merged.set(p.id, { ...p });
  }
  return [...merged.values()];
}

export function findPipe(catalogue: readonly PipeSpec[], id: string): PipeSpec | undefined {
  return catalogue.find((p) => p.id === id);
}

/** The sizes of one series, smallest bore first (ties broken by id so the order never depends on input order). */
export function seriesSizes(catalogue: readonly PipeSpec[], seriesId: string): PipeSpec[] {
  return catalogue
    .filter((p) => p.series === seriesId)
    .sort((a, b) => internalDiameterMm(a) - internalDiameterMm(b) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}

/** The next size up in the same series with a strictly larger bore, or undefined at the top of the series. */
export function nextLargerPipe(catalogue: readonly PipeSpec[], pipe: PipeSpec): PipeSpec | undefined {
  const bore = internalDiameterMm(pipe);
  return seriesSizes(catalogue, pipe.series).find((p) => internalDiameterMm(p) > bore);
}

/** Velocity (m/s) of a flow (L/s) in a bore (mm). */
export function velocityMs(flowLps: number, boreMm: number): number {
  requireFinite("flowLps", flowLps);
  requirePositive("internalDiameterMm", boreMm);
  const d = boreMm / 1000;
  return flowLps / 1000 / ((Math.PI * d * d) / 4);
}
