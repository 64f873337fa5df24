// A member a transmittal was sent to: when the e-mail went out and when they first opened it.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class TransmittalRecipient extends Model<InferAttributes<TransmittalRecipient>, InferCreationAttributes<TransmittalRecipient>> {
  declare id: CreationOptional<string>;
  declare transmittalId: string;
  declare userId: string;
  declare mailedAt: CreationOptional<Date | null>;
  declare seenAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
}

TransmittalRecipient.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    transmittalId: { type: DataTypes.UUID, allowNull: false },
    userId: { type: DataTypes.UUID, allowNull: false },
    mailedAt: DataTypes.DATE,
    seenAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "transmittal_recipients", updatedAt: false },
);
