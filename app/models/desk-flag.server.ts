import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "~/db.server";
import type { Listing } from "./listing.server";
import type { User } from "./user.server";

export const FLAG_KINDS = ["copied_photo", "low_price", "report"] as const;
export type FlagKind = (typeof FLAG_KINDS)[number];

/** Something that needs a moderator's eye on a listing or a thread: a copied photo, a price far under the index, a report. */
export class DeskFlag extends Model<InferAttributes<DeskFlag>, InferCreationAttributes<DeskFlag>> {
  declare id: CreationOptional<string>;
  declare kind: FlagKind;
  declare listingId: string | null;
  declare threadId: string | null;
  declare reporterId: string | null;
  /** A short code (a report's reason, `photo_match`, `under_index`). */
  declare reason: string;
  declare note: string | null;
  declare details: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;
  declare resolvedAt: Date | null;
  declare resolvedBy: string | null;
  declare resolution: string | null;

  declare listing?: NonAttribute<Listing | null>;
  declare reporter?: NonAttribute<User | null>;
}

DeskFlag.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    kind: { type: DataTypes.TEXT, allowNull: false },
    listingId: { type: DataTypes.UUID, allowNull: true },
    threadId: { type: DataTypes.UUID, allowNull: true },
    reporterId: { type: DataTypes.UUID, allowNull: true },
    reason: { type: DataTypes.TEXT, allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: true },
    details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    createdAt: DataTypes.DATE,
    resolvedAt: { type: DataTypes.DATE, allowNull: true },
    resolvedBy: { type: DataTypes.UUID, allowNull: true },
    resolution: { type: DataTypes.TEXT, allowNull: true },
  },
  { sequelize, tableName: "desk_flags", underscored: true, updatedAt: false },
);
