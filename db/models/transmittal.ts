// A record of revisions issued to project members: what, to whom, when, why, and with which status.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class Transmittal extends Model<InferAttributes<Transmittal>, InferCreationAttributes<Transmittal>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare number: number;
  declare reason: string;
  declare issuedStatus: "for_review" | "accepted";
  declare issuedById: string;
  declare createdAt: CreationOptional<Date>;
}

Transmittal.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    number: { type: DataTypes.INTEGER, allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false },
    issuedStatus: { type: DataTypes.TEXT, allowNull: false },
    issuedById: { type: DataTypes.UUID, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "transmittals", updatedAt: false },
);
