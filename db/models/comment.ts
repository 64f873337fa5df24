// One message in a request's thread, with the members it mentions.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class Comment extends Model<InferAttributes<Comment>, InferCreationAttributes<Comment>> {
  declare id: CreationOptional<string>;
  declare requestId: string;
  declare authorId: string;
  declare body: string;
  declare mentions: CreationOptional<string[]>;
  declare quotedMarkupId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
}

Comment.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    requestId: { type: DataTypes.UUID, allowNull: false },
    authorId: { type: DataTypes.UUID, allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    mentions: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
    quotedMarkupId: DataTypes.UUID,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "comments", updatedAt: false },
);
