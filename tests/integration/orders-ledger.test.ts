import { afterAll, describe, expect, it, vi } from "vitest";
import fc from "fast-check";

// The ledger balances after every path. fast-check (fixed seed) walks random sequences of steps — the
// people's, the provider's (payments replayed, payouts and refunds run twice), deadlines and time
// passing — over fresh orders; wrong steps must be refused. After every step each movement and the
// order's whole ledger sum to zero and no account goes the wrong side of zero; once settled, escrow is
// empty and every party holds exactly what the outcome says. Worked examples follow.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const { Order } = await import("~/models/index.server");
const { HttpError } = await import("~/http/errors.server");
const { QUEUES } = await import("~/services/jobs.server");
const t = await import("~/orders/transitions.server");
const { runDeadline } = await import("~/orders/deadlines.server");
const { balancesFor } = await import("~/orders/ledger.server");
const { testClock } = await import("../support/clock");
const { cast, fund, jobsFor, ledgerCheck, orderIn, reserve } = await import("./orders-support");
type Cast = import("./orders-support").Cast;
type TestClock = import("../support/clock").TestClock;

afterAll(() => sequelize.close());

const HOUR = 3_600_000;

interface World {
  c: Cast;
  orderId: string;
  clock: TestClock;
}

async function orderNow(w: World) {
  return Order.findByPk(w.orderId, { rejectOnEmpty: true });
}

/** PAYMENTS' side as its jobs would run it: each queued payout and refund, twice (a retried job). */
async function provider(w: World) {
  for (const job of await jobsFor(QUEUES.orderRelease, w.orderId)) {
    for (let i = 0; i < 2; i++) await t.markReleased(w.orderId, { transferId: `tr_${w.orderId}` }, w.clock);
    void job;
  }
  for (const job of await jobsFor(QUEUES.orderRefund, w.orderId)) {
    const { amountMinor, refundNo } = job.data as { amountMinor: number; refundNo: number };
    for (let i = 0; i < 2; i++) await t.markRefunded(w.orderId, { refundId: `re_${w.orderId}_${refundNo}`, amountMinor }, w.clock);
  }
}

async function deadlines(w: World) {
  for (const job of await jobsFor(QUEUES.orderDeadline, w.orderId)) await runDeadline(job.data, w.clock);
}

type Step = { kind: string; run: (w: World) => Promise<unknown> };

const stepArb: fc.Arbitrary<Step> = fc.oneof(
  fc.constant<Step>({ kind: "pay", run: async (w) => fund(await orderNow(w), w.clock) }),
  fc.constant<Step>({ kind: "pay with another payment", run: async (w) => fund(await orderNow(w), w.clock, "_b") }),
  fc.constant<Step>({
    kind: "ship",
    run: (w) => t.markShipped(w.orderId, w.c.seller.id, { carrier: "Parcelwise", trackingNumber: "PW9" }, w.clock),
  }),
  fc.constant<Step>({ kind: "confirm arrival", run: (w) => t.confirmArrival(w.orderId, w.c.buyer.id, w.clock) }),
  fc.constant<Step>({ kind: "accept", run: (w) => t.acceptUnit(w.orderId, w.c.buyer.id, w.clock) }),
  fc.constant<Step>({
    kind: "contest",
    run: (w) => t.contestOrder(w.orderId, w.c.buyer.id, { reason: "Hum on the left channel." }, w.clock),
  }),
  fc.double({ min: 0, max: 1, noNaN: true }).map<Step>((share) => ({
    kind: `resolve ${share.toFixed(2)}`,
    run: async (w) => {
      const o = await orderNow(w);
      const refundMinor = share < 0.15 ? 0 : share > 0.85 ? o.totalMinor : Math.round(o.totalMinor * share);
      return t.resolveContest(w.orderId, w.c.moderator.id, { refundMinor, note: "Decided on the evidence." }, w.clock);
    },
  })),
  fc.integer({ min: 1, max: 400 }).map<Step>((hours) => ({ kind: `wait ${hours} h`, run: async (w) => w.clock.advance(hours * HOUR) })),
  fc.constant<Step>({ kind: "deadlines", run: deadlines }),
  fc.constant<Step>({ kind: "provider", run: provider }),
);

async function expectBalanced(w: World, after: string) {
  expect(await ledgerCheck(w.orderId), after).toEqual({ total: 0, unbalanced: 0 });
  const b = await balancesFor(w.orderId);
  for (const account of ["escrow", "platform_fees", "seller_payable", "seller_paid"] as const)
    expect(b[account], `${account} after ${after}`).toBeGreaterThanOrEqual(0);
  expect(b.buyer, `buyer after ${after}`).toBeLessThanOrEqual(0);
}

describe("the ledger over random paths", () => {
  it("balances after every step and settles to what the outcome says", async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(stepArb, { minLength: 1, maxLength: 14 }), async (steps) => {
        const clock = testClock();
        const c = await cast();
        const w: World = { c, clock, orderId: (await reserve(c, clock)).id };
        for (const step of steps) {
          try {
            await step.run(w);
          } catch (error) {
            // A refused step is expected on a random path; anything else is a failure.
            if (!(error instanceof HttpError) || !["order_state", "not_found", "forbidden"].includes(error.code)) throw error;
          }
          await expectBalanced(w, step.kind);
        }
        // Settle: the moderator decides anything contested, time runs out every deadline, the provider catches up.
        if ((await orderNow(w)).state === "contested")
          await t.resolveContest(w.orderId, c.moderator.id, { refundMinor: 1_234, note: "Settled in the test." }, clock);
        for (let i = 0; i < 4; i++) {
          clock.advance(40 * 24 * HOUR);
          await deadlines(w);
          await provider(w);
        }
        await expectBalanced(w, "settling");
        const o = await orderNow(w);
        const b = await balancesFor(w.orderId);
        expect(["released", "refunded", "cancelled"]).toContain(o.state);
        expect(b.escrow).toBe(0);
        expect(b.seller_payable).toBe(0);
        const paid: number = o.paymentIntentId ? o.totalMinor : 0;
        expect(b.buyer).toBe(-paid + o.refundedMinor);
        expect(b.platform_fees).toBe(o.feeMinor ?? 0);
        expect(b.seller_paid).toBe(paid - o.refundedMinor - (o.feeMinor ?? 0));
        expect(!!o.transferId).toBe(b.seller_paid > 0);
      }),
      { numRuns: 40, seed: 9_2026, endOnFailure: true },
    );
  }, 240_000);
});

describe("worked examples", () => {
  it("a release: €505.00 paid, €40.40 fee, €464.60 paid out", async () => {
    const clock = testClock();
    const { order } = await orderIn("released", clock);
    await t.markReleased(order.id, { transferId: `tr_${order.id}` }, clock);
    expect(await balancesFor(order.id)).toEqual({
      buyer: -50_500,
      escrow: 0,
      platform_fees: 4_040,
      seller_payable: 0,
      seller_paid: 46_460,
    });
  });

  it("a part refund of €151.50 (30 %): fee on the €353.50 released is €28.28, the seller gets €325.22", async () => {
    const clock = testClock();
    const { c, order } = await orderIn("contested", clock);
    const resolved = await t.resolveContest(order.id, c.moderator.id, { refundMinor: 15_150, note: "Power 30 % under the sheet." }, clock);
    expect(resolved.state).toBe("refunded");
    expect((await jobsFor(QUEUES.orderRefund, order.id)).map((j) => j.data)).toEqual([
      { orderId: order.id, amountMinor: 15_150, refundNo: 1 },
    ]);
    expect((await jobsFor(QUEUES.orderRelease, order.id)).map((j) => j.data)).toEqual([{ orderId: order.id, amountMinor: 32_522 }]);
    // The jobs are what PAYMENTS' handlers read.
    const { OrderRefundJob, OrderReleaseJob } = await import("~/payments/jobs.server");
    for (const job of await jobsFor(QUEUES.orderRefund, order.id)) expect(OrderRefundJob.parse(job.data)).toEqual(job.data);
    for (const job of await jobsFor(QUEUES.orderRelease, order.id)) expect(OrderReleaseJob.parse(job.data)).toEqual(job.data);
    await t.markRefunded(order.id, { refundId: "re_part", amountMinor: 15_150 }, clock);
    await t.markReleased(order.id, { transferId: "tr_part" }, clock);
    expect(await balancesFor(order.id)).toEqual({
      buyer: -35_350,
      escrow: 0,
      platform_fees: 2_828,
      seller_payable: 0,
      seller_paid: 32_522,
    });
  });

  it("a whole refund: no fee, nothing to the seller, the unit withdrawn", async () => {
    const clock = testClock();
    const { order } = await orderIn("refunded", clock);
    expect(await jobsFor(QUEUES.orderRelease, order.id)).toEqual([]);
    await t.markRefunded(order.id, { refundId: "re_whole", amountMinor: 50_500 }, clock);
    await t.markRefunded(order.id, { refundId: "re_whole", amountMinor: 50_500 }, clock);
    expect(await balancesFor(order.id)).toEqual({ buyer: 0, escrow: 0, platform_fees: 0, seller_payable: 0, seller_paid: 0 });
    expect((await Order.findByPk(order.id))?.refundedMinor).toBe(50_500);
  });

  it("a payment replayed (the same webhook twice) is recorded once", async () => {
    const clock = testClock();
    const { order } = await orderIn("funded", clock);
    const again = await fund(order, clock);
    expect(again.version).toBe(order.version);
    expect(await balancesFor(order.id)).toMatchObject({ buyer: -50_500, escrow: 50_500 });
  });
});
