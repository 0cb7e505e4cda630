import type { Transaction } from "sequelize";
import { MarketplaceSettings } from "~/models/index.server";
import type { FeeRule } from "@shared/order-fee";

// The admin's settings for buying (fee, minimum, audition and arrival days, reservation and offer
// times): one row, read fresh for every decision so a change applies to the next order at once.

export interface MarketplaceSettingsView extends FeeRule {
  auditionDays: number;
  arrivalAssumedDays: number;
  reservationMinutes: number;
  offerHours: number;
  offerCheckoutHours: number;
  updatedBy: string | null;
  updatedAt: Date;
}

export async function marketplaceSettings(transaction?: Transaction): Promise<MarketplaceSettingsView> {
  const row = await MarketplaceSettings.findByPk(1, { transaction });
  if (!row) throw new Error("marketplace_settings has no row 1: run the migrations");
  return {
    feeBasisPoints: row.feeBasisPoints,
    feeMinimumMinor: row.feeMinimumMinor,
    auditionDays: row.auditionDays,
    arrivalAssumedDays: row.arrivalAssumedDays,
    reservationMinutes: row.reservationMinutes,
    offerHours: row.offerHours,
    offerCheckoutHours: row.offerCheckoutHours,
    updatedBy: row.updatedBy,
    updatedAt: row.updatedAt,
  };
}

export type SettingsChange = Partial<
  Pick<
    MarketplaceSettingsView,
    | "feeBasisPoints"
    | "feeMinimumMinor"
    | "auditionDays"
    | "arrivalAssumedDays"
    | "reservationMinutes"
    | "offerHours"
    | "offerCheckoutHours"
  >
>;

/** The admin's change (already parsed by the page); the database's CHECKs keep the ranges. */
export async function updateMarketplaceSettings(
  change: SettingsChange,
  adminId: string,
  now: Date = new Date(),
): Promise<MarketplaceSettingsView> {
  await MarketplaceSettings.update({ ...change, updatedBy: adminId, updatedAt: now }, { where: { id: 1 } });
  return marketplaceSettings();
}
