// A written notice to an owner of every non-compliance found on an existing installation, as sent.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export interface NoticeItem {
  finding: string;
  rule: string;
  ownerDecision: "correct_now" | "correct_later" | "declined" | "undecided";
}

export class NoncomplianceNotice extends Model<InferAttributes<NoncomplianceNotice>, InferCreationAttributes<NoncomplianceNotice>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare number: number;
  declare createdById: string;
  declare ownerName: string;
  declare ownerEmail: string;
  declare property: string;
  declare inspectedOn: string;
  declare items: NoticeItem[];
  declare pdfKey: string;
  declare pdfSha256: string;
  declare createdAt: CreationOptional<Date>;
}

NoncomplianceNotice.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    number: { type: DataTypes.INTEGER, allowNull: false },
    createdById: { type: DataTypes.UUID, allowNull: false },
    ownerName: { type: DataTypes.TEXT, allowNull: false },
    ownerEmail: { type: DataTypes.TEXT, allowNull: false },
    property: { type: DataTypes.TEXT, allowNull: false },
    inspectedOn: { type: DataTypes.DATEONLY, allowNull: false },
    items: { type: DataTypes.JSONB, allowNull: false },
    pdfKey: { type: DataTypes.TEXT, allowNull: false },
    pdfSha256: { type: DataTypes.TEXT, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "noncompliance_notices", updatedAt: false },
);
