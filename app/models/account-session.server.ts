import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "~/db.server";
import { User } from "~/models/user.server";

/**
 * One signed-in browser (table `sessions`). The cookie holds a random token; only its SHA-256 is
 * stored. A session is live while it is neither revoked nor expired and its account is active.
 */
export class AccountSession extends Model<InferAttributes<AccountSession>, InferCreationAttributes<AccountSession>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare tokenHash: string;
  declare address: string | null;
  declare userAgent: string | null;
  declare createdAt: CreationOptional<Date>;
  declare expiresAt: Date;
  declare lastSeenAt: CreationOptional<Date>;
  declare revokedAt: CreationOptional<Date | null>;
  declare user?: NonAttribute<User>;
}

AccountSession.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    userId: { type: DataTypes.UUID, allowNull: false },
    tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    address: { type: DataTypes.TEXT, allowNull: true },
    userAgent: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    lastSeenAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
  },
  { sequelize, tableName: "sessions", underscored: true, updatedAt: false },
);

// Guarded: a development reload re-creates the class, which then needs the association again.
if (!AccountSession.associations.user) AccountSession.belongsTo(User, { foreignKey: "userId", as: "user" });
