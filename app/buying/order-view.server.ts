import { eventNote } from "./event-notes";
import { SHIPPING_METHOD_LABELS, SHIPPING_ZONE_LABELS, TWO_PERSON_LIFT_G, formatWeight, listingTitle } from "@shared/catalogue";
import { ORDER_STATE_LABELS, nextStep, type ActorKind, type OrderState, type OwedBy } from "@shared/orders";
import { isOneOf } from "@shared/one-of";
import { MessageThread } from "~/models/message-thread.server";
import type { Listing, Order, OrderEvent, User } from "~/models/index.server";
import type { OrderDetail } from "~/orders/queries.server";
import { coverThumbs } from "./covers.server";
import {
  orderRef,
  type OrderDetailView,
  type OrderEventView,
  type OrderListingView,
  type OrderMoneyView,
  type OrderSummaryView,
  type OrderViewer,
} from "./order-view";

// Orders as the buying pages show them, worded for the one looking: the state in our words, the next
// step and whose it is, the money (the fee and the seller's share only once released), the timeline.

const OWED_WORDS: Record<OwedBy, string> = {
  buyer: "the buyer",
  seller: "the seller",
  moderator: "a moderator",
  provider: "the payment provider",
  nobody: "nobody",
};

const stateLabel = (state: string) => (isOneOf(Object.keys(ORDER_STATE_LABELS) as OrderState[], state) ? ORDER_STATE_LABELS[state] : state);

function listingView(
  listing: Pick<Listing, "id" | "maker" | "model" | "weightG" | "category"> | null | undefined,
  thumbs: Map<string, string>,
  listingId: string,
): OrderListingView {
  return {
    id: listing?.id ?? listingId,
    title: listing ? listingTitle(listing.maker, listing.model) : "A unit no longer listed",
    thumbUrl: thumbs.get(listingId) ?? null,
    heavy: (listing?.weightG ?? 0) >= TWO_PERSON_LIFT_G,
    weightG: listing?.weightG ?? null,
    weightText: listing?.weightG ? formatWeight(listing.weightG) : null,
    mainsPowered: listing?.category !== "loudspeaker",
  };
}

export function moneyView(order: Order): OrderMoneyView {
  const total = order.priceMinor + order.deliveryMinor;
  const released = order.feeMinor !== null && (order.state === "released" || order.transferId !== null);
  return {
    currency: order.currency,
    priceMinor: order.priceMinor,
    fromOffer: order.offerId !== null,
    deliveryMinor: order.deliveryMinor,
    totalMinor: total,
    feeMinor: order.feeMinor,
    refundedMinor: order.refundedMinor,
    sellerNetMinor: released ? total - order.refundedMinor - (order.feeMinor ?? 0) : null,
  };
}

function next(order: Order, viewer: OrderViewer): OrderSummaryView["next"] {
  const step = nextStep(
    {
      state: order.state,
      reservedUntil: order.reservedUntil,
      shipBy: order.shipBy,
      auditionEndsAt: order.auditionEndsAt,
      refundedMinor: order.refundedMinor,
      transferId: order.transferId,
    },
    viewer,
  );
  if (step.owedBy === "nobody") return { text: step.text, owedBy: "nobody", yours: false };
  return { text: step.text, owedBy: OWED_WORDS[step.owedBy], yours: step.owedBy === viewer };
}

type ListedOrder = Order & { listing?: Listing | null; buyer?: User | null; seller?: User | null };

/** The rows of /purchases (viewer buyer) or /sales (viewer seller). */
export async function orderSummaries(orders: ListedOrder[], viewer: "buyer" | "seller"): Promise<OrderSummaryView[]> {
  const thumbs = await coverThumbs(orders.map((o) => o.listingId));
  return orders.map((o) => ({
    id: o.id,
    ref: orderRef(o.id),
    state: o.state,
    stateLabel: stateLabel(o.state),
    listing: listingView(o.listing, thumbs, o.listingId),
    counterpart: (viewer === "buyer" ? o.seller?.displayName : o.buyer?.displayName) ?? "someone no longer on Loadline",
    next: next(o, viewer),
    money: moneyView(o),
    createdAt: o.createdAt.toISOString(),
    updatedAt: o.updatedAt.toISOString(),
  }));
}

const ACTOR_WORDS: Record<ActorKind, Record<OrderViewer, string>> = {
  buyer: { buyer: "you", seller: "the buyer", moderator: "the buyer" },
  seller: { buyer: "the seller", seller: "you", moderator: "the seller" },
  moderator: { buyer: "a moderator", seller: "a moderator", moderator: "a moderator" },
  system: { buyer: "Loadline, on schedule", seller: "Loadline, on schedule", moderator: "Loadline, on schedule" },
  provider: { buyer: "the payment provider", seller: "the payment provider", moderator: "the payment provider" },
};

function eventView(e: OrderEvent, viewer: OrderViewer, moderatorNames: Map<string, string>): OrderEventView {
  let actor = ACTOR_WORDS[e.actorKind]?.[viewer] ?? e.actorKind;
  if (viewer === "moderator" && e.actorKind === "moderator" && e.actorId) actor = moderatorNames.get(e.actorId) ?? actor;
  return {
    id: e.id,
    fromState: e.fromState,
    toState: e.toState,
    label: e.fromState === null ? "Reserved for checkout" : stateLabel(e.toState),
    actor: actor.charAt(0).toUpperCase() + actor.slice(1),
    note: eventNote(e, viewer),
    at: e.at.toISOString(),
  };
}

/** One order for its page; `moderatorNames` names the desk's people for the desk's own screen. */
export async function orderDetailView(
  detail: OrderDetail,
  viewer: OrderViewer,
  moderatorNames: Map<string, string> = new Map(),
): Promise<OrderDetailView> {
  const { order, listing } = detail;
  const [thumbs, thread] = await Promise.all([
    coverThumbs([order.listingId]),
    MessageThread.findOne({ where: { listingId: order.listingId, buyerId: order.buyerId }, attributes: ["id"] }),
  ]);
  const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);
  return {
    id: order.id,
    ref: orderRef(order.id),
    state: order.state,
    stateLabel: stateLabel(order.state),
    viewer,
    listing: listingView(listing, thumbs, order.listingId),
    buyerName: detail.buyer?.displayName ?? "a former member",
    sellerName: detail.seller?.displayName ?? "a former member",
    counterpart: (viewer === "buyer" ? detail.seller?.displayName : detail.buyer?.displayName) ?? "a former member",
    next: next(order, viewer),
    money: moneyView(order),
    delivery: {
      method: order.deliveryMethod,
      methodLabel: SHIPPING_METHOD_LABELS[order.deliveryMethod] ?? order.deliveryMethod,
      zoneLabel: SHIPPING_ZONE_LABELS[order.deliveryZone] ?? order.deliveryZone,
      carrier: order.carrier,
      trackingNumber: order.trackingNumber,
      handlingDays: listing?.handlingDays ?? null,
      reservedUntil: iso(order.reservedUntil),
      shipBy: iso(order.shipBy),
      shippedAt: iso(order.shippedAt),
      arrivedAt: iso(order.arrivedAt),
      auditionEndsAt: iso(order.auditionEndsAt),
      releasedAt: iso(order.releasedAt),
      closedAt: iso(order.closedAt),
    },
    events: detail.events.map((e) => eventView(e, viewer, moderatorNames)),
    threadHref: thread ? `/messages/${thread.id}` : null,
    createdAt: order.createdAt.toISOString(),
    updatedAt: order.updatedAt.toISOString(),
  };
}
