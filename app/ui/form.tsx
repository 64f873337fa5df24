// Form building blocks: every field has a visible label, a hint, and its error right beside it (announced).
import { getInputProps, getSelectProps, getTextareaProps, type FieldMetadata } from "@conform-to/react";
import type { ReactNode } from "react";

const inputClass =
  "mt-1 block w-full rounded-md border border-rule bg-sheet px-3 py-2.5 text-base text-ink shadow-inner shadow-black/[0.02] " +
  "placeholder:text-ink-soft/60 focus:border-copper focus:outline-none focus:ring-2 focus:ring-copper/30 " +
  "aria-[invalid=true]:border-fail aria-[invalid=true]:ring-fail/20";

interface FieldShellProps {
  label: string;
  hint?: ReactNode;
  errorId: string;
  hintId: string;
  errors?: string[];
  htmlFor: string;
  children: ReactNode;
}

function FieldShell({ label, hint, errors, errorId, hintId, htmlFor, children }: FieldShellProps) {
  return (
    <div className="space-y-1">
      <label htmlFor={htmlFor} className="block text-sm font-semibold text-ink">{label}</label>
      {children}
      {hint ? <p id={hintId} className="text-sm text-ink-soft">{hint}</p> : null}
      <p id={errorId} className="min-h-0 text-sm font-medium text-fail" aria-live="polite">
        {errors?.length ? <span>⚠ {errors.join(" ")}</span> : null}
      </p>
    </div>
  );
}

type Meta = FieldMetadata<string | undefined>;

export function TextField({ meta, label, hint, type = "text", ...rest }: {
  meta: Meta; label: string; hint?: ReactNode; type?: "text" | "email" | "password" | "tel" | "search";
  autoComplete?: string; placeholder?: string; autoFocus?: boolean;
}) {
  return (
    <FieldShell label={label} hint={hint} errors={meta.errors} errorId={meta.errorId} hintId={meta.descriptionId} htmlFor={meta.id}>
      <input {...getInputProps(meta, { type, ariaDescribedBy: hint ? meta.descriptionId : undefined })} key={meta.key} className={inputClass} {...rest} />
    </FieldShell>
  );
}

export function TextArea({ meta, label, hint, rows = 4 }: { meta: Meta; label: string; hint?: ReactNode; rows?: number }) {
  return (
    <FieldShell label={label} hint={hint} errors={meta.errors} errorId={meta.errorId} hintId={meta.descriptionId} htmlFor={meta.id}>
      <textarea {...getTextareaProps(meta, { ariaDescribedBy: hint ? meta.descriptionId : undefined })} key={meta.key} rows={rows} className={inputClass} />
    </FieldShell>
  );
}

export function SelectField({ meta, label, hint, options, placeholder }: {
  meta: Meta; label: string; hint?: ReactNode; options: readonly { value: string; label: string }[]; placeholder?: string;
}) {
  return (
    <FieldShell label={label} hint={hint} errors={meta.errors} errorId={meta.errorId} hintId={meta.descriptionId} htmlFor={meta.id}>
      <select {...getSelectProps(meta, { ariaDescribedBy: hint ? meta.descriptionId : undefined })} key={meta.key} className={inputClass}>
        {placeholder ? <option value="">{placeholder}</option> : null}
        {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </select>
    </FieldShell>
  );
}

export function FormErrors({ errors, id }: { errors?: string[]; id?: string }) {
  if (!errors?.length) return null;
  return (
    <div id={id} role="alert" className="rounded-md border border-fail/40 bg-fail/5 px-4 py-3 text-sm font-medium text-fail">
      {errors.map((e) => <p key={e}>⚠ {e}</p>)}
    </div>
  );
}
