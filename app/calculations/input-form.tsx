// Renders a simple calculator's input form from its spec: every field bound to its input path, with the
// engine's problems for that path beside it.
import { Button } from "~/ui/button";
import { Field, NumberInput, SelectInput } from "./fields";
import type { FieldSpec, SectionSpec } from "./forms";
import { pathKey, type InputIssue, type IssuePath } from "./issues";
import { getIn, setIn } from "./paths";

interface Props {
  sections: SectionSpec[];
  value: unknown;
  onChange: (next: any) => void;
  errors: Map<string, string[]>;
}

function FieldView({ spec, base, value, onChange, errors }: { spec: FieldSpec; base: IssuePath; value: unknown; onChange: Props["onChange"]; errors: Props["errors"] }) {
  const path = [...base, ...spec.path];
  const current = getIn(value, path);
  const set = (v: unknown) => onChange(setIn(value, path, v));
  const errs = errors.get(pathKey(path));
  if (spec.type === "number") {
    return (
      <Field label={spec.label} unit={spec.unit} hint={spec.hint} errors={errs}>
        {(id, errorId) => <NumberInput id={id} label={spec.label} value={current} onChange={set} invalid={!!errs} describedBy={errs ? errorId : undefined} />}
      </Field>
    );
  }
  if (spec.type === "boolean") {
    return (
      <div>
        <label className="flex items-center gap-2 text-sm font-semibold">
          <input type="checkbox" className="size-4 accent-copper" checked={current === true} onChange={(e) => set(e.target.checked)} />
          {spec.label}
        </label>
        {errs ? <p className="text-sm font-medium text-fail">⚠ {errs.join(" ")}</p> : null}
      </div>
    );
  }
  if (spec.type === "choice") {
    const options = spec.options.map((o) => ({ value: String(o.value ?? ""), label: o.label }));
    return (
      <Field label={spec.label} errors={errs}>
        {(id) => <SelectInput id={id} label={spec.label} value={String(current ?? "")} options={options} onChange={(v) => set(spec.options.find((o) => String(o.value ?? "") === v)?.value)} invalid={!!errs} />}
      </Field>
    );
  }
  const items = (Array.isArray(current) ? current : []) as unknown[];
  return (
    <fieldset className="space-y-3">
      <legend className="text-sm font-semibold">{spec.label}</legend>
      {errs ? <p className="text-sm font-medium text-fail">⚠ {errs.join(" ")}</p> : null}
      {items.length === 0 ? <p className="text-sm text-ink-soft">None.</p> : null}
      {items.map((_, i) => (
        <div key={i} className="flex flex-wrap items-end gap-3 rounded-md border border-rule/70 p-3">
          <span className="text-sm font-semibold text-ink-soft">{spec.itemLabel} {i + 1}</span>
          {spec.fields.map((f) => (
            <div key={pathKey(f.path)} className="w-40">
              <FieldView spec={f} base={[...path, i]} value={value} onChange={onChange} errors={errors} />
            </div>
          ))}
          <Button type="button" variant="quiet" className="px-2 py-1.5" onClick={() => set(items.filter((_, k) => k !== i))}>Remove</Button>
        </div>
      ))}
      <Button type="button" variant="quiet" onClick={() => set([...items, spec.newItem()])}>{spec.addLabel}</Button>
    </fieldset>
  );
}

export function InputForm({ sections, value, onChange, errors }: Props) {
  return (
    <div className="grid gap-6 md:grid-cols-2">
      {sections.map((s) => (
        <fieldset key={s.title} className="space-y-4">
          <legend className="mb-2 text-base font-bold">{s.title}</legend>
          {s.fields.map((f) => <FieldView key={pathKey(f.path)} spec={f} base={[]} value={value} onChange={onChange} errors={errors} />)}
        </fieldset>
      ))}
    </div>
  );
}

export type { InputIssue };
