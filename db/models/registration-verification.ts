// A project manager's check of an engineer's professional registration (or its revocation), with evidence.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class RegistrationVerification extends Model<
  InferAttributes<RegistrationVerification>,
  InferCreationAttributes<RegistrationVerification>
> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare projectId: string;
  declare verifiedById: string;
  declare outcome: "verified" | "revoked";
  declare registrationNumber: string;
  declare registrationBody: string;
  declare checkedOn: string;
  declare note: string | null;
  declare evidenceKey: string | null;
  declare evidenceName: string | null;
  declare evidenceSha256: string | null;
  declare createdAt: CreationOptional<Date>;
}

RegistrationVerification.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    userId: { type: DataTypes.UUID, allowNull: false },
    projectId: { type: DataTypes.UUID, allowNull: false },
    verifiedById: { type: DataTypes.UUID, allowNull: false },
    outcome: { type: DataTypes.TEXT, allowNull: false },
    registrationNumber: { type: DataTypes.TEXT, allowNull: false },
    registrationBody: { type: DataTypes.TEXT, allowNull: false },
    checkedOn: { type: DataTypes.DATEONLY, allowNull: false },
    note: DataTypes.TEXT,
    evidenceKey: DataTypes.TEXT,
    evidenceName: DataTypes.TEXT,
    evidenceSha256: DataTypes.TEXT,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "registration_verifications", updatedAt: false },
);
