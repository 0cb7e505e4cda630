import { listingTitle } from "@shared/catalogue";
import { Listing, Order, OrderContest, User } from "~/models/index.server";
import { CONTEST_REASON_LABELS } from "~/orders/contest-words";
import { orderRef } from "./order-view";

// Contested orders for the review desk's queue, longest waiting first.

export interface ContestedOrderItem {
  id: string;
  ref: string;
  title: string;
  buyer: string;
  seller: string;
  reason: string;
  since: string;
}

export async function contestedOrders(limit: number): Promise<ContestedOrderItem[]> {
  // Read with their associations (declared in the models' index, not on the class).
  const orders: (Order & { listing?: Listing | null; buyer?: User | null; seller?: User | null })[] = await Order.findAll({
    where: { state: "contested" },
    include: [
      { model: Listing, as: "listing", attributes: ["id", "maker", "model"] },
      { model: User, as: "buyer", attributes: ["displayName"] },
      { model: User, as: "seller", attributes: ["displayName"] },
    ],
    order: [["updatedAt", "ASC"]],
    limit,
  });
  const contests = orders.length
    ? await OrderContest.findAll({ where: { orderId: orders.map((o) => o.id) }, attributes: ["orderId", "reason"] })
    : [];
  const reasons = new Map(contests.map((c) => [c.orderId, c.reason]));
  return orders.map((o) => {
    const reason = reasons.get(o.id) ?? "";
    return {
      id: o.id,
      ref: orderRef(o.id),
      title: o.listing ? listingTitle(o.listing.maker, o.listing.model) : "A unit no longer listed",
      buyer: o.buyer?.displayName ?? "unknown buyer",
      seller: o.seller?.displayName ?? "unknown seller",
      reason: reason in CONTEST_REASON_LABELS ? CONTEST_REASON_LABELS[reason as keyof typeof CONTEST_REASON_LABELS] : reason,
      since: o.updatedAt.toISOString(),
    };
  });
}
