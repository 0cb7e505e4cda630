import { formatPrice } from "@shared/money";
import { UniqueConstraintError } from "sequelize";
import { sequelize } from "~/db.server";
import { refusal } from "~/http/errors.server";
import { LedgerEntry, Listing, Order, User } from "~/models/index.server";
import type { ShippingMethod, ShippingZone } from "@shared/catalogue";
import { isId } from "@shared/ids";
import type { Clock } from "./clock.server";
import { scheduleDeadline } from "./deadline-jobs.server";
import { balancesFor, move } from "./ledger.server";
import { acceptedOfferFor, markOfferUsed, restoreOfferUse } from "~/offers/accepted.server";
import { queueRefund, setListingStatus } from "./money.server";
import { marketplaceSettings } from "./settings.server";
import { lockOrder, recordEvent, runStep, stateRefusal, type Actor } from "./step.server";
import { deliveryPriceFor, listingRefusal } from "./reserve-rules.server";

// The order state machine: each transition one function with its guard, run in a transaction that
// locks the order's row, writes the timeline row, moves the ledger where money moves and queues the
// mails and jobs it causes. Refusals are 409 order_state (or 404 for a missing order or someone else's)
// and write nothing. States: shared/orders.ts; the picture: DEVELOPERS.md, "Orders and the ledger".

const DAY = 86_400_000;
/** Handling time for a listing that does not state one. */
export const DEFAULT_HANDLING_DAYS = 3;

const system: Actor = { id: null, kind: "system" };

// The audition window's steps live beside these; callers import every transition from here.
export * from "./audition-transitions.server";
const provider: Actor = { id: null, kind: "provider" };

export interface ReserveInput {
  listingId: string;
  buyerId: string;
  deliveryMethod: ShippingMethod;
  deliveryZone: ShippingZone;
}

/** Checkout's first step: holds the live unit for this buyer for the reservation time. */
export function reserveUnit(input: ReserveInput, clock: Clock): Promise<Order> {
  return sequelize.transaction(async (tx) => {
    const now = clock.now();
    // The listing's row lock is what serialises buyers: the second waits here, then sees 'reserved'.
    const listing = isId(input.listingId) ? await Listing.findByPk(input.listingId, { transaction: tx, lock: tx.LOCK.UPDATE }) : null;
    if (!listing || listing.status === "draft" || listing.status === "removed") throw refusal("not_found", "There is no such listing.");
    const seller = await User.findByPk(listing.sellerId, { transaction: tx });
    const why = listingRefusal(listing, seller, input.buyerId);
    if (why) throw refusal("order_state", why);
    const deliveryMinor = deliveryPriceFor(listing, input.deliveryMethod, input.deliveryZone);
    const offer = await acceptedOfferFor(listing.id, input.buyerId, now, tx);
    if (offer) await markOfferUsed(offer.offerId, tx);
    const settings = await marketplaceSettings(tx);
    listing.status = "reserved";
    await listing.save({ transaction: tx });
    let order: Order;
    try {
      order = await Order.create(
        {
          listingId: listing.id,
          buyerId: input.buyerId,
          sellerId: listing.sellerId,
          currency: listing.currency,
          priceMinor: offer ? offer.amountMinor : (listing.priceMinor ?? 0),
          deliveryMinor,
          deliveryMethod: input.deliveryMethod,
          deliveryZone: input.deliveryZone,
          offerId: offer?.offerId ?? null,
          reservedUntil: new Date(now.getTime() + settings.reservationMinutes * 60_000),
          createdAt: now,
          updatedAt: now,
        },
        { transaction: tx },
      );
    } catch (error) {
      // The partial unique index is the last word on one holder per unit.
      if (error instanceof UniqueConstraintError) throw refusal("order_state", "Another buyer holds this unit.");
      throw error;
    }
    await recordEvent(order, null, { id: input.buyerId, kind: "buyer" }, { mail: [], now, tx });
    await scheduleDeadline(order.id, "reservation", order.reservedUntil, tx);
    return order;
  });
}

/** Records the Checkout Session made for the reservation (no state change; the same id again is harmless). */
export function attachCheckout(orderId: string, { checkoutSessionId }: { checkoutSessionId: string }): Promise<Order> {
  return sequelize.transaction(async (tx) => {
    const order = await lockOrder(orderId, tx);
    if (order.checkoutSessionId === checkoutSessionId) return order;
    if (order.state !== "reserved") throw stateRefusal(order, "it can no longer be paid for.");
    if (order.checkoutSessionId) throw stateRefusal(order, "it already has a checkout.");
    order.checkoutSessionId = checkoutSessionId;
    await order.save({ transaction: tx });
    return order;
  });
}

export interface Funding {
  paymentIntentId: string;
  chargeId: string;
  amountMinor: number;
  currency: string;
  /** The provider event that said so (kept in the timeline note). */
  eventId: string;
}

/**
 * The provider says the buyer's payment succeeded (PAYMENTS calls this from a verified webhook event,
 * never from a redirect). The same payment again changes nothing. A payment that arrives after the
 * reservation lapsed is recorded and refunded in whole.
 */
export function markFunded(orderId: string, funding: Funding, clock: Clock): Promise<Order> {
  return sequelize.transaction(async (tx) => {
    const now = clock.now();
    const order = await lockOrder(orderId, tx);
    if (order.paymentIntentId === funding.paymentIntentId) return order;
    if (order.paymentIntentId) throw stateRefusal(order, "it was already paid by another payment.");
    if (funding.amountMinor !== order.totalMinor || funding.currency.toUpperCase() !== order.currency)
      throw refusal("order_state", `The payment (${funding.amountMinor} ${funding.currency}) does not match the order's total.`);
    const fromState = order.state;
    order.paymentIntentId = funding.paymentIntentId;
    order.chargeId = funding.chargeId;
    order.fundedAt = now;
    await move(order, "buyer_payment", "buyer", "escrow", order.totalMinor, { providerRef: funding.chargeId, at: now, transaction: tx });
    if (order.state === "reserved") {
      const listing = await Listing.findByPk(order.listingId, { transaction: tx });
      const days = Math.max(1, listing?.handlingDays ?? DEFAULT_HANDLING_DAYS);
      order.state = "funded";
      order.shipBy = new Date(now.getTime() + days * DAY);
      await scheduleDeadline(order.id, "ship_by", order.shipBy, tx);
    } else if (order.state === "cancelled") {
      await queueRefund(order, order.totalMinor, tx);
    } else {
      throw stateRefusal(order, "a payment cannot be taken now.");
    }
    order.version += 1;
    await order.save({ transaction: tx });
    const note =
      order.state === "cancelled"
        ? `Paid after the reservation lapsed (${funding.eventId}); the payment is refunded in whole.`
        : `Payment ${funding.paymentIntentId} (${funding.eventId}).`;
    await recordEvent(order, fromState, provider, { note, mail: order.state === "cancelled" ? ["buyer"] : ["buyer", "seller"], now, tx });
    return order;
  });
}

/** The reservation's time is up and it was not paid: the unit returns to the market. */
export function lapseReservation(orderId: string, clock: Clock): Promise<Order> {
  return runStep(
    orderId,
    {
      actor: system,
      from: ["reserved"],
      to: "cancelled",
      refuse: (order, now) => (now < order.reservedUntil ? "the reservation has not run out yet." : null),
      apply: async (order, { tx, now }) => {
        order.closedAt = now;
        await setListingStatus(order.listingId, "live", tx);
        // An accepted offer spent on this reservation may be used again while its checkout window lasts.
        if (order.offerId) await restoreOfferUse(order.offerId, now, tx);
      },
      note: "The reservation lapsed unpaid; the unit is back in the market.",
      mail: ["buyer"],
    },
    clock,
  );
}

export interface Shipment {
  carrier: string;
  trackingNumber: string;
}

/** The seller ships within the handling time, with carrier and tracking number. */
export function markShipped(orderId: string, sellerId: string, shipment: Shipment, clock: Clock): Promise<Order> {
  return runStep(
    orderId,
    {
      actor: { id: sellerId, kind: "seller" },
      side: "seller",
      from: ["funded"],
      to: "shipped",
      refuse: (order, now) => (order.shipBy && now > order.shipBy ? "the handling time has ended and the order is being cancelled." : null),
      apply: async (order, { tx, now }) => {
        order.shippedAt = now;
        order.carrier = shipment.carrier;
        order.trackingNumber = shipment.trackingNumber;
        const settings = await marketplaceSettings(tx);
        await scheduleDeadline(order.id, "arrival", new Date(now.getTime() + settings.arrivalAssumedDays * DAY), tx);
      },
      mail: ["buyer", "seller"],
    },
    clock,
  );
}

/** The handling time ended without a shipment: cancelled, the buyer refunded in whole. */
export function cancelUnshipped(orderId: string, clock: Clock): Promise<Order> {
  return runStep(
    orderId,
    {
      actor: system,
      from: ["funded"],
      to: "cancelled",
      refuse: (order, now) => (!order.shipBy || now < order.shipBy ? "the handling time has not ended yet." : null),
      apply: async (order, { tx, now }) => {
        order.closedAt = now;
        await queueRefund(order, order.totalMinor, tx);
        // The seller did not ship: the unit leaves the market until they list it again.
        await setListingStatus(order.listingId, "withdrawn", tx);
      },
      note: "Not shipped within the handling time; the buyer is refunded in whole.",
      mail: ["buyer", "seller"],
    },
    clock,
  );
}

/** Arrival, confirmed or assumed: the order passes through 'arrived' into the audition window. */
async function arrive(orderId: string, actor: Actor, clock: Clock, assumed: boolean): Promise<Order> {
  return sequelize.transaction(async (tx) => {
    const now = clock.now();
    const order = await lockOrder(orderId, tx);
    if (actor.kind === "buyer" && order.buyerId !== actor.id) throw refusal("not_found", "There is no such order.");
    if (order.state !== "shipped") throw stateRefusal(order, "its arrival cannot be recorded now.");
    const settings = await marketplaceSettings(tx);
    if (assumed && order.shippedAt && now.getTime() < order.shippedAt.getTime() + settings.arrivalAssumedDays * DAY)
      throw stateRefusal(order, "arrival is not assumed yet.");
    order.arrivedAt = now;
    order.state = "arrived";
    order.version += 1;
    await order.save({ transaction: tx });
    const note = assumed ? `No confirmation ${settings.arrivalAssumedDays} days after shipping; arrival assumed.` : null;
    await recordEvent(order, "shipped", actor, { note, mail: [], now, tx });
    order.state = "audition";
    order.auditionEndsAt = new Date(now.getTime() + settings.auditionDays * DAY);
    order.version += 1;
    await order.save({ transaction: tx });
    await recordEvent(order, "arrived", system, { mail: ["buyer", "seller"], now, tx });
    await scheduleDeadline(order.id, "audition", order.auditionEndsAt, tx);
    return order;
  });
}

export function confirmArrival(orderId: string, buyerId: string, clock: Clock): Promise<Order> {
  return arrive(orderId, { id: buyerId, kind: "buyer" }, clock, false);
}

export function assumeArrival(orderId: string, clock: Clock): Promise<Order> {
  return arrive(orderId, system, clock, true);
}

export function markReleased(orderId: string, { transferId }: { transferId: string }, clock: Clock): Promise<Order> {
  return sequelize.transaction(async (tx) => {
    const now = clock.now();
    const order = await lockOrder(orderId, tx);
    if (order.transferId === transferId) return order;
    if (order.transferId) throw stateRefusal(order, "the seller was already paid by another transfer.");
    // What was released and not yet paid out is the seller_payable balance.
    const payable = order.releasedAt ? (await balancesFor(order.id, tx)).seller_payable : 0;
    if (payable <= 0) throw stateRefusal(order, "nothing has been released to pay out.");
    order.transferId = transferId;
    order.closedAt = now;
    order.version += 1;
    await order.save({ transaction: tx });
    await move(order, "transfer", "seller_payable", "seller_paid", payable, { providerRef: transferId, at: now, transaction: tx });
    await recordEvent(order, order.state, provider, { note: `Paid out to the seller (${transferId}).`, mail: ["seller"], now, tx });
    return order;
  });
}

/** PAYMENTS refunded the buyer: recorded once per refund id, never more than escrow still holds. */
export function markRefunded(
  orderId: string,
  { refundId, amountMinor }: { refundId: string; amountMinor: number },
  clock: Clock,
): Promise<Order> {
  return sequelize.transaction(async (tx) => {
    const now = clock.now();
    const order = await lockOrder(orderId, tx);
    const seen = await LedgerEntry.findOne({ where: { orderId: order.id, kind: "refund", providerRef: refundId }, transaction: tx });
    if (seen) return order;
    if (order.state !== "cancelled" && order.state !== "refunded") throw stateRefusal(order, "no refund was decided.");
    const held = (await balancesFor(order.id, tx)).escrow;
    if (!Number.isSafeInteger(amountMinor) || amountMinor <= 0 || amountMinor > held)
      throw stateRefusal(order, `a refund of ${amountMinor} is more than the ${held} held.`);
    order.refundedMinor += amountMinor;
    order.closedAt = now;
    order.version += 1;
    await order.save({ transaction: tx });
    await move(order, "refund", "escrow", "buyer", amountMinor, { providerRef: refundId, at: now, transaction: tx });
    await recordEvent(order, order.state, provider, {
      note: `Refunded ${formatPrice(amountMinor, order.currency)} to the buyer (${refundId}).`,
      mail: ["buyer"],
      now,
      tx,
    });
    return order;
  });
}
