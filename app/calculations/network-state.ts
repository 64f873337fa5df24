// Owns the balance editor's state changes: the network as plain input JSON, edited row by row, and the engine's
// suggestions applied to it in one step (pipe changes, or a balancing PRV on the cold feed). Pure, so the
// browser editor and its tests share it.
import {
  findPipe,
  internalDiameterMm,
  pipeCatalogue,
  type BalancingPrvSuggestion,
  type FixtureType,
  type NetworkOutletInput,
  type NetworkSegmentInput,
  type PipeChange,
} from "~/engineering";
import type { BalanceInput } from "./kinds";
import { setIn } from "./paths";
import type { IssuePath } from "./issues";

/** Fittings with their own column in the editor; any others on a segment are kept as they are. */
export const FITTING_COLUMNS = [
  { id: "elbow-90", label: "Elbows" },
  { id: "tee-through", label: "Tees (run)" },
  { id: "tee-branch", label: "Tees (branch)" },
] as const;

export type DemandBasis = "fixture" | "loadingUnits" | "flowLps";

export type NetworkAction =
  | { type: "set"; path: IssuePath; value: unknown }
  | { type: "add"; list: "segments" | "outlets" | "mixingPoints" | "prvs" }
  | { type: "remove"; list: "segments" | "outlets" | "mixingPoints" | "prvs"; index: number }
  | { type: "fitting"; index: number; fittingId: string; count: number | undefined }
  | { type: "pipe"; index: number; pipeId: string | "bore" }
  | { type: "demand"; index: number; basis: DemandBasis }
  | { type: "applyPipeChanges"; changes: PipeChange[] }
  | { type: "applyBalancingPrv"; prv: BalancingPrvSuggestion; sameRating?: boolean }
  | { type: "replace"; input: BalanceInput };

function nextId(prefix: string, taken: { id?: string }[]): string {
  const ids = new Set(taken.map((t) => t.id));
  for (let n = taken.length + 1; ; n++) if (!ids.has(`${prefix}-${n}`)) return `${prefix}-${n}`;
}

function newRow(input: BalanceInput, list: "segments" | "outlets" | "mixingPoints" | "prvs") {
  const net = input.network;
  if (list === "segments") {
    const last = net.segments[net.segments.length - 1];
    return { id: nextId("seg", net.segments), fromNodeId: last?.toNodeId ?? net.supply.nodeId, toNodeId: "", service: last?.service ?? "cold", lengthM: 1, pipeId: "cu-c0-15" };
  }
  if (list === "outlets") {
    return { id: nextId("outlet", net.outlets), nodeId: net.segments[net.segments.length - 1]?.toNodeId ?? "", fixture: "washbasin" as FixtureType };
  }
  if (list === "mixingPoints") return { id: nextId("mix", net.mixingPoints), hotOutletId: "", coldOutletId: "" };
  return { id: nextId("prv", net.prvs ?? []), nodeId: "", settingKpa: Math.min(300, net.supply.staticPressureKpa || 300) };
}

function updateSegment(input: BalanceInput, index: number, change: (s: NetworkSegmentInput) => NetworkSegmentInput): BalanceInput {
  const segments = input.network.segments.map((s, i) => (i === index ? change(s) : s));
  return { ...input, network: { ...input.network, segments } };
}

export function networkReducer(input: BalanceInput, action: NetworkAction): BalanceInput {
  switch (action.type) {
    case "set":
      return setIn(input, action.path, action.value);
    case "add": {
      const rows = [...((input.network[action.list] as object[] | undefined) ?? []), newRow(input, action.list)];
      return { ...input, network: { ...input.network, [action.list]: rows } };
    }
    case "remove": {
      const rows = ((input.network[action.list] as object[] | undefined) ?? []).filter((_, i) => i !== action.index);
      return { ...input, network: { ...input.network, [action.list]: rows } };
    }
    case "fitting":
      return updateSegment(input, action.index, (s) => {
        const others = (s.fittings ?? []).filter((f) => f.fittingId !== action.fittingId);
        const fittings = action.count === undefined || action.count === 0 ? others : [...others, { fittingId: action.fittingId, count: action.count }];
        const { fittings: _old, ...rest } = s;
        return fittings.length ? { ...rest, fittings } : rest;
      });
    case "pipe":
      return updateSegment(input, action.index, (s) => {
        const { pipeId, internalDiameterMm: bore, ...rest } = s;
        if (action.pipeId === "bore") {
          const pipe = pipeId ? findPipe(pipeCatalogue, pipeId) : undefined;
          return { ...rest, internalDiameterMm: bore ?? (pipe ? internalDiameterMm(pipe) : 13.6) };
        }
        return { ...rest, pipeId: action.pipeId };
      });
    case "demand": {
      const outlets = input.network.outlets.map((o, i): NetworkOutletInput => {
        if (i !== action.index) return o;
        const { flowLps, loadingUnits, fixture, ...rest } = o;
        if (action.basis === "fixture") return { ...rest, fixture: fixture ?? "washbasin" };
        if (action.basis === "loadingUnits") return { ...rest, loadingUnits: loadingUnits ?? 1 };
        return { ...rest, flowLps: flowLps ?? 0.1 };
      });
      return { ...input, network: { ...input.network, outlets } };
    }
    case "applyPipeChanges": {
      const bySegment = new Map(action.changes.map((c) => [c.segmentId, c.toPipeId]));
      const segments = input.network.segments.map((s) => (bySegment.has(s.id) ? { ...s, pipeId: bySegment.get(s.id)! } : s));
      return { ...input, network: { ...input.network, segments } };
    }
    case "applyBalancingPrv": {
      const { nodeId } = action.prv;
      const raw = action.sameRating && action.prv.sameRating ? action.prv.sameRating.settingKpa : action.prv.settingKpa;
      // Whole kPa, rounded down so the cold side is never left higher than the prediction.
      const settingKpa = Math.max(1, Math.floor(raw));
      const prvs = [...(input.network.prvs ?? [])];
      const at = prvs.findIndex((p) => p.nodeId === nodeId);
      if (at >= 0) prvs[at] = { ...prvs[at], settingKpa };
      else prvs.push({ id: nextId("balancing-prv", prvs), nodeId, settingKpa });
      return { ...input, network: { ...input.network, prvs } };
    }
    case "replace":
      return action.input;
  }
}

/** Every node named anywhere in the network, for the node pickers. */
export function nodeIds(input: BalanceInput): string[] {
  const net = input.network;
  const ids = new Set<string>([net.supply.nodeId]);
  for (const s of net.segments) ids.add(s.fromNodeId).add(s.toNodeId);
  return [...ids].filter(Boolean);
}

export function demandBasis(o: NetworkOutletInput): DemandBasis {
  return o.flowLps !== undefined ? "flowLps" : o.loadingUnits !== undefined ? "loadingUnits" : "fixture";
}
