import { z } from "zod";

// The provider-side jobs: 'payment-event' (a recorded webhook event), 'order-release' (the seller's
// payout, then the order released) and 'order-refund' (a refund, then the order refunded). Each makes
// its provider call with the order's idempotency key before its database write, so a retry after a
// crash in between gets the same provider object and completes the write.

export const PaymentEventJob = z.object({ eventId: z.string().min(1) });
export const OrderReleaseJob = z.object({ orderId: z.uuid() });
/** `n` counts the order's refunds from 1 (the idempotency key's last part); the queuer fixes it. */
export const OrderRefundJob = z.object({ orderId: z.uuid(), amountMinor: z.number().int().positive(), n: z.number().int().min(1).default(1) });
export type OrderRefundJob = z.input<typeof OrderRefundJob>;

export async function paymentEventJob(data: unknown): Promise<void> {
  const { eventId } = PaymentEventJob.parse(data);
  const { processPaymentEvent } = await import("./process-event.server");
  await processPaymentEvent(eventId);
}

export async function orderReleaseJob(data: unknown): Promise<void> {
  const { orderId } = OrderReleaseJob.parse(data);
  const { releaseOrder } = await import("./release.server");
  await releaseOrder(orderId);
}

export async function orderRefundJob(data: unknown): Promise<void> {
  const job = OrderRefundJob.parse(data);
  const { refundOrder } = await import("./release.server");
  await refundOrder(job.orderId, job.amountMinor, job.n);
}
