import { getFormProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/projects.$projectId.transmittals._index";
import { describeFailure } from "~/drawings/http.server";
import { listIssuable } from "~/drawings/register.server";
import { issueSchema } from "~/drawings/schemas";
import { STATUS_LABELS } from "~/drawings/status";
import { StatusBadge } from "~/drawings/status-badge";
import { TransmittalList } from "~/drawings/transmittal-list";
import { issueRevisions, listTransmittals } from "~/drawings/transmittals.server";
import { listMembers } from "~/projects/members.server";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { Button } from "~/ui/button";
import { FormErrors, TextArea } from "~/ui/form";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project, role, user } = requireProjectAction(context, request, "drawings.view");
  const canIssue = can(role, "drawings.issue");
  const [transmittals, issuable, members] = await Promise.all([
    listTransmittals(project.id, user.id, canIssue),
    canIssue ? listIssuable(project.id) : [],
    canIssue ? listMembers(project.id) : [],
  ]);
  const preselect = new URL(request.url).searchParams.getAll("revision");
  return { projectId: project.id, transmittals, issuable, members: members.map((m) => ({ userId: m.userId, name: m.name, role: m.role })), canIssue, preselect };
}

export async function action({ context, request }: Route.ActionArgs) {
  const { user, project } = requireProjectAction(context, request, "drawings.issue");
  const submission = parseWithZod(await request.formData(), { schema: issueSchema });
  if (submission.status !== "success") return data({ result: submission.reply() }, { status: 400 });
  try {
    const t = await issueRevisions(user, project.id, submission.value);
    return redirect(`/projects/${project.id}/transmittals/${t.id}`);
  } catch (error) {
    const known = describeFailure(error);
    if (known) return data({ result: submission.reply({ formErrors: [known.message] }) }, { status: known.status });
    throw error;
  }
}

export default function Transmittals({ loaderData, actionData }: Route.ComponentProps) {
  const { transmittals, canIssue, projectId } = loaderData;
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <div className="lg:col-span-2">
        <Panel>
          <h2 className="mb-4 text-lg font-bold">{canIssue ? "Transmittals" : "Transmittals to you"}</h2>
          <TransmittalList transmittals={transmittals} projectId={projectId} />
        </Panel>
      </div>
      {canIssue ? <IssueForm {...loaderData} lastResult={actionData?.result} /> : null}
    </div>
  );
}

function IssueForm({ issuable, members, preselect, lastResult }: Route.ComponentProps["loaderData"] & { lastResult?: SubmissionResult<string[]> | null }) {
  const navigation = useNavigation();
  const [form, fields] = useForm({ id: "issue", lastResult, onValidate: ({ formData }) => parseWithZod(formData, { schema: issueSchema }) });
  return (
    <Panel>
      <h2 className="mb-4 text-lg font-bold">Issue revisions</h2>
      <Form method="post" {...getFormProps(form)} className="space-y-4 text-sm">
        <FormErrors errors={form.errors} id={form.errorId} />
        <input type="hidden" name="intent" value="issue" />
        <fieldset>
          <legend className="font-semibold">Revisions</legend>
          {issuable.length ? (
            <ul className="mt-2 max-h-64 space-y-1 overflow-y-auto">
              {issuable.map((r) => (
                <li key={r.id}>
                  <label className="flex flex-wrap items-center gap-2">
                    <input type="checkbox" name={fields.revisionIds.name} value={r.id} defaultChecked={preselect.includes(r.id)} />
                    <span className="font-semibold">{r.sheetNumber} {r.label}</span> <StatusBadge status={r.status} />
                  </label>
                </li>
              ))}
            </ul>
          ) : <p className="text-ink-soft">No revision can be issued yet. <Link to="../drawings" relative="path" className="underline">Upload one</Link>.</p>}
          <p id={fields.revisionIds.errorId} className="text-fail">{fields.revisionIds.errors?.join(" ")}</p>
        </fieldset>
        <fieldset>
          <legend className="font-semibold">Issue for</legend>
          {(["for_review", "accepted"] as const).map((s) => (
            <label key={s} className="mt-1 flex items-center gap-2"><input type="radio" name={fields.status.name} value={s} defaultChecked={s === "for_review"} /> {STATUS_LABELS[s]}</label>
          ))}
          <p className="mt-1 text-ink-soft">Accepting a revision for construction supersedes the sheet's previous accepted revision.</p>
        </fieldset>
        <fieldset>
          <legend className="font-semibold">Send to</legend>
          <ul className="mt-2 max-h-48 space-y-1 overflow-y-auto">
            {members.map((m) => (
              <li key={m.userId}><label className="flex items-center gap-2"><input type="checkbox" name={fields.recipientIds.name} value={m.userId} /> {m.name}</label></li>
            ))}
          </ul>
          <p id={fields.recipientIds.errorId} className="text-fail">{fields.recipientIds.errors?.join(" ")}</p>
        </fieldset>
        <TextArea meta={fields.reason} label="Why (shown to recipients)" rows={3} />
        <Button type="submit" disabled={navigation.state === "submitting"}>Issue and send transmittal</Button>
      </Form>
    </Panel>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Transmittals · Countersign" }];
