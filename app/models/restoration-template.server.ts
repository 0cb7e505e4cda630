import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { RestorationPartSchema, type RestorationPart } from "@shared/catalogue-schemas";
import { jsonColumn } from "./json-column.server";

/** A workshop's saved service job (title, work done, parts), applied to a unit's restoration log. */
export class RestorationTemplate extends Model<InferAttributes<RestorationTemplate>, InferCreationAttributes<RestorationTemplate>> {
  declare id: CreationOptional<string>;
  declare ownerId: string;
  declare title: string;
  declare work: string;
  declare parts: CreationOptional<RestorationPart[]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const readParts = jsonColumn("restoration_templates.parts", z.array(RestorationPartSchema), (): RestorationPart[] => []);

RestorationTemplate.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    ownerId: { type: DataTypes.UUID, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    work: { type: DataTypes.TEXT, allowNull: false },
    parts: {
      type: DataTypes.JSONB,
      allowNull: false,
      defaultValue: [],
      get() {
        return readParts(this.getDataValue("parts"));
      },
    },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "restoration_templates", underscored: true },
);
