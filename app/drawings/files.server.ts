// Getting a revision's bytes out, always after the caller's access was checked: the app streams the PDF from
// object storage with Range support (what the viewer uses), serves thumbnails, or hands out a short-lived
// presigned link for a download.
import { getObjectStream, presignDownload } from "../platform/storage.server";
import { DrawingError, keys } from "./errors";
import { findRevision } from "./register.server";

function downloadName(sheetNumber: string, label: string) {
  return `${sheetNumber}-${label}.pdf`.replace(/[^\w.\-]+/g, "_");
}

export async function serveRevisionFile(request: Request, projectId: string, drawingId: string, revisionId: string) {
  const rev = await findRevision(projectId, drawingId, revisionId);
  const object = await getObjectStream(rev.objectKey, request.headers.get("range"));
  if (!object) throw new DrawingError("The file of this revision is missing from storage.", 404);
  const headers = new Headers({
    "Content-Type": "application/pdf",
    "Accept-Ranges": "bytes",
    "Cache-Control": "private, max-age=3600",
    "Content-Disposition": `inline; filename="${rev.sha256.slice(0, 12)}.pdf"`,
    ETag: `"${rev.sha256}"`,
  });
  if (object.status === 416) {
    headers.set("Content-Range", `bytes */${rev.byteSize}`);
    return new Response(null, { status: 416, headers });
  }
  headers.set("Content-Length", String(object.contentLength));
  if (object.contentRange) headers.set("Content-Range", object.contentRange);
  return new Response(request.method === "HEAD" ? null : object.body, { status: object.status, headers });
}

export async function serveThumbnail(projectId: string, drawingId: string, revisionId: string, page: number) {
  const rev = await findRevision(projectId, drawingId, revisionId);
  if (!Number.isInteger(page) || page < 1 || page > rev.pageCount) throw new DrawingError("No such page.", 404);
  const object = await getObjectStream(keys(projectId).thumb(rev.sha256, page));
  if (!object?.body) throw new DrawingError("This thumbnail is not ready yet.", 404);
  return new Response(object.body, {
    headers: { "Content-Type": "image/webp", "Content-Length": String(object.contentLength), "Cache-Control": "private, max-age=86400, immutable" },
  });
}

export async function revisionDownloadUrl(projectId: string, drawingId: string, revisionId: string) {
  const rev = await findRevision(projectId, drawingId, revisionId);
  return presignDownload(rev.objectKey, downloadName(rev.drawing.sheetNumber, rev.label));
}
