// Owns the calculator kinds: for each, its input schema (the engine's zod schemas), how the engine runs it,
// the figures a reader compares, the method statement and the sources. Isomorphic: the browser runs it for
// live results and the server runs the very same code to recompute before anything is saved.
import { z } from "zod";
import {
  BALANCE_DIFFERENCE_DEFINITION,
  CAUTION,
  checkDeadLeg,
  checkDeliveryTemperature,
  checkDischargePipe,
  checkValveRatings,
  checkVacuumBreakers,
  expansionVolume,
  findFitting,
  findPipe,
  hazenWilliamsLossKpa,
  heatingTime,
  NetworkValidationError,
  pipeCatalogue,
  pressureBalance,
  segmentLoss,
  storageSizing,
  waterProperties,
  type BalanceNetwork,
  type BalanceResult,
  type DeadLegInput,
  type DeliveryTemperatureInput,
  type DischargePipeInput,
  type Finding,
  type HeatingTimeInput,
  type HeatingTimeResult,
  type SegmentLoss,
  type SegmentLossInput,
  type StorageSizingInput,
  type ValveRatingsInput,
  type VacuumBreakerInput,
} from "~/engineering";
import {
  balanceNetworkSchema,
  balanceOptionsSchema,
  deadLegInputSchema,
  deliveryTemperatureInputSchema,
  dischargePipeInputSchema,
  heatingTimeInputSchema,
  segmentLossInputSchema,
  storageSizingInputSchema,
  valveRatingsInputSchema,
  vacuumBreakerInputSchema,
} from "~/engineering/schemas";
import { EXAMPLES } from "./examples";
import { fromZod, type InputIssue } from "./issues";

export const KINDS = ["balance", "segment", "discharge", "vacuum", "valves", "storage", "deadleg"] as const;
export type CalculationKind = (typeof KINDS)[number];
export const isKind = (v: unknown): v is CalculationKind => typeof v === "string" && (KINDS as readonly string[]).includes(v);

/** One number (or verdict) a reader looks at and compares; `ok` marks a pass/fail verdict. */
export interface Figure {
  key: string;
  label: string;
  value: number | string;
  unit?: string;
  ok?: boolean;
  digits?: number;
}

/** Every output carries the verdict, the engine's findings and its caution. */
export interface KindOutput {
  ok: boolean;
  findings: Finding[];
  caution: string;
}

// ---------------------------------------------------------------------------------------------- inputs

export const balanceInputSchema = z.object({
  network: balanceNetworkSchema,
  options: balanceOptionsSchema.pick({ balanceLimitPercent: true, maxVelocityMs: true, maxStaticPressureKpa: true, fittingMethod: true }).optional(),
});
export type BalanceInput = z.infer<typeof balanceInputSchema> & { network: BalanceNetwork };

export const segmentInputSchema = segmentLossInputSchema.and(
  z.object({ hazenWilliamsC: z.number({ error: "Hazen–Williams C must be a number" }).positive("Hazen–Williams C must be greater than zero").max(200, "Hazen–Williams C above 200 is not a real pipe").optional() }),
);
export type SegmentInput = SegmentLossInput & { hazenWilliamsC?: number };

export const storageInputSchema = z.object({ sizing: storageSizingInputSchema, heating: heatingTimeInputSchema });
export interface StorageInput {
  sizing: StorageSizingInput;
  heating: HeatingTimeInput;
}

export const deadlegInputSchema = z.object({ deadLeg: deadLegInputSchema, delivery: deliveryTemperatureInputSchema });
export interface DeadlegInput {
  deadLeg: DeadLegInput;
  delivery: DeliveryTemperatureInput;
}

// --------------------------------------------------------------------------------------------- outputs

export type BalanceOutput = BalanceResult;
export interface SegmentOutput extends KindOutput {
  loss: SegmentLoss;
  hazenWilliamsFrictionKpa: number | null;
  water: { densityKgM3: number; kinematicViscosityM2S: number };
}
export interface StorageOutput extends KindOutput {
  sizing: { requiredVolumeL: number; recommendedVolumeL: number; basis: string };
  heating: HeatingTimeResult;
  expansion: { litres: number; percent: number };
}
export interface DeadlegOutput extends KindOutput {
  deadLeg: { volumeL: number; seconds: number };
  delivery: { deliveryC: number };
}

// ----------------------------------------------------------------------------------------- definitions

export interface KindDefinition<I = any, O extends KindOutput = any> {
  kind: CalculationKind;
  label: string;
  summary: string;
  /** False where the result is a set of numbers, not a pass/fail check. */
  hasVerdict: boolean;
  schema: z.ZodType<I>;
  run(input: I): O;
  example(): I;
  figures(input: I, output: O): Figure[];
  method(input: I, output: O): string[];
  sources(input: I, output: O): string[];
}

const FLOW_METHOD = [
  "Friction loss per segment: Darcy–Weisbach, with the Darcy friction factor from Colebrook–White (Newton iteration); 64/Re in laminar flow and a linear blend from Re 2000 to 4000.",
  "Water density and viscosity at each segment's temperature: IAPWS-IF97 region 1 and the IAPWS 2008 viscosity formulation, at one atmosphere.",
];
const IAPWS_SOURCE = "IAPWS-IF97 (R7-97(2012)) region 1 and IAPWS R12-08 viscosity; reproduced against the releases' verification tables.";
const LIMITS_SOURCE = "Balance limit 20 % and static pressure 600 kPa: common practice. Velocity 2.0 m/s: EN 806-3:2006 §4.4.";

const unique = (list: (string | undefined)[]) => [...new Set(list.filter((s): s is string => !!s))];

const balance: KindDefinition<BalanceInput, BalanceOutput> = {
  kind: "balance",
  label: "Pressure balance",
  summary: "Residual hot and cold pressure at every mixing point of a supply network, with suggested pipe changes.",
  hasVerdict: true,
  schema: balanceInputSchema as z.ZodType<BalanceInput>,
  run: (input) => pressureBalance(input.network, { ...input.options, suggest: true, includeProfiles: true }),
  example: () => structuredClone(EXAMPLES.balance),
  figures: (_input, out) => [
    { key: "ok", label: "Overall", value: out.ok ? "pass" : "fail", ok: out.ok },
    ...out.mixingPoints.flatMap((m): Figure[] => [
      { key: `mp.${m.id}.difference`, label: `${m.id}: difference`, value: m.differencePercent, unit: "%", digits: 1, ok: m.ok },
      { key: `mp.${m.id}.hot`, label: `${m.id}: hot residual`, value: m.hotResidualKpa, unit: "kPa", digits: 1 },
      { key: `mp.${m.id}.cold`, label: `${m.id}: cold residual`, value: m.coldResidualKpa, unit: "kPa", digits: 1 },
    ]),
    { key: "maxStatic", label: `Highest static pressure (${out.maxStaticPressure.nodeId})`, value: out.maxStaticPressure.pressureKpa, unit: "kPa", digits: 0 },
    { key: "findings", label: "Findings that fail", value: out.findings.filter((f) => f.severity === "fail").length },
  ],
  method: (input, out) => [
    ...FLOW_METHOD,
    `Fittings by ${input.options?.fittingMethod === "equivalentLength" ? "equivalent length (L/D)" : "loss coefficient K"} (Crane TP-410 method), plus ρ·g·Δz for each rise.`,
    `Design flow: ${out.designFlowMethod.map((d) => d.method).join("; ") || "none drawn"}. Flows summed towards the supply, pressures carried from the supply outwards; PRVs held at their setting (ideal valve).`,
    `Balance difference at a mixing point: ${BALANCE_DIFFERENCE_DEFINITION}. Limit ${out.limitPercent} %.`,
  ],
  sources: (input, out) =>
    unique([
      IAPWS_SOURCE,
      ...out.designFlowMethod.map((d) => `${d.method}: ${d.source}`),
      ...input.network.segments.map((s) => (s.pipeId ? findPipe(pipeCatalogue, s.pipeId)?.source : undefined)),
      ...input.network.segments.flatMap((s) => (s.fittings ?? []).map((f) => findFitting(f.fittingId)?.source)),
      LIMITS_SOURCE,
    ]),
};

const segment: KindDefinition<SegmentInput, SegmentOutput> = {
  kind: "segment",
  label: "Pipe segment loss",
  summary: "Pressure loss along one pipe: friction, fittings and rise, with a Hazen–Williams cross-check.",
  hasVerdict: false,
  schema: segmentInputSchema as z.ZodType<SegmentInput>,
  run: (input) => {
    const { hazenWilliamsC, ...lossInput } = input;
    const loss = segmentLoss(lossInput);
    const water = waterProperties(input.tempC);
    const hazenWilliamsFrictionKpa =
      hazenWilliamsC === undefined
        ? null
        : hazenWilliamsLossKpa({ flowLps: input.flowLps, internalDiameterMm: input.internalDiameterMm, lengthM: input.lengthM + (input.equivalentLengthM ?? 0), c: hazenWilliamsC, tempC: input.tempC });
    return { ok: true, findings: [], caution: CAUTION, loss, hazenWilliamsFrictionKpa, water: { densityKgM3: water.densityKgM3, kinematicViscosityM2S: water.kinematicViscosityM2S } };
  },
  example: () => structuredClone(EXAMPLES.segment),
  figures: (_input, out) => [
    { key: "velocity", label: "Velocity", value: out.loss.velocityMs, unit: "m/s", digits: 2 },
    { key: "reynolds", label: "Reynolds number", value: out.loss.reynolds, digits: 0 },
    { key: "frictionFactor", label: "Darcy friction factor", value: out.loss.frictionFactor, digits: 4 },
    { key: "friction", label: "Friction loss (Darcy–Weisbach)", value: out.loss.frictionLossKpa, unit: "kPa", digits: 2 },
    { key: "fittings", label: "Fitting loss", value: out.loss.fittingLossKpa, unit: "kPa", digits: 2 },
    { key: "static", label: "Static (rise)", value: out.loss.staticLossKpa, unit: "kPa", digits: 2 },
    { key: "total", label: "Total loss", value: out.loss.totalLossKpa, unit: "kPa", digits: 2 },
    ...(out.hazenWilliamsFrictionKpa === null ? [] : [{ key: "hazenWilliams", label: "Friction loss (Hazen–Williams cross-check)", value: out.hazenWilliamsFrictionKpa, unit: "kPa", digits: 2 }]),
  ],
  method: (input) => [
    ...FLOW_METHOD,
    "Fittings as K·ρv²/2; rise as ρ·g·Δz.",
    ...(input.hazenWilliamsC === undefined ? [] : ["Hazen–Williams (SI form) as an empirical cross-check of the friction loss only: it ignores temperature."]),
  ],
  sources: () => [IAPWS_SOURCE],
};

const discharge: KindDefinition<DischargePipeInput, KindOutput> = {
  kind: "discharge",
  label: "Discharge pipe",
  summary: "TP-valve or expansion-valve discharge: size, run length, enlargement and bends.",
  hasVerdict: true,
  schema: dischargePipeInputSchema as z.ZodType<DischargePipeInput>,
  run: (input) => checkDischargePipe(input),
  example: () => structuredClone(EXAMPLES.discharge),
  figures: (input, out) => [
    { key: "ok", label: "Overall", value: out.ok ? "pass" : "fail", ok: out.ok },
    { key: "length", label: "Run length", value: input.lengthM, unit: "m", digits: 1 },
    { key: "bends", label: "Bends", value: input.bends.length },
  ],
  method: () => ["Rule check of the discharge pipe against the valve connection size, the run length allowed for that size, where any enlargement starts, and each bend's angle or radius."],
  sources: () => ["22 mm up to 4 m, 28 mm up to 9 m from the valve outlet, at most 3 bends each ≤ 45° or radius ≥ 5 D, no elbows: common practice."],
};

const vacuum: KindDefinition<VacuumBreakerInput, KindOutput> = {
  kind: "vacuum",
  label: "Vacuum breakers",
  summary: "Vacuum breakers on the hot and cold sides: fitted, teed in far enough, or on a riser.",
  hasVerdict: true,
  schema: vacuumBreakerInputSchema as z.ZodType<VacuumBreakerInput>,
  run: (input) => checkVacuumBreakers(input),
  example: () => structuredClone(EXAMPLES.vacuum),
  figures: (_input, out) => [{ key: "ok", label: "Overall", value: out.ok ? "pass" : "fail", ok: out.ok }],
  method: () => ["Rule check per side: a vacuum breaker fitted; teed in directly only beyond the minimum distance from the heater, otherwise on a riser."],
  sources: () => ["Tee-in only beyond 700 mm, riser commonly 300 mm: common practice; the heater maker may ask for more."],
};

const valves: KindDefinition<ValveRatingsInput, KindOutput> = {
  kind: "valves",
  label: "Valve ratings",
  summary: "Pressure control and expansion valves against the heater rating, the TP valve, and static pressure.",
  hasVerdict: true,
  schema: valveRatingsInputSchema as z.ZodType<ValveRatingsInput>,
  run: (input) => checkValveRatings(input),
  example: () => structuredClone(EXAMPLES.valves),
  figures: (input, out) => [
    { key: "ok", label: "Overall", value: out.ok ? "pass" : "fail", ok: out.ok },
    { key: "heater", label: "Heater rating", value: input.heaterRatingKpa, unit: "kPa" },
    { key: "static", label: "Static pressure", value: input.staticPressureKpa, unit: "kPa" },
  ],
  method: () => ["Rule check: pressure control and expansion valves at or below the heater rating and a pair of the same rating; the TP valve unchanged; static pressure at most the limit."],
  sources: () => ["Valve pair at or below the heater rating, static pressure ≤ 600 kPa: common practice."],
};

const storage: KindDefinition<StorageInput, StorageOutput> = {
  kind: "storage",
  label: "Storage, heat-up and expansion",
  summary: "Storage against the users' need, heat-up time (m·c·ΔT / P) and the expansion of the stored water.",
  hasVerdict: true,
  schema: storageInputSchema as z.ZodType<StorageInput>,
  run: (input) => {
    const sizing = storageSizing(input.sizing);
    const heating = heatingTime(input.heating);
    const expansion = expansionVolume({ volumeL: input.heating.volumeL, fromC: input.heating.fromC, toC: input.heating.toC });
    return {
      ok: sizing.ok,
      findings: sizing.findings,
      caution: CAUTION,
      sizing: { requiredVolumeL: sizing.requiredVolumeL, recommendedVolumeL: sizing.recommendedVolumeL, basis: sizing.basis },
      heating,
      expansion,
    };
  },
  example: () => structuredClone(EXAMPLES.storage),
  figures: (input, out) => [
    { key: "ok", label: "Overall", value: out.ok ? "pass" : "fail", ok: out.ok },
    { key: "required", label: "Storage needed", value: out.sizing.requiredVolumeL, unit: "L", digits: 0 },
    { key: "recommended", label: "Recommended size", value: out.sizing.recommendedVolumeL, unit: "L", digits: 0 },
    { key: "capacity", label: "Heater capacity", value: input.sizing.volumeL, unit: "L", digits: 0 },
    { key: "hours", label: "Heat-up time", value: out.heating.hours, unit: "h", digits: 2 },
    { key: "energy", label: "Energy to heat", value: out.heating.energyKwh, unit: "kWh", digits: 2 },
    { key: "expansion", label: "Expansion volume", value: out.expansion.litres, unit: "L", digits: 2 },
  ],
  method: () => [
    "Storage needed = occupants × litres per occupant; recommended = the smallest standard size that covers it.",
    "Heat-up time = m · ∫cp dT / (P · efficiency), with cp integrated over the rise (IAPWS-IF97); standing losses ignored, so real times are a little longer.",
    "Expansion = V · (ρ(start) / ρ(final) − 1): the same mass at the lower density.",
  ],
  sources: (_input, out) => [IAPWS_SOURCE, out.sizing.basis],
};

const deadleg: KindDefinition<DeadlegInput, DeadlegOutput> = {
  kind: "deadleg",
  label: "Dead leg and delivery temperature",
  summary: "Standing volume and time to hot water at an outlet, and the temperature delivered there.",
  hasVerdict: true,
  schema: deadlegInputSchema as z.ZodType<DeadlegInput>,
  run: (input) => {
    const leg = checkDeadLeg(input.deadLeg);
    const delivery = checkDeliveryTemperature(input.delivery);
    return {
      ok: leg.ok && delivery.ok,
      findings: [...leg.findings, ...delivery.findings],
      caution: CAUTION,
      deadLeg: { volumeL: leg.volumeL, seconds: leg.seconds },
      delivery: { deliveryC: delivery.deliveryC },
    };
  },
  example: () => structuredClone(EXAMPLES.deadleg),
  figures: (_input, out) => [
    { key: "ok", label: "Overall", value: out.ok ? "pass" : "fail", ok: out.ok },
    { key: "volume", label: "Standing volume", value: out.deadLeg.volumeL, unit: "L", digits: 2 },
    { key: "seconds", label: "Time to hot water", value: out.deadLeg.seconds, unit: "s", digits: 0 },
    { key: "delivery", label: "Delivery temperature", value: out.delivery.deliveryC, unit: "°C", digits: 0 },
  ],
  method: () => [
    "Standing volume = Σ π·d²/4 · L over the runs from the hot supply to the outlet; time to hot = volume / flow (plug flow; heat taken up by a cold pipe ignored, so real waits are longer).",
    "Delivery temperature: the thermostat setting, or a tempering valve's setting where one is fitted, against the maximum delivery temperature set for the project.",
  ],
  sources: () => ["30 s time to hot, 60–65 °C storage: common practice (from memory); the maximum delivery temperature is a project setting to confirm against SANS 10252-1."],
};

export const KIND_DEFINITIONS: Record<CalculationKind, KindDefinition> = { balance, segment, discharge, vacuum, valves, storage, deadleg };

export type RunResult<O = any> = { ok: true; input: any; output: O } | { ok: false; issues: InputIssue[] };

/** Validates with the engine's schema, then runs the engine; every rejection comes back as issues with paths. */
export function runCalculation(kind: CalculationKind, raw: unknown): RunResult {
  const def = KIND_DEFINITIONS[kind];
  const parsed = def.schema.safeParse(raw);
  if (!parsed.success) return { ok: false, issues: fromZod(parsed.error) };
  try {
    return { ok: true, input: parsed.data, output: def.run(parsed.data) };
  } catch (error) {
    if (error instanceof NetworkValidationError) return { ok: false, issues: error.issues.map((i) => ({ path: ["network", ...i.path], message: i.message })) };
    // The engine's guards name the impossible field; the schema normally catches these first.
    if (error instanceof RangeError) return { ok: false, issues: [{ path: [], message: error.message }] };
    throw error;
  }
}
