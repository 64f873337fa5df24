import { describe, expect, it } from "vitest";
import { checkDeadLeg, timeToHot } from "./deadleg";

describe("timeToHot", () => {
  // Check value: geometry, V = π d² L / 4; 10 m of 13.6 mm bore holds 1.453 L, 14.5 s at 0.1 L/s.
  it("gives the standing volume and the plug-flow time to draw it off", () => {
    const r = timeToHot({ internalDiameterMm: 13.6, lengthM: 10, flowLps: 0.1 });
    expect(r.volumeL).toBeCloseTo((Math.PI * 0.0136 ** 2 * 10 * 1000) / 4, 12);
    expect(r.volumeL).toBeCloseTo(1.4527, 4);
    expect(r.seconds).toBeCloseTo(14.527, 3);
  });

  it("rejects a zero flow or negative length", () => {
    expect(() => timeToHot({ internalDiameterMm: 13.6, lengthM: 10, flowLps: 0 })).toThrow(RangeError);
    expect(() => timeToHot({ internalDiameterMm: 13.6, lengthM: -1, flowLps: 0.1 })).toThrow(RangeError);
  });
});

describe("checkDeadLeg", () => {
  // Limit: 30 s to hot water by default (common practice, from memory), configurable.
  it("passes a short leg and fails a long one, adding the runs", () => {
    expect(checkDeadLeg({ legs: [{ internalDiameterMm: 13.6, lengthM: 10 }], flowLps: 0.1 }).ok).toBe(true);
    const r = checkDeadLeg({ legs: [{ internalDiameterMm: 20.2, lengthM: 8 }, { internalDiameterMm: 13.6, lengthM: 6 }], flowLps: 0.1 });
    expect(r.volumeL).toBeCloseTo(timeToHot({ internalDiameterMm: 20.2, lengthM: 8, flowLps: 0.1 }).volumeL + timeToHot({ internalDiameterMm: 13.6, lengthM: 6, flowLps: 0.1 }).volumeL, 12);
    expect(r.ok).toBe(false);
    expect(r.findings[0]).toMatchObject({ code: "dead-leg-slow", severity: "fail" });
    expect(checkDeadLeg({ legs: [{ internalDiameterMm: 20.2, lengthM: 8 }], flowLps: 0.1, maxSeconds: 60 }).ok).toBe(true);
  });

  it("applies an optional volume limit", () => {
    const r = checkDeadLeg({ legs: [{ internalDiameterMm: 13.6, lengthM: 10 }], flowLps: 0.2, maxVolumeL: 1 });
    expect(r.findings.map((f) => f.code)).toEqual(["dead-leg-volume"]);
  });
});
