// Inputs for calculator fields: each has a label, shows the problems at its path right beside it, and keeps what
// was typed (a number field holds its own text, so "2." or a stray letter is never lost while typing).
import { useEffect, useId, useState } from "react";
import { parseNumber, showNumber } from "./paths";

const box =
  "block rounded-md border border-rule bg-sheet px-2 py-1.5 text-sm text-ink focus:border-copper focus:outline-none focus:ring-2 " +
  "focus:ring-copper/30 aria-[invalid=true]:border-fail aria-[invalid=true]:ring-fail/20";

/** Full width unless the caller sets one (table cells do). */
const sized = (className: string) => (/(^|\s)w-/.test(className) ? className : `w-full ${className}`);

const same = (a: number | undefined, b: unknown) => (a === undefined ? b === undefined : Number.isNaN(a) ? typeof b === "number" && Number.isNaN(b) : a === b);

export function NumberInput({ id, value, onChange, label, invalid, className = "", describedBy }: {
  id?: string; value: unknown; onChange: (v: number | undefined) => void; label: string; invalid?: boolean; className?: string; describedBy?: string;
}) {
  const [text, setText] = useState(showNumber(value));
  // Follow changes made elsewhere (a suggestion applied), but not the echo of our own typing.
  useEffect(() => {
    if (!same(parseNumber(text), value)) setText(showNumber(value));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value]);
  return (
    <input
      id={id}
      type="text"
      inputMode="decimal"
      aria-label={label}
      aria-invalid={invalid || undefined}
      aria-describedby={describedBy}
      className={`${box} tabular-nums ${sized(className)}`}
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        onChange(parseNumber(e.target.value));
      }}
    />
  );
}

export function TextInput({ value, onChange, label, invalid, list, className = "" }: {
  value: string | undefined; onChange: (v: string) => void; label: string; invalid?: boolean; list?: string; className?: string;
}) {
  return <input type="text" aria-label={label} aria-invalid={invalid || undefined} list={list} className={`${box} ${sized(className)}`} value={value ?? ""} onChange={(e) => onChange(e.target.value)} />;
}

export function SelectInput({ id, value, onChange, label, options, invalid, className = "" }: {
  id?: string; value: string; onChange: (v: string) => void; label: string; options: readonly { value: string; label: string; group?: string }[]; invalid?: boolean; className?: string;
}) {
  const groups = [...new Set(options.map((o) => o.group ?? ""))];
  const render = (list: typeof options) => list.map((o) => <option key={o.value} value={o.value}>{o.label}</option>);
  return (
    <select id={id} aria-label={label} aria-invalid={invalid || undefined} className={`${box} ${sized(className)}`} value={value} onChange={(e) => onChange(e.target.value)}>
      {groups.length === 1 ? render(options) : groups.map((g) => (g ? <optgroup key={g} label={g}>{render(options.filter((o) => o.group === g))}</optgroup> : render(options.filter((o) => !o.group))))}
    </select>
  );
}

/** A labelled field with its problems beside it. */
export function Field({ label, unit, hint, errors, children }: { label: string; unit?: string; hint?: string; errors?: string[]; children: (id: string, errorId: string) => React.ReactNode }) {
  const id = useId();
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-semibold text-ink">
        {label}
        {unit ? <span className="font-normal text-ink-soft"> ({unit})</span> : null}
      </label>
      {children(id, `${id}-error`)}
      {hint ? <p className="text-xs text-ink-soft">{hint}</p> : null}
      {errors?.length ? <p id={`${id}-error`} className="text-sm font-medium text-fail" aria-live="polite">⚠ {errors.join(" ")}</p> : null}
    </div>
  );
}
