import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "~/db.server";
import type { User } from "./user.server";

/** A buyer's rating of the seller after a released order, the seller's one answer, a moderator's hiding. */
export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
  declare id: CreationOptional<string>;
  declare orderId: string;
  declare sellerId: string;
  declare buyerId: string;
  declare rating: number;
  declare body: string;
  declare answer: CreationOptional<string | null>;
  declare answeredAt: CreationOptional<Date | null>;
  declare hiddenAt: CreationOptional<Date | null>;
  declare hiddenBy: CreationOptional<string | null>;
  declare hiddenNote: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** Present when a query includes it (models/index.server.ts). */
  declare buyer?: NonAttribute<User>;
}

Review.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    orderId: { type: DataTypes.UUID, allowNull: false, unique: true },
    sellerId: { type: DataTypes.UUID, allowNull: false },
    buyerId: { type: DataTypes.UUID, allowNull: false },
    rating: { type: DataTypes.SMALLINT, allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    answer: { type: DataTypes.TEXT, allowNull: true },
    answeredAt: { type: DataTypes.DATE, allowNull: true },
    hiddenAt: { type: DataTypes.DATE, allowNull: true },
    hiddenBy: { type: DataTypes.UUID, allowNull: true },
    hiddenNote: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "reviews", underscored: true },
);
