// The measurement rows of the editor: what was measured (its kind fixes the SI unit), a name, and the value.
import { useState } from "react";
import { Button } from "~/ui/button";
import { inputClass, issueAt, type Issues } from "./fields";
import { MEASUREMENT_KINDS, unitOf } from "./measurements";

interface Row {
  key: string;
  kind: string;
  name: string;
  value: string;
}

let seq = 0;
const blank = (): Row => ({ key: `m${seq++}`, kind: "lengthM", name: "", value: "" });

export function MeasurementRows({ initial, issues, disabled, onRowsChanged }: { initial: { kind: string; name: string; value: number }[]; issues: Issues; disabled?: boolean; onRowsChanged?: () => void }) {
  const [rows, setRows] = useState<Row[]>(() => initial.map((m) => ({ key: `m${seq++}`, kind: m.kind, name: m.name, value: String(m.value) })));
  const update = (key: string, patch: Partial<Row>) => setRows((all) => all.map((r) => (r.key === key ? { ...r, ...patch } : r)));
  return (
    <fieldset className="space-y-3" disabled={disabled}>
      <legend className="text-sm font-semibold">Measurements</legend>
      <p className="text-sm text-ink-soft">What you measured on site, in SI units. The engineer's calculators can start from these.</p>
      {rows.length === 0 ? <p className="text-sm text-ink-soft">No measurements yet.</p> : null}
      <ul className="space-y-3">
        {rows.map((r, i) => {
          const error = issueAt(issues, `measurements.${i}`);
          return (
            <li key={r.key} className="grid grid-cols-2 gap-2 rounded-md border border-rule p-3 sm:grid-cols-[12rem_1fr_8rem_auto]" data-testid="measurement-row">
              <label className="text-xs font-semibold">
                Measured
                <select name={`measurements[${i}].kind`} value={r.kind} onChange={(e) => update(r.key, { kind: e.target.value })} className={inputClass}>
                  {MEASUREMENT_KINDS.map((k) => <option key={k.id} value={k.id}>{k.label} ({k.unit})</option>)}
                </select>
              </label>
              <label className="text-xs font-semibold">
                Name
                <input name={`measurements[${i}].name`} value={r.name} onChange={(e) => update(r.key, { name: e.target.value })} placeholder="e.g. Discharge run, unit 5" className={inputClass} />
              </label>
              <label className="text-xs font-semibold">
                Value ({unitOf(r.kind)})
                <input name={`measurements[${i}].value`} value={r.value} onChange={(e) => update(r.key, { value: e.target.value })} inputMode="decimal" className={inputClass} aria-invalid={error ? true : undefined} />
              </label>
              <div className="flex items-end">
                <Button type="button" variant="quiet" className="px-3 py-2" onClick={() => { setRows((all) => all.filter((x) => x.key !== r.key)); setTimeout(() => onRowsChanged?.(), 0); }}>Remove<span className="sr-only"> measurement {i + 1}</span></Button>
              </div>
              {error ? <p className="col-span-full text-sm font-medium text-fail">⚠ {error}</p> : null}
            </li>
          );
        })}
      </ul>
      <Button type="button" variant="quiet" onClick={() => setRows((all) => [...all, blank()])}>Add a measurement</Button>
    </fieldset>
  );
}
