// An engineer's signing identity: certificate in the clear, private key encrypted. Revoked, never deleted.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class SigningKey extends Model<InferAttributes<SigningKey>, InferCreationAttributes<SigningKey>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare certificatePem: string;
  declare certificateSha256: string;
  declare encryptedPrivateKey: string;
  declare registrationNumber: string;
  declare revokedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}

SigningKey.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    userId: { type: DataTypes.UUID, allowNull: false },
    certificatePem: { type: DataTypes.TEXT, allowNull: false },
    certificateSha256: { type: DataTypes.TEXT, allowNull: false },
    encryptedPrivateKey: { type: DataTypes.TEXT, allowNull: false },
    registrationNumber: { type: DataTypes.TEXT, allowNull: false },
    revokedAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "signing_keys", updatedAt: false },
);
