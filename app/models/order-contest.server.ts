import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

/**
 * The buyer's contest of an order: reason, photos, their own readings and captures, and the comparison
 * with the listing's bench sheet as it came out when they contested. The moderator's resolution lands here.
 */
export class OrderContest extends Model<InferAttributes<OrderContest>, InferCreationAttributes<OrderContest>> {
  declare orderId: string;
  declare reason: string;
  declare note: string | null;
  /** The buyer's figures as shared/bench readings (parsed by the contest's own schema before storing). */
  declare readings: unknown;
  declare photoKeys: CreationOptional<string[]>;
  declare captureIds: CreationOptional<string[]>;
  /** The outcome of the re-measurement comparison, stored at contest time. */
  declare comparison: unknown;
  declare createdAt: CreationOptional<Date>;
  declare resolvedBy: CreationOptional<string | null>;
  declare resolutionNote: CreationOptional<string | null>;
  declare resolvedAt: CreationOptional<Date | null>;
}

OrderContest.init(
  {
    orderId: { type: DataTypes.UUID, primaryKey: true },
    reason: { type: DataTypes.TEXT, allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: true },
    readings: { type: DataTypes.JSONB, allowNull: true },
    photoKeys: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
    captureIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
    comparison: { type: DataTypes.JSONB, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    resolvedBy: { type: DataTypes.UUID, allowNull: true },
    resolutionNote: { type: DataTypes.TEXT, allowNull: true },
    resolvedAt: { type: DataTypes.DATE, allowNull: true },
  },
  { sequelize, tableName: "order_contests", underscored: true, timestamps: false },
);
