import type Stripe from "stripe";
import { payments } from "~/services/payments.server";
import { Listing } from "~/models/listing.server";
import { User } from "~/models/user.server";
import { refusal } from "~/http/errors.server";

// Every call Loadline makes to the payments provider for an order. Each carries an idempotency key
// made of the order and the step (`order:<id>:checkout`, `order:<id>:transfer`, `order:<id>:refund:<n>`),
// with parameters that depend only on the order: a retry after a crash between the call and our
// database write gets the same object back instead of a second charge, transfer or refund.
// The money is charged to the platform (separate charges and transfers): it stays in Loadline's
// provider balance until released to the seller's connected account, tied to the original charge.

/** What the provider calls read from an order (ORDERS' Order model satisfies it). */
export interface ProviderOrder {
  id: string;
  listingId: string;
  buyerId: string;
  sellerId: string;
  currency: string;
  priceMinor: number;
  deliveryMinor: number;
  deliveryMethod: string;
  deliveryZone: string;
  chargeId: string | null;
  paymentIntentId: string | null;
  refundedMinor: number;
  reservedUntil: Date | null;
  createdAt: Date;
  checkoutSessionId?: string | null;
}

/** A seller as the payout calls need them. */
export interface PayoutUser {
  id: string;
  email: string;
  displayName: string;
  payoutAccountId: string | null;
}

export const idempotencyKey = {
  checkout: (orderId: string) => `order:${orderId}:checkout`,
  transfer: (orderId: string) => `order:${orderId}:transfer`,
  refund: (orderId: string, n: number) => `order:${orderId}:refund:${n}`,
  expire: (orderId: string) => `order:${orderId}:expire`,
  account: (userId: string) => `user:${userId}:payout-account`,
};

/** The group the provider files an order's charge, refunds and transfer under (reconcile lists by it). */
export const transferGroup = (orderId: string) => `order_${orderId}`;

// The provider accepts a Checkout Session lasting 30 minutes to 24 hours from its creation. A
// reservation as short as 30 minutes would fall just under that, so the session lives a minute
// past the order's creation plus 30 minutes at least; fixed by the order, so a retry sends the same.
const MIN_SESSION_SECONDS = 31 * 60;

export function checkoutExpiresAt(order: Pick<ProviderOrder, "reservedUntil" | "createdAt">): number {
  const reserved = Math.floor((order.reservedUntil?.getTime() ?? 0) / 1000);
  const floor = Math.floor(order.createdAt.getTime() / 1000) + MIN_SESSION_SECONDS;
  return Math.max(reserved, floor);
}

const DELIVERY_WORDS: Record<string, string> = { collection: "Collection", parcel: "Parcel delivery", freight: "Freight delivery" };

/** A Checkout Session for the order in the listing's currency: the unit and its delivery as line items. */
export async function createCheckout(
  order: ProviderOrder,
  { successUrl, cancelUrl }: { successUrl: string; cancelUrl: string },
): Promise<{ id: string; url: string }> {
  // Back to pay again: the session already made, while it is open (a replayed creation would show
  // the page address of a session that may since have closed).
  if (order.checkoutSessionId) {
    const existing = await payments().checkout.sessions.retrieve(order.checkoutSessionId);
    if (existing.status === "open" && existing.url) return { id: existing.id, url: existing.url };
    throw refusal("order_state", "The payment page for this order has closed.");
  }
  const listing = await Listing.findByPk(order.listingId, { attributes: ["id", "maker", "model"], rejectOnEmpty: true });
  const buyer = await User.findByPk(order.buyerId, { attributes: ["id", "email"] });
  const currency = order.currency.toLowerCase();
  const name = [listing.maker, listing.model].filter(Boolean).join(" ") || "Hi-fi unit";
  const lineItems: Stripe.Checkout.SessionCreateParams.LineItem[] = [
    { quantity: 1, price_data: { currency, unit_amount: order.priceMinor, product_data: { name } } },
  ];
  if (order.deliveryMinor > 0) {
    const method = DELIVERY_WORDS[order.deliveryMethod] ?? "Delivery";
    lineItems.push({
      quantity: 1,
      price_data: { currency, unit_amount: order.deliveryMinor, product_data: { name: `${method} (${order.deliveryZone})` } },
    });
  }
  const session = await payments().checkout.sessions.create(
    {
      mode: "payment",
      line_items: lineItems,
      success_url: successUrl,
      cancel_url: cancelUrl,
      client_reference_id: order.id,
      ...(buyer ? { customer_email: buyer.email } : {}),
      metadata: { order_id: order.id },
      expires_at: checkoutExpiresAt(order),
      payment_intent_data: { transfer_group: transferGroup(order.id), metadata: { order_id: order.id } },
    },
    { idempotencyKey: idempotencyKey.checkout(order.id) },
  );
  if (!session.url) throw new Error(`Checkout Session ${session.id} has no payment page (status ${session.status})`);
  return { id: session.id, url: session.url };
}

/** Ends an open Checkout Session early (the reservation lapsed); one already finished is left alone. */
export async function expireCheckout(checkoutSessionId: string, orderId: string): Promise<void> {
  const session = await payments().checkout.sessions.retrieve(checkoutSessionId);
  if (session.status !== "open") return;
  await payments().checkout.sessions.expire(checkoutSessionId, {}, { idempotencyKey: idempotencyKey.expire(orderId) });
}

/**
 * Sends `amountMinor` (the seller's share, fixed when the money was released) to the seller's
 * connected account, from the order's own charge (source_transaction), so it may go while the
 * charge's funds are still pending at the provider.
 */
export async function transferToSeller(order: ProviderOrder, amountMinor: number): Promise<{ transferId: string; amountMinor: number }> {
  if (!order.chargeId) throw new Error(`Order ${order.id} has no charge to pay the seller from`);
  const seller = await User.findByPk(order.sellerId, { rejectOnEmpty: true });
  if (!seller.payoutAccountId) throw new Error(`The seller of order ${order.id} has no payout account`);
  const transfer = await payments().transfers.create(
    {
      amount: amountMinor,
      currency: order.currency.toLowerCase(),
      destination: seller.payoutAccountId,
      source_transaction: order.chargeId,
      transfer_group: transferGroup(order.id),
      metadata: { order_id: order.id },
    },
    { idempotencyKey: idempotencyKey.transfer(order.id) },
  );
  return { transferId: transfer.id, amountMinor: transfer.amount };
}

/** The order's transfer if the provider already made it (a retry later than the provider keeps keys). */
export async function existingTransfer(order: ProviderOrder): Promise<{ transferId: string; amountMinor: number } | null> {
  const list = await payments().transfers.list({ transfer_group: transferGroup(order.id), limit: 10 });
  const found = list.data.find((t) => t.metadata?.order_id === order.id);
  return found ? { transferId: found.id, amountMinor: found.amount } : null;
}

/** The order's refund number `n` if the provider already made it. */
export async function existingRefund(order: ProviderOrder, n: number): Promise<{ refundId: string; amountMinor: number } | null> {
  if (!order.chargeId) return null;
  const list = await payments().refunds.list({ charge: order.chargeId, limit: 100 });
  const found = list.data.find((r) => r.metadata?.order_id === order.id && r.metadata?.step === String(n));
  return found ? { refundId: found.id, amountMinor: found.amount } : null;
}

/** Returns `amountMinor` of the order's charge to the buyer; `n` counts the order's refunds from 1. */
export async function refundBuyer(order: ProviderOrder, amountMinor: number, n = 1): Promise<{ refundId: string; amountMinor: number }> {
  if (!order.paymentIntentId && !order.chargeId) throw new Error(`Order ${order.id} has no payment to refund`);
  const refund = await payments().refunds.create(
    {
      ...(order.chargeId ? { charge: order.chargeId } : { payment_intent: order.paymentIntentId! }),
      amount: amountMinor,
      metadata: { order_id: order.id, step: String(n) },
    },
    { idempotencyKey: idempotencyKey.refund(order.id, n) },
  );
  return { refundId: refund.id, amountMinor: refund.amount };
}

/** The seller's connected account (Express), created once; its id is kept on the user. */
export async function ensurePayoutAccount(user: PayoutUser): Promise<string> {
  if (user.payoutAccountId) return user.payoutAccountId;
  const account = await payments().accounts.create(
    {
      type: "express",
      email: user.email,
      capabilities: { transfers: { requested: true } },
      business_profile: { name: user.displayName },
      metadata: { user_id: user.id },
    },
    { idempotencyKey: idempotencyKey.account(user.id) },
  );
  // Two requests at once share the idempotency key, so both see the same account.
  await User.update({ payoutAccountId: account.id }, { where: { id: user.id, payoutAccountId: null } });
  const fresh = await User.findByPk(user.id, { rejectOnEmpty: true });
  return fresh.payoutAccountId ?? account.id;
}

/** A fresh, single-use onboarding link on the provider's page; it comes back to `returnUrl`. */
export async function onboardingLink(user: PayoutUser, returnUrl: string): Promise<string> {
  const account = await ensurePayoutAccount(user);
  const link = await payments().accountLinks.create({
    account,
    type: "account_onboarding",
    return_url: returnUrl,
    refresh_url: returnUrl,
  });
  return link.url;
}
