import { can } from "~/projects/permissions";
import { PROVISIONS } from "~/requests/provisions";

const calculatorFor = (provision: string) => PROVISIONS.find((p) => p.id === provision)?.calculator ?? null;
import type { Route } from "./+types/projects.$projectId.requests.$requestId._index";
import { ATTACHMENT_MAX_BYTES } from "~/requests/attachments.server";
import { addComment, listComments } from "~/requests/comments.server";
import { dateInputValue, formatWhen } from "~/requests/format";
import { formToObject } from "~/requests/form-data";
import { Notice } from "~/requests/fields";
import { forAction, forPage } from "~/requests/http.server";
import { ManagerPanel, MovePanel } from "~/requests/move-panel";
import { RequestContent, VersionDiffView } from "~/requests/request-content";
import { assignEngineer, getRequest, parseInput, setDueDate } from "~/requests/requests.server";
import { assignSchema, dueSchema, moveSchema } from "~/requests/schemas";
import { StateBadge } from "~/requests/state-badge";
import { Thread } from "~/requests/thread";
import { moveRequest } from "~/requests/transitions.server";
import { listMembers } from "~/projects/members.server";
import { requireProjectAction } from "~/projects/projects.server";
import { Panel } from "~/ui/shell";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.view");
  return forPage(async () => {
    const view = await getRequest(project.id, params.requestId, { id: user.id, role });
    const [comments, members] = await Promise.all([listComments(project.id, view.id), role === "manager" ? listMembers(project.id) : []]);
    const engineers = members.filter((m) => m.role === "engineer").map((m) => ({ userId: m.userId, name: m.name }));
    return { view, comments, engineers, manager: role === "manager", canSign: can(role, "approvals.sign"), canReview: can(role, "requests.review"), maxBytes: ATTACHMENT_MAX_BYTES, sent: new URL(request.url).searchParams.has("sent") };
  });
}

export async function action({ context, request, params }: Route.ActionArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.view");
  const actor = { ...user, role };
  const form = formToObject(await request.formData());
  const intent = String(form.intent ?? "");
  return forAction(intent, async () => {
    if (intent === "comment") {
      await addComment(actor, project.id, params.requestId, form);
      return { message: "Message sent." };
    }
    if (intent === "assign") {
      const v = parseInput(assignSchema, form);
      await assignEngineer(actor, project.id, params.requestId, v.assigneeId, v.lockVersion);
      return { message: "Engineer assigned." };
    }
    if (intent === "due") {
      const v = parseInput(dueSchema, form);
      await setDueDate(actor, project.id, params.requestId, v.dueOn, v.lockVersion);
      return { message: "Due date changed." };
    }
    const move = parseInput(moveSchema, { action: form.move, lockVersion: form.lockVersion, note: form.note });
    const done = await moveRequest(actor, project.id, params.requestId, move);
    return { message: `Moved from ${done.from.replace("_", " ")} to ${done.to.replace("_", " ")}.` };
  });
}

export default function RequestDetail({ loaderData, actionData }: Route.ComponentProps) {
  const { view, comments, engineers, manager, maxBytes, sent } = loaderData;
  const base = `/projects/${view.projectId}/requests/${view.id}`;
  const shown = view.sent ?? view.latest;
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <div className="space-y-6 lg:col-span-2">
        <Panel>
          <p className="text-sm font-semibold text-ink-soft">{view.code} · raised by {view.createdBy.name}</p>
          <div className="mt-1 flex flex-wrap items-center gap-3">
            <h2 className="text-2xl font-bold">{view.title}</h2>
            <StateBadge state={view.state} />
          </div>
          <div className="mt-5"><RequestContent version={shown} attachments={view.attachments} /></div>
        </Panel>
        {view.diff ? <Panel><VersionDiffView diff={view.diff} /></Panel> : null}
        <Panel><Thread projectId={view.projectId} requestId={view.id} comments={comments} maxBytes={maxBytes} /></Panel>
      </div>
      <div className="space-y-6">
        {sent && !actionData ? <Notice tone="ok">Sent to the engineer.</Notice> : null}
        {actionData && actionData.intent !== "comment" ? <Notice tone={actionData.ok ? "ok" : "fail"}>{actionData.message}</Notice> : null}
        <Panel>
          <h2 className="text-lg font-bold">Request</h2>
          <dl className="mt-3 grid grid-cols-[7rem_1fr] gap-y-2 text-sm">
            <dt className="text-ink-soft">Engineer</dt><dd data-testid="assignee">{view.assignee?.name ?? "Not assigned"}</dd>
            <dt className="text-ink-soft">Due</dt><dd className={view.overdue ? "font-semibold text-fail" : ""}>{formatWhen(view.dueAt, false)}{view.overdue ? " (overdue)" : ""}</dd>
            <dt className="text-ink-soft">In this state</dt><dd>for {view.waiting}</dd>
            <dt className="text-ink-soft">Versions</dt><dd>{view.versions.length}</dd>
          </dl>
          <a href={`${base}/sheet`} className="mt-4 block text-sm font-semibold text-copper-deep underline underline-offset-4">{loaderData.canReview ? "Mark up the sheet" : "See the sheet and its markups"}</a>
          <div className="mt-5"><MovePanel base={base} moves={view.moves} lockVersion={view.lockVersion} canEdit={view.canEdit} /></div>
          {view.state === "decided" ? <a href={`${base}/review`} className="mt-4 block text-sm font-semibold text-copper-deep underline underline-offset-4">See the decision</a> : null}
          {calculatorFor(view.provision) && view.state !== "draft" ? (
            <a href={`/projects/${view.projectId ?? ""}/calculations/new/${calculatorFor(view.provision)}?from=${view.id}`} className="mt-3 block text-sm font-semibold text-copper-deep underline underline-offset-4">Check it in the calculator, from these measurements</a>
          ) : null}
          {view.state === "decided" && loaderData.canSign ? <a href={`${base}/sign`} className="mt-3 inline-block rounded-md bg-copper px-4 py-2.5 text-sm font-semibold text-white hover:bg-copper-deep">Sign approval</a> : null}
          {view.state === "decided" || view.state === "closed" ? <a href={`/projects/${view.projectId ?? ""}/site`} className="mt-3 block text-sm font-semibold text-copper-deep underline underline-offset-4">Signed approvals on the site page</a> : null}
        </Panel>
        {manager && !["decided", "withdrawn", "superseded", "draft"].includes(view.state) ? (
          <Panel><h2 className="mb-3 text-lg font-bold">Manage</h2><ManagerPanel engineers={engineers} assigneeId={view.assignee?.id ?? null} dueOn={dateInputValue(view.dueAt)} lockVersion={view.lockVersion} /></Panel>
        ) : null}
      </div>
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.view.code ?? "Request"} · Countersign` }];
