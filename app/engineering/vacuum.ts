// Owns the vacuum-breaker check: one on each of the hot and cold sides, teed in directly only far enough from
// the heater, otherwise raised on a riser. Values are common practice; makers may demand more.

import { checkResult, finding, type CheckResult, type Finding } from "./findings";
import { requireNonNegative } from "./guards";
import { DEFAULT_LIMITS } from "./limits";

export interface VacuumBreakerSide {
  fitted: boolean;
  /** Distance along the pipe from the heater connection (hot outlet or cold inlet). */
  distanceFromOutletMm?: number;
  onRiser: boolean;
  riserHeightMm?: number;
}

export interface VacuumBreakerInput {
  hot: VacuumBreakerSide;
  cold: VacuumBreakerSide;
}

export function checkVacuumBreakers(input: VacuumBreakerInput): CheckResult {
  const { teeInMinDistanceMm, riserHeightMm } = DEFAULT_LIMITS.vacuumBreaker;
  const findings: Finding[] = [];
  for (const side of ["hot", "cold"] as const) {
    const v = input[side];
    if (!v) throw new RangeError(`the ${side} side must be described`);
    if (!v.fitted) {
      findings.push(
        finding("fail", "vacuum-breaker-missing", `A vacuum breaker is required on the ${side} side of the heater`, {}, side),
      );
      continue;
    }
    if (v.distanceFromOutletMm === undefined) {
      if (!v.onRiser) {
        findings.push(
          finding(
            "fail",
            "vacuum-breaker-position-unknown",
            `The ${side}-side vacuum breaker is not on a riser and its distance from the heater is not given; ` +
              `teeing in directly is allowed only more than ${teeInMinDistanceMm} mm away`,
            {},
            side,
          ),
        );
      }
    } else {
      requireNonNegative(`${side}.distanceFromOutletMm`, v.distanceFromOutletMm);
      if (v.distanceFromOutletMm <= teeInMinDistanceMm && !v.onRiser) {
        findings.push(
          finding(
            "fail",
            "vacuum-breaker-needs-riser",
            `The ${side}-side vacuum breaker is ${v.distanceFromOutletMm} mm from the heater; within ${teeInMinDistanceMm} mm it must stand on a riser`,
            { distanceFromOutletMm: v.distanceFromOutletMm, teeInMinDistanceMm },
            side,
          ),
        );
      }
    }
    if (v.onRiser) {
      if (v.riserHeightMm === undefined) {
        findings.push(
          finding("info", "riser-height-unknown", `Confirm the ${side}-side riser height (commonly ${riserHeightMm} mm)`, { riserHeightMm }, side),
        );
      } else {
        requireNonNegative(`${side}.riserHeightMm`, v.riserHeightMm);
        if (v.riserHeightMm < riserHeightMm) {
          findings.push(
            finding(
              "warn",
              "riser-short",
              `The ${side}-side riser is ${v.riserHeightMm} mm; ${riserHeightMm} mm is common practice`,
              { riserHeightMm: v.riserHeightMm, commonRiserHeightMm: riserHeightMm },
              side,
            ),
          );
        }
      }
    }
  }
  findings.push(
    finding("info", "maker-requirements", "The heater maker's instructions may ask for more than this minimum"),
  );
  return checkResult(findings);
}
