// An engineer's markup on one page of a sheet revision, for one request. The shape is a MarkupShape in PDF
// points; `version` rises on every change so two people editing the same markup cannot overwrite each other.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import type { MarkupShape } from "../../app/review/markups";
import { sequelize } from "../connection";

export class Markup extends Model<InferAttributes<Markup>, InferCreationAttributes<Markup>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare requestId: string;
  declare revisionId: string;
  declare page: number;
  declare kind: string;
  declare shape: MarkupShape;
  declare authorId: string;
  declare version: CreationOptional<number>;
  declare deletedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Markup.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    requestId: { type: DataTypes.UUID, allowNull: false },
    revisionId: { type: DataTypes.UUID, allowNull: false },
    page: { type: DataTypes.INTEGER, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    shape: { type: DataTypes.JSONB, allowNull: false },
    authorId: { type: DataTypes.UUID, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    deletedAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "markups" },
);
