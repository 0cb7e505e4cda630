import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import type { CaptureConditions, CaptureKind } from "@shared/bench/analysis";
import type { Reading, Sweep } from "@shared/bench/schema";

export type CaptureStatus = "queued" | "running" | "done" | "failed";

/**
 * A raw measurement file (WAV or CSV) a seller uploaded, with its stated conditions; the background
 * job fills in the analysis and the bench-sheet readings, or the reason it refused the file.
 */
export class Capture extends Model<InferAttributes<Capture>, InferCreationAttributes<Capture>> {
  declare id: CreationOptional<string>;
  declare ownerId: string;
  declare kind: CaptureKind;
  declare status: CreationOptional<CaptureStatus>;
  declare fileName: string;
  declare contentType: string;
  declare byteSize: number;
  declare storageKey: string | null;
  declare format: Record<string, unknown>;
  declare conditions: CaptureConditions;
  declare analysis: CreationOptional<Record<string, unknown> | null>;
  declare readings: CreationOptional<Reading[] | null>;
  declare sweep: CreationOptional<Sweep | null>;
  declare errorCode: CreationOptional<string | null>;
  declare errorMessage: CreationOptional<string | null>;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Capture.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    ownerId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "queued" },
    fileName: { type: DataTypes.TEXT, allowNull: false },
    contentType: { type: DataTypes.TEXT, allowNull: false },
    byteSize: { type: DataTypes.INTEGER, allowNull: false },
    storageKey: { type: DataTypes.TEXT, allowNull: true, unique: true },
    format: { type: DataTypes.JSON, allowNull: false },
    conditions: { type: DataTypes.JSON, allowNull: false },
    analysis: { type: DataTypes.JSON, allowNull: true },
    readings: { type: DataTypes.JSON, allowNull: true },
    sweep: { type: DataTypes.JSON, allowNull: true },
    errorCode: { type: DataTypes.TEXT, allowNull: true },
    errorMessage: { type: DataTypes.TEXT, allowNull: true },
    startedAt: { type: DataTypes.DATE, allowNull: true },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "captures", underscored: true },
);
