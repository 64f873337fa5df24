import { getFormProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/projects.$projectId.requests.new";
import { describeFailure } from "~/requests/http.server";
import { PROVISIONS } from "~/requests/provisions";
import { createDraft } from "~/requests/requests.server";
import { newRequestSchema } from "~/requests/schemas";
import { requireProjectAction } from "~/projects/projects.server";
import { Button } from "~/ui/button";
import { FormErrors, SelectField, TextField } from "~/ui/form";
import { Panel } from "~/ui/shell";

const provisionOptions = PROVISIONS.map((p) => ({ value: p.id, label: p.label }));

export async function loader({ context, request }: Route.LoaderArgs) {
  requireProjectAction(context, request, "requests.raise");
  return null;
}

export async function action({ context, request }: Route.ActionArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.raise");
  const submission = parseWithZod(await request.formData(), { schema: newRequestSchema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  try {
    const created = await createDraft({ ...user, role }, project.id, submission.value);
    throw redirect(`/projects/${project.id}/requests/${created.id}/edit`);
  } catch (error) {
    const known = describeFailure(error);
    if (!known) throw error;
    return data(submission.reply({ formErrors: [known.message] }), { status: known.status });
  }
}

export default function NewRequest({ actionData }: Route.ComponentProps) {
  const navigation = useNavigation();
  const [form, fields] = useForm({
    lastResult: actionData,
    shouldValidate: "onBlur",
    onValidate: ({ formData }) => parseWithZod(formData, { schema: newRequestSchema }),
  });
  return (
    <div className="mx-auto max-w-2xl">
      <Panel>
        <h2 className="text-xl font-bold">New request</h2>
        <p className="mt-1 text-sm text-ink-soft">Start with what cannot be applied. Next you describe the site constraint and your proposal, add measurements and photos; it saves as you go and reaches the engineer only when you submit it.</p>
        <Form method="post" {...getFormProps(form)} className="mt-5 space-y-4">
          <FormErrors errors={form.errors} id={form.errorId} />
          <TextField meta={fields.title} label="Title" placeholder="e.g. Unit 5 discharge run on the flat roof" />
          <SelectField meta={fields.provision} label="Provision that cannot be applied" options={provisionOptions} placeholder="Choose…" />
          <TextField meta={fields.clauseRef} label="Clause reference (optional)" hint="As printed in the edition you work to." />
          <Button type="submit" disabled={navigation.state === "submitting"}>Start the request</Button>
        </Form>
      </Panel>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "New request · Countersign" }];
