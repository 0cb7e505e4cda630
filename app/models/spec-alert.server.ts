import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

import type { AlertFrequency } from "~/alerts/frequency";

/** A buyer's saved market query: `query` is the market's canonical query string (marketFiltersToParams). */
export class SpecAlert extends Model<InferAttributes<SpecAlert>, InferCreationAttributes<SpecAlert>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare name: string;
  declare query: string;
  declare frequency: AlertFrequency;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

SpecAlert.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    userId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    query: { type: DataTypes.TEXT, allowNull: false },
    frequency: { type: DataTypes.TEXT, allowNull: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "spec_alerts", underscored: true },
);
