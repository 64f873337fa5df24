// Rule values here are common practice: vacuum breakers on both sides; more than 700 mm from the heater one may
// be teed in directly, otherwise it stands on a riser (commonly 300 mm).
import { describe, expect, it } from "vitest";
import { checkVacuumBreakers, type VacuumBreakerInput } from "./vacuum";

const teed = { fitted: true, distanceFromOutletMm: 900, onRiser: false };
const riser = { fitted: true, distanceFromOutletMm: 200, onRiser: true, riserHeightMm: 300 };
const codes = (input: VacuumBreakerInput) => checkVacuumBreakers(input).findings.filter((f) => f.severity !== "info").map((f) => `${f.elementId}:${f.code}`);

describe("checkVacuumBreakers", () => {
  it("passes both sides teed in far enough away, or on risers", () => {
    expect(checkVacuumBreakers({ hot: teed, cold: teed }).ok).toBe(true);
    expect(checkVacuumBreakers({ hot: riser, cold: riser }).ok).toBe(true);
    expect(codes({ hot: riser, cold: teed })).toEqual([]);
  });

  it("fails a missing breaker on either side", () => {
    expect(codes({ hot: teed, cold: { fitted: false, onRiser: false } })).toEqual(["cold:vacuum-breaker-missing"]);
    expect(checkVacuumBreakers({ hot: { fitted: false, onRiser: false }, cold: teed }).ok).toBe(false);
  });

  it("requires a riser within 700 mm of the heater, and 700 mm itself counts as within", () => {
    expect(codes({ hot: { fitted: true, distanceFromOutletMm: 700, onRiser: false }, cold: teed })).toEqual(["hot:vacuum-breaker-needs-riser"]);
    expect(codes({ hot: { fitted: true, distanceFromOutletMm: 701, onRiser: false }, cold: teed })).toEqual([]);
  });

  it("warns on a riser shorter than 300 mm and notes an unknown height", () => {
    expect(codes({ hot: { ...riser, riserHeightMm: 250 }, cold: teed })).toEqual(["hot:riser-short"]);
    const r = checkVacuumBreakers({ hot: { fitted: true, distanceFromOutletMm: 100, onRiser: true }, cold: teed });
    expect(r.ok).toBe(true);
    expect(r.findings.some((f) => f.code === "riser-height-unknown")).toBe(true);
  });

  it("fails a breaker off a riser whose distance is unknown", () => {
    expect(codes({ hot: { fitted: true, onRiser: false }, cold: teed })).toEqual(["hot:vacuum-breaker-position-unknown"]);
  });
});
