// Owns storage heating: heat-up time (m·c·ΔT / P), thermal expansion of the stored water, and whether the
// storage suits its users.
//
// Heat-up uses the mass of a vessel filled at the starting temperature and the specific heat integrated over
// the temperature rise; standing losses during heating are ignored, so real times are a little longer.

import { checkResult, finding, type CheckResult, type Finding } from "./findings";
import { requireFinite, requireNonNegative, requirePositive } from "./guards";
import { DEFAULT_LIMITS } from "./limits";
import { waterProperties } from "./water";

export interface HeatingTimeInput {
  volumeL: number;
  fromC: number;
  toC: number;
  powerKw: number;
  /** Share of the element's power that reaches the water. Default 1 (an immersed element). */
  efficiency?: number;
}

export interface HeatingTimeResult {
  energyKwh: number;
  hours: number;
  massKg: number;
}

function checkRise(fromC: number, toC: number): void {
  requireFinite("fromC", fromC);
  requireFinite("toC", toC);
  if (toC < fromC) throw new RangeError(`toC (${toC} °C) cannot be below fromC (${fromC} °C)`);
}

/** ∫ cp dT from fromC to toC, J/kg, by Simpson's rule (cp varies smoothly; 16 panels is exact to 1e-8). */
function specificEnthalpyRiseJPerKg(fromC: number, toC: number): number {
  if (toC === fromC) return 0;
  const panels = 16;
  const h = (toC - fromC) / panels;
  let sum = 0;
  for (let i = 0; i <= panels; i++) {
    const w = i === 0 || i === panels ? 1 : i % 2 === 1 ? 4 : 2;
    sum += w * waterProperties(fromC + i * h).specificHeatJPerKgK;
  }
  return (sum * h) / 3;
}

export function heatingTime(input: HeatingTimeInput): HeatingTimeResult {
  const { volumeL, fromC, toC, powerKw } = input;
  const efficiency = input.efficiency ?? 1;
  requireNonNegative("volumeL", volumeL);
  checkRise(fromC, toC);
  requirePositive("powerKw", powerKw);
  requirePositive("efficiency", efficiency);
  if (efficiency > 1) throw new RangeError(`efficiency cannot exceed 1 (got ${efficiency})`);
  const massKg = (volumeL / 1000) * waterProperties(fromC).densityKgM3;
  const energyKwh = (massKg * specificEnthalpyRiseJPerKg(fromC, toC)) / 3.6e6;
  return { energyKwh, hours: energyKwh / (powerKw * efficiency), massKg };
}

export interface ExpansionVolumeInput {
  volumeL: number;
  fromC: number;
  toC: number;
}

/** Volume the stored water gains when heated: the same mass at the lower density. */
export function expansionVolume(input: ExpansionVolumeInput): { litres: number; percent: number } {
  const { volumeL, fromC, toC } = input;
  requireNonNegative("volumeL", volumeL);
  checkRise(fromC, toC);
  const ratio = waterProperties(fromC).densityKgM3 / waterProperties(toC).densityKgM3;
  return { litres: volumeL * (ratio - 1), percent: (ratio - 1) * 100 };
}

export interface StorageSizingInput {
  occupants: number;
  /** Hot water stored per occupant. Default 50 L (common practice, from memory). */
  litresPerPersonPerDay?: number;
  /** The heater's capacity. */
  volumeL: number;
  /** Storage above this multiple of the need is excessive. Default 1.5 (common practice). */
  excessRatio?: number;
  /** Sizes on the market, for the recommendation. Default 50–300 L in 50 L steps (common practice). */
  standardSizesL?: readonly number[];
}

export interface StorageSizingResult extends CheckResult {
  requiredVolumeL: number;
  recommendedVolumeL: number;
  basis: string;
}

export function storageSizing(input: StorageSizingInput): StorageSizingResult {
  const { occupants, volumeL } = input;
  const perPerson = input.litresPerPersonPerDay ?? DEFAULT_LIMITS.storageLitresPerPerson;
  const excessRatio = input.excessRatio ?? DEFAULT_LIMITS.storageExcessRatio;
  const sizes = [...(input.standardSizesL ?? DEFAULT_LIMITS.standardHeaterSizesL)].sort((a, b) => a - b);
  requirePositive("occupants", occupants);
  requirePositive("litresPerPersonPerDay", perPerson);
  requirePositive("volumeL", volumeL);
  requirePositive("excessRatio", excessRatio);
  if (excessRatio < 1) throw new RangeError("excessRatio must be at least 1");
  sizes.forEach((s, i) => requirePositive(`standardSizesL[${i}]`, s));

  const requiredVolumeL = occupants * perPerson;
  const recommendedVolumeL = sizes.find((s) => s >= requiredVolumeL) ?? requiredVolumeL;
  const excessiveAboveL = Math.max(recommendedVolumeL, requiredVolumeL * excessRatio);
  const findings: Finding[] = [];
  if (volumeL < requiredVolumeL) {
    findings.push(
      finding(
        "warn",
        "storage-undersized",
        `${volumeL} L is less than the ${requiredVolumeL} L that ${occupants} occupants need at ${perPerson} L each`,
        { volumeL, requiredVolumeL, occupants, litresPerPerson: perPerson },
      ),
    );
  } else if (volumeL > excessiveAboveL) {
    findings.push(
      finding(
        "warn",
        "storage-excessive",
        `${volumeL} L is more than ${excessRatio} × the ${requiredVolumeL} L needed (recommended ${recommendedVolumeL} L); ` +
          `storage must not be excessive: it wastes energy and leaves water standing`,
        { volumeL, requiredVolumeL, recommendedVolumeL, excessRatio },
      ),
    );
  }
  if (sizes.every((s) => s < requiredVolumeL)) {
    findings.push(
      finding("info", "beyond-standard-sizes", `The need (${requiredVolumeL} L) is above the largest standard size; consider more than one heater`, {
        requiredVolumeL,
      }),
    );
  }
  return {
    ...checkResult(findings),
    requiredVolumeL,
    recommendedVolumeL,
    basis: `${perPerson} L stored per occupant (common practice, from memory); confirm against SANS 10252-1`,
  };
}
