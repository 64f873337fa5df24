import { describe, expect, it } from "vitest";
import { pressureBalance } from "~/engineering";
import { EXAMPLES } from "./examples";
import { runCalculation, type BalanceInput } from "./kinds";
import { demandBasis, networkReducer, nodeIds } from "./network-state";

const example = (): BalanceInput => structuredClone(EXAMPLES.balance);
const failing = () => {
  const input = example();
  const hot = input.network.segments.find((s) => s.id === "hot-run")!;
  Object.assign(hot, { pipeId: "cu-c0-15", lengthM: 40 });
  return input;
};
const solve = (input: BalanceInput) => pressureBalance(input.network, input.options);

describe("balance editor state", () => {
  it("starts from an example that passes, with one heater, a shower mixer and a basin", () => {
    const r = solve(example());
    expect(r.ok).toBe(true);
    expect(r.mixingPoints).toHaveLength(1);
    expect(example().network.outlets.map((o) => o.id)).toEqual(expect.arrayContaining(["basin-hot", "basin-cold"]));
  });

  it("applies the suggested pipe changes, after which the mixing point passes", () => {
    const input = failing();
    const before = solve(input);
    expect(before.mixingPoints[0].ok).toBe(false);
    const next = networkReducer(input, { type: "applyPipeChanges", changes: before.suggestion!.changes });
    const after = solve(next);
    expect(after.mixingPoints[0].ok).toBe(true);
    // The prediction the engine made is what the edited network gives.
    expect(after.mixingPoints[0].differencePercent).toBeCloseTo(before.suggestion!.after[0].differencePercent, 6);
    expect(input.network.segments.find((s) => s.id === "hot-run")!.pipeId).toBe("cu-c0-15"); // untouched
  });

  it("applies a balancing PRV at the node the engine names; the mixing point then passes", () => {
    const input = failing();
    const prv = solve(input).suggestion!.balancingPrv!;
    expect(prv).toBeDefined();
    const next = networkReducer(input, { type: "applyBalancingPrv", prv });
    expect(next.network.prvs).toEqual([{ id: "balancing-prv-1", nodeId: prv.nodeId, settingKpa: Math.floor(prv.settingKpa) }]);
    expect(solve(next).mixingPoints[0].ok).toBe(true);
    // Applying again updates the same PRV instead of adding a second at one node.
    expect(networkReducer(next, { type: "applyBalancingPrv", prv }).network.prvs).toHaveLength(1);
  });

  it("adds rows with fresh ids and removes them", () => {
    let s = networkReducer(example(), { type: "add", list: "segments" });
    expect(s.network.segments.at(-1)).toMatchObject({ id: "seg-9", fromNodeId: "basin-h", service: "hot" });
    s = networkReducer(s, { type: "add", list: "outlets" });
    expect(s.network.outlets.at(-1)!.id).toBe("outlet-5");
    s = networkReducer(s, { type: "remove", list: "segments", index: 8 });
    expect(s.network.segments).toHaveLength(8);
    s = networkReducer(s, { type: "add", list: "prvs" });
    expect(s.network.prvs).toHaveLength(1);
  });

  it("sets one fitting count and keeps the others", () => {
    const s = networkReducer(example(), { type: "fitting", index: 2, fittingId: "elbow-90", count: 3 });
    expect(s.network.segments[2].fittings).toEqual([{ fittingId: "tee-branch", count: 1 }, { fittingId: "elbow-90", count: 3 }]);
    const cleared = networkReducer(s, { type: "fitting", index: 2, fittingId: "tee-branch", count: undefined });
    expect(cleared.network.segments[2].fittings).toEqual([{ fittingId: "elbow-90", count: 3 }]);
  });

  it("switches a segment between a catalogue pipe and a stated bore", () => {
    const bore = networkReducer(example(), { type: "pipe", index: 3, pipeId: "bore" });
    expect(bore.network.segments[3].pipeId).toBeUndefined();
    expect(bore.network.segments[3].internalDiameterMm).toBeCloseTo(14);
    expect(runCalculation("balance", bore).ok).toBe(true);
    const back = networkReducer(bore, { type: "pipe", index: 3, pipeId: "cu-c0-22" });
    expect(back.network.segments[3]).toMatchObject({ pipeId: "cu-c0-22" });
    expect(back.network.segments[3].internalDiameterMm).toBeUndefined();
  });

  it("changes how an outlet states its demand", () => {
    const s = networkReducer(example(), { type: "demand", index: 0, basis: "flowLps" });
    expect(s.network.outlets[0]).toMatchObject({ id: "shower-hot", flowLps: 0.1 });
    expect(s.network.outlets[0].fixture).toBeUndefined();
    expect(demandBasis(s.network.outlets[0])).toBe("flowLps");
  });

  it("edits a field by path without touching the original, and lists the nodes", () => {
    const input = example();
    const s = networkReducer(input, { type: "set", path: ["network", "supply", "staticPressureKpa"], value: 450 });
    expect(s.network.supply.staticPressureKpa).toBe(450);
    expect(input.network.supply.staticPressureKpa).toBe(500);
    expect(nodeIds(input)).toEqual(expect.arrayContaining(["supply", "split", "heater", "shower-h", "basin-c"]));
  });
});
