import { getFormProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import type { z } from "zod";
import { data, Form, Link, redirect } from "react-router";
import type { Route } from "./+types/reset-password.$token";
import { resetPassword, resetTokenState, type ResetTokenState } from "~/accounts/reset.server";
import { resetSchema } from "~/accounts/schemas";
import { Button } from "~/ui/button";
import { FormErrors, TextField } from "~/ui/form";
import { PLAIN_PAGE } from "~/ui/plain-page";
import { Panel } from "~/ui/shell";

const PROBLEMS: Record<Exclude<ResetTokenState, "valid">, string> = {
  expired: "This reset link has expired. Ask for a new one; each link works for an hour.",
  used: "This reset link has already been used. Ask for a new one if you still need it.",
  unknown: "This reset link is not valid. Check you copied the whole link, or ask for a new one.",
};

export async function loader({ params }: Route.LoaderArgs) {
  return { state: await resetTokenState(params.token) };
}

export async function action({ request, params }: Route.ActionArgs) {
  const submission = parseWithZod(await request.formData(), { schema: resetSchema });
  if (submission.status !== "success") return data(submission.reply({ hideFields: ["password", "confirm"] }), { status: 400 });
  const state = await resetPassword(params.token, submission.value.password);
  if (state !== "valid") return data(submission.reply({ formErrors: [PROBLEMS[state]], hideFields: ["password", "confirm"] }), { status: 410 });
  throw redirect("/sign-in?notice=password-reset");
}

export default function ResetPassword({ loaderData, actionData }: Route.ComponentProps) {
  const [form, fields] = useForm<z.input<typeof resetSchema>>({ lastResult: actionData });
  return (
    <div className="mx-auto max-w-md">
      <h1 className="mb-6 text-3xl font-bold tracking-tight">Choose a new password</h1>
      {loaderData.state !== "valid" ? (
        <Panel>
          <p role="alert" className="font-medium text-fail">⚠ {PROBLEMS[loaderData.state]}</p>
          <p className="mt-4"><Link className="font-semibold text-copper-deep underline underline-offset-4" to="/reset-password">Ask for a new link</Link></p>
        </Panel>
      ) : (
        <Panel>
          <Form method="post" {...getFormProps(form)} className="space-y-4">
            <FormErrors errors={form.errors} id={form.errorId} />
            <TextField meta={fields.password} label="New password" type="password" autoComplete="new-password" hint="At least 10 characters. Every device signed in to your account will be signed out." />
            <TextField meta={fields.confirm} label="New password again" type="password" autoComplete="new-password" />
            <Button type="submit" className="w-full">Save new password</Button>
          </Form>
        </Panel>
      )}
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "New password · Countersign" }];

export const handle = PLAIN_PAGE;
