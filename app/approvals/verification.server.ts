// Verifying an engineer's professional registration: a project manager records what was checked (number, body,
// date, evidence), and a signing identity is issued in the same transaction. Revocation withdraws the right to
// sign and the key. Unverified engineers can review but not sign.
import { createHash } from "node:crypto";
import { Op } from "sequelize";
import { ProjectMember, RegistrationVerification, sequelize, SigningKey, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { UUID } from "../platform/failures.server";
import { env } from "../platform/env.server";
import type { SmallFile } from "../platform/small-upload.server";
import { discardObjects, putObject } from "../platform/storage.server";
import { decryptPrivateKey, encryptPrivateKey, issueSigningIdentity, type SigningIdentity } from "./identity.server";

export class VerificationError extends Error {
  constructor(
    message: string,
    readonly status = 409,
  ) {
    super(message);
  }
}

export type Evidence = SmallFile;
export const EVIDENCE_MAX_BYTES = 10 * 1024 * 1024;

async function engineerMember(projectId: string, memberId: string) {
  const member = UUID.test(memberId) ? await ProjectMember.findOne({ where: { id: memberId, projectId }, include: [{ model: User, as: "user" }] }) : null;
  if (!member) throw new VerificationError("That person is not a member of this project.", 404);
  if (member.role !== "engineer") throw new VerificationError("Only members with the engineer role have a registration to verify.", 422);
  return { member, user: (member as unknown as { user: User }).user };
}

export async function registrationRecord(projectId: string, memberId: string) {
  const { member, user } = await engineerMember(projectId, memberId);
  const history = await RegistrationVerification.findAll({
    where: { userId: user.id },
    include: [{ model: User, as: "verifiedBy", attributes: ["name"] }],
    order: [["createdAt", "DESC"]],
    limit: 20,
  });
  return {
    memberId: member.id,
    user: { id: user.id, name: user.name, email: user.email, registrationNumber: user.registrationNumber, registrationBody: user.registrationBody, registrationState: user.registrationState, verifiedAt: user.verifiedAt },
    history: history.map((h) => ({
      id: h.id,
      outcome: h.outcome,
      registrationNumber: h.registrationNumber,
      registrationBody: h.registrationBody,
      checkedOn: h.checkedOn,
      note: h.note,
      evidenceName: h.evidenceName,
      by: (h as unknown as { verifiedBy: User }).verifiedBy.name,
      at: h.createdAt,
    })),
  };
}

export async function verifyRegistration(
  actorId: string,
  projectId: string,
  memberId: string,
  input: { registrationNumber: string; registrationBody: string; checkedOn: string; note?: string; evidence?: Evidence },
) {
  const { user } = await engineerMember(projectId, memberId);
  if (user.id === actorId) throw new VerificationError("You cannot verify your own registration; another project manager must.", 403);
  let evidenceKey: string | null = null;
  let sha: string | null = null;
  if (input.evidence) {
    sha = createHash("sha256").update(input.evidence.bytes).digest("hex");
    evidenceKey = `projects/${projectId}/verifications/${sha}`;
    await putObject(evidenceKey, input.evidence.bytes, { contentType: input.evidence.contentType, contentLength: input.evidence.bytes.length });
  }
  const identity = issueSigningIdentity({ name: user.name, email: user.email, registrationNumber: input.registrationNumber, registrationBody: input.registrationBody });
  try {
    await sequelize.transaction(async (transaction) => {
      await User.update(
        { registrationNumber: input.registrationNumber, registrationBody: input.registrationBody, registrationState: "verified", verifiedById: actorId, verifiedAt: new Date() },
        { where: { id: user.id }, transaction },
      );
      await RegistrationVerification.create(
        { userId: user.id, projectId, verifiedById: actorId, outcome: "verified", registrationNumber: input.registrationNumber, registrationBody: input.registrationBody, checkedOn: input.checkedOn, note: input.note || null, evidenceKey, evidenceName: input.evidence?.filename ?? null, evidenceSha256: sha },
        { transaction },
      );
      await SigningKey.update({ revokedAt: new Date() }, { where: { userId: user.id, revokedAt: null }, transaction });
      const certificateSha256 = createHash("sha256").update(identity.certificatePem).digest("hex");
      await SigningKey.create(
        { userId: user.id, certificatePem: identity.certificatePem, certificateSha256, encryptedPrivateKey: encryptPrivateKey(identity.privateKeyPem, env.SIGNING_KEY_SECRET), registrationNumber: input.registrationNumber, revokedAt: null },
        { transaction },
      );
      await audit(
        { action: "engineer.verified", actorId, projectId, subjectType: "user", subjectId: user.id, data: { registrationNumber: input.registrationNumber, registrationBody: input.registrationBody, checkedOn: input.checkedOn, evidenceSha256: sha } },
        transaction,
      );
    });
  } catch (error) {
    // Evidence is named by content: the same document may back another engineer's verification, and stays.
    if (evidenceKey) await discardObjects([evidenceKey], async (key) => (await RegistrationVerification.count({ where: { evidenceKey: key } })) > 0);
    throw error;
  }
}

export async function revokeRegistration(actorId: string, projectId: string, memberId: string, note: string) {
  const { user } = await engineerMember(projectId, memberId);
  await sequelize.transaction(async (transaction) => {
    await User.update({ registrationState: "revoked" }, { where: { id: user.id }, transaction });
    await RegistrationVerification.create(
      { userId: user.id, projectId, verifiedById: actorId, outcome: "revoked", registrationNumber: user.registrationNumber ?? "", registrationBody: user.registrationBody ?? "", checkedOn: new Date().toISOString().slice(0, 10), note, evidenceKey: null, evidenceName: null, evidenceSha256: null },
      { transaction },
    );
    await SigningKey.update({ revokedAt: new Date() }, { where: { userId: user.id, revokedAt: null }, transaction });
    await audit({ action: "engineer.revoked", actorId, projectId, subjectType: "user", subjectId: user.id, data: { note } }, transaction);
  });
}

/** The engineer's usable signing identity, or null when unverified, revoked or the key cannot be opened. */
export async function activeSigningIdentity(userId: string): Promise<(SigningIdentity & { certificateSha256: string; registrationNumber: string }) | null> {
  const user = await User.findByPk(userId, { attributes: ["registrationState"] });
  if (user?.registrationState !== "verified") return null;
  const key = await SigningKey.findOne({ where: { userId, revokedAt: { [Op.is]: null } } });
  if (!key) return null;
  try {
    return {
      certificatePem: key.certificatePem,
      privateKeyPem: decryptPrivateKey(key.encryptedPrivateKey, env.SIGNING_KEY_SECRET),
      certificateSha256: key.certificateSha256,
      registrationNumber: key.registrationNumber,
    };
  } catch {
    return null;
  }
}
