import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Order } from "~/models/index.server";
import { acceptUnit, confirmArrival, lapseReservation, markShipped } from "~/orders/transitions.server";
import {
  checkout,
  deliverClean,
  deliverMessy,
  liveUnit,
  pay,
  runMoneyJobs,
  snapshotOrder,
  startWorld,
  stopWorld,
  type World,
} from "../support/payments-world";

// The same purchases twice: once with every webhook delivered once and in order, once with every
// webhook delivered twice and each batch in reverse order. End states and ledgers must be identical.
// The purchases: one paid (after a declined card) and taken to release, one paid a minute after its
// reservation lapsed (refunded automatically, never funded), one whose Checkout Session expired unpaid.

type Deliver = (world: World) => Promise<void>;

async function purchases(world: World, deliver: Deliver) {
  const day = 86_400_000;
  // 1. Declined, then paid; shipped, arrived, accepted; the seller paid.
  const a = await checkout(world, await liveUnit(world, 90_000, 4_500));
  expect(await pay(a.url, "4000 0000 0000 0002")).toBe(402);
  expect(await pay(a.url)).toBe(303);
  // The buyer is back from the payment page: that alone funds nothing.
  expect((await Order.findByPk(a.order.id))!.state).toBe("reserved");
  await deliver(world);
  expect((await Order.findByPk(a.order.id))!.state).toBe("funded");
  await markShipped(a.order.id, world.seller.id, { carrier: "Test Freight", trackingNumber: "TF123" }, world.clock.app);
  world.clock.app.advance(day);
  await confirmArrival(a.order.id, world.buyer.id, world.clock.app);
  await acceptUnit(a.order.id, world.buyer.id, world.clock.app);
  await runMoneyJobs(world, [a.order.id]);
  await deliver(world);

  // 2. The reservation lapses; the buyer pays in the minute the session outlives it.
  const b = await checkout(world, await liveUnit(world, 50_000, 2_000));
  world.clock.app.advanceMinutes(30);
  await lapseReservation(b.order.id, world.clock.app);
  expect(await pay(b.url)).toBe(303);
  await deliver(world);
  await runMoneyJobs(world, [b.order.id]);
  await deliver(world);

  // 3. Never paid: the session expires and its event arrives.
  const c = await checkout(world, await liveUnit(world, 30_000, 1_500));
  world.clock.app.advanceMinutes(32);
  await world.stripe.balance.retrieve(); // the stand-in notices the expiry on its next request
  await deliver(world);

  return Promise.all([a, b, c].map((x) => snapshotOrder(x.order.id)));
}

describe("payments webhooks delivered twice and out of order", () => {
  let world: World;

  beforeAll(async () => {
    world = await startWorld();
  });
  afterAll(async () => {
    await stopWorld(world);
  });

  it("reach the same end states and ledgers as a clean delivery", async () => {
    const clean = await purchases(world, deliverClean);
    const messy = await purchases(world, deliverMessy);
    expect(messy).toEqual(clean);

    const [released, late, expired] = clean;
    // 94,500 paid; 8 % fee (7,560) kept; 86,940 paid out to the seller.
    expect(released).toMatchObject({ state: "released", funded: true, paidOut: true, sum: 0 });
    expect(released.ledger).toEqual(
      [
        "buyer_payment buyer -94500",
        "buyer_payment escrow 94500",
        "platform_fee escrow -7560",
        "platform_fee platform_fees 7560",
        "seller_payable escrow -86940",
        "seller_payable seller_payable 86940",
        "transfer seller_payable -86940",
        "transfer seller_paid 86940",
      ].sort(),
    );
    expect(late).toMatchObject({ state: "cancelled", refundedMinor: 52_000, paidOut: false, sum: 0 });
    expect(late.ledger).toEqual(
      ["buyer_payment buyer -52000", "buyer_payment escrow 52000", "refund escrow -52000", "refund buyer 52000"].sort(),
    );
    expect(expired).toMatchObject({ state: "cancelled", funded: false, ledger: [], sum: 0 });
  });

  it("matches the provider's side: one charge and one transfer for the released order, the late payment refunded in whole", async () => {
    const transfers = await world.stripe.transfers.list({ limit: 100 });
    expect(transfers.data.map((t) => t.amount)).toEqual([86_940, 86_940]);
    const refunds = await world.stripe.refunds.list({ limit: 100 });
    expect(refunds.data.map((r) => r.amount)).toEqual([52_000, 52_000]);
    const charges = await world.stripe.charges.list({ limit: 100 });
    // Per purchase set: the declined attempt, the paid one, the late one.
    expect(charges.data.filter((c) => c.paid)).toHaveLength(4);
  });
});
