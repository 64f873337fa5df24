// Owns the hot/cold supply network as the balance solver sees it: the input types, their validation (every
// problem named by its element and field path), and the tree the solver walks — nodes in one canonical
// pre-order, so results never depend on the order the caller listed things in.

import { FIXTURE_DEMAND, type FixtureType } from "./demand";
import { IdTable } from "./ids";
import { MAX_RELATIVE_ROUGHNESS } from "./friction";
import { fittingCatalogue as defaultFittings, type FittingCount, type FittingType } from "./fittings";
import { internalDiameterMm, pipeCatalogue as defaultPipes, type PipeSpec } from "./pipes";
import { WATER_TEMPERATURE_RANGE_C } from "./water";

export type Service = "hot" | "cold";

export interface NetworkSegmentInput {
  id: string;
  fromNodeId: string;
  toNodeId: string;
  service: Service;
  lengthM: number;
  /** A catalogue pipe; only catalogue pipes can be upsized in suggestions. */
  pipeId?: string;
  /** A bore given directly, instead of pipeId. */
  internalDiameterMm?: number;
  /** Overrides the pipe's roughness; required with internalDiameterMm unless the default suits. */
  roughnessMm?: number;
  fittings?: FittingCount[];
  /** Loss coefficients on top of the fittings (a tap body, a meter…). */
  kTotal?: number;
  equivalentLengthM?: number;
  /** Height gained from fromNode to toNode; negative for a fall. */
  riseM?: number;
  /** Defaults to the network's hot or cold temperature. */
  tempC?: number;
}

export interface NetworkOutletInput {
  id: string;
  nodeId: string;
  /** A stated design flow (L/s); when given it is used as it is. */
  flowLps?: number;
  /** Loading units (EN 806-3) of this draw-off; used when no flow is stated. */
  loadingUnits?: number;
  /** Fixture type whose loading units apply when neither flow nor loading units is given. */
  fixture?: FixtureType;
  label?: string;
}

export interface MixingPointInput {
  id: string;
  hotOutletId: string;
  coldOutletId: string;
  label?: string;
}

export interface PrvInput {
  id?: string;
  /** The pressure at this node and everything downstream is held at or below the setting. */
  nodeId: string;
  settingKpa: number;
}

export interface HeaterInput {
  /** Water passing this node goes through the heater; segments leaving it carry hot water. */
  nodeId: string;
  /** Pressure loss through the heater; at ratedFlowLps when given (then scaled with flow squared). */
  pressureLossKpa: number;
  ratedFlowLps?: number;
}

export interface SupplyInput {
  nodeId: string;
  staticPressureKpa: number;
  /** Pressure available at the connection while the design flow is drawn; defaults to the static pressure. */
  dynamicPressureKpa?: number;
  prv?: PrvInput;
}

export interface BalanceNetwork {
  supply: SupplyInput;
  heater?: HeaterInput;
  segments: NetworkSegmentInput[];
  outlets: NetworkOutletInput[];
  mixingPoints: MixingPointInput[];
  /** Further PRVs, e.g. a balancing PRV on one cold feed. */
  prvs?: PrvInput[];
  /** Water temperatures for segments that state none. Defaults 60 °C hot, 20 °C cold (common practice). */
  hotTempC?: number;
  coldTempC?: number;
}

export type FittingMethod = "k" | "equivalentLength";

export interface NetworkIssue {
  /** Field path into the network input, e.g. ["segments", 3, "lengthM"]. */
  path: (string | number)[];
  message: string;
  elementId?: string;
}

export class NetworkValidationError extends Error {
  readonly issues: NetworkIssue[];
  constructor(issues: NetworkIssue[]) {
    super(`The network is not valid: ${issues.map((i) => i.message).join("; ")}`);
    this.name = "NetworkValidationError";
    this.issues = issues;
  }
}

export const DEFAULT_HOT_TEMP_C = 60;
export const DEFAULT_COLD_TEMP_C = 20;
const DEFAULT_ROUGHNESS_MM = 0.0015;

export interface ModelSegment {
  id: string;
  /** Position in the caller's segments array. */
  inputIndex: number;
  from: number;
  to: number;
  service: Service;
  lengthM: number;
  riseM: number;
  tempC: number;
  pipe: PipeSpec | undefined;
  boreMm: number;
  /** Roughness stated on the segment; undefined means "the pipe's own". */
  roughnessOverrideMm: number | undefined;
  /** K not tied to pipe size: kTotal plus, with the K method, every fitting. */
  fixedK: number;
  /** Fittings with an L/D, kept so their equivalent length follows a new bore (equivalent-length method). */
  lengthOverDiameterTotal: number;
  extraLengthM: number;
}

export interface ModelOutlet {
  id: string;
  inputIndex: number;
  node: number;
  statedFlowLps: number;
  loadingUnits: number;
  basis: "stated" | "loadingUnits";
}

export interface ModelMixingPoint {
  id: string;
  inputIndex: number;
  hot: number;
  cold: number;
}

export interface NetworkModel {
  nodeIds: string[];
  root: number;
  /** Nodes in canonical pre-order (children taken in segment-id order). */
  order: Int32Array;
  /** Position of each node in `order`; a subtree is the range [tin, tout). */
  tin: Int32Array;
  tout: Int32Array;
  parentNode: Int32Array;
  parentSeg: Int32Array;
  segments: ModelSegment[];
  outlets: ModelOutlet[];
  mixingPoints: ModelMixingPoint[];
  /** PRV setting per node, NaN where there is none. */
  prvSettingKpa: Float64Array;
  prvIds: (string | undefined)[];
  heaterNode: number;
  heaterLossKpa: number;
  heaterRatedFlowLps: number | undefined;
  supplyStaticKpa: number;
  supplyDynamicKpa: number;
  pipeCatalogue: readonly PipeSpec[];
  fittingMethod: FittingMethod;
}

// Catalogues are looked up once per segment; index each catalogue array once.
const indexCache = new WeakMap<readonly { id: string }[], Map<string, unknown>>();
function indexById<T extends { id: string }>(rows: readonly T[]): Map<string, T> {
  let index = indexCache.get(rows) as Map<string, T> | undefined;
  if (!index) {
    index = new Map();
    for (const r of rows) if (!index.has(r.id)) index.set(r.id, r);
    indexCache.set(rows, index);
  }
  return index;
}

// What the per-element loops call lives out here, not as closures inside buildNetworkModel: a closure made
// afresh on every call keeps its optimised code only while one of its instances lives, so after each full
// garbage collection a large network's loops would run unoptimised again until recompiled.

// Names and paths for messages are built only when there is something to report.
const segmentName = (s: NetworkSegmentInput | undefined, i: number) => `Segment "${s?.id ?? i}"`;
const segPath = (i: number, field: string): (string | number)[] => ["segments", i, field];
const outletName = (o: NetworkOutletInput | undefined, i: number) => `Outlet "${o?.id ?? i}"`;
const mixingName = (m: MixingPointInput | undefined, i: number) => `Mixing point "${m?.id ?? i}"`;

const isFiniteNumber = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
const byId = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
const bySegmentId = (a: ModelSegment, b: ModelSegment) => byId(a.id, b.id);
const { min: tMin, max: tMax } = WATER_TEMPERATURE_RANGE_C;
const tempOk = (t: number) => isFiniteNumber(t) && t >= tMin && t <= tMax;

export interface ModelOptions {
  pipeCatalogue?: readonly PipeSpec[];
  fittingCatalogue?: readonly FittingType[];
  fittingMethod?: FittingMethod;
}

/** Every problem with the network, in input order; empty when it can be solved. */
export function validateNetwork(network: BalanceNetwork, options: ModelOptions = {}): NetworkIssue[] {
  try {
    buildNetworkModel(network, options);
    return [];
  } catch (e) {
    if (e instanceof NetworkValidationError) return e.issues;
    throw e;
  }
}

/** Validates the network and builds the tree the solver walks; throws NetworkValidationError. */
export function buildNetworkModel(network: BalanceNetwork, options: ModelOptions = {}): NetworkModel {
  const pipes = options.pipeCatalogue ?? defaultPipes;
  const fittings = options.fittingCatalogue ?? defaultFittings;
  const pipeById = indexById(pipes);
  const fittingById = indexById(fittings);
  const fittingMethod = options.fittingMethod ?? "k";
  const issues: NetworkIssue[] = [];
  const issue = (path: (string | number)[], message: string, elementId?: string) =>
    issues.push(elementId === undefined ? { path, message } : { path, message, elementId });

  const supply = network.supply;
  const segmentsIn = Array.isArray(network.segments) ? network.segments : [];
  const outletsIn = Array.isArray(network.outlets) ? network.outlets : [];
  const mixingIn = Array.isArray(network.mixingPoints) ? network.mixingPoints : [];
  const hotTempC = network.hotTempC ?? DEFAULT_HOT_TEMP_C;
  const coldTempC = network.coldTempC ?? DEFAULT_COLD_TEMP_C;

  if (!supply || typeof supply.nodeId !== "string" || supply.nodeId === "") {
    issue(["supply", "nodeId"], "The supply needs a node id");
  }
  if (!supply || !isFiniteNumber(supply.staticPressureKpa) || supply.staticPressureKpa <= 0) {
    issue(["supply", "staticPressureKpa"], "The supply static pressure must be a positive number of kPa");
  }
  if (supply?.dynamicPressureKpa !== undefined) {
    if (!isFiniteNumber(supply.dynamicPressureKpa) || supply.dynamicPressureKpa <= 0) {
      issue(["supply", "dynamicPressureKpa"], "The supply dynamic pressure must be a positive number of kPa");
    } else if (isFiniteNumber(supply.staticPressureKpa) && supply.dynamicPressureKpa > supply.staticPressureKpa) {
      issue(
        ["supply", "dynamicPressureKpa"],
        `The supply pressure under flow (${supply.dynamicPressureKpa} kPa) cannot exceed its static pressure (${supply.staticPressureKpa} kPa)`,
      );
    }
  }
  if (!tempOk(hotTempC)) issue(["hotTempC"], `The hot water temperature must be ${tMin}–${tMax} °C`);
  if (!tempOk(coldTempC)) issue(["coldTempC"], `The cold water temperature must be ${tMin}–${tMax} °C`);
  if (segmentsIn.length === 0) issue(["segments"], "The network has no segments");

  // Nodes: the supply node first, then segment ends in input order.
  // A tree has one node more than it has segments.
  const nodeIndex = new IdTable(segmentsIn.length + 1);
  const nodeIds = nodeIndex.ids;
  const rootId = supply?.nodeId ?? "";
  nodeIndex.add(rootId);

  const segments: ModelSegment[] = [];
  const segIds = new IdTable(segmentsIn.length);
  for (let i = 0; i < segmentsIn.length; i++) {
    const s = segmentsIn[i];
    if (!s || typeof s.id !== "string" || s.id === "") {
      issue(["segments", i, "id"], `Segment ${i + 1} needs an id`);
      continue;
    }
    // One lookup per id: an id already there keeps its older number.
    const seen = segIds.size;
    if (segIds.add(s.id) < seen) issue(segPath(i, "id"), `${segmentName(s, i)} appears more than once`, s.id);
    let bad = false;
    if (typeof s.fromNodeId !== "string" || s.fromNodeId === "") {
      issue(segPath(i, "fromNodeId"), `${segmentName(s, i)} needs a from-node`, s.id);
      bad = true;
    }
    if (typeof s.toNodeId !== "string" || s.toNodeId === "") {
      issue(segPath(i, "toNodeId"), `${segmentName(s, i)} needs a to-node`, s.id);
      bad = true;
    }
    if (!bad && s.fromNodeId === s.toNodeId) {
      issue(segPath(i, "toNodeId"), `${segmentName(s, i)} starts and ends at the same node "${s.fromNodeId}"`, s.id);
      bad = true;
    }
    if (s.service !== "hot" && s.service !== "cold") issue(segPath(i, "service"), `${segmentName(s, i)} must be marked hot or cold`, s.id);
    if (!isFiniteNumber(s.lengthM) || s.lengthM < 0) {
      issue(segPath(i, "lengthM"), `${segmentName(s, i)} has a negative or missing length (${String(s.lengthM)} m)`, s.id);
    }
    const riseM = s.riseM ?? 0;
    if (!isFiniteNumber(riseM)) issue(segPath(i, "riseM"), `${segmentName(s, i)} has an invalid rise`, s.id);
    else if (isFiniteNumber(s.lengthM) && Math.abs(riseM) > s.lengthM + 1e-9) {
      issue(segPath(i, "riseM"), `${segmentName(s, i)} rises or falls ${Math.abs(riseM)} m over a length of only ${s.lengthM} m`, s.id);
    }
    const tempC = s.tempC ?? (s.service === "hot" ? hotTempC : coldTempC);
    if (!tempOk(tempC)) issue(segPath(i, "tempC"), `${segmentName(s, i)}: water temperature must be ${tMin}–${tMax} °C`, s.id);

    let pipe: PipeSpec | undefined;
    let boreMm = NaN;
    if (s.pipeId !== undefined && s.internalDiameterMm !== undefined) {
      issue(segPath(i, "internalDiameterMm"), `${segmentName(s, i)}: give a catalogue pipe or an internal diameter, not both`, s.id);
    } else if (s.pipeId !== undefined) {
      pipe = pipeById.get(s.pipeId);
      if (!pipe) issue(segPath(i, "pipeId"), `${segmentName(s, i)} uses pipe "${s.pipeId}", which is not in the catalogue`, s.id);
      else boreMm = internalDiameterMm(pipe);
    } else if (s.internalDiameterMm !== undefined) {
      if (!isFiniteNumber(s.internalDiameterMm) || s.internalDiameterMm <= 0) {
        issue(segPath(i, "internalDiameterMm"), `${segmentName(s, i)} needs an internal diameter greater than zero`, s.id);
      } else boreMm = s.internalDiameterMm;
    } else {
      issue(segPath(i, "pipeId"), `${segmentName(s, i)} needs a catalogue pipe or an internal diameter`, s.id);
    }
    if (pipe && !(boreMm > 0)) {
      issue(segPath(i, "pipeId"), `${segmentName(s, i)}: catalogue pipe "${pipe.id}" has no bore (check its walls)`, s.id);
    }
    if (s.roughnessMm !== undefined && (!isFiniteNumber(s.roughnessMm) || s.roughnessMm < 0)) {
      issue(segPath(i, "roughnessMm"), `${segmentName(s, i)} has a negative roughness`, s.id);
    } else if (boreMm > 0) {
      const roughness = s.roughnessMm ?? pipe?.roughnessMm ?? DEFAULT_ROUGHNESS_MM;
      if (!isFiniteNumber(roughness) || roughness < 0 || roughness / boreMm > MAX_RELATIVE_ROUGHNESS) {
        issue(segPath(i, "roughnessMm"), `${segmentName(s, i)}: a roughness of ${roughness} mm is not possible in a ${boreMm} mm bore`, s.id);
      }
    }
    const kTotal = s.kTotal ?? 0;
    if (!isFiniteNumber(kTotal) || kTotal < 0) issue(segPath(i, "kTotal"), `${segmentName(s, i)} has a negative loss coefficient`, s.id);
    const extraLengthM = s.equivalentLengthM ?? 0;
    if (!isFiniteNumber(extraLengthM) || extraLengthM < 0) {
      issue(segPath(i, "equivalentLengthM"), `${segmentName(s, i)} has a negative equivalent length`, s.id);
    }
    let fixedK = isFiniteNumber(kTotal) ? kTotal : 0;
    let lengthOverDiameterTotal = 0;
    const fittingList = s.fittings ?? [];
    for (let j = 0; j < fittingList.length; j++) {
      const f = fittingList[j];
      const fitting = fittingById.get(f?.fittingId);
      if (!fitting) {
        issue(["segments", i, "fittings", j, "fittingId"], `${segmentName(s, i)} has an unknown fitting "${String(f?.fittingId)}"`, s.id);
        continue;
      }
      if (!isFiniteNumber(f.count) || f.count < 0) {
        issue(["segments", i, "fittings", j, "count"], `${segmentName(s, i)} has a negative count of ${fitting.label}`, s.id);
        continue;
      }
      if (fittingMethod === "equivalentLength" && fitting.lengthOverDiameter !== undefined) {
        lengthOverDiameterTotal += fitting.lengthOverDiameter * f.count;
      } else fixedK += fitting.k * f.count;
    }
    if (bad) continue;
    segments.push({
      id: s.id,
      inputIndex: i,
      from: nodeIndex.add(s.fromNodeId),
      to: nodeIndex.add(s.toNodeId),
      service: s.service,
      lengthM: s.lengthM,
      riseM: isFiniteNumber(riseM) ? riseM : 0,
      tempC,
      pipe,
      boreMm,
      roughnessOverrideMm: s.roughnessMm,
      fixedK,
      lengthOverDiameterTotal,
      extraLengthM: isFiniteNumber(extraLengthM) ? extraLengthM : 0,
    });
  }

  // Topology: a tree rooted at the supply node.
  const n = nodeIds.length;
  const root = 0;
  const parentSeg = new Int32Array(n).fill(-1);
  const parentNode = new Int32Array(n).fill(-1);
  for (let k = 0; k < segments.length; k++) {
    const s = segments[k];
    if (s.to === root) {
      issue(["segments", s.inputIndex, "toNodeId"], `Segment "${s.id}" feeds the supply node "${rootId}"; the supply must be the start of the network`, s.id);
      continue;
    }
    const existing = parentSeg[s.to];
    if (existing !== -1) {
      issue(
        ["segments", s.inputIndex, "toNodeId"],
        `Node "${nodeIds[s.to]}" is fed by two segments ("${segments[existing].id}" and "${s.id}"); the network must be a tree`,
        s.id,
      );
      continue;
    }
    parentSeg[s.to] = k;
    parentNode[s.to] = s.from;
  }

  // Children of each node as one flat array (childStart[v] .. childStart[v + 1]), in segment-id order.
  const childStart = new Int32Array(n + 1);
  for (let k = 0; k < segments.length; k++) {
    const s = segments[k];
    if (parentSeg[s.to] === k) childStart[s.from + 1]++;
  }
  for (let v = 0; v < n; v++) childStart[v + 1] += childStart[v];
  const children: ModelSegment[] = new Array(childStart[n]);
  {
    const fill = childStart.slice(0, n);
    for (let k = 0; k < segments.length; k++) {
      const s = segments[k];
      if (parentSeg[s.to] === k) children[fill[s.from]++] = s;
    }
    for (let v = 0; v < n; v++) {
      const lo = childStart[v];
      const hi = childStart[v + 1];
      if (hi - lo < 2) continue;
      const sorted = children.slice(lo, hi).sort(bySegmentId);
      for (let j = 0; j < sorted.length; j++) children[lo + j] = sorted[j];
    }
  }

  const order = new Int32Array(n);
  const tin = new Int32Array(n).fill(-1);
  const tout = new Int32Array(n).fill(-1);
  let count = 0;
  {
    // Iterative depth-first walk; the second stack entry closes a subtree.
    const stack: number[] = [root];
    while (stack.length) {
      const top = stack.pop()!;
      if (top < 0) {
        tout[~top] = count;
        continue;
      }
      tin[top] = count;
      order[count++] = top;
      stack.push(~top);
      for (let k = childStart[top + 1] - 1; k >= childStart[top]; k--) stack.push(children[k].to);
    }
  }
  if (count < n) {
    const reported = new Set<number>();
    for (const s of segments) {
      if (tin[s.from] !== -1 || reported.has(s.from)) continue;
      // Follow feeds upstream from the stranded node: a repeat means a loop, a dead end a detached part.
      const seen: number[] = [];
      const onWalk = new Set<number>();
      let v = s.from;
      while (v !== -1 && !onWalk.has(v) && !reported.has(v) && tin[v] === -1) {
        onWalk.add(v);
        seen.push(v);
        v = parentNode[v];
      }
      seen.forEach((x) => reported.add(x));
      if (v !== -1 && onWalk.has(v)) {
        const loop: string[] = [];
        let x = v;
        do {
          loop.push(segments[parentSeg[x]].id);
          x = parentNode[x];
        } while (x !== v);
        loop.reverse();
        const first = segments[parentSeg[v]];
        issue(
          ["segments", first.inputIndex],
          `Segments ${loop.map((id) => `"${id}"`).join(", ")} form a loop; the network must be a tree`,
          first.id,
        );
      } else if (v === -1) {
        const head = seen[seen.length - 1];
        issue(
          ["segments", s.inputIndex, "fromNodeId"],
          `Segment "${s.id}" starts at node "${nodeIds[s.from]}", which is not connected to the supply node "${rootId}"` +
            (head !== s.from ? ` (its branch starts at "${nodeIds[head]}")` : ""),
          s.id,
        );
      }
    }
  }
  const treeOk = count === n && !issues.some((i) => i.path[0] === "segments" && i.path[2] === "toNodeId");

  // Heater, PRVs, outlets and mixing points, which refer to nodes.
  let heaterNode = -1;
  const heater = network.heater;
  if (heater) {
    const v = nodeIndex.get(heater.nodeId);
    if (v === -1) issue(["heater", "nodeId"], `The heater node "${String(heater.nodeId)}" is not in the network`);
    else if (v === root) issue(["heater", "nodeId"], "The heater cannot sit at the supply node");
    else heaterNode = v;
    if (!isFiniteNumber(heater.pressureLossKpa) || heater.pressureLossKpa < 0) {
      issue(["heater", "pressureLossKpa"], "The heater pressure loss must be given and cannot be negative");
    }
    if (heater.ratedFlowLps !== undefined && (!isFiniteNumber(heater.ratedFlowLps) || heater.ratedFlowLps <= 0)) {
      issue(["heater", "ratedFlowLps"], "The heater's rated flow must be greater than zero");
    }
  }

  const prvSettingKpa = new Float64Array(n).fill(NaN);
  const prvIds: (string | undefined)[] = new Array(n).fill(undefined);
  const prvs: { prv: PrvInput; path: (string | number)[] }[] = [];
  if (supply?.prv) prvs.push({ prv: supply.prv, path: ["supply", "prv"] });
  (network.prvs ?? []).forEach((prv, i) => prvs.push({ prv, path: ["prvs", i] }));
  for (const { prv, path } of prvs) {
    const label = prv?.id ? `PRV "${prv.id}"` : "A PRV";
    const v = prv ? nodeIndex.get(prv.nodeId) : -1;
    if (v === -1) {
      issue([...path, "nodeId"], `${label} sits at node "${String(prv?.nodeId)}", which is not in the network`, prv?.id);
      continue;
    }
    if (!isFiniteNumber(prv.settingKpa) || prv.settingKpa <= 0) {
      issue([...path, "settingKpa"], `${label} needs a setting greater than zero`, prv.id);
      continue;
    }
    if (isFiniteNumber(supply?.staticPressureKpa) && prv.settingKpa > supply.staticPressureKpa) {
      issue(
        [...path, "settingKpa"],
        `${label} is set to ${prv.settingKpa} kPa, above the ${supply.staticPressureKpa} kPa supply; a PRV can only reduce pressure`,
        prv.id,
      );
      continue;
    }
    if (!Number.isNaN(prvSettingKpa[v])) {
      issue([...path, "nodeId"], `Two PRVs sit at node "${prv.nodeId}"`, prv.id);
      continue;
    }
    prvSettingKpa[v] = prv.settingKpa;
    prvIds[v] = prv.id;
  }

  // Downstream of the heater is hot; everything else is cold.
  if (treeOk && heaterNode !== -1) {
    for (const s of segments) {
      const downstream = tin[s.to] > tin[heaterNode] && tin[s.to] < tout[heaterNode];
      if (s.service === "hot" && !downstream) {
        issue(["segments", s.inputIndex, "service"], `Segment "${s.id}" is marked hot but is not downstream of the heater`, s.id);
      } else if (s.service === "cold" && downstream) {
        issue(["segments", s.inputIndex, "service"], `Segment "${s.id}" is marked cold but is downstream of the heater`, s.id);
      }
    }
  }

  const outlets: ModelOutlet[] = [];
  const outletIndex = new IdTable(outletsIn.length);
  for (let i = 0; i < outletsIn.length; i++) {
    const o = outletsIn[i];
    if (!o || typeof o.id !== "string" || o.id === "") {
      issue(["outlets", i, "id"], `Outlet ${i + 1} needs an id`);
      continue;
    }
    if (outletIndex.get(o.id) !== -1) {
      issue(["outlets", i, "id"], `${outletName(o, i)} appears more than once`, o.id);
      continue;
    }
    const node = nodeIndex.get(o.nodeId);
    if (node === -1) {
      issue(["outlets", i, "nodeId"], `${outletName(o, i)} sits at node "${String(o.nodeId)}", which is not in the network`, o.id);
      continue;
    }
    if (node === root) {
      issue(["outlets", i, "nodeId"], `${outletName(o, i)} sits at the supply node; put it at the end of a segment`, o.id);
      continue;
    }
    let statedFlowLps = 0;
    let loadingUnits = 0;
    if (o.flowLps !== undefined) {
      if (!isFiniteNumber(o.flowLps) || o.flowLps < 0) {
        issue(["outlets", i, "flowLps"], `${outletName(o, i)} has a negative or invalid flow`, o.id);
        continue;
      }
      statedFlowLps = o.flowLps;
    } else if (o.loadingUnits !== undefined) {
      if (!isFiniteNumber(o.loadingUnits) || o.loadingUnits < 0) {
        issue(["outlets", i, "loadingUnits"], `${outletName(o, i)} has negative or invalid loading units`, o.id);
        continue;
      }
      loadingUnits = o.loadingUnits;
    } else if (o.fixture !== undefined) {
      const demand = FIXTURE_DEMAND[o.fixture];
      if (!demand) {
        issue(["outlets", i, "fixture"], `${outletName(o, i)} has an unknown fixture type "${String(o.fixture)}"`, o.id);
        continue;
      }
      loadingUnits = demand.loadingUnits;
    } else {
      issue(["outlets", i, "flowLps"], `${outletName(o, i)} needs a flow, loading units or a fixture type`, o.id);
      continue;
    }
    outletIndex.add(o.id); // numbered as it is pushed, so its number is its place in outlets
    outlets.push({
      id: o.id,
      inputIndex: i,
      node,
      statedFlowLps,
      loadingUnits,
      basis: o.flowLps !== undefined ? "stated" : "loadingUnits",
    });
  }

  const mixingPoints: ModelMixingPoint[] = [];
  const mixingIds = new IdTable(mixingIn.length);
  for (let i = 0; i < mixingIn.length; i++) {
    const m = mixingIn[i];
    if (!m || typeof m.id !== "string" || m.id === "") {
      issue(["mixingPoints", i, "id"], `Mixing point ${i + 1} needs an id`);
      continue;
    }
    const seen = mixingIds.size;
    if (mixingIds.add(m.id) < seen) {
      issue(["mixingPoints", i, "id"], `${mixingName(m, i)} appears more than once`, m.id);
      continue;
    }
    const hot = outletIndex.get(m.hotOutletId);
    const cold = outletIndex.get(m.coldOutletId);
    if (hot === -1) issue(["mixingPoints", i, "hotOutletId"], `${mixingName(m, i)} refers to unknown outlet "${String(m.hotOutletId)}"`, m.id);
    if (cold === -1) issue(["mixingPoints", i, "coldOutletId"], `${mixingName(m, i)} refers to unknown outlet "${String(m.coldOutletId)}"`, m.id);
    if (hot === -1 || cold === -1) continue;
    if (hot === cold) {
      issue(["mixingPoints", i, "coldOutletId"], `${mixingName(m, i)} joins outlet "${m.hotOutletId}" to itself`, m.id);
      continue;
    }
    if (treeOk) {
      if (segments[parentSeg[outlets[hot].node]].service !== "hot") issue(["mixingPoints", i, "hotOutletId"], `${mixingName(m, i)}: outlet "${m.hotOutletId}" is not on a hot pipe`, m.id);
      if (segments[parentSeg[outlets[cold].node]].service !== "cold") issue(["mixingPoints", i, "coldOutletId"], `${mixingName(m, i)}: outlet "${m.coldOutletId}" is not on a cold pipe`, m.id);
    }
    mixingPoints.push({ id: m.id, inputIndex: i, hot, cold });
  }

  if (issues.length) throw new NetworkValidationError(issues);

  const supplyStaticKpa = supply.staticPressureKpa;
  return {
    nodeIds,
    root,
    order,
    tin,
    tout,
    parentNode,
    parentSeg,
    segments,
    outlets,
    mixingPoints,
    prvSettingKpa,
    prvIds,
    heaterNode,
    heaterLossKpa: heater?.pressureLossKpa ?? 0,
    heaterRatedFlowLps: heater?.ratedFlowLps,
    supplyStaticKpa,
    supplyDynamicKpa: supply.dynamicPressureKpa ?? supplyStaticKpa,
    pipeCatalogue: pipes,
    fittingMethod,
  };
}

export const defaultRoughnessMm = (seg: ModelSegment): number =>
  seg.roughnessOverrideMm ?? seg.pipe?.roughnessMm ?? DEFAULT_ROUGHNESS_MM;
