// A person with a Countersign account. Engineers carry a professional registration whose state gates signing.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export const REGISTRATION_STATES = ["unverified", "verified", "revoked"] as const;
export type RegistrationState = (typeof REGISTRATION_STATES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare phone: string | null;
  declare profession: string | null;
  declare passwordHash: string;
  declare registrationNumber: string | null;
  declare registrationBody: string | null;
  declare registrationState: RegistrationState | null;
  declare verifiedById: string | null;
  declare verifiedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

User.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    email: { type: DataTypes.TEXT, allowNull: false, unique: true },
    name: { type: DataTypes.TEXT, allowNull: false },
    phone: DataTypes.TEXT,
    profession: DataTypes.TEXT,
    passwordHash: { type: DataTypes.TEXT, allowNull: false },
    registrationNumber: DataTypes.TEXT,
    registrationBody: DataTypes.TEXT,
    registrationState: DataTypes.TEXT,
    verifiedById: DataTypes.UUID,
    verifiedAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "users" },
);
