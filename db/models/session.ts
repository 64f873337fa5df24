// A signed-in browser. The cookie carries a random id; only its SHA-256 is stored, so a database leak yields no sessions.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
  declare id: CreationOptional<string>;
  declare idHash: string;
  declare userId: string | null;
  declare data: Record<string, unknown>;
  declare expiresAt: Date;
  declare userAgent: string | null;
  declare ip: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Session.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    idHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    userId: DataTypes.UUID,
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    userAgent: DataTypes.TEXT,
    ip: DataTypes.TEXT,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "sessions" },
);
