// What changed between two versions of a request: a word diff of each text field and the measurement rows
// matched by kind and name. Pure: the server computes it, the page shows it.
import { diffWords } from "diff";
import { provisionLabel } from "./provisions";
import { formatMeasurement } from "./measurements";

export interface VersionContent {
  n: number;
  title: string;
  provision: string;
  clauseRef: string;
  siteConstraint: string;
  proposal: string;
  measurements: { kind: string; name: string; value: number; unit: string }[];
}

export interface DiffPart {
  value: string;
  added?: boolean;
  removed?: boolean;
}

export interface FieldChange {
  field: keyof typeof FIELD_LABELS;
  label: string;
  parts: DiffPart[];
}

export interface MeasurementChange {
  change: "added" | "removed" | "changed";
  name: string;
  before?: string;
  after?: string;
}

export interface VersionDiff {
  from: number;
  to: number;
  fields: FieldChange[];
  measurements: MeasurementChange[];
  unchanged: boolean;
}

export const FIELD_LABELS = {
  title: "Title",
  provision: "Provision",
  clauseRef: "Clause reference",
  siteConstraint: "Site constraint",
  proposal: "Proposal",
} as const;

export function diffVersions(before: VersionContent, after: VersionContent): VersionDiff {
  const fields: FieldChange[] = [];
  for (const field of Object.keys(FIELD_LABELS) as (keyof typeof FIELD_LABELS)[]) {
    const a = field === "provision" ? provisionLabel(before.provision) : before[field];
    const b = field === "provision" ? provisionLabel(after.provision) : after[field];
    if (a === b) continue;
    const parts = diffWords(a, b).map((p) => ({ value: p.value, ...(p.added ? { added: true } : {}), ...(p.removed ? { removed: true } : {}) }));
    fields.push({ field, label: FIELD_LABELS[field], parts });
  }
  const key = (m: VersionContent["measurements"][number]) => `${m.kind}\u0000${m.name.trim().toLowerCase()}`;
  const old = new Map(before.measurements.map((m) => [key(m), m]));
  const now = new Map(after.measurements.map((m) => [key(m), m]));
  const measurements: MeasurementChange[] = [];
  for (const [k, m] of now) {
    const was = old.get(k);
    if (!was) measurements.push({ change: "added", name: m.name, after: formatMeasurement(m) });
    else if (was.value !== m.value || was.unit !== m.unit) measurements.push({ change: "changed", name: m.name, before: formatMeasurement(was), after: formatMeasurement(m) });
  }
  for (const [k, m] of old) if (!now.has(k)) measurements.push({ change: "removed", name: m.name, before: formatMeasurement(m) });
  return { from: before.n, to: after.n, fields, measurements, unchanged: !fields.length && !measurements.length };
}
