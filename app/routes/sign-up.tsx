import { getFormProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import type { z } from "zod";
import { data, Form, Link, redirect, useSearchParams } from "react-router";
import type { Route } from "./+types/sign-up";
import { DuplicateEmailError, signUp } from "~/accounts/accounts.server";
import { optionalUser } from "~/accounts/auth.server";
import { PROFESSIONS, signUpSchema } from "~/accounts/schemas";
import { startSession } from "~/accounts/session.server";
import { safeRedirect } from "~/platform/http.server";
import { Button } from "~/ui/button";
import { FormErrors, SelectField, TextField } from "~/ui/form";
import { PLAIN_PAGE } from "~/ui/plain-page";
import { Panel } from "~/ui/shell";

export async function loader({ context }: Route.LoaderArgs) {
  if (optionalUser(context)) throw redirect("/projects");
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const submission = parseWithZod(await request.formData(), { schema: signUpSchema });
  if (submission.status !== "success") return data(submission.reply({ hideFields: ["password"] }), { status: 400 });
  try {
    const user = await signUp(submission.value);
    return startSession(request, user.id, safeRedirect(submission.value.redirectTo));
  } catch (error) {
    if (error instanceof DuplicateEmailError) {
      return data(submission.reply({ fieldErrors: { email: [error.message] }, hideFields: ["password"] }), { status: 409 });
    }
    throw error;
  }
}

export default function SignUp({ actionData }: Route.ComponentProps) {
  const [params] = useSearchParams();
  const [form, fields] = useForm<z.input<typeof signUpSchema>>({ lastResult: actionData });
  const isEngineer = fields.profession.value === "engineer";
  return (
    <div className="mx-auto max-w-lg">
      <h1 className="mb-2 text-3xl font-bold tracking-tight">Create your account</h1>
      <p className="mb-6 text-ink-soft">One account for every project you are invited to, whatever your role on each.</p>
      <Panel>
        <Form method="post" {...getFormProps(form)} className="space-y-4">
          <FormErrors errors={form.errors} id={form.errorId} />
          <input type="hidden" name="redirectTo" value={params.get("redirectTo") ?? ""} />
          <TextField meta={fields.name} label="Full name" autoComplete="name" />
          <TextField meta={fields.email} label="E-mail address" type="email" autoComplete="email" />
          <TextField meta={fields.password} label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." />
          <TextField meta={fields.phone} label="Mobile number (optional)" type="tel" autoComplete="tel" />
          <SelectField meta={fields.profession} label="Profession" options={PROFESSIONS} placeholder="Choose…" />
          <fieldset className={`space-y-4 rounded-md border border-dashed border-rule p-4 ${isEngineer ? "" : "opacity-80"}`}>
            <legend className="px-1 text-sm font-semibold">Professional registration {isEngineer ? "" : "(engineers)"}</legend>
            <TextField meta={fields.registrationNumber} label="Registration number" hint="It stays unverified until a project manager checks it; only verified engineers can sign approvals." />
            <TextField meta={fields.registrationBody} label="Registering body" />
          </fieldset>
          <Button type="submit" className="w-full">Create account</Button>
        </Form>
      </Panel>
      <p className="mt-6 text-sm">
        Already have an account?{" "}
        <Link className="font-semibold text-copper-deep underline underline-offset-4" to={`/sign-in${params.get("redirectTo") ? `?redirectTo=${encodeURIComponent(params.get("redirectTo")!)}` : ""}`}>Sign in</Link>
      </p>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Create account · Countersign" }];

export const handle = PLAIN_PAGE;
