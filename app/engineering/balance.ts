// Owns the pressure-balance solve: design flow in every segment, residual dynamic pressure at every node, the
// hot/cold difference at each mixing point, static-pressure and velocity checks, and suggested changes.
//
// Cost is linear in the network: flows by one post-order pass (outlet demand summed towards the supply), then
// pressures by one pre-order pass (supply pressure less each segment's loss, heater loss at the heater node,
// PRVs holding their node at or below their setting). A PRV is modelled as ideal: it passes lower pressures
// unchanged and holds its setting under flow; a real valve falls off with flow, so add its body loss as a
// fitting ("prv-typical") or as kTotal from the maker's curve.
//
// Memory stays near the size of the result itself (losses in typed arrays, profile points shared, ids numbered
// in typed-array tables by network.ts): past a few thousand outlets the garbage collector, not the arithmetic,
// is what a wasteful solve pays for, and it pays more than linearly.
//
// Difference at a mixing point: |Ph − Pc| / max(Ph, Pc) × 100, the gap as a share of the higher residual
// pressure. Where neither side has any residual pressure left the difference is reported as 100 %.

import { CAUTION } from "./caution";
import { designFlowLpsFromLoadingUnits, DESIGN_FLOW_METHOD } from "./demand";
import { finding, type Finding } from "./findings";
import { segmentLossUnchecked, type SegmentLoss } from "./losses";
import {
  buildNetworkModel,
  defaultRoughnessMm,
  type BalanceNetwork,
  type FittingMethod,
  type ModelOutlet,
  type ModelSegment,
  type NetworkModel,
} from "./network";
import { DEFAULT_LIMITS } from "./limits";
import { internalDiameterMm, nextLargerPipe, seriesSizes, type PipeSpec } from "./pipes";
import type { FittingType } from "./fittings";
import { STANDARD_GRAVITY_MS2, waterProperties } from "./water";

export const BALANCE_DIFFERENCE_DEFINITION =
  "|Ph − Pc| / max(Ph, Pc) × 100: the hot/cold residual pressure gap as a share of the higher of the two";

export interface BalanceOptions {
  /** Default 20 % (common practice). */
  balanceLimitPercent?: number;
  /** Default 2.0 m/s (EN 806-3:2006 §4.4 for mains, risers and floor pipes). */
  maxVelocityMs?: number;
  /** Default 600 kPa (common practice). */
  maxStaticPressureKpa?: number;
  fittingMethod?: FittingMethod;
  pipeCatalogue?: readonly PipeSpec[];
  fittingCatalogue?: readonly FittingType[];
  /** Work out suggested changes when something fails. Default true. */
  suggest?: boolean;
  /** Upper bound on single-size steps the suggestion search takes. Default 200. */
  maxSuggestionSteps?: number;
  /** Include the pressure profile along each hot and cold path. Default true. */
  includeProfiles?: boolean;
}

export interface ProfilePoint {
  nodeId: string;
  distanceM: number;
  pressureKpa: number;
  note?: string;
}

export interface MixingPointResult {
  id: string;
  hotOutletId: string;
  coldOutletId: string;
  hotResidualKpa: number;
  coldResidualKpa: number;
  differencePercent: number;
  limitPercent: number;
  ok: boolean;
  /** The side with the lower residual pressure (the one to improve). */
  lowerSide: "hot" | "cold" | "equal";
  /** Points are shared by every profile that passes the same node: read them, do not change them. */
  hotProfile: ProfilePoint[];
  coldProfile: ProfilePoint[];
}

export interface SegmentResult {
  id: string;
  service: "hot" | "cold";
  pipeId: string | undefined;
  internalDiameterMm: number;
  roughnessMm: number;
  tempC: number;
  flowLps: number;
  velocityMs: number;
  reynolds: number;
  frictionFactor: number;
  frictionLossKpa: number;
  fittingLossKpa: number;
  staticLossKpa: number;
  totalLossKpa: number;
  inletPressureKpa: number;
  outletPressureKpa: number;
}

export interface NodeResult {
  nodeId: string;
  parentNodeId: string | null;
  viaSegmentId: string | null;
  distanceM: number;
  flowLps: number;
  /** Residual pressure while the design flows are drawn (downstream of any PRV at the node). */
  pressureKpa: number;
  /** Pressure with nothing flowing. */
  staticPressureKpa: number;
  prvSettingKpa?: number;
  heaterOutletPressureKpa?: number;
}

export interface PipeChange {
  segmentId: string;
  reason: "velocity" | "balance";
  fromPipeId: string;
  toPipeId: string;
  fromInternalDiameterMm: number;
  toInternalDiameterMm: number;
  velocityBeforeMs: number;
  velocityAfterMs: number;
  lossBeforeKpa: number;
  lossAfterKpa: number;
}

export interface MixingPointOutcome {
  id: string;
  hotResidualKpa: number;
  coldResidualKpa: number;
  differencePercent: number;
  ok: boolean;
}

export interface BalancingPrvSuggestion {
  mixingPointId: string;
  /** Fit the PRV here: the highest node on the cold feed that serves this mixing point alone. */
  nodeId: string;
  /** Setting that brings the cold residual pressure down to the hot one. */
  settingKpa: number;
  predicted: MixingPointOutcome;
  /** The accepted trade fix is a PRV of the same rating as the one regulating the hot side. */
  sameRating?: { hotSidePrvNodeId: string; settingKpa: number; predicted: MixingPointOutcome };
}

export interface BalanceSuggestion {
  method: string;
  /** True when the changes bring every mixing point within the limit and every velocity within its limit. */
  resolved: boolean;
  changes: PipeChange[];
  after: MixingPointOutcome[];
  balancingPrv?: BalancingPrvSuggestion;
  notes: string[];
}

export interface BalanceResult {
  ok: boolean;
  definition: string;
  limitPercent: number;
  maxVelocityMs: number;
  maxStaticPressureKpa: number;
  designFlowMethod: { method: string; source: string }[];
  mixingPoints: MixingPointResult[];
  segments: SegmentResult[];
  nodes: NodeResult[];
  maxStaticPressure: { nodeId: string; pressureKpa: number };
  findings: Finding[];
  suggestion: BalanceSuggestion | null;
  caution: string;
}

const SUGGESTION_METHOD =
  "Greedy search, not guaranteed minimal: first every segment above the velocity limit goes to the smallest size " +
  "in its series that meets it; then, one size step at a time, the segment on a failing mixing point's " +
  "lower-pressure path whose upsizing most reduces the total excess over the limit is upsized (ties: the larger " +
  "loss reduction, then segment id); finally each change is stepped back where the result still holds.";

interface Sizing {
  pipe: (PipeSpec | undefined)[];
  boreMm: Float64Array;
}

/** Each segment's loss as one typed array per quantity: no object per segment lives through the solve. */
interface LossTable {
  velocityMs: Float64Array;
  reynolds: Float64Array;
  frictionFactor: Float64Array;
  frictionLossKpa: Float64Array;
  fittingLossKpa: Float64Array;
  staticLossKpa: Float64Array;
  totalLossKpa: Float64Array;
}

interface Solved {
  flowLps: Float64Array; // per segment
  nodeFlowLps: Float64Array;
  heaterLossKpa: number;
  losses: LossTable;
  /** The same array as losses.totalLossKpa. */
  lossKpa: Float64Array;
  pressureKpa: Float64Array; // per node, after any PRV
}

function roughnessOf(seg: ModelSegment, pipe: PipeSpec | undefined): number {
  return seg.roughnessOverrideMm ?? pipe?.roughnessMm ?? defaultRoughnessMm(seg);
}

function lossFor(seg: ModelSegment, pipe: PipeSpec | undefined, boreMm: number, flowLps: number, into?: SegmentLoss): SegmentLoss {
  const frictionLengthM = seg.lengthM + seg.extraLengthM + seg.lengthOverDiameterTotal * (boreMm / 1000);
  return segmentLossUnchecked(flowLps, boreMm, frictionLengthM, roughnessOf(seg, pipe), seg.tempC, seg.fixedK, seg.riseM, into);
}

/** Post-order pass: each segment carries the design flow of everything downstream of it. */
function computeFlows(model: NetworkModel): { flowLps: Float64Array; nodeFlowLps: Float64Array } {
  const n = model.nodeIds.length;
  const stated = new Float64Array(n);
  const luSum = new Float64Array(n);
  const luMax = new Float64Array(n);
  // Sum in a fixed order where several outlets share a node, so results never depend on input order.
  const perNode = new Int32Array(n);
  for (const o of model.outlets) perNode[o.node]++;
  const shared: ModelOutlet[] = [];
  for (const o of model.outlets) {
    if (perNode[o.node] > 1) {
      shared.push(o);
      continue;
    }
    stated[o.node] += o.statedFlowLps;
    luSum[o.node] += o.loadingUnits;
    if (o.loadingUnits > luMax[o.node]) luMax[o.node] = o.loadingUnits;
  }
  shared.sort(byIdAscending);
  for (const o of shared) {
    stated[o.node] += o.statedFlowLps;
    luSum[o.node] += o.loadingUnits;
    if (o.loadingUnits > luMax[o.node]) luMax[o.node] = o.loadingUnits;
  }
  const { order, parentNode } = model;
  for (let k = n - 1; k > 0; k--) {
    const v = order[k];
    const p = parentNode[v];
    stated[p] += stated[v];
    luSum[p] += luSum[v];
    if (luMax[v] > luMax[p]) luMax[p] = luMax[v];
  }
  const nodeFlowLps = new Float64Array(n);
  for (let v = 0; v < n; v++) nodeFlowLps[v] = stated[v] + designFlowLpsFromLoadingUnits(luSum[v], luMax[v]);
  const flowLps = new Float64Array(model.segments.length);
  for (let k = 0; k < flowLps.length; k++) flowLps[k] = nodeFlowLps[model.segments[k].to];
  return { flowLps, nodeFlowLps };
}

function heaterLoss(model: NetworkModel, nodeFlowLps: Float64Array): number {
  if (model.heaterNode === -1) return 0;
  const q = nodeFlowLps[model.heaterNode];
  if (q <= 0) return 0;
  const rated = model.heaterRatedFlowLps;
  return rated === undefined ? model.heaterLossKpa : model.heaterLossKpa * (q / rated) ** 2;
}

/** Pre-order pass over order[from, to): pressure at each node from its parent's. */
function propagate(
  model: NetworkModel,
  lossKpa: Float64Array,
  heaterLossKpa: number,
  pressure: Float64Array,
  from: number,
  to: number,
  prvOverride?: { node: number; settingKpa: number },
): void {
  const { order, parentNode, parentSeg, prvSettingKpa, heaterNode } = model;
  for (let k = from; k < to; k++) {
    const v = order[k];
    const p = parentNode[v];
    let value = p === -1 ? model.supplyDynamicKpa : pressure[p] - (p === heaterNode ? heaterLossKpa : 0) - lossKpa[parentSeg[v]];
    const setting = prvOverride && prvOverride.node === v ? prvOverride.settingKpa : prvSettingKpa[v];
    if (value > setting) value = setting;
    pressure[v] = value;
  }
}

function solve(model: NetworkModel, sizing: Sizing, flows: { flowLps: Float64Array; nodeFlowLps: Float64Array }): Solved {
  // Plain loops: typed-array `from` with a mapping function goes through the iterator protocol and is slow.
  const count = model.segments.length;
  const losses: LossTable = {
    velocityMs: new Float64Array(count),
    reynolds: new Float64Array(count),
    frictionFactor: new Float64Array(count),
    frictionLossKpa: new Float64Array(count),
    fittingLossKpa: new Float64Array(count),
    staticLossKpa: new Float64Array(count),
    totalLossKpa: new Float64Array(count),
  };
  // One record, overwritten segment after segment and copied out at once.
  let l: SegmentLoss | undefined;
  for (let k = 0; k < count; k++) {
    l = lossFor(model.segments[k], sizing.pipe[k], sizing.boreMm[k], flows.flowLps[k], l);
    losses.velocityMs[k] = l.velocityMs;
    losses.reynolds[k] = l.reynolds;
    losses.frictionFactor[k] = l.frictionFactor;
    losses.frictionLossKpa[k] = l.frictionLossKpa;
    losses.fittingLossKpa[k] = l.fittingLossKpa;
    losses.staticLossKpa[k] = l.staticLossKpa;
    losses.totalLossKpa[k] = l.totalLossKpa;
  }
  const lossKpa = losses.totalLossKpa;
  const hl = heaterLoss(model, flows.nodeFlowLps);
  const pressureKpa = new Float64Array(model.nodeIds.length);
  propagate(model, lossKpa, hl, pressureKpa, 0, model.order.length);
  return { ...flows, heaterLossKpa: hl, losses, lossKpa, pressureKpa };
}

function outcome(hot: number, cold: number, limit: number): { differencePercent: number; ok: boolean; penalty: number } {
  const high = Math.max(hot, cold);
  const low = Math.min(hot, cold);
  const differencePercent = high <= 0 ? 100 : (Math.abs(hot - cold) / high) * 100;
  const ok = low > 0 && differencePercent <= limit + 1e-9;
  // Lost residual pressure outranks any imbalance: it must be restored first.
  const penalty = low <= 0 ? 1000 - low : Math.max(0, differencePercent - limit);
  return { differencePercent, ok, penalty };
}

// What runs once per element lives at module level rather than as closures inside pressureBalance: a closure
// made afresh on every call keeps its optimised code only while one of its instances lives, so after each full
// garbage collection a large network would be solved by unoptimised code again until recompiled.

const byIdAscending = (a: { id: string }, b: { id: string }) => (a.id < b.id ? -1 : 1);

interface Profiles {
  model: NetworkModel;
  solved: Solved;
  distanceM: Float64Array;
  /** A node's point reads the same in every profile that passes it, so each is made once and shared (read-only). */
  pointAt: ProfilePoint[];
  heaterPoints?: [ProfilePoint, ProfilePoint];
}

/** The pressure along the path from the supply to an outlet: one array per outlet, its points shared. */
function pressureProfile(profiles: Profiles, outletNode: number): ProfilePoint[] {
  const { model, solved, distanceM, pointAt } = profiles;
  const { parentNode, heaterNode, nodeIds } = model;
  let length = 0;
  for (let v = outletNode; v !== -1; v = parentNode[v]) length += v === heaterNode ? 2 : 1;
  const points: ProfilePoint[] = new Array(length);
  // Filled from the outlet back, so the profile reads from the supply out.
  let i = length;
  for (let v = outletNode; v !== -1; v = parentNode[v]) {
    if (v === heaterNode) {
      profiles.heaterPoints ??= [
        { nodeId: nodeIds[v], distanceM: distanceM[v], pressureKpa: solved.pressureKpa[v], note: "heater inlet" },
        { nodeId: nodeIds[v], distanceM: distanceM[v], pressureKpa: solved.pressureKpa[v] - solved.heaterLossKpa, note: "heater outlet" },
      ];
      points[--i] = profiles.heaterPoints[1];
      points[--i] = profiles.heaterPoints[0];
      continue;
    }
    let point = pointAt[v];
    if (point === undefined) {
      point = { nodeId: nodeIds[v], distanceM: distanceM[v], pressureKpa: solved.pressureKpa[v] };
      if (!Number.isNaN(model.prvSettingKpa[v])) point.note = `PRV ${model.prvSettingKpa[v]} kPa`;
      pointAt[v] = point;
    }
    points[--i] = point;
  }
  return points;
}

export function pressureBalance(network: BalanceNetwork, options: BalanceOptions = {}): BalanceResult {
  const limit = options.balanceLimitPercent ?? DEFAULT_LIMITS.balanceLimitPercent;
  const maxVelocityMs = options.maxVelocityMs ?? DEFAULT_LIMITS.maxVelocityMs;
  const maxStaticKpa = options.maxStaticPressureKpa ?? DEFAULT_LIMITS.maxStaticPressureKpa;
  for (const [name, v] of [
    ["balanceLimitPercent", limit],
    ["maxVelocityMs", maxVelocityMs],
    ["maxStaticPressureKpa", maxStaticKpa],
  ] as const) {
    if (!Number.isFinite(v) || v <= 0) throw new RangeError(`${name} must be greater than zero (got ${v})`);
  }
  const model = buildNetworkModel(network, options);
  const sizing: Sizing = { pipe: new Array(model.segments.length), boreMm: new Float64Array(model.segments.length) };
  for (let k = 0; k < model.segments.length; k++) {
    sizing.pipe[k] = model.segments[k].pipe;
    sizing.boreMm[k] = model.segments[k].boreMm;
  }
  const flows = computeFlows(model);
  const solved = solve(model, sizing, flows);
  const { nodeIds, order, parentNode, parentSeg, segments } = model;
  const n = nodeIds.length;

  // Distance along the pipe and static pressure, one more pre-order pass.
  const distanceM = new Float64Array(n);
  const staticKpa = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const v = order[k];
    const p = parentNode[v];
    let s: number;
    if (p === -1) s = model.supplyStaticKpa;
    else {
      const seg = segments[parentSeg[v]];
      distanceM[v] = distanceM[p] + seg.lengthM;
      s = staticKpa[p] - (waterProperties(seg.tempC).densityKgM3 * STANDARD_GRAVITY_MS2 * seg.riseM) / 1000;
    }
    const setting = model.prvSettingKpa[v];
    staticKpa[v] = s > setting ? setting : s;
  }

  const findings: Finding[] = [];
  let maxStaticNode = model.root;
  for (let k = 0; k < n; k++) if (staticKpa[order[k]] > staticKpa[maxStaticNode]) maxStaticNode = order[k];
  if (staticKpa[maxStaticNode] > maxStaticKpa + 1e-9) {
    findings.push(
      finding(
        "fail",
        "static-pressure-exceeded",
        `System static pressure must not exceed ${maxStaticKpa} kPa (common practice); it reaches ` +
          `${round(staticKpa[maxStaticNode])} kPa at node "${nodeIds[maxStaticNode]}"`,
        { staticPressureKpa: staticKpa[maxStaticNode], limitKpa: maxStaticKpa },
        nodeIds[maxStaticNode],
      ),
    );
  }

  const fast: number[] = [];
  for (let k = 0; k < segments.length; k++) if (solved.losses.velocityMs[k] > maxVelocityMs + 1e-12) fast.push(k);
  fast.sort((a, b) => (segments[a].id < segments[b].id ? -1 : 1));
  for (const k of fast) {
    const v = solved.losses.velocityMs[k];
    findings.push(
      finding(
        "warn",
        "velocity-exceeded",
        `Velocity in segment "${segments[k].id}" is ${round(v, 2)} m/s, above the ${maxVelocityMs} m/s limit`,
        { velocityMs: v, limitMs: maxVelocityMs, flowLps: flows.flowLps[k] },
        segments[k].id,
      ),
    );
  }
  const mixing = new Uint8Array(model.outlets.length);
  for (const m of model.mixingPoints) mixing[m.hot] = mixing[m.cold] = 1;
  const dry: ModelOutlet[] = [];
  for (let i = 0; i < model.outlets.length; i++) {
    const o = model.outlets[i];
    if (mixing[i] === 0 && solved.pressureKpa[o.node] <= 0) dry.push(o);
  }
  dry.sort(byIdAscending);
  for (const o of dry) {
    findings.push(
      finding(
        "fail",
        "outlet-no-pressure",
        `Outlet "${o.id}" has no residual pressure left at design flow`,
        { residualKpa: solved.pressureKpa[o.node] },
        o.id,
      ),
    );
  }
  for (let k = 0; k < n; k++) {
    const v = order[k];
    const setting = model.prvSettingKpa[v];
    if (Number.isNaN(setting) || parentNode[v] === -1) continue;
    const p = parentNode[v];
    const arriving = solved.pressureKpa[p] - (p === model.heaterNode ? solved.heaterLossKpa : 0) - solved.lossKpa[parentSeg[v]];
    if (arriving < setting) {
      findings.push(
        finding(
          "info",
          "prv-not-regulating",
          `At design flow the PRV at node "${nodeIds[v]}" receives ${round(arriving)} kPa, below its ${setting} kPa setting, so it does not regulate`,
          { inletPressureKpa: arriving, settingKpa: setting },
          model.prvIds[v] ?? nodeIds[v],
        ),
      );
    }
  }

  const profiles: Profiles | undefined = (options.includeProfiles ?? true) ? { model, solved, distanceM, pointAt: new Array(n) } : undefined;
  const mixingPoints: MixingPointResult[] = new Array(model.mixingPoints.length);
  for (let i = 0; i < mixingPoints.length; i++) {
    const m = model.mixingPoints[i];
    const hotNode = model.outlets[m.hot].node;
    const coldNode = model.outlets[m.cold].node;
    const hot = solved.pressureKpa[hotNode];
    const cold = solved.pressureKpa[coldNode];
    const o = outcome(hot, cold, limit);
    mixingPoints[i] = {
      id: m.id,
      hotOutletId: model.outlets[m.hot].id,
      coldOutletId: model.outlets[m.cold].id,
      hotResidualKpa: hot,
      coldResidualKpa: cold,
      differencePercent: o.differencePercent,
      limitPercent: limit,
      ok: o.ok,
      lowerSide: hot < cold ? "hot" : cold < hot ? "cold" : "equal",
      hotProfile: profiles ? pressureProfile(profiles, hotNode) : [],
      coldProfile: profiles ? pressureProfile(profiles, coldNode) : [],
    };
  }
  const failing: MixingPointResult[] = [];
  for (const m of mixingPoints) if (!m.ok) failing.push(m);
  failing.sort(byIdAscending);
  for (const m of failing) {
    if (Math.min(m.hotResidualKpa, m.coldResidualKpa) <= 0) {
      findings.push(
        finding(
          "fail",
          "no-residual-pressure",
          `Mixing point "${m.id}" has no residual pressure left on its ${m.hotResidualKpa <= 0 ? "hot" : "cold"} side at design flow`,
          { hotResidualKpa: m.hotResidualKpa, coldResidualKpa: m.coldResidualKpa },
          m.id,
        ),
      );
    } else if (!m.ok) {
      findings.push(
        finding(
          "fail",
          "pressure-imbalance",
          `Hot and cold residual pressures at mixing point "${m.id}" differ by ${round(m.differencePercent, 1)} %, ` +
            `more than the ${limit} % limit (common practice)`,
          { hotResidualKpa: m.hotResidualKpa, coldResidualKpa: m.coldResidualKpa, differencePercent: m.differencePercent, limitPercent: limit },
          m.id,
        ),
      );
    }
  }

  const losses = solved.losses;
  const segmentResults: SegmentResult[] = new Array(segments.length);
  for (let k = 0; k < segments.length; k++) {
    const s = segments[k];
    const p = s.from;
    const inlet = solved.pressureKpa[p] - (p === model.heaterNode ? solved.heaterLossKpa : 0);
    segmentResults[k] = {
      id: s.id,
      service: s.service,
      pipeId: s.pipe?.id,
      internalDiameterMm: s.boreMm,
      roughnessMm: roughnessOf(s, s.pipe),
      tempC: s.tempC,
      flowLps: flows.flowLps[k],
      velocityMs: losses.velocityMs[k],
      reynolds: losses.reynolds[k],
      frictionFactor: losses.frictionFactor[k],
      frictionLossKpa: losses.frictionLossKpa[k],
      fittingLossKpa: losses.fittingLossKpa[k],
      staticLossKpa: losses.staticLossKpa[k],
      totalLossKpa: losses.totalLossKpa[k],
      inletPressureKpa: inlet,
      outletPressureKpa: inlet - losses.totalLossKpa[k],
    };
  }

  const nodes: NodeResult[] = new Array(n);
  for (let k = 0; k < n; k++) {
    const v = order[k];
    const node: NodeResult = {
      nodeId: nodeIds[v],
      parentNodeId: parentNode[v] === -1 ? null : nodeIds[parentNode[v]],
      viaSegmentId: parentSeg[v] === -1 ? null : segments[parentSeg[v]].id,
      distanceM: distanceM[v],
      flowLps: flows.nodeFlowLps[v],
      pressureKpa: solved.pressureKpa[v],
      staticPressureKpa: staticKpa[v],
    };
    if (!Number.isNaN(model.prvSettingKpa[v])) node.prvSettingKpa = model.prvSettingKpa[v];
    if (v === model.heaterNode) node.heaterOutletPressureKpa = solved.pressureKpa[v] - solved.heaterLossKpa;
    nodes[k] = node;
  }

  const designFlowMethod: { method: string; source: string }[] = [];
  let byLoadingUnits = false;
  let stated = false;
  for (const o of model.outlets) {
    if (o.basis === "loadingUnits") byLoadingUnits = true;
    else stated = true;
  }
  if (byLoadingUnits) designFlowMethod.push(DESIGN_FLOW_METHOD.loadingUnits);
  if (stated) designFlowMethod.push(DESIGN_FLOW_METHOD.stated);

  const needsSuggestion =
    mixingPoints.some((m) => !m.ok) || findings.some((f) => f.code === "velocity-exceeded");
  const suggestion =
    (options.suggest ?? true) && needsSuggestion
      ? suggestChanges(model, sizing, flows, solved, {
          limit,
          maxVelocityMs,
          maxSteps: options.maxSuggestionSteps ?? 200,
        })
      : null;

  return {
    ok: !findings.some((f) => f.severity === "fail"),
    definition: BALANCE_DIFFERENCE_DEFINITION,
    limitPercent: limit,
    maxVelocityMs,
    maxStaticPressureKpa: maxStaticKpa,
    designFlowMethod,
    mixingPoints,
    segments: segmentResults,
    nodes,
    maxStaticPressure: { nodeId: nodeIds[maxStaticNode], pressureKpa: staticKpa[maxStaticNode] },
    findings,
    suggestion,
    caution: CAUTION,
  };
}

function round(v: number, digits = 0): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}

interface SuggestSettings {
  limit: number;
  maxVelocityMs: number;
  maxSteps: number;
}

function suggestChanges(
  model: NetworkModel,
  original: Sizing,
  flows: { flowLps: Float64Array; nodeFlowLps: Float64Array },
  base: Solved,
  settings: SuggestSettings,
): BalanceSuggestion {
  const { segments, order, tin, tout, parentNode, parentSeg, outlets, mixingPoints } = model;
  const catalogue = model.pipeCatalogue;
  const n = model.nodeIds.length;
  const m = mixingPoints.length;
  const notes: string[] = [];
  const pipe = [...original.pipe];
  const bore = Float64Array.from(original.boreMm);
  const velocity = Float64Array.from(base.losses.velocityMs);
  const lossKpa = Float64Array.from(base.lossKpa);
  const pressure = Float64Array.from(base.pressureKpa);
  const scratch = new Float64Array(n);
  const hl = base.heaterLossKpa;
  // Size steps looked up once: the greedy loop asks for them at every step.
  const seriesOf = new Map<string, PipeSpec[]>();
  const nextOf = new Map<PipeSpec, PipeSpec | undefined>();
  for (const p of catalogue) {
    if (!seriesOf.has(p.series)) seriesOf.set(p.series, seriesSizes(catalogue, p.series));
    nextOf.set(p, nextLargerPipe(catalogue, p));
  }
  // Loss each segment would have one size up, kept until the segment changes.
  const upsizedLoss = new Float64Array(segments.length).fill(NaN);
  const hotNode = mixingPoints.map((mp) => outlets[mp.hot].node);
  const coldNode = mixingPoints.map((mp) => outlets[mp.cold].node);

  // Mixing points touching each node, for finding those a subtree change can affect.
  const mpStart = new Int32Array(n + 1);
  for (let i = 0; i < m; i++) {
    mpStart[hotNode[i] + 1]++;
    mpStart[coldNode[i] + 1]++;
  }
  for (let v = 0; v < n; v++) mpStart[v + 1] += mpStart[v];
  const mpAt = new Int32Array(2 * m);
  {
    const fill = mpStart.slice(0, n);
    for (let i = 0; i < m; i++) {
      mpAt[fill[hotNode[i]]++] = i;
      mpAt[fill[coldNode[i]]++] = i;
    }
  }
  const stamp = new Int32Array(m);
  let stampNo = 0;

  const penalties = new Float64Array(m);
  const evaluateAll = (): number => {
    let total = 0;
    for (let i = 0; i < m; i++) {
      penalties[i] = outcome(pressure[hotNode[i]], pressure[coldNode[i]], settings.limit).penalty;
      total += penalties[i];
    }
    return total;
  };
  const recompute = () => propagate(model, lossKpa, hl, pressure, 0, n);

  /** Total penalty if segment k's loss were newLoss (or a PRV override applied below child), by subtree re-propagation. */
  const objectiveWith = (total: number, child: number, newLoss: number | undefined, prv?: { node: number; settingKpa: number }) => {
    const lo = tin[child];
    const hi = tout[child];
    const p = parentNode[child];
    const seg = parentSeg[child];
    const arriving = pressure[p] - (p === model.heaterNode ? hl : 0) - (newLoss ?? lossKpa[seg]);
    const setting = prv && prv.node === child ? prv.settingKpa : model.prvSettingKpa[child];
    scratch[child] = arriving > setting ? setting : arriving;
    for (let k = lo + 1; k < hi; k++) {
      const v = order[k];
      const q = parentNode[v];
      let value = scratch[q] - (q === model.heaterNode ? hl : 0) - lossKpa[parentSeg[v]];
      const s = prv && prv.node === v ? prv.settingKpa : model.prvSettingKpa[v];
      if (value > s) value = s;
      scratch[v] = value;
    }
    stampNo++;
    let result = total;
    const inside = (v: number) => tin[v] >= lo && tin[v] < hi;
    for (let k = lo; k < hi; k++) {
      const v = order[k];
      for (let j = mpStart[v]; j < mpStart[v + 1]; j++) {
        const i = mpAt[j];
        if (stamp[i] === stampNo) continue;
        stamp[i] = stampNo;
        const h = inside(hotNode[i]) ? scratch[hotNode[i]] : pressure[hotNode[i]];
        const c = inside(coldNode[i]) ? scratch[coldNode[i]] : pressure[coldNode[i]];
        result += outcome(h, c, settings.limit).penalty - penalties[i];
      }
    }
    return result;
  };

  const apply = (k: number, next: PipeSpec) => {
    upsizedLoss[k] = NaN;
    pipe[k] = next;
    bore[k] = internalDiameterMm(next);
    const l = lossFor(segments[k], next, bore[k], flows.flowLps[k]);
    velocity[k] = l.velocityMs;
    lossKpa[k] = l.totalLossKpa;
  };

  // 1. Velocity: the smallest size in the series that meets the limit.
  const bySegmentId = segments.map((_, k) => k).sort((a, b) => (segments[a].id < segments[b].id ? -1 : 1));
  const velocityStuck = new Set<number>();
  for (const k of bySegmentId) {
    if (velocity[k] <= settings.maxVelocityMs) continue;
    const current = pipe[k];
    if (!current) {
      notes.push(`Segment "${segments[k].id}" exceeds the velocity limit but has no catalogue pipe to upsize.`);
      velocityStuck.add(k);
      continue;
    }
    const sizes = seriesOf.get(current.series)!.filter((p) => internalDiameterMm(p) > bore[k]);
    const fit = sizes.find((p) => lossFor(segments[k], p, internalDiameterMm(p), flows.flowLps[k]).velocityMs <= settings.maxVelocityMs);
    if (fit) apply(k, fit);
    else {
      notes.push(`No size in series "${current.series}" keeps segment "${segments[k].id}" within ${settings.maxVelocityMs} m/s.`);
      velocityStuck.add(k);
      if (sizes.length) apply(k, sizes[sizes.length - 1]);
    }
  }
  recompute();
  let total = evaluateAll();

  // 2. Balance: greedy single-size steps.
  const onPath = new Int32Array(segments.length);
  let pathStamp = 0;
  let steps = 0;
  const fixedBore = new Set<string>();
  while (total > 1e-9 && steps < settings.maxSteps) {
    pathStamp++;
    const candidates: number[] = [];
    for (let i = 0; i < m; i++) {
      if (penalties[i] <= 0) continue;
      const h = pressure[hotNode[i]];
      const c = pressure[coldNode[i]];
      const starts = h < c ? [hotNode[i]] : c < h ? [coldNode[i]] : [hotNode[i], coldNode[i]];
      for (const start of starts) {
        for (let v = start; parentNode[v] !== -1; v = parentNode[v]) {
          const k = parentSeg[v];
          if (onPath[k] === pathStamp) continue;
          onPath[k] = pathStamp;
          if (!pipe[k]) fixedBore.add(segments[k].id);
          else if (nextOf.get(pipe[k]!)) candidates.push(k);
        }
      }
    }
    candidates.sort((a, b) => (segments[a].id < segments[b].id ? -1 : 1));
    let best = -1;
    let bestGain = 0;
    let bestDelta = 0;
    let bestPipe: PipeSpec | undefined;
    for (const k of candidates) {
      const next = nextOf.get(pipe[k]!)!;
      if (Number.isNaN(upsizedLoss[k])) {
        upsizedLoss[k] = lossFor(segments[k], next, internalDiameterMm(next), flows.flowLps[k]).totalLossKpa;
      }
      const newLoss = upsizedLoss[k];
      const gain = total - objectiveWith(total, segments[k].to, newLoss);
      const delta = lossKpa[k] - newLoss;
      const tol = 1e-9 * Math.max(1, Math.abs(bestGain));
      if (gain > bestGain + tol || (best !== -1 && Math.abs(gain - bestGain) <= tol && delta > bestDelta + 1e-12)) {
        best = k;
        bestGain = gain;
        bestDelta = delta;
        bestPipe = next;
      }
    }
    if (best === -1 || bestGain <= 1e-9) break;
    apply(best, bestPipe!);
    recompute();
    total = evaluateAll();
    steps++;
  }
  if (steps >= settings.maxSteps && total > 1e-9) notes.push(`Stopped after ${settings.maxSteps} upsizing steps.`);
  if (fixedBore.size) {
    const ids = [...fixedBore].sort().map((id) => `"${id}"`);
    notes.push(`Segments ${ids.join(", ")} lie on failing paths but have no catalogue pipe, so they were not upsized.`);
  }

  // 3. Step back any change that is not needed.
  const velocityOk = (k: number, p: PipeSpec) =>
    velocityStuck.has(k) || lossFor(segments[k], p, internalDiameterMm(p), flows.flowLps[k]).velocityMs <= settings.maxVelocityMs;
  let pruned = true;
  while (pruned) {
    pruned = false;
    for (let idx = bySegmentId.length - 1; idx >= 0; idx--) {
      const k = bySegmentId[idx];
      const from = original.pipe[k];
      const now = pipe[k];
      if (!from || !now || now === from) continue;
      const sizes = seriesOf.get(now.series)!;
      const pos = sizes.indexOf(now);
      const down = sizes.slice(0, pos).reverse().find((p) => internalDiameterMm(p) >= internalDiameterMm(from) && internalDiameterMm(p) < internalDiameterMm(now));
      if (!down || !velocityOk(k, down)) continue;
      const newLoss = lossFor(segments[k], down, internalDiameterMm(down), flows.flowLps[k]).totalLossKpa;
      if (objectiveWith(total, segments[k].to, newLoss) <= total + 1e-9) {
        apply(k, down);
        recompute();
        total = evaluateAll();
        pruned = true;
      }
    }
  }

  const changes: PipeChange[] = [];
  for (const k of bySegmentId) {
    const from = original.pipe[k];
    const to = pipe[k];
    if (!from || !to || from === to) continue;
    const wasFast = base.losses.velocityMs[k] > settings.maxVelocityMs;
    changes.push({
      segmentId: segments[k].id,
      reason: wasFast ? "velocity" : "balance",
      fromPipeId: from.id,
      toPipeId: to.id,
      fromInternalDiameterMm: original.boreMm[k],
      toInternalDiameterMm: bore[k],
      velocityBeforeMs: base.losses.velocityMs[k],
      velocityAfterMs: velocity[k],
      lossBeforeKpa: base.losses.totalLossKpa[k],
      lossAfterKpa: lossKpa[k],
    });
  }
  const after: MixingPointOutcome[] = mixingPoints.map((mp, i) => {
    const o = outcome(pressure[hotNode[i]], pressure[coldNode[i]], settings.limit);
    return { id: mp.id, hotResidualKpa: pressure[hotNode[i]], coldResidualKpa: pressure[coldNode[i]], differencePercent: o.differencePercent, ok: o.ok };
  });
  const velocitiesOk = segments.every((_, k) => velocity[k] <= settings.maxVelocityMs + 1e-12);
  const resolved = total <= 1e-9 && velocitiesOk;
  if (!resolved && total > 1e-9) {
    notes.push("Upsizing within the catalogue does not bring every mixing point within the limit; review the layout or pressures.");
  }

  const suggestion: BalanceSuggestion = { method: SUGGESTION_METHOD, resolved, changes, after, notes };
  if (m === 1) {
    const prv = balancingPrv(model, base, settings.limit);
    if (prv) suggestion.balancingPrv = prv;
  }
  return suggestion;

  function balancingPrv(model: NetworkModel, solved: Solved, limit: number): BalancingPrvSuggestion | undefined {
    const hot = hotNode[0];
    const cold = coldNode[0];
    const ph = solved.pressureKpa[hot];
    const pc = solved.pressureKpa[cold];
    if (outcome(ph, pc, limit).ok || !(pc > ph) || ph <= 0) return undefined;
    // Outlets below each node, to find the highest node that feeds this cold outlet alone.
    const outletCount = new Int32Array(n);
    for (const o of outlets) outletCount[o.node]++;
    for (let k = n - 1; k > 0; k--) outletCount[parentNode[order[k]]] += outletCount[order[k]];
    let node = cold;
    while (parentNode[node] !== model.root && parentNode[node] !== -1 && outletCount[parentNode[node]] === 1) node = parentNode[node];
    // Put the original network back in place for the prediction.
    pressure.set(solved.pressureKpa);
    lossKpa.set(solved.lossKpa);
    for (let i = 0; i < m; i++) penalties[i] = outcome(pressure[hotNode[i]], pressure[coldNode[i]], limit).penalty;
    const drop = pressure[node] - pc;
    const settingKpa = ph + drop;
    const predict = (setting: number): MixingPointOutcome => {
      objectiveWith(0, node, undefined, { node, settingKpa: setting });
      const c = scratch[cold];
      const o = outcome(ph, c, limit);
      return { id: mixingPoints[0].id, hotResidualKpa: ph, coldResidualKpa: c, differencePercent: o.differencePercent, ok: o.ok };
    };
    const result: BalancingPrvSuggestion = {
      mixingPointId: mixingPoints[0].id,
      nodeId: model.nodeIds[node],
      settingKpa,
      predicted: predict(settingKpa),
    };
    // The PRV nearest upstream of the hot outlet, if it does not already regulate this cold feed.
    for (let v = hot; v !== -1; v = parentNode[v]) {
      if (Number.isNaN(model.prvSettingKpa[v])) continue;
      const shared = tin[node] > tin[v] && tin[node] < tout[v];
      if (!shared) {
        result.sameRating = {
          hotSidePrvNodeId: model.nodeIds[v],
          settingKpa: model.prvSettingKpa[v],
          predicted: predict(model.prvSettingKpa[v]),
        };
      }
      break;
    }
    return result;
  }
}
