// Project membership: the member list (with search), role changes and removal, guarded so a project always
// keeps at least one manager, and role changes race safely (optimistic version check).
import { Op, OptimisticLockError } from "sequelize";
import { ProjectMember, sequelize, User } from "../../db/models";
import { audit } from "../platform/audit.server";
import type { Role } from "./permissions";

export class MembershipError extends Error {
  constructor(
    message: string,
    readonly status = 409,
  ) {
    super(message);
  }
}

export interface MemberView {
  id: string;
  userId: string;
  name: string;
  email: string;
  profession: string | null;
  role: Role;
  version: number;
  registrationState: string | null;
}

export async function listMembers(projectId: string, options: { q?: string; limit?: number } = {}): Promise<MemberView[]> {
  const q = options.q?.trim();
  const userWhere = q
    ? { [Op.or]: [{ name: { [Op.iLike]: `%${escapeLike(q)}%` } }, { email: { [Op.iLike]: `%${escapeLike(q)}%` } }] }
    : undefined;
  const rows = await ProjectMember.findAll({
    where: { projectId },
    attributes: ["id", "userId", "role", "version"],
    include: [{ model: User, as: "user", attributes: ["name", "email", "profession", "registrationState"], where: userWhere }],
    order: [[{ model: User, as: "user" }, "name", "ASC"]],
    limit: options.limit ?? 500,
  });
  return rows.map((m) => {
    const u = (m as unknown as { user: User }).user;
    return {
      id: m.id,
      userId: m.userId,
      role: m.role,
      version: m.version,
      name: u.name,
      email: u.email,
      profession: u.profession,
      registrationState: u.registrationState,
    };
  });
}

function escapeLike(s: string) {
  return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}

async function assertKeepsAManager(projectId: string, memberId: string, transaction: import("sequelize").Transaction) {
  const managers = await ProjectMember.findAll({
    where: { projectId, role: "manager" },
    attributes: ["id"],
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (managers.length === 1 && managers[0]!.id === memberId) {
    throw new MembershipError("A project needs at least one project manager. Make someone else manager first.");
  }
}

export async function changeRole(actorId: string, projectId: string, memberId: string, role: Role, version: number) {
  try {
    await sequelize.transaction(async (transaction) => {
      const member = await ProjectMember.findOne({ where: { id: memberId, projectId }, transaction });
      if (!member) throw new MembershipError("That person is no longer a member of this project.", 404);
      if (member.version !== version) {
        throw new MembershipError("Someone else changed this member a moment ago. The list now shows their change.");
      }
      if (member.role === role) return;
      if (member.role === "manager") await assertKeepsAManager(projectId, memberId, transaction);
      const from = member.role;
      member.role = role;
      await member.save({ transaction });
      await audit(
        { action: "member.role_changed", actorId, projectId, subjectType: "project_member", subjectId: memberId, data: { from, to: role } },
        transaction,
      );
    });
  } catch (error) {
    if (error instanceof OptimisticLockError) {
      throw new MembershipError("Someone else changed this member a moment ago. The list now shows their change.");
    }
    throw error;
  }
}

export async function removeMember(actorId: string, projectId: string, memberId: string) {
  await sequelize.transaction(async (transaction) => {
    const member = await ProjectMember.findOne({ where: { id: memberId, projectId }, transaction });
    if (!member) throw new MembershipError("That person is no longer a member of this project.", 404);
    if (member.role === "manager") await assertKeepsAManager(projectId, memberId, transaction);
    await member.destroy({ transaction });
    await audit(
      { action: "member.removed", actorId, projectId, subjectType: "project_member", subjectId: memberId, data: { userId: member.userId, role: member.role } },
      transaction,
    );
  });
}
