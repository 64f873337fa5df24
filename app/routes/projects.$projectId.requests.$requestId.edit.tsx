import { redirect, type ShouldRevalidateFunctionArgs } from "react-router";
import type { Route } from "./+types/projects.$projectId.requests.$requestId.edit";
import { ATTACHMENT_MAX_BYTES, removeAttachment } from "~/requests/attachments.server";
import { formToObject, withoutBlankMeasurements } from "~/requests/form-data";
import { forAction, forPage } from "~/requests/http.server";
import { RequestEditor } from "~/requests/request-editor";
import { getRequest, parseInput, saveContent } from "~/requests/requests.server";
import { moveSchema } from "~/requests/schemas";
import { StateBadge } from "~/requests/state-badge";
import { moveRequest } from "~/requests/transitions.server";
import { requireProjectAction } from "~/projects/projects.server";
import { Panel } from "~/ui/shell";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.raise");
  const view = await forPage(() => getRequest(project.id, params.requestId, { id: user.id, role }));
  if (!view.canEdit) throw redirect(`/projects/${project.id}/requests/${view.id}`);
  return { view, maxBytes: ATTACHMENT_MAX_BYTES };
}

export async function action({ context, request, params }: Route.ActionArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.raise");
  const actor = { ...user, role };
  const form = await request.formData();
  const intent = String(form.get("intent") ?? "");
  const content = () => withoutBlankMeasurements(formToObject([...form].filter(([k]) => !["intent", "move", "lockVersion", "attachmentId"].includes(k))));
  if (intent === "remove-attachment") return forAction(intent, () => removeAttachment(actor, project.id, params.requestId, String(form.get("attachmentId"))));
  if (intent === "save") return forAction(intent, async () => ({ value: await saveContent(actor, project.id, params.requestId, content()) }));
  const sent = await forAction("send", async () => {
    await saveContent(actor, project.id, params.requestId, content());
    const move = parseInput(moveSchema, { action: form.get("move"), lockVersion: form.get("lockVersion") });
    await moveRequest(actor, project.id, params.requestId, move);
  });
  if ("ok" in sent && sent.ok) throw redirect(`/projects/${project.id}/requests/${params.requestId}?sent=1`);
  return sent;
}

export function shouldRevalidate({ formData, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  // Autosaves change nothing the page shows; reloading would only cost the plumber's mobile data.
  if (formData?.get("intent") === "save") return false;
  return defaultShouldRevalidate;
}

export default function EditRequest({ loaderData, actionData }: Route.ComponentProps) {
  const { view, maxBytes } = loaderData;
  return (
    <div className="mx-auto max-w-3xl space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <h2 className="text-xl font-bold">{view.code}</h2>
        <StateBadge state={view.state} />
        <a href={`/projects/${view.projectId}/requests/${view.id}/sheet`} className="text-sm font-semibold text-copper-deep underline underline-offset-4">Place pins on the sheet</a>
      </div>
      {view.state === "info_requested" ? <p className="text-sm text-ink-soft">The engineer asked for more information (see the conversation on the request). Change what is needed and resubmit; the version they saw stays on the record.</p> : null}
      <Panel>
        <RequestEditor
          version={view.latest}
          lockVersion={view.lockVersion}
          sendAction={view.state === "draft" ? "submit" : "resubmit"}
          attachments={view.attachments}
          uploadUrl={`/projects/${view.projectId}/requests/${view.id}/attachments`}
          maxBytes={maxBytes}
          reply={actionData && "ok" in actionData ? (actionData as never) : undefined}
        />
      </Panel>
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.view.code ?? "Request"} · Countersign` }];
