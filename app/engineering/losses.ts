// Owns the pressure loss of one pipe segment: Darcy–Weisbach friction with the friction factor at the
// segment's water temperature, fittings as K·ρv²/2, and the static head of any rise. Hazen–Williams is here
// as a cross-check only: it is empirical, ignores temperature and is fitted to turbulent flow of cool water.

import { darcyFrictionFactorUnchecked, MAX_RELATIVE_ROUGHNESS } from "./friction";
import { requireFinite, requireNonNegative, requirePositive } from "./guards";
import { STANDARD_GRAVITY_MS2, waterProperties } from "./water";

const NO_FLOW_REYNOLDS = 1e-9;

export interface SegmentLossInput {
  flowLps: number;
  internalDiameterMm: number;
  lengthM: number;
  roughnessMm: number;
  tempC: number;
  /** Sum of fitting loss coefficients. */
  kTotal?: number;
  /** Extra friction length standing in for fittings (equivalent-length method). */
  equivalentLengthM?: number;
  /** Height gained from inlet to outlet; negative for a fall. */
  riseM?: number;
}

export interface SegmentLoss {
  velocityMs: number;
  reynolds: number;
  /** Darcy friction factor; 0 when nothing flows. */
  frictionFactor: number;
  frictionLossKpa: number;
  fittingLossKpa: number;
  /** ρ g rise: positive for a rise, negative (a gain) for a fall. */
  staticLossKpa: number;
  totalLossKpa: number;
  densityKgM3: number;
}

export function segmentLoss(input: SegmentLossInput): SegmentLoss {
  const { flowLps, internalDiameterMm, lengthM, roughnessMm, tempC } = input;
  const kTotal = input.kTotal ?? 0;
  const equivalentLengthM = input.equivalentLengthM ?? 0;
  const riseM = input.riseM ?? 0;
  requireNonNegative("flowLps", flowLps);
  requirePositive("internalDiameterMm", internalDiameterMm);
  requireNonNegative("lengthM", lengthM);
  requireNonNegative("roughnessMm", roughnessMm);
  requireNonNegative("kTotal", kTotal);
  requireNonNegative("equivalentLengthM", equivalentLengthM);
  requireFinite("riseM", riseM);
  if (roughnessMm / internalDiameterMm > MAX_RELATIVE_ROUGHNESS) {
    throw new RangeError(`roughnessMm ${roughnessMm} is too large for a ${internalDiameterMm} mm bore`);
  }
  return segmentLossUnchecked(flowLps, internalDiameterMm, lengthM + equivalentLengthM, roughnessMm, tempC, kTotal, riseM);
}

/**
 * segmentLoss without input checks, for the balance solver, whose network is validated once up front. With
 * `into` the figures overwrite that record instead of a new one, so a solver reading them at once can reuse one
 * record for every segment of a large network.
 */
export function segmentLossUnchecked(
  flowLps: number,
  internalDiameterMm: number,
  frictionLengthM: number,
  roughnessMm: number,
  tempC: number,
  kTotal: number,
  riseM: number,
  into?: SegmentLoss,
): SegmentLoss {
  const water = waterProperties(tempC);
  const d = internalDiameterMm / 1000;
  const area = (Math.PI * d * d) / 4;
  const velocityMs = flowLps / 1000 / area;
  const staticLossKpa = (water.densityKgM3 * STANDARD_GRAVITY_MS2 * riseM) / 1000;
  const reynolds = (velocityMs * d) / water.kinematicViscosityM2S;
  // Below this nothing measurable flows, and 64/Re would overflow to Infinity.
  if (reynolds < NO_FLOW_REYNOLDS) return lossRecord(into, 0, 0, 0, 0, 0, staticLossKpa, staticLossKpa, water.densityKgM3);
  const frictionFactor = darcyFrictionFactorUnchecked(reynolds, roughnessMm / internalDiameterMm);
  const dynamicPressurePa = (water.densityKgM3 * velocityMs * velocityMs) / 2;
  const frictionLossKpa = (frictionFactor * (frictionLengthM / d) * dynamicPressurePa) / 1000;
  const fittingLossKpa = (kTotal * dynamicPressurePa) / 1000;
  const totalLossKpa = frictionLossKpa + fittingLossKpa + staticLossKpa;
  return lossRecord(into, velocityMs, reynolds, frictionFactor, frictionLossKpa, fittingLossKpa, staticLossKpa, totalLossKpa, water.densityKgM3);
}

function lossRecord(
  into: SegmentLoss | undefined,
  velocityMs: number,
  reynolds: number,
  frictionFactor: number,
  frictionLossKpa: number,
  fittingLossKpa: number,
  staticLossKpa: number,
  totalLossKpa: number,
  densityKgM3: number,
): SegmentLoss {
  if (!into) return { velocityMs, reynolds, frictionFactor, frictionLossKpa, fittingLossKpa, staticLossKpa, totalLossKpa, densityKgM3 };
  into.velocityMs = velocityMs;
  into.reynolds = reynolds;
  into.frictionFactor = frictionFactor;
  into.frictionLossKpa = frictionLossKpa;
  into.fittingLossKpa = fittingLossKpa;
  into.staticLossKpa = staticLossKpa;
  into.totalLossKpa = totalLossKpa;
  into.densityKgM3 = densityKgM3;
  return into;
}

export interface HazenWilliamsInput {
  flowLps: number;
  internalDiameterMm: number;
  lengthM: number;
  c: number;
  /** Only converts head to pressure; the formula itself has no temperature. Default 20 °C. */
  tempC?: number;
}

/** Hazen–Williams, SI form: hf = 10.67 L Q^1.852 / (C^1.852 d^4.87), hf in m, Q in m³/s, d in m. */
export function hazenWilliamsLossKpa(input: HazenWilliamsInput): number {
  const { flowLps, internalDiameterMm, lengthM, c } = input;
  requireNonNegative("flowLps", flowLps);
  requirePositive("internalDiameterMm", internalDiameterMm);
  requireNonNegative("lengthM", lengthM);
  requirePositive("c", c);
  const q = flowLps / 1000;
  const d = internalDiameterMm / 1000;
  const headM = (10.67 * lengthM * q ** 1.852) / (c ** 1.852 * d ** 4.87);
  return (waterProperties(input.tempC ?? 20).densityKgM3 * STANDARD_GRAVITY_MS2 * headM) / 1000;
}
