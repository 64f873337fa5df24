// What happened, by whom, when. Insert-only: a database trigger refuses UPDATE and DELETE.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>;
  declare projectId: string | null;
  declare actorId: string | null;
  declare action: string;
  declare subjectType: string | null;
  declare subjectId: string | null;
  declare data: Record<string, unknown>;
  declare createdAt: CreationOptional<Date>;
}

AuditEvent.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: DataTypes.UUID,
    actorId: DataTypes.UUID,
    action: { type: DataTypes.TEXT, allowNull: false },
    subjectType: DataTypes.TEXT,
    subjectId: DataTypes.UUID,
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "audit_events", updatedAt: false },
);
