// Owns the fittings catalogue: loss coefficients (K) and equivalent lengths in pipe diameters (L/D).
//
// Most K-values follow the Crane Technical Paper 410 method, K = (L/D)·fT, with fT = 0.025, the paper's
// fully turbulent friction factor for about 20 mm (¾") pipe; the L/D multipliers are from memory of the
// paper's tables. Where the paper has no entry the value is common practice. Replace typical values with the
// manufacturer's data for any valve that decides a result (a PRV above all: its loss depends on its flow curve).

import { requireNonNegative } from "./guards";

export interface FittingType {
  id: string;
  label: string;
  /** Loss coefficient for ΔP = K·ρv²/2. */
  k: number;
  /** Equivalent length in internal diameters, where the source gives one. */
  lengthOverDiameter?: number;
  source: string;
}

export interface FittingCount {
  fittingId: string;
  count: number;
}

const CRANE_FT = 0.025;
const crane = (lengthOverDiameter: number): Pick<FittingType, "k" | "lengthOverDiameter" | "source"> => ({
  k: Math.round(lengthOverDiameter * CRANE_FT * 1000) / 1000,
  lengthOverDiameter,
  source: `Crane TP-410 method: L/D = ${lengthOverDiameter}, K = (L/D)·fT with fT = ${CRANE_FT} (≈20 mm) (from memory)`,
});

export const fittingCatalogue: readonly FittingType[] = Object.freeze([
  { id: "elbow-90", label: "Elbow 90° (standard)", ...crane(30) },
  { id: "bend-90-long", label: "Bend 90°, radius 1.5 D", ...crane(14) },
  { id: "elbow-45", label: "Elbow 45° (standard)", ...crane(16) },
  {
    id: "bend-45",
    label: "Bend 45°, formed, radius 1.5 D",
    k: 0.18,
    lengthOverDiameter: 7,
    source: "Common practice (from memory): about half the 90° bend of the same radius",
  },
  { id: "tee-through", label: "Tee, flow through run", ...crane(20) },
  { id: "tee-branch", label: "Tee, flow through branch", ...crane(60) },
  { id: "gate-valve-open", label: "Gate valve, fully open", ...crane(8) },
  { id: "ball-valve-open", label: "Ball valve, fully open (full bore)", ...crane(3) },
  { id: "globe-valve-open", label: "Globe valve / stop tap, fully open", ...crane(340) },
  { id: "angle-valve-open", label: "Angle valve, fully open", ...crane(150) },
  { id: "butterfly-valve-open", label: "Butterfly valve, fully open", ...crane(45) },
  { id: "check-valve-swing", label: "Check valve, swing type", ...crane(100) },
  { id: "check-valve-lift", label: "Check valve, lift type", ...crane(600) },
  {
    id: "prv-typical",
    label: "Pressure-reducing valve, body loss (typical)",
    k: 10,
    source: "Common practice (from memory): placeholder; use the maker's flow curve",
  },
  {
    id: "strainer",
    label: "Strainer, clean",
    k: 2,
    source: "Common practice (from memory)",
  },
  {
    id: "entry-sharp",
    label: "Pipe entry from a vessel, sharp-edged",
    k: 0.5,
    source: "Standard textbook value for a sharp-edged entrance (K = 0.5)",
  },
  {
    id: "exit",
    label: "Pipe exit into a vessel",
    k: 1,
    source: "Borda–Carnot: all velocity head lost on discharge into a large volume (K = 1)",
  },
]);

export function findFitting(id: string, catalogue: readonly FittingType[] = fittingCatalogue): FittingType | undefined {
  return catalogue.find((f) => f.id === id);
}

function lookup(id: string, catalogue: readonly FittingType[]): FittingType {
  const f = findFitting(id, catalogue);
  if (!f) throw new RangeError(`unknown fitting "${id}"`);
  return f;
}

/** Sum of K over the fittings. */
export function fittingsK(fittings: readonly FittingCount[], catalogue: readonly FittingType[] = fittingCatalogue): number {
  let k = 0;
  for (const { fittingId, count } of fittings) {
    requireNonNegative(`count of ${fittingId}`, count);
    k += lookup(fittingId, catalogue).k * count;
  }
  return k;
}

/**
 * Split the fittings for the equivalent-length method: those with an L/D become extra pipe length (m) at the
 * given internal diameter; those without one stay as K.
 */
export function fittingsAsEquivalentLength(
  fittings: readonly FittingCount[],
  internalDiameterMm: number,
  catalogue: readonly FittingType[] = fittingCatalogue,
): { equivalentLengthM: number; remainingK: number } {
  let equivalentLengthM = 0;
  let remainingK = 0;
  for (const { fittingId, count } of fittings) {
    requireNonNegative(`count of ${fittingId}`, count);
    const f = lookup(fittingId, catalogue);
    if (f.lengthOverDiameter !== undefined) equivalentLengthM += f.lengthOverDiameter * (internalDiameterMm / 1000) * count;
    else remainingK += f.k * count;
  }
  return { equivalentLengthM, remainingK };
}
