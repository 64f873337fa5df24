// Password reset by e-mail: a single-use token that expires, and every session ended once it is used.
import { Op } from "sequelize";
import { PasswordReset, sequelize, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { appLink, sendMail } from "../platform/mailer.server";
import { hashToken, newToken } from "../platform/tokens.server";
import { hashPassword } from "./password.server";
import { revokeAllSessions } from "./session.server";

export const RESET_TTL_MINUTES = 60;
const RESETS_PER_HOUR = 3;

/** Sends a reset link when the account exists; says nothing either way, so addresses cannot be probed. */
export async function requestPasswordReset(email: string) {
  const user = await User.findOne({ where: { email: email.toLowerCase() }, attributes: ["id", "email", "name"] });
  if (!user) return;
  const recent = await PasswordReset.count({
    where: { userId: user.id, createdAt: { [Op.gt]: new Date(Date.now() - 3_600_000) } },
  });
  if (recent >= RESETS_PER_HOUR) return;
  const { token, hash } = newToken();
  await PasswordReset.create({
    userId: user.id,
    tokenHash: hash,
    expiresAt: new Date(Date.now() + RESET_TTL_MINUTES * 60_000),
    usedAt: null,
  });
  await sendMail({
    to: user.email,
    subject: "Reset your Countersign password",
    text: `Hello ${user.name},\n\nSomeone (we hope you) asked to reset the password of your Countersign account. The link works once, for ${RESET_TTL_MINUTES} minutes.\n\nIf you did not ask, ignore this message: your password stays as it is.`,
    action: { label: "Choose a new password", url: appLink(`/reset-password/${token}`) },
  });
}

export type ResetTokenState = "valid" | "expired" | "used" | "unknown";

export async function resetTokenState(token: string): Promise<ResetTokenState> {
  const row = await PasswordReset.findOne({ where: { tokenHash: hashToken(token) } });
  if (!row) return "unknown";
  if (row.usedAt) return "used";
  if (row.expiresAt < new Date()) return "expired";
  return "valid";
}

export async function resetPassword(token: string, password: string): Promise<ResetTokenState> {
  const passwordHash = await hashPassword(password);
  return sequelize.transaction(async (transaction) => {
    const row = await PasswordReset.findOne({
      where: { tokenHash: hashToken(token) },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!row) return "unknown";
    if (row.usedAt) return "used";
    if (row.expiresAt < new Date()) return "expired";
    await row.update({ usedAt: new Date() }, { transaction });
    await User.update({ passwordHash }, { where: { id: row.userId }, transaction });
    await audit({ action: "account.password_reset", actorId: row.userId, subjectType: "user", subjectId: row.userId }, transaction);
    await revokeAllSessions(row.userId);
    return "valid";
  });
}
