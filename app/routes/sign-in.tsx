import { getFormProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import type { z } from "zod";
import { data, Form, Link, redirect, useSearchParams } from "react-router";
import type { Route } from "./+types/sign-in";
import { authenticator, optionalUser, SignInError } from "~/accounts/auth.server";
import { signInSchema } from "~/accounts/schemas";
import { startSession } from "~/accounts/session.server";
import { safeRedirect } from "~/platform/http.server";
import { Button } from "~/ui/button";
import { FormErrors, TextField } from "~/ui/form";
import { PLAIN_PAGE } from "~/ui/plain-page";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  if (optionalUser(context)) throw redirect(safeRedirect(new URL(request.url).searchParams.get("redirectTo")));
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const formData = await request.clone().formData();
  const submission = parseWithZod(formData, { schema: signInSchema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  try {
    const userId = await authenticator.authenticate("password", request);
    return startSession(request, userId, safeRedirect(submission.value.redirectTo));
  } catch (error) {
    if (error instanceof SignInError) {
      return data(submission.reply({ formErrors: [error.message], hideFields: ["password"] }), { status: error.status });
    }
    throw error;
  }
}

export default function SignIn({ actionData }: Route.ComponentProps) {
  const [params] = useSearchParams();
  const [form, fields] = useForm<z.input<typeof signInSchema>>({ lastResult: actionData });
  const notice = params.get("notice");
  return (
    <div className="mx-auto max-w-md">
      <h1 className="mb-2 text-3xl font-bold tracking-tight">Sign in</h1>
      <p className="mb-6 text-ink-soft">Requests, reviews and signed approvals for your projects.</p>
      {notice === "password-reset" ? (
        <p role="status" className="mb-4 rounded-md border border-ok/40 bg-ok/5 px-4 py-3 text-sm text-ok">
          ✓ Your password was changed. Sign in with the new one.
        </p>
      ) : null}
      <Panel>
        <Form method="post" {...getFormProps(form)} className="space-y-4">
          <FormErrors errors={form.errors} id={form.errorId} />
          <input type="hidden" name="redirectTo" value={params.get("redirectTo") ?? ""} />
          <TextField meta={fields.email} label="E-mail address" type="email" autoComplete="email" />
          <TextField meta={fields.password} label="Password" type="password" autoComplete="current-password" />
          <Button type="submit" className="w-full">Sign in</Button>
        </Form>
      </Panel>
      <p className="mt-6 flex flex-wrap justify-between gap-2 text-sm">
        <Link className="font-semibold text-copper-deep underline underline-offset-4" to={`/sign-up${params.get("redirectTo") ? `?redirectTo=${encodeURIComponent(params.get("redirectTo")!)}` : ""}`}>
          Create an account
        </Link>
        <Link className="font-semibold text-copper-deep underline underline-offset-4" to="/reset-password">Forgot your password?</Link>
      </p>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Countersign" }];

export const handle = PLAIN_PAGE;
