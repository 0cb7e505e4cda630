import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "~/db.server";
import type { WorkshopStatus } from "@shared/catalogue";
import type { User } from "./user.server";

/** A restoration business; a moderator verifies it before its listings carry the workshop's name as verified. */
export class Workshop extends Model<InferAttributes<Workshop>, InferCreationAttributes<Workshop>> {
  declare id: CreationOptional<string>;
  declare ownerId: string;
  declare name: string;
  declare slug: string;
  declare about: string | null;
  declare country: string;
  declare region: string | null;
  declare town: string | null;
  declare verificationStatus: CreationOptional<WorkshopStatus>;
  declare verifiedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** Present when a query includes it (models/index.server.ts). */
  declare owner?: NonAttribute<User>;
}

Workshop.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    ownerId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    slug: { type: DataTypes.CITEXT, allowNull: false, unique: true },
    about: { type: DataTypes.TEXT, allowNull: true },
    country: { type: DataTypes.CHAR(2), allowNull: false },
    region: { type: DataTypes.TEXT, allowNull: true },
    town: { type: DataTypes.TEXT, allowNull: true },
    verificationStatus: { type: DataTypes.TEXT, allowNull: false, defaultValue: "applied" },
    verifiedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "workshops", underscored: true },
);
