// The record an engineer signs, shown in full before signing (and on the approval page afterwards).
import { CheckIcon, AlertIcon, ClockIcon } from "../ui/icons";
import { DECISION_LABELS, OUTCOME_LABELS, type DecisionOutcome, type PrincipleOutcome } from "../review/principles";

export interface RecordViewData {
  request: { reference: string; version: number; title: string; provision: string; clauseRef: string; siteConstraint: string; proposal: string };
  decision: { outcome: DecisionOutcome; conditions: string[]; reasons: string };
  principles: { id: string; label: string; outcome: PrincipleOutcome | null; reasoning: string }[];
  calculations: { id: string; title: string; kind: string; engineVersion: string; outputs: unknown }[];
  drawings: { revisionId: string; sheetNumber: string; title: string; revisionLabel: string; sha256: string }[];
}

const OUTCOME_ICON = { not_affected: CheckIcon, maintained: CheckIcon, compromised: AlertIcon } as const;

export function RecordView({ record }: { record: RecordViewData }) {
  return (
    <div className="space-y-6 text-sm">
      <section>
        <h3 className="font-bold">Decision</h3>
        <p className="mt-1 text-lg font-semibold">{DECISION_LABELS[record.decision.outcome]}</p>
        {record.decision.conditions.length ? (
          <ol className="mt-2 list-decimal space-y-1 pl-5">{record.decision.conditions.map((c, i) => <li key={i}>{c}</li>)}</ol>
        ) : <p className="text-ink-soft">No conditions.</p>}
      </section>
      <section>
        <h3 className="font-bold">Request {record.request.reference} · version {record.request.version}</h3>
        <p className="mt-1 font-semibold">{record.request.title}</p>
        <p className="text-ink-soft">{record.request.provision}{record.request.clauseRef ? ` · clause ${record.request.clauseRef}` : ""}</p>
        <p className="mt-2"><span className="font-semibold">Site constraint: </span>{record.request.siteConstraint}</p>
        <p className="mt-1"><span className="font-semibold">Proposal: </span>{record.request.proposal}</p>
      </section>
      <section>
        <h3 className="font-bold">Principles</h3>
        <ul className="mt-2 divide-y divide-rule rounded-md border border-rule">
          {record.principles.map((p) => {
            const Icon = p.outcome ? OUTCOME_ICON[p.outcome] : ClockIcon;
            return (
              <li key={p.id} className="px-3 py-2">
                <p className="flex flex-wrap items-center justify-between gap-2"><span className="font-semibold">{p.label}</span><span className="inline-flex items-center gap-1"><Icon className="text-copper" /> {p.outcome ? OUTCOME_LABELS[p.outcome] : "Not recorded"}</span></p>
                {p.reasoning ? <p className="mt-1 text-ink-soft">{p.reasoning}</p> : null}
              </li>
            );
          })}
        </ul>
      </section>
      <section>
        <h3 className="font-bold">Calculations</h3>
        {record.calculations.length ? (
          <ul className="mt-2 space-y-1">{record.calculations.map((c) => <li key={c.id}>{c.title} · {c.kind} · engine {c.engineVersion} · {(c.outputs as { ok?: boolean })?.ok ? "✓ within limits" : "⚠ see findings"}</li>)}</ul>
        ) : <p className="text-ink-soft">None attached.</p>}
      </section>
      <section>
        <h3 className="font-bold">Drawings it rests on</h3>
        {record.drawings.length ? (
          <ul className="mt-2 space-y-1">{record.drawings.map((d) => <li key={d.revisionId}><span className="font-semibold">{d.sheetNumber} rev {d.revisionLabel}</span> — {d.title}<br /><code className="break-all text-xs text-ink-soft">SHA-256 {d.sha256}</code></li>)}</ul>
        ) : <p className="text-ink-soft">No drawing revisions recorded.</p>}
      </section>
    </div>
  );
}
