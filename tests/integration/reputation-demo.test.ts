import { afterAll, describe, expect, it, vi } from "vitest";

// The demo scenario's completed sales: each walked through the real order steps, so every one is
// released and paid out with a ledger that sums to zero and an empty escrow; three models have enough
// sales for the sold-price index; the reviews (some answered) are there; a second run adds nothing.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const { Listing, Order, Review } = await import("~/models/index.server");
const { balancesFor } = await import("~/orders/ledger.server");
const { soldPriceIndex } = await import("~/reputation/price-index.server");
const { ensureBucket } = await import("~/services/storage.server");
const { seedDemo } = await import("../../db/seeds/demo");
const { DEMO_SALES } = await import("../../db/seeds/demo-sales");

afterAll(() => sequelize.close());

async function demoSaleOrders() {
  const listings = await Listing.findAll({ where: { serialNumber: DEMO_SALES.map((s) => s.serial) }, attributes: ["id", "status"] });
  const orders = await Order.findAll({ where: { listingId: listings.map((l) => l.id) } });
  return { listings, orders };
}

describe("the demo scenario's completed sales", () => {
  it("are released and paid out through the order steps, each ledger balanced and escrow empty", async () => {
    await ensureBucket();
    await seedDemo(); // loaded by the test stack already, unless run alone
    const { listings, orders } = await demoSaleOrders();
    expect(listings).toHaveLength(DEMO_SALES.length);
    expect(listings.every((l) => l.status === "sold")).toBe(true);
    expect(orders).toHaveLength(DEMO_SALES.length);
    for (const order of orders) {
      expect(order.state).toBe("released");
      const b = await balancesFor(order.id);
      const total: number = order.totalMinor;
      expect(b).toEqual({
        buyer: -total,
        escrow: 0,
        platform_fees: order.feeMinor,
        seller_payable: 0,
        seller_paid: total - order.feeMinor!,
      });
      const [{ events }] = await sequelize.query<{ events: number }>(
        `SELECT count(*)::int AS events FROM order_events WHERE order_id = :id`,
        {
          replacements: { id: order.id },
          type: (await import("sequelize")).QueryTypes.SELECT,
        },
      );
      // reserved, funded, shipped, arrived, audition, released, paid out
      expect(events).toBe(7);
    }
    expect(await Review.count({ where: { orderId: orders.map((o) => o.id) } })).toBe(DEMO_SALES.filter((s) => s.review).length);
  });

  it("give three demo models a sold-price index", async () => {
    for (const [maker, model, atLeast] of [
      ["Carrowain", "WQ 46i", 4],
      ["Vantrell", "Velt 35", 3],
      ["Quorvane", "Orrel Three", 3],
    ] as const) {
      const index = await soldPriceIndex(maker, model, "GBP");
      expect(index?.all.count, `${maker} ${model}`).toBeGreaterThanOrEqual(atLeast);
    }
    // Carrowain WQ 46i: £640, £675, £710 bench-verified and £480 not.
    expect((await soldPriceIndex("Carrowain", "WQ 46i", "GBP"))?.verified).toMatchObject({ count: 3, medianMinor: 67_500 });
  });

  it("are not sold twice by a second run", async () => {
    const before = await demoSaleOrders();
    await seedDemo();
    const after = await demoSaleOrders();
    expect(after.orders.map((o) => o.id).sort()).toEqual(before.orders.map((o) => o.id).sort());
  });
});
