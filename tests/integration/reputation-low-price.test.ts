import { randomBytes } from "node:crypto";
import { afterAll, describe, expect, it, vi } from "vitest";

// The price check at publish: a unit priced under half the sold-price index's median for its maker
// and model (common practice, not a published figure) raises a low_price flag for the review desk with
// the index in its details; the unit itself goes live as it would have. At half the median, or with
// fewer than three sales to judge by, nothing is raised.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { saveBenchSheet } = await import("~/listings/bench.server");
const { saveItem } = await import("~/listings/drafts.server");
const { publishListing } = await import("~/listings/publish.server");
const { DeskFlag } = await import("~/models/index.server");
const { exampleIntegratedAmplifierSheet } = await import("@shared/bench");
const { AMP_ITEM, cleanUp, makeAccount, readyDraft, withOwnCaptures } = await import("./listing-support");
const { sale } = await import("./reputation-support");

afterAll(cleanUp);

async function publishAt(model: string, priceMinor: number) {
  const seller = await makeAccount(`low-price-${randomBytes(3).toString("hex")}`, ["workshop"]);
  const draft = await readyDraft(seller);
  await saveItem(draft.id, seller.user.id, { ...AMP_ITEM, model, priceMinor });
  await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
  const { listing } = await publishListing(draft.id, seller.session);
  return { listing, flags: await DeskFlag.findAll({ where: { listingId: listing.id } }) };
}

describe("the low-price flag at publish", () => {
  const model = `Low ${randomBytes(3).toString("hex")}`;

  it("is raised under half the median, with the index in its details, and the unit still goes live", async () => {
    await sale(AMP_ITEM.maker, model, 100_000, { verified: true });
    await sale(AMP_ITEM.maker, model, 110_000, { verified: true });
    await sale(AMP_ITEM.maker, model, 90_000);
    const { listing, flags } = await publishAt(model, 49_999);
    expect(listing.status).toBe("live");
    expect(flags.map((f) => [f.kind, f.reason, f.resolvedAt])).toEqual([["low_price", "below_sold_price_index", null]]);
    expect(flags[0].details).toMatchObject({
      priceMinor: 49_999,
      currency: "EUR",
      ratio: 0.5,
      thresholdMinor: 50_000,
      index: {
        all: { count: 3, medianMinor: 100_000, lowMinor: 90_000, highMinor: 110_000 },
        verified: { count: 2 },
        unverified: { count: 1 },
      },
    });
  });

  it("is not raised at half the median", async () => {
    const { flags } = await publishAt(model, 50_000);
    expect(flags).toEqual([]);
  });

  it("is not raised with fewer than three sales to judge by", async () => {
    const fresh = `Low ${randomBytes(3).toString("hex")}`;
    await sale(AMP_ITEM.maker, fresh, 100_000);
    await sale(AMP_ITEM.maker, fresh, 100_000);
    const { flags } = await publishAt(fresh, 10_000);
    expect(flags).toEqual([]);
  });
});
