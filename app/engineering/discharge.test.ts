// Rules and values checked here are common practice (no published source cited): TP discharge 22 mm, at most
// 4 m at 22 mm, enlarged to 28 mm from the valve outlet up to 9 m, at most 3 bends, each ≤ 45° or with a
// centre-line radius ≥ 5 × D, no elbows.
import { describe, expect, it } from "vitest";
import { CAUTION } from "./caution";
import { checkDischargePipe, type DischargePipeInput } from "./discharge";

const good: DischargePipeInput = {
  valve: "tp",
  valveConnectionMm: 22,
  pipeDiameterMm: 22,
  lengthM: 3.5,
  bends: [{ angleDeg: 45 }, { angleDeg: 30 }],
  elbows: 0,
  enlargedFromValveOutlet: false,
};
const codes = (input: DischargePipeInput) => checkDischargePipe(input).findings.filter((f) => f.severity !== "info").map((f) => f.code);

describe("checkDischargePipe", () => {
  it("passes a short 22 mm run with gentle bends, and carries the caution", () => {
    const r = checkDischargePipe(good);
    expect(r.ok).toBe(true);
    expect(codes(good)).toEqual([]);
    expect(r.caution).toBe(CAUTION);
    expect(r.findings.some((f) => f.code === "discharge-termination")).toBe(true);
  });

  it("allows exactly 4 m at 22 mm and fails beyond", () => {
    expect(checkDischargePipe({ ...good, lengthM: 4 }).ok).toBe(true);
    const r = checkDischargePipe({ ...good, lengthM: 4.5 });
    expect(r.ok).toBe(false);
    expect(r.findings.find((f) => f.code === "discharge-too-long")!.values).toMatchObject({ lengthM: 4.5, maxLengthM: 4 });
  });

  it("allows 28 mm up to 9 m when enlarged from the valve outlet", () => {
    expect(checkDischargePipe({ ...good, pipeDiameterMm: 28, lengthM: 9, enlargedFromValveOutlet: true }).ok).toBe(true);
    expect(codes({ ...good, pipeDiameterMm: 28, lengthM: 9.2, enlargedFromValveOutlet: true })).toEqual(["discharge-too-long"]);
    expect(codes({ ...good, pipeDiameterMm: 28, lengthM: 6, enlargedFromValveOutlet: false })).toEqual(["enlargement-not-at-valve"]);
  });

  it("fails a pipe smaller than the valve connection", () => {
    expect(codes({ ...good, pipeDiameterMm: 15 })).toContain("discharge-smaller-than-connection");
  });

  it("warns on an untabulated size and on an unusual TP connection", () => {
    expect(codes({ ...good, pipeDiameterMm: 35, enlargedFromValveOutlet: true })).toEqual(["discharge-size-not-tabulated"]);
    expect(codes({ ...good, valveConnectionMm: 15, pipeDiameterMm: 22, enlargedFromValveOutlet: true })).toEqual(["tp-connection-unusual"]);
    expect(codes({ ...good, valve: "expansion", valveConnectionMm: 15, pipeDiameterMm: 22, enlargedFromValveOutlet: true })).toEqual([]);
  });

  it("allows three bends, not four", () => {
    expect(checkDischargePipe({ ...good, bends: [{ angleDeg: 45 }, { angleDeg: 45 }, { angleDeg: 45 }] }).ok).toBe(true);
    expect(codes({ ...good, bends: [{ angleDeg: 45 }, { angleDeg: 45 }, { angleDeg: 45 }, { angleDeg: 20 }] })).toEqual(["too-many-bends"]);
  });

  it("allows a sharper bend only with a radius of at least 5 × D", () => {
    expect(checkDischargePipe({ ...good, bends: [{ angleDeg: 90, centreLineRadiusMm: 110 }] }).ok).toBe(true);
    const r = checkDischargePipe({ ...good, bends: [{ angleDeg: 90, centreLineRadiusMm: 100 }, { angleDeg: 60 }] });
    const sharp = r.findings.filter((f) => f.code === "bend-too-sharp");
    expect(sharp.map((f) => f.elementId)).toEqual(["bend-1", "bend-2"]);
    expect(sharp[0].values).toMatchObject({ angleDeg: 90, centreLineRadiusMm: 100, minRadiusMm: 110 });
  });

  it("fails any elbow", () => {
    expect(codes({ ...good, elbows: 1 })).toEqual(["elbows-in-discharge"]);
  });

  it("rejects impossible input", () => {
    expect(() => checkDischargePipe({ ...good, lengthM: -1 })).toThrow(RangeError);
    expect(() => checkDischargePipe({ ...good, bends: [{ angleDeg: 0 }] })).toThrow(RangeError);
    expect(() => checkDischargePipe({ ...good, pipeDiameterMm: 0 })).toThrow(RangeError);
  });
});
