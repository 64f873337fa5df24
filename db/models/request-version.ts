// One version of a request's content. A version is edited while it is a draft; once submitted it never changes,
// and a resubmission is a new version, so the engineer can see what changed.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export interface Measurement {
  kind: string;
  name: string;
  value: number;
  unit: string;
}

export class RequestVersion extends Model<InferAttributes<RequestVersion>, InferCreationAttributes<RequestVersion>> {
  declare id: CreationOptional<string>;
  declare requestId: string;
  declare n: number;
  declare title: string;
  declare provision: string;
  declare clauseRef: CreationOptional<string>;
  declare siteConstraint: CreationOptional<string>;
  declare proposal: CreationOptional<string>;
  declare measurements: CreationOptional<Measurement[]>;
  declare createdById: string;
  declare submittedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

RequestVersion.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    requestId: { type: DataTypes.UUID, allowNull: false },
    n: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    provision: { type: DataTypes.TEXT, allowNull: false },
    clauseRef: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    siteConstraint: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    proposal: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    measurements: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    createdById: { type: DataTypes.UUID, allowNull: false },
    submittedAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "request_versions" },
);
