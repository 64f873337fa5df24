// One sign-in attempt, kept so the rate limit holds across app servers.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class SignInAttempt extends Model<InferAttributes<SignInAttempt>, InferCreationAttributes<SignInAttempt>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare ip: string | null;
  declare succeeded: boolean;
  declare createdAt: CreationOptional<Date>;
}

SignInAttempt.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    email: { type: DataTypes.TEXT, allowNull: false },
    ip: DataTypes.TEXT,
    succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "sign_in_attempts", updatedAt: false },
);
