import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import { benchSheetSchema, verdictSchema, type BenchSheet as Sheet, type Verdict } from "@shared/bench";
import { jsonColumn, none } from "./json-column.server";

/**
 * A listing's bench sheet (one per listing) as entered, and the verdict the bench checks gave it.
 * The shapes are shared/bench's; the database keeps them as JSON so the schema can grow without
 * a migration per reading. verdict and checked_at are null until the sheet has been checked.
 * Both read through their schemas: a sheet or verdict stored in an older shape reads as null.
 */
export class BenchSheet extends Model<InferAttributes<BenchSheet>, InferCreationAttributes<BenchSheet>> {
  declare id: CreationOptional<string>;
  declare listingId: string;
  declare sheet: Sheet | null;
  declare verdict: Verdict | null;
  declare checkedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const readSheet = jsonColumn("bench_sheets.sheet", benchSheetSchema, none);
const readVerdict = jsonColumn("bench_sheets.verdict", verdictSchema, none);

BenchSheet.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    listingId: { type: DataTypes.UUID, allowNull: false, unique: true },
    sheet: {
      type: DataTypes.JSONB,
      allowNull: false,
      get() {
        return readSheet(this.getDataValue("sheet"));
      },
    },
    verdict: {
      type: DataTypes.JSONB,
      allowNull: true,
      get() {
        return readVerdict(this.getDataValue("verdict"));
      },
    },
    checkedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "bench_sheets", underscored: true },
);
