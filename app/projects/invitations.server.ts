// Invitations: a manager invites an e-mail address in a role; the link is accepted by signing in or signing up
// with that same address. Tokens are stored as hashes, expire, and work once.
import { Op } from "sequelize";
import { Invitation, Project, ProjectMember, sequelize, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { appLink, sendMail } from "../platform/mailer.server";
import { hashToken, newToken } from "../platform/tokens.server";
import { MembershipError } from "./members.server";
import { ROLE_LABELS, type Role } from "./permissions";

export const INVITATION_TTL_DAYS = 14;

export async function inviteMember(actor: { id: string; name: string }, projectId: string, email: string, role: Role) {
  email = email.toLowerCase();
  const { token, hash } = newToken();
  const project = await sequelize.transaction(async (transaction) => {
    const project = await Project.findByPk(projectId, { attributes: ["id", "name"], transaction });
    if (!project) throw new MembershipError("This project no longer exists.", 404);
    const existing = await User.findOne({ where: { email }, attributes: ["id"], transaction });
    if (existing && (await ProjectMember.count({ where: { projectId, userId: existing.id }, transaction }))) {
      throw new MembershipError(`${email} is already a member of this project.`, 422);
    }
    // A new invitation to the same address replaces any earlier open one.
    await Invitation.update(
      { revokedAt: new Date() },
      { where: { projectId, email, acceptedAt: null, revokedAt: null }, transaction },
    );
    const invitation = await Invitation.create(
      {
        projectId,
        email,
        role,
        tokenHash: hash,
        invitedById: actor.id,
        expiresAt: new Date(Date.now() + INVITATION_TTL_DAYS * 86_400_000),
        acceptedAt: null,
        acceptedById: null,
        revokedAt: null,
      },
      { transaction },
    );
    await audit(
      { action: "invitation.sent", actorId: actor.id, projectId, subjectType: "invitation", subjectId: invitation.id, data: { email, role } },
      transaction,
    );
    return project;
  });
  await sendMail({
    to: email,
    subject: `${actor.name} invited you to ${project.name} on Countersign`,
    text: `${actor.name} invited you to join the project "${project.name}" as ${ROLE_LABELS[role].toLowerCase()}.\n\nSign in or create an account with this e-mail address (${email}) to accept. The invitation is valid for ${INVITATION_TTL_DAYS} days.`,
    action: { label: "Open the invitation", url: appLink(`/invitations/${token}`) },
  });
}

export async function listOpenInvitations(projectId: string) {
  const rows = await Invitation.findAll({
    where: { projectId, acceptedAt: null, revokedAt: null, expiresAt: { [Op.gt]: new Date() } },
    attributes: ["id", "email", "role", "expiresAt", "createdAt"],
    order: [["createdAt", "DESC"]],
  });
  return rows.map((r) => r.get({ plain: true }));
}

export async function revokeInvitation(actorId: string, projectId: string, invitationId: string) {
  await sequelize.transaction(async (transaction) => {
    const [count] = await Invitation.update(
      { revokedAt: new Date() },
      { where: { id: invitationId, projectId, acceptedAt: null, revokedAt: null }, transaction },
    );
    if (count) {
      await audit({ action: "invitation.revoked", actorId, projectId, subjectType: "invitation", subjectId: invitationId }, transaction);
    }
  });
}

export type InvitationView =
  | { state: "open"; email: string; role: Role; projectName: string; invitedBy: string }
  | { state: "expired" | "used" | "revoked" | "unknown" };

export async function describeInvitation(token: string): Promise<InvitationView> {
  const row = await Invitation.findOne({
    where: { tokenHash: hashToken(token) },
    include: [
      { model: Project, as: "project", attributes: ["name"] },
      { model: User, as: "invitedBy", attributes: ["name"] },
    ],
  });
  if (!row) return { state: "unknown" };
  if (row.acceptedAt) return { state: "used" };
  if (row.revokedAt) return { state: "revoked" };
  if (row.expiresAt < new Date()) return { state: "expired" };
  const r = row as unknown as { project: Project; invitedBy: User };
  return { state: "open", email: row.email, role: row.role, projectName: r.project.name, invitedBy: r.invitedBy.name };
}

export class InvitationError extends Error {}

/** Accepts for the signed-in user, who must hold the invited address. Returns the project id. */
export async function acceptInvitation(token: string, user: { id: string; email: string }) {
  return sequelize.transaction(async (transaction) => {
    const row = await Invitation.findOne({ where: { tokenHash: hashToken(token) }, transaction, lock: transaction.LOCK.UPDATE });
    if (!row) throw new InvitationError("This invitation link is not valid. Ask the project manager for a new one.");
    if (row.acceptedAt) throw new InvitationError("This invitation has already been used.");
    if (row.revokedAt) throw new InvitationError("This invitation was withdrawn by the project manager.");
    if (row.expiresAt < new Date()) throw new InvitationError("This invitation has expired. Ask the project manager for a new one.");
    if (row.email !== user.email.toLowerCase()) {
      throw new InvitationError(
        `This invitation is for ${row.email}, but you are signed in as ${user.email}. Sign out and sign in with the invited address.`,
      );
    }
    const already = await ProjectMember.findOne({ where: { projectId: row.projectId, userId: user.id }, transaction });
    if (!already) await ProjectMember.create({ projectId: row.projectId, userId: user.id, role: row.role }, { transaction });
    await row.update({ acceptedAt: new Date(), acceptedById: user.id }, { transaction });
    await audit(
      { action: "invitation.accepted", actorId: user.id, projectId: row.projectId, subjectType: "invitation", subjectId: row.id, data: { role: row.role } },
      transaction,
    );
    return row.projectId;
  });
}
