// An invitation to join a project in a role, sent by e-mail; the token is stored as a hash and used once.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";
import type { Role } from "../../app/projects/permissions";

export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare email: string;
  declare role: Role;
  declare tokenHash: string;
  declare invitedById: string;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare acceptedById: string | null;
  declare revokedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Invitation.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    email: { type: DataTypes.TEXT, allowNull: false },
    role: { type: DataTypes.TEXT, allowNull: false },
    tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    invitedById: { type: DataTypes.UUID, allowNull: false },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    acceptedAt: DataTypes.DATE,
    acceptedById: DataTypes.UUID,
    revokedAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "invitations" },
);
