// A sheet in a project's register: its number (unique per project), title, discipline and stated scale(s).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class Drawing extends Model<InferAttributes<Drawing>, InferCreationAttributes<Drawing>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare sheetNumber: string;
  declare title: string;
  declare discipline: string;
  declare scaleText: string | null;
  declare createdById: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Drawing.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    sheetNumber: { type: DataTypes.TEXT, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    discipline: { type: DataTypes.TEXT, allowNull: false },
    scaleText: DataTypes.TEXT,
    createdById: { type: DataTypes.UUID, allowNull: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "drawings" },
);
