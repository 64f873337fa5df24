// E-mail about requests: who hears of what (submission, assignment, questions, resubmission, decision, mention),
// never the person who did it, never a member who muted the project. Queued in the caller's transaction.
import { Op, type Transaction } from "sequelize";
import { ProjectMember, ProjectMute, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { queueMail } from "../platform/mail-queue.server";
import { appLink } from "../platform/mailer.server";
import { requestCode } from "./due";

export type NoticeEvent = "submitted" | "assigned" | "info_requested" | "resubmitted" | "decided" | "mentioned" | "withdrawn";

export interface Notice {
  event: NoticeEvent;
  projectId: string;
  request: { id: string; number: number; title: string };
  actor: { id: string; name: string };
  to: (string | null | undefined)[];
  note?: string;
}

const SUBJECT: Record<NoticeEvent, (code: string, title: string) => string> = {
  submitted: (c, t) => `${c} submitted for your review: ${t}`,
  assigned: (c, t) => `${c} assigned to you: ${t}`,
  info_requested: (c, t) => `${c}: more information needed — ${t}`,
  resubmitted: (c, t) => `${c} resubmitted: ${t}`,
  decided: (c, t) => `${c} decided: ${t}`,
  mentioned: (c, t) => `You were mentioned on ${c}: ${t}`,
  withdrawn: (c, t) => `${c} withdrawn: ${t}`,
};

const LEAD: Record<NoticeEvent, (actor: string) => string> = {
  submitted: (a) => `${a} submitted a deviation request. You are the engineer assigned to review it.`,
  assigned: (a) => `${a} assigned this deviation request to you for review.`,
  info_requested: (a) => `${a} needs more information before deciding on your request.`,
  resubmitted: (a) => `${a} answered and resubmitted the request. Open the review desk to see what changed.`,
  decided: (a) => `${a} recorded a decision on this request.`,
  mentioned: (a) => `${a} mentioned you in the request's conversation.`,
  withdrawn: (a) => `${a} withdrew this request.`,
};

export async function notify(notice: Notice, transaction: Transaction) {
  const wanted = [...new Set(notice.to.filter((id): id is string => !!id && id !== notice.actor.id))];
  if (!wanted.length) return;
  const [members, muted] = await Promise.all([
    ProjectMember.findAll({ where: { projectId: notice.projectId, userId: { [Op.in]: wanted } }, attributes: ["userId"], transaction }),
    ProjectMute.findAll({ where: { projectId: notice.projectId, userId: { [Op.in]: wanted } }, attributes: ["userId"], transaction }),
  ]);
  const mutedIds = new Set(muted.map((m) => m.userId));
  const ids = members.map((m) => m.userId).filter((id) => !mutedIds.has(id));
  if (!ids.length) return;
  const users = await User.findAll({ where: { id: { [Op.in]: ids } }, attributes: ["id", "email", "name"], transaction });
  const code = requestCode(notice.request.number);
  for (const user of users) {
    const text = [`${user.name},`, `${code} — ${notice.request.title}`, LEAD[notice.event](notice.actor.name), notice.note ? `“${notice.note}”` : "", "You can mute e-mail about this project on its Requests page."]
      .filter(Boolean)
      .join("\n\n");
    await queueMail(
      {
        to: user.email,
        subject: SUBJECT[notice.event](code, notice.request.title),
        text,
        action: { label: "Open the request", url: appLink(`/projects/${notice.projectId}/requests/${notice.request.id}`) },
      },
      transaction,
    );
  }
}

export async function isMuted(projectId: string, userId: string) {
  return !!(await ProjectMute.findOne({ where: { projectId, userId }, attributes: ["id"] }));
}

export async function setMuted(projectId: string, userId: string, muted: boolean) {
  if (muted) await ProjectMute.findOrCreate({ where: { projectId, userId }, defaults: { projectId, userId } });
  else await ProjectMute.destroy({ where: { projectId, userId } });
  await audit({ action: muted ? "requests.muted" : "requests.unmuted", actorId: userId, projectId, subjectType: "project", subjectId: projectId });
}
