import { randomBytes } from "node:crypto";
import type { CreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";
import { Listing, Order, User } from "~/models/index.server";
import type { Role } from "~/auth/roles";
import { HttpError } from "~/http/errors.server";
import { QUEUES } from "~/services/jobs.server";
import * as t from "~/orders/transitions.server";
import { blankListing } from "../support/blank-listing";
import type { TestClock } from "../support/clock";

// Shared by the orders suites: people and live units made straight in the database, an order walked to
// any state through the real transitions, and what a refusal must leave untouched. Orders are never
// deleted (their timeline and ledger are append-only); every run's rows carry their own emails.

export const RUN = randomBytes(4).toString("hex");
let n = 0;

export async function person(label: string, roles: Role[] = ["buyer"], payouts = false): Promise<User> {
  n++;
  return User.create({
    email: `orders-it-${RUN}-${label}-${n}@example.test`,
    displayName: `Orders ${label}`,
    passwordHash: null,
    roles,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
    payoutsEnabled: payouts,
    payoutAccountId: payouts ? `acct_test_${RUN}_${n}` : null,
  });
}

/** A seller with a connected payout account. */
export const seller = (label = "seller") => person(label, ["seller"], true);

/** A live amplifier: €480, parcel €25 at home / €40 nearby, collection free, 2 handling days. */
export async function liveUnit(sellerId: string, extra: Partial<CreationAttributes<Listing>> = {}): Promise<Listing> {
  return Listing.create(
    blankListing(sellerId, "integrated_amplifier", {
      status: "live",
      maker: "Brannock Audio",
      model: `BA-${randomBytes(2).toString("hex")}`,
      priceMinor: 48_000,
      currency: "EUR",
      country: "DE",
      town: "Heddelstein",
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      // Back-dated: the browser suite that follows opens demo units from the market's newest-first first page.
      publishedAt: new Date(Date.UTC(2020, 0, 1)),
      shippingOptions: [{ method: "parcel", prices: { domestic: 2_500, nearby: 4_000 } }, { method: "collection" }],
      handlingDays: 2,
      ...extra,
    }),
  );
}

export interface Cast {
  seller: User;
  buyer: User;
  stranger: User;
  moderator: User;
  listing: Listing;
}

export async function cast(): Promise<Cast> {
  const s = await seller();
  const [buyer, stranger, moderator] = await Promise.all([person("buyer"), person("stranger"), person("moderator", ["moderator"])]);
  return { seller: s, buyer, stranger, moderator, listing: await liveUnit(s.id) };
}

export const reserve = (c: Cast, clock: TestClock) =>
  t.reserveUnit({ listingId: c.listing.id, buyerId: c.buyer.id, deliveryMethod: "parcel", deliveryZone: "domestic" }, clock);

export const fund = (order: Order, clock: TestClock, suffix = "") =>
  t.markFunded(
    order.id,
    {
      paymentIntentId: `pi_${order.id}${suffix}`,
      chargeId: `ch_${order.id}${suffix}`,
      amountMinor: order.totalMinor,
      currency: order.currency,
      eventId: `evt_${order.id}${suffix}`,
    },
    clock,
  );

export type Reachable = "reserved" | "funded" | "shipped" | "audition" | "contested" | "released" | "refunded" | "cancelled";

/** A fresh cast and an order walked to `state` through the transitions themselves. */
export async function orderIn(state: Reachable, clock: TestClock): Promise<{ c: Cast; order: Order }> {
  const c = await cast();
  let order = await reserve(c, clock);
  if (state === "reserved") return { c, order };
  if (state === "cancelled") {
    clock.advanceMinutes(31);
    return { c, order: await t.lapseReservation(order.id, clock) };
  }
  order = await fund(order, clock);
  if (state === "funded") return { c, order };
  order = await t.markShipped(order.id, c.seller.id, { carrier: "Parcelwise", trackingNumber: "PW123456789" }, clock);
  if (state === "shipped") return { c, order };
  order = await t.confirmArrival(order.id, c.buyer.id, clock);
  if (state === "audition") return { c, order };
  if (state === "released") return { c, order: await t.acceptUnit(order.id, c.buyer.id, clock) };
  order = await t.contestOrder(order.id, c.buyer.id, { reason: "Left channel hums." }, clock);
  if (state === "contested") return { c, order };
  return { c, order: await t.resolveContest(order.id, c.moderator.id, { refundMinor: order.totalMinor, note: "Hum confirmed." }, clock) };
}

export interface QueuedJob {
  id: string;
  name: string;
  state: string;
  data: Record<string, unknown>;
  startAfter: Date;
}

/** Every job of `queue` about this order (any state), oldest first. */
export async function jobsFor(queue: string, orderId: string): Promise<QueuedJob[]> {
  const [rows] = await sequelize.query(
    `SELECT id, name, state, data, start_after AS "startAfter" FROM pgboss.job WHERE name = $1 AND data->>'orderId' = $2 ORDER BY created_on, id`,
    { bind: [queue, orderId] },
  );
  return rows as QueuedJob[];
}

const ORDER_QUEUES = [QUEUES.orderDeadline, QUEUES.orderMail, QUEUES.orderRelease, QUEUES.orderRefund, QUEUES.watchNotice];

/** Everything a transition could write for an order: its row, timeline, ledger, jobs and its unit's status. */
export async function footprint(orderId: string) {
  const order = await Order.findByPk(orderId, { rejectOnEmpty: true });
  const [[counts]] = await sequelize.query(
    `SELECT (SELECT count(*) FROM order_events WHERE order_id = $1::uuid)::int AS events,
            (SELECT count(*) FROM ledger_entries WHERE order_id = $1::uuid)::int AS ledger,
            (SELECT count(*) FROM order_contests WHERE order_id = $1::uuid)::int AS contests,
            (SELECT count(*) FROM pgboss.job WHERE name = ANY($2) AND (data->>'orderId' = $1::text OR data->>'listingId' = $3::text))::int AS jobs,
            (SELECT status FROM listings WHERE id = $3::uuid) AS listing`,
    { bind: [orderId, ORDER_QUEUES, order.listingId] },
  );
  return { order: order.toJSON(), ...(counts as { events: number; ledger: number; contests: number; jobs: number; listing: string }) };
}

/** The refusal a call ends in (fails the test if it succeeds or throws something else). */
export async function refusalOf(call: () => Promise<unknown>): Promise<string> {
  try {
    await call();
  } catch (error) {
    if (error instanceof HttpError) return error.code;
    throw error;
  }
  throw new Error("expected a refusal, but the call succeeded");
}

/** Sum of the order's ledger, and the sums of its movements that are not zero (should be none). */
export async function ledgerCheck(orderId: string): Promise<{ total: number; unbalanced: number }> {
  const [[row]] = await sequelize.query(
    `SELECT coalesce(sum(amount_minor), 0)::int AS total,
            (SELECT count(*) FROM (SELECT movement_id FROM ledger_entries WHERE order_id = $1 GROUP BY movement_id HAVING sum(amount_minor) <> 0) m)::int AS unbalanced
       FROM ledger_entries WHERE order_id = $1`,
    { bind: [orderId] },
  );
  return row as { total: number; unbalanced: number };
}
