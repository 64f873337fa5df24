// Owns time to hot water and the dead-leg check: the volume standing in the pipe between the hot supply and an
// outlet, and how long the outlet runs cold while that volume is drawn off. Plug flow is assumed and the heat
// taken up by a cold pipe is ignored, so real waits are longer than these figures.

import { checkResult, finding, type CheckResult, type Finding } from "./findings";
import { requireNonNegative, requirePositive } from "./guards";
import { DEFAULT_LIMITS } from "./limits";

export interface TimeToHotInput {
  internalDiameterMm: number;
  lengthM: number;
  flowLps: number;
}

export function timeToHot(input: TimeToHotInput): { volumeL: number; seconds: number } {
  requirePositive("internalDiameterMm", input.internalDiameterMm);
  requireNonNegative("lengthM", input.lengthM);
  requirePositive("flowLps", input.flowLps);
  const d = input.internalDiameterMm / 1000;
  const volumeL = ((Math.PI * d * d) / 4) * input.lengthM * 1000;
  return { volumeL, seconds: volumeL / input.flowLps };
}

export interface DeadLegInput {
  /** The pipe runs from the hot supply (or circulating loop) to the outlet. */
  legs: { internalDiameterMm: number; lengthM: number }[];
  /** Flow at the outlet while it is opened. */
  flowLps: number;
  /** Default 30 s (common practice, from memory). */
  maxSeconds?: number;
  /** Optional limit on the standing volume. */
  maxVolumeL?: number;
}

export interface DeadLegResult extends CheckResult {
  volumeL: number;
  seconds: number;
}

export function checkDeadLeg(input: DeadLegInput): DeadLegResult {
  const maxSeconds = input.maxSeconds ?? DEFAULT_LIMITS.deadLegMaxSeconds;
  requirePositive("maxSeconds", maxSeconds);
  if (input.maxVolumeL !== undefined) requirePositive("maxVolumeL", input.maxVolumeL);
  if (!Array.isArray(input.legs) || input.legs.length === 0) throw new RangeError("a dead leg needs at least one pipe run");
  requirePositive("flowLps", input.flowLps);
  let volumeL = 0;
  for (const leg of input.legs) volumeL += timeToHot({ ...leg, flowLps: input.flowLps }).volumeL;
  const seconds = volumeL / input.flowLps;
  const findings: Finding[] = [];
  if (seconds > maxSeconds) {
    findings.push(
      finding(
        "fail",
        "dead-leg-slow",
        `Hot water takes at least ${Math.round(seconds)} s to arrive (${volumeL.toFixed(2)} L at ${input.flowLps} L/s), ` +
          `more than the ${maxSeconds} s limit; shorten the leg, reduce its bore, or put a smaller heater near the outlets`,
        { seconds, maxSeconds, volumeL, flowLps: input.flowLps },
      ),
    );
  }
  if (input.maxVolumeL !== undefined && volumeL > input.maxVolumeL) {
    findings.push(
      finding(
        "fail",
        "dead-leg-volume",
        `The dead leg holds ${volumeL.toFixed(2)} L, more than the ${input.maxVolumeL} L limit`,
        { volumeL, maxVolumeL: input.maxVolumeL },
      ),
    );
  }
  return { ...checkResult(findings), volumeL, seconds };
}
