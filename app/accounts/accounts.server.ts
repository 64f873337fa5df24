// Accounts: sign-up, profile and the engineer's registration details.
import { UniqueConstraintError } from "sequelize";
import { sequelize, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import { hashPassword } from "./password.server";

export interface SignUpInput {
  email: string;
  password: string;
  name: string;
  phone?: string;
  profession: string;
  registrationNumber?: string;
  registrationBody?: string;
}

export class DuplicateEmailError extends Error {
  constructor() {
    super("An account with this e-mail address already exists. Sign in, or reset your password.");
  }
}

function registration(input: { profession: string; registrationNumber?: string; registrationBody?: string }) {
  const number = input.registrationNumber?.trim() || null;
  return {
    registrationNumber: number,
    registrationBody: input.registrationBody?.trim() || null,
    registrationState: number ? ("unverified" as const) : null,
  };
}

export async function signUp(input: SignUpInput) {
  const passwordHash = await hashPassword(input.password);
  try {
    return await sequelize.transaction(async (transaction) => {
      const user = await User.create(
        {
          email: input.email.toLowerCase(),
          name: input.name,
          phone: input.phone || null,
          profession: input.profession,
          passwordHash,
          ...registration(input),
          verifiedById: null,
          verifiedAt: null,
        },
        { transaction },
      );
      await audit({ action: "account.created", actorId: user.id, subjectType: "user", subjectId: user.id }, transaction);
      return user;
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw new DuplicateEmailError();
    throw error;
  }
}

export async function getProfile(userId: string) {
  const user = await User.findByPk(userId, {
    attributes: ["id", "email", "name", "phone", "profession", "registrationNumber", "registrationBody", "registrationState", "verifiedAt"],
  });
  return user?.get({ plain: true }) ?? null;
}

export async function updateProfile(
  userId: string,
  input: { name: string; phone?: string; profession: string; registrationNumber?: string; registrationBody?: string },
) {
  return sequelize.transaction(async (transaction) => {
    const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user) throw new Error("account vanished");
    const next = registration(input);
    const numberChanged = next.registrationNumber !== user.registrationNumber;
    user.set({ name: input.name, phone: input.phone || null, profession: input.profession });
    if (numberChanged) {
      // A new number has not been checked by anyone: it starts unverified again.
      user.set({ ...next, verifiedById: null, verifiedAt: null });
    } else {
      user.set({ registrationBody: next.registrationBody });
    }
    await user.save({ transaction });
    await audit(
      { action: "account.profile_updated", actorId: userId, subjectType: "user", subjectId: userId, data: { registrationChanged: numberChanged } },
      transaction,
    );
  });
}
