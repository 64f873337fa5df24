// A numbered pin placing a request on a sheet revision (PDF points, origin top-left). Placed by the viewer.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../connection";

export class RequestPin extends Model<InferAttributes<RequestPin>, InferCreationAttributes<RequestPin>> {
  declare id: CreationOptional<string>;
  declare requestId: string;
  declare revisionId: string;
  declare page: number;
  declare xPt: number;
  declare yPt: number;
  declare n: number;
  declare createdById: string;
  declare createdAt: CreationOptional<Date>;
}

RequestPin.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    requestId: { type: DataTypes.UUID, allowNull: false },
    revisionId: { type: DataTypes.UUID, allowNull: false },
    page: { type: DataTypes.INTEGER, allowNull: false },
    xPt: { type: DataTypes.DOUBLE, allowNull: false },
    yPt: { type: DataTypes.DOUBLE, allowNull: false },
    n: { type: DataTypes.INTEGER, allowNull: false },
    createdById: { type: DataTypes.UUID, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "request_pins", updatedAt: false },
);
