// Background processing of a stored revision (job "revision.process"): page count and sizes, positioned text,
// and a thumbnail per page. Reads the PDF from object storage by ranges; progress is written to the revision
// row as it goes, so the register can show it. Idempotent: running it again rewrites the same results.
import { Op } from "sequelize";
import { DrawingRevision, isDatabaseUnavailable, type PageSize, type TextRun } from "../../db/models";
import { audit } from "../platform/audit.server";
import { env } from "../platform/env.server";
import { activeJobs, defineJob, failJob, whenJobsStart } from "../platform/jobs.server";
import { putObject, StorageUnavailableError } from "../platform/storage.server";
import { DrawingError, keys } from "./errors";
import { objectSource, openPdf, pageSize, pageText, renderPage } from "./pdf.server";

/** Thumbnails are this many pixels wide (sharp enough for a 2× screen in the side rail). */
export const THUMB_WIDTH_PX = 320;

const job = defineJob<{ revisionId: string }>({
  name: "revision.process",
  retryLimit: 2,
  retryDelaySeconds: 3,
  expireInSeconds: 15 * 60,
  handler: async ({ revisionId }, meta) => processRevision(revisionId, { final: meta.retryCount >= meta.retryLimit }),
});

export function queueProcessing(revisionId: string) {
  return job.send({ revisionId }, { singletonKey: revisionId });
}

// Revisions recorded while the queue could not take them (or by a process that stopped) are queued again.
whenJobsStart(async () => {
  const stale = await DrawingRevision.findAll({
    where: { processing: "queued", updatedAt: { [Op.lt]: new Date(Date.now() - 60_000) } },
    attributes: ["id"],
    limit: 500,
  });
  for (const r of stale) await queueProcessing(r.id);
});

// A revision being processed records each page as it goes. One that has shown no progress for this long was left
// by a process that stopped (killed, crashed, redeployed): its job goes back to the queue for a live worker.
// If the process was merely slow, the page is processed twice, which is harmless: every write is by key.
export const STALL_SECONDS = 30;
const STALL_CHECK_EVERY_MS = 10_000;

export async function requeueStalledProcessing(now = Date.now()) {
  const active = await activeJobs<{ revisionId: string }>(job.name);
  if (!active.length) return 0;
  const stalled = await DrawingRevision.findAll({
    where: { id: active.map((j) => j.data.revisionId), processing: ["running", "queued"], updatedAt: { [Op.lt]: new Date(now - STALL_SECONDS * 1000) } },
    attributes: ["id"],
  });
  const ids = new Set(stalled.map((r) => r.id));
  const jobs = active.filter((j) => ids.has(j.data.revisionId) && j.startedOn.getTime() < now - STALL_SECONDS * 1000);
  for (const j of jobs) await failJob(job.name, j.id, `no progress for ${STALL_SECONDS} s: the process running it stopped`);
  return jobs.length;
}

// Only processes that run the worker watch: a web-only process has no business polling the queue.
if (env.JOBS_WORKER) whenJobsStart(async () => {
  const timer = setInterval(() => void requeueStalledProcessing().catch((e) => console.error("stalled processing check:", (e as Error).message)), STALL_CHECK_EVERY_MS);
  timer.unref();
});

function explain(error: unknown): string {
  if (error instanceof StorageUnavailableError) return "The file store did not answer while reading this revision. Try again.";
  if (error instanceof DrawingError) return error.message;
  const name = (error as Error)?.name;
  if (name === "InvalidPDFException" || name === "UnknownErrorException" || name === "FormatError") return "The PDF could not be read: it looks damaged.";
  return `Processing stopped: ${(error as Error)?.message ?? "unknown error"}.`;
}

export async function processRevision(revisionId: string, options: { final?: boolean } = {}) {
  const rev = await DrawingRevision.findByPk(revisionId, { attributes: ["id", "projectId", "objectKey", "sha256", "byteSize"] });
  if (!rev) return;
  await DrawingRevision.update({ processing: "running", processedPages: 0, processingError: null }, { where: { id: revisionId } });
  const k = keys(rev.projectId);
  let pdf: Awaited<ReturnType<typeof openPdf>> | undefined;
  try {
    pdf = await openPdf(objectSource(rev.objectKey, rev.byteSize));
    const pages: PageSize[] = [];
    const text: TextRun[][] = [];
    for (let n = 1; n <= pdf.numPages; n++) {
      const page = await pdf.getPage(n);
      const size = pageSize(page);
      pages.push(size);
      text.push(await pageText(page));
      const canvas = await renderPage(page, THUMB_WIDTH_PX / size.widthPt);
      const webp = await canvas.encode("webp", 82);
      await putObject(k.thumb(rev.sha256, n), webp, { contentType: "image/webp", contentLength: webp.length });
      page.cleanup();
      await DrawingRevision.update({ processedPages: n, pageCount: pdf.numPages }, { where: { id: revisionId } });
    }
    await DrawingRevision.update({ processing: "done", pages, text, pageCount: pdf.numPages, processedPages: pdf.numPages }, { where: { id: revisionId } });
  } catch (error) {
    // A PDF that cannot be read will not read better later: fail now. Outages are retried by the queue.
    const transient = error instanceof StorageUnavailableError || isDatabaseUnavailable(error);
    await DrawingRevision.update(
      { processing: transient && options.final === false ? "queued" : "failed", processingError: explain(error) },
      { where: { id: revisionId } },
    );
    if (transient) throw error;
  } finally {
    await pdf?.destroy();
  }
}

/** A member with upload rights asks for a failed revision to be processed again. */
export async function retryProcessing(actorId: string, projectId: string, revisionId: string) {
  const [count] = await DrawingRevision.update(
    { processing: "queued", processingError: null, processedPages: 0 },
    { where: { id: revisionId, projectId, processing: "failed" } },
  );
  if (!count) throw new DrawingError("Only a revision whose processing failed can be retried.", 409, "not_failed");
  await audit({ action: "revision.processing_retried", actorId, projectId, subjectType: "drawing_revision", subjectId: revisionId });
  await queueProcessing(revisionId);
}
