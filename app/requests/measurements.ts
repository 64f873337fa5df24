// What a site plumber measures, as typed rows: each kind carries its SI unit in its name (lengthM, pressureKpa),
// so a calculator can later be prefilled from a request without guessing units.
import { z } from "zod";

export const MEASUREMENT_KINDS = [
  { id: "staticPressureKpa", label: "Static pressure", unit: "kPa" },
  { id: "heaterRatingKpa", label: "Heater pressure rating", unit: "kPa" },
  { id: "valveRatingKpa", label: "Valve rating", unit: "kPa" },
  { id: "lengthM", label: "Length", unit: "m" },
  { id: "heightM", label: "Height difference", unit: "m" },
  { id: "pipeSizeMm", label: "Pipe size", unit: "mm" },
  { id: "distanceMm", label: "Distance", unit: "mm" },
  { id: "volumeL", label: "Volume", unit: "L" },
  { id: "flowLps", label: "Flow", unit: "L/s" },
  { id: "temperatureC", label: "Temperature", unit: "°C" },
  { id: "powerKw", label: "Element rating", unit: "kW" },
  { id: "bendCount", label: "Number of bends", unit: "bends" },
  { id: "angleDeg", label: "Bend angle", unit: "°" },
] as const;

export type MeasurementKind = (typeof MEASUREMENT_KINDS)[number]["id"];
const KIND_IDS = MEASUREMENT_KINDS.map((k) => k.id) as [MeasurementKind, ...MeasurementKind[]];

export function unitOf(kind: string) {
  return MEASUREMENT_KINDS.find((k) => k.id === kind)?.unit ?? "";
}

export function kindLabel(kind: string) {
  return MEASUREMENT_KINDS.find((k) => k.id === kind)?.label ?? kind;
}

export const measurementSchema = z
  .object({
    kind: z.enum(KIND_IDS, { error: "Choose what was measured." }),
    name: z.string().trim().max(120, "Keep the name under 120 characters.").default(""),
    value: z.coerce.number({ error: "Enter a number." }).refine(Number.isFinite, "Enter a number.").refine((v) => Math.abs(v) < 1e7, "That number is out of range."),
  })
  .transform((m) => ({ ...m, name: m.name || kindLabel(m.kind), unit: unitOf(m.kind) }));

export type MeasurementRow = z.output<typeof measurementSchema>;

export function formatMeasurement(m: { value: number; unit: string }) {
  // A decimal point, not the locale's comma: technical values read the same on every screen and in every mail.
  return `${Math.round(m.value * 1000) / 1000} ${m.unit}`;
}
