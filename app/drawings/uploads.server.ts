// Receiving PDFs into the register. The body is read as a stream: hashed and counted on the way to a temporary
// file (never held whole in memory), checked by parsing, split per sheet if asked, then stored in object storage
// under its SHA-256 and recorded in one transaction. Whatever fails, nothing is left behind: no row, no object.
import { createHash } from "node:crypto";
import { createReadStream, createWriteStream } from "node:fs";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { Transform } from "node:stream";
import { pipeline } from "node:stream/promises";
import { PDFDocument } from "pdf-lib";
import { Op, UniqueConstraintError } from "sequelize";
import { Drawing, DrawingRevision, sequelize, type PageSize, type RevisionStatus } from "../../db/models";
import { audit } from "../platform/audit.server";
import { env } from "../platform/env.server";
import { boundaryOf, drainBody, MultipartError, readMultipart } from "../platform/multipart.server";
import { discardObjects, objectExists, putObject } from "../platform/storage.server";
import type { Role } from "../projects/permissions";
import { DrawingError, keys } from "./errors";
import { nextLabel } from "./labels";
import { fileSource, inspectPdf, PdfProblem } from "./pdf.server";
import { queueProcessing } from "./processing.server";
import { uploadSchema, type UploadFields } from "./schemas";

export interface StoredRevision {
  drawingId: string;
  revisionId: string;
  sheetNumber: string;
  label: string;
  status: RevisionStatus;
  pageCount: number;
  sha256: string;
}

export interface DuplicateRevision {
  sheetNumber: string;
  label: string;
  drawingId: string;
  revisionId: string;
  sourcePage: number | null;
}

export interface UploadOutcome {
  status: 201 | 409;
  message: string;
  stored: StoredRevision[];
  duplicates: DuplicateRevision[];
}

interface Received {
  file: string;
  filename: string;
  bytes: number;
  sha256: string;
}

interface Piece {
  file: string;
  sha256: string;
  bytes: number;
  pages: PageSize[];
  sheetNumber: string;
  title: string;
  sourcePage: number | null;
}

const MB = 1024 * 1024;
/** A refused upload's remaining bytes are read and dropped up to this much, so the browser sees the reason. */
const DRAIN_LIMIT = 64 * MB;
const sizeText = (n: number) => (n >= MB ? `${Math.round((n / MB) * 10) / 10} MB` : `${Math.ceil(n / 1024)} KB`);

/** Counts and hashes the bytes passing through, and stops the upload once it is over the limit. */
function meter(limit: number) {
  const hash = createHash("sha256");
  let bytes = 0;
  const stream = new Transform({
    transform(chunk: Buffer, _enc, done) {
      bytes += chunk.length;
      if (bytes > limit) return done(new DrawingError(`This file is larger than ${sizeText(limit)}, the most Countersign accepts. Reduce it (e.g. lower the image resolution) or split the set.`, 413, "too_large"));
      hash.update(chunk);
      done(null, chunk);
    },
  });
  return { stream, result: () => ({ bytes, sha256: hash.digest("hex") }) };
}

function readFields(raw: Record<string, string>): UploadFields {
  const parsed = uploadSchema.safeParse(Object.fromEntries(Object.entries(raw).filter(([, v]) => v !== "")));
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    throw new DrawingError(`${issue.path.join(".") ? `${fieldLabel(String(issue.path[0]))}: ` : ""}${issue.message}`, 422, "invalid_fields");
  }
  return parsed.data;
}

const fieldLabel = (f: string) => ({ sheetNumber: "Sheet number", label: "Revision", title: "Title", mode: "Sheets" })[f] ?? f;

/** Reads the multipart body: fields first, then the one PDF, streamed to a temporary file. */
async function receive(request: Request, dir: string): Promise<{ fields: UploadFields; received: Received }> {
  const boundary = boundaryOf(request.headers.get("content-type"));
  if (!boundary || !request.body) throw new DrawingError("Send the PDF as a form upload (multipart/form-data).", 415, "not_multipart");
  const declared = Number(request.headers.get("content-length") ?? 0);
  if (declared > env.UPLOAD_MAX_BYTES + 256 * 1024) {
    await drainBody(request.body, DRAIN_LIMIT);
    throw new DrawingError(`This file is larger than ${sizeText(env.UPLOAD_MAX_BYTES)}, the most Countersign accepts. Reduce it or split the set.`, 413, "too_large");
  }
  let fields: UploadFields | null = null;
  let received: Received | null = null;
  try {
    await readMultipart(request.body, boundary, {
      async onFile(part, raw) {
        // The fields came first: refuse bad ones before taking in the file.
        fields = readFields(raw);
        const file = path.join(dir, "upload.pdf");
        const m = meter(env.UPLOAD_MAX_BYTES);
        await pipeline(part.stream, m.stream, createWriteStream(file));
        received = { file, filename: part.filename.slice(0, 200), ...m.result() };
      },
    });
  } catch (error) {
    await drainBody(request.body, DRAIN_LIMIT);
    if (error instanceof MultipartError) throw new DrawingError(error.message, error.status, "bad_upload");
    throw error;
  }
  if (!received || !fields) throw new DrawingError("Choose a PDF file to upload.", 400, "no_file");
  return { fields, received };
}

async function splitPages(received: Received, fields: UploadFields, pages: PageSize[], dir: string): Promise<Piece[]> {
  // pdf-lib needs the whole set in memory; that is bounded by the upload limit and happens once per upload.
  const source = await PDFDocument.load(await readFile(received.file), { updateMetadata: false });
  const pieces: Piece[] = [];
  for (let i = 0; i < source.getPageCount(); i++) {
    const doc = await PDFDocument.create({ updateMetadata: false });
    const [page] = await doc.copyPages(source, [i]);
    doc.addPage(page!);
    const bytes = await doc.save();
    const file = path.join(dir, `page-${i + 1}.pdf`);
    await writeFile(file, bytes);
    const n = String(i + 1).padStart(2, "0");
    pieces.push({
      file,
      sha256: createHash("sha256").update(bytes).digest("hex"),
      bytes: bytes.length,
      pages: [pages[i]!],
      sheetNumber: `${fields.sheetNumber}-${n}`,
      title: `${fields.title || baseName(received.filename)} — sheet ${i + 1}`,
      sourcePage: i + 1,
    });
  }
  return pieces;
}

const baseName = (filename: string) => filename.replace(/\.[^.]*$/, "").trim() || "Untitled sheet";

export async function receiveUpload(request: Request, actor: { id: string }, projectId: string, role: Role): Promise<UploadOutcome> {
  const dir = await mkdtemp(path.join(env.UPLOAD_TMP_DIR ?? tmpdir(), "countersign-upload-"));
  const putKeys: string[] = [];
  try {
    const { fields, received } = await receive(request, dir);
    const source = await fileSource(received.file);
    let facts;
    try {
      facts = await inspectPdf(source, env.UPLOAD_MAX_PAGES);
    } catch (error) {
      if (error instanceof PdfProblem) throw new DrawingError(error.message, 422, error.code);
      throw error;
    } finally {
      await source.close?.();
    }

    const pieces: Piece[] =
      fields.mode === "split" && facts.pageCount > 1
        ? await splitPages(received, fields, facts.pages, dir)
        : [{ file: received.file, sha256: received.sha256, bytes: received.bytes, pages: facts.pages, sheetNumber: fields.sheetNumber, title: fields.title || baseName(received.filename), sourcePage: null }];

    const k = keys(projectId);
    const existing = await DrawingRevision.findAll({
      where: { projectId, sha256: { [Op.in]: pieces.map((p) => p.sha256) } },
      attributes: ["id", "sha256", "label", "drawingId", "sourcePage"],
      include: [{ model: Drawing, as: "drawing", attributes: ["sheetNumber"] }],
    });
    const duplicates: DuplicateRevision[] = existing.map((r) => ({
      sheetNumber: (r as DrawingRevision & { drawing: Drawing }).drawing.sheetNumber,
      label: r.label,
      drawingId: r.drawingId,
      revisionId: r.id,
      sourcePage: r.sourcePage,
    }));
    const seen = new Set(existing.map((r) => r.sha256));
    const fresh = pieces.filter((p) => !seen.has(p.sha256));
    if (!fresh.length) {
      const d = duplicates[0]!;
      return {
        status: 409,
        message: `Already in the register: these exact bytes are revision ${d.label} of sheet ${d.sheetNumber}. Nothing new was stored.`,
        stored: [],
        duplicates,
      };
    }

    // Objects first (named by content, so a retry rewrites the same key), then the rows in one transaction.
    for (const p of fresh) {
      const key = k.revision(p.sha256);
      if (await objectExists(key)) continue;
      await putObject(key, createReadStream(p.file), { contentType: "application/pdf", contentLength: p.bytes });
      putKeys.push(key);
    }

    const status: RevisionStatus = role === "site_plumber" ? "for_review" : "draft";
    const stored = await sequelize.transaction(async (transaction) => {
      const out: StoredRevision[] = [];
      for (const p of fresh) {
        let drawing = await Drawing.findOne({ where: { projectId, sheetNumber: p.sheetNumber }, transaction, lock: transaction.LOCK.UPDATE });
        if (!drawing) {
          drawing = await Drawing.create(
            { projectId, sheetNumber: p.sheetNumber, title: p.title, discipline: fields.discipline || (role === "site_plumber" ? "Site sketch" : "Plumbing"), scaleText: fields.scaleText || null, createdById: actor.id },
            { transaction },
          );
          await audit({ action: "drawing.created", actorId: actor.id, projectId, subjectType: "drawing", subjectId: drawing.id, data: { sheetNumber: p.sheetNumber } }, transaction);
        }
        const labels = (await DrawingRevision.findAll({ where: { drawingId: drawing.id }, attributes: ["label"], transaction })).map((r) => r.label);
        const label = fields.label ?? nextLabel(labels, "preliminary");
        if (labels.includes(label)) throw new DrawingError(`Sheet ${p.sheetNumber} already has a revision ${label}. Choose another label or leave it blank for the next one.`, 409, "label_taken");
        const rev = await DrawingRevision.create(
          {
            projectId, drawingId: drawing.id, label, status, description: fields.description ?? "", objectKey: k.revision(p.sha256), sha256: p.sha256,
            byteSize: p.bytes, originalFilename: received.filename, sourcePage: p.sourcePage, pageCount: p.pages.length, pages: p.pages, uploadedById: actor.id,
            issuedById: status === "for_review" ? actor.id : null, issuedAt: status === "for_review" ? new Date() : null,
          },
          { transaction },
        );
        drawing.changed("updatedAt", true);
        await drawing.save({ transaction });
        await audit(
          { action: "revision.uploaded", actorId: actor.id, projectId, subjectType: "drawing_revision", subjectId: rev.id, data: { sheetNumber: p.sheetNumber, label, sha256: p.sha256, bytes: p.bytes, status } },
          transaction,
        );
        out.push({ drawingId: drawing.id, revisionId: rev.id, sheetNumber: p.sheetNumber, label, status, pageCount: p.pages.length, sha256: p.sha256 });
      }
      return out;
    }).catch((error) => {
      if (error instanceof UniqueConstraintError) {
        throw new DrawingError("Someone uploaded the same sheet or revision a moment ago. Reload the register and try again.", 409, "conflict");
      }
      throw error;
    });
    putKeys.length = 0; // recorded: the objects now belong to rows

    for (const s of stored) await queueProcessing(s.revisionId).catch((e) => console.error("could not queue processing:", (e as Error).message));
    const skipped = duplicates.length ? ` ${duplicates.length} page(s) were already in the register and were skipped.` : "";
    return {
      status: 201,
      message: stored.length === 1 ? `Stored as revision ${stored[0]!.label} of sheet ${stored[0]!.sheetNumber}.${skipped}` : `Stored ${stored.length} sheets.${skipped}`,
      stored,
      duplicates,
    };
  } finally {
    await discardObjects(putKeys, async (objectKey) => (await DrawingRevision.count({ where: { objectKey } })) > 0);
    await rm(dir, { recursive: true, force: true });
  }
}

