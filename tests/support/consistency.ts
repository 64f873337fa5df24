// Database ↔ object-store consistency: every object in the bucket should be referenced by a row (or derived from
// one), and every key a row refers to should be in the bucket. Reused by any test that wants to prove a failure
// left nothing behind.
//
// Referenced keys (columns that name an object):
//   drawing_revisions.objectKey, attachments.objectKey / thumbKey, approvals.packKey, noncompliance_notices.pdfKey,
//   registration_verifications.evidenceKey, installation_records.photoKeys[].key.
// Derived objects (no column names them; their key is computed from a referenced revision, so they are allowed):
//   projects/<p>/thumbs/<sha>-p<n>.webp   page thumbnails that background processing renders for a revision of
//                                         project <p> with that SHA-256 (attachment thumbnails are in thumbKey);
//   projects/<p>/compare/<a>-<b>-p<n>.*   the comparison cache for two revisions <a>, <b> of project <p>.
// A revision whose processing is done must also have its page thumbnails 1..processedPages: a missing one is
// reported as a dangling row too ("<key> (thumbnail of revision <id>)").
import { Op } from "sequelize";
import { Approval, Attachment, DrawingRevision, InstallationRecord, NoncomplianceNotice, RegistrationVerification } from "../../db/models";
import { listKeys } from "../../app/platform/storage.server";
import { keys as drawingKeys } from "../../app/drawings/errors";

export interface Consistency {
  /** In the bucket, referenced by no row and derived from none. */
  orphanObjects: string[];
  /** Referenced by a row (or expected from one), but not in the bucket. */
  danglingRows: string[];
}

export interface ConsistencyOptions {
  /** Only these projects' objects and rows (keys under projects/<id>/); by default the whole bucket and database. */
  projectIds?: string[];
  bucket?: string;
}

async function listObjects(bucket: string, prefixes: string[]): Promise<string[]> {
  const out: string[] = [];
  for (const prefix of prefixes) for await (const key of listKeys(prefix, bucket)) out.push(key);
  return out;
}

export async function checkConsistency(options: ConsistencyOptions = {}): Promise<Consistency> {
  const bucket = options.bucket ?? process.env.S3_BUCKET ?? "countersign-test";
  const where = options.projectIds ? { projectId: { [Op.in]: options.projectIds } } : {};
  const prefixes = options.projectIds ? options.projectIds.map((id) => `projects/${id}/`) : [""];

  const [revisions, attachments, approvals, notices, verifications, installations, objects] = await Promise.all([
    DrawingRevision.findAll({ where, attributes: ["id", "projectId", "objectKey", "sha256", "processing", "processedPages"] }),
    Attachment.findAll({ where, attributes: ["id", "objectKey", "thumbKey"] }),
    Approval.findAll({ where, attributes: ["id", "packKey"] }),
    NoncomplianceNotice.findAll({ where, attributes: ["id", "pdfKey"] }),
    RegistrationVerification.findAll({ where, attributes: ["id", "evidenceKey"] }),
    InstallationRecord.findAll({ where, attributes: ["id", "photoKeys"] }),
    listObjects(bucket, prefixes),
  ]);

  // key → what refers to it (for the report)
  const referenced = new Map<string, string>();
  const refer = (key: string | null | undefined, by: string) => {
    if (key && !referenced.has(key)) referenced.set(key, by);
  };
  for (const r of revisions) refer(r.objectKey, `drawing_revisions ${r.id}`);
  for (const a of attachments) {
    refer(a.objectKey, `attachments ${a.id}`);
    refer(a.thumbKey, `attachments ${a.id} (thumbnail)`);
  }
  for (const a of approvals) refer(a.packKey, `approvals ${a.id}`);
  for (const n of notices) refer(n.pdfKey, `noncompliance_notices ${n.id}`);
  for (const v of verifications) refer(v.evidenceKey, `registration_verifications ${v.id}`);
  for (const i of installations) for (const p of i.photoKeys ?? []) refer(p.key, `installation_records ${i.id}`);
  // Processed revisions promise their page thumbnails.
  for (const r of revisions) {
    if (r.processing !== "done") continue;
    const k = drawingKeys(r.projectId);
    for (let n = 1; n <= r.processedPages; n++) refer(k.thumb(r.sha256, n), `drawing_revisions ${r.id} (thumbnail p${n})`);
  }

  const revisionShas = new Map<string, Set<string>>(); // projectId → SHA-256s of its revisions
  for (const r of revisions) {
    if (!revisionShas.has(r.projectId)) revisionShas.set(r.projectId, new Set());
    revisionShas.get(r.projectId)!.add(r.sha256);
  }
  const derived = (key: string) => {
    const thumb = key.match(/^projects\/([0-9a-f-]{36})\/thumbs\/([0-9a-f]{64})-p\d+\.webp$/);
    if (thumb) return revisionShas.get(thumb[1]!)?.has(thumb[2]!) ?? false;
    const compare = key.match(/^projects\/([0-9a-f-]{36})\/compare\/([0-9a-f]{64})-([0-9a-f]{64})-p\d+\.(json|png)$/);
    if (compare) {
      const shas = revisionShas.get(compare[1]!);
      return !!shas?.has(compare[2]!) && shas.has(compare[3]!);
    }
    return false;
  };

  const inBucket = new Set(objects);
  return {
    orphanObjects: objects.filter((key) => !referenced.has(key) && !derived(key)).sort(),
    danglingRows: [...referenced].filter(([key]) => !inBucket.has(key)).map(([key, by]) => `${key} (${by})`).sort(),
  };
}
