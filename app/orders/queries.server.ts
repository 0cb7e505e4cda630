import { Op } from "sequelize";
import { refusal } from "~/http/errors.server";
import { LedgerEntry, Listing, Order, OrderContest, OrderEvent, User } from "~/models/index.server";
import { isId } from "@shared/ids";

// Reading orders: the buyer's purchases, the seller's sales, and one order with its timeline, ledger
// and contest for the buyer, the seller or a moderator. Anyone else gets the same 404 as a missing order.

export type OrderRole = "buyer" | "seller" | "moderator";

const listingAttributes = ["id", "maker", "model", "category", "currency", "priceMinor", "weightG", "status", "handlingDays", "sellerId"];
const personAttributes = ["id", "displayName"];

function listOrders(where: { buyerId: string } | { sellerId: string }) {
  return Order.findAll({
    where,
    include: [
      { model: Listing, as: "listing", attributes: listingAttributes },
      { model: User, as: "buyer", attributes: personAttributes },
      { model: User, as: "seller", attributes: personAttributes },
    ],
    order: [
      ["createdAt", "DESC"],
      ["id", "DESC"],
    ],
  });
}

/** The buyer's orders, newest first (with the listing and both people's display names). */
export function purchasesFor(buyerId: string): Promise<Order[]> {
  return listOrders({ buyerId });
}

/** The seller's orders, newest first. */
export function salesFor(sellerId: string): Promise<Order[]> {
  return listOrders({ sellerId });
}

export interface OrderDetail {
  order: Order;
  listing: Listing | null;
  buyer: Pick<User, "id" | "displayName"> | null;
  seller: Pick<User, "id" | "displayName"> | null;
  events: OrderEvent[];
  ledger: LedgerEntry[];
  contest: OrderContest | null;
}

/**
 * One order as `role` sees it: the buyer and seller reach only their own; a moderator (the caller has
 * checked the role) reaches any. Everything else is a 404.
 */
export async function orderFor(viewerId: string, orderId: string, role: OrderRole): Promise<OrderDetail> {
  if (!isId(orderId)) throw refusal("not_found", "There is no such order.");
  const where =
    role === "buyer" ? { id: orderId, buyerId: viewerId } : role === "seller" ? { id: orderId, sellerId: viewerId } : { id: orderId };
  const order = await Order.findOne({ where });
  if (!order) throw refusal("not_found", "There is no such order.");
  const [listing, people, events, ledger, contest] = await Promise.all([
    Listing.findByPk(order.listingId),
    User.findAll({ where: { id: { [Op.in]: [order.buyerId, order.sellerId] } }, attributes: personAttributes }),
    OrderEvent.findAll({ where: { orderId: order.id }, order: [["seq", "ASC"]] }),
    LedgerEntry.findAll({ where: { orderId: order.id }, order: [["seq", "ASC"]] }),
    OrderContest.findByPk(order.id),
  ]);
  const person = (id: string) => people.find((p) => p.id === id) ?? null;
  return { order, listing, buyer: person(order.buyerId), seller: person(order.sellerId), events, ledger, contest };
}
