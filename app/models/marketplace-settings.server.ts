import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { jsonColumn } from "./json-column.server";

const FeeMinimums = z.record(z.string().regex(/^[A-Z]{3}$/), z.number().int().min(0));
const readFeeMinimums = jsonColumn("marketplace_settings.fee_minimum_minor", FeeMinimums, (): Record<string, number> => ({}));

/** The admin's settings for buying: the one row with id 1. Read through app/orders/settings.server.ts. */
export class MarketplaceSettings extends Model<InferAttributes<MarketplaceSettings>, InferCreationAttributes<MarketplaceSettings>> {
  declare id: CreationOptional<number>;
  declare feeBasisPoints: number;
  /** Per currency, in its minor units. */
  declare feeMinimumMinor: Record<string, number>;
  declare auditionDays: number;
  declare arrivalAssumedDays: number;
  declare reservationMinutes: number;
  declare offerHours: number;
  declare offerCheckoutHours: number;
  declare updatedBy: string | null;
  declare updatedAt: CreationOptional<Date>;
}

MarketplaceSettings.init(
  {
    id: { type: DataTypes.SMALLINT, primaryKey: true, defaultValue: 1 },
    feeBasisPoints: { type: DataTypes.INTEGER, allowNull: false },
    feeMinimumMinor: {
      type: DataTypes.JSONB,
      allowNull: false,
      get() {
        return readFeeMinimums(this.getDataValue("feeMinimumMinor"));
      },
    },
    auditionDays: { type: DataTypes.INTEGER, allowNull: false },
    arrivalAssumedDays: { type: DataTypes.INTEGER, allowNull: false },
    reservationMinutes: { type: DataTypes.INTEGER, allowNull: false },
    offerHours: { type: DataTypes.INTEGER, allowNull: false },
    offerCheckoutHours: { type: DataTypes.INTEGER, allowNull: false },
    updatedBy: { type: DataTypes.UUID, allowNull: true },
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "marketplace_settings", underscored: true, createdAt: false },
);
