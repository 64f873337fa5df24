import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { designFlow, designFlowLpsFromLoadingUnits, FIXTURE_DEMAND, LOADING_UNIT_FLOW_LPS } from "./demand";

describe("loading units", () => {
  // Check values: EN 806-3:2006 Table 2 (read in a reproduced excerpt): washbasin, bidet, WC cistern 1 LU;
  // kitchen sink, washing machine, dishwasher, sink, shower head 2 LU; urinal flush valve 3; domestic bath 4;
  // garden tap 5; non-domestic sink / bath 8; flush valve DN 20 15. 1 LU = 0.1 L/s.
  it.each([
    ["washbasin", 1, 0.1],
    ["wc-cistern", 1, 0.1],
    ["kitchen-sink", 2, 0.2],
    ["washing-machine", 2, 0.2],
    ["dishwasher", 2, 0.2],
    ["shower", 2, 0.2],
    ["urinal-flush-valve", 3, 0.3],
    ["bath", 4, 0.4],
    ["garden-tap", 5, 0.5],
    ["non-domestic-sink", 8, 0.8],
    ["flush-valve-dn20", 15, 1.5],
  ] as const)("%s: %s LU, %s L/s", (fixture, lu, q) => {
    expect(FIXTURE_DEMAND[fixture].loadingUnits).toBe(lu);
    expect(FIXTURE_DEMAND[fixture].drawOffFlowLps).toBeCloseTo(q, 12);
    expect(FIXTURE_DEMAND[fixture].loadingUnits * LOADING_UNIT_FLOW_LPS).toBeCloseTo(q, 12);
  });
});

describe("design flow from loading units", () => {
  // Check values: the anchors of our EN 806-3 Figure B.1 approximation (from memory, confirm): a single draw-off
  // gives its own flow; 300 LU → 1.7 L/s; 5000 LU → 9 L/s.
  it("passes through the curve's anchors", () => {
    expect(designFlowLpsFromLoadingUnits(4, 4)).toBeCloseTo(0.4, 12);
    expect(designFlowLpsFromLoadingUnits(300, 4)).toBeCloseTo(1.7, 12);
    expect(designFlowLpsFromLoadingUnits(300, 15)).toBeCloseTo(1.7, 12);
    expect(designFlowLpsFromLoadingUnits(5000, 4)).toBeCloseTo(9, 12);
  });

  it("is zero with nothing connected and rejects inconsistent input", () => {
    expect(designFlowLpsFromLoadingUnits(0, 0)).toBe(0);
    expect(() => designFlowLpsFromLoadingUnits(3, 4)).toThrow(/cannot exceed the total/);
    expect(() => designFlowLpsFromLoadingUnits(3, 0)).toThrow(RangeError);
    expect(() => designFlowLpsFromLoadingUnits(-1, 1)).toThrow(RangeError);
  });

  it("lies between the largest single draw-off and all draw-offs at once, and grows with total LU", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 20, noNaN: true }), fc.double({ min: 0, max: 8000, noNaN: true }), fc.double({ min: 1, max: 2, noNaN: true }), (largest, extra, factor) => {
        const total = largest + extra;
        const q = designFlowLpsFromLoadingUnits(total, largest);
        expect(q).toBeGreaterThanOrEqual(largest * LOADING_UNIT_FLOW_LPS - 1e-12);
        expect(q).toBeLessThanOrEqual(total * LOADING_UNIT_FLOW_LPS + 1e-12);
        expect(designFlowLpsFromLoadingUnits(total * factor, largest)).toBeGreaterThanOrEqual(q - 1e-12);
      }),
    );
  });

  it("states its method and source, and flags extrapolation", () => {
    const r = designFlow({ fixtures: [{ fixture: "bath", count: 2 }, { fixture: "washbasin", count: 3 }] });
    expect(r.totalLoadingUnits).toBe(11);
    expect(r.largestSingleLoadingUnits).toBe(4);
    expect(r.method).toBe("EN 806-3 loading units");
    expect(r.source).toMatch(/EN 806-3:2006 Table 2/);
    expect(r.flowLps).toBeCloseTo(designFlowLpsFromLoadingUnits(11, 4), 12);
    expect(designFlow({ loadingUnits: [6000] }).notes.join(" ")).toMatch(/extrapolated/);
  });

  it("adds stated flows without diversity", () => {
    const r = designFlow({ statedFlowsLps: [0.2, 0.15] });
    expect(r.flowLps).toBeCloseTo(0.35, 12);
    expect(r.method).toBe("Stated flows");
    const both = designFlow({ fixtures: [{ fixture: "shower", count: 1 }], statedFlowsLps: [0.5] });
    expect(both.flowLps).toBeCloseTo(0.7, 12);
    expect(both.method).toBe("EN 806-3 loading units + Stated flows");
  });
});
