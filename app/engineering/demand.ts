// Owns design (simultaneous-demand) flow: loading units per draw-off point and their conversion to a design
// flow, or stated flows added without diversity.
//
// Loading units: EN 806-3:2006 Table 2 (1 LU = 0.1 L/s), read in a reproduced excerpt of the standard.
// Conversion: EN 806-3:2006 gives the design flow QD against total LU as a diagram (Figure B.1), with one curve
// per largest single draw-off. We approximate it by straight lines on log–log axes through three anchors: the
// largest single draw-off on its own (its LU, its flow), 300 LU at 1.7 L/s, and 5000 LU at 9 L/s. Those anchors
// come from a secondary description of the diagram, not from the figure itself (from memory — confirm against
// the standard before relying on the design flow). Above 5000 LU the upper line is extrapolated and flagged.

import { requireNonNegative } from "./guards";

export const LOADING_UNIT_FLOW_LPS = 0.1;

export type FixtureType =
  | "washbasin"
  | "bidet"
  | "wc-cistern"
  | "kitchen-sink"
  | "washing-machine"
  | "dishwasher"
  | "sink"
  | "shower"
  | "urinal-flush-valve"
  | "bath"
  | "garden-tap"
  | "non-domestic-sink"
  | "bath-non-domestic"
  | "flush-valve-dn20";

export interface FixtureDemand {
  label: string;
  loadingUnits: number;
  drawOffFlowLps: number;
  minimumFlowLps: number;
}

const table2 = (label: string, drawOffFlowLps: number, minimumFlowLps: number, loadingUnits: number): FixtureDemand => ({
  label,
  drawOffFlowLps,
  minimumFlowLps,
  loadingUnits,
});

/** EN 806-3:2006 Table 2: draw-off flow QA, minimum flow Qmin and loading units. */
export const FIXTURE_DEMAND: Readonly<Record<FixtureType, FixtureDemand>> = Object.freeze({
  washbasin: table2("Washbasin, handbasin", 0.1, 0.1, 1),
  bidet: table2("Bidet", 0.1, 0.1, 1),
  "wc-cistern": table2("WC cistern", 0.1, 0.1, 1),
  "kitchen-sink": table2("Domestic kitchen sink", 0.2, 0.15, 2),
  "washing-machine": table2("Washing machine", 0.2, 0.15, 2),
  dishwasher: table2("Dishwasher", 0.2, 0.15, 2),
  sink: table2("Sink", 0.2, 0.15, 2),
  shower: table2("Shower head", 0.2, 0.15, 2),
  "urinal-flush-valve": table2("Urinal flush valve", 0.3, 0.15, 3),
  bath: table2("Bath, domestic", 0.4, 0.3, 4),
  "garden-tap": table2("Tap (garden, garage)", 0.5, 0.4, 5),
  "non-domestic-sink": table2("Non-domestic kitchen sink DN 20", 0.8, 0.8, 8),
  "bath-non-domestic": table2("Bath, non-domestic", 0.8, 0.8, 8),
  "flush-valve-dn20": table2("Flush valve DN 20", 1.5, 1.0, 15),
});

export const EN806_CURVE = {
  kneeLoadingUnits: 300,
  kneeFlowLps: 1.7,
  upperLoadingUnits: 5000,
  upperFlowLps: 9,
} as const;

const UPPER_EXPONENT =
  Math.log(EN806_CURVE.upperFlowLps / EN806_CURVE.kneeFlowLps) /
  Math.log(EN806_CURVE.upperLoadingUnits / EN806_CURVE.kneeLoadingUnits);

export const DESIGN_FLOW_METHOD = {
  loadingUnits: {
    method: "EN 806-3 loading units",
    source:
      "EN 806-3:2006 Table 2 loading units; Figure B.1 approximated by log–log lines through the largest single " +
      "draw-off, 300 LU → 1.7 L/s and 5000 LU → 9 L/s (anchors from memory, confirm)",
  },
  stated: {
    method: "Stated flows",
    source: "Flows stated by the designer, added without diversity",
  },
} as const;

/**
 * Design flow (L/s) for a total of LU whose largest single draw-off is largestSingleLoadingUnits. Never below
 * that single draw-off's flow, never above all draw-offs open at once.
 */
export function designFlowLpsFromLoadingUnits(totalLoadingUnits: number, largestSingleLoadingUnits: number): number {
  requireNonNegative("totalLoadingUnits", totalLoadingUnits);
  requireNonNegative("largestSingleLoadingUnits", largestSingleLoadingUnits);
  if (totalLoadingUnits === 0) return 0;
  if (largestSingleLoadingUnits <= 0) {
    throw new RangeError("largestSingleLoadingUnits must be greater than zero when there are loading units");
  }
  if (largestSingleLoadingUnits > totalLoadingUnits * (1 + 1e-12)) {
    throw new RangeError(
      `the largest single draw-off (${largestSingleLoadingUnits} LU) cannot exceed the total (${totalLoadingUnits} LU)`,
    );
  }
  const singleFlowLps = largestSingleLoadingUnits * LOADING_UNIT_FLOW_LPS;
  const { kneeLoadingUnits, kneeFlowLps } = EN806_CURVE;
  let flowLps: number;
  if (totalLoadingUnits >= kneeLoadingUnits) {
    flowLps = kneeFlowLps * (totalLoadingUnits / kneeLoadingUnits) ** UPPER_EXPONENT;
  } else if (singleFlowLps < kneeFlowLps && largestSingleLoadingUnits < kneeLoadingUnits) {
    const m = Math.log(kneeFlowLps / singleFlowLps) / Math.log(kneeLoadingUnits / largestSingleLoadingUnits);
    flowLps = singleFlowLps * (totalLoadingUnits / largestSingleLoadingUnits) ** m;
  } else {
    flowLps = singleFlowLps;
  }
  return Math.min(Math.max(flowLps, singleFlowLps), totalLoadingUnits * LOADING_UNIT_FLOW_LPS);
}

export interface FixtureCount {
  fixture: FixtureType;
  count: number;
}

export interface DesignFlowInput {
  /** Draw-off points by type; their loading units come from EN 806-3 Table 2. */
  fixtures?: readonly FixtureCount[];
  /** Draw-off points given directly in loading units. */
  loadingUnits?: readonly number[];
  /** Flows the designer states (L/s), added as they are. */
  statedFlowsLps?: readonly number[];
}

export interface DesignFlowResult {
  flowLps: number;
  totalLoadingUnits: number;
  largestSingleLoadingUnits: number;
  statedFlowLps: number;
  method: string;
  source: string;
  notes: string[];
}

export function designFlow(input: DesignFlowInput): DesignFlowResult {
  let total = 0;
  let largest = 0;
  for (const { fixture, count } of input.fixtures ?? []) {
    const demand = FIXTURE_DEMAND[fixture];
    if (!demand) throw new RangeError(`unknown fixture type "${String(fixture)}"`);
    requireNonNegative(`count of ${fixture}`, count);
    if (count === 0) continue;
    total += demand.loadingUnits * count;
    largest = Math.max(largest, demand.loadingUnits);
  }
  for (const lu of input.loadingUnits ?? []) {
    requireNonNegative("loadingUnits", lu);
    total += lu;
    largest = Math.max(largest, lu);
  }
  let stated = 0;
  for (const q of input.statedFlowsLps ?? []) stated += requireNonNegative("statedFlowsLps", q);

  const notes: string[] = [];
  const parts: { method: string; source: string }[] = [];
  if (total > 0) parts.push(DESIGN_FLOW_METHOD.loadingUnits);
  if (stated > 0 || (input.statedFlowsLps?.length ?? 0) > 0) parts.push(DESIGN_FLOW_METHOD.stated);
  if (total > EN806_CURVE.upperLoadingUnits) {
    notes.push(`Total of ${total} LU is beyond the ${EN806_CURVE.upperLoadingUnits} LU the diagram covers; the curve is extrapolated.`);
  }
  if (total > 0 && stated > 0) notes.push("Stated flows are added to the loading-unit design flow without diversity.");
  return {
    flowLps: designFlowLpsFromLoadingUnits(total, largest) + stated,
    totalLoadingUnits: total,
    largestSingleLoadingUnits: largest,
    statedFlowLps: stated,
    method: parts.map((p) => p.method).join(" + ") || "No draw-offs",
    source: parts.map((p) => p.source).join("; "),
    notes,
  };
}
