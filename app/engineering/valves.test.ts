// Rule values here are common practice: control and expansion valves at or below the heater rating and equal
// as a pair (e.g. 400 kPa on a 600 kPa heater); the TP valve unchanged; static pressure at most 600 kPa.
import { describe, expect, it } from "vitest";
import { checkStaticPressure, checkValveRatings, type ValveRatingsInput } from "./valves";

const good: ValveRatingsInput = { heaterRatingKpa: 600, pressureControlValveKpa: 400, expansionValveKpa: 400, tpValveChanged: false, staticPressureKpa: 400 };
const codes = (input: ValveRatingsInput) => checkValveRatings(input).findings.filter((f) => f.severity === "fail").map((f) => f.code);

describe("checkValveRatings", () => {
  it("passes a 400 kPa pair on a 600 kPa heater", () => {
    expect(checkValveRatings(good).ok).toBe(true);
    expect(checkValveRatings({ ...good, pressureControlValveKpa: 600, expansionValveKpa: 600 }).ok).toBe(true);
  });

  it("fails valves rated above the heater", () => {
    expect(codes({ ...good, heaterRatingKpa: 400, pressureControlValveKpa: 600, expansionValveKpa: 600 })).toEqual([
      "control-valve-above-heater",
      "expansion-valve-above-heater",
    ]);
  });

  it("fails a mismatched pair", () => {
    expect(codes({ ...good, expansionValveKpa: 600 })).toEqual(["valve-pair-mismatch"]);
  });

  it("fails a changed TP valve and notes an unconfirmed one", () => {
    expect(codes({ ...good, tpValveChanged: true })).toEqual(["tp-valve-changed"]);
    const r = checkValveRatings({ ...good, tpValveChanged: undefined });
    expect(r.ok).toBe(true);
    expect(r.findings.map((f) => f.code)).toContain("tp-valve-unconfirmed");
  });

  it("fails static pressure above 600 kPa", () => {
    expect(codes({ ...good, staticPressureKpa: 650 })).toEqual(["static-pressure-exceeded"]);
    expect(checkStaticPressure({ staticPressureKpa: 600 }).ok).toBe(true);
    expect(checkStaticPressure({ staticPressureKpa: 550, limitKpa: 500 }).ok).toBe(false);
  });

  it("rejects impossible ratings", () => {
    expect(() => checkValveRatings({ ...good, heaterRatingKpa: 0 })).toThrow(RangeError);
    expect(() => checkValveRatings({ ...good, expansionValveKpa: -400 })).toThrow(RangeError);
  });
});
