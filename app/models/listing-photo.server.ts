import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import type { PhotoStatus } from "@shared/catalogue";

/**
 * One photo of a listing. The upload waits under incoming/ until the photo job has written the
 * original (upright and metadata-free: docs/decisions/0034), which stays private in S3; only the
 * three derived sizes, stripped of metadata, are ever served.
 */
export class ListingPhoto extends Model<InferAttributes<ListingPhoto>, InferCreationAttributes<ListingPhoto>> {
  declare id: CreationOptional<string>;
  declare listingId: string;
  declare position: number;
  declare isCover: CreationOptional<boolean>;
  declare status: CreationOptional<PhotoStatus>;
  declare originalKey: string;
  declare thumbKey: string | null;
  declare listingKey: string | null;
  declare zoomKey: string | null;
  declare contentType: string | null;
  declare byteSize: number | null;
  declare width: number | null;
  declare height: number | null;
  /** Perceptual hash of the image, for the reused-photo check. */
  declare phash: string | null;
  declare error: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

ListingPhoto.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    listingId: { type: DataTypes.UUID, allowNull: false },
    position: { type: DataTypes.SMALLINT, allowNull: false },
    isCover: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "processing" },
    originalKey: { type: DataTypes.TEXT, allowNull: false },
    thumbKey: { type: DataTypes.TEXT, allowNull: true },
    listingKey: { type: DataTypes.TEXT, allowNull: true },
    zoomKey: { type: DataTypes.TEXT, allowNull: true },
    contentType: { type: DataTypes.TEXT, allowNull: true },
    byteSize: { type: DataTypes.INTEGER, allowNull: true },
    width: { type: DataTypes.INTEGER, allowNull: true },
    height: { type: DataTypes.INTEGER, allowNull: true },
    phash: { type: DataTypes.TEXT, allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "listing_photos", underscored: true },
);
