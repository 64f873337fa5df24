// Results of a balance calculation: each mixing point's hot and cold residual pressure with its verdict and a
// plot of both profiles, the suggestions with a button to apply each, and the segment-by-segment losses.
import { lazy, Suspense } from "react";
import type { BalanceResult, BalanceSuggestion } from "~/engineering";
import { ClientOnly } from "~/ui/client-only";
import { Button } from "~/ui/button";
import { formatNumber } from "./format";
import type { NetworkAction } from "./network-state";
import { VerdictBadge } from "./ui";

const PressurePlot = lazy(() => import("./pressure-plot.client"));
const kpa = (v: number) => `${formatNumber(v, 1)} kPa`;

function Suggestion({ suggestion, onApply }: { suggestion: BalanceSuggestion; onApply?: (a: NetworkAction) => void }) {
  const prv = suggestion.balancingPrv;
  return (
    <section className="space-y-4 rounded-md border border-copper/40 bg-copper-wash/30 p-4" data-testid="suggestion">
      <h3 className="text-base font-bold">Suggested changes</h3>
      {suggestion.changes.length ? (
        <div className="space-y-2">
          <p className="text-sm">
            Pipe changes {suggestion.resolved ? "that bring every mixing point within the limit" : "that improve the balance (not enough on their own)"}:
          </p>
          <ul className="list-disc space-y-1 pl-5 text-sm">
            {suggestion.changes.map((c) => (
              <li key={c.segmentId}>
                Segment <strong>{c.segmentId}</strong>: {c.fromPipeId} → <strong>{c.toPipeId}</strong> ({c.reason === "velocity" ? "velocity" : "balance"}; loss {kpa(c.lossBeforeKpa)} → {kpa(c.lossAfterKpa)})
              </li>
            ))}
          </ul>
          <p className="text-sm text-ink-soft">
            Predicted: {suggestion.after.map((a) => `${a.id} ${formatNumber(a.differencePercent, 1)} % (${a.ok ? "pass" : "fail"})`).join(", ")}.
          </p>
          {onApply ? <Button type="button" onClick={() => onApply({ type: "applyPipeChanges", changes: suggestion.changes })}>Apply pipe changes</Button> : null}
        </div>
      ) : null}
      {prv ? (
        <div className="space-y-2 border-t border-copper/20 pt-3">
          <p className="text-sm">
            Or fit a balancing PRV on the cold feed at node <strong>{prv.nodeId}</strong>, set to <strong>{formatNumber(Math.floor(prv.settingKpa), 0)} kPa</strong>: predicted difference {formatNumber(prv.predicted.differencePercent, 1)} % ({prv.predicted.ok ? "pass" : "fail"}).
          </p>
          {prv.sameRating ? (
            <p className="text-sm text-ink-soft">
              The accepted trade fix is a PRV of the same rating as the one on the hot side ({formatNumber(prv.sameRating.settingKpa, 0)} kPa at {prv.sameRating.hotSidePrvNodeId}): predicted {formatNumber(prv.sameRating.predicted.differencePercent, 1)} % ({prv.sameRating.predicted.ok ? "pass" : "fail"}).
            </p>
          ) : null}
          {onApply ? (
            <div className="flex flex-wrap gap-2">
              <Button type="button" variant="quiet" onClick={() => onApply({ type: "applyBalancingPrv", prv })}>Apply balancing PRV</Button>
              {prv.sameRating ? <Button type="button" variant="quiet" onClick={() => onApply({ type: "applyBalancingPrv", prv, sameRating: true })}>Apply a same-rating PRV</Button> : null}
            </div>
          ) : null}
        </div>
      ) : null}
      {suggestion.notes.map((n) => <p key={n} className="text-sm text-ink-soft">{n}</p>)}
      <details className="text-xs text-ink-soft"><summary className="cursor-pointer">How the suggestion is found</summary><p className="mt-1">{suggestion.method}</p></details>
    </section>
  );
}

export function BalanceResults({ result, onApply }: { result: BalanceResult; onApply?: (a: NetworkAction) => void }) {
  return (
    <div className="space-y-6">
      <section className="space-y-3">
        <h3 className="text-base font-bold">Mixing points</h3>
        {result.mixingPoints.length === 0 ? <p className="text-sm text-ink-soft">No mixing points: add one joining a hot and a cold outlet.</p> : null}
        {result.mixingPoints.map((m) => (
          <article key={m.id} className="rounded-md border border-rule p-4" data-testid={`mixing-${m.id}`}>
            <div className="flex flex-wrap items-center gap-3">
              <h4 className="font-bold">{m.id}</h4>
              <VerdictBadge ok={m.ok} />
              <span className="text-sm tabular-nums">
                Hot {kpa(m.hotResidualKpa)} · Cold {kpa(m.coldResidualKpa)} · Difference <strong data-testid="difference">{formatNumber(m.differencePercent, 1)} %</strong> (limit {m.limitPercent} %)
              </span>
            </div>
            <ClientOnly fallback={<div className="h-64" />}>
              {() => (
                <Suspense fallback={<div className="h-64" />}>
                  <PressurePlot point={m} />
                </Suspense>
              )}
            </ClientOnly>
          </article>
        ))}
      </section>
      {result.suggestion ? <Suggestion suggestion={result.suggestion} onApply={onApply} /> : null}
      <details className="rounded-md border border-rule p-4">
        <summary className="cursor-pointer font-bold">Segments: flow, velocity and loss</summary>
        <div className="mt-3 overflow-x-auto">
          <table className="w-full min-w-[40rem] text-sm tabular-nums">
            <thead><tr className="text-left text-xs uppercase tracking-wide text-ink-soft"><th className="py-1">Segment</th><th>Flow L/s</th><th>Velocity m/s</th><th>Re</th><th>Loss kPa</th><th>In kPa</th><th>Out kPa</th></tr></thead>
            <tbody>
              {result.segments.map((s) => (
                <tr key={s.id} className="border-t border-rule/60">
                  <td className="py-1">{s.id}</td><td>{formatNumber(s.flowLps, 2)}</td><td>{formatNumber(s.velocityMs, 2)}{s.velocityMs > result.maxVelocityMs ? " ⚠" : ""}</td>
                  <td>{formatNumber(s.reynolds, 0)}</td><td>{formatNumber(s.totalLossKpa, 1)}</td><td>{formatNumber(s.inletPressureKpa, 1)}</td><td>{formatNumber(s.outletPressureKpa, 1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
    </div>
  );
}
