import { afterAll, describe, expect, it, vi } from "vitest";
import { UniqueConstraintError } from "sequelize";

// Every transition's guard: from a state it does not start from, by someone who is not the side it
// belongs to, or before its deadline, it is refused and writes nothing (the order's row, timeline,
// ledger, contest, jobs and its unit's status are as before). Also the database's own guards.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const { ORDER_STATES } = await import("@shared/orders");
const t = await import("~/orders/transitions.server");
const { testClock } = await import("../support/clock");
const { footprint, orderIn, refusalOf } = await import("./orders-support");
type Reachable = import("./orders-support").Reachable;
type Cast = import("./orders-support").Cast;
type Order = import("~/models/index.server").Order;
type TestClock = import("../support/clock").TestClock;

afterAll(() => sequelize.close());

type Call = (o: Order, c: Cast, clock: TestClock, who: "right" | "stranger") => Promise<unknown>;

const ship = { carrier: "Parcelwise", trackingNumber: "PW1" };
const payment = (o: Order) => ({
  paymentIntentId: `pi_other_${o.id}`,
  chargeId: `ch_other_${o.id}`,
  amountMinor: o.totalMinor,
  currency: o.currency,
  eventId: "evt_x",
});

/** Each transition, the states it starts from, and the person who may take it (null: the system or provider). */
const TRANSITIONS: Record<string, { from: Reachable[]; call: Call; person: boolean }> = {
  markShipped: {
    from: ["funded"],
    person: true,
    call: (o, c, k, w) => t.markShipped(o.id, w === "right" ? c.seller.id : c.stranger.id, ship, k),
  },
  confirmArrival: {
    from: ["shipped"],
    person: true,
    call: (o, c, k, w) => t.confirmArrival(o.id, w === "right" ? c.buyer.id : c.stranger.id, k),
  },
  acceptUnit: { from: ["audition"], person: true, call: (o, c, k, w) => t.acceptUnit(o.id, w === "right" ? c.buyer.id : c.stranger.id, k) },
  contestOrder: {
    from: ["audition"],
    person: true,
    call: (o, c, k, w) => t.contestOrder(o.id, w === "right" ? c.buyer.id : c.stranger.id, { reason: "Crackles." }, k),
  },
  resolveContest: {
    from: ["contested"],
    person: true,
    call: (o, c, k, w) => t.resolveContest(o.id, w === "right" ? c.moderator.id : c.stranger.id, { refundMinor: 1_000, note: "Part." }, k),
  },
  markFunded: { from: ["reserved"], person: false, call: (o, _c, k) => t.markFunded(o.id, payment(o), k) },
  lapseReservation: { from: ["reserved"], person: false, call: (o, _c, k) => t.lapseReservation(o.id, k) },
  cancelUnshipped: { from: ["funded"], person: false, call: (o, _c, k) => t.cancelUnshipped(o.id, k) },
  assumeArrival: { from: ["shipped"], person: false, call: (o, _c, k) => t.assumeArrival(o.id, k) },
  closeAudition: { from: ["audition"], person: false, call: (o, _c, k) => t.closeAudition(o.id, k) },
  markReleased: { from: ["released"], person: false, call: (o, _c, k) => t.markReleased(o.id, { transferId: `tr_other_${o.id}` }, k) },
  markRefunded: {
    from: ["refunded"],
    person: false,
    call: (o, _c, k) => t.markRefunded(o.id, { refundId: `re_other_${o.id}`, amountMinor: 1 }, k),
  },
};

const STATES: Reachable[] = ["reserved", "funded", "shipped", "audition", "contested", "released", "refunded", "cancelled"];

describe("from a state it does not start from, each transition is refused and writes nothing", () => {
  it.each(STATES)(
    "an order that is %s",
    async (state) => {
      const clock = testClock();
      const { c, order } = await orderIn(state, clock);
      // Far past every deadline, so only the state can be the reason.
      clock.advanceDays(60);
      const before = await footprint(order.id);
      for (const [name, tr] of Object.entries(TRANSITIONS)) {
        if (tr.from.includes(state)) continue;
        // markFunded on a lapsed (cancelled) order is the late payment, which is taken and refunded: tested elsewhere.
        if (name === "markFunded" && state === "cancelled") continue;
        expect(await refusalOf(() => tr.call(order, c, clock, "right")), `${name} on ${state}`).toBe("order_state");
        expect(await footprint(order.id), `${name} on ${state}`).toEqual(before);
      }
    },
    60_000,
  );
});

describe("by anyone but its side, each person's transition is refused and writes nothing", () => {
  it.each(Object.entries(TRANSITIONS).filter(([, tr]) => tr.person))("%s", async (name, tr) => {
    const clock = testClock();
    const { c, order } = await orderIn(tr.from[0], clock);
    const before = await footprint(order.id);
    const code = await refusalOf(() => tr.call(order, c, clock, "stranger"));
    // Someone else's order is a 404 to a buyer or seller; the moderator's step checks the role.
    expect(code).toBe(name === "resolveContest" ? "forbidden" : "not_found");
    expect(await footprint(order.id)).toEqual(before);
  });

  it("the buyer cannot ship and the seller cannot accept, confirm arrival or contest", async () => {
    const clock = testClock();
    const funded = await orderIn("funded", clock);
    expect(await refusalOf(() => t.markShipped(funded.order.id, funded.c.buyer.id, ship, clock))).toBe("not_found");
    const shipped = await orderIn("shipped", clock);
    expect(await refusalOf(() => t.confirmArrival(shipped.order.id, shipped.c.seller.id, clock))).toBe("not_found");
    const audition = await orderIn("audition", clock);
    const before = await footprint(audition.order.id);
    expect(await refusalOf(() => t.acceptUnit(audition.order.id, audition.c.seller.id, clock))).toBe("not_found");
    expect(await refusalOf(() => t.contestOrder(audition.order.id, audition.c.seller.id, { reason: "x" }, clock))).toBe("not_found");
    expect(await refusalOf(() => t.resolveContest(audition.order.id, audition.c.moderator.id, { refundMinor: 0, note: "x" }, clock))).toBe(
      "order_state",
    );
    expect(await footprint(audition.order.id)).toEqual(before);
  });
});

describe("before its deadline, each deadline's step is refused and writes nothing", () => {
  it.each([
    ["reserved", "lapseReservation", (o: Order, k: TestClock) => t.lapseReservation(o.id, k)],
    ["funded", "cancelUnshipped", (o: Order, k: TestClock) => t.cancelUnshipped(o.id, k)],
    ["shipped", "assumeArrival", (o: Order, k: TestClock) => t.assumeArrival(o.id, k)],
    ["audition", "closeAudition", (o: Order, k: TestClock) => t.closeAudition(o.id, k)],
  ] as const)("%s: %s", async (state, _name, call) => {
    const clock = testClock();
    const { order } = await orderIn(state, clock);
    clock.advanceMinutes(29);
    const before = await footprint(order.id);
    expect(await refusalOf(() => call(order, clock))).toBe("order_state");
    expect(await footprint(order.id)).toEqual(before);
  });

  it("the seller cannot ship after the handling time; the buyer cannot contest after the window", async () => {
    const clock = testClock();
    const funded = await orderIn("funded", clock);
    clock.advanceDays(2);
    clock.advance(1);
    expect(await refusalOf(() => t.markShipped(funded.order.id, funded.c.seller.id, ship, clock))).toBe("order_state");
    const audition = await orderIn("audition", clock);
    clock.advanceDays(3);
    expect(await refusalOf(() => t.contestOrder(audition.order.id, audition.c.buyer.id, { reason: "Late." }, clock))).toBe("order_state");
    expect(await footprint(audition.order.id)).toMatchObject({ contests: 0 });
  });
});

describe("a moderator's decision", () => {
  it("needs a note and a refund between 0 and the total", async () => {
    const clock = testClock();
    const { c, order } = await orderIn("contested", clock);
    const before = await footprint(order.id);
    const resolve = (refundMinor: number, note: string) =>
      refusalOf(() => t.resolveContest(order.id, c.moderator.id, { refundMinor, note }, clock));
    expect(await resolve(1_000, "   ")).toBe("invalid");
    expect(await resolve(-1, "Because.")).toBe("order_state");
    expect(await resolve(order.totalMinor + 1, "Because.")).toBe("order_state");
    expect(await resolve(10.5, "Because.")).toBe("order_state");
    expect(await footprint(order.id)).toEqual(before);
  });
});

describe("the database's own guards", () => {
  it("lists the same order states as shared/orders.ts", async () => {
    const [[row]] = await sequelize.query(
      `SELECT pg_get_constraintdef(oid) AS def FROM pg_constraint WHERE conname = 'orders_state_known'`,
    );
    const listed = [...(row as { def: string }).def.matchAll(/'([a-z_]+)'/g)].map((m) => m[1]);
    expect(listed.sort()).toEqual([...ORDER_STATES].sort());
  });

  it("refuses a second order holding the same unit, whatever the code above it does", async () => {
    const clock = testClock();
    const { c, order } = await orderIn("funded", clock);
    const { Order: OrderModel } = await import("~/models/index.server");
    const copy = {
      ...order.get({ plain: true }),
      id: undefined,
      buyerId: c.stranger.id,
      state: "reserved" as const,
      paymentIntentId: null,
      chargeId: null,
    };
    const error: unknown = await OrderModel.create(copy).then(
      () => null,
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(UniqueConstraintError);
    expect(error instanceof UniqueConstraintError && error.parent).toMatchObject({ constraint: "orders_one_holder_idx" });
  });

  it("ledger entries and timeline rows cannot be changed or removed, and an unbalanced movement is refused at commit", async () => {
    const clock = testClock();
    const { order } = await orderIn("funded", clock);
    await expect(
      sequelize.query(`UPDATE ledger_entries SET amount_minor = amount_minor + 1 WHERE order_id = $1`, { bind: [order.id] }),
    ).rejects.toThrow(/append-only/);
    await expect(sequelize.query(`DELETE FROM ledger_entries WHERE order_id = $1`, { bind: [order.id] })).rejects.toThrow(/append-only/);
    await expect(sequelize.query(`UPDATE order_events SET note = 'x' WHERE order_id = $1`, { bind: [order.id] })).rejects.toThrow(
      /append-only/,
    );
    await expect(sequelize.query(`DELETE FROM order_events WHERE order_id = $1`, { bind: [order.id] })).rejects.toThrow(/append-only/);
    await expect(
      sequelize.query(
        `INSERT INTO ledger_entries (order_id, movement_id, kind, account, amount_minor, currency, at)
         VALUES ($1, gen_random_uuid(), 'refund', 'buyer', 100, 'EUR', now())`,
        { bind: [order.id] },
      ),
    ).rejects.toThrow(/does not balance/);
    const { ledgerCheck } = await import("./orders-support");
    expect(await ledgerCheck(order.id)).toEqual({ total: 0, unbalanced: 0 });
  });
});
