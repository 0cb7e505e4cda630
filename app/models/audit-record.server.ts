import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "~/db.server";
import type { User } from "./user.server";

/** One moderator's (or the system's) action on a desk subject. Append-only: a trigger refuses UPDATE and DELETE. */
export class AuditRecord extends Model<InferAttributes<AuditRecord>, InferCreationAttributes<AuditRecord>> {
  declare id: CreationOptional<string>;
  /** Null when the system acted. */
  declare actorId: string | null;
  declare action: string;
  declare subjectType: string;
  declare subjectId: string;
  declare note: string;
  declare before: unknown;
  declare after: unknown;
  declare createdAt: CreationOptional<Date>;

  declare actor?: NonAttribute<User | null>;
}

AuditRecord.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    actorId: { type: DataTypes.UUID, allowNull: true },
    action: { type: DataTypes.TEXT, allowNull: false },
    subjectType: { type: DataTypes.TEXT, allowNull: false },
    subjectId: { type: DataTypes.UUID, allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: false },
    before: { type: DataTypes.JSONB, allowNull: true },
    after: { type: DataTypes.JSONB, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "audit_records", underscored: true, updatedAt: false },
);
