import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { hazenWilliamsLossKpa, segmentLoss } from "./losses";
import { STANDARD_GRAVITY_MS2, waterProperties } from "./water";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);
const base = { flowLps: 0.3, internalDiameterMm: 20.8, lengthM: 10, roughnessMm: 0.0015, tempC: 20 };

describe("segmentLoss", () => {
  // Check value: Hagen–Poiseuille law for laminar pipe flow, Δp = 128 μ L Q / (π d⁴) (any fluid-mechanics text).
  it("matches Hagen–Poiseuille in laminar flow", () => {
    const input = { flowLps: 0.005, internalDiameterMm: 10, lengthM: 12, roughnessMm: 0.0015, tempC: 20 };
    const r = segmentLoss(input);
    expect(r.reynolds).toBeLessThan(2000);
    const mu = waterProperties(20).dynamicViscosityPaS;
    const expectedPa = (128 * mu * 12 * 0.005e-3) / (Math.PI * 0.01 ** 4);
    expect(relativeError(r.frictionLossKpa * 1000, expectedPa)).toBeLessThan(1e-12);
  });

  // Check value: hydrostatics, Δp = ρ g h; 10 m of water at 20 °C is 97.89 kPa (998.21 kg/m³ × 9.80665 m/s²).
  it("charges ρ g h for a rise and credits a fall", () => {
    expect(segmentLoss({ ...base, riseM: 10 }).staticLossKpa).toBeCloseTo(97.89, 2);
    expect(segmentLoss({ ...base, riseM: -10 }).staticLossKpa).toBeCloseTo(-97.89, 2);
  });

  it("charges fittings as K·ρv²/2 and adds the parts into the total", () => {
    const r = segmentLoss({ ...base, kTotal: 3.5, riseM: 2 });
    const rho = waterProperties(20).densityKgM3;
    expect(r.fittingLossKpa).toBeCloseTo((3.5 * rho * r.velocityMs ** 2) / 2 / 1000, 12);
    expect(r.totalLossKpa).toBeCloseTo(r.frictionLossKpa + r.fittingLossKpa + r.staticLossKpa, 12);
    expect(r.staticLossKpa).toBeCloseTo((rho * STANDARD_GRAVITY_MS2 * 2) / 1000, 12);
  });

  it("treats an equivalent length as extra friction length", () => {
    const a = segmentLoss({ ...base, lengthM: 10, equivalentLengthM: 2.5 });
    const b = segmentLoss({ ...base, lengthM: 12.5 });
    expect(a.frictionLossKpa).toBeCloseTo(b.frictionLossKpa, 12);
  });

  it("has no friction, fitting loss or velocity at zero flow, but keeps the static head", () => {
    const r = segmentLoss({ ...base, flowLps: 0, kTotal: 5, riseM: 1 });
    expect(r).toMatchObject({ velocityMs: 0, reynolds: 0, frictionFactor: 0, frictionLossKpa: 0, fittingLossKpa: 0 });
    expect(r.totalLossKpa).toBe(r.staticLossKpa);
  });

  it("loses less in hot water than cold at the same flow (lower viscosity)", () => {
    expect(segmentLoss({ ...base, tempC: 60 }).frictionLossKpa).toBeLessThan(segmentLoss(base).frictionLossKpa);
  });

  it("rejects physically impossible input", () => {
    expect(() => segmentLoss({ ...base, lengthM: -1 })).toThrow(/lengthM cannot be negative/);
    expect(() => segmentLoss({ ...base, flowLps: -0.1 })).toThrow(RangeError);
    expect(() => segmentLoss({ ...base, internalDiameterMm: 0 })).toThrow(RangeError);
    expect(() => segmentLoss({ ...base, roughnessMm: -0.01 })).toThrow(RangeError);
    expect(() => segmentLoss({ ...base, kTotal: -1 })).toThrow(RangeError);
    expect(() => segmentLoss({ ...base, tempC: 120 })).toThrow(RangeError);
  });

  const flow = fc.double({ min: 0.001, max: 5, noNaN: true });
  const bore = fc.double({ min: 8, max: 110, noNaN: true });
  const length = fc.double({ min: 0.1, max: 200, noNaN: true });
  const rough = fc.constantFrom(0, 0.0015, 0.007, 0.045, 0.15);
  const temp = fc.double({ min: 1, max: 95, noNaN: true });

  it("friction loss grows with flow", () => {
    fc.assert(
      fc.property(flow, fc.double({ min: 1.001, max: 3, noNaN: true }), bore, length, rough, temp, (q, factor, d, l, e, t) => {
        const a = segmentLoss({ flowLps: q, internalDiameterMm: d, lengthM: l, roughnessMm: e, tempC: t, kTotal: 1 });
        const b = segmentLoss({ flowLps: q * factor, internalDiameterMm: d, lengthM: l, roughnessMm: e, tempC: t, kTotal: 1 });
        expect(b.frictionLossKpa).toBeGreaterThan(a.frictionLossKpa);
        expect(b.totalLossKpa).toBeGreaterThan(a.totalLossKpa);
      }),
    );
  });

  it("friction loss grows with length in proportion", () => {
    fc.assert(
      fc.property(flow, bore, length, fc.double({ min: 1.001, max: 5, noNaN: true }), rough, temp, (q, d, l, factor, e, t) => {
        const a = segmentLoss({ flowLps: q, internalDiameterMm: d, lengthM: l, roughnessMm: e, tempC: t });
        const b = segmentLoss({ flowLps: q, internalDiameterMm: d, lengthM: l * factor, roughnessMm: e, tempC: t });
        expect(b.frictionLossKpa).toBeGreaterThan(a.frictionLossKpa);
        expect(relativeError(b.frictionLossKpa, a.frictionLossKpa * factor)).toBeLessThan(1e-9);
      }),
    );
  });

  it("friction loss shrinks with diameter", () => {
    fc.assert(
      fc.property(flow, bore, fc.double({ min: 1.001, max: 3, noNaN: true }), length, rough, temp, (q, d, factor, l, e, t) => {
        const a = segmentLoss({ flowLps: q, internalDiameterMm: d, lengthM: l, roughnessMm: e, tempC: t, kTotal: 2 });
        const b = segmentLoss({ flowLps: q, internalDiameterMm: d * factor, lengthM: l, roughnessMm: e, tempC: t, kTotal: 2 });
        expect(b.frictionLossKpa).toBeLessThan(a.frictionLossKpa);
        expect(b.totalLossKpa).toBeLessThan(a.totalLossKpa);
      }),
    );
  });

  it("never lets NaN or Infinity out for valid input", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 50, noNaN: true }),
        fc.double({ min: 1, max: 500, noNaN: true }),
        fc.double({ min: 0, max: 1000, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        temp,
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: -50, max: 50, noNaN: true }),
        (q, d, l, e, t, k, rise) => {
          const r = segmentLoss({ flowLps: q, internalDiameterMm: d, lengthM: l, roughnessMm: Math.min(e, d * 0.099), tempC: t, kTotal: k, riseM: rise });
          for (const v of Object.values(r)) expect(Number.isFinite(v)).toBe(true);
        },
      ),
    );
  });
});

describe("hazenWilliamsLossKpa", () => {
  // Check values: the SI Hazen–Williams formula itself, hf = 10.67 L Q^1.852 / (C^1.852 d^4.87).
  it("evaluates the SI formula", () => {
    const headM = (10.67 * 100 * 0.001 ** 1.852) / (140 ** 1.852 * 0.0262 ** 4.87);
    const expectedKpa = (waterProperties(20).densityKgM3 * STANDARD_GRAVITY_MS2 * headM) / 1000;
    expect(hazenWilliamsLossKpa({ flowLps: 1, internalDiameterMm: 26.2, lengthM: 100, c: 140 })).toBeCloseTo(expectedKpa, 10);
  });

  it("scales as Q^1.852, L and d^-4.87", () => {
    const a = hazenWilliamsLossKpa({ flowLps: 0.4, internalDiameterMm: 20, lengthM: 10, c: 140 });
    expect(hazenWilliamsLossKpa({ flowLps: 0.8, internalDiameterMm: 20, lengthM: 10, c: 140 }) / a).toBeCloseTo(2 ** 1.852, 10);
    expect(hazenWilliamsLossKpa({ flowLps: 0.4, internalDiameterMm: 20, lengthM: 30, c: 140 }) / a).toBeCloseTo(3, 10);
    expect(hazenWilliamsLossKpa({ flowLps: 0.4, internalDiameterMm: 40, lengthM: 10, c: 140 }) / a).toBeCloseTo(2 ** -4.87, 10);
  });

  // Cross-check, not a published value: for smooth copper (C = 140) at 0.5–2 m/s, Hazen–Williams and
  // Darcy–Weisbach–Colebrook at 15 °C agree within about 15 % (Hazen–Williams has no Reynolds dependence).
  it("agrees with Darcy–Weisbach within 15 % for copper at ordinary velocities", () => {
    for (const d of [13.6, 20.2, 26.2, 32.6, 51.6]) {
      for (const v of [0.5, 1, 1.5, 2]) {
        const q = ((v * Math.PI * (d / 1000) ** 2) / 4) * 1000;
        const dw = segmentLoss({ flowLps: q, internalDiameterMm: d, lengthM: 10, roughnessMm: 0.0015, tempC: 15 }).frictionLossKpa;
        const hw = hazenWilliamsLossKpa({ flowLps: q, internalDiameterMm: d, lengthM: 10, c: 140, tempC: 15 });
        expect(relativeError(hw, dw)).toBeLessThan(0.15);
      }
    }
  });

  it("rejects impossible input", () => {
    expect(() => hazenWilliamsLossKpa({ flowLps: 1, internalDiameterMm: 20, lengthM: -1, c: 140 })).toThrow(RangeError);
    expect(() => hazenWilliamsLossKpa({ flowLps: 1, internalDiameterMm: 20, lengthM: 1, c: 0 })).toThrow(RangeError);
  });
});
