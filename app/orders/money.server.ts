import type { Transaction } from "sequelize";
import { Listing } from "~/models/index.server";
import type { Order } from "~/models/index.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { queueWatchNotice } from "~/alerts/watch-notices.server";
import { platformFeeMinor } from "@shared/order-fee";
import { move } from "./ledger.server";
import { marketplaceSettings } from "./settings.server";

// What a release or a refund decision writes: the ledger legs that are decided here (fee, seller
// payable), the provider's job (PAYMENTS' 'order-release' / 'order-refund', which calls back
// markReleased / markRefunded), and the unit's listing status. All inside the deciding transaction.

/** The job PAYMENTS' 'order-release' handler receives: pay `amountMinor` to the seller. */
export interface ReleaseJob {
  orderId: string;
  amountMinor: number;
}

/** The job PAYMENTS' 'order-refund' handler receives; `refundNo` numbers the order's refunds from 1 (its idempotency key's last part). */
export interface RefundJob {
  orderId: string;
  amountMinor: number;
  refundNo: number;
}

/**
 * Releases what stays with the seller after `refundMinor`: the fee to the platform, the rest payable to
 * the seller, the transfer queued. The unit counts as sold and its watchers hear so.
 */
export async function releaseToSeller(order: Order, refundMinor: number, now: Date, tx: Transaction): Promise<void> {
  const gross = order.totalMinor - refundMinor;
  const settings = await marketplaceSettings(tx);
  const fee = platformFeeMinor(gross, order.currency, settings);
  const payable = gross - fee;
  order.feeMinor = fee;
  order.releasedAt = now;
  await move(order, "platform_fee", "escrow", "platform_fees", fee, { at: now, transaction: tx });
  await move(order, "seller_payable", "escrow", "seller_payable", payable, { at: now, transaction: tx });
  if (payable > 0) {
    const job: ReleaseJob = { orderId: order.id, amountMinor: payable };
    await enqueue(QUEUES.orderRelease, job, { transaction: tx, singletonKey: `order:${order.id}:transfer` });
  }
  await setListingStatus(order.listingId, "sold", tx);
  await queueWatchNotice({ kind: "sold", listingId: order.listingId }, tx);
}

/** Queues a refund of `amountMinor` to the buyer; the ledger moves when the provider confirms it. */
export async function queueRefund(order: Order, amountMinor: number, tx: Transaction, refundNo = 1): Promise<void> {
  if (amountMinor <= 0) return;
  const job: RefundJob = { orderId: order.id, amountMinor, refundNo };
  await enqueue(QUEUES.orderRefund, job, { transaction: tx, singletonKey: `order:${order.id}:refund:${refundNo}` });
}

/**
 * Moves the unit out of 'reserved', under a row lock (orders lock their own row first, then the
 * listing's). A listing a moderator has meanwhile removed stays as it is.
 */
export async function setListingStatus(listingId: string, status: "live" | "sold" | "withdrawn", tx: Transaction): Promise<void> {
  const listing = await Listing.findByPk(listingId, { transaction: tx, lock: tx.LOCK.UPDATE });
  if (!listing || listing.status !== "reserved") return;
  listing.status = status;
  await listing.save({ transaction: tx });
}
