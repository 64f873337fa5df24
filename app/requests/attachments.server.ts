// Photos and documents on a request. The upload is streamed to a temporary file (hashed and counted on the way,
// stopped at the limit), recognised by its first bytes rather than by what the browser claims, a photo gets a
// thumbnail, and both are stored under the SHA-256. Whatever fails, nothing is left behind: no row, no object.
import { createHash } from "node:crypto";
import { createReadStream, createWriteStream } from "node:fs";
import { mkdtemp, open, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { Transform } from "node:stream";
import { pipeline } from "node:stream/promises";
import sharp from "sharp";
import { Op } from "sequelize";
import { Attachment, DeviationRequest, sequelize, User } from "../../db/models";
import { env } from "../platform/env.server";
import { boundaryOf, drainBody, MultipartError, readMultipart } from "../platform/multipart.server";
import { deleteObject, discardObjects, getObjectStream, objectExists, putObject } from "../platform/storage.server";
import { attachmentKeys, RequestError, UUID } from "./errors";
import { EDITABLE_STATES, latestVersion, lockRequest, openVersion, toAttachmentView, type Actor, type AttachmentView } from "./requests.server";

const MB = 1024 * 1024;
/** The largest attachment accepted (a phone photo is 2–8 MB; a data sheet rarely more). */
export const ATTACHMENT_MAX_BYTES = 15 * MB;
export const THUMB_WIDTH_PX = 480;
const DRAIN_LIMIT = 32 * MB;

export const ACCEPTED_TEXT = "Photos (JPEG, PNG or WebP) and PDF documents";

type Kind = { contentType: string; image: boolean };

/** What the file is, from its first bytes. */
export function sniff(head: Uint8Array): Kind | null {
  const b = Buffer.from(head);
  if (b.length >= 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff) return { contentType: "image/jpeg", image: true };
  if (b.length >= 8 && b.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return { contentType: "image/png", image: true };
  if (b.length >= 12 && b.subarray(0, 4).toString("latin1") === "RIFF" && b.subarray(8, 12).toString("latin1") === "WEBP") return { contentType: "image/webp", image: true };
  if (b.length >= 5 && b.subarray(0, 5).toString("latin1") === "%PDF-") return { contentType: "application/pdf", image: false };
  return null;
}

const sizeText = (n: number) => `${Math.round((n / MB) * 10) / 10} MB`;
const tooLarge = () => new RequestError(`This file is larger than ${sizeText(ATTACHMENT_MAX_BYTES)}, the most Countersign accepts for an attachment. Take the photo at a lower resolution or reduce the document.`, 413, "too_large");

function meter(limit: number) {
  const hash = createHash("sha256");
  let bytes = 0;
  const stream = new Transform({
    transform(chunk: Buffer, _enc, done) {
      bytes += chunk.length;
      if (bytes > limit) return done(tooLarge());
      hash.update(chunk);
      done(null, chunk);
    },
  });
  return { stream, result: () => ({ bytes, sha256: hash.digest("hex") }) };
}

async function readHead(file: string) {
  const handle = await open(file, "r");
  try {
    const buf = Buffer.alloc(16);
    const { bytesRead } = await handle.read(buf, 0, 16, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

export type Purpose = "request" | "comment";

/** Who may attach what, checked before a byte of the file is read. */
async function checkMayAttach(actor: Actor, projectId: string, requestId: string, purpose: Purpose) {
  if (!UUID.test(requestId)) throw new RequestError("No such request in this project.", 404);
  const request = await DeviationRequest.findOne({ where: { id: requestId, projectId }, attributes: ["id", "state", "createdById"] });
  if (!request || (request.state === "draft" && request.createdById !== actor.id)) throw new RequestError("No such request in this project.", 404);
  if (purpose === "request") {
    if (request.createdById !== actor.id) throw new RequestError("Only the plumber who raised this request can add photos and documents to it. Others can attach files to a comment.", 403);
    if (!EDITABLE_STATES.includes(request.state)) throw new RequestError("This request is with the engineer, so nothing can be added to it now. Attach the file to a comment instead.", 409);
  }
  return request;
}

export async function receiveAttachment(request: Request, actor: Actor, projectId: string, requestId: string): Promise<AttachmentView> {
  const boundary = boundaryOf(request.headers.get("content-type"));
  if (!boundary || !request.body) throw new RequestError("Send the file as a form upload (multipart/form-data).", 415, "not_multipart");
  const declared = Number(request.headers.get("content-length") ?? 0);
  const purpose: Purpose = new URL(request.url).searchParams.get("for") === "comment" ? "comment" : "request";
  try {
    await checkMayAttach(actor, projectId, requestId, purpose);
    if (declared > ATTACHMENT_MAX_BYTES + 64 * 1024) throw tooLarge();
  } catch (error) {
    await drainBody(request.body, DRAIN_LIMIT);
    throw error;
  }

  const dir = await mkdtemp(path.join(env.UPLOAD_TMP_DIR ?? tmpdir(), "countersign-attachment-"));
  const putKeys: string[] = [];
  try {
    let received: { file: string; filename: string; bytes: number; sha256: string } | null = null;
    try {
      await readMultipart(request.body, boundary, {
        async onFile(part) {
          const file = path.join(dir, "upload");
          const m = meter(ATTACHMENT_MAX_BYTES);
          await pipeline(part.stream, m.stream, createWriteStream(file));
          received = { file, filename: (part.filename || "attachment").slice(0, 200), ...m.result() };
        },
      });
    } catch (error) {
      await drainBody(request.body, DRAIN_LIMIT);
      if (error instanceof MultipartError) throw new RequestError(error.message, error.status, "bad_upload");
      throw error;
    }
    const got = received as { file: string; filename: string; bytes: number; sha256: string } | null;
    if (!got || got.bytes === 0) throw new RequestError("Choose a photo or document to attach.", 400, "no_file");

    const kind = sniff(await readHead(got.file));
    if (!kind) throw new RequestError(`“${got.filename}” is not a photo or a PDF. ${ACCEPTED_TEXT} can be attached.`, 415, "not_accepted");

    const keys = attachmentKeys(projectId);
    let thumb: Buffer | null = null;
    let size: { width: number | null; height: number | null } = { width: null, height: null };
    if (kind.image) {
      try {
        const meta = await sharp(got.file).metadata();
        // Phones record the camera's orientation separately: the stored size is as the photo is seen.
        const turned = (meta.orientation ?? 1) >= 5;
        size = { width: (turned ? meta.height : meta.width) ?? null, height: (turned ? meta.width : meta.height) ?? null };
        thumb = await sharp(got.file).rotate().resize({ width: THUMB_WIDTH_PX, withoutEnlargement: true }).webp({ quality: 80 }).toBuffer();
      } catch {
        throw new RequestError(`“${got.filename}” could not be read as a photo: it looks damaged.`, 422, "bad_image");
      }
    }

    const originalKey = keys.original(got.sha256);
    if (!(await objectExists(originalKey))) {
      await putObject(originalKey, createReadStream(got.file), { contentType: kind.contentType, contentLength: got.bytes });
      putKeys.push(originalKey);
    }
    const thumbKey = thumb ? keys.thumb(got.sha256) : null;
    if (thumb && thumbKey && !(await objectExists(thumbKey))) {
      await putObject(thumbKey, thumb, { contentType: "image/webp", contentLength: thumb.length });
      putKeys.push(thumbKey);
    }

    // Checked again now the bytes are in: the request may have moved on while the file was arriving.
    const row = await sequelize.transaction(async (transaction) => {
      await checkMayAttach(actor, projectId, requestId, purpose);
      const locked = await lockRequest(projectId, requestId, transaction);
      const versionN = purpose === "request" ? (await openVersion(actor, locked, transaction)).n : null;
      return Attachment.create({
      projectId,
      requestId,
      versionN,
      commentId: null,
      objectKey: originalKey,
      sha256: got.sha256,
      contentType: kind.contentType,
      byteSize: got.bytes,
      filename: got.filename,
      thumbKey,
      widthPx: size.width,
      heightPx: size.height,
      uploadedById: actor.id,
      }, { transaction });
    });
    putKeys.length = 0; // recorded: the objects now belong to a row
    return toAttachmentView(projectId, Object.assign(row, { uploadedBy: { name: actor.name } as User }));
  } finally {
    await discardObjects(putKeys, async (key) => (await Attachment.count({ where: { [Op.or]: [{ objectKey: key }, { thumbKey: key }] } })) > 0);
    await rm(dir, { recursive: true, force: true });
  }
}

/** Removes an attachment the requester added to the version they are still editing. */
export async function removeAttachment(actor: Actor, projectId: string, requestId: string, attachmentId: string) {
  await checkMayAttach(actor, projectId, requestId, "request");
  if (!UUID.test(attachmentId)) throw new RequestError("No such attachment on this request.", 404);
  const a = await Attachment.findOne({ where: { id: attachmentId, requestId, projectId, commentId: null } });
  if (!a) throw new RequestError("No such attachment on this request.", 404);
  const latest = (await latestVersion(requestId))!;
  if (a.versionN !== latest.n || latest.submittedAt) throw new RequestError("This file was part of a version the engineer has seen, so it stays on the record.", 409);
  await a.destroy();
  // The bytes stay while any other row refers to them.
  if (!(await Attachment.count({ where: { projectId, sha256: a.sha256 } }))) {
    await deleteObject(a.objectKey);
    if (a.thumbKey) await deleteObject(a.thumbKey);
  }
}

/** The file (or its thumbnail), streamed through the app after the access check. */
export async function attachmentResponse(projectId: string, requestId: string, attachmentId: string, thumb: boolean, viewerId: string): Promise<Response> {
  if (!UUID.test(attachmentId) || !UUID.test(requestId)) throw new RequestError("No such attachment on this request.", 404);
  const [a, request] = await Promise.all([
    Attachment.findOne({ where: { id: attachmentId, requestId, projectId } }),
    DeviationRequest.findOne({ where: { id: requestId, projectId }, attributes: ["state", "createdById"] }),
  ]);
  // A draft's files are its author's own, like the draft.
  if (!a || !request || (request.state === "draft" && request.createdById !== viewerId)) throw new RequestError("No such attachment on this request.", 404);
  const key = thumb && a.thumbKey ? a.thumbKey : a.objectKey;
  const object = await getObjectStream(key);
  if (!object?.body) throw new RequestError("The file is missing from storage.", 404);
  const type = thumb && a.thumbKey ? "image/webp" : a.contentType;
  const safe = a.filename.replace(/[^\w.\- ]+/g, "_");
  return new Response(object.body, {
    headers: {
      "content-type": type,
      "content-length": String(object.contentLength),
      "content-disposition": `${type.startsWith("image/") ? "inline" : "attachment"}; filename="${safe}"`,
      "cache-control": "private, max-age=3600",
    },
  });
}
