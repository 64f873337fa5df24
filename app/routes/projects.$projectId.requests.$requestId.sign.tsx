import { getFormProps, getInputProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/projects.$projectId.requests.$requestId.sign";
import { signApproval, signingPreview, SigningError } from "~/approvals/approvals.server";
import { RecordView } from "~/approvals/record-view";
import { signSchema } from "~/approvals/sign-schemas";
import { activeSigningIdentity } from "~/approvals/verification.server";
import { CAUTION } from "~/engineering";
import { requireProjectAction } from "~/projects/projects.server";
import { Button } from "~/ui/button";
import { FormErrors, TextField } from "~/ui/form";
import { AlertIcon } from "~/ui/icons";
import { PageTitle, Panel } from "~/ui/shell";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, user } = requireProjectAction(context, request, "approvals.sign");
  try {
    const [preview, identity] = await Promise.all([signingPreview(project.id, params.requestId), activeSigningIdentity(user.id)]);
    return { ...preview, canSign: !!identity };
  } catch (error) {
    if (error instanceof SigningError) throw data({ message: error.message }, { status: error.status });
    throw error;
  }
}

export async function action({ context, request, params }: Route.ActionArgs) {
  const { project, user } = requireProjectAction(context, request, "approvals.sign");
  const submission = parseWithZod(await request.formData(), { schema: signSchema });
  if (submission.status !== "success") return data(submission.reply({ hideFields: ["password"] }), { status: 400 });
  try {
    const approval = await signApproval(user, project.id, params.requestId, submission.value);
    throw redirect(`/projects/${project.id}/approvals/${approval.id}?signed=1`);
  } catch (error) {
    if (error instanceof SigningError) {
      const fieldErrors = error.status === 401 ? { password: [error.message] } : undefined;
      return data(submission.reply({ formErrors: fieldErrors ? [] : [error.message], fieldErrors, hideFields: ["password"] }), { status: error.status });
    }
    throw error;
  }
}

export default function SignApproval({ loaderData, actionData }: Route.ComponentProps) {
  const { record, digest, canSign } = loaderData;
  const navigation = useNavigation();
  const [form, fields] = useForm({ lastResult: actionData, onValidate: ({ formData }) => parseWithZod(formData, { schema: signSchema }) });
  return (
    <div>
      <PageTitle title={`Sign approval v${record.nextVersion} of ${record.request.reference}`} lead="This is exactly what your signature will cover. Read it through; the server checks it again, and recomputes every calculation, when you sign." />
      <div className="grid gap-6 lg:grid-cols-3">
        <Panel className="lg:col-span-2">
          {/* The record's sections are h3s, as on the approval page; this names the panel they sit in. */}
          <h2 className="sr-only">The record you sign</h2>
          <RecordView record={record} />
        </Panel>
        <Panel className="h-fit">
          <p className="mb-4 flex gap-2 rounded-md border border-warn/40 bg-warn/5 p-3 text-xs text-ink"><AlertIcon className="mt-0.5 shrink-0 text-warn" /> {CAUTION}</p>
          {canSign ? (
            <Form method="post" {...getFormProps(form)} className="space-y-4">
              <FormErrors errors={form.errors} id={form.errorId} />
              <input type="hidden" name="seenDigest" value={digest} />
              <TextField meta={fields.password} label="Your password" type="password" autoComplete="current-password" hint="Entered now, for this signature only." />
              <label className="flex items-start gap-2 text-sm">
                <input {...getInputProps(fields.confirm, { type: "checkbox" })} className="mt-1" />
                <span>I have reviewed this record and sign it as the responsible registered engineer.</span>
              </label>
              {fields.confirm.errors ? <p className="text-sm font-medium text-fail">⚠ {fields.confirm.errors.join(" ")}</p> : null}
              <Button type="submit" className="w-full" disabled={navigation.state === "submitting"}>{navigation.state === "submitting" ? "Signing…" : "Sign approval"}</Button>
              <p className="text-xs text-ink-soft">Record digest <code className="break-all">{digest.slice(0, 16)}…</code></p>
            </Form>
          ) : (
            <p role="alert" className="font-medium text-fail">⚠ Your professional registration is not verified on Countersign, so you can review but not sign. A project manager verifies it from the Members page.</p>
          )}
        </Panel>
      </div>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Sign approval · Countersign" }];
