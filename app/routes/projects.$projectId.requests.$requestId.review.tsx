import { Link, redirect } from "react-router";
import type { Route } from "./+types/projects.$projectId.requests.$requestId.review";
import { formToObject } from "~/requests/form-data";
import { forAction, forPage } from "~/requests/http.server";
import { RequestContent, VersionDiffView } from "~/requests/request-content";
import { StateBadge } from "~/requests/state-badge";
import { getReviewDesk, recordDecision, saveDecisionDraft } from "~/review/decisions.server";
import { DecisionSummary, ReviewForm } from "~/review/review-form";
import { requireProjectAction } from "~/projects/projects.server";
import { AlertIcon } from "~/ui/icons";
import { Panel } from "~/ui/shell";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.view");
  return { desk: await forPage(() => getReviewDesk(project.id, params.requestId, { id: user.id, role })) };
}

export async function action({ context, request, params }: Route.ActionArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.review");
  const form = formToObject(await request.formData());
  const intent = form.intent === "record" ? "record" : "save";
  const out = await forAction(intent, async () => {
    if (intent === "record") await recordDecision({ ...user, role }, project.id, params.requestId, form);
    else await saveDecisionDraft({ ...user, role }, project.id, params.requestId, form);
    return { message: intent === "record" ? "Decision recorded." : "Saved. Nothing is recorded until you record the decision." };
  });
  if (intent === "record" && "ok" in out && out.ok) throw redirect(`/projects/${project.id}/requests/${params.requestId}/review?recorded=1`);
  return out;
}

export default function ReviewDesk({ loaderData, actionData }: Route.ComponentProps) {
  const { request: r, draft, recorded, revisions } = loaderData.desk;
  const deciding = r.moves.includes("decide");
  const last = recorded.at(-1);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <h2 className="text-xl font-bold">Review desk · {r.code}</h2>
        <StateBadge state={r.state} />
        <Link to={`/projects/${r.projectId}/requests/${r.id}`} className="text-sm font-semibold text-copper-deep underline underline-offset-4">Back to the request and its conversation</Link>
        <Link to={`/projects/${r.projectId}/requests/${r.id}/sheet`} className="text-sm font-semibold text-copper-deep underline underline-offset-4">Mark up the sheet</Link>
      </div>
      <p className="flex items-start gap-2 rounded-md border border-rule bg-paper px-4 py-3 text-sm" role="note">
        <AlertIcon className="mt-0.5 shrink-0 text-copper" />
        What is recorded here supports the registered engineer's professional judgement; it does not replace it, and the applicable standards and local regulations prevail.
      </p>
      <div className="grid gap-6 lg:grid-cols-2">
        <div className="space-y-6">
          <Panel><h3 className="mb-3 text-lg font-bold">{r.title}</h3>{r.sent ? <RequestContent version={r.sent} attachments={r.attachments} /> : <p className="text-sm text-ink-soft">Not submitted yet.</p>}</Panel>
          {r.diff ? <Panel><VersionDiffView diff={r.diff} /></Panel> : null}
        </div>
        <Panel>
          {deciding ? (
            <ReviewForm key={`${r.lockVersion}-${draft?.id}`} draft={draft} attachments={r.attachments} revisions={revisions} lockVersion={r.lockVersion} reply={actionData as never} />
          ) : last ? (
            <DecisionSummary decision={last} />
          ) : (
            <p className="text-sm text-ink-soft">{r.state === "submitted" || r.state === "resubmitted" ? "The engineer starts the review from the request page; the decision is then worked out here." : "No decision has been recorded on this request."}</p>
          )}
        </Panel>
      </div>
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Review desk · ${data?.desk.request.code ?? "Request"} · Countersign` }];
