import { z } from "zod";
import { processPaymentEvent } from "./process-event.server";
import { refundOrder, releaseOrder } from "./release.server";

// The provider-side jobs: 'payment-event' (a recorded webhook event), 'order-release' (the seller's
// payout, then the order released) and 'order-refund' (a refund, then the order refunded). The two
// order jobs are queued by the order transitions (app/orders/money.server.ts) with the amount fixed
// there; each makes its provider call with the order's idempotency key before its database write, so
// a retry after a crash in between gets the same provider object and completes the write.

export const PaymentEventJob = z.object({ eventId: z.string().min(1) });
export const OrderReleaseJob = z.object({ orderId: z.uuid(), amountMinor: z.number().int().positive() });
/** `refundNo` counts the order's refunds from 1 (the idempotency key's last part). */
export const OrderRefundJob = z.object({ orderId: z.uuid(), amountMinor: z.number().int().positive(), refundNo: z.number().int().min(1) });

export async function paymentEventJob(data: unknown): Promise<void> {
  const { eventId } = PaymentEventJob.parse(data);
  await processPaymentEvent(eventId);
}

export async function orderReleaseJob(data: unknown): Promise<void> {
  const { orderId, amountMinor } = OrderReleaseJob.parse(data);
  await releaseOrder(orderId, amountMinor);
}

export async function orderRefundJob(data: unknown): Promise<void> {
  const { orderId, amountMinor, refundNo } = OrderRefundJob.parse(data);
  await refundOrder(orderId, amountMinor, refundNo);
}
