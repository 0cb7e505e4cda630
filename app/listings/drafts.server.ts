import type { Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing, User, Workshop } from "~/models/index.server";
import type { SessionUser } from "~/auth/guards.server";
import { hasRole } from "~/auth/guards.server";
import { normaliseRoles } from "~/auth/roles";
import { CATEGORIES } from "@shared/catalogue";
import { ConditionPatchSchema, ConditionSchema, ItemPatchSchema, ItemSchema, type ItemPatch } from "@shared/listing-draft";
import { currencyAfterCountryChange, listingCurrencyFor, sameMinorDigits } from "@shared/listing-currency";
import { isCurrency } from "@shared/listing-input";
import { assertEditable, isPublished, ownListing } from "./access.server";
import { ListingInputError, ListingStateError, type Issue } from "./errors.server";
import { NO_FACETS } from "@shared/listing-facets";
import { isOneOf } from "@shared/one-of";
import { noticePriceChange, queueWatchNotice } from "~/alerts/watch-notices.server";

// Drafts and the item and condition steps. Who may list: any signed-in account. Listing for the first
// time makes the account a seller (the role is added with the draft, in one transaction); a workshop
// account lists as its workshop, and its drafts start with the workshop's location.

const zodIssues = (issues: readonly { path: PropertyKey[]; message: string }[], prefix = ""): Issue[] =>
  issues.map((i) => ({ path: prefix + i.path.map(String).join("."), message: i.message }));

export async function createDraft(user: SessionUser, category: unknown): Promise<Listing> {
  if (!isOneOf(CATEGORIES, category))
    throw new ListingInputError([{ path: "category", message: "Choose what kind of unit you are listing." }]);
  return sequelize.transaction(async (transaction) => {
    if (!hasRole(user, ["seller", "workshop"])) {
      const account = await User.findByPk(user.id, { transaction, lock: transaction.LOCK.UPDATE });
      if (account) await account.update({ roles: normaliseRoles([...account.roles, "seller"]) }, { transaction });
    }
    const workshop = await Workshop.findOne({ where: { ownerId: user.id }, transaction });
    return Listing.create(
      {
        sellerId: user.id,
        workshopId: workshop?.id ?? null,
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
        currency: listingCurrencyFor(workshop?.country),
        country: workshop?.country ?? null,
        region: workshop?.region ?? null,
        town: workshop?.town ?? null,
        postcode: null,
        handlingDays: null,
        cosmeticGrade: null,
        serviceState: null,
        conditionNote: null,
        publishedAt: null,
        heldReason: null,
        ...NO_FACETS,
      },
      { transaction },
    );
  });
}

/** Fields a listing past draft may not lose (the database refuses them too: listings_publishable). */
const KEPT_ONCE_PUBLISHED = ["maker", "model", "priceMinor", "country", "cosmeticGrade", "serviceState"] as const;

function keepPublishable(listing: Listing, next: Record<string, unknown>, prefix: string): Issue[] {
  if (!isPublished(listing) && listing.status !== "withdrawn") return [];
  return KEPT_ONCE_PUBLISHED.filter((k) => k in next && (next[k] === null || next[k] === undefined)).map((k) => ({
    path: prefix + k,
    message: "A published listing must keep this; change it rather than clearing it.",
  }));
}

/**
 * A draft's currency moves with its country unless the seller chose it (shared/listing-currency.ts).
 * The form does this as the seller picks; here for a plain form post or an API client. Only between
 * currencies that read the typed prices alike, and never on a published listing, where the seller
 * must see such a change before it is saved.
 */
function followCountry(listing: Listing, values: ItemPatch): ItemPatch {
  if (listing.status !== "draft" || values.country === undefined) return values;
  const sent = values.currency ?? listing.currency;
  const next = currencyAfterCountryChange(
    { country: listing.country, currency: listing.currency },
    { country: values.country, currency: sent },
  );
  return next !== sent && isCurrency(next) && sameMinorDigits(next, sent) ? { ...values, currency: next } : values;
}

/** Save the item step (any subset of its fields). Returns the listing as saved. */
export async function saveItem(listingId: string, sellerId: string, patch: unknown, opts: { transaction?: Transaction } = {}) {
  const parsed = ItemPatchSchema.safeParse(patch);
  if (!parsed.success) throw new ListingInputError(zodIssues(parsed.error.issues));
  const run = async (transaction: Transaction) => {
    const listing = await ownListing(listingId, sellerId, { transaction, lock: true });
    assertEditable(listing);
    const values = followCountry(listing, parsed.data);
    const current = ItemSchema.safeParse({ ...pickItem(listing), ...values });
    if (!current.success) throw new ListingInputError(zodIssues(current.error.issues));
    const issues = keepPublishable(listing, values, "");
    if (values.category && values.category !== listing.category) {
      if (listing.status !== "draft")
        issues.push({ path: "category", message: "The kind of unit cannot change once the listing has been published." });
      else {
        const sheet = await BenchSheet.findOne({ where: { listingId }, transaction });
        // A sheet that no longer reads (null) may still hold readings: keep it rather than guess.
        const used = sheet && (!sheet.sheet || sheet.sheet.readings.length > 0 || sheet.sheet.sweeps.length > 0);
        if (used)
          issues.push({ path: "category", message: "The bench sheet holds readings for the current kind of unit; clear them first." });
        else if (sheet) await sheet.destroy({ transaction });
      }
    }
    if (issues.length) throw new ListingInputError(issues);
    const before = { status: listing.status, priceMinor: listing.priceMinor, currency: listing.currency };
    await listing.update(values, { transaction });
    await noticePriceChange(listing.id, before, listing, transaction);
    return listing;
  };
  return opts.transaction ? run(opts.transaction) : sequelize.transaction(run);
}

export async function saveCondition(listingId: string, sellerId: string, patch: unknown, opts: { transaction?: Transaction } = {}) {
  const parsed = ConditionPatchSchema.safeParse(patch);
  if (!parsed.success) throw new ListingInputError(zodIssues(parsed.error.issues));
  const run = async (transaction: Transaction) => {
    const listing = await ownListing(listingId, sellerId, { transaction, lock: true });
    assertEditable(listing);
    const next = ConditionSchema.safeParse({
      cosmeticGrade: listing.cosmeticGrade,
      serviceState: listing.serviceState,
      conditionNote: listing.conditionNote,
      ...parsed.data,
    });
    if (!next.success) throw new ListingInputError(zodIssues(next.error.issues));
    const issues = keepPublishable(listing, parsed.data, "");
    if (issues.length) throw new ListingInputError(issues);
    await listing.update(parsed.data, { transaction });
    return listing;
  };
  return opts.transaction ? run(opts.transaction) : sequelize.transaction(run);
}

/** Takes a live or held listing off the market; the seller can publish it again later. */
export async function withdrawListing(listingId: string, sellerId: string, opts: { transaction?: Transaction } = {}): Promise<Listing> {
  const run = async (transaction: Transaction) => {
    const listing = await ownListing(listingId, sellerId, { transaction, lock: true });
    assertEditable(listing);
    if (!isPublished(listing))
      throw new ListingStateError(
        listing.status === "withdrawn"
          ? "This listing is already withdrawn."
          : "A draft is not on the market; there is nothing to withdraw.",
        "not_published",
      );
    await listing.update({ status: "withdrawn" }, { transaction });
    await queueWatchNotice({ kind: "withdrawn", listingId: listing.id }, transaction);
    return listing;
  };
  return opts.transaction ? run(opts.transaction) : sequelize.transaction(run);
}

export function pickItem(l: Listing) {
  return {
    category: l.category,
    maker: l.maker,
    model: l.model,
    yearFrom: l.yearFrom,
    yearTo: l.yearTo,
    serialNumber: l.serialNumber ?? null,
    mainsVoltageV: l.mainsVoltageV,
    mainsFrequencyHz: l.mainsFrequencyHz as 50 | 60 | null,
    mainsSwitchable: l.mainsSwitchable,
    weightG: l.weightG,
    boxedLengthMm: l.boxedLengthMm,
    boxedWidthMm: l.boxedWidthMm,
    boxedHeightMm: l.boxedHeightMm,
    includesManual: l.includesManual,
    includesRemote: l.includesRemote,
    includesOriginalPacking: l.includesOriginalPacking,
    priceMinor: l.priceMinor,
    currency: l.currency,
    offersWelcome: l.offersWelcome,
    country: l.country,
    region: l.region,
    town: l.town,
    postcode: l.postcode,
    shippingOptions: l.shippingOptions,
    handlingDays: l.handlingDays,
  };
}
