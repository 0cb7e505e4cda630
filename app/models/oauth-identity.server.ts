import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

/** An account's identity at an outside sign-in provider: (provider, subject) is unique. */
export class OAuthIdentity extends Model<InferAttributes<OAuthIdentity>, InferCreationAttributes<OAuthIdentity>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare provider: string;
  declare subject: string;
  declare email: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

OAuthIdentity.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    userId: { type: DataTypes.UUID, allowNull: false },
    provider: { type: DataTypes.TEXT, allowNull: false },
    subject: { type: DataTypes.TEXT, allowNull: false },
    email: { type: DataTypes.CITEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "oauth_identities", underscored: true },
);
