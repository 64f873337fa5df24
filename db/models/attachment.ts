// A photo or document on a request (or on one of its comments), stored in object storage under its SHA-256.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class Attachment extends Model<InferAttributes<Attachment>, InferCreationAttributes<Attachment>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare requestId: string;
  declare versionN: number | null;
  declare commentId: CreationOptional<string | null>;
  declare objectKey: string;
  declare sha256: string;
  declare contentType: string;
  declare byteSize: number;
  declare filename: string;
  declare thumbKey: string | null;
  declare widthPx: number | null;
  declare heightPx: number | null;
  declare uploadedById: string;
  declare createdAt: CreationOptional<Date>;
}

Attachment.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    requestId: { type: DataTypes.UUID, allowNull: false },
    versionN: DataTypes.INTEGER,
    commentId: DataTypes.UUID,
    objectKey: { type: DataTypes.TEXT, allowNull: false },
    sha256: { type: DataTypes.TEXT, allowNull: false },
    contentType: { type: DataTypes.TEXT, allowNull: false },
    byteSize: {
      type: DataTypes.BIGINT,
      allowNull: false,
      get() {
        return Number(this.getDataValue("byteSize"));
      },
    },
    filename: { type: DataTypes.TEXT, allowNull: false },
    thumbKey: DataTypes.TEXT,
    widthPx: DataTypes.INTEGER,
    heightPx: DataTypes.INTEGER,
    uploadedById: { type: DataTypes.UUID, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "attachments", updatedAt: false },
);
