import type { CreationAttributes } from "sequelize";
import type { Category } from "@shared/catalogue";
import { NO_FACETS } from "@shared/listing-facets";
import type { Listing } from "~/models/index.server";

/** A listing row with only its seller and kind filled in (plus `extra`), for Listing.create in tests. */
export function blankListing(
  sellerId: string,
  category: Category,
  extra: Partial<CreationAttributes<Listing>> = {},
): CreationAttributes<Listing> {
  return {
    sellerId,
    workshopId: null,
    category,
    maker: null,
    model: null,
    yearFrom: null,
    yearTo: null,
    serialNumber: null,
    mainsVoltageV: null,
    mainsFrequencyHz: null,
    weightG: null,
    boxedLengthMm: null,
    boxedWidthMm: null,
    boxedHeightMm: null,
    priceMinor: null,
    country: null,
    region: null,
    town: null,
    postcode: null,
    handlingDays: null,
    cosmeticGrade: null,
    serviceState: null,
    conditionNote: null,
    publishedAt: null,
    heldReason: null,
    ...NO_FACETS,
    ...extra,
  };
}
