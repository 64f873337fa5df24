// Owns the zod schemas for the engine's inputs, so the app's forms and API reject impossible input with a
// message beside the field (negative lengths, a PRV set above its supply, a rise longer than the pipe) before
// the engine is called. The engine still checks for itself; these exist for human messages and field paths.

import { z } from "zod";
import { FIXTURE_DEMAND, type FixtureType } from "./demand";
import { WATER_TEMPERATURE_RANGE_C } from "./water";

const { min: T_MIN, max: T_MAX } = WATER_TEMPERATURE_RANGE_C;

const num = (label: string) => z.number({ error: `${label} must be a number` });
const nonNegative = (label: string) => num(label).min(0, `${label} cannot be negative`);
const positive = (label: string) => num(label).positive(`${label} must be greater than zero`);
const length = (label = "Length") => nonNegative(label).max(100_000, `${label} is implausibly long`);
const pressureKpa = (label: string) =>
  positive(label).max(10_000, `${label} above 10 000 kPa is outside building water supply`);
const waterTempC = (label: string) =>
  num(label).min(T_MIN, `${label} must be at least ${T_MIN} °C`).max(T_MAX, `${label} must be at most ${T_MAX} °C for liquid water here`);
const id = (label: string) => z.string({ error: `${label} is required` }).min(1, `${label} is required`);

const fixtureTypes = Object.keys(FIXTURE_DEMAND) as [FixtureType, ...FixtureType[]];
export const fixtureTypeSchema = z.enum(fixtureTypes, { error: "Unknown fixture type" });

export const segmentLossInputSchema = z
  .object({
    flowLps: nonNegative("Flow"),
    internalDiameterMm: positive("Internal diameter"),
    lengthM: length(),
    roughnessMm: nonNegative("Roughness"),
    tempC: waterTempC("Water temperature"),
    kTotal: nonNegative("Loss coefficient K").optional(),
    equivalentLengthM: length("Equivalent length").optional(),
    riseM: num("Rise").optional(),
  })
  .superRefine((v, ctx) => {
    if (v.riseM !== undefined && Math.abs(v.riseM) > v.lengthM) {
      ctx.addIssue({ code: "custom", path: ["riseM"], message: `A pipe ${v.lengthM} m long cannot rise or fall ${Math.abs(v.riseM)} m` });
    }
    if (v.roughnessMm > v.internalDiameterMm * 0.1) {
      ctx.addIssue({ code: "custom", path: ["roughnessMm"], message: "Roughness cannot be more than a tenth of the bore" });
    }
  });

export const hazenWilliamsInputSchema = z.object({
  flowLps: nonNegative("Flow"),
  internalDiameterMm: positive("Internal diameter"),
  lengthM: length(),
  c: positive("Hazen–Williams C").max(200, "Hazen–Williams C above 200 is not a real pipe"),
  tempC: waterTempC("Water temperature").optional(),
});

export const designFlowInputSchema = z.object({
  fixtures: z.array(z.object({ fixture: fixtureTypeSchema, count: nonNegative("Count").int("Count must be a whole number") })).optional(),
  loadingUnits: z.array(nonNegative("Loading units")).optional(),
  statedFlowsLps: z.array(nonNegative("Flow")).optional(),
});

export const pipeSpecSchema = z
  .object({
    id: id("Pipe id"),
    series: id("Series"),
    material: id("Material"),
    label: id("Label"),
    outsideDiameterMm: positive("Outside diameter"),
    wallThicknessMm: positive("Wall thickness"),
    internalDiameterMm: positive("Internal diameter").optional(),
    roughnessMm: nonNegative("Roughness"),
    hazenWilliamsC: positive("Hazen–Williams C"),
    source: id("Source"),
  })
  .superRefine((p, ctx) => {
    const bore = p.internalDiameterMm ?? p.outsideDiameterMm - 2 * p.wallThicknessMm;
    if (!(bore > 0)) {
      ctx.addIssue({ code: "custom", path: ["wallThicknessMm"], message: `A ${p.wallThicknessMm} mm wall leaves no bore in a ${p.outsideDiameterMm} mm pipe` });
    } else if (bore >= p.outsideDiameterMm) {
      ctx.addIssue({ code: "custom", path: ["internalDiameterMm"], message: "The internal diameter must be smaller than the outside diameter" });
    }
  });

const prvSchema = z.object({
  id: z.string().optional(),
  nodeId: id("PRV node"),
  settingKpa: pressureKpa("PRV setting"),
});

const segmentSchema = z.object({
  id: id("Segment id"),
  fromNodeId: id("From node"),
  toNodeId: id("To node"),
  service: z.enum(["hot", "cold"], { error: "Mark the segment hot or cold" }),
  lengthM: length(),
  pipeId: z.string().min(1).optional(),
  internalDiameterMm: positive("Internal diameter").optional(),
  roughnessMm: nonNegative("Roughness").optional(),
  fittings: z.array(z.object({ fittingId: id("Fitting"), count: nonNegative("Fitting count") })).optional(),
  kTotal: nonNegative("Loss coefficient K").optional(),
  equivalentLengthM: length("Equivalent length").optional(),
  riseM: num("Rise").optional(),
  tempC: waterTempC("Water temperature").optional(),
});

const outletSchema = z.object({
  id: id("Outlet id"),
  nodeId: id("Outlet node"),
  flowLps: nonNegative("Flow").optional(),
  loadingUnits: nonNegative("Loading units").optional(),
  fixture: fixtureTypeSchema.optional(),
  label: z.string().optional(),
});

export const balanceNetworkSchema = z
  .object({
    supply: z.object({
      nodeId: id("Supply node"),
      staticPressureKpa: pressureKpa("Supply static pressure"),
      dynamicPressureKpa: pressureKpa("Supply pressure under flow").optional(),
      prv: prvSchema.optional(),
    }),
    heater: z
      .object({
        nodeId: id("Heater node"),
        pressureLossKpa: nonNegative("Heater pressure loss"),
        ratedFlowLps: positive("Heater rated flow").optional(),
      })
      .optional(),
    segments: z.array(segmentSchema).min(1, "The network needs at least one segment"),
    outlets: z.array(outletSchema),
    mixingPoints: z.array(z.object({ id: id("Mixing point id"), hotOutletId: id("Hot outlet"), coldOutletId: id("Cold outlet"), label: z.string().optional() })),
    prvs: z.array(prvSchema).optional(),
    hotTempC: waterTempC("Hot water temperature").optional(),
    coldTempC: waterTempC("Cold water temperature").optional(),
  })
  .superRefine((net, ctx) => {
    const supplyKpa = net.supply.staticPressureKpa;
    if (net.supply.dynamicPressureKpa !== undefined && net.supply.dynamicPressureKpa > supplyKpa) {
      ctx.addIssue({
        code: "custom",
        path: ["supply", "dynamicPressureKpa"],
        message: `The pressure under flow (${net.supply.dynamicPressureKpa} kPa) cannot exceed the static pressure (${supplyKpa} kPa)`,
      });
    }
    const prvAbove = (prv: { settingKpa: number } | undefined, path: (string | number)[]) => {
      if (prv && prv.settingKpa > supplyKpa) {
        ctx.addIssue({
          code: "custom",
          path: [...path, "settingKpa"],
          message: `A PRV cannot be set to ${prv.settingKpa} kPa, above the ${supplyKpa} kPa supply: it can only reduce pressure`,
        });
      }
    };
    prvAbove(net.supply.prv, ["supply", "prv"]);
    net.prvs?.forEach((prv, i) => prvAbove(prv, ["prvs", i]));
    net.segments.forEach((s, i) => {
      if (s.riseM !== undefined && Math.abs(s.riseM) > s.lengthM) {
        ctx.addIssue({ code: "custom", path: ["segments", i, "riseM"], message: `A pipe ${s.lengthM} m long cannot rise or fall ${Math.abs(s.riseM)} m` });
      }
      if ((s.pipeId === undefined) === (s.internalDiameterMm === undefined)) {
        ctx.addIssue({ code: "custom", path: ["segments", i, "pipeId"], message: "Choose a catalogue pipe or give an internal diameter (one, not both)" });
      }
      if (s.fromNodeId === s.toNodeId) {
        ctx.addIssue({ code: "custom", path: ["segments", i, "toNodeId"], message: "A segment must end at a different node from where it starts" });
      }
    });
    net.outlets.forEach((o, i) => {
      if (o.flowLps === undefined && o.loadingUnits === undefined && o.fixture === undefined) {
        ctx.addIssue({ code: "custom", path: ["outlets", i, "flowLps"], message: "Give a flow, loading units or a fixture type" });
      }
    });
  });

export const balanceOptionsSchema = z.object({
  balanceLimitPercent: positive("Balance limit").max(100, "A balance limit above 100 % means nothing").optional(),
  maxVelocityMs: positive("Velocity limit").max(10, "A velocity limit above 10 m/s is not credible for building water").optional(),
  maxStaticPressureKpa: pressureKpa("Static pressure limit").optional(),
  fittingMethod: z.enum(["k", "equivalentLength"]).optional(),
  pipeCatalogue: z.array(pipeSpecSchema).optional(),
  suggest: z.boolean().optional(),
  maxSuggestionSteps: positive("Suggestion steps").int().max(10_000).optional(),
  includeProfiles: z.boolean().optional(),
});

export const dischargePipeInputSchema = z.object({
  valve: z.enum(["tp", "expansion"], { error: "The valve must be a TP valve or an expansion valve" }),
  valveConnectionMm: positive("Valve connection"),
  pipeDiameterMm: positive("Pipe diameter"),
  lengthM: length("Discharge length"),
  bends: z.array(
    z.object({
      angleDeg: positive("Bend angle").max(180, "A bend cannot turn more than 180°"),
      centreLineRadiusMm: positive("Bend radius").optional(),
    }),
  ),
  elbows: nonNegative("Number of elbows").int("Number of elbows must be a whole number"),
  enlargedFromValveOutlet: z.boolean(),
});

const vacuumSideSchema = z.object({
  fitted: z.boolean(),
  distanceFromOutletMm: nonNegative("Distance from the heater").optional(),
  onRiser: z.boolean(),
  riserHeightMm: nonNegative("Riser height").optional(),
});
export const vacuumBreakerInputSchema = z.object({ hot: vacuumSideSchema, cold: vacuumSideSchema });

export const valveRatingsInputSchema = z.object({
  heaterRatingKpa: pressureKpa("Heater rating"),
  pressureControlValveKpa: pressureKpa("Pressure control valve rating"),
  expansionValveKpa: pressureKpa("Expansion valve rating"),
  tpValveChanged: z.boolean().optional(),
  staticPressureKpa: pressureKpa("Static pressure"),
});

export const staticPressureInputSchema = z.object({
  staticPressureKpa: pressureKpa("Static pressure"),
  limitKpa: pressureKpa("Limit").optional(),
});

const temperatureRise = <T extends { fromC: number; toC: number }>(v: T, ctx: z.RefinementCtx) => {
  if (v.toC < v.fromC) {
    ctx.addIssue({ code: "custom", path: ["toC"], message: `The final temperature (${v.toC} °C) cannot be below the starting one (${v.fromC} °C)` });
  }
};

export const heatingTimeInputSchema = z
  .object({
    volumeL: nonNegative("Volume"),
    fromC: waterTempC("Starting temperature"),
    toC: waterTempC("Final temperature"),
    powerKw: positive("Element power"),
    efficiency: positive("Efficiency").max(1, "Efficiency cannot exceed 1").optional(),
  })
  .superRefine(temperatureRise);

export const expansionVolumeInputSchema = z
  .object({
    volumeL: nonNegative("Volume"),
    fromC: waterTempC("Starting temperature"),
    toC: waterTempC("Final temperature"),
  })
  .superRefine(temperatureRise);

export const storageSizingInputSchema = z.object({
  occupants: positive("Occupants"),
  litresPerPersonPerDay: positive("Litres per person").optional(),
  volumeL: positive("Heater capacity"),
  excessRatio: num("Excess ratio").min(1, "The excess ratio must be at least 1").optional(),
  standardSizesL: z.array(positive("Standard size")).optional(),
});

export const timeToHotInputSchema = z.object({
  internalDiameterMm: positive("Internal diameter"),
  lengthM: length(),
  flowLps: positive("Flow"),
});

export const deadLegInputSchema = z.object({
  legs: z.array(z.object({ internalDiameterMm: positive("Internal diameter"), lengthM: length() })).min(1, "Give at least one pipe run"),
  flowLps: positive("Flow"),
  maxSeconds: positive("Time limit").optional(),
  maxVolumeL: positive("Volume limit").optional(),
});

const celsius = (label: string) => num(label).gt(0, `${label} must be above 0 °C`).lt(100, `${label} must be below 100 °C`);
export const deliveryTemperatureInputSchema = z
  .object({
    thermostatC: celsius("Thermostat setting"),
    maxDeliveryC: celsius("Maximum delivery temperature"),
    temperingValve: z.object({ fitted: z.boolean(), setC: celsius("Tempering valve setting").optional() }).optional(),
    minStorageC: celsius("Minimum storage temperature").optional(),
    maxStorageC: celsius("Maximum storage temperature").optional(),
  })
  .superRefine((v, ctx) => {
    if (v.minStorageC !== undefined && v.maxStorageC !== undefined && v.minStorageC > v.maxStorageC) {
      ctx.addIssue({ code: "custom", path: ["minStorageC"], message: "The minimum storage temperature cannot be above the maximum" });
    }
  });
