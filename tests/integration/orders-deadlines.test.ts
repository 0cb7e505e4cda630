import { afterAll, describe, expect, it, vi } from "vitest";

// Deadlines are deferred 'order-deadline' jobs, each written with the change that sets it. Run as the
// worker would (the test clock stands in for time passing): a missed handling time cancels and queues
// the whole refund, no confirmation assumes arrival and opens the audition window, the window's end
// releases the money. A job run twice, late, early or after the people moved on changes nothing more.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const { Listing, Order, OrderEvent } = await import("~/models/index.server");
const { QUEUES } = await import("~/services/jobs.server");
const t = await import("~/orders/transitions.server");
const { runDeadline } = await import("~/orders/deadlines.server");
const { balancesFor } = await import("~/orders/ledger.server");
const { testClock } = await import("../support/clock");
const { footprint, jobsFor, ledgerCheck, orderIn } = await import("./orders-support");

afterAll(() => sequelize.close());

const DAY = 86_400_000;

async function deadline(orderId: string, kind: string) {
  const jobs = (await jobsFor(QUEUES.orderDeadline, orderId)).filter((j) => j.data.kind === kind);
  expect(jobs.length, `a ${kind} job`).toBeGreaterThan(0);
  return jobs[0];
}

describe("the handling time", () => {
  it("is the listing's handling days from payment; missed, the order is cancelled, the refund queued and the unit withdrawn", async () => {
    const clock = testClock("2026-12-30T10:00:00Z");
    const { c, order } = await orderIn("funded", clock);
    expect(order.shipBy?.toISOString()).toBe("2027-01-01T10:00:00.000Z");
    const job = await deadline(order.id, "ship_by");
    expect(new Date(job.startAfter).toISOString()).toBe("2027-01-01T10:00:00.000Z");

    clock.advance(2 * DAY - 1);
    expect(await runDeadline(job.data, clock)).toBe("not_due");
    expect((await Order.findByPk(order.id))?.state).toBe("funded");

    clock.advance(1);
    expect(await runDeadline(job.data, clock)).toBe("done");
    const cancelled = await Order.findByPk(order.id, { rejectOnEmpty: true });
    expect(cancelled.state).toBe("cancelled");
    expect((await jobsFor(QUEUES.orderRefund, order.id)).map((j) => j.data)).toEqual([
      { orderId: order.id, amountMinor: 50_500, refundNo: 1 },
    ]);
    expect((await Listing.findByPk(c.listing.id))?.status).toBe("withdrawn");
    const cancelEvent = await lastEventId(order.id);
    const mails = (await jobsFor(QUEUES.orderMail, order.id)).filter((j) => j.data.eventId === cancelEvent);
    expect(mails.map((j) => j.data.to).sort()).toEqual(["buyer", "seller"]);

    // PAYMENTS refunds; the ledger then shows escrow empty and the buyer whole.
    await t.markRefunded(order.id, { refundId: `re_${order.id}`, amountMinor: 50_500 }, clock);
    expect(await balancesFor(order.id)).toMatchObject({ buyer: 0, escrow: 0 });
    expect(await ledgerCheck(order.id)).toEqual({ total: 0, unbalanced: 0 });
  });

  it("does nothing once the seller has shipped", async () => {
    const clock = testClock();
    const { order } = await orderIn("shipped", clock);
    clock.advanceDays(5);
    const before = await footprint(order.id);
    expect(await runDeadline((await deadline(order.id, "ship_by")).data, clock)).toBe("moved_on");
    expect(await footprint(order.id)).toEqual(before);
  });
});

function lastEventId(orderId: string) {
  return OrderEvent.findOne({ where: { orderId }, order: [["seq", "DESC"]] }).then((e) => e?.id);
}

describe("arrival", () => {
  it("is assumed after the set days with no confirmation, and opens the audition window", async () => {
    const clock = testClock("2026-12-30T10:00:00Z");
    const { order } = await orderIn("shipped", clock);
    const job = await deadline(order.id, "arrival");
    expect(new Date(job.startAfter).toISOString()).toBe("2027-01-09T10:00:00.000Z");
    clock.advanceDays(10);
    expect(await runDeadline(job.data, clock)).toBe("done");
    const opened = await Order.findByPk(order.id, { rejectOnEmpty: true });
    expect(opened.state).toBe("audition");
    expect(opened.auditionEndsAt?.toISOString()).toBe("2027-01-12T10:00:00.000Z");
    const events = await OrderEvent.findAll({ where: { orderId: order.id }, order: [["seq", "ASC"]] });
    expect(events.slice(-2).map((e) => [e.fromState, e.toState, e.actorKind])).toEqual([
      ["shipped", "arrived", "system"],
      ["arrived", "audition", "system"],
    ]);
  });
});

describe("the audition window", () => {
  it("closes at its end with no contest: released, fee fixed, the transfer queued, the unit sold and its watchers told", async () => {
    const clock = testClock("2026-12-30T10:00:00Z");
    const { c, order } = await orderIn("audition", clock);
    const job = await deadline(order.id, "audition");
    expect(new Date(job.startAfter).toISOString()).toBe("2027-01-02T10:00:00.000Z");
    clock.advanceDays(3);
    expect(await runDeadline(job.data, clock)).toBe("done");
    const released = await Order.findByPk(order.id, { rejectOnEmpty: true });
    expect(released.state).toBe("released");
    // €505.00 × 8 % = €40.40.
    expect(released.feeMinor).toBe(4_040);
    expect((await jobsFor(QUEUES.orderRelease, order.id)).map((j) => j.data)).toEqual([{ orderId: order.id, amountMinor: 46_460 }]);
    expect(await balancesFor(order.id)).toEqual({
      buyer: -50_500,
      escrow: 0,
      platform_fees: 4_040,
      seller_payable: 46_460,
      seller_paid: 0,
    });
    expect((await Listing.findByPk(c.listing.id))?.status).toBe("sold");
    const [[notice]] = await sequelize.query(`SELECT data FROM pgboss.job WHERE name = $1 AND data->>'listingId' = $2`, {
      bind: [QUEUES.watchNotice, c.listing.id],
    });
    expect((notice as { data: unknown }).data).toEqual({ kind: "sold", listingId: c.listing.id });

    await t.markReleased(order.id, { transferId: `tr_${order.id}` }, clock);
    expect(await balancesFor(order.id)).toEqual({
      buyer: -50_500,
      escrow: 0,
      platform_fees: 4_040,
      seller_payable: 0,
      seller_paid: 46_460,
    });
  });

  it("does nothing after the buyer contested", async () => {
    const clock = testClock();
    const { order } = await orderIn("contested", clock);
    clock.advanceDays(4);
    const before = await footprint(order.id);
    expect(await runDeadline((await deadline(order.id, "audition")).data, clock)).toBe("moved_on");
    expect(await footprint(order.id)).toEqual(before);
  });
});

describe("deadline jobs are idempotent", () => {
  it.each([
    ["reserved", "reservation", 31 / (24 * 60)],
    ["funded", "ship_by", 3],
    ["shipped", "arrival", 11],
    ["audition", "audition", 4],
  ] as const)("a %s order's %s job run twice (and by two workers at once) takes its step once", async (state, kind, days) => {
    const clock = testClock();
    const { order } = await orderIn(state, clock);
    const job = await deadline(order.id, kind);
    clock.advance(days * DAY);
    const outcomes = await Promise.all([runDeadline(job.data, clock), runDeadline(job.data, clock)]);
    expect(outcomes.sort()).toEqual(["done", "moved_on"]);
    const after = await footprint(order.id);
    expect(await runDeadline(job.data, clock)).toBe("moved_on");
    expect(await footprint(order.id)).toEqual(after);
    expect(await ledgerCheck(order.id)).toEqual({ total: 0, unbalanced: 0 });
  });

  it("a job that fires early queues itself again for the deadline instead of acting", async () => {
    const clock = testClock("2026-12-30T10:00:00Z");
    const { order } = await orderIn("audition", clock);
    const job = await deadline(order.id, "audition");
    clock.advanceDays(1);
    expect(await runDeadline(job.data, clock)).toBe("not_due");
    const jobs = (await jobsFor(QUEUES.orderDeadline, order.id)).filter((j) => j.data.kind === "audition");
    expect(jobs).toHaveLength(2);
    expect(new Date(jobs[1].startAfter).toISOString()).toBe("2027-01-02T10:00:00.000Z");
    expect((await Order.findByPk(order.id))?.state).toBe("audition");
  });

  it("a job for an order that does not exist, or malformed data, does nothing or is refused", async () => {
    expect(await runDeadline({ orderId: "00000000-0000-4000-8000-000000000000", kind: "audition" })).toBe("moved_on");
    await expect(runDeadline({ orderId: "x", kind: "audition" })).rejects.toThrow();
  });
});
