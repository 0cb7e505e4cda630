import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import type { CaptureFileKind, CaptureFormat } from "~/bench/captures.server";
import {
  captureConditionsSchema,
  storedAnalysisSchema,
  type AnyAnalysis,
  type CaptureConditions,
  type CaptureKind,
} from "@shared/bench/analysis";
import { readingSchema, sweepSchema, type Reading, type Sweep } from "@shared/bench/schema";
import { jsonColumn, none } from "./json-column.server";

export type CaptureStatus = "queued" | "running" | "done" | "failed";
/** What the file holds: only its kind until the job has read it in full. */
export type StoredCaptureFormat = CaptureFormat | { file: CaptureFileKind };

/**
 * A raw measurement file (WAV or CSV) a seller uploaded, with its stated conditions; the background
 * job fills in the analysis and the bench-sheet readings, or the reason it refused the file.
 * The JSON columns read through their schemas; a value stored in an older shape reads as null.
 */
export class Capture extends Model<InferAttributes<Capture>, InferCreationAttributes<Capture>> {
  declare id: CreationOptional<string>;
  declare ownerId: string;
  /** The listing it was uploaded for or first used on (deleting that draft removes it); null for none. */
  declare listingId: CreationOptional<string | null>;
  declare kind: CaptureKind;
  declare status: CreationOptional<CaptureStatus>;
  declare fileName: string;
  declare contentType: string;
  declare byteSize: number;
  declare storageKey: string | null;
  declare format: StoredCaptureFormat | null;
  declare conditions: CaptureConditions | null;
  declare analysis: CreationOptional<AnyAnalysis | null>;
  declare readings: CreationOptional<Reading[] | null>;
  declare sweep: CreationOptional<Sweep | null>;
  declare errorCode: CreationOptional<string | null>;
  declare errorMessage: CreationOptional<string | null>;
  /** Times the analysis job has started on it since it was (re)queued. */
  declare attempts: CreationOptional<number>;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const header = z.tuple([z.string(), z.string()]).nullable();
const captureFormatSchema = z.discriminatedUnion("file", [
  z.object({
    file: z.literal("wav"),
    container: z.enum(["RIFF", "RIFX", "RF64"]),
    encoding: z.enum(["pcm", "float"]),
    bitDepth: z.literal([16, 24, 32]),
    channels: z.literal([1, 2]),
    sampleRate: z.number(),
    frames: z.number(),
    durationS: z.number(),
  }),
  z.object({ file: z.literal("csv"), rows: z.number(), header }),
]);
// Compile-time proof that the schema reads what the bench writes.
const _format: (f: z.infer<typeof captureFormatSchema>) => CaptureFormat = (f) => f;
void _format;
const storedFormatSchema = z.union([captureFormatSchema, z.object({ file: z.enum(["wav", "csv"]) })]);

const readFormat = jsonColumn("captures.format", storedFormatSchema, none);
const readConditions = jsonColumn("captures.conditions", captureConditionsSchema, none);
const readAnalysis = jsonColumn("captures.analysis", storedAnalysisSchema, none);
const readReadings = jsonColumn("captures.readings", z.array(readingSchema), none);
const readSweep = jsonColumn("captures.sweep", sweepSchema, none);

Capture.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    ownerId: { type: DataTypes.UUID, allowNull: false },
    listingId: { type: DataTypes.UUID, allowNull: true },
    kind: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "queued" },
    fileName: { type: DataTypes.TEXT, allowNull: false },
    contentType: { type: DataTypes.TEXT, allowNull: false },
    byteSize: { type: DataTypes.INTEGER, allowNull: false },
    storageKey: { type: DataTypes.TEXT, allowNull: true, unique: true },
    format: {
      type: DataTypes.JSON,
      allowNull: false,
      get() {
        return readFormat(this.getDataValue("format"));
      },
    },
    conditions: {
      type: DataTypes.JSON,
      allowNull: false,
      get() {
        return readConditions(this.getDataValue("conditions"));
      },
    },
    analysis: {
      type: DataTypes.JSON,
      allowNull: true,
      get() {
        return readAnalysis(this.getDataValue("analysis"));
      },
    },
    readings: {
      type: DataTypes.JSON,
      allowNull: true,
      get() {
        return readReadings(this.getDataValue("readings"));
      },
    },
    sweep: {
      type: DataTypes.JSON,
      allowNull: true,
      get() {
        return readSweep(this.getDataValue("sweep"));
      },
    },
    errorCode: { type: DataTypes.TEXT, allowNull: true },
    errorMessage: { type: DataTypes.TEXT, allowNull: true },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    startedAt: { type: DataTypes.DATE, allowNull: true },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "captures", underscored: true },
);
