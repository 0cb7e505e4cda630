import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

/** One password sign-in attempt, kept for rate limiting. */
export class SignInAttempt extends Model<InferAttributes<SignInAttempt>, InferCreationAttributes<SignInAttempt>> {
  declare id: CreationOptional<string>; // BIGINT arrives as a string from pg
  declare email: string;
  declare address: string | null;
  declare succeeded: boolean;
  declare attemptedAt: CreationOptional<Date>;
}

SignInAttempt.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    email: { type: DataTypes.CITEXT, allowNull: false },
    address: { type: DataTypes.TEXT, allowNull: true },
    succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
    attemptedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  },
  { sequelize, tableName: "sign_in_attempts", underscored: true, timestamps: false },
);
