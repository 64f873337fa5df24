// The conversation on a request: any member may write; "@Name" mentions of project members are resolved on
// the server and mailed; files are uploaded first (as comment attachments) and linked when the comment is sent.
import { Op } from "sequelize";
import { Attachment, Comment, DeviationRequest, sequelize, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { listMembers } from "../projects/members.server";
import { RequestError, UUID } from "./errors";
import { extractMentions } from "./mentions";
import { notify } from "./notifications.server";
import { toAttachmentView, zodIssues, type Actor, type AttachmentView } from "./requests.server";
import { commentSchema } from "./schemas";

export interface CommentView {
  id: string;
  author: { id: string; name: string };
  body: string;
  mentions: string[];
  createdAt: string;
  attachments: AttachmentView[];
}

async function findRequest(projectId: string, requestId: string, viewerId?: string) {
  if (!UUID.test(requestId)) throw new RequestError("No such request in this project.", 404);
  const request = await DeviationRequest.findOne({ where: { id: requestId, projectId }, attributes: ["id", "number", "title", "projectId", "state", "createdById"] });
  if (!request || (viewerId && request.state === "draft" && request.createdById !== viewerId)) throw new RequestError("No such request in this project.", 404);
  return request;
}

export async function listComments(projectId: string, requestId: string): Promise<CommentView[]> {
  await findRequest(projectId, requestId);
  const rows = await Comment.findAll({
    where: { requestId },
    include: [
      { model: User, as: "author", attributes: ["id", "name"] },
      { model: Attachment, as: "attachments" },
    ],
    order: [["createdAt", "ASC"]],
  });
  return rows.map((c) => {
    const x = c as Comment & { author: User; attachments: Attachment[] };
    return {
      id: c.id,
      author: { id: x.author.id, name: x.author.name },
      body: c.body,
      mentions: c.mentions,
      createdAt: c.createdAt.toISOString(),
      attachments: x.attachments.map((a) => toAttachmentView(projectId, a)),
    };
  });
}

export async function addComment(actor: Actor, projectId: string, requestId: string, input: unknown) {
  const parsed = commentSchema.safeParse(input);
  if (!parsed.success) throw new RequestError("The comment needs attention.", 422, "invalid", zodIssues(parsed.error));
  const { body, attachmentIds } = parsed.data;
  const request = await findRequest(projectId, requestId, actor.id);
  const members = await listMembers(projectId);
  const mentions = extractMentions(body, members).filter((id) => id !== actor.id);
  return sequelize.transaction(async (transaction) => {
    const comment = await Comment.create({ requestId, authorId: actor.id, body, mentions }, { transaction });
    if (attachmentIds.length) {
      const [linked] = await Attachment.update(
        { commentId: comment.id },
        { where: { id: { [Op.in]: attachmentIds }, requestId, projectId, uploadedById: actor.id, commentId: null, versionN: null }, transaction },
      );
      if (linked !== new Set(attachmentIds).size) throw new RequestError("One of the files is not yours to attach here, or is already on another comment. Upload it again.", 422, "invalid", [{ path: "attachmentIds", message: "Upload the file again." }]);
    }
    await audit({ action: "request.commented", actorId: actor.id, projectId, subjectType: "deviation_request", subjectId: requestId, data: { commentId: comment.id, mentions, attachments: attachmentIds.length } }, transaction);
    if (mentions.length) await notify({ event: "mentioned", projectId, request, actor, to: mentions, note: body.slice(0, 500) }, transaction);
    return { id: comment.id, mentions };
  });
}
