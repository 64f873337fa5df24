// Markups on a request's sheets: every member of the project reads them; engineers draw, change and remove them.
// Every write checks the shape (schema, then that it lies on the revision's page), scopes the revision to the
// project, checks the markup's version so a stale edit never overwrites someone else's, and writes its audit event.
import { Op, type Transaction } from "sequelize";
import { z } from "zod";
import { DeviationRequest, DrawingRevision, Markup, sequelize, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { can, type Role } from "../projects/permissions";
import { RequestError, UUID } from "../requests/errors";
import { parseInput } from "../requests/requests.server";
import { markupShapeSchema, offPage, type MarkupKind, type MarkupShape } from "./markups";

export const MARKUP_STALE = "Someone else changed this markup since you loaded it. It now shows their version; draw your change again if it is still needed.";
const CLOSED = ["withdrawn", "superseded"];

export interface MarkupView {
  id: string;
  revisionId: string;
  page: number;
  kind: MarkupKind;
  shape: MarkupShape;
  author: { id: string; name: string };
  version: number;
  updatedAt: string;
}

interface Viewer {
  id: string;
  role: Role;
}

const uuid = (what: string) => z.string().regex(UUID, `Choose ${what}.`);
const createSchema = z.object({ revisionId: uuid("a drawing revision"), page: z.coerce.number().int().min(1, "Pages start at 1."), shape: markupShapeSchema });
const updateSchema = z.object({ version: z.coerce.number().int().min(1), shape: markupShapeSchema });
const deleteSchema = z.object({ version: z.coerce.number().int().min(1) });

function toView(m: Markup): MarkupView {
  const author = (m as Markup & { author?: User }).author;
  return {
    id: m.id,
    revisionId: m.revisionId,
    page: m.page,
    kind: m.kind as MarkupKind,
    shape: m.shape,
    author: { id: m.authorId, name: author?.name ?? "—" },
    version: m.version,
    updatedAt: m.updatedAt.toISOString(),
  };
}

/** The request, if the viewer may see it (a draft is its author's own). */
async function visibleRequest(projectId: string, requestId: string, viewer: Viewer, transaction?: Transaction) {
  if (!UUID.test(requestId)) throw new RequestError("No such request in this project.", 404);
  const request = await DeviationRequest.findOne({ where: { id: requestId, projectId }, attributes: ["id", "state", "createdById"], transaction, lock: transaction?.LOCK.UPDATE });
  if (!request || (request.state === "draft" && request.createdById !== viewer.id)) throw new RequestError("No such request in this project.", 404);
  return request;
}

function requireReviewer(viewer: Viewer) {
  if (!can(viewer.role, "requests.review")) throw new RequestError("Only an engineer on this project can mark up the sheet.", 403);
}

/** The revision's page size; 404 for a revision of another project, 422 for a page it does not have. */
export async function revisionPage(projectId: string, revisionId: string, page: number, transaction?: Transaction) {
  const revision = UUID.test(revisionId) ? await DrawingRevision.findOne({ where: { id: revisionId, projectId }, attributes: ["id", "pages", "pageCount"], transaction }) : null;
  if (!revision) throw new RequestError("That drawing revision is not on this project.", 404);
  const size = revision.pages[page - 1];
  if (!size) throw new RequestError(`That revision has ${revision.pages.length} page(s); there is no page ${page}.`, 422, "invalid", [{ path: "page", message: `Choose a page from 1 to ${revision.pages.length}.` }]);
  return size;
}

async function checkOnPage(projectId: string, revisionId: string, page: number, shape: MarkupShape, transaction: Transaction) {
  const size = await revisionPage(projectId, revisionId, page, transaction);
  const off = offPage(shape, size);
  if (off) throw new RequestError(`The markup does not fit on the page. ${off}`, 422, "invalid", [{ path: "shape.points", message: off }]);
}

export async function listMarkups(projectId: string, requestId: string, viewer: Viewer, filter: MarkupFilter = {}) {
  await visibleRequest(projectId, requestId, viewer);
  return markupsOf(projectId, requestId, filter);
}

type MarkupFilter = { revisionId?: string | null; page?: number | null };

/** The request's live markups, for a caller that has already checked the viewer may see the request. */
export async function markupsOf(projectId: string, requestId: string, filter: MarkupFilter = {}) {
  const where: Record<string, unknown> = { projectId, requestId, deletedAt: null };
  if (filter.revisionId) {
    if (!UUID.test(filter.revisionId)) throw new RequestError("That drawing revision is not on this project.", 404);
    where.revisionId = filter.revisionId;
  }
  if (filter.page) where.page = filter.page;
  // Plain rows: a request can carry thousands of markups, and each would otherwise become a model instance.
  const rows = await Markup.findAll({
    where,
    attributes: ["id", "revisionId", "page", "kind", "shape", "authorId", "version", "updatedAt"],
    include: [{ model: User, as: "author", attributes: ["id", "name"] }],
    order: [["createdAt", "ASC"], ["id", "ASC"]],
    raw: true,
    nest: true,
  });
  return rows.map((m) => toView(m as Markup));
}

/** The non-deleted markups of a request on the given revisions, for the signed pack and its record. */
export async function markupsForPack(requestId: string, revisionIds: string[], transaction?: Transaction) {
  if (!revisionIds.length) return [];
  const rows = await Markup.findAll({ where: { requestId, revisionId: { [Op.in]: revisionIds }, deletedAt: null }, order: [["createdAt", "ASC"], ["id", "ASC"]], transaction });
  return rows.map((m) => ({ id: m.id, revisionId: m.revisionId, page: m.page, kind: m.kind as MarkupKind, shape: m.shape, version: m.version }));
}

async function lockMarkup(projectId: string, requestId: string, markupId: string, transaction: Transaction) {
  const markup = UUID.test(markupId) ? await Markup.findOne({ where: { id: markupId, projectId, requestId }, transaction, lock: transaction.LOCK.UPDATE }) : null;
  if (!markup || markup.deletedAt) throw new RequestError("No such markup on this request (it may have been removed).", 404);
  return markup;
}

function requireOpen(request: DeviationRequest) {
  if (CLOSED.includes(request.state)) throw new RequestError("This request is closed, so its markups cannot change now.", 409, "closed");
}

export async function createMarkup(actor: Viewer, projectId: string, requestId: string, input: unknown) {
  requireReviewer(actor);
  const v = parseInput(createSchema, input, "The markup needs attention.");
  return sequelize.transaction(async (transaction) => {
    requireOpen(await visibleRequest(projectId, requestId, actor, transaction));
    await checkOnPage(projectId, v.revisionId, v.page, v.shape, transaction);
    const markup = await Markup.create({ projectId, requestId, revisionId: v.revisionId, page: v.page, kind: v.shape.kind, shape: v.shape, authorId: actor.id }, { transaction });
    await audit({ action: "markup.created", actorId: actor.id, projectId, subjectType: "markup", subjectId: markup.id, data: { requestId, revisionId: v.revisionId, page: v.page, kind: v.shape.kind } }, transaction);
    return reload(markup.id, transaction);
  });
}

export async function updateMarkup(actor: Viewer, projectId: string, requestId: string, markupId: string, input: unknown) {
  requireReviewer(actor);
  const v = parseInput(updateSchema, input, "The markup needs attention.");
  return sequelize.transaction(async (transaction) => {
    requireOpen(await visibleRequest(projectId, requestId, actor, transaction));
    const markup = await lockMarkup(projectId, requestId, markupId, transaction);
    if (markup.version !== v.version) throw new RequestError(MARKUP_STALE, 409, "stale");
    if (v.shape.kind !== markup.kind) throw new RequestError(`A ${markup.kind} stays a ${markup.kind}; draw a new markup instead.`, 422, "invalid", [{ path: "shape.kind", message: "The kind of a markup cannot change." }]);
    await checkOnPage(projectId, markup.revisionId, markup.page, v.shape, transaction);
    await markup.update({ shape: v.shape, version: markup.version + 1 }, { transaction });
    await audit({ action: "markup.updated", actorId: actor.id, projectId, subjectType: "markup", subjectId: markup.id, data: { requestId, version: markup.version } }, transaction);
    return reload(markup.id, transaction);
  });
}

export async function deleteMarkup(actor: Viewer, projectId: string, requestId: string, markupId: string, input: unknown) {
  requireReviewer(actor);
  const v = parseInput(deleteSchema, input, "Say which version of the markup you are removing.");
  return sequelize.transaction(async (transaction) => {
    requireOpen(await visibleRequest(projectId, requestId, actor, transaction));
    const markup = await lockMarkup(projectId, requestId, markupId, transaction);
    if (markup.version !== v.version) throw new RequestError(MARKUP_STALE, 409, "stale");
    await markup.update({ deletedAt: new Date(), version: markup.version + 1 }, { transaction });
    await audit({ action: "markup.deleted", actorId: actor.id, projectId, subjectType: "markup", subjectId: markup.id, data: { requestId, kind: markup.kind } }, transaction);
    return { id: markup.id };
  });
}

async function reload(id: string, transaction: Transaction) {
  const m = await Markup.findByPk(id, { include: [{ model: User, as: "author", attributes: ["id", "name"] }], transaction });
  return toView(m!);
}
