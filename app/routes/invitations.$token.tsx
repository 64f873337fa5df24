import { data, Form, redirect } from "react-router";
import type { Route } from "./+types/invitations.$token";
import { optionalUser, requireUser } from "~/accounts/auth.server";
import { acceptInvitation, describeInvitation, InvitationError } from "~/projects/invitations.server";
import { ROLE_LABELS } from "~/projects/permissions";
import { Button, ButtonLink } from "~/ui/button";
import { FormErrors } from "~/ui/form";
import { Panel } from "~/ui/shell";

const CLOSED = {
  expired: "This invitation has expired. Ask the project manager for a new one.",
  used: "This invitation has already been used.",
  revoked: "This invitation was withdrawn by the project manager.",
  unknown: "This invitation link is not valid. Check you copied the whole link.",
} as const;

export async function loader({ context, params }: Route.LoaderArgs) {
  const user = optionalUser(context);
  return { invitation: await describeInvitation(params.token), user };
}

export async function action({ context, request, params }: Route.ActionArgs) {
  const user = requireUser(context, request);
  try {
    const projectId = await acceptInvitation(params.token, user);
    throw redirect(`/projects/${projectId}`);
  } catch (error) {
    if (error instanceof InvitationError) return data({ error: error.message }, { status: 409 });
    throw error;
  }
}

export default function InvitationPage({ loaderData, actionData, params }: Route.ComponentProps) {
  const { invitation, user } = loaderData;
  const here = `/invitations/${params.token}`;
  if (invitation.state !== "open") {
    return (
      <div className="mx-auto max-w-lg"><Panel><h1 className="text-2xl font-bold">Invitation</h1><p role="alert" className="mt-3 font-medium text-fail">⚠ {CLOSED[invitation.state]}</p></Panel></div>
    );
  }
  const mismatch = user && user.email.toLowerCase() !== invitation.email;
  return (
    <div className="mx-auto max-w-lg">
      <Panel>
        <h1 className="text-2xl font-bold">Join {invitation.projectName}</h1>
        <p className="mt-3 text-ink-soft">
          {invitation.invitedBy} invited <strong className="text-ink">{invitation.email}</strong> to this project as{" "}
          <strong className="text-ink">{ROLE_LABELS[invitation.role].toLowerCase()}</strong>.
        </p>
        <div className="mt-6 space-y-4">
          <FormErrors errors={actionData?.error ? [actionData.error] : undefined} />
          {!user ? (
            <div className="flex flex-wrap gap-3">
              <ButtonLink to={`/sign-in?redirectTo=${encodeURIComponent(here)}`}>Sign in to accept</ButtonLink>
              <ButtonLink variant="quiet" to={`/sign-up?redirectTo=${encodeURIComponent(here)}`}>Create an account</ButtonLink>
            </div>
          ) : mismatch ? (
            <p role="alert" className="font-medium text-fail">
              ⚠ This invitation is for {invitation.email}, but you are signed in as {user.email}. Sign out and sign in with the invited address.
            </p>
          ) : (
            <Form method="post"><Button type="submit">Accept and open the project</Button></Form>
          )}
        </div>
      </Panel>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Invitation · Countersign" }];
