import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

/**
 * One conversation about one listing between one buyer and the listing's seller (unique per listing
 * and buyer). Each side's read mark is a time: a side has unread messages when last_message_at is
 * later than its mark (a sender's own mark moves with every message they send).
 */
export class MessageThread extends Model<InferAttributes<MessageThread>, InferCreationAttributes<MessageThread>> {
  declare id: CreationOptional<string>;
  declare listingId: string;
  declare buyerId: string;
  declare sellerId: string;
  declare buyerReadAt: Date | null;
  declare sellerReadAt: Date | null;
  declare lastMessageAt: Date | null;
  /** Up to when each side has been mailed about new messages (the 'message-mail' job). */
  declare buyerMailedAt: CreationOptional<Date | null>;
  declare sellerMailedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

MessageThread.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    listingId: { type: DataTypes.UUID, allowNull: false },
    buyerId: { type: DataTypes.UUID, allowNull: false },
    sellerId: { type: DataTypes.UUID, allowNull: false },
    buyerReadAt: { type: DataTypes.DATE, allowNull: true },
    sellerReadAt: { type: DataTypes.DATE, allowNull: true },
    lastMessageAt: { type: DataTypes.DATE, allowNull: true },
    buyerMailedAt: { type: DataTypes.DATE, allowNull: true },
    sellerMailedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "message_threads", underscored: true },
);
