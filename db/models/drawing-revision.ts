// One revision of a sheet: the PDF (stored by SHA-256), its status in the issue cycle, and what background
// processing learnt from it (page sizes, positioned text, thumbnails).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export const REVISION_STATUSES = ["draft", "for_review", "accepted", "superseded", "withdrawn"] as const;
export type RevisionStatus = (typeof REVISION_STATUSES)[number];
export const PROCESSING_STATES = ["queued", "running", "done", "failed"] as const;
export type ProcessingState = (typeof PROCESSING_STATES)[number];

export interface PageSize {
  widthPt: number;
  heightPt: number;
}
/** A run of text on a page: top-left corner, width and height in PDF points (origin top-left). */
export interface TextRun {
  s: string;
  x: number;
  y: number;
  w: number;
  h: number;
}

export class DrawingRevision extends Model<InferAttributes<DrawingRevision>, InferCreationAttributes<DrawingRevision>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare drawingId: string;
  declare label: string;
  declare status: RevisionStatus;
  declare description: string;
  declare objectKey: string;
  declare sha256: string;
  declare byteSize: number;
  declare originalFilename: string | null;
  declare sourcePage: number | null;
  declare pageCount: number;
  declare pages: PageSize[];
  declare text: CreationOptional<TextRun[][] | null>;
  declare processing: CreationOptional<ProcessingState>;
  declare processingError: CreationOptional<string | null>;
  declare processedPages: CreationOptional<number>;
  declare uploadedById: string;
  declare issuedById: CreationOptional<string | null>;
  declare issuedAt: CreationOptional<Date | null>;
  declare supersedesId: CreationOptional<string | null>;
  declare supersededById: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

DrawingRevision.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    drawingId: { type: DataTypes.UUID, allowNull: false },
    label: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    objectKey: { type: DataTypes.TEXT, allowNull: false },
    sha256: { type: DataTypes.TEXT, allowNull: false },
    byteSize: {
      type: DataTypes.BIGINT,
      allowNull: false,
      get() {
        return Number(this.getDataValue("byteSize"));
      },
    },
    originalFilename: DataTypes.TEXT,
    sourcePage: DataTypes.INTEGER,
    pageCount: { type: DataTypes.INTEGER, allowNull: false },
    pages: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    text: DataTypes.JSONB,
    processing: { type: DataTypes.TEXT, allowNull: false, defaultValue: "queued" },
    processingError: DataTypes.TEXT,
    processedPages: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    uploadedById: { type: DataTypes.UUID, allowNull: false },
    issuedById: DataTypes.UUID,
    issuedAt: DataTypes.DATE,
    supersedesId: DataTypes.UUID,
    supersededById: DataTypes.UUID,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "drawing_revisions" },
);
