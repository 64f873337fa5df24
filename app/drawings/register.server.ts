// Reading the register: a project's sheets with their revisions and current revision, one sheet, one revision.
// Every query is scoped by project, so an id from another project is simply not found.
import { Op } from "sequelize";
import { Drawing, DrawingRevision, User, type RevisionStatus } from "../../db/models";
import { compareLabels } from "./labels";
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

function toRevisionView(r: DrawingRevision): RevisionView {
  const withUsers = r as DrawingRevision & { uploadedBy?: User | null; issuedBy?: User | null };
  return {
    id: r.id,
    drawingId: r.drawingId,
    label: r.label,
    status: r.status,
    description: r.description,
    sha256: r.sha256,
    byteSize: r.byteSize,
    originalFilename: r.originalFilename,
    sourcePage: r.sourcePage,
    pageCount: r.pageCount,
    pages: r.pages,
    processing: r.processing,
    processingError: r.processingError ?? null,
    processedPages: r.processedPages,
    uploadedBy: withUsers.uploadedBy?.name ?? "—",
    uploadedAt: r.createdAt.toISOString(),
    issuedBy: withUsers.issuedBy?.name ?? null,
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

export async function listRegister(projectId: string): Promise<DrawingView[]> {
  const [drawings, revisions] = await Promise.all([
    Drawing.findAll({ where: { projectId }, order: [["sheetNumber", "ASC"]] }),
    DrawingRevision.findAll({ where: { projectId }, attributes: [...REVISION_FIELDS], include: includeUsers }),
  ]);
  const byDrawing = new Map<string, RevisionView[]>();
  for (const r of revisions) {
    const list = byDrawing.get(r.drawingId) ?? [];
    list.push(toRevisionView(r));
    byDrawing.set(r.drawingId, list);
  }
  return drawings.map((d) => {
    const revs = (byDrawing.get(d.id) ?? []).sort((a, b) => compareLabels(b.label, a.label));
    return { ...drawingFields(d), current: currentRevision(revs), revisions: revs };
  });
}

function drawingFields(d: Drawing) {
  return { id: d.id, sheetNumber: d.sheetNumber, title: d.title, discipline: d.discipline, scaleText: d.scaleText, updatedAt: d.updatedAt.toISOString() };
}

export async function getDrawing(projectId: string, drawingId: string): Promise<DrawingView> {
  if (!UUID.test(drawingId)) throw new DrawingError("No such sheet in this project.", 404);
  const d = await Drawing.findOne({ where: { id: drawingId, projectId } });
  if (!d) throw new DrawingError("No such sheet in this project.", 404);
  const revisions = await DrawingRevision.findAll({ where: { drawingId, projectId }, attributes: [...REVISION_FIELDS], include: includeUsers });
  const revs = revisions.map(toRevisionView).sort((a, b) => compareLabels(b.label, a.label));
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
    .sort((a, b) => a.sheetNumber.localeCompare(b.sheetNumber) || compareLabels(a.label, b.label));
}

export { toRevisionView };
