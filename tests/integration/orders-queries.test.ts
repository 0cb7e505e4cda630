import { afterAll, describe, expect, it, vi } from "vitest";

// Reading orders: the buyer's purchases, the seller's sales, one order with its timeline, ledger and
// contest for its buyer, its seller or a moderator, and the same 404 for anyone else. Also the
// checkout session attached to a reservation.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const t = await import("~/orders/transitions.server");
const { orderFor, purchasesFor, salesFor } = await import("~/orders/queries.server");
const { testClock } = await import("../support/clock");
const { orderIn, refusalOf } = await import("./orders-support");

afterAll(() => sequelize.close());

describe("purchases, sales and one order", () => {
  it("each side sees its own; a moderator sees any; anyone else gets a 404", async () => {
    const clock = testClock();
    const { c, order } = await orderIn("contested", clock);
    expect((await purchasesFor(c.buyer.id)).map((o) => o.id)).toEqual([order.id]);
    expect((await salesFor(c.seller.id)).map((o) => o.id)).toEqual([order.id]);
    expect(await purchasesFor(c.seller.id)).toEqual([]);

    const asBuyer = await orderFor(c.buyer.id, order.id, "buyer");
    expect(asBuyer.events.map((e) => e.toState)).toEqual(["reserved", "funded", "shipped", "arrived", "audition", "contested"]);
    expect(asBuyer.ledger.map((l) => [l.kind, l.account, l.amountMinor])).toEqual([
      ["buyer_payment", "buyer", -50_500],
      ["buyer_payment", "escrow", 50_500],
    ]);
    expect(asBuyer.contest?.reason).toBe("Left channel hums.");
    expect(asBuyer.seller?.displayName).toBe(c.seller.displayName);
    expect((await orderFor(c.seller.id, order.id, "seller")).order.id).toBe(order.id);
    expect((await orderFor(c.moderator.id, order.id, "moderator")).order.id).toBe(order.id);

    expect(await refusalOf(() => orderFor(c.stranger.id, order.id, "buyer"))).toBe("not_found");
    expect(await refusalOf(() => orderFor(c.buyer.id, order.id, "seller"))).toBe("not_found");
    expect(await refusalOf(() => orderFor(c.buyer.id, "nonsense", "buyer"))).toBe("not_found");
  });
});

describe("the checkout session", () => {
  it("is attached once to a reservation; the same id again is harmless, another or a late one refused", async () => {
    const clock = testClock();
    const { order } = await orderIn("reserved", clock);
    expect((await t.attachCheckout(order.id, { checkoutSessionId: `cs_${order.id}` })).checkoutSessionId).toBe(`cs_${order.id}`);
    expect((await t.attachCheckout(order.id, { checkoutSessionId: `cs_${order.id}` })).checkoutSessionId).toBe(`cs_${order.id}`);
    expect(await refusalOf(() => t.attachCheckout(order.id, { checkoutSessionId: "cs_other" }))).toBe("order_state");
    const funded = await orderIn("funded", clock);
    expect(await refusalOf(() => t.attachCheckout(funded.order.id, { checkoutSessionId: "cs_late" }))).toBe("order_state");
  });
});
