// A signed approval version. Written once; afterwards only `state` (and why, and when) may change.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export const APPROVAL_STATES = ["current", "needs_reapproval", "superseded", "withdrawn"] as const;
export type ApprovalState = (typeof APPROVAL_STATES)[number];

export class Approval extends Model<InferAttributes<Approval>, InferCreationAttributes<Approval>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare requestId: string;
  declare decisionId: string;
  declare n: number;
  declare reference: string;
  declare outcome: string;
  declare snapshot: Record<string, unknown>;
  declare snapshotSha256: string;
  declare packKey: string;
  declare packSha256: string;
  declare packBytes: number;
  declare restsOn: string[];
  declare signerId: string;
  declare signingKeyId: string;
  declare certificateSha256: string;
  declare signedAt: Date;
  declare verifyCode: string;
  declare state: CreationOptional<ApprovalState>;
  declare stateReason: string | null;
  declare stateChangedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}

Approval.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    requestId: { type: DataTypes.UUID, allowNull: false },
    decisionId: { type: DataTypes.UUID, allowNull: false },
    n: { type: DataTypes.INTEGER, allowNull: false },
    reference: { type: DataTypes.TEXT, allowNull: false },
    outcome: { type: DataTypes.TEXT, allowNull: false },
    snapshot: { type: DataTypes.JSONB, allowNull: false },
    snapshotSha256: { type: DataTypes.TEXT, allowNull: false },
    packKey: { type: DataTypes.TEXT, allowNull: false },
    packSha256: { type: DataTypes.TEXT, allowNull: false },
    packBytes: { type: DataTypes.INTEGER, allowNull: false },
    restsOn: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false },
    signerId: { type: DataTypes.UUID, allowNull: false },
    signingKeyId: { type: DataTypes.UUID, allowNull: false },
    certificateSha256: { type: DataTypes.TEXT, allowNull: false },
    signedAt: { type: DataTypes.DATE, allowNull: false },
    verifyCode: { type: DataTypes.TEXT, allowNull: false },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: "current" },
    stateReason: DataTypes.TEXT,
    stateChangedAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "approvals", updatedAt: false },
);
