// Issuing revisions: one transaction changes their status (an accepted revision supersedes the sheet's
// previous accepted one), records the transmittal with its items and recipients, and audits it all; after the
// commit each recipient gets an e-mail through the job queue (retried with backoff). Recipients see what was
// issued to them, and what is new since they last looked.
import { flagApprovalsRestingOn } from "../approvals/supersession.server";
import { Op } from "sequelize";
import { Drawing, DrawingRevision, ProjectMember, sequelize, Transmittal, TransmittalItem, TransmittalRecipient, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { defineJob } from "../platform/jobs.server";
import { appLink, sendMail } from "../platform/mailer.server";
import { DrawingError, UUID } from "./errors";
import { compareLabels, compareSheetNumbers } from "./labels";
import { ISSUABLE_FROM, STATUS_LABELS, type IssueStatus } from "./status";

export interface IssueInput {
  revisionIds: string[];
  status: IssueStatus;
  recipientIds: string[];
  reason: string;
}

const notify = defineJob<{ recipientId: string }>({
  name: "transmittal.notify",
  retryLimit: 5,
  retryDelaySeconds: 10,
  handler: async ({ recipientId }) => sendTransmittalMail(recipientId),
});

export async function issueRevisions(actor: { id: string; name: string }, projectId: string, input: IssueInput) {
  const revisionIds = [...new Set(input.revisionIds)];
  const recipientIds = [...new Set(input.recipientIds)];
  const transmittal = await sequelize.transaction(async (transaction) => {
    // One issue at a time per project keeps transmittal numbers and superseding consistent.
    await sequelize.query("SELECT pg_advisory_xact_lock(hashtext(:key))", { replacements: { key: `transmittal:${projectId}` }, transaction });
    const revisions = await DrawingRevision.findAll({
      where: { id: { [Op.in]: revisionIds }, projectId },
      attributes: ["id", "drawingId", "label", "status"],
      include: [{ model: Drawing, as: "drawing", attributes: ["sheetNumber"] }],
      transaction,
      lock: { level: transaction.LOCK.UPDATE, of: DrawingRevision },
    });
    if (revisions.length !== revisionIds.length) throw new DrawingError("One of the chosen revisions is not in this project.", 404);
    const drawings = new Set(revisions.map((r) => r.drawingId));
    if (input.status === "accepted" && drawings.size !== revisions.length) {
      throw new DrawingError("Only one revision per sheet can be accepted for construction at a time.", 422, "two_per_sheet");
    }
    for (const r of revisions) {
      if (!ISSUABLE_FROM.includes(r.status)) {
        const sheet = (r as DrawingRevision & { drawing: Drawing }).drawing.sheetNumber;
        throw new DrawingError(`Revision ${r.label} of ${sheet} is ${STATUS_LABELS[r.status].toLowerCase()} and cannot be issued.`, 409, "not_issuable");
      }
    }
    const members = await ProjectMember.findAll({ where: { projectId, userId: { [Op.in]: recipientIds } }, attributes: ["userId"], transaction });
    if (members.length !== recipientIds.length) throw new DrawingError("Transmittals go to members of this project only.", 422, "not_member");

    const now = new Date();
    for (const r of revisions) {
      if (input.status === "accepted" && r.status !== "accepted") {
        const previous = await DrawingRevision.findOne({
          where: { drawingId: r.drawingId, projectId, status: "accepted", id: { [Op.ne]: r.id } },
          attributes: ["id", "label"],
          transaction,
          lock: transaction.LOCK.UPDATE,
        });
        if (previous) {
          await DrawingRevision.update({ status: "superseded", supersededById: r.id }, { where: { id: previous.id }, transaction });
          await audit(
            { action: "revision.superseded", actorId: actor.id, projectId, subjectType: "drawing_revision", subjectId: previous.id, data: { label: previous.label, by: r.id, byLabel: r.label } },
            transaction,
          );
          await flagApprovalsRestingOn(projectId, [previous.id], transaction);
        }
        await DrawingRevision.update({ status: "accepted", supersedesId: previous?.id ?? null, issuedById: actor.id, issuedAt: now }, { where: { id: r.id }, transaction });
      } else if (input.status === "for_review" && r.status !== "accepted") {
        await DrawingRevision.update({ status: "for_review", issuedById: actor.id, issuedAt: now }, { where: { id: r.id }, transaction });
      }
      await audit(
        { action: "revision.issued", actorId: actor.id, projectId, subjectType: "drawing_revision", subjectId: r.id, data: { from: r.status, to: input.status === "for_review" && r.status === "accepted" ? "accepted" : input.status } },
        transaction,
      );
    }

    const last = (await Transmittal.max("number", { where: { projectId }, transaction })) as number | null;
    const t = await Transmittal.create({ projectId, number: (last ?? 0) + 1, reason: input.reason, issuedStatus: input.status, issuedById: actor.id }, { transaction });
    await TransmittalItem.bulkCreate(revisions.map((r) => ({ transmittalId: t.id, revisionId: r.id })), { transaction });
    const recipients = await TransmittalRecipient.bulkCreate(recipientIds.map((userId) => ({ transmittalId: t.id, userId })), { transaction, returning: true });
    await audit(
      { action: "transmittal.created", actorId: actor.id, projectId, subjectType: "transmittal", subjectId: t.id, data: { number: t.number, revisions: revisionIds, recipients: recipientIds, status: input.status } },
      transaction,
    );
    return { id: t.id, number: t.number, recipientRowIds: recipients.map((r) => r.id) };
  });
  for (const recipientId of transmittal.recipientRowIds) {
    await notify.send({ recipientId }, { singletonKey: recipientId }).catch((e) => console.error("could not queue transmittal mail:", (e as Error).message));
  }
  return { id: transmittal.id, number: transmittal.number };
}

export async function withdrawRevision(actorId: string, projectId: string, revisionId: string, reason: string) {
  await sequelize.transaction(async (transaction) => {
    const rev = await DrawingRevision.findOne({ where: { id: revisionId, projectId }, attributes: ["id", "status", "label"], transaction, lock: transaction.LOCK.UPDATE });
    if (!rev) throw new DrawingError("No such revision in this project.", 404);
    if (rev.status === "withdrawn" || rev.status === "superseded") throw new DrawingError(`This revision is already ${rev.status}.`, 409);
    await DrawingRevision.update({ status: "withdrawn" }, { where: { id: rev.id }, transaction });
    await audit({ action: "revision.withdrawn", actorId, projectId, subjectType: "drawing_revision", subjectId: rev.id, data: { from: rev.status, reason } }, transaction);
  });
}

async function sendTransmittalMail(recipientId: string) {
  const recipient = await TransmittalRecipient.findByPk(recipientId, {
    include: [
      { model: User, as: "user", attributes: ["email", "name"] },
      { model: Transmittal, as: "transmittal", include: [{ model: User, as: "issuedBy", attributes: ["name"] }] },
    ],
  });
  if (!recipient || recipient.mailedAt) return;
  const { user, transmittal } = recipient as TransmittalRecipient & { user: User; transmittal: Transmittal & { issuedBy: User } };
  const items = await itemsOf(transmittal.id);
  const lines = items.map((i) => `• ${i.sheetNumber} revision ${i.label} — ${i.title}`).join("\n");
  await sendMail({
    to: user.email,
    subject: `Transmittal ${transmittal.number}: ${items.length} revision(s) ${transmittal.issuedStatus === "accepted" ? "accepted for construction" : "issued for review"}`,
    text: `${user.name},\n\n${transmittal.issuedBy.name} issued these revisions to you (${STATUS_LABELS[transmittal.issuedStatus].toLowerCase()}):\n\n${lines}\n\nWhy: ${transmittal.reason}`,
    action: { label: "Open the transmittal", url: appLink(`/projects/${transmittal.projectId}/transmittals/${transmittal.id}`) },
  });
  await TransmittalRecipient.update({ mailedAt: new Date() }, { where: { id: recipientId } });
}

async function itemsOf(transmittalId: string) {
  const items = await TransmittalItem.findAll({
    where: { transmittalId },
    include: [{ model: DrawingRevision, as: "revision", attributes: ["id", "label", "status", "drawingId"], include: [{ model: Drawing, as: "drawing", attributes: ["sheetNumber", "title"] }] }],
  });
  return items
    .map((i) => {
      const r = (i as TransmittalItem & { revision: DrawingRevision & { drawing: Drawing } }).revision;
      return { revisionId: r.id, drawingId: r.drawingId, label: r.label, status: r.status, sheetNumber: r.drawing.sheetNumber, title: r.drawing.title };
    })
    .sort((a, b) => compareSheetNumbers(a.sheetNumber, b.sheetNumber) || compareLabels(a.label, b.label));
}

export interface TransmittalSummary {
  id: string;
  number: number;
  reason: string;
  issuedStatus: IssueStatus;
  issuedBy: string;
  createdAt: string;
  toMe: boolean;
  seenAt: string | null;
  isNew: boolean;
  recipients: { name: string; seenAt: string | null; mailedAt: string | null }[];
  items: Awaited<ReturnType<typeof itemsOf>>;
}

/** Transmittals of the project the user may see: all of them for issuers, else those sent to them. */
export async function listTransmittals(projectId: string, userId: string, seeAll: boolean): Promise<TransmittalSummary[]> {
  const mine = await TransmittalRecipient.findAll({ where: { userId }, attributes: ["transmittalId"] });
  const where = seeAll ? { projectId } : { projectId, id: { [Op.in]: mine.map((m) => m.transmittalId) } };
  const rows = await Transmittal.findAll({
    where,
    include: [
      { model: User, as: "issuedBy", attributes: ["name"] },
      { model: TransmittalRecipient, as: "recipients", include: [{ model: User, as: "user", attributes: ["name"] }] },
    ],
    order: [["number", "DESC"]],
    limit: 200,
  });
  return Promise.all(rows.map((t) => summarise(t, userId)));
}

async function summarise(t: Transmittal, userId: string): Promise<TransmittalSummary> {
  const { issuedBy, recipients } = t as Transmittal & { issuedBy: User; recipients: (TransmittalRecipient & { user: User })[] };
  const me = recipients.find((r) => r.userId === userId);
  return {
    id: t.id,
    number: t.number,
    reason: t.reason,
    issuedStatus: t.issuedStatus,
    issuedBy: issuedBy.name,
    createdAt: t.createdAt.toISOString(),
    toMe: !!me,
    seenAt: me?.seenAt?.toISOString() ?? null,
    isNew: !!me && !me.seenAt,
    recipients: recipients.map((r) => ({ name: r.user.name, seenAt: r.seenAt?.toISOString() ?? null, mailedAt: r.mailedAt?.toISOString() ?? null })),
    items: await itemsOf(t.id),
  };
}

/** One transmittal, for a recipient or an issuer; opening it marks it seen for the recipient. */
export async function openTransmittal(projectId: string, userId: string, transmittalId: string, seeAll: boolean) {
  if (!UUID.test(transmittalId)) throw new DrawingError("No such transmittal.", 404);
  const t = await Transmittal.findOne({
    where: { id: transmittalId, projectId },
    include: [
      { model: User, as: "issuedBy", attributes: ["name"] },
      { model: TransmittalRecipient, as: "recipients", include: [{ model: User, as: "user", attributes: ["name"] }] },
    ],
  });
  if (!t) throw new DrawingError("No such transmittal.", 404);
  const summary = await summarise(t, userId);
  if (!summary.toMe && !seeAll) throw new DrawingError("No such transmittal.", 404);
  if (summary.toMe && !summary.seenAt) {
    await TransmittalRecipient.update({ seenAt: new Date() }, { where: { transmittalId, userId, seenAt: null } });
  }
  return summary;
}

export async function countUnseen(projectId: string, userId: string) {
  return TransmittalRecipient.count({
    where: { userId, seenAt: null },
    include: [{ model: Transmittal, as: "transmittal", where: { projectId }, attributes: [] }],
  });
}
