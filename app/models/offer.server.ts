import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import type { OfferParty, OfferState } from "@shared/offers";

/**
 * An offer on a listing, by its buyer or (as a counter) by its seller. A counter is a new row whose
 * parent is the offer it answers. An accepted offer lets the buyer check out at amount_minor until
 * checkout_until; checkout marks it 'used'.
 */
export class Offer extends Model<InferAttributes<Offer>, InferCreationAttributes<Offer>> {
  declare id: CreationOptional<string>;
  declare listingId: string;
  declare buyerId: string;
  declare sellerId: string;
  declare threadId: string | null;
  declare amountMinor: number;
  declare currency: string;
  declare madeBy: OfferParty;
  declare parentOfferId: string | null;
  declare state: CreationOptional<OfferState>;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare checkoutUntil: Date | null;
  declare decidedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Offer.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    listingId: { type: DataTypes.UUID, allowNull: false },
    buyerId: { type: DataTypes.UUID, allowNull: false },
    sellerId: { type: DataTypes.UUID, allowNull: false },
    threadId: { type: DataTypes.UUID, allowNull: true },
    amountMinor: { type: DataTypes.INTEGER, allowNull: false },
    currency: { type: DataTypes.CHAR(3), allowNull: false },
    madeBy: { type: DataTypes.TEXT, allowNull: false },
    parentOfferId: { type: DataTypes.UUID, allowNull: true },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: "open" },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    acceptedAt: { type: DataTypes.DATE, allowNull: true },
    checkoutUntil: { type: DataTypes.DATE, allowNull: true },
    decidedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "offers", underscored: true },
);
