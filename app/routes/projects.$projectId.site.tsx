import { Link } from "react-router";
import type { Route } from "./+types/projects.$projectId.site";
import { ApprovalState } from "~/approvals/state";
import { listApprovals } from "~/approvals/site.server";
import { requireProjectAction } from "~/projects/projects.server";
import { DECISION_LABELS, type DecisionOutcome } from "~/review/principles";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "approvals.view");
  const approvals = await listApprovals(project.id);
  return { projectId: project.id, current: approvals.filter((a) => a.state === "current"), flagged: approvals.filter((a) => a.state === "needs_reapproval"), earlier: approvals.filter((a) => a.state === "superseded" || a.state === "withdrawn") };
}

export default function SitePage({ loaderData }: Route.ComponentProps) {
  const { current, flagged, earlier, projectId } = loaderData;
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 className="text-xl font-bold">Signed approvals for site</h2>
          <Link to={`/projects/${projectId}/notices`} className="text-sm font-semibold text-copper-deep underline underline-offset-4">Non-compliance notices to owners</Link>
        </div>
        {current.length ? (
          <a href={`/projects/${projectId}/site/packs.zip`} className="rounded-md border border-rule bg-sheet px-4 py-2.5 text-sm font-semibold hover:border-copper" download>
            Download all current packs (zip)
          </a>
        ) : null}
      </div>
      {flagged.length ? (
        <div role="alert" className="rounded-lg border-2 border-warn bg-warn/5 p-4 text-sm">
          <p className="font-bold">⚠ {flagged.length} approval{flagged.length > 1 ? "s" : ""} need re-approval</p>
          <p className="mt-1">A drawing they rest on was superseded. Do not build from them until the engineer has signed a new version.</p>
        </div>
      ) : null}
      {current.length === 0 && flagged.length === 0 ? <Panel><p className="text-ink-soft">No signed approvals on this project yet.</p></Panel> : null}
      <ul className="space-y-4">
        {[...flagged, ...current].map((a) => (
          <li key={a.id}>
            <Panel>
              <div className="flex flex-wrap items-start justify-between gap-2">
                <div>
                  <p className="text-sm font-semibold text-copper-deep">{a.reference} · approval v{a.n}</p>
                  <h3 className="text-lg font-bold">{a.title}</h3>
                  <p className="text-sm text-ink-soft">{DECISION_LABELS[a.outcome as DecisionOutcome]} · signed by {a.signer} on {a.signedAt.slice(0, 10)}</p>
                </div>
                <ApprovalState state={a.state} />
              </div>
              {a.conditions.length ? (
                <div className="mt-3 rounded-md bg-paper p-3">
                  <p className="text-sm font-bold">Conditions</p>
                  <ol className="mt-1 list-decimal space-y-1 pl-5 text-sm">{a.conditions.map((c, i) => <li key={i}>{c}</li>)}</ol>
                </div>
              ) : null}
              <div className="mt-4 flex flex-wrap gap-3 text-sm font-semibold">
                <a href={`/projects/${projectId}/approvals/${a.id}/pack`} className="rounded-md bg-copper px-4 py-2.5 text-white hover:bg-copper-deep">Download signed pack</a>
                <Link to={`/projects/${projectId}/approvals/${a.id}`} className="rounded-md border border-rule bg-sheet px-4 py-2.5 hover:border-copper">Details{a.installed ? "" : " · record installation"}</Link>
              </div>
              {a.installed ? <p className="mt-3 text-sm">✓ Installed as approved on {a.installed.on} ({a.installed.by})</p> : null}
            </Panel>
          </li>
        ))}
      </ul>
      {earlier.length ? (
        <details className="rounded-lg border border-rule bg-sheet p-4">
          <summary className="cursor-pointer font-semibold">Earlier versions ({earlier.length})</summary>
          <ul className="mt-3 space-y-2 text-sm">
            {earlier.map((a) => (
              <li key={a.id} className="flex flex-wrap items-center justify-between gap-2">
                <Link className="underline underline-offset-4" to={`/projects/${projectId}/approvals/${a.id}`}>{a.reference} v{a.n} — {a.title}</Link>
                <ApprovalState state={a.state} />
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}
