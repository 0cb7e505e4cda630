import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "~/db.server";
import { type Category, type CosmeticGrade, type ListingStatus, type ServiceState } from "@shared/catalogue";
import { ShippingOptionsSchema, type ShippingOption } from "@shared/catalogue-schemas";
import type { BenchSheet } from "./bench-sheet.server";
import { jsonColumn } from "./json-column.server";
import type { ListingPhoto } from "./listing-photo.server";
import type { RestorationEntry } from "./restoration-entry.server";
import type { User } from "./user.server";
import type { Workshop } from "./workshop.server";

/**
 * A unit for sale. Fields a draft may still lack are nullable; the database refuses to move a listing
 * past draft without maker, model, price, location, condition and a publish time (listings_publishable).
 * The facet columns (power_8ohm_w …) copy figures from the checked bench sheet so the market can filter
 * by them; they are null when the sheet has no such reading.
 */
export class Listing extends Model<InferAttributes<Listing>, InferCreationAttributes<Listing>> {
  declare id: CreationOptional<string>;
  declare sellerId: string;
  declare workshopId: string | null;
  declare status: CreationOptional<ListingStatus>;
  declare category: Category;
  declare maker: string | null;
  declare model: string | null;
  declare yearFrom: number | null;
  declare yearTo: number | null;
  /** Stored for disputes and theft checks; never sent to a public page. */
  declare serialNumber: string | null;
  declare mainsVoltageV: number | null;
  declare mainsFrequencyHz: number | null;
  declare mainsSwitchable: CreationOptional<boolean>;
  declare weightG: number | null;
  declare boxedLengthMm: number | null;
  declare boxedWidthMm: number | null;
  declare boxedHeightMm: number | null;
  declare includesManual: CreationOptional<boolean>;
  declare includesRemote: CreationOptional<boolean>;
  declare includesOriginalPacking: CreationOptional<boolean>;
  declare priceMinor: number | null;
  declare currency: CreationOptional<string>;
  declare offersWelcome: CreationOptional<boolean>;
  declare country: string | null;
  declare region: string | null;
  declare town: string | null;
  declare postcode: string | null;
  declare shippingOptions: CreationOptional<ShippingOption[]>;
  declare handlingDays: number | null;
  declare cosmeticGrade: CosmeticGrade | null;
  declare serviceState: ServiceState | null;
  declare conditionNote: string | null;
  declare benchVerified: CreationOptional<boolean>;
  declare publishedAt: Date | null;
  declare heldReason: string | null;
  /** The moderator's note when they asked for changes; shown in the seller's editor. */
  declare reviewNote: CreationOptional<string | null>;
  /** The workshop's own stock number (the inventory CSV's `reference`); the seller's eyes only. */
  declare stockReference: CreationOptional<string | null>;
  declare power8ohmW: number | null;
  declare power4ohmW: number | null;
  declare thdPct: number | null;
  declare thdnPct: number | null;
  declare snrDb: number | null;
  declare f3LowHz: number | null;
  declare f3HighHz: number | null;
  declare dampingFactor: number | null;
  declare riaaDeviationDb: number | null;
  declare gainDb: number | null;
  declare noiseUv: number | null;
  declare sensitivityDb: number | null;
  declare impedanceMinOhm: number | null;
  declare speedErrorPct: number | null;
  declare wowFlutterPct: number | null;
  /** The price in euro cents at the admin's rates; kept by database triggers (search migration), never written here. */
  declare priceEurMinor: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  // Associations (models/index.server.ts), present when a query includes them.
  declare seller?: NonAttribute<User>;
  declare workshop?: NonAttribute<Workshop | null>;
  declare benchSheet?: NonAttribute<BenchSheet | null>;
  declare photos?: NonAttribute<ListingPhoto[]>;
  declare restorationEntries?: NonAttribute<RestorationEntry[]>;
}

const readShippingOptions = jsonColumn("listings.shipping_options", ShippingOptionsSchema, (): ShippingOption[] => []);

const nullable = (type: DataTypes.DataType) => ({ type, allowNull: true });
const facet = (field: string) => ({ type: DataTypes.DOUBLE, allowNull: true, field });

Listing.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    sellerId: { type: DataTypes.UUID, allowNull: false },
    workshopId: nullable(DataTypes.UUID),
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "draft" },
    category: { type: DataTypes.TEXT, allowNull: false },
    maker: nullable(DataTypes.TEXT),
    model: nullable(DataTypes.TEXT),
    yearFrom: nullable(DataTypes.SMALLINT),
    yearTo: nullable(DataTypes.SMALLINT),
    serialNumber: nullable(DataTypes.TEXT),
    mainsVoltageV: nullable(DataTypes.SMALLINT),
    mainsFrequencyHz: nullable(DataTypes.SMALLINT),
    mainsSwitchable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    weightG: nullable(DataTypes.INTEGER),
    boxedLengthMm: nullable(DataTypes.INTEGER),
    boxedWidthMm: nullable(DataTypes.INTEGER),
    boxedHeightMm: nullable(DataTypes.INTEGER),
    includesManual: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    includesRemote: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    includesOriginalPacking: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    priceMinor: nullable(DataTypes.INTEGER),
    currency: { type: DataTypes.CHAR(3), allowNull: false, defaultValue: "EUR" },
    offersWelcome: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    country: nullable(DataTypes.CHAR(2)),
    region: nullable(DataTypes.TEXT),
    town: nullable(DataTypes.TEXT),
    postcode: nullable(DataTypes.TEXT),
    shippingOptions: {
      type: DataTypes.JSONB,
      allowNull: false,
      defaultValue: [],
      get() {
        return readShippingOptions(this.getDataValue("shippingOptions"));
      },
    },
    handlingDays: nullable(DataTypes.SMALLINT),
    cosmeticGrade: nullable(DataTypes.TEXT),
    serviceState: nullable(DataTypes.TEXT),
    conditionNote: nullable(DataTypes.TEXT),
    benchVerified: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    publishedAt: nullable(DataTypes.DATE),
    heldReason: nullable(DataTypes.TEXT),
    reviewNote: nullable(DataTypes.TEXT),
    stockReference: nullable(DataTypes.STRING(40)),
    // Facet columns, named for their units (shared/listing-facets.ts fills them).
    power8ohmW: facet("power_8ohm_w"),
    power4ohmW: facet("power_4ohm_w"),
    thdPct: facet("thd_pct"),
    thdnPct: facet("thdn_pct"),
    snrDb: facet("snr_db"),
    f3LowHz: facet("f3_low_hz"),
    f3HighHz: facet("f3_high_hz"),
    dampingFactor: facet("damping_factor"),
    riaaDeviationDb: facet("riaa_deviation_db"),
    gainDb: facet("gain_db"),
    noiseUv: facet("noise_uv"),
    sensitivityDb: facet("sensitivity_db"),
    impedanceMinOhm: facet("impedance_min_ohm"),
    speedErrorPct: facet("speed_error_pct"),
    wowFlutterPct: facet("wow_flutter_pct"),
    priceEurMinor: {
      type: DataTypes.BIGINT,
      allowNull: true,
      field: "price_eur_minor",
      // pg reads bigint as a string; euro cents of any price fit a double exactly.
      get() {
        const v: unknown = this.getDataValue("priceEurMinor");
        return v === null || v === undefined ? null : Number(v);
      },
    },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  {
    sequelize,
    tableName: "listings",
    underscored: true,
    // Keeps the serial number out of anything that serialises a listing by accident.
    defaultScope: { attributes: { exclude: ["serialNumber"] } },
    scopes: { withSerial: { attributes: { include: ["serialNumber"] } } },
  },
);
