// Small pieces every calculator view shares: verdicts and severities as a word with an icon (never colour
// alone), the findings list, the figures table, the list of input problems, and the engine's caution.
import type { Finding } from "~/engineering";
import { AlertIcon, CheckIcon } from "~/ui/icons";
import { formatFigure } from "./format";
import type { InputIssue } from "./issues";
import type { Figure } from "./kinds";

export function VerdictBadge({ ok, passLabel = "Pass", failLabel = "Fail" }: { ok: boolean; passLabel?: string; failLabel?: string }) {
  return (
    <span data-verdict={ok ? "pass" : "fail"} className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border bg-sheet px-2 py-0.5 text-xs font-bold uppercase tracking-wide ${ok ? "border-ok/40 text-ok" : "border-fail/40 text-fail"}`}>
      {ok ? <CheckIcon /> : <AlertIcon />}
      {ok ? passLabel : failLabel}
    </span>
  );
}

const SEVERITY = {
  fail: { label: "Fails", tone: "border-fail/40 text-fail", icon: <AlertIcon /> },
  warn: { label: "Warning", tone: "border-warn/40 text-warn", icon: <AlertIcon /> },
  info: { label: "Note", tone: "border-rule text-ink-soft", icon: <span aria-hidden>i</span> },
} as const;

export function FindingsList({ findings }: { findings: Finding[] }) {
  if (!findings.length) return <p className="text-sm text-ink-soft">No findings: every rule checked here is met.</p>;
  return (
    <ul className="space-y-2 text-sm" data-testid="findings">
      {findings.map((f, i) => {
        const s = SEVERITY[f.severity];
        return (
          <li key={`${f.code}-${i}`} className="flex flex-wrap items-start gap-2">
            <span className={`inline-flex shrink-0 items-center gap-1 rounded-full border bg-sheet px-2 py-0.5 text-xs font-semibold ${s.tone}`}>{s.icon}{s.label}</span>
            <span className="min-w-0 flex-1">{f.rule}</span>
          </li>
        );
      })}
    </ul>
  );
}

export function FiguresTable({ figures }: { figures: Figure[] }) {
  return (
    <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[minmax(12rem,auto)_1fr]" data-testid="figures">
      {figures.map((f) => (
        <div key={f.key} className="contents">
          <dt className="font-semibold text-ink-soft">{f.label}</dt>
          <dd className="flex items-center gap-2 tabular-nums" data-figure={f.key}>
            {f.ok !== undefined && typeof f.value === "string" ? <VerdictBadge ok={f.ok} /> : formatFigure(f)}
            {f.ok !== undefined && typeof f.value !== "string" ? <VerdictBadge ok={f.ok} /> : null}
          </dd>
        </div>
      ))}
    </dl>
  );
}

export function IssueList({ issues, describe }: { issues: InputIssue[]; describe?: (i: InputIssue) => string }) {
  if (!issues.length) return null;
  return (
    <div role="alert" className="rounded-md border border-fail/40 bg-fail/5 px-4 py-3 text-sm text-fail" data-testid="input-issues">
      <p className="font-semibold">⚠ Fix {issues.length === 1 ? "this input" : `these ${issues.length} inputs`} to see results:</p>
      <ul className="mt-1 list-disc pl-5">
        {issues.map((i, k) => (
          <li key={k}>{describe ? describe(i) : i.message}</li>
        ))}
      </ul>
    </div>
  );
}

export function Caution({ text }: { text: string }) {
  return (
    <p className="rounded-md border border-copper/30 bg-copper-wash/60 px-4 py-3 text-sm" data-testid="caution">
      <strong className="font-semibold">Caution. </strong>
      {text}
    </p>
  );
}
