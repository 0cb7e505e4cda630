import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "~/db.server";
import type { User } from "./user.server";

/** A moderator working on one desk item until expires_at; one row per item (the primary key). */
export class DeskClaim extends Model<InferAttributes<DeskClaim>, InferCreationAttributes<DeskClaim>> {
  declare subjectType: string;
  declare subjectId: string;
  declare moderatorId: string;
  declare claimedAt: Date;
  declare expiresAt: Date;

  declare moderator?: NonAttribute<User>;
}

DeskClaim.init(
  {
    subjectType: { type: DataTypes.TEXT, allowNull: false, primaryKey: true },
    subjectId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
    moderatorId: { type: DataTypes.UUID, allowNull: false },
    claimedAt: { type: DataTypes.DATE, allowNull: false },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
  },
  { sequelize, tableName: "desk_claims", underscored: true, timestamps: false },
);
