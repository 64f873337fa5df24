// Reading the register: a project's sheets with their revisions and current revision, one sheet, one revision.
// Every query is scoped by project, so an id from another project is simply not found.
import { Op, type WhereOptions } from "sequelize";
import { Drawing, DrawingRevision, User, type RevisionStatus } from "../../db/models";
import { compareLabels, compareSheetNumbers } from "./labels";
import { DrawingError, UUID } from "./errors";

const REVISION_FIELDS = [
  "id", "drawingId", "label", "status", "description", "sha256", "byteSize", "originalFilename", "sourcePage", "pageCount",
  "pages", "processing", "processingError", "processedPages", "issuedAt", "supersedesId", "supersededById", "createdAt",
] as const;

export interface RevisionView {
  id: string;
  drawingId: string;
  label: string;
  status: RevisionStatus;
  description: string;
  sha256: string;
  byteSize: number;
  originalFilename: string | null;
  sourcePage: number | null;
  pageCount: number;
  pages: { widthPt: number; heightPt: number }[];
  processing: "queued" | "running" | "done" | "failed";
  processingError: string | null;
  processedPages: number;
  uploadedBy: string;
  uploadedAt: string;
  issuedBy: string | null;
  issuedAt: string | null;
  supersedesId: string | null;
  supersededById: string | null;
}

export interface DrawingView {
  id: string;
  sheetNumber: string;
  title: string;
  discipline: string;
  scaleText: string | null;
  updatedAt: string;
  current: RevisionView | null;
  revisions: RevisionView[];
}

/** What the register page shows of a revision: no hashes, sizes or page sizes (the sheet page has those). */
const REGISTER_REVISION_FIELDS = ["id", "label", "status", "description", "processing", "processedPages", "pageCount", "uploadedBy", "uploadedAt", "issuedBy", "issuedAt"] as const;
export type RegisterRevision = Pick<RevisionView, (typeof REGISTER_REVISION_FIELDS)[number]>;
export type RegisterRow = Omit<DrawingView, "current" | "revisions"> & { current: RegisterRevision | null; revisions: RegisterRevision[] };

const registerRevision = (r: RevisionView) => Object.fromEntries(REGISTER_REVISION_FIELDS.map((f) => [f, r[f]])) as RegisterRevision;

/** The register page's rows: a large register is sent to the browser (and into the document) a third the size. */
export function toRegisterRows(drawings: DrawingView[]): RegisterRow[] {
  return drawings.map((d) => ({ ...d, current: d.current && registerRevision(d.current), revisions: d.revisions.map(registerRevision) }));
}

/** A revision's fields, with the names of who uploaded and issued it when they were read. */
type RevisionSource = Pick<DrawingRevision, (typeof REVISION_FIELDS)[number]> & { uploadedBy?: { name: string } | null; issuedBy?: { name: string } | null };

function toRevisionView(r: RevisionSource): RevisionView {
  return {
    id: r.id,
    drawingId: r.drawingId,
    label: r.label,
    status: r.status,
    description: r.description,
    sha256: r.sha256,
    // Plain rows carry BIGINT as text; model instances already give a number.
    byteSize: Number(r.byteSize),
    originalFilename: r.originalFilename,
    sourcePage: r.sourcePage,
    pageCount: r.pageCount,
    pages: r.pages,
    processing: r.processing,
    processingError: r.processingError ?? null,
    processedPages: r.processedPages,
    uploadedBy: r.uploadedBy?.name ?? "—",
    uploadedAt: r.createdAt.toISOString(),
    issuedBy: r.issuedBy?.name ?? null,
    issuedAt: r.issuedAt ? r.issuedAt.toISOString() : null,
    supersedesId: r.supersedesId ?? null,
    supersededById: r.supersededById ?? null,
  };
}

/** The revision the register shows for a sheet: the accepted one, else the newest live one, else the newest. */
export function currentRevision<T extends { status: RevisionStatus; label: string }>(revisions: readonly T[]): T | null {
  const newestFirst = [...revisions].sort((a, b) => compareLabels(b.label, a.label));
  return (
    newestFirst.find((r) => r.status === "accepted") ??
    newestFirst.find((r) => r.status === "for_review" || r.status === "draft") ??
    newestFirst[0] ??
    null
  );
}

const includeUsers = [
  { model: User, as: "uploadedBy", attributes: ["name"] },
  { model: User, as: "issuedBy", attributes: ["name"] },
];

/**
 * The register in sheet-number order. With `limit`, one page of sheets after the `after` sheet number (a cursor:
 * pass the last sheet number of a page to get the next one); without it, every sheet.
 */
export async function listRegister(projectId: string, page: { limit?: number; after?: string | null } = {}): Promise<DrawingView[]> {
  const drawings = (await Drawing.findAll({
    where: page.after ? { projectId, sheetNumber: { [Op.gt]: page.after } } : { projectId },
    order: [["sheetNumber", "ASC"]],
    limit: page.limit,
    raw: true,
  })) as unknown as Drawing[];
  // A page reads only its sheets' revisions; the whole register reads the project's.
  const revisions = await revisionViews(page.limit ? { projectId, drawingId: { [Op.in]: drawings.map((d) => d.id) } } : { projectId });
  const byDrawing = new Map<string, RevisionView[]>();
  for (const r of revisions) {
    const list = byDrawing.get(r.drawingId) ?? [];
    list.push(r);
    byDrawing.set(r.drawingId, list);
  }
  return drawings.map((d) => {
    const revs = (byDrawing.get(d.id) ?? []).sort((a, b) => compareLabels(b.label, a.label));
    return { ...drawingFields(d), current: currentRevision(revs), revisions: revs };
  });
}

/**
 * Revision views from plain rows, people's names read once for all of them: a register of a thousand revisions
 * is far cheaper this way than as model instances with two joined users each.
 */
async function revisionViews(where: WhereOptions<DrawingRevision>): Promise<RevisionView[]> {
  const rows = (await DrawingRevision.findAll({ where, attributes: [...REVISION_FIELDS, "uploadedById", "issuedById"], raw: true })) as unknown as (RevisionSource & {
    uploadedById: string;
    issuedById: string | null;
  })[];
  const ids = [...new Set(rows.flatMap((r) => (r.issuedById ? [r.uploadedById, r.issuedById] : [r.uploadedById])))];
  const people = ids.length ? ((await User.findAll({ where: { id: { [Op.in]: ids } }, attributes: ["id", "name"], raw: true })) as unknown as { id: string; name: string }[]) : [];
  const names = new Map(people.map((u) => [u.id, u.name]));
  const person = (id: string | null) => (id && names.has(id) ? { name: names.get(id)! } : null);
  return rows.map((r) => toRevisionView({ ...r, uploadedBy: person(r.uploadedById), issuedBy: person(r.issuedById) }));
}

function drawingFields(d: Drawing) {
  return { id: d.id, sheetNumber: d.sheetNumber, title: d.title, discipline: d.discipline, scaleText: d.scaleText, updatedAt: d.updatedAt.toISOString() };
}

export async function getDrawing(projectId: string, drawingId: string): Promise<DrawingView> {
  if (!UUID.test(drawingId)) throw new DrawingError("No such sheet in this project.", 404);
  const d = await Drawing.findOne({ where: { id: drawingId, projectId } });
  if (!d) throw new DrawingError("No such sheet in this project.", 404);
  const revs = (await revisionViews({ drawingId, projectId })).sort((a, b) => compareLabels(b.label, a.label));
  return { ...drawingFields(d), current: currentRevision(revs), revisions: revs };
}

/** One revision's row (with its object key), only if it belongs to that sheet of that project. */
export async function findRevision(projectId: string, drawingId: string | null, revisionId: string, withText = false) {
  if (!UUID.test(revisionId) || (drawingId !== null && !UUID.test(drawingId))) throw new DrawingError("No such revision in this project.", 404);
  const where = drawingId ? { id: revisionId, projectId, drawingId } : { id: revisionId, projectId };
  const rev = await DrawingRevision.findOne({
    where,
    attributes: withText ? undefined : { exclude: ["text"] },
    include: [...includeUsers, { model: Drawing, as: "drawing", attributes: ["sheetNumber", "title"] }],
  });
  if (!rev) throw new DrawingError("No such revision in this project.", 404);
  return rev as DrawingRevision & { drawing: Drawing };
}

export async function getRevision(projectId: string, drawingId: string, revisionId: string): Promise<RevisionView> {
  return toRevisionView(await findRevision(projectId, drawingId, revisionId));
}

export interface RevisionBrief {
  id: string;
  drawingId: string;
  label: string;
  status: RevisionStatus;
  pages: { widthPt: number; heightPt: number }[];
  uploadedAt: string;
  sheetNumber: string;
  title: string;
  scaleText: string | null;
}

/**
 * Every revision of the project in brief (no people, no history fields), in register order: sheet number, then
 * newest label first. For pickers that offer them all; far lighter than the register itself.
 */
export async function listRevisionBriefs(projectId: string): Promise<RevisionBrief[]> {
  const [revisions, drawings] = await Promise.all([
    DrawingRevision.findAll({ where: { projectId }, attributes: ["id", "drawingId", "label", "status", "pages", "createdAt"], raw: true }) as unknown as Promise<
      Pick<DrawingRevision, "id" | "drawingId" | "label" | "status" | "pages" | "createdAt">[]
    >,
    Drawing.findAll({ where: { projectId }, attributes: ["id", "sheetNumber", "title", "scaleText"], raw: true }) as unknown as Promise<Pick<Drawing, "id" | "sheetNumber" | "title" | "scaleText">[]>,
  ]);
  const sheets = new Map(drawings.map((d) => [d.id, d]));
  return revisions
    .map((r) => {
      const d = sheets.get(r.drawingId)!;
      return { id: r.id, drawingId: r.drawingId, label: r.label, status: r.status, pages: r.pages, uploadedAt: r.createdAt.toISOString(), sheetNumber: d.sheetNumber, title: d.title, scaleText: d.scaleText };
    })
    .sort((a, b) => compareSheetNumbers(a.sheetNumber, b.sheetNumber) || compareLabels(b.label, a.label));
}

/** Revisions that may be issued (draft, for review, accepted), for the transmittal form. */
export async function listIssuable(projectId: string) {
  const rows = await DrawingRevision.findAll({
    where: { projectId, status: { [Op.in]: ["draft", "for_review", "accepted"] } },
    attributes: ["id", "label", "status", "drawingId"],
    include: [{ model: Drawing, as: "drawing", attributes: ["sheetNumber", "title"] }],
  });
  return rows
    .map((r) => {
      const d = (r as DrawingRevision & { drawing: Drawing }).drawing;
      return { id: r.id, label: r.label, status: r.status, drawingId: r.drawingId, sheetNumber: d.sheetNumber, title: d.title };
    })
    .sort((a, b) => compareSheetNumbers(a.sheetNumber, b.sheetNumber) || compareLabels(a.label, b.label));
}

export { toRevisionView };
