import { getFormProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/projects.$projectId.notices";
import { NOTICE_ROWS, noticeSchema, OWNER_DECISIONS } from "~/approvals/notice-schema";
import { listNotices, sendNoncomplianceNotice } from "~/approvals/records.server";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { Button } from "~/ui/button";
import { FormErrors, TextField } from "~/ui/form";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project, role } = requireProjectAction(context, request, "approvals.view");
  return { notices: await listNotices(project.id), canSend: can(role, "installations.record"), today: new Date().toISOString().slice(0, 10) };
}

export async function action({ context, request }: Route.ActionArgs) {
  const { project, user } = requireProjectAction(context, request, "installations.record");
  const submission = parseWithZod(await request.formData(), { schema: noticeSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), sent: null }, { status: 400 });
  const notice = await sendNoncomplianceNotice(user.id, project.id, submission.value);
  return { result: submission.reply({ resetForm: true }), sent: `Notice ${notice.number} was sent to ${notice.ownerEmail}.` };
}

const decisionOptions = Object.entries(OWNER_DECISIONS);
const input = "mt-1 block w-full rounded-md border border-rule bg-sheet px-3 py-2 text-sm";

export default function Notices({ loaderData, actionData }: Route.ComponentProps) {
  const { notices, canSend, today } = loaderData;
  const navigation = useNavigation();
  const [form, fields] = useForm({ lastResult: actionData?.result, defaultValue: { inspectedOn: today }, onValidate: ({ formData }) => parseWithZod(formData, { schema: noticeSchema }) });
  const rows = fields.items.getFieldList();
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <div className="space-y-6 lg:col-span-2">
        {canSend ? (
          <Panel>
            <h2 className="text-lg font-bold">Non-compliance notice to an owner</h2>
            <p className="mt-1 text-sm text-ink-soft">On work at an existing installation, report every non-compliance you find to the owner in writing. The notice goes to the owner as a PDF and stays on record here.</p>
            {actionData?.sent ? <p role="status" className="mt-3 text-sm text-ok">✓ {actionData.sent}</p> : null}
            <Form method="post" {...getFormProps(form)} className="mt-4 space-y-4">
              <FormErrors errors={form.errors} id={form.errorId} />
              <div className="grid gap-4 sm:grid-cols-2">
                <TextField meta={fields.ownerName} label="Owner's name" />
                <TextField meta={fields.ownerEmail} label="Owner's e-mail" type="email" />
                <TextField meta={fields.property} label="Property or unit" />
                <TextField meta={fields.inspectedOn} label="Date of the visit (YYYY-MM-DD)" />
              </div>
              <fieldset className="space-y-3">
                <legend className="text-sm font-semibold">Items found (leave unused rows empty)</legend>
                {fields.items.errors ? <p className="text-sm font-medium text-fail">⚠ {fields.items.errors.join(" ")}</p> : null}
                {Array.from({ length: NOTICE_ROWS }, (_, i) => {
                  const row = rows[i]?.getFieldset();
                  return (
                    <div key={i} className="grid gap-2 rounded-md border border-rule p-3 sm:grid-cols-3">
                      <label className="text-xs font-semibold">Finding {i + 1}<input name={`items[${i}].finding`} className={input} /></label>
                      <label className="text-xs font-semibold">Rule it breaks<input name={`items[${i}].rule`} className={input} aria-invalid={!!row?.rule.errors} />{row?.rule.errors ? <span className="text-fail">⚠ {row.rule.errors.join(" ")}</span> : null}</label>
                      <label className="text-xs font-semibold">Owner's decision<select name={`items[${i}].ownerDecision`} defaultValue="undecided" className={input}>{decisionOptions.map(([v, l]) => <option key={v} value={v}>{l}</option>)}</select></label>
                    </div>
                  );
                })}
              </fieldset>
              <Button type="submit" disabled={navigation.state === "submitting"}>Send notice to the owner</Button>
            </Form>
          </Panel>
        ) : null}
      </div>
      <Panel className="h-fit">
        <h2 className="text-lg font-bold">Notices sent</h2>
        {notices.length ? (
          <ul className="mt-3 space-y-2 text-sm">{notices.map((n) => <li key={n.id} className="border-b border-rule/60 pb-2 last:border-0"><p className="font-semibold">Notice {n.number} · {n.property}</p><p className="text-ink-soft">{n.items} item{n.items > 1 ? "s" : ""} · to {n.ownerName} · {n.inspectedOn} · by {n.by}</p></li>)}</ul>
        ) : <p className="mt-2 text-sm text-ink-soft">None yet.</p>}
      </Panel>
    </div>
  );
}
