// The audit log: one row per consequential action, written in the same transaction as the action itself.
import type { Transaction } from "sequelize";
import { AuditEvent } from "../../db/models";

export interface AuditEntry {
  action: string;
  actorId?: string | null;
  projectId?: string | null;
  subjectType?: string;
  subjectId?: string;
  data?: Record<string, unknown>;
}

export async function audit(entry: AuditEntry, transaction?: Transaction) {
  await AuditEvent.create(
    {
      action: entry.action,
      actorId: entry.actorId ?? null,
      projectId: entry.projectId ?? null,
      subjectType: entry.subjectType ?? null,
      subjectId: entry.subjectId ?? null,
      data: entry.data ?? {},
    },
    { transaction },
  );
}
