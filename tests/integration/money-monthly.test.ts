import { afterAll, describe, expect, it, vi } from "vitest";

// The money view's monthly sums against ledger rows counted by hand. One seller's four orders (and
// another seller's, which must not show) are funded through the real transitions at chosen times;
// release, payout and refund movements are then written with the ledger's own writer at chosen times,
// so every amount below is known without the fee rule or the payment provider.
vi.mock("~/services/mail.server", () => ({ sendMail: async () => ({ messageId: "test" }) }));

const { sequelize } = await import("~/db.server");
const t = await import("~/orders/transitions.server");
const { recordMovement } = await import("~/orders/ledger.server");
const { moneyByMonth } = await import("~/money/monthly.server");
const { moneyCsv } = await import("~/money/csv");
const { testClock } = await import("../support/clock");
const { fund, liveUnit, person, seller } = await import("./orders-support");
type Order = import("~/models/index.server").Order;

afterAll(() => sequelize.close());

const clock = testClock();

async function funded(sellerId: string, priceMinor: number, at: string, currency = "EUR"): Promise<Order> {
  clock.set(at);
  const listing = await liveUnit(sellerId, { priceMinor, currency, ...(currency === "GBP" ? { country: "GB" } : {}) });
  const buyer = await person("money-buyer");
  const order = await t.reserveUnit(
    { listingId: listing.id, buyerId: buyer.id, deliveryMethod: "collection", deliveryZone: "domestic" },
    clock,
  );
  return fund(order, clock);
}

async function movement(order: Order, kind: Parameters<typeof recordMovement>[1], legs: Parameters<typeof recordMovement>[2], at: string) {
  await sequelize.transaction((transaction) => recordMovement(order, kind, legs, { at: new Date(at), transaction }));
}

describe("the money view's months", () => {
  it("sums each month's movements and carries the balances from month to month", async () => {
    const s = await seller("money");
    const other = await seller("money-other");
    // A: €400.00 paid 10 Sep; released 3 Oct with a €32.00 fee (€368.00 to the seller); paid out 1 Nov 00:30 UTC.
    const a = await funded(s.id, 40_000, "2026-09-10T12:00:00Z");
    await movement(
      a,
      "platform_fee",
      [
        { account: "escrow", amountMinor: -3_200 },
        { account: "platform_fees", amountMinor: 3_200 },
      ],
      "2026-10-03T09:00:00Z",
    );
    await movement(
      a,
      "seller_payable",
      [
        { account: "escrow", amountMinor: -36_800 },
        { account: "seller_payable", amountMinor: 36_800 },
      ],
      "2026-10-03T09:00:00Z",
    );
    await movement(
      a,
      "transfer",
      [
        { account: "seller_payable", amountMinor: -36_800 },
        { account: "seller_paid", amountMinor: 36_800 },
      ],
      "2026-11-01T00:30:00Z",
    );
    // B: €250.00 paid 31 Oct 23:30 UTC (October, in UTC), refunded whole on 2 Nov.
    const b = await funded(s.id, 25_000, "2026-10-31T23:30:00Z");
    await movement(
      b,
      "refund",
      [
        { account: "escrow", amountMinor: -25_000 },
        { account: "buyer", amountMinor: 25_000 },
      ],
      "2026-11-02T10:00:00Z",
    );
    // C: €123.45 paid 15 Nov, still in escrow. E: £300 paid 20 Nov, still in escrow.
    await funded(s.id, 12_345, "2026-11-15T08:00:00Z");
    await funded(s.id, 30_000, "2026-11-20T08:00:00Z", "GBP");
    // Another seller's €990.00 in October.
    await funded(other.id, 99_000, "2026-10-10T08:00:00Z");

    const books = await moneyByMonth(s.id, { from: "2026-09", to: "2026-12" });
    expect(books.map((b) => b.currency)).toEqual(["EUR", "GBP"]);
    const eur = books[0];
    const row = (sales: number, refunds: number, fees: number, released: number, payouts: number, pending: number, awaiting: number) => ({
      salesMinor: sales,
      refundsMinor: refunds,
      feesMinor: fees,
      releasedMinor: released,
      payoutsMinor: payouts,
      pendingReleaseMinor: pending,
      awaitingPayoutMinor: awaiting,
    });
    expect(eur.months).toEqual([
      { month: "2026-09", ...row(40_000, 0, 0, 0, 0, 40_000, 0) },
      // 40 000 − 3 200 − 36 800 + 25 000 held; 36 800 released, not yet paid out.
      { month: "2026-10", ...row(25_000, 0, 3_200, 36_800, 0, 25_000, 36_800) },
      // 25 000 − 25 000 + 12 345 held; the payout empties what was released.
      { month: "2026-11", ...row(12_345, 25_000, 0, 0, 36_800, 12_345, 0) },
      { month: "2026-12", ...row(0, 0, 0, 0, 0, 12_345, 0) },
    ]);
    expect(eur.totals).toEqual({ salesMinor: 77_345, refundsMinor: 25_000, feesMinor: 3_200, releasedMinor: 36_800, payoutsMinor: 36_800 });
    expect(books[1].months.map((m) => [m.month, m.salesMinor, m.pendingReleaseMinor])).toEqual([
      ["2026-09", 0, 0],
      ["2026-10", 0, 0],
      ["2026-11", 30_000, 30_000],
      ["2026-12", 0, 30_000],
    ]);

    // A range starting later carries September's escrow in.
    const late = await moneyByMonth(s.id, { from: "2026-11", to: "2026-11" });
    expect(late[0].months).toEqual([{ month: "2026-11", ...row(12_345, 25_000, 0, 0, 36_800, 12_345, 0) }]);
    // The other seller's month.
    const theirs = await moneyByMonth(other.id, { from: "2026-10", to: "2026-10" });
    expect(theirs[0].months[0].salesMinor).toBe(99_000);

    const csv = moneyCsv(books).split("\r\n");
    expect(csv[0]).toBe(
      "Month,Month name,Currency,Sales (buyers' payments),Refunds to buyers,Loadline fees,Released to you,Paid out,Pending release at month end,Awaiting payout at month end",
    );
    expect(csv[2]).toBe("2026-10,Oct 2026,EUR,250.00,0.00,32.00,368.00,0.00,250.00,368.00");
    expect(csv[3]).toBe("2026-11,Nov 2026,EUR,123.45,250.00,0.00,0.00,368.00,123.45,0.00");
    expect(csv[7]).toBe("2026-11,Nov 2026,GBP,300.00,0.00,0.00,0.00,0.00,300.00,0.00");
  });
});
