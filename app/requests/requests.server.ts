// Deviation requests: starting a draft (numbered per project under a lock), saving its content (a new version
// once the earlier one was sent), reading one request as its people see it, assigning the engineer and moving
// the due date. Every query is scoped by project, so an id from elsewhere is simply not found.
import { Op, type Transaction } from "sequelize";
import type { z } from "zod";
import { Attachment, DeviationRequest, ProjectMember, RequestVersion, sequelize, User, type Measurement } from "../../db/models";
import { audit } from "../platform/audit.server";
import type { Role } from "../projects/permissions";
import { isOverdue, requestCode, waitedFor } from "./due";
import { RequestError, STALE, UUID } from "./errors";
import { notify } from "./notifications.server";
import { contentSchema, type RequestContent } from "./schemas";
import { diffVersions, type VersionContent, type VersionDiff } from "./versions";
import { availableMoves, OPEN_STATES, type RequestAction, type RequestState } from "./workflow";

export interface Actor {
  id: string;
  name: string;
  role: Role;
}

/** States in which the requester may change the content. */
export const EDITABLE_STATES: readonly RequestState[] = ["draft", "info_requested"];
/** States in which the engineer has work on the request. */
const REVIEW_STATES: readonly RequestState[] = ["submitted", "in_review", "resubmitted"];

export function zodIssues(error: { issues: { path: PropertyKey[]; message: string }[] }) {
  return error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
}

/** Parses input with a schema; failures become a 422 with the field issues. */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown, message = "Some fields need attention."): z.output<S> {
  const parsed = schema.safeParse(input);
  if (!parsed.success) throw new RequestError(`${message} ${parsed.error.issues[0]?.message ?? ""}`.trim(), 422, "invalid", zodIssues(parsed.error));
  return parsed.data;
}

export function parseContent(input: unknown): RequestContent {
  const parsed = contentSchema.safeParse(input);
  if (!parsed.success) throw new RequestError("Some of the request's fields need attention.", 422, "invalid", zodIssues(parsed.error));
  return parsed.data;
}

/** The request row, locked for the rest of the transaction; 404 unless it belongs to the project. */
export async function lockRequest(projectId: string, requestId: string, transaction: Transaction) {
  if (!UUID.test(requestId)) throw new RequestError("No such request in this project.", 404);
  const request = await DeviationRequest.findOne({ where: { id: requestId, projectId }, transaction, lock: transaction.LOCK.UPDATE });
  if (!request) throw new RequestError("No such request in this project.", 404);
  return request;
}

export function checkLock(request: DeviationRequest, lockVersion: number) {
  if (request.lockVersion !== lockVersion) throw new RequestError(STALE, 409, "stale");
}

export async function latestVersion(requestId: string, transaction?: Transaction) {
  return RequestVersion.findOne({ where: { requestId }, order: [["n", "DESC"]], transaction, lock: transaction ? transaction.LOCK.UPDATE : undefined });
}

export async function createDraft(actor: Actor, projectId: string, input: unknown) {
  if (actor.role !== "site_plumber") throw new RequestError("Only a site plumber on this project can raise a request.", 403);
  const content = parseContent(input);
  return sequelize.transaction(async (transaction) => {
    // One number at a time per project: numbers are gap-free in order of creation, never shared.
    await sequelize.query("SELECT pg_advisory_xact_lock(hashtext(:key))", { replacements: { key: `request-number:${projectId}` }, transaction });
    const last = (await DeviationRequest.max("number", { where: { projectId }, transaction })) as number | null;
    const request = await DeviationRequest.create(
      { projectId, number: (last ?? 0) + 1, state: "draft", title: content.title, provision: content.provision, clauseRef: content.clauseRef, createdById: actor.id },
      { transaction },
    );
    await RequestVersion.create({ requestId: request.id, n: 1, ...content, createdById: actor.id }, { transaction });
    await audit(
      { action: "request.created", actorId: actor.id, projectId, subjectType: "deviation_request", subjectId: request.id, data: { number: request.number, provision: content.provision } },
      transaction,
    );
    return { id: request.id, number: request.number, code: requestCode(request.number) };
  });
}

/**
 * Saves the requester's content. A draft version is overwritten; once the latest version was sent to the
 * engineer, the first change makes a new version and the sent one stays as it was.
 */
export async function saveContent(actor: Actor, projectId: string, requestId: string, input: unknown) {
  const content = parseContent(input);
  return sequelize.transaction(async (transaction) => {
    const request = await lockRequest(projectId, requestId, transaction);
    if (request.createdById !== actor.id) throw new RequestError("Only the plumber who raised this request can change it.", 403);
    if (!EDITABLE_STATES.includes(request.state)) {
      throw new RequestError("This request is with the engineer, so its content cannot change now. Add a comment instead.", 409, "not_editable");
    }
    const version = await openVersion(actor, request, transaction);
    await version.update({ ...content }, { transaction });
    const n = version.n;
    await request.update({ title: content.title, provision: content.provision, clauseRef: content.clauseRef }, { transaction });
    return { versionN: n, savedAt: new Date().toISOString() };
  });
}

/**
 * The version the requester is editing: the latest, unless the engineer has already been sent it, in which case
 * a new version starts as a copy of it (and the sent one stays as it was).
 */
export async function openVersion(actor: Actor, request: DeviationRequest, transaction: Transaction) {
  const latest = (await latestVersion(request.id, transaction))!;
  if (!latest.submittedAt) return latest;
  const c = latest.get({ plain: true });
  const next = await RequestVersion.create(
    { requestId: request.id, n: c.n + 1, title: c.title, provision: c.provision, clauseRef: c.clauseRef, siteConstraint: c.siteConstraint, proposal: c.proposal, measurements: c.measurements, createdById: actor.id },
    { transaction },
  );
  await audit({ action: "request.version_started", actorId: actor.id, projectId: request.projectId, subjectType: "deviation_request", subjectId: request.id, data: { n: next.n } }, transaction);
  return next;
}

/** The engineer with the fewest open requests on this project (the only one, if there is one); null if none. */
export async function pickEngineer(projectId: string, transaction: Transaction): Promise<string | null> {
  const engineers = await ProjectMember.findAll({
    where: { projectId, role: "engineer" },
    attributes: ["userId"],
    include: [{ model: User, as: "user", attributes: ["name"] }],
    transaction,
  });
  if (engineers.length <= 1) return engineers[0]?.userId ?? null;
  const open = await DeviationRequest.findAll({
    where: { projectId, state: { [Op.in]: [...REVIEW_STATES, "info_requested"] }, assigneeId: { [Op.in]: engineers.map((e) => e.userId) } },
    attributes: ["assigneeId"],
    transaction,
  });
  const load = (id: string) => open.filter((r) => r.assigneeId === id).length;
  const name = (m: ProjectMember) => (m as ProjectMember & { user: User }).user.name;
  return [...engineers].sort((a, b) => load(a.userId) - load(b.userId) || name(a).localeCompare(name(b)) || a.userId.localeCompare(b.userId))[0]!.userId;
}

export async function assignEngineer(actor: Actor, projectId: string, requestId: string, assigneeId: string, lockVersion: number) {
  if (actor.role !== "manager") throw new RequestError("Only a project manager can assign the engineer.", 403);
  await sequelize.transaction(async (transaction) => {
    const request = await lockRequest(projectId, requestId, transaction);
    checkLock(request, lockVersion);
    if (!OPEN_STATES.includes(request.state)) throw new RequestError("This request is closed; its engineer cannot change now.", 409);
    const member = await ProjectMember.findOne({ where: { projectId, userId: assigneeId, role: "engineer" }, transaction });
    if (!member) throw new RequestError("Choose an engineer who is a member of this project.", 422, "invalid", [{ path: "assigneeId", message: "Choose an engineer on this project." }]);
    const from = request.assigneeId;
    await request.update({ assigneeId, lockVersion: request.lockVersion + 1 }, { transaction });
    await audit({ action: "request.assigned", actorId: actor.id, projectId, subjectType: "deviation_request", subjectId: requestId, data: { from, to: assigneeId } }, transaction);
    await notify({ event: "assigned", projectId, request, actor, to: [assigneeId] }, transaction);
  });
}

export async function setDueDate(actor: Actor, projectId: string, requestId: string, dueOn: string, lockVersion: number) {
  if (actor.role !== "manager") throw new RequestError("Only a project manager can move the due date.", 403);
  const dueAt = new Date(`${dueOn}T17:00:00+02:00`);
  if (Number.isNaN(dueAt.getTime())) throw new RequestError("Enter a valid date.", 422, "invalid", [{ path: "dueOn", message: "Enter a valid date." }]);
  await sequelize.transaction(async (transaction) => {
    const request = await lockRequest(projectId, requestId, transaction);
    checkLock(request, lockVersion);
    if (!OPEN_STATES.includes(request.state)) throw new RequestError("This request is closed; it has no due date to move.", 409);
    const from = request.dueAt?.toISOString() ?? null;
    await request.update({ dueAt, lockVersion: request.lockVersion + 1 }, { transaction });
    await audit({ action: "request.due_changed", actorId: actor.id, projectId, subjectType: "deviation_request", subjectId: requestId, data: { from, to: dueAt.toISOString() } }, transaction);
  });
}

export interface AttachmentView {
  id: string;
  filename: string;
  contentType: string;
  byteSize: number;
  isImage: boolean;
  versionN: number | null;
  commentId: string | null;
  uploadedBy: string;
  url: string;
  thumbUrl: string | null;
}

export function toAttachmentView(projectId: string, a: Attachment): AttachmentView {
  const url = `/projects/${projectId}/requests/${a.requestId}/attachments/${a.id}`;
  return {
    id: a.id,
    filename: a.filename,
    contentType: a.contentType,
    byteSize: a.byteSize,
    isImage: a.contentType.startsWith("image/"),
    versionN: a.versionN,
    commentId: a.commentId ?? null,
    uploadedBy: (a as Attachment & { uploadedBy?: User }).uploadedBy?.name ?? "—",
    url,
    thumbUrl: a.thumbKey ? `${url}?size=thumb` : null,
  };
}

export interface VersionView extends VersionContent {
  id: string;
  submittedAt: string | null;
  createdAt: string;
}

function toVersionView(v: RequestVersion): VersionView {
  return {
    id: v.id,
    n: v.n,
    title: v.title,
    provision: v.provision,
    clauseRef: v.clauseRef,
    siteConstraint: v.siteConstraint,
    proposal: v.proposal,
    measurements: v.measurements as Measurement[],
    submittedAt: v.submittedAt?.toISOString() ?? null,
    createdAt: v.createdAt.toISOString(),
  };
}

export interface RequestView {
  id: string;
  projectId: string;
  number: number;
  code: string;
  title: string;
  provision: string;
  clauseRef: string;
  state: RequestState;
  lockVersion: number;
  createdBy: { id: string; name: string };
  assignee: { id: string; name: string } | null;
  dueAt: string | null;
  overdue: boolean;
  submittedAt: string | null;
  stateChangedAt: string;
  waiting: string;
  isRequester: boolean;
  moves: RequestAction[];
  canEdit: boolean;
  /** The newest version (possibly a draft the requester is working on). */
  latest: VersionView;
  /** The newest version the engineer has been sent (null for a draft never submitted). */
  sent: VersionView | null;
  /** What changed in `sent` since the version sent before it. */
  diff: VersionDiff | null;
  versions: { n: number; submittedAt: string | null }[];
  attachments: AttachmentView[];
}

/** One request as the viewer sees it: content, people, the moves they may make, and what changed. */
export async function getRequest(projectId: string, requestId: string, viewer: { id: string; role: Role }): Promise<RequestView> {
  if (!UUID.test(requestId)) throw new RequestError("No such request in this project.", 404);
  const request = await DeviationRequest.findOne({
    where: { id: requestId, projectId },
    include: [
      { model: User, as: "assignee", attributes: ["id", "name"] },
      { model: User, as: "createdBy", attributes: ["id", "name"] },
    ],
  });
  // A draft is its author's own until submitted.
  if (!request || (request.state === "draft" && request.createdById !== viewer.id)) throw new RequestError("No such request in this project.", 404);
  const [versions, attachments] = await Promise.all([
    RequestVersion.findAll({ where: { requestId }, order: [["n", "ASC"]] }),
    Attachment.findAll({ where: { requestId, commentId: null }, include: [{ model: User, as: "uploadedBy", attributes: ["name"] }], order: [["createdAt", "ASC"]] }),
  ]);
  const views = versions.map(toVersionView);
  const sentList = views.filter((v) => v.submittedAt);
  const sent = sentList.at(-1) ?? null;
  const before = sentList.at(-2) ?? null;
  const people = request as DeviationRequest & { assignee: User | null; createdBy: User };
  const isRequester = request.createdById === viewer.id;
  const open = OPEN_STATES.includes(request.state);
  return {
    id: request.id,
    projectId,
    number: request.number,
    code: requestCode(request.number),
    title: request.title,
    provision: request.provision,
    clauseRef: request.clauseRef,
    state: request.state,
    lockVersion: request.lockVersion,
    createdBy: { id: people.createdBy.id, name: people.createdBy.name },
    assignee: people.assignee ? { id: people.assignee.id, name: people.assignee.name } : null,
    dueAt: request.dueAt?.toISOString() ?? null,
    overdue: isOverdue(request.dueAt, open && request.state !== "draft"),
    submittedAt: request.submittedAt?.toISOString() ?? null,
    stateChangedAt: request.stateChangedAt.toISOString(),
    waiting: waitedFor(request.stateChangedAt),
    isRequester,
    moves: availableMoves(request.state, { role: viewer.role, isRequester }),
    canEdit: isRequester && EDITABLE_STATES.includes(request.state),
    latest: views.at(-1)!,
    sent,
    diff: sent && before ? diffVersions(before, sent) : null,
    versions: views.map((v) => ({ n: v.n, submittedAt: v.submittedAt })),
    attachments: attachments.map((a) => toAttachmentView(projectId, a)),
  };
}

/** Every version with what changed from the one before: the version history. */
export async function listVersions(projectId: string, requestId: string) {
  if (!UUID.test(requestId)) throw new RequestError("No such request in this project.", 404);
  const request = await DeviationRequest.findOne({ where: { id: requestId, projectId }, attributes: ["id"] });
  if (!request) throw new RequestError("No such request in this project.", 404);
  const versions = (await RequestVersion.findAll({ where: { requestId }, order: [["n", "ASC"]] })).map(toVersionView);
  return versions.map((v, i) => ({ ...v, changes: i > 0 ? diffVersions(versions[i - 1]!, v) : null }));
}

/** The measurements of a request's latest version, for starting a calculator from them (null if none). */
export async function requestMeasurements(projectId: string, requestId: string | null) {
  if (!requestId || !/^[0-9a-f-]{36}$/i.test(requestId)) return null;
  const request = await DeviationRequest.findOne({ where: { id: requestId, projectId }, attributes: ["id", "number", "state"] });
  // A draft is its author's alone until submitted.
  if (!request || request.state === "draft") return null;
  const version = await latestVersion(request.id);
  return { code: requestCode(request.number), measurements: (version?.measurements ?? []).map((m) => ({ kind: m.kind, value: Number(m.value) })) };
}
