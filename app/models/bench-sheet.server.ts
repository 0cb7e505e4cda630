import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

/**
 * A listing's bench sheet (one per listing) as entered, and the verdict the bench checks gave it.
 * The shapes are shared/bench's; the database keeps them as JSON so the schema can grow without
 * a migration per reading. verdict and checked_at are null until the sheet has been checked.
 */
export class BenchSheet extends Model<InferAttributes<BenchSheet>, InferCreationAttributes<BenchSheet>> {
  declare id: CreationOptional<string>;
  declare listingId: string;
  declare sheet: Record<string, unknown>;
  declare verdict: Record<string, unknown> | null;
  declare checkedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

BenchSheet.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    listingId: { type: DataTypes.UUID, allowNull: false, unique: true },
    sheet: { type: DataTypes.JSONB, allowNull: false },
    verdict: { type: DataTypes.JSONB, allowNull: true },
    checkedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "bench_sheets", underscored: true },
);
