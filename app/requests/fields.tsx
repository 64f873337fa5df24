// Plain labelled fields for the request editor and review desk, with the server's issue shown beside each one.
// (These forms save as you type, so they hold their own values instead of going through a submit cycle.)
import { useId, type ReactNode } from "react";

export const inputClass =
  "mt-1 block w-full rounded-md border border-rule bg-sheet px-3 py-2.5 text-base text-ink focus:border-copper focus:outline-none focus:ring-2 focus:ring-copper/30 aria-[invalid=true]:border-fail";

export type Issues = { path: string; message: string }[] | undefined;

export function issueAt(issues: Issues, path: string) {
  return issues?.find((i) => i.path === path || i.path.startsWith(`${path}.`))?.message;
}

export function Field({ label, hint, error, children }: { label: string; hint?: ReactNode; error?: string; children: (props: { id: string; "aria-invalid"?: boolean; "aria-describedby": string }) => ReactNode }) {
  const id = useId();
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-semibold">{label}</label>
      {children({ id, "aria-invalid": error ? true : undefined, "aria-describedby": `${id}-hint ${id}-error` })}
      {hint ? <p id={`${id}-hint`} className="text-sm text-ink-soft">{hint}</p> : null}
      <p id={`${id}-error`} className="text-sm font-medium text-fail" aria-live="polite">{error ? `⚠ ${error}` : null}</p>
    </div>
  );
}

export function Notice({ tone, children }: { tone: "ok" | "fail" | "info"; children: ReactNode }) {
  const cls = { ok: "border-ok/40 bg-ok/5 text-ok", fail: "border-fail/40 bg-fail/5 text-fail", info: "border-rule bg-paper text-ink" }[tone];
  return <div role={tone === "fail" ? "alert" : "status"} className={`rounded-md border px-4 py-3 text-sm font-medium ${cls}`}>{tone === "fail" ? "⚠ " : tone === "ok" ? "✓ " : ""}{children}</div>;
}
