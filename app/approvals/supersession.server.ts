// When the ground under an approval moves: a drawing revision it rests on is superseded, so it is flagged as
// needing re-approval and the team is told. Also the one way approvals e-mail a project's team.
import { Op, type Transaction } from "sequelize";
import { Approval, ProjectMember, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { queueMail } from "../platform/mail-queue.server";
import { appLink } from "../platform/mailer.server";

/** E-mails every member of the project except the actor (queued in the transaction). */
export async function notifyTeam(projectId: string, actorId: string | null, subject: string, text: string, path: string, transaction: Transaction) {
  const members = await ProjectMember.findAll({ where: { projectId }, include: [{ model: User, as: "user", attributes: ["email", "name", "id"] }], transaction });
  for (const m of members) {
    const u = (m as unknown as { user: User }).user;
    if (u.id === actorId) continue;
    await queueMail({ to: u.email, subject, text: `${u.name},\n\n${text}`, action: { label: "Open in Countersign", url: appLink(path) } }, transaction);
  }
}

/** Marks approvals that rest on any of these (now superseded) revisions as needing re-approval, and says so. */
export async function flagApprovalsRestingOn(projectId: string, revisionIds: string[], transaction: Transaction) {
  if (!revisionIds.length) return 0;
  const affected = await Approval.findAll({ where: { projectId, state: "current", restsOn: { [Op.overlap]: revisionIds } }, transaction });
  for (const a of affected) {
    await a.update({ state: "needs_reapproval", stateReason: "A drawing revision it rests on was superseded.", stateChangedAt: new Date() }, { transaction });
    await audit({ action: "approval.needs_reapproval", projectId, subjectType: "approval", subjectId: a.id, data: { revisionIds } }, transaction);
    await notifyTeam(projectId, null, `${a.reference} approval v${a.n} needs re-approval`, `A drawing revision that ${a.reference} approval v${a.n} rests on was superseded. The approval is flagged as needing re-approval: do not build from it until the engineer has reviewed the new revision.`, `/projects/${projectId}/site`, transaction);
  }
  return affected.length;
}

