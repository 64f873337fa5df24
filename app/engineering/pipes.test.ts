import { describe, expect, it } from "vitest";
import { fittingCatalogue, fittingsAsEquivalentLength, fittingsK } from "./fittings";
import { findPipe, internalDiameterMm, mergeCatalogue, nextLargerPipe, pipeCatalogue, pipeSpecProblems, seriesSizes, velocityMs, type PipeSpec } from "./pipes";

describe("pipe catalogue", () => {
  it("has a usable, sourced row for every size", () => {
    const ids = new Set<string>();
    for (const p of pipeCatalogue) {
      expect(pipeSpecProblems(p)).toEqual([]);
      expect(p.source.length).toBeGreaterThan(10);
      expect(ids.has(p.id)).toBe(false);
      ids.add(p.id);
    }
    expect(new Set(pipeCatalogue.map((p) => p.material))).toEqual(
      new Set(["copper", "pex", "pp-r", "pex-al-pex", "galvanised-steel"]),
    );
  });

  // Check values: SANS 460 Class 0 walls from a South African maker's published table (15 × 0.5, 22 × 0.6);
  // EN 1057 R250 (15 × 0.7, 22 × 0.9) and ISO 65 medium DN 20 (26.9 × 2.6) from memory.
  it.each([
    ["cu-c0-15", 14.0],
    ["cu-c0-22", 20.8],
    ["cu-r250-15", 13.6],
    ["cu-r250-22", 20.2],
    ["ppr-20", 13.2],
    ["galv-20", 21.7],
  ])("gives %s an internal diameter of %s mm", (id, bore) => {
    expect(internalDiameterMm(findPipe(pipeCatalogue, id)!)).toBeCloseTo(bore, 9);
  });

  it("prefers a stated bore over outside diameter less walls", () => {
    const p: PipeSpec = { ...findPipe(pipeCatalogue, "cu-c0-22")!, internalDiameterMm: 20.5 };
    expect(internalDiameterMm(p)).toBe(20.5);
  });

  it("steps to the next larger size within the same series only", () => {
    const next = nextLargerPipe(pipeCatalogue, findPipe(pipeCatalogue, "cu-c0-15")!);
    expect(next?.id).toBe("cu-c0-22");
    expect(nextLargerPipe(pipeCatalogue, findPipe(pipeCatalogue, "cu-c0-54")!)).toBeUndefined();
    const sizes = seriesSizes(pipeCatalogue, "pex-sdr7.4").map(internalDiameterMm);
    expect([...sizes].sort((a, b) => a - b)).toEqual(sizes);
  });

  it("merges a project's rows: new ids are added, existing ids replaced, the base untouched", () => {
    const extra: PipeSpec[] = [
      { ...findPipe(pipeCatalogue, "cu-c0-22")!, hazenWilliamsC: 130, source: "project survey: aged copper" },
      { id: "cu-c0-67", series: "copper-sans460-class0", material: "copper", label: "Copper 67 × 1.5", outsideDiameterMm: 66.7, wallThicknessMm: 1.5, roughnessMm: 0.0015, hazenWilliamsC: 140, source: "SANS 460 Class 0 maker's table" },
    ];
    const merged = mergeCatalogue(pipeCatalogue, extra);
    expect(merged.length).toBe(pipeCatalogue.length + 1);
    expect(findPipe(merged, "cu-c0-22")!.hazenWilliamsC).toBe(130);
    expect(findPipe(pipeCatalogue, "cu-c0-22")!.hazenWilliamsC).toBe(140);
    expect(nextLargerPipe(merged, findPipe(merged, "cu-c0-54")!)?.id).toBe("cu-c0-67");
  });

  it("refuses an unusable project row, naming it", () => {
    const bad = { ...findPipe(pipeCatalogue, "pex-16")!, id: "pex-bad", wallThicknessMm: 9 };
    expect(() => mergeCatalogue(pipeCatalogue, [bad])).toThrow(/pex-bad.*leaves no bore/);
    const dup = findPipe(pipeCatalogue, "pex-16")!;
    expect(() => mergeCatalogue(pipeCatalogue, [dup, dup])).toThrow(/appears twice/);
  });

  it("computes velocity from flow and bore", () => {
    expect(velocityMs(0.3, 20)).toBeCloseTo(0.3e-3 / ((Math.PI * 0.02 ** 2) / 4), 12);
  });
});

describe("fittings catalogue", () => {
  it("names a source for every K-value", () => {
    for (const f of fittingCatalogue) {
      expect(f.k).toBeGreaterThanOrEqual(0);
      expect(f.source).toMatch(/Crane|Common practice|textbook|Borda/);
    }
  });

  // Check values: Crane TP-410 method K = (L/D)·fT with fT = 0.025: standard 90° elbow L/D 30 → 0.75; gate valve
  // L/D 8 → 0.20; globe valve L/D 340 → 8.5 (from memory).
  it("derives Crane-style K from L/D", () => {
    expect(fittingsK([{ fittingId: "elbow-90", count: 1 }])).toBeCloseTo(0.75, 12);
    expect(fittingsK([{ fittingId: "gate-valve-open", count: 2 }])).toBeCloseTo(0.4, 12);
    expect(fittingsK([{ fittingId: "globe-valve-open", count: 1 }])).toBeCloseTo(8.5, 12);
  });

  it("turns fittings with an L/D into equivalent length and keeps the rest as K", () => {
    const r = fittingsAsEquivalentLength(
      [
        { fittingId: "elbow-90", count: 2 },
        { fittingId: "prv-typical", count: 1 },
      ],
      20,
    );
    expect(r.equivalentLengthM).toBeCloseTo(2 * 30 * 0.02, 12);
    expect(r.remainingK).toBe(10);
  });

  it("rejects unknown fittings and negative counts", () => {
    expect(() => fittingsK([{ fittingId: "teapot", count: 1 }])).toThrow(/unknown fitting/);
    expect(() => fittingsK([{ fittingId: "elbow-90", count: -1 }])).toThrow(RangeError);
  });
});
