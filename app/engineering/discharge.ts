// Owns the check of a TP-valve or expansion-valve discharge pipe: its size against the valve connection, its
// length for that size, how it was enlarged, and its bends. Rules and values are common practice.

import { checkResult, finding, type CheckResult, type Finding } from "./findings";
import { requireFinite, requireNonNegative, requirePositive } from "./guards";
import { DEFAULT_LIMITS } from "./limits";

export interface DischargeBend {
  angleDeg: number;
  centreLineRadiusMm?: number;
}

export interface DischargePipeInput {
  valve: "tp" | "expansion";
  valveConnectionMm: number;
  pipeDiameterMm: number;
  lengthM: number;
  bends: DischargeBend[];
  /** Number of elbows (sharp fittings) in the run. */
  elbows: number;
  /** The larger pipe starts at the valve outlet, not part-way along the run. */
  enlargedFromValveOutlet: boolean;
}

export function checkDischargePipe(input: DischargePipeInput): CheckResult {
  const rules = DEFAULT_LIMITS.discharge;
  const { valve, valveConnectionMm, pipeDiameterMm, lengthM, bends, elbows, enlargedFromValveOutlet } = input;
  if (valve !== "tp" && valve !== "expansion") throw new RangeError(`valve must be "tp" or "expansion"`);
  requirePositive("valveConnectionMm", valveConnectionMm);
  requirePositive("pipeDiameterMm", pipeDiameterMm);
  requireNonNegative("lengthM", lengthM);
  requireNonNegative("elbows", elbows);
  const valveName = valve === "tp" ? "TP valve" : "expansion valve";
  const findings: Finding[] = [];

  if (valve === "tp" && valveConnectionMm !== DEFAULT_LIMITS.tpValveConnectionMm) {
    findings.push(
      finding(
        "warn",
        "tp-connection-unusual",
        `A TP valve connection is normally ${DEFAULT_LIMITS.tpValveConnectionMm} mm; confirm the ${valveConnectionMm} mm stated`,
        { valveConnectionMm, expectedMm: DEFAULT_LIMITS.tpValveConnectionMm },
      ),
    );
  }
  if (pipeDiameterMm < valveConnectionMm) {
    findings.push(
      finding(
        "fail",
        "discharge-smaller-than-connection",
        `The discharge pipe must be at least the size of the ${valveName} connection (${valveConnectionMm} mm); it is ${pipeDiameterMm} mm`,
        { pipeDiameterMm, valveConnectionMm },
      ),
    );
  }

  const enlarged = pipeDiameterMm > valveConnectionMm;
  if (pipeDiameterMm === rules.baseDiameterMm) {
    if (lengthM > rules.baseMaxLengthM) {
      findings.push(
        finding(
          "fail",
          "discharge-too-long",
          `A ${rules.baseDiameterMm} mm discharge pipe may run at most ${rules.baseMaxLengthM} m; this one is ${lengthM} m. ` +
            `Enlarge it to ${rules.enlargedDiameterMm} mm from the valve outlet (up to ${rules.enlargedMaxLengthM} m)`,
          { lengthM, maxLengthM: rules.baseMaxLengthM, pipeDiameterMm },
        ),
      );
    }
  } else if (pipeDiameterMm === rules.enlargedDiameterMm) {
    if (lengthM > rules.enlargedMaxLengthM) {
      findings.push(
        finding(
          "fail",
          "discharge-too-long",
          `A ${rules.enlargedDiameterMm} mm discharge pipe may run at most ${rules.enlargedMaxLengthM} m; this one is ${lengthM} m`,
          { lengthM, maxLengthM: rules.enlargedMaxLengthM, pipeDiameterMm },
        ),
      );
    }
  } else {
    findings.push(
      finding(
        "warn",
        "discharge-size-not-tabulated",
        `No run length is set for a ${pipeDiameterMm} mm discharge pipe (only ${rules.baseDiameterMm} mm up to ` +
          `${rules.baseMaxLengthM} m and ${rules.enlargedDiameterMm} mm up to ${rules.enlargedMaxLengthM} m); the engineer must justify it`,
        { pipeDiameterMm, lengthM },
      ),
    );
  }
  if (enlarged && !enlargedFromValveOutlet) {
    findings.push(
      finding(
        "fail",
        "enlargement-not-at-valve",
        `The enlarged discharge pipe (${pipeDiameterMm} mm) must start at the ${valveName} outlet, not part-way along the run`,
        { pipeDiameterMm, valveConnectionMm },
      ),
    );
  }

  if (!Array.isArray(bends)) throw new RangeError("bends must be a list");
  if (bends.length > rules.maxBends) {
    findings.push(
      finding("fail", "too-many-bends", `A discharge pipe may have at most ${rules.maxBends} bends; this one has ${bends.length}`, {
        bends: bends.length,
        maxBends: rules.maxBends,
      }),
    );
  }
  const minRadiusMm = rules.minBendRadiusDiameters * pipeDiameterMm;
  bends.forEach((bend, i) => {
    requireFinite(`bends[${i}].angleDeg`, bend.angleDeg);
    if (bend.angleDeg <= 0 || bend.angleDeg > 180) throw new RangeError(`bends[${i}].angleDeg must be between 0 and 180°`);
    if (bend.centreLineRadiusMm !== undefined) requirePositive(`bends[${i}].centreLineRadiusMm`, bend.centreLineRadiusMm);
    if (bend.angleDeg <= rules.maxBendAngleDeg) return;
    if (bend.centreLineRadiusMm !== undefined && bend.centreLineRadiusMm >= minRadiusMm) return;
    findings.push(
      finding(
        "fail",
        "bend-too-sharp",
        `Bend ${i + 1} turns ${bend.angleDeg}°: each bend must be at most ${rules.maxBendAngleDeg}° or have a centre-line ` +
          `radius of at least ${rules.minBendRadiusDiameters} × the pipe diameter (${minRadiusMm} mm)` +
          (bend.centreLineRadiusMm === undefined ? "; no radius was given" : `; its radius is ${bend.centreLineRadiusMm} mm`),
        { bendIndex: i, angleDeg: bend.angleDeg, centreLineRadiusMm: bend.centreLineRadiusMm ?? 0, minRadiusMm },
        `bend-${i + 1}`,
      ),
    );
  });
  if (elbows > 0) {
    findings.push(finding("fail", "elbows-in-discharge", `A discharge pipe may have no elbows; this one has ${elbows}`, { elbows }));
  }
  findings.push(
    finding(
      "info",
      "discharge-termination",
      "Confirm the discharge ends where it is visible and can do no harm (from memory)",
    ),
  );
  return checkResult(findings);
}
