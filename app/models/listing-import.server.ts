import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

export const IMPORT_STATUSES = ["queued", "running", "done", "failed"] as const;
export type ImportStatus = (typeof IMPORT_STATUSES)[number];

/**
 * One CSV import of units as drafts. `rows` holds the file's rows, already checked, until the job has
 * written them (then null: the upload is not kept); `doneRows` is the progress the import page polls.
 * Read and written only by app/imports, which parses `rows` through the CSV layout's schema.
 */
export class ListingImport extends Model<InferAttributes<ListingImport>, InferCreationAttributes<ListingImport>> {
  declare id: CreationOptional<string>;
  declare ownerId: string;
  declare fileName: string;
  declare status: CreationOptional<ImportStatus>;
  declare totalRows: number;
  declare doneRows: CreationOptional<number>;
  declare rows: unknown;
  declare error: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare finishedAt: CreationOptional<Date | null>;
}

ListingImport.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    ownerId: { type: DataTypes.UUID, allowNull: false },
    fileName: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "queued" },
    totalRows: { type: DataTypes.INTEGER, allowNull: false },
    doneRows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    rows: { type: DataTypes.JSONB, allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
  },
  { sequelize, tableName: "listing_imports", underscored: true, timestamps: false },
);
