import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

/**
 * A bench certificate as issued: the listing, the SHA-256 of its bench sheet as certified
 * (app/certificates/sheet-hash.server.ts), when it was issued, and when the sheet first changed after
 * (set by a trigger on bench_sheets). One per listing and sheet version.
 */
export class BenchCertificate extends Model<InferAttributes<BenchCertificate>, InferCreationAttributes<BenchCertificate>> {
  declare id: CreationOptional<string>;
  declare listingId: string;
  declare sheetHash: string;
  declare issuedAt: CreationOptional<Date>;
  declare supersededAt: CreationOptional<Date | null>;
}

BenchCertificate.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    listingId: { type: DataTypes.UUID, allowNull: false },
    sheetHash: { type: DataTypes.TEXT, allowNull: false },
    issuedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    supersededAt: { type: DataTypes.DATE, allowNull: true },
  },
  { sequelize, tableName: "bench_certificates", underscored: true, timestamps: false },
);
