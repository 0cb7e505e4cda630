import { randomBytes } from "node:crypto";
import { afterAll, describe, expect, it, vi } from "vitest";

// Reviews through their service: only the buyer of a released order rates, once; only its seller
// answers, once; a refusal writes nothing; a moderator's hiding takes the review off the seller's page
// and out of the average, and leaves an audit record with the note.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const { HttpError } = await import("~/http/errors.server");
const { Review } = await import("~/models/index.server");
const r = await import("~/reputation/reviews.server");
const { sellerProfile, ratingOf } = await import("~/reputation/profile.server");
const { testClock } = await import("../support/clock");
const { orderIn, person, liveUnit } = await import("./orders-support");

afterAll(() => sequelize.close());

const clock = testClock("2026-12-30T10:00:00Z");
const good = { rating: "5", body: "Measured as the sheet said. Packed with care." };

async function notFoundOf(call: () => Promise<unknown>) {
  try {
    await call();
  } catch (e) {
    if (e instanceof HttpError) return e.status;
    throw e;
  }
  return "no refusal";
}

describe("the buyer's review", () => {
  it("is refused before the money is released, with the reason beside the form", async () => {
    const { c, order } = await orderIn("audition", clock);
    const done = await r.writeReview(c.buyer.id, order.id, good, clock);
    expect(done).toEqual({ ok: false, status: 409, errors: { form: expect.stringMatching(/once the money has been released/) } });
    expect(await Review.count({ where: { orderId: order.id } })).toBe(0);
  });

  it("is written once after release; a second is refused and the first stays as it was", async () => {
    const { c, order } = await orderIn("released", clock);
    expect(await r.writeReview(c.buyer.id, order.id, good, clock)).toEqual({ ok: true });
    const again = await r.writeReview(c.buyer.id, order.id, { rating: "1", body: "Changed my mind." }, clock);
    expect(again).toMatchObject({ ok: false, status: 409 });
    const rows = await Review.findAll({ where: { orderId: order.id } });
    expect(rows.map((x) => [x.rating, x.body, x.sellerId])).toEqual([[5, good.body, c.seller.id]]);
  });

  it("is someone else's order to the seller, a stranger and a missing id: a 404, nothing written", async () => {
    const { c, order } = await orderIn("released", clock);
    expect(await notFoundOf(() => r.writeReview(c.seller.id, order.id, good, clock))).toBe(404);
    expect(await notFoundOf(() => r.writeReview(c.stranger.id, order.id, good, clock))).toBe(404);
    expect(await notFoundOf(() => r.writeReview(c.buyer.id, "not-an-id", good, clock))).toBe(404);
    expect(await notFoundOf(() => r.reviewPage(c.stranger.id, order.id, "buyer"))).toBe(404);
    expect(await Review.count({ where: { orderId: order.id } })).toBe(0);
  });

  it("takes a rating of 1 to 5 and a text of 1 to 1,000 characters", async () => {
    const { c, order } = await orderIn("released", clock);
    for (const rating of ["0", "6", "4.5", "", "five"]) {
      const done = await r.writeReview(c.buyer.id, order.id, { ...good, rating }, clock);
      expect(done, rating).toMatchObject({ ok: false, status: 400, errors: { rating: "Choose a rating from 1 to 5." } });
    }
    expect(await r.writeReview(c.buyer.id, order.id, { ...good, body: "   " }, clock)).toMatchObject({
      errors: { body: expect.any(String) },
    });
    expect(await r.writeReview(c.buyer.id, order.id, { ...good, body: "x".repeat(1001) }, clock)).toMatchObject({
      errors: { body: expect.any(String) },
    });
    expect(await Review.count({ where: { orderId: order.id } })).toBe(0);
    expect(await r.writeReview(c.buyer.id, order.id, { rating: "1", body: "x".repeat(1000) }, clock)).toEqual({ ok: true });
  });
});

describe("the seller's answer", () => {
  it("comes once, from the seller only, and only to a review that exists", async () => {
    const { c, order } = await orderIn("released", clock);
    expect(await r.answerReview(c.seller.id, order.id, { answer: "Thank you." }, clock)).toMatchObject({ ok: false, status: 409 });
    await r.writeReview(c.buyer.id, order.id, good, clock);
    expect(await notFoundOf(() => r.answerReview(c.buyer.id, order.id, { answer: "Me again." }, clock))).toBe(404);
    expect(await notFoundOf(() => r.answerReview(c.stranger.id, order.id, { answer: "Hello." }, clock))).toBe(404);
    expect(await r.answerReview(c.seller.id, order.id, { answer: "" }, clock)).toMatchObject({
      status: 400,
      errors: { answer: expect.any(String) },
    });
    expect(await r.answerReview(c.seller.id, order.id, { answer: "Thank you, enjoy it." }, clock)).toEqual({ ok: true });
    expect(await r.answerReview(c.seller.id, order.id, { answer: "And another thing." }, clock)).toMatchObject({ ok: false, status: 409 });
    const page = await r.reviewPage(c.buyer.id, order.id, "buyer");
    expect(page.review).toMatchObject({ rating: 5, answer: "Thank you, enjoy it.", answeredAt: clock.now().toISOString() });
  });
});

describe("hiding a review", () => {
  it("needs a note, takes the review off the seller's page and out of the average, and is audited", async () => {
    const { c, order } = await orderIn("released", clock);
    await r.writeReview(c.buyer.id, order.id, { rating: "1", body: "Abusive words about the seller." }, clock);
    // A second sale of the same seller, rated 5, so the average moves when the first is hidden.
    const second = await liveUnit(c.seller.id);
    const buyer2 = await person("buyer2");
    const t = await import("~/orders/transitions.server");
    let o2 = await t.reserveUnit(
      { listingId: second.id, buyerId: buyer2.id, deliveryMethod: "collection", deliveryZone: "domestic" },
      clock,
    );
    o2 = await t.markFunded(
      o2.id,
      {
        paymentIntentId: `pi_${o2.id}`,
        chargeId: `ch_${o2.id}`,
        amountMinor: o2.totalMinor,
        currency: o2.currency,
        eventId: `evt_${o2.id}`,
      },
      clock,
    );
    await t.markShipped(o2.id, c.seller.id, { carrier: "Parcelwise", trackingNumber: "PW1" }, clock);
    await t.confirmArrival(o2.id, buyer2.id, clock);
    await t.acceptUnit(o2.id, buyer2.id, clock);
    await r.writeReview(buyer2.id, o2.id, { rating: "5", body: "Spot on." }, clock);
    expect(await ratingOf(c.seller.id)).toEqual({ average: 3, count: 2 });

    const review = await Review.findOne({ where: { orderId: order.id }, rejectOnEmpty: true });
    expect(await r.hideReview(c.moderator.id, review.id, { note: "  " }, clock)).toMatchObject({
      status: 400,
      errors: { note: expect.any(String) },
    });
    expect((await review.reload()).hiddenAt).toBeNull();

    expect(await r.hideReview(c.moderator.id, review.id, { note: "Insults, no account of the sale." }, clock)).toEqual({ ok: true });
    expect(await r.hideReview(c.moderator.id, review.id, { note: "Again." }, clock)).toMatchObject({ ok: false, status: 409 });
    expect(await ratingOf(c.seller.id)).toEqual({ average: 5, count: 1 });
    const profile = await sellerProfile(c.seller.id);
    if (!profile || "redirect" in profile) throw new Error("expected the seller's page");
    expect(profile.reviews.map((x) => x.body)).toEqual(["Spot on."]);
    expect(profile.completedSales).toBe(2);
    const [audit] = await sequelize.query<{ action: string; note: string; actor_id: string }>(
      `SELECT action, note, actor_id FROM audit_records WHERE subject_type = 'review' AND subject_id = :id`,
      { replacements: { id: review.id }, type: (await import("sequelize")).QueryTypes.SELECT },
    );
    expect(audit).toEqual({ action: "hide_review", note: "Insults, no account of the sale.", actor_id: c.moderator.id });
    // Its two sides still see it, with the note.
    expect((await r.reviewPage(c.buyer.id, order.id, "buyer")).review?.hidden?.note).toBe("Insults, no account of the sale.");
  });
});

describe("a seller's page", () => {
  it("counts completed sales, the bench-verified share of units put in the market, and lists live units", async () => {
    const { c } = await orderIn("released", clock);
    await liveUnit(c.seller.id, { benchVerified: true });
    await liveUnit(c.seller.id, { status: "draft", benchVerified: false });
    const profile = await sellerProfile(c.seller.id);
    if (!profile || "redirect" in profile) throw new Error("expected the seller's page");
    // The sold unit (not verified) and the live verified one; the draft never was in the market.
    expect(profile.verified).toEqual({ listings: 2, benchVerified: 1 });
    expect(profile.completedSales).toBe(1);
    expect(profile.live).toHaveLength(1);
    expect(profile.rating).toEqual({ average: null, count: 0 });
  });

  it("is a 404 for a buyer-only account, a suspended seller and a malformed id", async () => {
    const { c } = await orderIn("released", clock);
    expect(await sellerProfile(c.buyer.id)).toBeNull();
    expect(await sellerProfile(`nope-${randomBytes(2).toString("hex")}`)).toBeNull();
    await c.seller.update({ status: "suspended" });
    expect(await sellerProfile(c.seller.id)).toBeNull();
  });
});
