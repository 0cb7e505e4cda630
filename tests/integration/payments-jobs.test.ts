import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import path from "node:path";
import { LedgerEntry, Order } from "~/models/index.server";
import { acceptUnit, cancelUnshipped, confirmArrival, markShipped } from "~/orders/transitions.server";
import { checkoutExpiresAt, createCheckout, idempotencyKey, transferToSeller } from "~/orders/provider.server";
import { armFault, disarmFaults, InjectedFault } from "~/payments/faults.server";
import {
  checkout,
  deliverClean,
  liveUnit,
  pay,
  runMoneyJobs,
  runQueued,
  startWorld,
  stopWorld,
  type World,
} from "../support/payments-world";

// The provider calls and the jobs that make them: the Checkout Session's shape and key, and a failure
// between a provider call and the database write that follows — thrown, or the process killed — after
// which the retried job finds the same transfer or refund and completes the write, once.

describe("payments provider calls and jobs", () => {
  let world: World;

  beforeAll(async () => {
    world = await startWorld("2026-12-30T09:00:00Z");
  });
  afterEach(() => disarmFaults());
  afterAll(async () => {
    await stopWorld(world);
  });

  async function funded(price = 70_000, delivery = 3_000) {
    const c = await checkout(world, await liveUnit(world, price, delivery));
    expect(await pay(c.url)).toBe(303);
    await deliverClean(world);
    return c;
  }

  async function accepted() {
    const c = await funded();
    await markShipped(c.order.id, world.seller.id, { carrier: "Test Freight", trackingNumber: "TF1" }, world.clock.app);
    await confirmArrival(c.order.id, world.buyer.id, world.clock.app);
    await acceptUnit(c.order.id, world.buyer.id, world.clock.app);
    return c;
  }

  const ledgerKinds = async (orderId: string) =>
    (await LedgerEntry.findAll({ where: { orderId } })).map((e) => e.kind).filter((k, i, all) => all.indexOf(k) === i);

  it("opens a Checkout Session in the listing's currency with the unit and delivery, the order id and the reservation's end", async () => {
    const { order, sessionId } = await checkout(world, await liveUnit(world, 61_000, 2_500));
    const session = await world.stripe.checkout.sessions.retrieve(sessionId, { expand: ["line_items"] });
    expect(session).toMatchObject({
      currency: "gbp",
      amount_total: 63_500,
      metadata: { order_id: order.id },
      client_reference_id: order.id,
      success_url: "http://127.0.0.1:3000/purchases/x",
      expires_at: checkoutExpiresAt(order),
    });
    expect(session.line_items!.data.map((l) => [l.description, l.amount_total])).toEqual([
      [expect.stringMatching(/^Testbridge PA-/), 61_000],
      ["Parcel delivery (domestic)", 2_500],
    ]);
    // The session outlives the 30-minute reservation by the provider's minimum, never less.
    expect(session.expires_at).toBe(Math.floor(order.createdAt.getTime() / 1000) + 31 * 60);
    // The same order again (its session id not yet saved, as after a crash): the key returns the same session.
    const urls = { successUrl: "http://127.0.0.1:3000/purchases/x", cancelUrl: "http://127.0.0.1:3000/" };
    expect((await createCheckout(order, urls)).id).toBe(sessionId);
    // Saved and still open: the buyer is sent back to the same page; once it has closed, refused.
    const saved = (await Order.findByPk(order.id))!;
    expect(await createCheckout(saved, urls)).toEqual({ id: sessionId, url: session.url });
    await world.stripe.checkout.sessions.expire(sessionId);
    await expect(createCheckout(saved, urls)).rejects.toMatchObject({ code: "order_state" });
    expect(idempotencyKey.checkout(order.id)).toBe(`order:${order.id}:checkout`);
  });

  it("retries a release that failed after the transfer: the same transfer, recorded once", async () => {
    const { order } = await accepted();
    armFault("release:after-transfer");
    await expect(runMoneyJobs(world, [order.id])).rejects.toBeInstanceOf(InjectedFault);
    const transfers = () => world.stripe.transfers.list({ transfer_group: `order_${order.id}` }).then((l) => l.data);
    expect(await transfers()).toHaveLength(1);
    expect((await Order.findByPk(order.id))!.transferId).toBeNull();
    expect(await ledgerKinds(order.id)).not.toContain("transfer");

    await runMoneyJobs(world, [order.id]); // the job is still queued: the retry
    const [transfer] = await transfers();
    expect(await transfers()).toHaveLength(1);
    const after = (await Order.findByPk(order.id))!;
    expect(after.transferId).toBe(transfer.id);
    const entries = await LedgerEntry.findAll({ where: { orderId: order.id, kind: "transfer" } });
    expect(entries.map((e) => [e.account, e.amountMinor, e.providerRef]).sort()).toEqual(
      [
        ["seller_paid", transfer.amount, transfer.id],
        ["seller_payable", -transfer.amount, transfer.id],
      ].sort(),
    );
    // A transfer made again under the order's key is the same transfer, not a second one.
    const replay = await transferToSeller(after, transfer.amount);
    expect(replay.transferId).toBe(transfer.id);
  });

  it("retries a refund that failed after the provider refunded: the same refund, recorded once", async () => {
    const { order } = await funded(40_000, 2_000);
    world.clock.app.advanceDays(4); // the handling time passes unshipped
    await cancelUnshipped(order.id, world.clock.app);
    armFault("refund:after-refund");
    await expect(runMoneyJobs(world, [order.id])).rejects.toBeInstanceOf(InjectedFault);
    const charge = (await Order.findByPk(order.id))!.chargeId!;
    const refunds = () => world.stripe.refunds.list({ charge }).then((l) => l.data);
    expect(await refunds()).toHaveLength(1);
    expect((await Order.findByPk(order.id))!.refundedMinor).toBe(0);

    await runMoneyJobs(world, [order.id]);
    expect(await refunds()).toHaveLength(1);
    const after = (await Order.findByPk(order.id))!;
    expect(after).toMatchObject({ state: "cancelled", refundedMinor: 42_000 });
    const legs = await LedgerEntry.findAll({ where: { orderId: order.id, kind: "refund" } });
    expect(legs.map((e) => e.providerRef)).toEqual([(await refunds())[0].id, (await refunds())[0].id]);
    // The refund's own webhook afterwards changes nothing.
    await deliverClean(world);
    expect((await Order.findByPk(order.id))!.refundedMinor).toBe(42_000);
  });

  it("completes a release whose process was killed between the transfer and the database write", async () => {
    const { order } = await accepted();
    let job: { orderId: string; amountMinor: number } | undefined;
    // Take the queued job's data without running it; the killed process runs it.
    await runQueued<{ orderId: string; amountMinor: number }>(
      "order-release",
      (d) => d.orderId === order.id,
      async (d) => void (job = d),
    );
    const child = spawn(
      process.execPath,
      ["--import", "tsx", path.resolve("tests/support/release-child.ts"), job!.orderId, String(job!.amountMinor)],
      {
        env: { ...process.env, FAKE_STRIPE_PORT: String(world.fake.port), STRIPE_SECRET_KEY: "" },
        stdio: ["ignore", "pipe", "pipe"],
      },
    );
    let output = "";
    child.stdout.on("data", (c) => (output += c));
    child.stderr.on("data", (c) => (output += c));
    const signal = await new Promise<NodeJS.Signals | null>((resolve) => child.on("exit", (_code, sig) => resolve(sig)));
    expect(signal, output).toBe("SIGKILL");
    const made = await world.stripe.transfers.list({ transfer_group: `order_${order.id}` });
    expect(made.data).toHaveLength(1);
    expect((await Order.findByPk(order.id))!.transferId).toBeNull();

    // The worker's retry of the same job.
    const { releaseOrder } = await import("~/payments/release.server");
    await releaseOrder(job!.orderId, job!.amountMinor, world.clock.app);
    expect((await Order.findByPk(order.id))!.transferId).toBe(made.data[0].id);
    expect((await world.stripe.transfers.list({ transfer_group: `order_${order.id}` })).data).toHaveLength(1);
  }, 60_000);
});
