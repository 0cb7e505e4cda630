import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import type { Role } from "~/auth/roles";

export type AccountStatus = "active" | "suspended";

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare emailVerifiedAt: Date | null;
  declare passwordHash: string | null;
  declare displayName: string;
  declare roles: CreationOptional<Role[]>;
  declare status: CreationOptional<AccountStatus>;
  declare lastSignInAt: Date | null;
  /** The payment provider's connected account for payouts (sellers). */
  declare payoutAccountId: CreationOptional<string | null>;
  declare payoutsEnabled: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

User.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    email: { type: DataTypes.CITEXT, allowNull: false, unique: true },
    emailVerifiedAt: { type: DataTypes.DATE, allowNull: true },
    passwordHash: { type: DataTypes.TEXT, allowNull: true },
    displayName: { type: DataTypes.TEXT, allowNull: false },
    roles: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: ["buyer"] },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "active" },
    lastSignInAt: { type: DataTypes.DATE, allowNull: true },
    payoutAccountId: { type: DataTypes.TEXT, allowNull: true },
    payoutsEnabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "users", underscored: true },
);
