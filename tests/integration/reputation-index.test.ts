import { randomBytes } from "node:crypto";
import { afterAll, describe, expect, it, vi } from "vitest";

// The sold-price index from orders walked through the real steps: median, range and count, split by
// the bench-verified mark, shown from three sales; sales with a part refund left out; maker and model
// matched whatever their case and spacing; sales in another currency converted with the admin's rates.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const t = await import("~/orders/transitions.server");
const { soldPriceIndex } = await import("~/reputation/price-index.server");
const { currentRates } = await import("~/currencies/rates.server");
const { convertMinor } = await import("@shared/currency");
const { testClock } = await import("../support/clock");
const { person, seller: newSeller, liveUnit } = await import("./orders-support");

afterAll(() => sequelize.close());

const clock = testClock("2026-12-30T10:00:00Z");

/** A unit of `maker`/`model` sold at `priceMinor` (collection, so the total is the price); `refund` part-refunds it through a contest. */
async function sale(
  maker: string,
  model: string,
  priceMinor: number,
  opts: { verified?: boolean; currency?: string; refund?: number; stopInAudition?: boolean } = {},
) {
  const s = await newSeller();
  const buyer = await person("buyer");
  const unit = await liveUnit(s.id, { maker, model, priceMinor, currency: opts.currency ?? "EUR", benchVerified: opts.verified ?? false });
  let order = await t.reserveUnit({ listingId: unit.id, buyerId: buyer.id, deliveryMethod: "collection", deliveryZone: "domestic" }, clock);
  const ref = order.id;
  order = await t.markFunded(
    order.id,
    { paymentIntentId: `pi_${ref}`, chargeId: `ch_${ref}`, amountMinor: order.totalMinor, currency: order.currency, eventId: `evt_${ref}` },
    clock,
  );
  await t.markShipped(order.id, s.id, { carrier: "Parcelwise", trackingNumber: "PW1" }, clock);
  order = await t.confirmArrival(order.id, buyer.id, clock);
  if (opts.stopInAudition) return order;
  if (opts.refund) {
    await t.contestOrder(order.id, buyer.id, { reason: "Scratches not shown." }, clock);
    const moderator = await person("moderator", ["moderator"]);
    return t.resolveContest(order.id, moderator.id, { refundMinor: opts.refund, note: "Part refund for the scratches." }, clock);
  }
  return t.acceptUnit(order.id, buyer.id, clock);
}

const model = () => `Index ${randomBytes(3).toString("hex")}`;

describe("the sold-price index", () => {
  it("needs three completed sales before it says anything", async () => {
    const m = model();
    await sale("Brannock Audio", m, 40_000);
    await sale("Brannock Audio", m, 50_000);
    expect(await soldPriceIndex("Brannock Audio", m, "EUR")).toBeNull();
    await sale("Brannock Audio", m, 60_000);
    expect(await soldPriceIndex("Brannock Audio", m, "EUR")).toMatchObject({
      currency: "EUR",
      all: { count: 3, medianMinor: 50_000, lowMinor: 40_000, highMinor: 60_000 },
    });
  });

  it("splits by the bench-verified mark, an even count's median being the mean of the middle two", async () => {
    const m = model();
    await sale("Brannock Audio", m, 70_000, { verified: true });
    await sale("Brannock Audio", m, 80_000, { verified: true });
    await sale("Brannock Audio", m, 45_000);
    await sale("Brannock Audio", m, 30_000);
    expect(await soldPriceIndex("brannock  audio", ` ${m.toUpperCase()} `, "EUR")).toEqual({
      currency: "EUR",
      all: { count: 4, medianMinor: 57_500, lowMinor: 30_000, highMinor: 80_000 },
      verified: { count: 2, medianMinor: 75_000, lowMinor: 70_000, highMinor: 80_000 },
      unverified: { count: 2, medianMinor: 37_500, lowMinor: 30_000, highMinor: 45_000 },
    });
  });

  it("leaves out a sale settled with a part refund, and a sale still in its audition window", async () => {
    const m = model();
    await sale("Brannock Audio", m, 40_000);
    await sale("Brannock Audio", m, 42_000);
    await sale("Brannock Audio", m, 44_000, { refund: 10_000 });
    await sale("Brannock Audio", m, 48_000, { stopInAudition: true });
    expect(await soldPriceIndex("Brannock Audio", m, "EUR")).toBeNull();
    await sale("Brannock Audio", m, 46_000);
    expect((await soldPriceIndex("Brannock Audio", m, "EUR"))?.all).toEqual({
      count: 3,
      medianMinor: 42_000,
      lowMinor: 40_000,
      highMinor: 46_000,
    });
  });

  it("converts sales made in another currency with the admin's rates", async () => {
    const m = model();
    await sale("Brannock Audio", m, 40_000);
    await sale("Brannock Audio", m, 50_000);
    await sale("Brannock Audio", m, 30_000, { currency: "GBP" });
    const gbpInEur = convertMinor(30_000, "GBP", "EUR", await currentRates())!;
    expect(gbpInEur).toBeGreaterThan(30_000);
    const index = await soldPriceIndex("Brannock Audio", m, "EUR");
    const sorted = [40_000, 50_000, gbpInEur].sort((a, b) => a - b);
    expect(index?.all).toEqual({ count: 3, medianMinor: sorted[1], lowMinor: sorted[0], highMinor: sorted[2] });
  });
});
