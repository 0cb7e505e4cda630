import * as t from "~/orders/transitions.server";
import { testClock } from "../support/clock";
import { person, seller as newSeller, liveUnit } from "./orders-support";

// Completed sales for the reputation suites, walked through the real order steps.

const clock = testClock("2026-12-30T10:00:00Z");

/** A unit of `maker`/`model` sold at `priceMinor` (collection, so the total is the price); `refund` part-refunds it through a contest. */
export async function sale(
  maker: string,
  model: string,
  priceMinor: number,
  opts: { verified?: boolean; currency?: string; refund?: number; stopInAudition?: boolean } = {},
) {
  const s = await newSeller();
  const buyer = await person("buyer");
  const unit = await liveUnit(s.id, { maker, model, priceMinor, currency: opts.currency ?? "EUR", benchVerified: opts.verified ?? false });
  let order = await t.reserveUnit({ listingId: unit.id, buyerId: buyer.id, deliveryMethod: "collection", deliveryZone: "domestic" }, clock);
  const ref = order.id;
  order = await t.markFunded(
    order.id,
    { paymentIntentId: `pi_${ref}`, chargeId: `ch_${ref}`, amountMinor: order.totalMinor, currency: order.currency, eventId: `evt_${ref}` },
    clock,
  );
  await t.markShipped(order.id, s.id, { carrier: "Parcelwise", trackingNumber: "PW1" }, clock);
  order = await t.confirmArrival(order.id, buyer.id, clock);
  if (opts.stopInAudition) return order;
  if (opts.refund) {
    await t.contestOrder(order.id, buyer.id, { reason: "Scratches not shown." }, clock);
    const moderator = await person("moderator", ["moderator"]);
    return t.resolveContest(order.id, moderator.id, { refundMinor: opts.refund, note: "Part refund for the scratches." }, clock);
  }
  return t.acceptUnit(order.id, buyer.id, clock);
}
