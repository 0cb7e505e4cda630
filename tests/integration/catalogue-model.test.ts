import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { Listing, ListingPhoto, User } from "~/models/index.server";
import { blankListing } from "../support/blank-listing";
import { CATEGORIES, COSMETIC_GRADES, LISTING_STATUSES, PHOTO_STATUSES, SERVICE_STATES, WORKSHOP_STATUSES } from "@shared/catalogue";

// The database keeps the catalogue honest even when a bug slips past the forms: its CHECK lists
// match the shared vocabulary, and it refuses rows that would put a half-made listing in front of buyers.

async function constraintValues(name: string): Promise<string[]> {
  const [row] = await sequelize.query<{ def: string }>(`SELECT pg_get_constraintdef(oid) AS def FROM pg_constraint WHERE conname = :name`, {
    replacements: { name },
    type: QueryTypes.SELECT,
  });
  return [...row.def.matchAll(/'([a-z_]+)'::text/g)].map((m) => m[1]);
}

describe("catalogue vocabulary in the database", () => {
  it.each([
    ["listings_status_known", LISTING_STATUSES],
    ["listings_category_known", CATEGORIES],
    ["listings_cosmetic_known", COSMETIC_GRADES],
    ["listings_service_known", SERVICE_STATES],
    ["listing_photos_status_known", PHOTO_STATUSES],
    ["workshops_verification_known", WORKSHOP_STATUSES],
  ])("%s lists exactly shared/catalogue's values", async (name, values) => {
    expect((await constraintValues(name)).sort()).toEqual([...values].sort());
  });
});

describe("catalogue rows the database refuses", () => {
  let t: Transaction;
  let sellerId: string;

  beforeAll(async () => {
    t = await sequelize.transaction();
    const seller = await User.create(
      {
        email: `model-check-${process.pid}@example.test`,
        displayName: "Model Check",
        roles: ["buyer", "seller"],
        passwordHash: null,
        emailVerifiedAt: null,
        lastSignInAt: null,
      },
      { transaction: t },
    );
    sellerId = seller.id;
  });
  afterAll(async () => {
    await t.rollback(); // nothing from this file stays behind
  });

  // Each attempt in its own savepoint, so one refusal does not abort the others.
  async function refused(run: (t: Transaction) => Promise<unknown>): Promise<string> {
    const sp = await sequelize.transaction({ transaction: t });
    try {
      await run(sp);
      await sp.commit();
      return "accepted";
    } catch (error) {
      await sp.rollback();
      return String((error as { parent?: { constraint?: string } }).parent?.constraint ?? error);
    }
  }

  const draft = (extra: Parameters<typeof blankListing>[2] = {}) => blankListing(sellerId, "turntable", extra);

  it("lets a draft be almost empty, but not go live without price, condition and location", async () => {
    expect(await refused((tx) => Listing.create(draft(), { transaction: tx }))).toBe("accepted");
    expect(
      await refused((tx) =>
        Listing.create(draft({ status: "live", maker: "Quorvane", model: "Orrel Three", publishedAt: new Date() }), { transaction: tx }),
      ),
    ).toBe("listings_publishable");
  });

  it("refuses a held listing without a reason, and money that is not a positive whole number of minor units", async () => {
    const full = {
      status: "held" as const,
      maker: "Quorvane",
      model: "Orrel Three",
      priceMinor: 42_000,
      country: "GB",
      cosmeticGrade: "clean" as const,
      serviceState: "serviced_measured" as const,
      publishedAt: new Date(),
    };
    expect(await refused((tx) => Listing.create(draft(full), { transaction: tx }))).toBe("listings_held_has_reason");
    expect(await refused((tx) => Listing.create(draft({ priceMinor: 0 }), { transaction: tx }))).toBe("listings_price_minor_check");
  });

  it("refuses a ready photo without its sizes, and a second cover", async () => {
    const listing = await Listing.create(draft(), { transaction: t });
    const photo = (position: number, extra: Partial<ListingPhoto> = {}) => ({
      listingId: listing.id,
      position,
      originalKey: `originals/photos/x${position}.jpg`,
      thumbKey: null,
      listingKey: null,
      zoomKey: null,
      contentType: "image/jpeg",
      byteSize: 1,
      width: null,
      height: null,
      phash: null,
      error: null,
      ...extra,
    });
    expect(await refused((tx) => ListingPhoto.create(photo(0, { status: "ready" }), { transaction: tx }))).toBe(
      "listing_photos_ready_has_sizes",
    );
    expect(await refused((tx) => ListingPhoto.create(photo(0, { isCover: true }), { transaction: tx }))).toBe("accepted");
    expect(await refused((tx) => ListingPhoto.create(photo(1, { isCover: true }), { transaction: tx }))).toBe("listing_photos_one_cover");
  });
});
