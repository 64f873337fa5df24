// How a decision judges one safety and performance principle: outcome, reasoning, and links to evidence.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import type { PrincipleOutcome } from "../../app/review/principles";
import { sequelize } from "../connection";

export interface EvidenceLink {
  kind: "calculation" | "markup" | "attachment";
  id: string;
}

export class AssessmentRow extends Model<InferAttributes<AssessmentRow>, InferCreationAttributes<AssessmentRow>> {
  declare id: CreationOptional<string>;
  declare decisionId: string;
  declare principle: string;
  declare outcome: PrincipleOutcome | null;
  declare reasoning: CreationOptional<string>;
  declare evidence: CreationOptional<EvidenceLink[]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

AssessmentRow.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    decisionId: { type: DataTypes.UUID, allowNull: false },
    principle: { type: DataTypes.TEXT, allowNull: false },
    outcome: DataTypes.TEXT,
    reasoning: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    evidence: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "assessments" },
);
