import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

/**
 * A buyer watching a listing: one row per (user, listing), enforced by watches_user_listing_unique.
 * Later issues hang the watch list and change alerts off it.
 */
export class Watch extends Model<InferAttributes<Watch>, InferCreationAttributes<Watch>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare listingId: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Watch.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    userId: { type: DataTypes.UUID, allowNull: false },
    listingId: { type: DataTypes.UUID, allowNull: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "watches", underscored: true },
);
