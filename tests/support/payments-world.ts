import { randomBytes } from "node:crypto";
import { Listing, Order, User } from "~/models/index.server";
import { LedgerEntry } from "~/models/ledger-entry.server";
import { setPaymentsClient } from "~/services/payments.server";
import { attachCheckout, reserveUnit } from "~/orders/transitions.server";
import { createCheckout, ensurePayoutAccount } from "~/orders/provider.server";
import { syncPayoutAccount } from "~/payments/payouts.server";
import { processPaymentEvent } from "~/payments/process-event.server";
import { refundOrder, releaseOrder } from "~/payments/release.server";
import { signatureHeader, type RunningStripeFake } from "../../fakes/stripe/index";
import type { StripeObject } from "../../fakes/stripe/store";
import { blankListing } from "./blank-listing";
import { testClock, type TestClock } from "./clock";
import { routeArgs } from "./route-args";
import { FAKE_WEBHOOK_SECRET, payOnPage, startTestFake, type TestFake } from "./stripe-fake";

// A buying world for the payments suites: a stand-in whose clock is the orders' test clock, the app's
// payments client pointed at it, a connected seller, a buyer and live units. Webhooks are not sent by
// the stand-in: the test hands each event to the webhook route itself (signed, as the stand-in would),
// in whatever order and as often as it likes, and processes the recorded events (the 'payment-event' job).

const RUN = randomBytes(3).toString("hex");
let counter = 0;

export interface World extends TestFake {
  clock: TestFake["clock"] & { app: TestClock };
  seller: User;
  buyer: User;
  /** Events handed to the webhook route so far (by id). */
  delivered: Set<string>;
}

export async function startWorld(start = "2026-12-30T10:00:00Z"): Promise<World> {
  const app = testClock(start);
  const t = await startTestFake({ clock: () => Math.floor(app.now().getTime() / 1000) });
  setPaymentsClient(t.stripe);
  const seller = await user("seller", ["buyer", "seller"]);
  const buyer = await user("buyer", ["buyer"]);
  await connect(seller, t.fake);
  await seller.reload();
  return { ...t, clock: { ...t.clock, app }, seller, buyer, delivered: new Set() };
}

export async function stopWorld(world: World | undefined): Promise<void> {
  setPaymentsClient(undefined);
  await world?.fake.stop();
}

async function user(label: string, roles: ("buyer" | "seller")[]): Promise<User> {
  counter++;
  return User.create({
    email: `pay-${RUN}-${label}-${counter}@example.test`,
    displayName: `Payments test ${label}`,
    passwordHash: null,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
    roles,
  });
}

/** Connects the seller's payout account through the stand-in's onboarding page. */
async function connect(seller: User, fake: RunningStripeFake): Promise<void> {
  const accountId = await ensurePayoutAccount(seller);
  const { payments } = await import("~/services/payments.server");
  const link = await payments().accountLinks.create({ account: accountId, type: "account_onboarding", return_url: `${fake.url}/` });
  await fetch(link.url, { method: "POST", body: new URLSearchParams({ business_name: "Test bench" }), redirect: "manual" });
  await syncPayoutAccount(accountId);
}

/** A live unit of the seller's at `priceMinor` GBP, parcel delivery at `deliveryMinor` in the domestic zone. */
export async function liveUnit(world: World, priceMinor = 90_000, deliveryMinor = 4_500): Promise<Listing> {
  counter++;
  return Listing.create(
    blankListing(world.seller.id, "power_amplifier", {
      status: "live",
      maker: "Testbridge",
      model: `PA-${counter}`,
      priceMinor,
      currency: "GBP",
      country: "GB",
      town: "Testham",
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      publishedAt: world.clock.app.now(),
      handlingDays: 3,
      shippingOptions: [{ method: "parcel", prices: { domestic: deliveryMinor } }],
    }),
  );
}

/** Reserves the unit for the buyer and opens its Checkout Session, as the checkout page does. */
export async function checkout(world: World, listing: Listing): Promise<{ order: Order; url: string; sessionId: string }> {
  const order = await reserveUnit(
    { listingId: listing.id, buyerId: world.buyer.id, deliveryMethod: "parcel", deliveryZone: "domestic" },
    world.clock.app,
  );
  const session = await createCheckout(order, { successUrl: "http://127.0.0.1:3000/purchases/x", cancelUrl: "http://127.0.0.1:3000/" });
  await attachCheckout(order.id, { checkoutSessionId: session.id });
  return { order, url: session.url, sessionId: session.id };
}

export async function pay(url: string, number = "4242 4242 4242 4242"): Promise<number> {
  return (await payOnPage(url, number)).status;
}

/** The stand-in's events not yet handed to the app, oldest first. */
export function newEvents(world: World): StripeObject[] {
  return world.fake.store
    .all("event")
    .reverse()
    .filter((e) => !world.delivered.has(e.id));
}

/** Hands one event to the webhook route as the stand-in would (signed body); returns the HTTP status. */
export async function deliver(world: World, event: StripeObject): Promise<number> {
  const { action } = await import("~/routes/api.v1.webhooks.stripe");
  const body = JSON.stringify(Object.fromEntries(Object.entries(event).filter(([k]) => !k.startsWith("_"))));
  const request = new Request("http://127.0.0.1/api/v1/webhooks/stripe", {
    method: "POST",
    headers: { "content-type": "application/json", "stripe-signature": signatureHeader(body, FAKE_WEBHOOK_SECRET) },
    body,
  });
  const response = await action(routeArgs(request, {}));
  world.delivered.add(event.id);
  return response.status;
}

/** Runs the 'payment-event' jobs the webhook route queued for this world's events, as the worker would. */
export async function processRecorded(world: World): Promise<number> {
  return runQueued<{ eventId: string }>(
    "payment-event",
    (d) => world.delivered.has(d.eventId),
    (d) => processPaymentEvent(d.eventId, world.clock.app, () => {}),
  );
}

/** Runs the payout and refund jobs the order transitions queued for these orders. */
export async function runMoneyJobs(world: World, orderIds: string[]): Promise<void> {
  const mine = (d: { orderId: string }) => orderIds.includes(d.orderId);
  await runQueued<{ orderId: string; amountMinor: number }>("order-release", mine, (d) =>
    releaseOrder(d.orderId, d.amountMinor, world.clock.app),
  );
  await runQueued<{ orderId: string; amountMinor: number; refundNo: number }>("order-refund", mine, (d) =>
    refundOrder(d.orderId, d.amountMinor, d.refundNo, world.clock.app),
  );
}

/** Delivers every new event once, in order, and processes them: a clean webhook stream. */
export async function deliverClean(world: World): Promise<void> {
  for (const e of newEvents(world)) await deliver(world, e);
  await processRecorded(world);
}

/** Every new event twice, the batch reversed, processed between and after: a messy webhook stream. */
export async function deliverMessy(world: World): Promise<void> {
  const batch = newEvents(world).reverse();
  for (const e of batch) await deliver(world, e);
  await processRecorded(world);
  for (const e of [...batch].reverse()) await deliver(world, e);
  await processRecorded(world);
}

/** The order's state and its ledger as comparable values (no ids or times). */
export async function snapshotOrder(orderId: string) {
  const order = await Order.findByPk(orderId, { rejectOnEmpty: true });
  const entries = await LedgerEntry.findAll({ where: { orderId }, order: [["seq", "ASC"]] });
  const ledger = entries.map((e) => `${e.kind} ${e.account} ${e.amountMinor}`).sort();
  const sum = entries.reduce((s, e) => s + e.amountMinor, 0);
  return {
    state: order.state,
    refundedMinor: order.refundedMinor,
    funded: Boolean(order.chargeId),
    paidOut: Boolean(order.transferId),
    ledger,
    sum,
  };
}

/**
 * Runs this world's waiting jobs of one queue through `handler`, as the worker would (the integration
 * suite runs no worker); jobs of other suites' orders are left alone. Returns how many ran.
 */
export async function runQueued<T>(queue: string, mine: (data: T) => boolean, handler: (data: T) => Promise<unknown>): Promise<number> {
  const { sequelize } = await import("~/db.server");
  const { getBoss } = await import("~/services/jobs.server");
  await getBoss();
  let ran = 0;
  for (;;) {
    const [rows] = await sequelize.query(`SELECT id, data FROM pgboss.job WHERE name = $1 AND state = 'created' ORDER BY created_on, id`, {
      bind: [queue],
    });
    const jobs = (rows as { id: string; data: T }[]).filter((r) => mine(r.data));
    if (jobs.length === 0) return ran;
    for (const job of jobs) {
      await handler(job.data);
      await sequelize.query(`DELETE FROM pgboss.job WHERE name = $1 AND id = $2`, { bind: [queue, job.id] });
      ran++;
    }
  }
}
