// The review desk's decision form: each principle judged (not affected / maintained / compromised) with its
// reasoning and evidence, the decision with numbered conditions or reasons, and the revisions it rests on. The
// rules are previewed as you go (the same function the server enforces).
import { useMemo, useRef, useState } from "react";
import { Form, useNavigation } from "react-router";
import type { AttachmentView } from "~/requests/requests.server";
import { inputClass, issueAt, Notice, type Issues } from "~/requests/fields";
import { formToObject } from "~/requests/form-data";
import { Button } from "~/ui/button";
import type { DecisionView, RevisionChoice } from "./decisions.server";
import { DECISION_LABELS, DECISION_OUTCOMES, decisionProblems, OUTCOME_LABELS, OUTCOMES, PRINCIPLES, type DecisionProblem } from "./principles";
import { decisionFormSchema, toDraft } from "./schemas";

function problemsOf(form: HTMLFormElement | null): DecisionProblem[] {
  if (!form) return [];
  const parsed = decisionFormSchema.safeParse(formToObject(new FormData(form)));
  if (!parsed.success) return [];
  if (!parsed.data.outcome) return [{ path: "outcome", message: "Choose the decision." }];
  return decisionProblems(toDraft(parsed.data));
}

export function ReviewForm({ draft, attachments, revisions, lockVersion, reply }: { draft: DecisionView | null; attachments: AttachmentView[]; revisions: RevisionChoice[]; lockVersion: number; reply?: { ok: boolean; message?: string; issues?: Issues } }) {
  const navigation = useNavigation();
  const form = useRef<HTMLFormElement>(null);
  const [conditions, setConditions] = useState<string[]>(() => (draft?.conditions.length ? draft.conditions.map((c) => c.text) : [""]));
  const [problems, setProblems] = useState<DecisionProblem[] | null>(null);
  const issues = reply && !reply.ok ? reply.issues : undefined;
  const byPrinciple = useMemo(() => new Map(draft?.assessments.map((a) => [a.principleId, a]) ?? []), [draft]);
  const files = attachments.filter((a) => a.versionN !== null);
  const shownProblems = problems ?? (issues as DecisionProblem[] | undefined) ?? [];

  return (
    <Form method="post" ref={form} className="space-y-6" onChange={() => setProblems(problemsOf(form.current))} data-testid="review-form">
      <input type="hidden" name="lockVersion" value={lockVersion} />
      {reply ? <Notice tone={reply.ok ? "ok" : "fail"}>{reply.message}</Notice> : null}
      <fieldset className="space-y-4">
        <legend className="text-lg font-bold">Principles</legend>
        {PRINCIPLES.map((p, i) => {
          const saved = byPrinciple.get(p.id);
          const error = issueAt(issues, `principles.${p.id}`);
          return (
            <div key={p.id} className="rounded-md border border-rule p-3" data-testid={`principle-${p.id}`}>
              <input type="hidden" name={`principles[${i}].principleId`} value={p.id} />
              <fieldset>
                <legend className="font-semibold">{i + 1}. {p.label}</legend>
                <div className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-sm">
                  {OUTCOMES.map((o) => (
                    <label key={o} className="inline-flex items-center gap-1.5">
                      <input type="radio" name={`principles[${i}].outcome`} value={o} defaultChecked={saved?.outcome === o} className="accent-copper" />
                      {o === "compromised" ? "✕ " : o === "maintained" ? "✓ " : "○ "}{OUTCOME_LABELS[o]}
                    </label>
                  ))}
                </div>
              </fieldset>
              <label className="mt-2 block text-sm">
                <span className="font-semibold">Reasoning</span>
                <textarea name={`principles[${i}].reasoning`} rows={2} defaultValue={saved?.reasoning ?? ""} className={inputClass} aria-label={`Reasoning for ${p.label}`} />
              </label>
              {files.length ? (
                <div className="mt-2 flex flex-wrap gap-3 text-sm">
                  <span className="font-semibold">Evidence:</span>
                  {files.map((f) => (
                    <label key={f.id} className="inline-flex items-center gap-1.5">
                      <input type="checkbox" name={`principles[${i}].evidence`} value={f.id} defaultChecked={saved?.evidence.some((e) => e.id === f.id)} className="accent-copper" /> {f.filename}
                    </label>
                  ))}
                </div>
              ) : null}
              {error ? <p className="mt-1 text-sm font-medium text-fail">⚠ {error}</p> : null}
            </div>
          );
        })}
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="text-lg font-bold">Decision</legend>
        <div className="flex flex-wrap gap-x-5 gap-y-1 text-sm">
          {DECISION_OUTCOMES.map((o) => (
            <label key={o} className="inline-flex items-center gap-1.5"><input type="radio" name="outcome" value={o} defaultChecked={draft?.outcome === o} className="accent-copper" /> {DECISION_LABELS[o]}</label>
          ))}
        </div>
        <div className="space-y-2">
          <p className="text-sm font-semibold">Conditions (with an approval with conditions)</p>
          <ol className="space-y-2">
            {conditions.map((c, k) => (
              <li key={k} className="flex gap-2 text-sm">
                <span className="mt-3 font-semibold tabular-nums">{k + 1}.</span>
                <textarea name={`conditions[${k}]`} rows={2} defaultValue={c} className={inputClass} aria-label={`Condition ${k + 1}`} />
              </li>
            ))}
          </ol>
          <Button type="button" variant="quiet" onClick={() => setConditions((all) => [...all, ""])}>Add a condition</Button>
          {issueAt(issues, "conditions") ? <p className="text-sm font-medium text-fail">⚠ {issueAt(issues, "conditions")}</p> : null}
        </div>
        <label className="block text-sm">
          <span className="font-semibold">Reasons (with a refusal)</span>
          <textarea name="reasons" rows={3} defaultValue={draft?.reasons ?? ""} className={inputClass} />
        </label>
        <fieldset className="text-sm">
          <legend className="font-semibold">Rests on these drawing revisions</legend>
          {revisions.length ? revisions.map((r) => (
            <label key={r.id} className="mt-1 flex items-center gap-1.5"><input type="checkbox" name="restsOn" value={r.id} defaultChecked={draft?.restsOn.includes(r.id)} className="accent-copper" /> {r.label}</label>
          )) : <p className="text-ink-soft">This project has no current drawing revisions.</p>}
        </fieldset>
      </fieldset>

      <div aria-live="polite" data-testid="decision-problems">
        {shownProblems.length ? (
          <div className="rounded-md border border-warn/40 bg-warn/5 p-3 text-sm text-warn">
            <p className="font-semibold">Before it can be recorded:</p>
            <ul className="mt-1 list-disc pl-5">{shownProblems.map((p) => <li key={p.path + p.message}>{p.message}</li>)}</ul>
          </div>
        ) : problems ? <p className="text-sm font-semibold text-ok">✓ Ready to record.</p> : null}
      </div>
      <div className="flex flex-wrap gap-3 border-t border-rule pt-4">
        <Button type="submit" name="intent" value="record" disabled={navigation.state !== "idle"}>Record decision</Button>
        <Button type="submit" name="intent" value="save" variant="quiet" disabled={navigation.state !== "idle"}>Save and continue later</Button>
      </div>
    </Form>
  );
}

export function DecisionSummary({ decision }: { decision: DecisionView }) {
  return (
    <div className="space-y-4 text-sm" data-testid="decision">
      <p className="text-lg font-bold">{decision.outcome ? DECISION_LABELS[decision.outcome] : "Draft"} <span className="text-sm font-normal text-ink-soft">on version {decision.versionN}, by {decision.decidedBy}{decision.recordedAt ? ` (recorded, not yet signed)` : ""}</span></p>
      {decision.conditions.length ? (
        <div><p className="font-semibold">Conditions</p><ol className="list-decimal pl-5">{decision.conditions.map((c) => <li key={c.n}>{c.text}</li>)}</ol></div>
      ) : null}
      {decision.reasons ? <div><p className="font-semibold">Reasons</p><p className="whitespace-pre-line">{decision.reasons}</p></div> : null}
      <table className="w-full"><tbody className="divide-y divide-rule">
        {PRINCIPLES.map((p) => {
          const a = decision.assessments.find((x) => x.principleId === p.id);
          return (
            <tr key={p.id} className="flex flex-col py-2 sm:table-row">
              <td className="pr-3 font-semibold sm:py-2">{p.label}</td>
              <td className="pr-3 sm:py-2">{a?.outcome ? `${a.outcome === "compromised" ? "✕" : a.outcome === "maintained" ? "✓" : "○"} ${OUTCOME_LABELS[a.outcome]}` : "—"}</td>
              <td className="text-ink-soft sm:py-2">{a?.reasoning}</td>
            </tr>
          );
        })}
      </tbody></table>
    </div>
  );
}
