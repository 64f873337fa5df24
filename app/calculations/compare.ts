// Owns the side-by-side comparison of two saved calculations of one kind: every input (flattened to a readable
// path, list items keyed by their id so reordering is not a difference) and every key figure, each row marked
// same, changed, added or removed.
import { formatFigure } from "./format";
import { KIND_DEFINITIONS, type CalculationKind } from "./kinds";

export type RowState = "same" | "changed" | "added" | "removed";
export interface CompareRow {
  key: string;
  label: string;
  a: string | null;
  b: string | null;
  state: RowState;
}
export interface Comparison {
  inputs: CompareRow[];
  figures: CompareRow[];
  changedInputs: number;
  changedFigures: number;
}

interface Side {
  kind: CalculationKind;
  inputs: unknown;
  outputs: unknown;
}

/** Leaves of a JSON value by path; array items with an `id` are keyed by it. */
export function flatten(value: unknown, prefix = "", out = new Map<string, string>()): Map<string, string> {
  if (Array.isArray(value)) {
    if (value.length === 0) out.set(prefix, "none");
    value.forEach((item, i) => {
      const id = item && typeof item === "object" && "id" in item && typeof item.id === "string" ? item.id : String(i + 1);
      flatten(item, `${prefix}[${id}]`, out);
    });
  } else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  } else if (value !== undefined) {
    out.set(prefix, value === null ? "—" : String(value));
  }
  return out;
}

function rows(a: Map<string, { label: string; text: string }>, b: Map<string, { label: string; text: string }>): CompareRow[] {
  const keys = [...a.keys(), ...[...b.keys()].filter((k) => !a.has(k))];
  return keys.map((key) => {
    const x = a.get(key);
    const y = b.get(key);
    const state: RowState = !x ? "added" : !y ? "removed" : x.text === y.text ? "same" : "changed";
    return { key, label: (x ?? y)!.label, a: x?.text ?? null, b: y?.text ?? null, state };
  });
}

export function compare(a: Side, b: Side): Comparison {
  if (a.kind !== b.kind) throw new RangeError(`Only calculations of the same kind can be compared (${a.kind} and ${b.kind})`);
  const def = KIND_DEFINITIONS[a.kind];
  const inputsOf = (s: Side) => new Map([...flatten(s.inputs)].map(([k, v]) => [k, { label: k, text: v }]));
  const figuresOf = (s: Side) => new Map(def.figures(s.inputs, s.outputs).map((f) => [f.key, { label: f.label, text: formatFigure(f) }]));
  const inputs = rows(inputsOf(a), inputsOf(b));
  const figures = rows(figuresOf(a), figuresOf(b));
  const changed = (list: CompareRow[]) => list.filter((r) => r.state !== "same").length;
  return { inputs, figures, changedInputs: changed(inputs), changedFigures: changed(figures) };
}
