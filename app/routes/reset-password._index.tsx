import { getFormProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import type { z } from "zod";
import { data, Form, Link } from "react-router";
import type { Route } from "./+types/reset-password._index";
import { requestPasswordReset } from "~/accounts/reset.server";
import { resetRequestSchema } from "~/accounts/schemas";
import { Button } from "~/ui/button";
import { FormErrors, TextField } from "~/ui/form";
import { PLAIN_PAGE } from "~/ui/plain-page";
import { Panel } from "~/ui/shell";

export async function action({ request }: Route.ActionArgs) {
  const submission = parseWithZod(await request.formData(), { schema: resetRequestSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), sent: false }, { status: 400 });
  try {
    await requestPasswordReset(submission.value.email);
  } catch (error) {
    console.error("password reset mail failed:", error);
    return data(
      { result: submission.reply({ formErrors: ["The reset e-mail could not be sent just now. Try again in a few minutes."] }), sent: false },
      { status: 503 },
    );
  }
  return { result: submission.reply({ resetForm: true }), sent: true };
}

export default function ResetRequest({ actionData }: Route.ComponentProps) {
  const [form, fields] = useForm<z.input<typeof resetRequestSchema>>({
    lastResult: actionData?.result,
  });
  return (
    <div className="mx-auto max-w-md">
      <h1 className="mb-2 text-3xl font-bold tracking-tight">Reset your password</h1>
      <p className="mb-6 text-ink-soft">We will e-mail you a link that works once, for an hour.</p>
      {actionData?.sent ? (
        <p role="status" className="mb-4 rounded-md border border-ok/40 bg-ok/5 px-4 py-3 text-sm text-ok">
          ✓ If an account exists for that address, a reset link is on its way. Check your inbox.
        </p>
      ) : null}
      <Panel>
        <Form method="post" {...getFormProps(form)} className="space-y-4">
          <FormErrors errors={form.errors} id={form.errorId} />
          <TextField meta={fields.email} label="E-mail address" type="email" autoComplete="email" />
          <Button type="submit" className="w-full">Send reset link</Button>
        </Form>
      </Panel>
      <p className="mt-6 text-sm"><Link className="font-semibold text-copper-deep underline underline-offset-4" to="/sign-in">Back to sign in</Link></p>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Reset password · Countersign" }];

export const handle = PLAIN_PAGE;
