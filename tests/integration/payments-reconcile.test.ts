import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import path from "node:path";
import { sequelize } from "~/db.server";
import { Order } from "~/models/index.server";
import { move } from "~/orders/ledger.server";
import { acceptUnit, confirmArrival, markShipped } from "~/orders/transitions.server";
import { reconcile } from "~/payments/reconcile.server";
import { checkout, deliverClean, liveUnit, pay, runMoneyJobs, startWorld, stopWorld, type World } from "../support/payments-world";

// `npm run reconcile`: the ledger per order against the provider's charges, refunds and transfers.
// A clean world agrees; a ledger broken on purpose (a refund the provider never made, a transfer
// recorded larger than made) and a refund made behind the ledger's back are each reported, and the
// command exits non-zero.

describe("reconcile", () => {
  let world: World;
  let released: Order;
  let broken: Order;

  beforeAll(async () => {
    world = await startWorld("2026-12-30T08:00:00Z");
    const a = await checkout(world, await liveUnit(world, 80_000, 4_000));
    const b = await checkout(world, await liveUnit(world, 20_000, 1_000));
    expect(await pay(a.url)).toBe(303);
    expect(await pay(b.url)).toBe(303);
    await deliverClean(world);
    await markShipped(a.order.id, world.seller.id, { carrier: "Test Freight", trackingNumber: "R1" }, world.clock.app);
    await confirmArrival(a.order.id, world.buyer.id, world.clock.app);
    await acceptUnit(a.order.id, world.buyer.id, world.clock.app);
    await runMoneyJobs(world, [a.order.id]);
    await deliverClean(world);
    released = (await Order.findByPk(a.order.id))!;
    broken = (await Order.findByPk(b.order.id))!;
  });
  afterAll(async () => {
    await stopWorld(world);
  });

  const scope = () => ({ stripe: world.stripe, orderIds: [released.id, broken.id] });

  function runCli(orderIds: string[]): Promise<{ code: number | null; out: string }> {
    const args = ["--import", "tsx", path.resolve("scripts/reconcile.ts"), ...orderIds.flatMap((id) => ["--order", id])];
    const child = spawn(process.execPath, args, {
      env: { ...process.env, FAKE_STRIPE_PORT: String(world.fake.port), STRIPE_SECRET_KEY: "" },
      stdio: ["ignore", "pipe", "pipe"],
    });
    let out = "";
    child.stdout.on("data", (c) => (out += c));
    child.stderr.on("data", (c) => (out += c));
    return new Promise((resolve) => child.on("exit", (code) => resolve({ code, out })));
  }

  it("finds no difference when the ledger and the provider agree, and exits 0", async () => {
    expect(released).toMatchObject({ state: "released" });
    expect(await reconcile(scope())).toEqual([]);
    const cli = await runCli([released.id, broken.id]);
    expect(cli.out).toContain("The ledger and the payment provider agree.");
    expect(cli.code).toBe(0);
  }, 60_000);

  it("reports each difference of a deliberately broken ledger and exits non-zero", async () => {
    const at = world.clock.app.now();
    // A transfer the ledger records larger than the provider made it, and a refund the provider never made.
    const transfer = await world.stripe.transfers.create({
      amount: 1_000,
      currency: "gbp",
      destination: world.seller.payoutAccountId!,
      source_transaction: broken.chargeId!,
      transfer_group: `order_${broken.id}`,
      metadata: { order_id: broken.id },
    });
    await sequelize.transaction(async (transaction) => {
      await move(broken, "refund", "escrow", "buyer", 5_000, { providerRef: "re_neverhappened", at, transaction });
      await move(broken, "transfer", "seller_payable", "seller_paid", 1_200, { providerRef: transfer.id, at, transaction });
    });
    // A refund made at the provider behind the ledger's back.
    const refund = await world.stripe.refunds.create({ charge: broken.chargeId!, amount: 700, metadata: { order_id: broken.id } });

    const differences = await reconcile(scope());
    expect(differences.map((d) => [d.orderId, d.kind, d.providerRef, d.ledgerMinor, d.providerMinor]).sort()).toEqual(
      [
        [broken.id, "refund", "re_neverhappened", 5_000, null],
        [broken.id, "refund", refund.id, null, 700],
        [broken.id, "transfer", transfer.id, 1_200, 1_000],
      ].sort(),
    );
    // The released order is still in agreement.
    expect(differences.some((d) => d.orderId === released.id)).toBe(false);

    const cli = await runCli([released.id, broken.id]);
    expect(cli.code).toBe(1);
    expect(cli.out).toContain("3 differences");
    expect(cli.out).toContain(`the ledger's refund re_neverhappened is not at the provider`);
    expect(cli.out).toContain(`transfer to the seller ${transfer.id}: ledger 1200 GBP, provider 1000 GBP`);
    expect(cli.out).toContain(`the provider's refund ${refund.id} (700 GBP) is not in the ledger`);
  }, 60_000);
});
