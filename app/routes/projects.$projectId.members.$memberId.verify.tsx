import { getFormProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/projects.$projectId.members.$memberId.verify";
import { readFormWithFile, sniffDocumentOrImage } from "~/platform/small-upload.server";
import { revokeSchema, verifySchema } from "~/approvals/schemas";
import { EVIDENCE_MAX_BYTES, registrationRecord, revokeRegistration, VerificationError, verifyRegistration } from "~/approvals/verification.server";
import { requireProjectAction } from "~/projects/projects.server";
import { Button } from "~/ui/button";
import { FormErrors, TextArea, TextField } from "~/ui/form";
import { Panel } from "~/ui/shell";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "members.manage");
  try {
    return { projectId: project.id, record: await registrationRecord(project.id, params.memberId), today: new Date().toISOString().slice(0, 10) };
  } catch (error) {
    if (error instanceof VerificationError) throw data({ message: error.message }, { status: error.status });
    throw error;
  }
}

export async function action({ context, request, params }: Route.ActionArgs) {
  const { user, project } = requireProjectAction(context, request, "members.manage");
  const { fields, file: evidence, problem } = await readFormWithFile(request, { maxBytes: EVIDENCE_MAX_BYTES, sniff: sniffDocumentOrImage, wrongType: "Evidence must be a PDF, PNG or JPEG file." });
  const schema = fields.intent === "revoke" ? revokeSchema : verifySchema;
  const submission = parseWithZod(new URLSearchParams(fields), { schema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  if (problem) return data(submission.reply({ fieldErrors: { evidence: [problem] } }), { status: 422 });
  try {
    const v = submission.value;
    if (v.intent === "verify") await verifyRegistration(user.id, project.id, params.memberId, { ...v, evidence });
    else await revokeRegistration(user.id, project.id, params.memberId, v.note);
  } catch (error) {
    if (error instanceof VerificationError) return data(submission.reply({ formErrors: [error.message] }), { status: error.status });
    throw error;
  }
  throw redirect(`/projects/${project.id}/members/${params.memberId}/verify`);
}

export default function VerifyRegistration({ loaderData, actionData }: Route.ComponentProps) {
  const { record, today, projectId } = loaderData;
  const navigation = useNavigation();
  const [form, fields] = useForm({
    id: "verify",
    lastResult: actionData,
    defaultValue: { registrationNumber: record.user.registrationNumber ?? "", registrationBody: record.user.registrationBody ?? "", checkedOn: today },
    onValidate: ({ formData }) => parseWithZod(formData, { schema: formData.get("intent") === "revoke" ? revokeSchema : verifySchema }),
  });
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <Panel className="lg:col-span-2">
        <h2 className="text-lg font-bold">Professional registration of {record.user.name}</h2>
        <p className="mt-1 text-sm text-ink-soft">
          Check the number against the registering body's public register before you confirm. A verified engineer receives a
          personal signing certificate and may sign approvals on Countersign.
        </p>
        <p className="mt-3 text-sm" data-testid="registration-state">
          State: <strong>{{ unverified: "Not yet verified", verified: "Verified", revoked: "Revoked" }[record.user.registrationState ?? "unverified"]}</strong>
        </p>
        <Form method="post" encType="multipart/form-data" {...getFormProps(form)} className="mt-5 space-y-4">
          <FormErrors errors={form.errors} id={form.errorId} />
          <input type="hidden" name="intent" value="verify" />
          <TextField meta={fields.registrationNumber} label="Registration number checked" />
          <TextField meta={fields.registrationBody} label="Registering body" />
          <TextField meta={fields.checkedOn} label="Date checked (YYYY-MM-DD)" />
          <div>
            <label htmlFor="evidence" className="block text-sm font-semibold">Evidence (optional: PDF, PNG or JPEG, up to 10 MB)</label>
            <input id="evidence" name="evidence" type="file" accept="application/pdf,image/png,image/jpeg" className="mt-1 block w-full text-sm" aria-describedby="evidence-error" />
            <p id="evidence-error" className="text-sm font-medium text-fail">{actionData?.error?.evidence?.length ? `⚠ ${actionData.error.evidence.join(" ")}` : null}</p>
          </div>
          <TextArea meta={fields.note} label="Note (optional)" rows={2} />
          <Button type="submit" disabled={navigation.state === "submitting"}>Confirm registration is verified</Button>
        </Form>
      </Panel>
      <div className="space-y-6">
        {record.user.registrationState === "verified" ? (
          <Panel>
            <h2 className="text-lg font-bold">Revoke</h2>
            <Form method="post" className="mt-3 space-y-3">
              <input type="hidden" name="intent" value="revoke" />
              <label htmlFor="revoke-note" className="block text-sm font-semibold">Reason</label>
              <textarea id="revoke-note" name="note" required minLength={5} rows={2} className="block w-full rounded-md border border-rule bg-sheet px-3 py-2" />
              <Button variant="danger" type="submit">Revoke the right to sign</Button>
            </Form>
          </Panel>
        ) : null}
        <Panel>
          <h2 className="text-lg font-bold">History</h2>
          {record.history.length === 0 ? <p className="mt-2 text-sm text-ink-soft">No checks recorded yet.</p> : (
            <ol className="mt-3 space-y-3 text-sm">
              {record.history.map((h) => (
                <li key={h.id} className="border-b border-rule/60 pb-2 last:border-0">
                  <p className="font-semibold">{h.outcome === "verified" ? "✓ Verified" : "⚠ Revoked"} · {h.checkedOn}</p>
                  <p className="text-ink-soft">{h.registrationNumber} · {h.registrationBody} · by {h.by}{h.evidenceName ? ` · evidence: ${h.evidenceName}` : ""}</p>
                  {h.note ? <p className="text-ink-soft">{h.note}</p> : null}
                </li>
              ))}
            </ol>
          )}
        </Panel>
        <Link to={`/projects/${projectId}/members`} className="text-sm font-semibold text-copper-deep underline underline-offset-4">Back to members</Link>
      </div>
    </div>
  );
}
