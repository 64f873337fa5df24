// Owns the valve-rating and static-pressure checks: the pressure control valve and expansion valve rated at
// or below the heater and matched as a pair, the TP valve left as supplied, and static pressure at most
// 600 kPa. Values are common practice.

import { checkResult, finding, type CheckResult, type Finding } from "./findings";
import { requirePositive } from "./guards";
import { DEFAULT_LIMITS } from "./limits";

export interface StaticPressureInput {
  staticPressureKpa: number;
  limitKpa?: number;
}

export function checkStaticPressure(input: StaticPressureInput): CheckResult {
  const limitKpa = input.limitKpa ?? DEFAULT_LIMITS.maxStaticPressureKpa;
  requirePositive("staticPressureKpa", input.staticPressureKpa);
  requirePositive("limitKpa", limitKpa);
  const findings: Finding[] = [];
  if (input.staticPressureKpa > limitKpa) {
    findings.push(
      finding(
        "fail",
        "static-pressure-exceeded",
        `System static pressure must not exceed ${limitKpa} kPa; it is ${input.staticPressureKpa} kPa. Fit a PRV before the hot/cold split`,
        { staticPressureKpa: input.staticPressureKpa, limitKpa },
      ),
    );
  }
  return checkResult(findings);
}

export interface ValveRatingsInput {
  heaterRatingKpa: number;
  pressureControlValveKpa: number;
  expansionValveKpa: number;
  /** Whether the TP valve's rating or type was changed from the heater's own. */
  tpValveChanged?: boolean;
  staticPressureKpa: number;
}

export function checkValveRatings(input: ValveRatingsInput): CheckResult {
  const { heaterRatingKpa, pressureControlValveKpa, expansionValveKpa, staticPressureKpa } = input;
  requirePositive("heaterRatingKpa", heaterRatingKpa);
  requirePositive("pressureControlValveKpa", pressureControlValveKpa);
  requirePositive("expansionValveKpa", expansionValveKpa);
  const findings: Finding[] = [];
  if (pressureControlValveKpa > heaterRatingKpa) {
    findings.push(
      finding(
        "fail",
        "control-valve-above-heater",
        `The pressure control valve (${pressureControlValveKpa} kPa) must be rated at or below the heater (${heaterRatingKpa} kPa)`,
        { pressureControlValveKpa, heaterRatingKpa },
      ),
    );
  }
  if (expansionValveKpa > heaterRatingKpa) {
    findings.push(
      finding(
        "fail",
        "expansion-valve-above-heater",
        `The expansion valve (${expansionValveKpa} kPa) must be rated at or below the heater (${heaterRatingKpa} kPa)`,
        { expansionValveKpa, heaterRatingKpa },
      ),
    );
  }
  if (pressureControlValveKpa !== expansionValveKpa) {
    findings.push(
      finding(
        "fail",
        "valve-pair-mismatch",
        `The pressure control valve (${pressureControlValveKpa} kPa) and expansion valve (${expansionValveKpa} kPa) must be a pair of the same rating`,
        { pressureControlValveKpa, expansionValveKpa },
      ),
    );
  }
  if (input.tpValveChanged === true) {
    findings.push(
      finding("fail", "tp-valve-changed", "The TP valve is integral to the heater: its rating and type must not be changed"),
    );
  } else if (input.tpValveChanged === undefined) {
    findings.push(finding("info", "tp-valve-unconfirmed", "Confirm the TP valve is the heater's own, unchanged in rating and type"));
  }
  findings.push(...checkStaticPressure({ staticPressureKpa }).findings);
  return checkResult(findings);
}
