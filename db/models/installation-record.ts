// The site's record that work was installed as approved, with date and photos.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class InstallationRecord extends Model<InferAttributes<InstallationRecord>, InferCreationAttributes<InstallationRecord>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare approvalId: string;
  declare recordedById: string;
  declare installedOn: string;
  declare note: string | null;
  declare photoKeys: CreationOptional<{ key: string; name: string; sha256: string }[]>;
  declare createdAt: CreationOptional<Date>;
}

InstallationRecord.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    projectId: { type: DataTypes.UUID, allowNull: false },
    approvalId: { type: DataTypes.UUID, allowNull: false },
    recordedById: { type: DataTypes.UUID, allowNull: false },
    installedOn: { type: DataTypes.DATEONLY, allowNull: false },
    note: DataTypes.TEXT,
    photoKeys: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "installation_records", updatedAt: false },
);
