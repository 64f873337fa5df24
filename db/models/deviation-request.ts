// A deviation request: a provision that cannot be applied on site, numbered per project (DR-001 …), moving
// through the workflow. `lockVersion` makes every transition fail loudly when someone else moved it first.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import type { RequestState } from "../../app/requests/workflow";
import { sequelize } from "../connection";

export class DeviationRequest extends Model<InferAttributes<DeviationRequest>, InferCreationAttributes<DeviationRequest>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare number: number;
  declare title: string;
  declare provision: string;
  declare clauseRef: CreationOptional<string>;
  declare state: RequestState;
  declare assigneeId: CreationOptional<string | null>;
  declare dueAt: CreationOptional<Date | null>;
  declare submittedAt: CreationOptional<Date | null>;
  declare stateChangedAt: CreationOptional<Date>;
  declare createdById: string;
  declare lockVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

DeviationRequest.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    number: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    provision: { type: DataTypes.TEXT, allowNull: false },
    clauseRef: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: "draft" },
    assigneeId: DataTypes.UUID,
    dueAt: DataTypes.DATE,
    submittedAt: DataTypes.DATE,
    stateChangedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    createdById: { type: DataTypes.UUID, allowNull: false },
    lockVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "deviation_requests" },
);
