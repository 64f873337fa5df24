// Owns synthetic networks for the balance benchmark and the solver's tests: a supply with a PRV, a heater, and
// hot and cold trees branching eight ways down to showers, sized by how many draw-offs each pipe serves. Not
// part of the engine's public API.

import type { BalanceNetwork, NetworkSegmentInput, NetworkOutletInput, MixingPointInput } from "../network";

/** Small deterministic generator so generated networks are the same on every run. */
function lcg(seed: number): () => number {
  let s = seed >>> 0 || 1;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

function copperFor(drawOffs: number): string {
  if (drawOffs <= 2) return "cu-c0-15";
  if (drawOffs <= 8) return "cu-c0-22";
  if (drawOffs <= 32) return "cu-c0-28";
  if (drawOffs <= 128) return "cu-c0-35";
  if (drawOffs <= 512) return "cu-c0-42";
  return "cu-c0-54";
}

/** A network with the given number of mixing points (twice as many outlets). */
export function syntheticNetwork(mixingPointCount: number, seed = 1): BalanceNetwork {
  const random = lcg(seed);
  const segments: NetworkSegmentInput[] = [];
  const outlets: NetworkOutletInput[] = [];
  const mixingPoints: MixingPointInput[] = [];
  const length = (lo: number, hi: number) => Math.round((lo + random() * (hi - lo)) * 10) / 10;

  segments.push({ id: "main", fromNodeId: "S", toNodeId: "M", service: "cold", lengthM: 8, pipeId: "cu-c0-54" });
  segments.push({
    id: "heater-feed",
    fromNodeId: "M",
    toNodeId: "H",
    service: "cold",
    lengthM: 6,
    riseM: 2.5,
    pipeId: copperFor(mixingPointCount),
    fittings: [{ fittingId: "elbow-90", count: 3 }],
  });

  const build = (service: "hot" | "cold", parent: string, indices: number[], path: string): void => {
    if (indices.length === 1) {
      const i = indices[0];
      const outletId = `${service}-${i}`;
      const node = `${service}-o${i}`;
      segments.push({
        id: `${service}-leg-${i}`,
        fromNodeId: parent,
        toNodeId: node,
        service,
        lengthM: length(1, service === "hot" ? 6 : 3),
        pipeId: "cu-c0-15",
        fittings: [{ fittingId: "elbow-90", count: 2 }],
      });
      outlets.push({ id: outletId, nodeId: node, fixture: "shower" });
      return;
    }
    const chunk = Math.ceil(indices.length / 8);
    for (let c = 0; c * chunk < indices.length; c++) {
      const part = indices.slice(c * chunk, (c + 1) * chunk);
      const node = `${service}-n${path}.${c}`;
      segments.push({
        id: `${service}-br${path}.${c}`,
        fromNodeId: parent,
        toNodeId: node,
        service,
        lengthM: length(2, 10),
        riseM: c % 3 === 0 ? 1 : 0,
        pipeId: copperFor(part.length),
        fittings: [{ fittingId: "tee-branch", count: 1 }],
      });
      build(service, node, part, `${path}.${c}`);
    }
  };
  const all = Array.from({ length: mixingPointCount }, (_, i) => i);
  build("cold", "M", all, "");
  build("hot", "H", all, "");
  for (const i of all) mixingPoints.push({ id: `mix-${i}`, hotOutletId: `hot-${i}`, coldOutletId: `cold-${i}` });

  return {
    supply: { nodeId: "S", staticPressureKpa: 550, prv: { nodeId: "M", settingKpa: 400 } },
    heater: { nodeId: "H", pressureLossKpa: 8, ratedFlowLps: 0.5 },
    segments,
    outlets,
    mixingPoints,
  };
}
