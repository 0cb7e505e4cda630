import { afterAll, describe, expect, it, vi } from "vitest";

// Checkout's reservation: one buyer per unit however many try at once, the refusals for units that
// cannot be bought, and the 30-minute lapse (moved by the test clock) that returns the unit to the market.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const { Listing, Order, OrderEvent } = await import("~/models/index.server");
const { QUEUES } = await import("~/services/jobs.server");
const t = await import("~/orders/transitions.server");
const { runDeadline } = await import("~/orders/deadlines.server");
const { testClock } = await import("../support/clock");
const { cast, footprint, jobsFor, liveUnit, person, refusalOf, reserve, seller } = await import("./orders-support");

afterAll(() => sequelize.close());

describe("50 buyers at once", () => {
  it("exactly one reserves the unit; the others are refused and nothing of theirs is written", async () => {
    const clock = testClock();
    const s = await seller();
    const listing = await liveUnit(s.id);
    const buyers = await Promise.all(Array.from({ length: 50 }, (_, i) => person(`crowd${i}`)));
    const results = await Promise.allSettled(
      buyers.map((b) => t.reserveUnit({ listingId: listing.id, buyerId: b.id, deliveryMethod: "parcel", deliveryZone: "domestic" }, clock)),
    );
    const won = results.filter((r) => r.status === "fulfilled");
    const lost = results.filter((r): r is PromiseRejectedResult => r.status === "rejected");
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(49);
    expect(new Set(lost.map((r) => (r.reason as { code?: string }).code))).toEqual(new Set(["order_state"]));
    // Refused by the listing's lock and status, not merely by the unique index behind them.
    expect(new Set(lost.map((r) => (r.reason as Error).message))).toEqual(
      new Set(["Another buyer is checking out this unit. If they do not pay in time it returns to the market."]),
    );
    const orders = await Order.findAll({ where: { listingId: listing.id } });
    expect(orders).toHaveLength(1);
    expect(await OrderEvent.count({ where: { orderId: orders[0].id } })).toBe(1);
    expect((await Listing.findByPk(listing.id))?.status).toBe("reserved");
    // One reservation deadline, so one checkout can ever be made for it.
    expect(await jobsFor(QUEUES.orderDeadline, orders[0].id)).toHaveLength(1);
  }, 60_000);
});

describe("the reservation", () => {
  it("holds the price and delivery for the buyer's zone, for 30 minutes", async () => {
    const clock = testClock("2026-12-30T10:00:00Z");
    const c = await cast();
    const order = await t.reserveUnit(
      { listingId: c.listing.id, buyerId: c.buyer.id, deliveryMethod: "parcel", deliveryZone: "nearby" },
      clock,
    );
    expect(order).toMatchObject({ state: "reserved", priceMinor: 48_000, deliveryMinor: 4_000, currency: "EUR", sellerId: c.seller.id });
    expect(order.reservedUntil.toISOString()).toBe("2026-12-30T10:30:00.000Z");
    const [deadline] = await jobsFor(QUEUES.orderDeadline, order.id);
    expect(deadline.data).toEqual({ orderId: order.id, kind: "reservation" });
    expect(new Date(deadline.startAfter).toISOString()).toBe("2026-12-30T10:30:00.000Z");
  });

  it("collection costs nothing; a method or zone the seller does not offer is refused", async () => {
    const clock = testClock();
    const c = await cast();
    const collect = await t.reserveUnit(
      { listingId: c.listing.id, buyerId: c.buyer.id, deliveryMethod: "collection", deliveryZone: "worldwide" },
      clock,
    );
    expect(collect.deliveryMinor).toBe(0);
    const d = await cast();
    const reserveWith = (method: "freight" | "parcel", zone: "worldwide" | "domestic") =>
      t.reserveUnit({ listingId: d.listing.id, buyerId: d.buyer.id, deliveryMethod: method, deliveryZone: zone }, clock);
    expect(await refusalOf(() => reserveWith("freight", "domestic"))).toBe("invalid");
    expect(await refusalOf(() => reserveWith("parcel", "worldwide"))).toBe("invalid");
    expect((await Listing.findByPk(d.listing.id))?.status).toBe("live");
  });

  it("refuses held, draft, withdrawn, sold and reserved units, one's own, and a seller without payouts", async () => {
    const clock = testClock();
    const s = await seller();
    const buyer = await person("buyer");
    const attempt = (listingId: string, buyerId = buyer.id) =>
      refusalOf(() => t.reserveUnit({ listingId, buyerId, deliveryMethod: "parcel", deliveryZone: "domestic" }, clock));
    for (const [status, code] of [
      ["held", "order_state"],
      ["withdrawn", "order_state"],
      ["sold", "order_state"],
      ["reserved", "order_state"],
      ["removed", "not_found"],
    ] as const) {
      const unit = await liveUnit(s.id, { status, heldReason: status === "held" ? "Checking the sheet" : null });
      expect(await attempt(unit.id), status).toBe(code);
    }
    const draft = await liveUnit(s.id, { status: "draft" });
    expect(await attempt(draft.id)).toBe("not_found");
    const own = await liveUnit(s.id);
    expect(await attempt(own.id, s.id)).toBe("order_state");
    const unconnected = await person("unconnected", ["seller"], false);
    const theirs = await liveUnit(unconnected.id);
    expect(await attempt(theirs.id)).toBe("order_state");
    expect(await attempt("not-an-id")).toBe("not_found");
    expect(await Order.count({ where: { buyerId: buyer.id } })).toBe(0);
    expect((await Listing.findByPk(theirs.id))?.status).toBe("live");
  });
});

describe("a reserved listing", () => {
  it("cannot be edited or withdrawn by its seller while a buyer holds it", async () => {
    const clock = testClock();
    const c = await cast();
    await reserve(c, clock);
    const { saveItem, withdrawListing } = await import("~/listings/drafts.server");
    expect(await refusalOf(() => saveItem(c.listing.id, c.seller.id, { priceMinor: 99_000 }))).toBe("conflict");
    expect(await refusalOf(() => withdrawListing(c.listing.id, c.seller.id))).toBe("conflict");
    expect(await Listing.findByPk(c.listing.id)).toMatchObject({ status: "reserved", priceMinor: 48_000 });
  });
});

describe("an accepted offer", () => {
  async function acceptedOffer(
    c: { listing: { id: string }; buyer: { id: string }; seller: { id: string } },
    amountMinor: number,
    checkoutUntil: string,
  ) {
    const [[row]] = await sequelize.query(
      `INSERT INTO offers (listing_id, buyer_id, seller_id, amount_minor, currency, made_by, state, expires_at, accepted_at, checkout_until)
       VALUES ($1, $2, $3, $4, 'EUR', 'buyer', 'accepted', $5, $5, $5) RETURNING id`,
      { bind: [c.listing.id, c.buyer.id, c.seller.id, amountMinor, checkoutUntil] },
    );
    return (row as { id: string }).id;
  }
  const offerState = async (id: string) => {
    const [[row]] = await sequelize.query(`SELECT state FROM offers WHERE id = $1`, { bind: [id] });
    return (row as { state: string }).state;
  };

  it("sets the price for its buyer within its checkout window, and is spent by the reservation", async () => {
    const clock = testClock("2026-12-30T10:00:00Z");
    const c = await cast();
    const offerId = await acceptedOffer(c, 41_000, "2026-12-31T10:00:00Z");
    const order = await reserve(c, clock);
    expect(order).toMatchObject({ priceMinor: 41_000, deliveryMinor: 2_500, offerId });
    expect(await offerState(offerId)).toBe("used");
  });

  it("does not apply after its checkout window, nor to another buyer", async () => {
    const clock = testClock("2026-12-30T10:00:00Z");
    const c = await cast();
    const late = await acceptedOffer(c, 41_000, "2026-12-30T09:59:00Z");
    const order = await reserve(c, clock);
    expect(order).toMatchObject({ priceMinor: 48_000, offerId: null });
    expect(await offerState(late)).toBe("accepted");
    const d = await cast();
    const theirs = await acceptedOffer({ ...d, buyer: d.stranger }, 30_000, "2026-12-31T10:00:00Z");
    expect((await reserve(d, clock)).priceMinor).toBe(48_000);
    expect(await offerState(theirs)).toBe("accepted");
  });
});

describe("the lapse", () => {
  it("at 29 minutes the deadline job only waits; at 30 the order is cancelled and the unit is live again", async () => {
    const clock = testClock("2026-12-30T10:00:00Z");
    const c = await cast();
    const order = await reserve(c, clock);
    const [deadline] = await jobsFor(QUEUES.orderDeadline, order.id);

    clock.advanceMinutes(29);
    const before = await footprint(order.id);
    expect(await runDeadline(deadline.data, clock)).toBe("not_due");
    expect(await refusalOf(() => t.lapseReservation(order.id, clock))).toBe("order_state");
    const after = await footprint(order.id);
    expect(after.order).toEqual(before.order);
    expect(after.listing).toBe("reserved");

    clock.advanceMinutes(1);
    expect(await runDeadline(deadline.data, clock)).toBe("done");
    const lapsed = await Order.findByPk(order.id, { rejectOnEmpty: true });
    expect(lapsed.state).toBe("cancelled");
    expect(lapsed.closedAt?.toISOString()).toBe("2026-12-30T10:30:00.000Z");
    expect((await Listing.findByPk(c.listing.id))?.status).toBe("live");
    const events = await OrderEvent.findAll({ where: { orderId: order.id }, order: [["seq", "ASC"]] });
    expect(events.map((e) => [e.fromState, e.toState, e.actorKind])).toEqual([
      [null, "reserved", "buyer"],
      ["reserved", "cancelled", "system"],
    ]);
    // The buyer is told; the seller heard nothing of the reservation and hears nothing of its lapse.
    expect((await jobsFor(QUEUES.orderMail, order.id)).map((j) => j.data.to)).toEqual(["buyer"]);

    // The unit is back in the market: another buyer can reserve it.
    const next = await person("next");
    const again = await t.reserveUnit(
      { listingId: c.listing.id, buyerId: next.id, deliveryMethod: "parcel", deliveryZone: "domestic" },
      clock,
    );
    expect(again.state).toBe("reserved");
  });

  it("a payment that arrives before the lapse job runs still funds the order", async () => {
    const clock = testClock();
    const c = await cast();
    const order = await reserve(c, clock);
    clock.advanceMinutes(31);
    const { fund } = await import("./orders-support");
    expect((await fund(order, clock)).state).toBe("funded");
    const [deadline] = await jobsFor(QUEUES.orderDeadline, order.id);
    expect(await runDeadline(deadline.data, clock)).toBe("moved_on");
    expect((await Listing.findByPk(c.listing.id))?.status).toBe("reserved");
  });

  it("a payment after the lapse is recorded and refunded in whole; the unit stays with its next holder", async () => {
    const clock = testClock();
    const c = await cast();
    const order = await reserve(c, clock);
    clock.advanceMinutes(30);
    await t.lapseReservation(order.id, clock);
    const next = await person("next");
    await t.reserveUnit({ listingId: c.listing.id, buyerId: next.id, deliveryMethod: "parcel", deliveryZone: "domestic" }, clock);
    const { fund, ledgerCheck } = await import("./orders-support");
    const late = await fund(order, clock);
    expect(late.state).toBe("cancelled");
    expect((await jobsFor(QUEUES.orderRefund, order.id)).map((j) => j.data)).toEqual([
      { orderId: order.id, amountMinor: order.totalMinor, refundNo: 1 },
    ]);
    expect(await ledgerCheck(order.id)).toEqual({ total: 0, unbalanced: 0 });
    expect((await Listing.findByPk(c.listing.id))?.status).toBe("reserved");
  });
});
