import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import { BuyerReadingsSchema, remeasurementSchema } from "@shared/bench/remeasure-schema";
import type { BuyerReadings, Remeasurement } from "@shared/bench/remeasure";
import { jsonColumn, none } from "./json-column.server";

/**
 * The buyer's own figures entered when they accepted the unit, and their comparison with the listing's
 * bench sheet as it came out then. (A contest keeps its figures in order_contests.) One per order.
 */
export class OrderRemeasurement extends Model<InferAttributes<OrderRemeasurement>, InferCreationAttributes<OrderRemeasurement>> {
  declare orderId: string;
  declare readings: BuyerReadings | null;
  declare comparison: Remeasurement | null;
  declare enteredAt: CreationOptional<Date>;
}

const readReadings = jsonColumn("order_remeasurements.readings", BuyerReadingsSchema, none);
const readComparison = jsonColumn("order_remeasurements.comparison", remeasurementSchema, none);

OrderRemeasurement.init(
  {
    orderId: { type: DataTypes.UUID, primaryKey: true },
    readings: {
      type: DataTypes.JSONB,
      allowNull: false,
      get() {
        return readReadings(this.getDataValue("readings"));
      },
    },
    comparison: {
      type: DataTypes.JSONB,
      allowNull: false,
      get() {
        return readComparison(this.getDataValue("comparison"));
      },
    },
    enteredAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  },
  { sequelize, tableName: "order_remeasurements", underscored: true, timestamps: false },
);
