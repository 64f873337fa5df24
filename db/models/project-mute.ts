// A member who asked for no e-mail about a project's requests (the row's presence is the setting).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class ProjectMute extends Model<InferAttributes<ProjectMute>, InferCreationAttributes<ProjectMute>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare userId: string;
  declare createdAt: CreationOptional<Date>;
}

ProjectMute.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    userId: { type: DataTypes.UUID, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "project_mutes", updatedAt: false },
);
