// A saved calculation: its kind, the inputs as validated, the outputs the server recomputed, and the engine
// version. Rows are written once; a changed calculation is saved as a new row.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class Calculation extends Model<InferAttributes<Calculation>, InferCreationAttributes<Calculation>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare kind: string;
  declare title: string;
  declare inputs: unknown;
  declare outputs: unknown;
  declare engineVersion: string;
  declare createdBy: string;
  declare requestId: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Calculation.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    inputs: { type: DataTypes.JSONB, allowNull: false },
    outputs: { type: DataTypes.JSONB, allowNull: false },
    engineVersion: { type: DataTypes.TEXT, allowNull: false },
    createdBy: { type: DataTypes.UUID, allowNull: false },
    requestId: DataTypes.UUID,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "calculations" },
);
