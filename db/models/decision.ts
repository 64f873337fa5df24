// The engineer's decision on one version of a request: worked on as a draft (outcome null), then recorded once.
// `restsOn` lists the drawing revisions the decision relies on.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import type { DecisionOutcome } from "../../app/review/principles";
import { sequelize } from "../connection";

export interface Condition {
  n: number;
  text: string;
}

export class Decision extends Model<InferAttributes<Decision>, InferCreationAttributes<Decision>> {
  declare id: CreationOptional<string>;
  declare requestId: string;
  declare requestVersionId: string;
  declare outcome: CreationOptional<DecisionOutcome | null>;
  declare conditions: CreationOptional<Condition[]>;
  declare reasons: CreationOptional<string>;
  declare restsOn: CreationOptional<string[]>;
  declare decidedById: string;
  declare recordedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Decision.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    requestId: { type: DataTypes.UUID, allowNull: false },
    requestVersionId: { type: DataTypes.UUID, allowNull: false },
    outcome: DataTypes.TEXT,
    conditions: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    reasons: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    restsOn: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
    decidedById: { type: DataTypes.UUID, allowNull: false },
    recordedAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "decisions" },
);
