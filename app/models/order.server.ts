import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import type { ShippingMethod, ShippingZone } from "@shared/catalogue";
import type { OrderState } from "@shared/orders";

/**
 * One buyer's purchase of one listing. Its state changes only through app/orders/transitions.server.ts
 * (each change a row in order_events); `version` counts the changes.
 */
export class Order extends Model<InferAttributes<Order>, InferCreationAttributes<Order>> {
  declare id: CreationOptional<string>;
  declare listingId: string;
  declare buyerId: string;
  declare sellerId: string;
  declare state: CreationOptional<OrderState>;
  declare currency: string;
  declare priceMinor: number;
  declare deliveryMinor: number;
  declare deliveryMethod: ShippingMethod;
  declare deliveryZone: ShippingZone;
  /** The platform fee, fixed when the money is released (null before). */
  declare feeMinor: CreationOptional<number | null>;
  declare offerId: CreationOptional<string | null>;
  declare checkoutSessionId: CreationOptional<string | null>;
  declare paymentIntentId: CreationOptional<string | null>;
  declare chargeId: CreationOptional<string | null>;
  declare transferId: CreationOptional<string | null>;
  declare refundedMinor: CreationOptional<number>;
  declare reservedUntil: Date;
  declare fundedAt: CreationOptional<Date | null>;
  declare shipBy: CreationOptional<Date | null>;
  declare shippedAt: CreationOptional<Date | null>;
  declare carrier: CreationOptional<string | null>;
  declare trackingNumber: CreationOptional<string | null>;
  declare arrivedAt: CreationOptional<Date | null>;
  declare auditionEndsAt: CreationOptional<Date | null>;
  declare releasedAt: CreationOptional<Date | null>;
  declare closedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare version: CreationOptional<number>;

  /** What the buyer pays: the price and delivery. */
  declare totalMinor: CreationOptional<number>;
}

Order.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    listingId: { type: DataTypes.UUID, allowNull: false },
    buyerId: { type: DataTypes.UUID, allowNull: false },
    sellerId: { type: DataTypes.UUID, allowNull: false },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: "reserved" },
    currency: { type: DataTypes.CHAR(3), allowNull: false },
    priceMinor: { type: DataTypes.INTEGER, allowNull: false },
    deliveryMinor: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    deliveryMethod: { type: DataTypes.TEXT, allowNull: false },
    deliveryZone: { type: DataTypes.TEXT, allowNull: false },
    feeMinor: { type: DataTypes.INTEGER, allowNull: true },
    offerId: { type: DataTypes.UUID, allowNull: true },
    checkoutSessionId: { type: DataTypes.TEXT, allowNull: true },
    paymentIntentId: { type: DataTypes.TEXT, allowNull: true },
    chargeId: { type: DataTypes.TEXT, allowNull: true },
    transferId: { type: DataTypes.TEXT, allowNull: true },
    refundedMinor: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    reservedUntil: { type: DataTypes.DATE, allowNull: false },
    fundedAt: { type: DataTypes.DATE, allowNull: true },
    shipBy: { type: DataTypes.DATE, allowNull: true },
    shippedAt: { type: DataTypes.DATE, allowNull: true },
    carrier: { type: DataTypes.TEXT, allowNull: true },
    trackingNumber: { type: DataTypes.TEXT, allowNull: true },
    arrivedAt: { type: DataTypes.DATE, allowNull: true },
    auditionEndsAt: { type: DataTypes.DATE, allowNull: true },
    releasedAt: { type: DataTypes.DATE, allowNull: true },
    closedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    totalMinor: {
      type: DataTypes.VIRTUAL,
      get() {
        return this.priceMinor + this.deliveryMinor;
      },
    },
  },
  { sequelize, tableName: "orders", underscored: true },
);
