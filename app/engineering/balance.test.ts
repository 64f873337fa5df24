import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { BALANCE_DIFFERENCE_DEFINITION, pressureBalance, type BalanceResult } from "./balance";
import { syntheticNetwork } from "./bench/networks";
import { CAUTION } from "./caution";
import { designFlowLpsFromLoadingUnits } from "./demand";
import { fittingsK } from "./fittings";
import { segmentLoss } from "./losses";
import { NetworkValidationError, validateNetwork, type BalanceNetwork, type NetworkSegmentInput } from "./network";
import { findPipe, internalDiameterMm, pipeCatalogue } from "./pipes";
import { STANDARD_GRAVITY_MS2, waterProperties } from "./water";

const bore = (id: string) => internalDiameterMm(findPipe(pipeCatalogue, id)!);

/** One shower: cold straight from a tee, hot out through the heater in the roof. */
function showerNetwork(over: Partial<{ hotPipe: string; hotLengthM: number; staticKpa: number; prvKpa: number }> = {}): BalanceNetwork {
  return {
    supply: { nodeId: "S", staticPressureKpa: over.staticKpa ?? 500, prv: { nodeId: "S", settingKpa: over.prvKpa ?? 400 } },
    heater: { nodeId: "H", pressureLossKpa: 10 },
    segments: [
      { id: "a-main", fromNodeId: "S", toNodeId: "T", service: "cold", lengthM: 5, pipeId: "cu-c0-22" },
      {
        id: "b-heater-feed",
        fromNodeId: "T",
        toNodeId: "H",
        service: "cold",
        lengthM: 12,
        pipeId: "cu-c0-22",
        riseM: 3,
        fittings: [{ fittingId: "elbow-90", count: 4 }],
      },
      {
        id: "c-hot",
        fromNodeId: "H",
        toNodeId: "SH",
        service: "hot",
        lengthM: over.hotLengthM ?? 15,
        pipeId: over.hotPipe ?? "cu-c0-15",
        riseM: -3,
        fittings: [{ fittingId: "elbow-90", count: 6 }],
      },
      { id: "d-cold", fromNodeId: "T", toNodeId: "SC", service: "cold", lengthM: 6, pipeId: "cu-c0-15" },
    ],
    outlets: [
      { id: "shower-hot", nodeId: "SH", flowLps: 0.15 },
      { id: "shower-cold", nodeId: "SC", flowLps: 0.1 },
    ],
    mixingPoints: [{ id: "shower", hotOutletId: "shower-hot", coldOutletId: "shower-cold" }],
  };
}

const loss = (flowLps: number, pipeId: string, lengthM: number, tempC: number, elbows: number, riseM = 0) =>
  segmentLoss({
    flowLps,
    internalDiameterMm: bore(pipeId),
    lengthM,
    roughnessMm: 0.0015,
    tempC,
    kTotal: fittingsK([{ fittingId: "elbow-90", count: elbows }]),
    riseM,
  }).totalLossKpa;

describe("pressureBalance on a single shower", () => {
  const result = pressureBalance(showerNetwork());
  const mp = result.mixingPoints[0];

  it("takes each residual pressure as supply less the losses along its path", () => {
    const main = loss(0.25, "cu-c0-22", 5, 20, 0);
    const feed = loss(0.15, "cu-c0-22", 12, 20, 4, 3);
    const hot = loss(0.15, "cu-c0-15", 15, 60, 6, -3);
    const cold = loss(0.1, "cu-c0-15", 6, 20, 0);
    expect(mp.hotResidualKpa).toBeCloseTo(400 - main - feed - 10 - hot, 9);
    expect(mp.coldResidualKpa).toBeCloseTo(400 - main - cold, 9);
  });

  it("reports the difference by its stated definition", () => {
    expect(result.definition).toBe(BALANCE_DIFFERENCE_DEFINITION);
    const expected = (Math.abs(mp.hotResidualKpa - mp.coldResidualKpa) / Math.max(mp.hotResidualKpa, mp.coldResidualKpa)) * 100;
    expect(mp.differencePercent).toBeCloseTo(expected, 12);
    expect(mp.limitPercent).toBe(20);
    expect(mp.ok).toBe(true);
    expect(mp.lowerSide).toBe("hot");
    expect(result.ok).toBe(true);
    expect(result.caution).toBe(CAUTION);
  });

  it("carries the sum of downstream flows in each segment", () => {
    const flow = Object.fromEntries(result.segments.map((s) => [s.id, s.flowLps]));
    expect(flow).toEqual({ "a-main": 0.25, "b-heater-feed": 0.15, "c-hot": 0.15, "d-cold": 0.1 });
    expect(result.designFlowMethod.map((m) => m.method)).toEqual(["Stated flows"]);
  });

  it("gives the pressure profile along each path, heater inlet and outlet included", () => {
    expect(mp.hotProfile.map((p) => [p.nodeId, p.distanceM, p.note])).toEqual([
      ["S", 0, "PRV 400 kPa"],
      ["T", 5, undefined],
      ["H", 17, "heater inlet"],
      ["H", 17, "heater outlet"],
      ["SH", 32, undefined],
    ]);
    expect(mp.hotProfile[2].pressureKpa - mp.hotProfile[3].pressureKpa).toBeCloseTo(10, 12);
    expect(mp.hotProfile.at(-1)!.pressureKpa).toBe(mp.hotResidualKpa);
    expect(mp.coldProfile.map((p) => p.nodeId)).toEqual(["S", "T", "SC"]);
  });

  it("omits profiles when asked", () => {
    const r = pressureBalance(showerNetwork(), { includeProfiles: false });
    expect(r.mixingPoints[0].hotProfile).toEqual([]);
    expect(r.mixingPoints[0].hotResidualKpa).toBe(mp.hotResidualKpa);
  });

  it("scales the heater loss with flow squared from its rated flow", () => {
    const net = showerNetwork();
    net.heater = { nodeId: "H", pressureLossKpa: 10, ratedFlowLps: 0.3 };
    const r = pressureBalance(net);
    expect(r.nodes.find((n) => n.nodeId === "H")!.heaterOutletPressureKpa).toBeCloseTo(
      r.nodes.find((n) => n.nodeId === "H")!.pressureKpa - 10 * (0.15 / 0.3) ** 2,
      12,
    );
  });

  it("uses the equivalent-length method when asked", () => {
    const r = pressureBalance(showerNetwork(), { fittingMethod: "equivalentLength" });
    const extra = 6 * 30 * (bore("cu-c0-15") / 1000);
    const hot = segmentLoss({ flowLps: 0.15, internalDiameterMm: bore("cu-c0-15"), lengthM: 15, equivalentLengthM: extra, roughnessMm: 0.0015, tempC: 60, riseM: -3 });
    expect(r.segments.find((s) => s.id === "c-hot")!.totalLossKpa).toBeCloseTo(hot.totalLossKpa, 12);
  });
});

describe("pressureBalance: design flow from loading units", () => {
  it("applies the EN 806-3 conversion to each segment's downstream loading units", () => {
    const net = syntheticNetwork(6);
    const r = pressureBalance(net);
    // Each cold branch at the first level serves one shower (2 LU): its own draw-off.
    const leg = r.segments.find((s) => s.id === "cold-leg-0")!;
    expect(leg.flowLps).toBeCloseTo(0.2, 12);
    // The cold trunk at M carries six showers' design flow: 12 LU, largest single 2 LU.
    const coldAtM = r.nodes.filter((n) => n.parentNodeId === "M" && n.nodeId.startsWith("cold"));
    const total = coldAtM.reduce((s, n) => s + n.flowLps, 0);
    expect(total).toBeCloseTo(6 * 0.2, 12); // one shower per first-level branch
    const main = r.segments.find((s) => s.id === "main")!;
    expect(main.flowLps).toBeCloseTo(designFlowLpsFromLoadingUnits(24, 2), 12);
    expect(r.designFlowMethod[0].source).toMatch(/EN 806-3/);
  });
});

describe("pressureBalance: static pressure", () => {
  // Rule: system static pressure at most 600 kPa (common practice).
  it("fails above 600 kPa static anywhere, counting the head of a fall", () => {
    const net = showerNetwork({ staticKpa: 650, prvKpa: 590 });
    net.segments.push({ id: "e-basement", fromNodeId: "T", toNodeId: "B", service: "cold", lengthM: 6, riseM: -4, pipeId: "cu-c0-15" });
    net.outlets.push({ id: "tap", nodeId: "B", flowLps: 0.1 });
    const r = pressureBalance(net);
    const expected = 590 + (waterProperties(20).densityKgM3 * STANDARD_GRAVITY_MS2 * 4) / 1000;
    expect(r.maxStaticPressure.nodeId).toBe("B");
    expect(r.maxStaticPressure.pressureKpa).toBeCloseTo(expected, 9);
    const f = r.findings.find((x) => x.code === "static-pressure-exceeded")!;
    expect(f.severity).toBe("fail");
    expect(f.elementId).toBe("B");
    expect(r.ok).toBe(false);
  });

  it("passes at 600 kPa and is configurable", () => {
    const net = showerNetwork({ staticKpa: 600, prvKpa: 600 });
    expect(pressureBalance(net).findings.some((f) => f.code === "static-pressure-exceeded")).toBe(false);
    expect(pressureBalance(net, { maxStaticPressureKpa: 500 }).findings.some((f) => f.code === "static-pressure-exceeded")).toBe(true);
  });
});

describe("pressureBalance: failing balance and suggestions", () => {
  const net = showerNetwork({ hotLengthM: 30 });
  net.mixingPoints.push({ id: "basin", hotOutletId: "basin-hot", coldOutletId: "basin-cold" });
  net.segments.push(
    { id: "f-basin-hot", fromNodeId: "H", toNodeId: "BH", service: "hot", lengthM: 4, pipeId: "cu-c0-15" },
    { id: "g-basin-cold", fromNodeId: "T", toNodeId: "BC", service: "cold", lengthM: 4, pipeId: "cu-c0-15" },
  );
  net.outlets.push({ id: "basin-hot", nodeId: "BH", flowLps: 0.1 }, { id: "basin-cold", nodeId: "BC", flowLps: 0.1 });
  net.segments[2].pipeId = "cu-c0-15";
  net.outlets[0].flowLps = 0.3;
  const r = pressureBalance(net);

  // The 20 % limit is common practice.
  it("fails a mixing point beyond 20 % with the numbers behind it", () => {
    const shower = r.mixingPoints.find((m) => m.id === "shower")!;
    expect(shower.ok).toBe(false);
    expect(shower.differencePercent).toBeGreaterThan(20);
    const f = r.findings.find((x) => x.elementId === "shower")!;
    expect(f).toMatchObject({ severity: "fail", code: "pressure-imbalance" });
    expect(f.values.differencePercent).toBe(shower.differencePercent);
    expect(r.ok).toBe(false);
  });

  it("honours a configured limit", () => {
    const shower = r.mixingPoints.find((m) => m.id === "shower")!;
    const loose = pressureBalance(net, { balanceLimitPercent: shower.differencePercent + 1 });
    expect(loose.mixingPoints.find((m) => m.id === "shower")!.ok).toBe(true);
  });

  it("suggests upsizing on the hot path only, and the suggestion holds when applied", () => {
    const s = r.suggestion!;
    expect(s.resolved).toBe(true);
    expect(s.method).toMatch(/Greedy/);
    expect(s.changes.length).toBeGreaterThan(0);
    for (const c of s.changes) {
      expect(["b-heater-feed", "c-hot"]).toContain(c.segmentId);
      expect(c.toInternalDiameterMm).toBeGreaterThan(c.fromInternalDiameterMm);
      expect(findPipe(pipeCatalogue, c.toPipeId)!.series).toBe(findPipe(pipeCatalogue, c.fromPipeId)!.series);
      expect(c.velocityAfterMs).toBeLessThanOrEqual(2);
    }
    expect(s.after.every((m) => m.ok)).toBe(true);
    const applied: BalanceNetwork = {
      ...net,
      segments: net.segments.map((seg) => {
        const change = s.changes.find((c) => c.segmentId === seg.id);
        return change ? { ...seg, pipeId: change.toPipeId } : seg;
      }),
    };
    const again = pressureBalance(applied);
    expect(again.mixingPoints.every((m) => m.ok)).toBe(true);
    for (const m of s.after) {
      const x = again.mixingPoints.find((y) => y.id === m.id)!;
      expect(x.hotResidualKpa).toBeCloseTo(m.hotResidualKpa, 9);
      expect(x.differencePercent).toBeCloseTo(m.differencePercent, 9);
    }
    expect(again.suggestion).toBeNull();
  });

  it("keeps no change that is not needed", () => {
    const s = r.suggestion!;
    for (const c of s.changes) {
      // Stepping any single change back one size breaks the result.
      const sizes = pipeCatalogue.filter((p) => p.series === findPipe(pipeCatalogue, c.toPipeId)!.series).sort((a, b) => internalDiameterMm(a) - internalDiameterMm(b));
      const pos = sizes.findIndex((p) => p.id === c.toPipeId);
      const applied: BalanceNetwork = {
        ...net,
        segments: net.segments.map((seg) => {
          const change = s.changes.find((x) => x.segmentId === seg.id);
          if (!change) return seg;
          return { ...seg, pipeId: change === c ? sizes[pos - 1].id : change.toPipeId };
        }),
      };
      expect(pressureBalance(applied).mixingPoints.every((m) => m.ok)).toBe(false);
    }
  });

  it("offers no suggestion when asked not to", () => {
    expect(pressureBalance(net, { suggest: false }).suggestion).toBeNull();
  });
});

// The fix of a second PRV on the cold feed, of the same rating, where only one point mixes is common practice.
describe("pressureBalance: balancing PRV where only one point mixes", () => {
  // The heater has its own 400 kPa pressure control valve; the cold feed to the shower runs at 550 kPa mains.
  const net: BalanceNetwork = {
    supply: { nodeId: "S", staticPressureKpa: 550 },
    heater: { nodeId: "H", pressureLossKpa: 10 },
    prvs: [{ id: "pcv", nodeId: "HV", settingKpa: 400 }],
    segments: [
      { id: "main", fromNodeId: "S", toNodeId: "T", service: "cold", lengthM: 5, pipeId: "cu-c0-22" },
      { id: "to-valve", fromNodeId: "T", toNodeId: "HV", service: "cold", lengthM: 10, pipeId: "cu-c0-22" },
      { id: "valve-heater", fromNodeId: "HV", toNodeId: "H", service: "cold", lengthM: 1, pipeId: "cu-c0-22" },
      { id: "hot", fromNodeId: "H", toNodeId: "SH", service: "hot", lengthM: 12, pipeId: "cu-c0-15" },
      { id: "cold-1", fromNodeId: "T", toNodeId: "C1", service: "cold", lengthM: 4, pipeId: "cu-c0-15" },
      { id: "cold-2", fromNodeId: "C1", toNodeId: "SC", service: "cold", lengthM: 3, pipeId: "cu-c0-15" },
    ],
    outlets: [
      { id: "sh-hot", nodeId: "SH", flowLps: 0.12 },
      { id: "sh-cold", nodeId: "SC", flowLps: 0.08 },
    ],
    mixingPoints: [{ id: "shower", hotOutletId: "sh-hot", coldOutletId: "sh-cold" }],
  };
  const r = pressureBalance(net);
  const prv = r.suggestion!.balancingPrv!;

  it("fails as built: the cold side is at mains pressure", () => {
    expect(r.mixingPoints[0].ok).toBe(false);
    expect(r.mixingPoints[0].lowerSide).toBe("hot");
  });

  it("places a PRV at the top of the feed that serves only this cold outlet, set to match the hot side", () => {
    expect(prv.mixingPointId).toBe("shower");
    expect(prv.nodeId).toBe("C1");
    expect(prv.predicted.differencePercent).toBeLessThan(1e-9);
    expect(prv.predicted.coldResidualKpa).toBeCloseTo(r.mixingPoints[0].hotResidualKpa, 9);
    const applied = pressureBalance({ ...net, prvs: [...net.prvs!, { nodeId: prv.nodeId, settingKpa: prv.settingKpa }] });
    expect(applied.mixingPoints[0].coldResidualKpa).toBeCloseTo(applied.mixingPoints[0].hotResidualKpa, 9);
    expect(applied.mixingPoints[0].ok).toBe(true);
  });

  it("also predicts the accepted fix: a PRV of the same rating as the hot side's", () => {
    expect(prv.sameRating).toMatchObject({ hotSidePrvNodeId: "HV", settingKpa: 400 });
    const applied = pressureBalance({ ...net, prvs: [...net.prvs!, { nodeId: "C1", settingKpa: 400 }] });
    expect(prv.sameRating!.predicted.differencePercent).toBeCloseTo(applied.mixingPoints[0].differencePercent, 9);
    expect(prv.sameRating!.predicted.ok).toBe(applied.mixingPoints[0].ok);
  });
});

// The 2.0 m/s default is EN 806-3:2006 §4.4 for mains, risers and floor pipes (read in a reproduced excerpt).
describe("pressureBalance: velocity", () => {
  it("warns above 2.0 m/s and suggests the smallest size in the series that meets it", () => {
    const net = showerNetwork();
    net.outlets[1].flowLps = 0.5; // 0.5 L/s in a 14 mm bore: about 3.2 m/s
    const r = pressureBalance(net, { balanceLimitPercent: 99 });
    const f = r.findings.find((x) => x.code === "velocity-exceeded")!;
    expect(f).toMatchObject({ severity: "warn", elementId: "d-cold" });
    const change = r.suggestion!.changes.find((c) => c.segmentId === "d-cold")!;
    expect(change).toMatchObject({ reason: "velocity", fromPipeId: "cu-c0-15", toPipeId: "cu-c0-22" });
    expect(change.velocityAfterMs).toBeLessThanOrEqual(2);
    expect(pressureBalance(net, { balanceLimitPercent: 99, maxVelocityMs: 4 }).findings.some((x) => x.code === "velocity-exceeded")).toBe(false);
  });
});

describe("network validation", () => {
  const issuesOf = (net: BalanceNetwork) => validateNetwork(net);
  const withSegments = (segments: NetworkSegmentInput[]): BalanceNetwork => ({ ...showerNetwork(), segments });

  it("accepts a good network", () => {
    expect(issuesOf(showerNetwork())).toEqual([]);
  });

  it("throws NetworkValidationError with field paths", () => {
    const net = showerNetwork();
    net.segments[0].lengthM = -2;
    expect(() => pressureBalance(net)).toThrow(NetworkValidationError);
    try {
      pressureBalance(net);
    } catch (e) {
      expect((e as NetworkValidationError).issues[0]).toMatchObject({
        path: ["segments", 0, "lengthM"],
        elementId: "a-main",
      });
      expect((e as NetworkValidationError).issues[0].message).toMatch(/Segment "a-main" has a negative or missing length/);
    }
  });

  it("names a loop", () => {
    const segs = showerNetwork().segments;
    const issues = issuesOf(
      withSegments([
        ...segs,
        { id: "x1", fromNodeId: "L1", toNodeId: "L2", service: "cold", lengthM: 1, pipeId: "cu-c0-15" },
        { id: "x2", fromNodeId: "L2", toNodeId: "L1", service: "cold", lengthM: 1, pipeId: "cu-c0-15" },
      ]),
    );
    expect(issues.map((i) => i.message).join(" ")).toMatch(/Segments "x\d", "x\d" form a loop/);
  });

  it("names a node fed twice (a loop back into the tree)", () => {
    const segs = showerNetwork().segments;
    const issues = issuesOf(withSegments([...segs, { id: "z", fromNodeId: "SC", toNodeId: "T", service: "cold", lengthM: 1, pipeId: "cu-c0-15" }]));
    expect(issues[0].message).toMatch(/Node "T" is fed by two segments \("a-main" and "z"\)/);
  });

  it("names a part not connected to the supply", () => {
    const segs = showerNetwork().segments;
    const issues = issuesOf(withSegments([...segs, { id: "orphan", fromNodeId: "Q", toNodeId: "R", service: "cold", lengthM: 1, pipeId: "cu-c0-15" }]));
    expect(issues[0]).toMatchObject({ elementId: "orphan", path: ["segments", 4, "fromNodeId"] });
    expect(issues[0].message).toMatch(/not connected to the supply node "S"/);
  });

  it("names missing nodes, outlets, pipes and fittings", () => {
    const net = showerNetwork();
    net.outlets.push({ id: "ghost", nodeId: "nowhere", flowLps: 0.1 });
    net.mixingPoints.push({ id: "mp2", hotOutletId: "shower-hot", coldOutletId: "missing" });
    net.segments[3].pipeId = "cu-99";
    net.segments[1].fittings = [{ fittingId: "teapot", count: 1 }];
    net.heater = { nodeId: "HX", pressureLossKpa: 5 };
    const messages = issuesOf(net).map((i) => i.message);
    expect(messages).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/Outlet "ghost" sits at node "nowhere", which is not in the network/),
        expect.stringMatching(/Mixing point "mp2" refers to unknown outlet "missing"/),
        expect.stringMatching(/uses pipe "cu-99", which is not in the catalogue/),
        expect.stringMatching(/unknown fitting "teapot"/),
        expect.stringMatching(/heater node "HX" is not in the network/),
      ]),
    );
  });

  it("rejects physically impossible values", () => {
    const net = showerNetwork();
    net.supply.prv = { nodeId: "S", settingKpa: 700 };
    net.segments[1].riseM = 20;
    net.supply.dynamicPressureKpa = 600;
    net.outlets[0].flowLps = -0.1;
    const messages = issuesOf(net).map((i) => i.message);
    expect(messages).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/set to 700 kPa, above the 500 kPa supply; a PRV can only reduce pressure/),
        expect.stringMatching(/rises or falls 20 m over a length of only 12 m/),
        expect.stringMatching(/pressure under flow \(600 kPa\) cannot exceed its static pressure/),
        expect.stringMatching(/Outlet "shower-hot" has a negative or invalid flow/),
      ]),
    );
  });

  it("checks hot and cold against the heater's position", () => {
    const net = showerNetwork();
    net.segments[3].service = "hot";
    net.mixingPoints[0] = { id: "shower", hotOutletId: "shower-cold", coldOutletId: "shower-hot" };
    const messages = issuesOf(net).map((i) => i.message);
    expect(messages).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/Segment "d-cold" is marked hot but is not downstream of the heater/),
        expect.stringMatching(/outlet "shower-hot" is not on a cold pipe/),
      ]),
    );
  });

  it("rejects duplicate ids and a segment that ends where it starts", () => {
    const segs = showerNetwork().segments;
    const messages = issuesOf(
      withSegments([...segs, { ...segs[0] }, { id: "self", fromNodeId: "T", toNodeId: "T", service: "cold", lengthM: 1, pipeId: "cu-c0-15" }]),
    ).map((i) => i.message);
    expect(messages).toEqual(
      expect.arrayContaining([expect.stringMatching(/Segment "a-main" appears more than once/), expect.stringMatching(/starts and ends at the same node "T"/)]),
    );
  });
});

// ---------------------------------------------------------------------------------------------------------
// Properties over generated networks.

interface GeneratedTree {
  parents: number[];
  pipes: string[];
  lengths: number[];
  rises: number[];
  flows: number[];
}

const copper = ["cu-c0-15", "cu-c0-22", "cu-c0-28"];
/** A random tree of cold nodes under a supply, a heater hanging off node 1, and hot nodes under it. */
const treeArb = fc
  .integer({ min: 3, max: 40 })
  .chain((size) =>
    fc.record({
      parents: fc.tuple(...Array.from({ length: size }, (_, i) => fc.integer({ min: 0, max: Math.max(0, i) }))),
      pipes: fc.array(fc.constantFrom(...copper), { minLength: size, maxLength: size }),
      lengths: fc.array(fc.double({ min: 0.5, max: 30, noNaN: true }), { minLength: size, maxLength: size }),
      rises: fc.array(fc.double({ min: -0.4, max: 0.4, noNaN: true }), { minLength: size, maxLength: size }),
      flows: fc.array(fc.double({ min: 0, max: 0.4, noNaN: true }), { minLength: size, maxLength: size }),
    }),
  );

function networkFrom(t: GeneratedTree): BalanceNetwork {
  // Node k+1 hangs off node parents[k] (0 = supply); the subtree under node 1 is hot, behind the heater at 1.
  const hot = new Set<number>();
  const segments: NetworkSegmentInput[] = t.parents.map((p, k) => {
    const node = k + 1;
    if (p === 1 || hot.has(p)) hot.add(node);
    return {
      id: `s${node}`,
      fromNodeId: `n${p}`,
      toNodeId: `n${node}`,
      service: hot.has(node) ? "hot" : "cold",
      lengthM: t.lengths[k],
      riseM: t.rises[k] * t.lengths[k],
      pipeId: t.pipes[k],
    };
  });
  const outlets = t.parents.map((_, k) => ({ id: `o${k + 1}`, nodeId: `n${k + 1}`, flowLps: t.flows[k] }));
  const hotOutlets = outlets.filter((_, k) => hot.has(k + 1));
  const coldOutlets = outlets.filter((_, k) => !hot.has(k + 1) && k + 1 !== 1);
  const mixingPoints = hotOutlets
    .slice(0, coldOutlets.length)
    .map((h, i) => ({ id: `m${i}`, hotOutletId: h.id, coldOutletId: coldOutlets[i].id }));
  return {
    supply: { nodeId: "n0", staticPressureKpa: 450 },
    heater: { nodeId: "n1", pressureLossKpa: 5 },
    segments,
    outlets: outlets.filter((o) => o.nodeId !== "n1"),
    mixingPoints,
  };
}

function shuffle<T>(items: T[], seed: number): T[] {
  const a = [...items];
  let s = seed;
  for (let i = a.length - 1; i > 0; i--) {
    s = (Math.imul(s, 1103515245) + 12345) >>> 0;
    const j = s % (i + 1);
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

const byId = <T extends { id: string }>(items: T[]) => Object.fromEntries(items.map((x) => [x.id, x]));
const canonical = (r: BalanceResult) => ({
  mixingPoints: byId(r.mixingPoints),
  segments: byId(r.segments),
  nodes: Object.fromEntries(r.nodes.map((n) => [n.nodeId, n])),
  findings: [...r.findings].sort((a, b) => `${a.code}${a.elementId}`.localeCompare(`${b.code}${b.elementId}`)),
  suggestion: r.suggestion && {
    ...r.suggestion,
    changes: Object.fromEntries(r.suggestion.changes.map((c) => [c.segmentId, c])),
    after: byId(r.suggestion.after),
  },
  ok: r.ok,
});

describe("pressureBalance properties", () => {
  it("gives the same results whatever order segments, outlets and mixing points are listed in", () => {
    fc.assert(
      fc.property(treeArb, fc.integer({ min: 1, max: 2 ** 31 - 1 }), (t, seed) => {
        const net = networkFrom(t);
        const shuffled: BalanceNetwork = {
          ...net,
          segments: shuffle(net.segments, seed),
          outlets: shuffle(net.outlets, seed + 1),
          mixingPoints: shuffle(net.mixingPoints, seed + 2),
        };
        expect(canonical(pressureBalance(shuffled))).toEqual(canonical(pressureBalance(net)));
      }),
      { numRuns: 60 },
    );
  });

  it("never lets NaN or Infinity out for a valid network", () => {
    const numbers = (value: unknown, out: number[] = []): number[] => {
      if (typeof value === "number") out.push(value);
      else if (Array.isArray(value)) value.forEach((v) => numbers(v, out));
      else if (value && typeof value === "object") Object.values(value).forEach((v) => numbers(v, out));
      return out;
    };
    fc.assert(
      fc.property(treeArb, (t) => {
        const r = pressureBalance(networkFrom(t));
        for (const v of numbers(r)) expect(Number.isFinite(v)).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it("lowers a hot residual when its pipe gets longer, and leaves cold outlets alone", () => {
    fc.assert(
      fc.property(treeArb, fc.double({ min: 1.1, max: 3, noNaN: true }), (t, factor) => {
        const net = networkFrom(t);
        const hotSeg = net.segments.find((s) => s.service === "hot" && s.fromNodeId === "n1");
        fc.pre(hotSeg !== undefined);
        const longer: BalanceNetwork = {
          ...net,
          segments: net.segments.map((s) => (s === hotSeg ? { ...s, lengthM: s.lengthM * factor, riseM: s.riseM } : s)),
        };
        const a = pressureBalance(net, { suggest: false });
        const b = pressureBalance(longer, { suggest: false });
        const target = a.nodes.find((n) => n.nodeId === hotSeg!.toNodeId)!;
        const after = b.nodes.find((n) => n.nodeId === hotSeg!.toNodeId)!;
        if (target.flowLps > 1e-6) expect(after.pressureKpa).toBeLessThan(target.pressureKpa);
        for (const seg of net.segments.filter((s) => s.service === "cold")) {
          expect(b.nodes.find((n) => n.nodeId === seg.toNodeId)!.pressureKpa).toBe(a.nodes.find((n) => n.nodeId === seg.toNodeId)!.pressureKpa);
        }
      }),
      { numRuns: 40 },
    );
  });

  it("handles a deep chain without recursion limits", () => {
    const n = 20_000;
    const segments: NetworkSegmentInput[] = Array.from({ length: n }, (_, i) => ({
      id: `c${i}`,
      fromNodeId: `n${i}`,
      toNodeId: `n${i + 1}`,
      service: "cold" as const,
      lengthM: 0.01,
      pipeId: "cu-c0-54",
    }));
    const r = pressureBalance({ supply: { nodeId: "n0", staticPressureKpa: 400 }, segments, outlets: [{ id: "end", nodeId: `n${n}`, flowLps: 0.1 }], mixingPoints: [] });
    expect(r.nodes.at(-1)!.distanceM).toBeCloseTo(200, 6);
    expect(r.nodes.at(-1)!.pressureKpa).toBeLessThan(400);
  });
});

describe("pressureBalance: edge cases", () => {
  it("fails a mixing point with no residual pressure left", () => {
    const r = pressureBalance(showerNetwork({ hotLengthM: 200, staticKpa: 150, prvKpa: 150 }));
    expect(r.mixingPoints[0].hotResidualKpa).toBeLessThan(0);
    expect(r.findings.find((f) => f.code === "no-residual-pressure")).toMatchObject({ severity: "fail", elementId: "shower" });
    expect(Number.isFinite(r.mixingPoints[0].differencePercent)).toBe(true);
  });

  it("fails any other outlet left without pressure", () => {
    const net = showerNetwork({ staticKpa: 150, prvKpa: 150 });
    net.segments.push({ id: "e-far", fromNodeId: "T", toNodeId: "F", service: "cold", lengthM: 100, riseM: 12, pipeId: "cu-c0-15" });
    net.outlets.push({ id: "far-tap", nodeId: "F", flowLps: 0.2 });
    const r = pressureBalance(net);
    expect(r.findings.find((f) => f.code === "outlet-no-pressure")).toMatchObject({ severity: "fail", elementId: "far-tap" });
    expect(r.ok).toBe(false);
  });

  it("notes a PRV that receives less than its setting at design flow", () => {
    const net = showerNetwork();
    net.prvs = [{ id: "local", nodeId: "SC", settingKpa: 399 }];
    const r = pressureBalance(net);
    expect(r.findings.find((f) => f.code === "prv-not-regulating")).toMatchObject({ severity: "info", elementId: "local" });
  });

  it("explains when a failing segment has no catalogue pipe to upsize", () => {
    const net = showerNetwork({ hotLengthM: 30 });
    net.outlets[0].flowLps = 0.3;
    net.segments[2] = { ...net.segments[2], pipeId: undefined, internalDiameterMm: 14, roughnessMm: 0.0015 };
    const r = pressureBalance(net);
    expect(r.mixingPoints[0].ok).toBe(false);
    expect(r.suggestion!.changes.every((c) => c.segmentId !== "c-hot")).toBe(true);
    expect(r.suggestion!.notes.join(" ")).toMatch(/"c-hot" lie on failing paths but have no catalogue pipe/);
  });

  it("rejects nonsensical limits", () => {
    expect(() => pressureBalance(showerNetwork(), { balanceLimitPercent: 0 })).toThrow(RangeError);
    expect(() => pressureBalance(showerNetwork(), { maxVelocityMs: -1 })).toThrow(RangeError);
  });
});
