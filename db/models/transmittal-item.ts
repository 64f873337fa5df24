// One revision carried by a transmittal.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class TransmittalItem extends Model<InferAttributes<TransmittalItem>, InferCreationAttributes<TransmittalItem>> {
  declare id: CreationOptional<string>;
  declare transmittalId: string;
  declare revisionId: string;
  declare createdAt: CreationOptional<Date>;
}

TransmittalItem.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    transmittalId: { type: DataTypes.UUID, allowNull: false },
    revisionId: { type: DataTypes.UUID, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "transmittal_items", updatedAt: false },
);
