import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { pressureBalance, type BalanceOptions } from "./balance";
import { syntheticNetwork } from "./bench/networks";
import { designFlowLpsFromLoadingUnits, FIXTURE_DEMAND } from "./demand";
import { fittingsK } from "./fittings";
import { segmentLoss } from "./losses";
import { DEFAULT_COLD_TEMP_C, DEFAULT_HOT_TEMP_C, type NetworkSegmentInput } from "./network";
import { findPipe, internalDiameterMm, pipeCatalogue } from "./pipes";

// A network of 2,000 outlets (1,000 showers, hot and cold, 5,138 segments), solved by the engine and checked
// two ways: against a plain path-by-path computation from the input, and against fingerprints of the whole
// result taken from the solver as it stood before its model building was reworked for speed.
const network = syntheticNetwork(1000);

// A generous ceiling for a loaded machine, not a time check.
describe("pressureBalance on a 2,000-outlet network", { timeout: 30_000 }, () => {
  it("matches a straightforward computation from the input, node by node", () => {
    const r = pressureBalance(network, { suggest: false });
    const heater = network.heater!;
    const prv = network.supply.prv!;
    const below = new Map<string, NetworkSegmentInput[]>();
    for (const s of network.segments) {
      if (!below.has(s.fromNodeId)) below.set(s.fromNodeId, []);
      below.get(s.fromNodeId)!.push(s);
    }
    const unitsAt = new Map(network.outlets.map((o) => [o.nodeId, FIXTURE_DEMAND[o.fixture!].loadingUnits]));

    // Loading units below each node (their total and the largest single draw-off), by plain recursion.
    const units = new Map<string, { total: number; largest: number }>();
    const unitsBelow = (node: string): { total: number; largest: number } => {
      let total = unitsAt.get(node) ?? 0;
      let largest = total;
      for (const s of below.get(node) ?? []) {
        const u = unitsBelow(s.toNodeId);
        total += u.total;
        largest = Math.max(largest, u.largest);
      }
      units.set(node, { total, largest });
      return { total, largest };
    };
    unitsBelow(network.supply.nodeId);
    const flowAt = (node: string) => designFlowLpsFromLoadingUnits(units.get(node)!.total, units.get(node)!.largest);
    const heaterLossKpa = heater.pressureLossKpa * (flowAt(heater.nodeId) / heater.ratedFlowLps!) ** 2;

    // Pressure at each node from the supply out: less each segment's loss, the heater's after the heater, held
    // at the PRV setting below the PRV.
    const pressure = new Map<string, number>([[network.supply.nodeId, network.supply.staticPressureKpa]]);
    const walk = (node: string) => {
      for (const s of below.get(node) ?? []) {
        const pipe = findPipe(pipeCatalogue, s.pipeId!)!;
        const loss = segmentLoss({
          flowLps: flowAt(s.toNodeId),
          internalDiameterMm: internalDiameterMm(pipe),
          lengthM: s.lengthM,
          roughnessMm: pipe.roughnessMm,
          tempC: s.service === "hot" ? DEFAULT_HOT_TEMP_C : DEFAULT_COLD_TEMP_C,
          kTotal: fittingsK(s.fittings ?? []),
          riseM: s.riseM ?? 0,
        }).totalLossKpa;
        const arriving = pressure.get(node)! - (node === heater.nodeId ? heaterLossKpa : 0) - loss;
        pressure.set(s.toNodeId, s.toNodeId === prv.nodeId ? Math.min(arriving, prv.settingKpa) : arriving);
        walk(s.toNodeId);
      }
    };
    walk(network.supply.nodeId);

    expect(r.nodes).toHaveLength(network.segments.length + 1);
    for (const node of r.nodes) {
      expect(node.pressureKpa).toBeCloseTo(pressure.get(node.nodeId)!, 9);
      expect(node.flowLps).toBeCloseTo(flowAt(node.nodeId), 12);
    }
    const outletNode = new Map(network.outlets.map((o) => [o.id, o.nodeId]));
    expect(r.mixingPoints).toHaveLength(network.mixingPoints.length);
    for (const [i, mp] of r.mixingPoints.entries()) {
      const input = network.mixingPoints[i];
      expect(mp.id).toBe(input.id);
      expect(mp.hotResidualKpa).toBeCloseTo(pressure.get(outletNode.get(input.hotOutletId)!)!, 9);
      expect(mp.coldResidualKpa).toBeCloseTo(pressure.get(outletNode.get(input.coldOutletId)!)!, 9);
      expect(mp.hotProfile.at(-1)!.pressureKpa).toBe(mp.hotResidualKpa);
    }
  });

  // SHA-256 of JSON.stringify(result): every figure, finding, profile and suggested change, bit for bit.
  const fingerprints: [string, BalanceOptions, string][] = [
    ["with suggestions and profiles", {}, "290974c0dff60053159b5c52f2d0e1f00fae8b082e17889ec841d19ee2123644"],
    ["by equivalent length", { suggest: false, fittingMethod: "equivalentLength" }, "7a23bf944c869de9c3be54de2249ba0291abc30734ae1a82c9dec5266d6af036"],
    ["without profiles", { suggest: false, includeProfiles: false }, "00870a28096b8b9924d55f44312821e7c29a64042081404fc05537abf2aba50f"],
  ];
  it.each(fingerprints)("gives exactly the results it always gave, %s", (_, options, expected) => {
    const json = JSON.stringify(pressureBalance(network, options));
    expect(createHash("sha256").update(json).digest("hex")).toBe(expected);
  });
});
