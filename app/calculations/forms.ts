// Owns what each simple calculator asks for: sections of fields by input path, with labels and units in the
// trade's words. The balance calculator has its own network editor instead.
import type { IssuePath } from "./issues";
import type { CalculationKind } from "./kinds";

export type FieldSpec =
  | { type: "number"; path: IssuePath; label: string; unit?: string; hint?: string }
  | { type: "boolean"; path: IssuePath; label: string }
  | { type: "choice"; path: IssuePath; label: string; options: { value: string | boolean | undefined; label: string }[] }
  | { type: "list"; path: IssuePath; label: string; itemLabel: string; fields: FieldSpec[]; newItem: () => object; addLabel: string };

export interface SectionSpec {
  title: string;
  fields: FieldSpec[];
}

const n = (path: IssuePath, label: string, unit?: string, hint?: string): FieldSpec => ({ type: "number", path, label, unit, hint });
const b = (path: IssuePath, label: string): FieldSpec => ({ type: "boolean", path, label });

const vacuumSide = (side: "hot" | "cold"): SectionSpec => ({
  title: side === "hot" ? "Hot side" : "Cold side",
  fields: [
    b([side, "fitted"], "Vacuum breaker fitted"),
    n([side, "distanceFromOutletMm"], "Distance from the heater connection", "mm", "Leave blank if not known."),
    b([side, "onRiser"], "Stands on a riser"),
    n([side, "riserHeightMm"], "Riser height", "mm"),
  ],
});

export const FORMS: Record<Exclude<CalculationKind, "balance">, SectionSpec[]> = {
  segment: [
    {
      title: "Pipe and flow",
      fields: [
        n(["flowLps"], "Design flow", "L/s"),
        n(["internalDiameterMm"], "Internal diameter", "mm"),
        n(["lengthM"], "Length", "m"),
        n(["roughnessMm"], "Roughness", "mm", "Drawn copper about 0.0015 mm; plastics about 0.007 mm."),
        n(["tempC"], "Water temperature", "°C"),
      ],
    },
    {
      title: "Fittings, rise and cross-check",
      fields: [
        n(["kTotal"], "Sum of fitting loss coefficients K"),
        n(["equivalentLengthM"], "Extra equivalent length", "m"),
        n(["riseM"], "Rise from inlet to outlet", "m", "Negative for a fall."),
        n(["hazenWilliamsC"], "Hazen–Williams C (cross-check)", undefined, "Leave blank to skip the cross-check."),
      ],
    },
  ],
  discharge: [
    {
      title: "Valve and pipe",
      fields: [
        { type: "choice", path: ["valve"], label: "Valve", options: [{ value: "tp", label: "TP valve" }, { value: "expansion", label: "Expansion valve" }] },
        n(["valveConnectionMm"], "Valve connection", "mm"),
        n(["pipeDiameterMm"], "Discharge pipe diameter", "mm"),
        n(["lengthM"], "Run length", "m"),
        b(["enlargedFromValveOutlet"], "Any enlargement starts at the valve outlet"),
        n(["elbows"], "Elbows in the run"),
      ],
    },
    {
      title: "Bends",
      fields: [
        {
          type: "list",
          path: ["bends"],
          label: "Bends",
          itemLabel: "Bend",
          addLabel: "Add a bend",
          newItem: () => ({ angleDeg: 45 }),
          fields: [n(["angleDeg"], "Angle", "°"), n(["centreLineRadiusMm"], "Centre-line radius", "mm")],
        },
      ],
    },
  ],
  vacuum: [vacuumSide("hot"), vacuumSide("cold")],
  valves: [
    {
      title: "Ratings",
      fields: [
        n(["heaterRatingKpa"], "Heater rating", "kPa"),
        n(["pressureControlValveKpa"], "Pressure control valve", "kPa"),
        n(["expansionValveKpa"], "Expansion valve", "kPa"),
        n(["staticPressureKpa"], "System static pressure", "kPa"),
        {
          type: "choice",
          path: ["tpValveChanged"],
          label: "TP valve",
          options: [
            { value: false, label: "The heater's own, unchanged" },
            { value: true, label: "Changed in rating or type" },
            { value: undefined, label: "Not yet confirmed" },
          ],
        },
      ],
    },
  ],
  storage: [
    {
      title: "Storage",
      fields: [
        n(["sizing", "occupants"], "Occupants"),
        n(["sizing", "litresPerPersonPerDay"], "Hot water per occupant", "L"),
        n(["sizing", "volumeL"], "Heater capacity", "L"),
        n(["sizing", "excessRatio"], "Excessive above", "× need", "Default 1.5."),
      ],
    },
    {
      title: "Heat-up and expansion",
      fields: [
        n(["heating", "volumeL"], "Volume heated", "L"),
        n(["heating", "fromC"], "Starting temperature", "°C"),
        n(["heating", "toC"], "Final temperature", "°C"),
        n(["heating", "powerKw"], "Element power", "kW"),
        n(["heating", "efficiency"], "Efficiency", "0–1"),
      ],
    },
  ],
  deadleg: [
    {
      title: "Pipe runs to the outlet",
      fields: [
        {
          type: "list",
          path: ["deadLeg", "legs"],
          label: "Runs",
          itemLabel: "Run",
          addLabel: "Add a run",
          newItem: () => ({ internalDiameterMm: 13.6, lengthM: 1 }),
          fields: [n(["internalDiameterMm"], "Internal diameter", "mm"), n(["lengthM"], "Length", "m")],
        },
        n(["deadLeg", "flowLps"], "Flow at the outlet", "L/s"),
        n(["deadLeg", "maxSeconds"], "Time to hot limit", "s"),
        n(["deadLeg", "maxVolumeL"], "Standing volume limit", "L", "Optional."),
      ],
    },
    {
      title: "Delivery temperature",
      fields: [
        n(["delivery", "thermostatC"], "Thermostat setting", "°C"),
        n(["delivery", "maxDeliveryC"], "Maximum delivery temperature", "°C", "A project setting: confirm the figure against SANS 10252-1."),
        b(["delivery", "temperingValve", "fitted"], "Tempering valve fitted"),
        n(["delivery", "temperingValve", "setC"], "Tempering valve setting", "°C"),
      ],
    },
  ],
};

/** The label of the field at a path, for naming a problem in the summary. */
export function labelFor(kind: Exclude<CalculationKind, "balance">, path: IssuePath): string | undefined {
  for (const section of FORMS[kind]) {
    for (const f of section.fields) {
      if (f.type === "list" && f.path.every((p, i) => path[i] === p)) {
        const index = path[f.path.length];
        const inner = f.fields.find((g) => g.path.every((p, i) => path[f.path.length + 1 + i] === p));
        return typeof index === "number" ? `${f.itemLabel} ${index + 1}${inner ? `, ${inner.label.toLowerCase()}` : ""}` : f.label;
      }
      if (f.path.length === path.length && f.path.every((p, i) => path[i] === p)) return f.label;
    }
  }
  return undefined;
}
