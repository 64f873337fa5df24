import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { expansionVolume, heatingTime, storageSizing } from "./heating";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe("heatingTime", () => {
  // Check value: textbook Q = m c ΔT with c = 4.186 kJ/(kg·K) and 1 kg per litre: 150 L from 15 to 60 °C takes
  // 150 × 4.186 × 45 / 3600 = 7.85 kWh, 2.62 h at 3 kW. Our mass and cp differ from those round values by
  // under 1 %.
  it("heats 150 L from 15 to 60 °C with 3 kW in about 2.6 h", () => {
    const r = heatingTime({ volumeL: 150, fromC: 15, toC: 60, powerKw: 3 });
    expect(relativeError(r.energyKwh, (150 * 4.186 * 45) / 3600)).toBeLessThan(0.01);
    expect(relativeError(r.hours, (150 * 4.186 * 45) / 3600 / 3)).toBeLessThan(0.01);
    expect(r.massKg).toBeCloseTo(149.87, 2);
  });

  it("scales with volume and rise, and divides by power × efficiency", () => {
    const a = heatingTime({ volumeL: 100, fromC: 20, toC: 60, powerKw: 2 });
    expect(heatingTime({ volumeL: 200, fromC: 20, toC: 60, powerKw: 2 }).hours).toBeCloseTo(2 * a.hours, 12);
    expect(heatingTime({ volumeL: 100, fromC: 20, toC: 60, powerKw: 4 }).hours).toBeCloseTo(a.hours / 2, 12);
    expect(heatingTime({ volumeL: 100, fromC: 20, toC: 60, powerKw: 2, efficiency: 0.8 }).hours).toBeCloseTo(a.hours / 0.8, 12);
    expect(heatingTime({ volumeL: 100, fromC: 20, toC: 20, powerKw: 2 }).energyKwh).toBe(0);
  });

  it("rejects impossible input", () => {
    expect(() => heatingTime({ volumeL: 100, fromC: 60, toC: 20, powerKw: 2 })).toThrow(RangeError);
    expect(() => heatingTime({ volumeL: 100, fromC: 20, toC: 60, powerKw: 0 })).toThrow(RangeError);
    expect(() => heatingTime({ volumeL: -5, fromC: 20, toC: 60, powerKw: 2 })).toThrow(RangeError);
    expect(() => heatingTime({ volumeL: 100, fromC: 20, toC: 60, powerKw: 2, efficiency: 1.2 })).toThrow(RangeError);
  });
});

describe("expansionVolume", () => {
  // Check value: from the tabulated densities 999.10 kg/m³ at 15 °C and 983.20 kg/m³ at 60 °C, 150 L expands by
  // 150 × (999.10 / 983.20 − 1) = 2.43 L.
  it("expands 150 L by about 2.43 L from 15 to 60 °C", () => {
    const r = expansionVolume({ volumeL: 150, fromC: 15, toC: 60 });
    expect(r.litres).toBeCloseTo(150 * (999.1026 / 983.2 - 1), 2);
    expect(r.percent).toBeCloseTo((999.1026 / 983.2 - 1) * 100, 2);
  });

  it("grows with the temperature rise", () => {
    fc.assert(
      fc.property(fc.double({ min: 5, max: 40, noNaN: true }), fc.double({ min: 1, max: 50, noNaN: true }), (from, rise) => {
        const a = expansionVolume({ volumeL: 100, fromC: from, toC: from + rise });
        const b = expansionVolume({ volumeL: 100, fromC: from, toC: from + rise + 5 });
        expect(b.litres).toBeGreaterThan(a.litres);
      }),
    );
  });
});

describe("storageSizing", () => {
  // Basis: 50 L per occupant (common practice, from memory), excessive above 1.5 × the need (common practice).
  it("recommends the smallest standard size that meets the need", () => {
    const r = storageSizing({ occupants: 3, volumeL: 150 });
    expect(r).toMatchObject({ ok: true, requiredVolumeL: 150, recommendedVolumeL: 150 });
    expect(r.findings).toEqual([]);
    expect(r.basis).toMatch(/common practice/);
  });

  it("warns on excessive storage and on too little", () => {
    expect(storageSizing({ occupants: 2, volumeL: 200 }).findings.map((f) => f.code)).toEqual(["storage-excessive"]);
    expect(storageSizing({ occupants: 2, volumeL: 150 }).findings).toEqual([]);
    expect(storageSizing({ occupants: 4, volumeL: 150 }).findings.map((f) => f.code)).toEqual(["storage-undersized"]);
    expect(storageSizing({ occupants: 2, volumeL: 200, excessRatio: 2 }).findings).toEqual([]);
  });

  it("notes a need beyond the largest standard size", () => {
    const r = storageSizing({ occupants: 10, volumeL: 500 });
    expect(r.findings.map((f) => f.code)).toContain("beyond-standard-sizes");
    expect(r.recommendedVolumeL).toBe(500);
  });

  it("rejects impossible input", () => {
    expect(() => storageSizing({ occupants: 0, volumeL: 100 })).toThrow(RangeError);
    expect(() => storageSizing({ occupants: 2, volumeL: 100, excessRatio: 0.5 })).toThrow(RangeError);
  });
});
