// Signing an approval. The engineer sees exactly what will be signed (the preview and its digest); at signing the
// server re-checks the password, the engineer's verification, recomputes every attached calculation, and — holding
// a row lock on the request so two signers cannot both win — numbers the version, builds and signs the pack,
// stores it, writes the immutable approval row and its audit event, and supersedes the previous version.
import { createHash, randomBytes } from "node:crypto";
import { Op, type Transaction } from "sequelize";
import {
  Approval,
  AssessmentRow,
  Calculation,
  Decision,
  DeviationRequest,
  Drawing,
  DrawingRevision,
  Project,
  RequestVersion,
  sequelize,
  SigningKey,
  User,
} from "../../db/models";
import { verifyPassword } from "../accounts/password.server";
import { calculate } from "../calculations/calculations.server";
import { CAUTION, ENGINE_VERSION } from "../engineering";
import { audit } from "../platform/audit.server";
import { appLink } from "../platform/mailer.server";
import { deleteObject, getObjectBytes, putObject, StorageUnavailableError } from "../platform/storage.server";
import { requestCode } from "../requests/due";
import { provisionLabel } from "../requests/provisions";
import { markupsForPack } from "../review/markups.server";
import { DECISION_LABELS, OUTCOME_LABELS, PRINCIPLES, type DecisionOutcome, type PrincipleOutcome } from "../review/principles";
import { buildApprovalPack } from "./pack.server";
import { signPdf } from "./pdf-signature.server";
import { canonicalJson } from "./snapshot";
import { notifyTeam } from "./supersession.server";
import { activeSigningIdentity } from "./verification.server";

export class SigningError extends Error {
  constructor(
    message: string,
    readonly status: 401 | 403 | 404 | 409 | 422 | 503 = 409,
  ) {
    super(message);
  }
}

const sha256 = (data: string | Uint8Array) => createHash("sha256").update(data).digest("hex");

/** Everything the signature covers except the moment and the signer's key, gathered from the database. */
async function gatherRecord(projectId: string, requestId: string, transaction?: Transaction) {
  const request = await DeviationRequest.findOne({ where: { id: requestId, projectId }, transaction });
  if (!request) throw new SigningError("No such request on this project.", 404);
  const decision = await Decision.findOne({
    where: { requestId, recordedAt: { [Op.ne]: null } },
    order: [["recordedAt", "DESC"]],
    transaction,
  });
  if (request.state !== "decided" || !decision?.outcome) throw new SigningError("Only a decided request can be signed. Record the decision first.", 409);
  if (decision.outcome === "refused") throw new SigningError("A refusal is recorded, not signed as an approval.", 422);
  const signedAlready = await Approval.findOne({ where: { decisionId: decision.id }, attributes: ["n"], transaction });
  if (signedAlready) throw new SigningError(`This decision is already signed as approval v${signedAlready.n}. Record a new decision to sign a new version.`, 409);
  const [version, assessments, calculations, revisions, previous] = await Promise.all([
    RequestVersion.findByPk(decision.requestVersionId, { transaction }),
    AssessmentRow.findAll({ where: { decisionId: decision.id }, transaction }),
    Calculation.findAll({ where: { projectId, requestId }, order: [["createdAt", "ASC"]], transaction }),
    DrawingRevision.findAll({ where: { id: { [Op.in]: decision.restsOn }, projectId }, include: [{ model: Drawing, as: "drawing" }], transaction }),
    Approval.max("n", { where: { requestId }, transaction }) as Promise<number | null>,
  ]);
  if (!version) throw new SigningError("The request version of this decision is missing.", 409);
  // The engineer's markups on the sheets the decision rests on are part of what is signed.
  const markups = await markupsForPack(requestId, revisions.map((r) => r.id), transaction);
  const byPrinciple = new Map(assessments.map((a) => [a.principle, a]));
  const record = {
    request: {
      id: request.id,
      reference: requestCode(request.number),
      lockVersion: request.lockVersion,
      version: version.n,
      title: version.title,
      provision: provisionLabel(version.provision),
      clauseRef: version.clauseRef ?? "",
      siteConstraint: version.siteConstraint ?? "",
      proposal: version.proposal ?? "",
      measurements: version.measurements ?? [],
    },
    decision: {
      id: decision.id,
      outcome: decision.outcome as DecisionOutcome,
      conditions: (decision.conditions ?? []).map((c) => c.text),
      reasons: decision.reasons ?? "",
      recordedAt: decision.recordedAt!.toISOString(),
    },
    principles: PRINCIPLES.map((p) => {
      const a = byPrinciple.get(p.id);
      return { id: p.id, label: p.label, outcome: (a?.outcome ?? null) as PrincipleOutcome | null, reasoning: a?.reasoning ?? "", evidence: a?.evidence ?? [] };
    }),
    calculations: calculations.map((c) => ({ id: c.id, kind: c.kind, title: c.title, inputs: c.inputs, outputs: c.outputs, engineVersion: c.engineVersion })),
    drawings: revisions.map((r) => {
      const d = (r as unknown as { drawing: Drawing }).drawing;
      return { revisionId: r.id, sheetNumber: d.sheetNumber, title: d.title, revisionLabel: r.label, status: r.status, sha256: r.sha256 };
    }),
    markups: markups.map((m) => ({ id: m.id, revisionId: m.revisionId, page: m.page, kind: m.kind, version: m.version, shape: m.shape })),
    nextVersion: (previous ?? 0) + 1,
  };
  return { request, decision, record, revisions };
}

export type SigningRecord = Awaited<ReturnType<typeof gatherRecord>>["record"];

/** What the engineer is shown before signing, and the digest they send back to say "this is what I saw". */
export async function signingPreview(projectId: string, requestId: string) {
  const { record } = await gatherRecord(projectId, requestId);
  return { record, digest: sha256(canonicalJson(record)) };
}

/** Reruns each attached calculation with the current engine; names any whose results moved. */
function nonReproducing(record: SigningRecord) {
  const problems: string[] = [];
  for (const c of record.calculations) {
    try {
      const now = calculate(c.kind, c.inputs);
      if (canonicalJson(now.output) !== canonicalJson(c.outputs)) problems.push(`“${c.title}” now gives different results (engine ${ENGINE_VERSION}; saved with ${c.engineVersion})`);
    } catch {
      problems.push(`“${c.title}” no longer runs with engine ${ENGINE_VERSION}`);
    }
  }
  return problems;
}

export interface SignInput {
  password: string;
  seenDigest: string;
}

export async function signApproval(actor: { id: string }, projectId: string, requestId: string, input: SignInput) {
  const signer = await User.findByPk(actor.id);
  if (!signer || !(await verifyPassword(input.password, signer.passwordHash))) {
    throw new SigningError("That password is not right. Signing needs your password, entered now.", 401);
  }
  const identity = await activeSigningIdentity(actor.id);
  if (!identity) throw new SigningError("Your professional registration is not verified on Countersign, so you cannot sign. A project manager verifies it.", 403);
  const key = await SigningKey.findOne({ where: { userId: actor.id, revokedAt: { [Op.is]: null } } });
  if (!key) throw new SigningError("You have no signing key. Ask a project manager to verify your registration again.", 403);

  const project = await Project.findByPk(projectId, { attributes: ["id", "name", "siteAddress"] });
  if (!project) throw new SigningError("No such project.", 404);
  const signedAt = new Date();
  const verifyCode = randomBytes(18).toString("base64url");
  let packKey: string | undefined;

  try {
    return await sequelize.transaction(async (transaction) => {
      // The row lock makes a second, simultaneous signer wait here, then find the version already taken.
      await DeviationRequest.findOne({ where: { id: requestId, projectId }, lock: transaction.LOCK.UPDATE, transaction });
      const { record, revisions } = await gatherRecord(projectId, requestId, transaction);
      if (sha256(canonicalJson(record)) !== input.seenDigest) {
        throw new SigningError("The record changed since you opened it (another approval was signed, or the decision, calculations or drawings changed). Review it again before signing.", 409);
      }
      const drift = nonReproducing(record);
      if (drift.length) throw new SigningError(`Not signed: ${drift.join("; ")}. Reopen and save the calculation again, then review.`, 409);

      const snapshot = {
        ...record,
        approval: { version: record.nextVersion, signedAt: signedAt.toISOString(), verifyCode },
        engineer: { id: signer.id, name: signer.name, email: signer.email, registrationNumber: identity.registrationNumber, registrationBody: signer.registrationBody ?? "", certificateSha256: key.certificateSha256 },
        project: { id: project.id, name: project.name, siteAddress: project.siteAddress },
        engineVersion: ENGINE_VERSION,
      };
      const snapshotSha256 = sha256(canonicalJson(snapshot));
      const sheets = await Promise.all(
        revisions.map(async (r) => {
          const bytes = await getObjectBytes(r.objectKey);
          if (!bytes) throw new SigningError(`The drawing file of ${record.drawings.find((d) => d.revisionId === r.id)?.sheetNumber ?? "a sheet"} is missing from storage.`, 503);
          const d = record.drawings.find((x) => x.revisionId === r.id)!;
          return { sheetNumber: d.sheetNumber, title: d.title, revisionLabel: d.revisionLabel, sha256: d.sha256, pdf: bytes, markups: record.markups.filter((m) => m.revisionId === r.id).map((m) => ({ ...m.shape, page: m.page })) };
        }),
      );
      const doc = await buildApprovalPack({
        approval: { reference: record.request.reference, version: record.nextVersion, decision: DECISION_LABELS[record.decision.outcome], signedAt, verifyUrl: appLink(`/verify/${verifyCode}`), snapshotSha256 },
        engineer: { name: signer.name, registrationNumber: identity.registrationNumber, registrationBody: signer.registrationBody ?? "" },
        project: { name: project.name, siteAddress: project.siteAddress },
        request: { title: record.request.title, provision: record.request.provision, clauseRef: record.request.clauseRef, constraint: record.request.siteConstraint, proposal: record.request.proposal },
        principles: record.principles.map((p) => ({ label: p.label, outcome: p.outcome ? OUTCOME_LABELS[p.outcome] : "—", reasoning: p.reasoning })),
        conditions: record.decision.conditions,
        calculations: record.calculations.map((c) => ({ title: c.title, lines: summaryLines(c.outputs), engineVersion: c.engineVersion })),
        sheets,
        caution: CAUTION,
      });
      const pack = await signPdf(doc, identity, {
        reason: `${record.request.reference} approval v${record.nextVersion}: ${DECISION_LABELS[record.decision.outcome]}`,
        name: signer.name,
        location: "Countersign",
        contactInfo: signer.email,
        signingTime: signedAt,
      });
      const packSha256 = sha256(pack);
      packKey = `projects/${projectId}/approvals/${requestId}-v${record.nextVersion}-${packSha256.slice(0, 16)}.pdf`;
      await putObject(packKey, pack, { contentType: "application/pdf", contentLength: pack.length });

      await Approval.update(
        { state: "superseded", stateReason: `Superseded by v${record.nextVersion}`, stateChangedAt: signedAt },
        { where: { requestId, state: { [Op.in]: ["current", "needs_reapproval"] } }, transaction },
      );
      const approval = await Approval.create(
        {
          projectId,
          requestId,
          decisionId: record.decision.id,
          n: record.nextVersion,
          reference: record.request.reference,
          outcome: record.decision.outcome,
          snapshot,
          snapshotSha256,
          packKey,
          packSha256,
          packBytes: pack.length,
          restsOn: record.drawings.map((d) => d.revisionId),
          signerId: signer.id,
          signingKeyId: key.id,
          certificateSha256: key.certificateSha256,
          signedAt,
          verifyCode,
          stateReason: null,
          stateChangedAt: null,
        },
        { transaction },
      );
      await audit(
        { action: "approval.signed", actorId: signer.id, projectId, subjectType: "approval", subjectId: approval.id, data: { reference: record.request.reference, version: record.nextVersion, snapshotSha256, packSha256 } },
        transaction,
      );
      await notifyTeam(projectId, signer.id, `${record.request.reference} approval v${record.nextVersion} signed`, `${signer.name} signed approval v${record.nextVersion} of ${record.request.reference} (${record.request.title}): ${DECISION_LABELS[record.decision.outcome]}. The signed pack is on the site page.`, `/projects/${projectId}/site`, transaction);
      return approval;
    });
  } catch (error) {
    if (packKey) await deleteObject(packKey).catch(() => undefined);
    if (error instanceof StorageUnavailableError) throw new SigningError("The file store is not answering, so nothing was signed or recorded. Try again in a minute.", 503);
    throw error;
  }
}

function summaryLines(outputs: unknown): string[] {
  const o = outputs as { ok?: boolean; findings?: { severity: string; rule: string }[] };
  const lines = [`Result: ${o?.ok ? "within the limits checked" : "see findings"}`];
  for (const f of o?.findings?.slice(0, 8) ?? []) lines.push(`${f.severity.toUpperCase()}: ${f.rule}`);
  return lines;
}
