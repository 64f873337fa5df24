import { getFormProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/profile";
import { getProfile, updateProfile } from "~/accounts/accounts.server";
import { requireUser } from "~/accounts/auth.server";
import { PROFESSIONS, profileSchema } from "~/accounts/schemas";
import { notFound } from "~/platform/http.server";
import { Button } from "~/ui/button";
import { FormErrors, SelectField, TextField } from "~/ui/form";
import { CheckIcon, ClockIcon, AlertIcon } from "~/ui/icons";
import { PageTitle, Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const user = requireUser(context, request);
  const profile = await getProfile(user.id);
  if (!profile) notFound();
  return { profile };
}

export async function action({ context, request }: Route.ActionArgs) {
  const user = requireUser(context, request);
  const submission = parseWithZod(await request.formData(), { schema: profileSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), saved: false }, { status: 400 });
  await updateProfile(user.id, submission.value);
  return { result: submission.reply(), saved: true };
}

const STATE = {
  unverified: { Icon: ClockIcon, text: "Unverified — a project manager has not yet checked this registration. You can review but not sign." },
  verified: { Icon: CheckIcon, text: "Verified — you may sign approvals." },
  revoked: { Icon: AlertIcon, text: "Revoked — this registration may not sign approvals." },
} as const;

export default function Profile({ loaderData, actionData }: Route.ComponentProps) {
  const { profile } = loaderData;
  const navigation = useNavigation();
  const [form, fields] = useForm({
    lastResult: actionData?.result,
    defaultValue: {
      name: profile.name,
      phone: profile.phone ?? "",
      profession: profile.profession ?? "",
      registrationNumber: profile.registrationNumber ?? "",
      registrationBody: profile.registrationBody ?? "",
    },
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
    onValidate: ({ formData }) => parseWithZod(formData, { schema: profileSchema }),
  });
  const state = profile.registrationState ? STATE[profile.registrationState] : null;
  return (
    <div className="mx-auto max-w-2xl">
      <PageTitle title="Your profile" lead={`Signed in as ${profile.email}.`} />
      {actionData?.saved ? <p role="status" className="mb-4 rounded-md border border-ok/40 bg-ok/5 px-4 py-3 text-sm text-ok">✓ Profile saved.</p> : null}
      <Panel>
        <Form method="post" {...getFormProps(form)} className="space-y-4">
          <FormErrors errors={form.errors} id={form.errorId} />
          <TextField meta={fields.name} label="Full name" autoComplete="name" />
          <TextField meta={fields.phone} label="Mobile number" type="tel" autoComplete="tel" />
          <SelectField meta={fields.profession} label="Profession" options={PROFESSIONS} placeholder="Choose…" />
          <fieldset className="space-y-4 rounded-md border border-dashed border-rule p-4">
            <legend className="px-1 text-sm font-semibold">Professional registration</legend>
            {state ? (
              <p className="flex items-start gap-2 text-sm" data-testid="registration-state">
                <state.Icon className="mt-0.5 shrink-0 text-copper" /> {state.text}
              </p>
            ) : null}
            <TextField meta={fields.registrationNumber} label="Registration number" hint="Changing it makes it unverified again." />
            <TextField meta={fields.registrationBody} label="Registering body" />
          </fieldset>
          <Button type="submit" disabled={navigation.state === "submitting"}>Save profile</Button>
        </Form>
      </Panel>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Profile · Countersign" }];
