// What the site needs from approvals: the project's approvals with their state and conditions, the signed pack
// (through a short-lived link after the access check), all current packs as one zip for offline use, and the
// "installed as approved" record that closes the request.
import { createHash } from "node:crypto";
import { PassThrough, Readable } from "node:stream";
import { ZipArchive } from "archiver";
import { Op, type WhereOptions } from "sequelize";
import { Approval, DeviationRequest, InstallationRecord, sequelize, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { discardObjects, getObjectStream, presignDownload, putObject } from "../platform/storage.server";
import { checkMove } from "../requests/workflow";
import { notifyTeam } from "./supersession.server";

export class SiteError extends Error {
  constructor(
    message: string,
    readonly status = 409,
  ) {
    super(message);
  }
}

type Snapshot = {
  request: { title: string; provision: string; version: number };
  decision: { conditions: string[] };
  drawings: { sheetNumber: string; revisionLabel: string; title: string; sha256: string }[];
  engineer: { name: string; registrationNumber: string; registrationBody: string };
};

export interface ApprovalSummary {
  id: string;
  requestId: string;
  reference: string;
  n: number;
  title: string;
  outcome: string;
  state: string;
  stateReason: string | null;
  conditions: string[];
  signedAt: string;
  signer: string;
  verifyCode: string;
  installed: { on: string; by: string } | null;
}

function summary(a: Approval, installs: InstallationRecord[]): ApprovalSummary {
  const s = a.snapshot as unknown as Snapshot;
  const install = installs.find((i) => i.approvalId === a.id);
  return {
    id: a.id,
    requestId: a.requestId,
    reference: a.reference,
    n: a.n,
    title: s.request.title,
    outcome: a.outcome,
    state: a.state,
    stateReason: a.stateReason,
    conditions: s.decision.conditions,
    signedAt: a.signedAt.toISOString(),
    signer: s.engineer.name,
    verifyCode: a.verifyCode,
    installed: install ? { on: install.installedOn, by: (install as unknown as { recordedBy?: User }).recordedBy?.name ?? "" } : null,
  };
}

export async function listApprovals(projectId: string, options: { currentOnly?: boolean } = {}) {
  const rows = await Approval.findAll({
    where: { projectId, ...(options.currentOnly ? { state: "current" } : {}) },
    attributes: { exclude: [] },
    order: [["reference", "ASC"], ["n", "DESC"]],
  });
  const installs = rows.length
    ? await InstallationRecord.findAll({ where: { approvalId: { [Op.in]: rows.map((r) => r.id) } }, include: [{ model: User, as: "recordedBy", attributes: ["name"] }] })
    : [];
  return rows.map((r) => summary(r, installs));
}

async function findApproval(projectId: string, approvalId: string) {
  if (!/^[0-9a-f-]{36}$/i.test(approvalId)) throw new SiteError("No such approval on this project.", 404);
  const a = await Approval.findOne({ where: { id: approvalId, projectId } });
  if (!a) throw new SiteError("No such approval on this project.", 404);
  return a;
}

export async function getApproval(projectId: string, approvalId: string) {
  const a = await findApproval(projectId, approvalId);
  const [installs, versions] = await Promise.all([
    InstallationRecord.findAll({ where: { approvalId: a.id }, include: [{ model: User, as: "recordedBy", attributes: ["name"] }] }),
    Approval.findAll({ where: { requestId: a.requestId }, attributes: ["id", "n", "state", "signedAt"], order: [["n", "ASC"]] }),
  ]);
  const previous = a.n > 1 ? await Approval.findOne({ where: { requestId: a.requestId, n: a.n - 1 } }) : null;
  return {
    approval: summary(a, installs),
    snapshot: a.snapshot as unknown as Snapshot & Record<string, unknown>,
    previousSnapshot: (previous?.snapshot as unknown as Snapshot | undefined) ?? null,
    packSha256: a.packSha256,
    packBytes: a.packBytes,
    versions: versions.map((v) => ({ id: v.id, n: v.n, state: v.state })),
    installations: installs.map((i) => ({ id: i.id, on: i.installedOn, note: i.note, photos: i.photoKeys.length, by: (i as unknown as { recordedBy?: User }).recordedBy?.name ?? "" })),
  };
}

export async function packLink(projectId: string, approvalId: string) {
  const a = await findApproval(projectId, approvalId);
  return presignDownload(a.packKey, `${a.reference}-approval-v${a.n}.pdf`);
}

/** All current packs of the project as one zip, streamed from storage as it is written. */
export async function currentPacksZip(projectId: string): Promise<{ stream: ReadableStream<Uint8Array>; count: number }> {
  const rows = await Approval.findAll({ where: { projectId, state: "current" }, attributes: ["packKey", "reference", "n"], order: [["reference", "ASC"]] });
  const zip = new ZipArchive({ zlib: { level: 0 } });
  const out = new PassThrough();
  zip.pipe(out);
  (async () => {
    for (const r of rows) {
      const object = await getObjectStream(r.packKey);
      if (object?.body) zip.append(Readable.fromWeb(object.body as never), { name: `${r.reference}-approval-v${r.n}.pdf` });
    }
    zip.append(`Current approval packs, ${new Date().toISOString()}\nEach PDF is digitally signed; check any copy at the verification page printed on it.\n`, { name: "README.txt" });
    await zip.finalize();
  })().catch((error) => out.destroy(error));
  return { stream: Readable.toWeb(out) as ReadableStream<Uint8Array>, count: rows.length };
}

export interface InstallationPhoto {
  filename: string;
  contentType: string;
  bytes: Buffer;
}

export async function recordInstallation(
  actor: { id: string; name: string; role: "site_plumber" | "engineer" | "architect" | "manager" },
  projectId: string,
  approvalId: string,
  input: { installedOn: string; note?: string; photos: InstallationPhoto[] },
) {
  const a = await findApproval(projectId, approvalId);
  if (a.state !== "current") throw new SiteError("Only a current approval can be recorded as installed. This one is " + a.state.replace("_", " ") + ".");
  const stored: { key: string; name: string; sha256: string }[] = [];
  for (const p of input.photos) {
    const sha256 = createHash("sha256").update(p.bytes).digest("hex");
    const key = `projects/${projectId}/installations/${sha256}`;
    await putObject(key, p.bytes, { contentType: p.contentType, contentLength: p.bytes.length });
    stored.push({ key, name: p.filename, sha256 });
  }
  try {
    await sequelize.transaction(async (transaction) => {
      const request = await DeviationRequest.findOne({ where: { id: a.requestId, projectId }, lock: transaction.LOCK.UPDATE, transaction });
      if (!request) throw new SiteError("The request of this approval is missing.", 404);
      const move = checkMove(request.state, "close", { role: actor.role, isRequester: request.createdById === actor.id });
      if (!move.ok) throw new SiteError(move.reason, 409);
      await InstallationRecord.create({ projectId, approvalId, recordedById: actor.id, installedOn: input.installedOn, note: input.note || null, photoKeys: stored }, { transaction });
      const from = request.state;
      await request.update({ state: move.to, stateChangedAt: new Date(), lockVersion: request.lockVersion + 1 }, { transaction });
      await audit({ action: "request.moved", actorId: actor.id, projectId, subjectType: "request", subjectId: request.id, data: { from, to: move.to, action: "close", approvalId } }, transaction);
      await audit({ action: "installation.recorded", actorId: actor.id, projectId, subjectType: "approval", subjectId: approvalId, data: { installedOn: input.installedOn, photos: stored.length } }, transaction);
      await notifyTeam(projectId, actor.id, `${a.reference} installed as approved`, `${actor.name} recorded ${a.reference} (approval v${a.n}) as installed as approved on ${input.installedOn}.`, `/projects/${projectId}/approvals/${approvalId}`, transaction);
    });
  } catch (error) {
    // Photos are named by content: another record may hold the same photo, and keeps it.
    await discardObjects(stored.map((s) => s.key), async (key) => {
      // JSONB containment: a row whose photo list has an entry with this key (Sequelize's types cannot say it).
      const where = { projectId, photoKeys: { [Op.contains]: [{ key }] } } as WhereOptions<InstallationRecord>;
      return (await InstallationRecord.count({ where })) > 0;
    });
    throw error;
  }
}
