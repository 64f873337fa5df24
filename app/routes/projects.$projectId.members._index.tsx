import { getFormProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/projects.$projectId.members._index";
import { inviteMember, listOpenInvitations, revokeInvitation } from "~/projects/invitations.server";
import { MemberPicker } from "~/projects/member-picker";
import { changeRole, listMembers, MembershipError, removeMember } from "~/projects/members.server";
import { can, ROLE_LABELS, ROLES } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { changeRoleSchema, inviteSchema, removeMemberSchema, revokeInvitationSchema } from "~/projects/schemas";
import { Button } from "~/ui/button";
import { FormErrors, SelectField, TextField } from "~/ui/form";
import { AlertIcon, CheckIcon, ClockIcon, MailIcon } from "~/ui/icons";
import { RoleBadge } from "~/ui/role-badge";
import { Panel } from "~/ui/shell";

const roleOptions = ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }));

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project, role, user } = requireProjectAction(context, request, "members.view");
  const manage = can(role, "members.manage");
  const [members, invitations] = await Promise.all([listMembers(project.id), manage ? listOpenInvitations(project.id) : []]);
  return { projectId: project.id, members, invitations, manage, me: user.id };
}

export async function action({ context, request }: Route.ActionArgs) {
  const { user, project } = requireProjectAction(context, request, "members.manage");
  const formData = await request.formData();
  const intent = formData.get("intent");
  const schema = { invite: inviteSchema, "change-role": changeRoleSchema, remove: removeMemberSchema, "revoke-invitation": revokeInvitationSchema }[String(intent)];
  if (!schema) return data({ intent: String(intent), result: null, error: "Unknown action.", done: undefined }, { status: 400 });
  const submission = parseWithZod(formData, { schema });
  if (submission.status !== "success") return data({ intent: String(intent), result: submission.reply(), error: null, done: undefined }, { status: 400 });
  const v = submission.value;
  try {
    if (v.intent === "invite") await inviteMember(user, project.id, v.email, v.role);
    if (v.intent === "change-role") await changeRole(user.id, project.id, v.memberId, v.role, v.version);
    if (v.intent === "remove") await removeMember(user.id, project.id, v.memberId);
    if (v.intent === "revoke-invitation") await revokeInvitation(user.id, project.id, v.invitationId);
  } catch (error) {
    if (error instanceof MembershipError) {
      return data({ intent: String(intent), result: submission.reply({ formErrors: [error.message] }), error: error.message, done: undefined }, { status: error.status });
    }
    throw error;
  }
  return { intent: String(intent), result: submission.reply({ resetForm: true }), error: null, done: v.intent === "invite" ? `Invitation sent to ${v.email}.` : undefined };
}

export default function Members({ loaderData, actionData }: Route.ComponentProps) {
  const { members, invitations, manage, me, projectId } = loaderData;
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <div className="space-y-6 lg:col-span-2">
        {actionData?.error && actionData.intent !== "invite" ? <FormErrors errors={[actionData.error]} /> : null}
        <Panel>
          <h2 className="mb-4 text-lg font-bold">Members ({members.length})</h2>
          <table className="w-full text-sm">
            <thead className="hidden text-left text-ink-soft sm:table-header-group">
              <tr><th className="pb-2 font-semibold">Name</th><th className="pb-2 font-semibold">Role</th>{manage ? <th className="pb-2"><span className="sr-only">Actions</span></th> : null}</tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {members.map((m) => (
                <tr key={m.id} className="flex flex-col gap-2 py-3 sm:table-row" data-testid={`member-${m.email}`}>
                  <td className="sm:py-3">
                    <p className="font-semibold">{m.name}{m.userId === me ? <span className="text-ink-soft"> (you)</span> : null}</p>
                    <p className="text-ink-soft">{m.email}</p>
                    {m.registrationState ? <RegistrationState state={m.registrationState} /> : null}
                    {manage && m.role === "engineer" && m.userId !== me ? (
                      <Link to={`${m.id}/verify`} className="mt-1 inline-block text-xs font-semibold text-copper-deep underline underline-offset-4">
                        {m.registrationState === "verified" ? "Registration record" : "Verify registration"}
                      </Link>
                    ) : null}
                  </td>
                  <td className="sm:py-3">
                    {manage ? (
                      <Form method="post" className="flex items-center gap-2">
                        <input type="hidden" name="intent" value="change-role" />
                        <input type="hidden" name="memberId" value={m.id} />
                        <input type="hidden" name="version" value={m.version} />
                        <label className="sr-only" htmlFor={`role-${m.id}`}>Role of {m.name}</label>
                        <select id={`role-${m.id}`} name="role" defaultValue={m.role} key={`${m.id}-${m.version}`} className="rounded-md border border-rule bg-sheet px-2 py-1.5">
                          {roleOptions.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
                        </select>
                        <Button variant="quiet" className="px-3 py-1.5" type="submit">Change</Button>
                      </Form>
                    ) : (
                      <RoleBadge role={m.role} />
                    )}
                  </td>
                  {manage ? (
                    <td className="sm:py-3 sm:text-right">
                      <Form method="post" onSubmit={(e) => { if (!confirm(`Remove ${m.name} from this project?`)) e.preventDefault(); }}>
                        <input type="hidden" name="intent" value="remove" />
                        <input type="hidden" name="memberId" value={m.id} />
                        <Button variant="danger" className="px-3 py-1.5" type="submit">Remove</Button>
                      </Form>
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </Panel>
        {manage && invitations.length ? (
          <Panel>
            <h2 className="mb-4 text-lg font-bold">Invitations waiting</h2>
            <ul className="divide-y divide-rule text-sm">
              {invitations.map((i) => (
                <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                  <span className="flex items-center gap-2"><MailIcon className="text-copper" /> {i.email} · {ROLE_LABELS[i.role]}</span>
                  <Form method="post">
                    <input type="hidden" name="intent" value="revoke-invitation" />
                    <input type="hidden" name="invitationId" value={i.id} />
                    <Button variant="quiet" className="px-3 py-1.5" type="submit">Withdraw</Button>
                  </Form>
                </li>
              ))}
            </ul>
          </Panel>
        ) : null}
      </div>
      <div className="space-y-6">
        {manage ? <InviteForm lastResult={actionData?.intent === "invite" ? actionData.result : undefined} done={actionData?.done} /> : null}
        <Panel><MemberPicker projectId={projectId} /></Panel>
      </div>
    </div>
  );
}

function RegistrationState({ state }: { state: string }) {
  const text = { unverified: "Registration not yet verified", verified: "Registration verified", revoked: "Registration revoked" }[state] ?? state;
  const Icon = state === "verified" ? CheckIcon : state === "revoked" ? AlertIcon : ClockIcon;
  return <p className="mt-1 flex items-center gap-1.5 text-xs font-medium text-ink-soft"><Icon className="text-copper" /> {text}</p>;
}

function InviteForm({ lastResult, done }: { lastResult?: SubmissionResult<string[]> | null; done?: string }) {
  const navigation = useNavigation();
  const [form, fields] = useForm({
    id: "invite",
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: inviteSchema }),
  });
  return (
    <Panel>
      <h2 className="mb-4 text-lg font-bold">Invite someone</h2>
      {done ? <p role="status" className="mb-3 text-sm text-ok">✓ {done}</p> : null}
      <Form method="post" {...getFormProps(form)} className="space-y-4">
        <FormErrors errors={form.errors} id={form.errorId} />
        <input type="hidden" name="intent" value="invite" />
        <TextField meta={fields.email} label="E-mail address" type="email" />
        <SelectField meta={fields.role} label="Role on this project" options={roleOptions} placeholder="Choose…" />
        <Button type="submit" disabled={navigation.state === "submitting"}>Send invitation</Button>
      </Form>
    </Panel>
  );
}
