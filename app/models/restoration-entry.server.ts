import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import { RestorationPartSchema, RestorationReadingSchema, type RestorationPart, type RestorationReading } from "@shared/catalogue-schemas";
import { z } from "zod";
import { jsonColumn } from "./json-column.server";

/** One dated step of a unit's restoration log: the work, the parts with quantities, who did it, readings. */
export class RestorationEntry extends Model<InferAttributes<RestorationEntry>, InferCreationAttributes<RestorationEntry>> {
  declare id: CreationOptional<string>;
  declare listingId: string;
  /** A calendar date (YYYY-MM-DD); no time of day or zone. */
  declare doneOn: string;
  declare work: string;
  declare parts: CreationOptional<RestorationPart[]>;
  declare technician: string | null;
  declare readingsBefore: CreationOptional<RestorationReading[]>;
  declare readingsAfter: CreationOptional<RestorationReading[]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const readParts = jsonColumn("restoration_entries.parts", z.array(RestorationPartSchema), (): RestorationPart[] => []);
const readReadings = (column: string) => jsonColumn(column, z.array(RestorationReadingSchema), (): RestorationReading[] => []);
const readBefore = readReadings("restoration_entries.readings_before");
const readAfter = readReadings("restoration_entries.readings_after");

RestorationEntry.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    listingId: { type: DataTypes.UUID, allowNull: false },
    doneOn: { type: DataTypes.DATEONLY, allowNull: false },
    work: { type: DataTypes.TEXT, allowNull: false },
    parts: {
      type: DataTypes.JSONB,
      allowNull: false,
      defaultValue: [],
      get() {
        return readParts(this.getDataValue("parts"));
      },
    },
    technician: { type: DataTypes.TEXT, allowNull: true },
    readingsBefore: {
      type: DataTypes.JSONB,
      allowNull: false,
      defaultValue: [],
      get() {
        return readBefore(this.getDataValue("readingsBefore"));
      },
    },
    readingsAfter: {
      type: DataTypes.JSONB,
      allowNull: false,
      defaultValue: [],
      get() {
        return readAfter(this.getDataValue("readingsAfter"));
      },
    },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "restoration_entries", underscored: true },
);
