import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

export type TokenPurpose = "verify_email" | "reset_password";

/** A one-time token sent by e-mail; only its SHA-256 is stored. */
export class AccountToken extends Model<InferAttributes<AccountToken>, InferCreationAttributes<AccountToken>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare purpose: TokenPurpose;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}

AccountToken.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    userId: { type: DataTypes.UUID, allowNull: false },
    purpose: { type: DataTypes.TEXT, allowNull: false },
    tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "account_tokens", underscored: true, updatedAt: false },
);
