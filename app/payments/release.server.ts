import { Order } from "~/models/index.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import { markRefunded, markReleased } from "~/orders/transitions.server";
import { existingRefund, existingTransfer, refundBuyer, transferToSeller } from "~/orders/provider.server";
import { faultPoint } from "./faults.server";

// 'order-release' and 'order-refund': the provider call first, with the order's idempotency key,
// then the database write through ORDERS' transition. A crash (or an injected fault) between the two
// leaves the provider's object made and the ledger unwritten; the retried job finds the same object
// (the key, or for a retry after the provider forgot the key, a look-up by order) and completes the
// write, which records each provider id once.

export async function releaseOrder(orderId: string, amountMinor: number, clock: Clock = systemClock): Promise<void> {
  const order = await Order.findByPk(orderId);
  if (!order) return; // the order is gone: nothing to pay
  if (order.transferId) return; // paid out already (a duplicate job)
  const transfer = (await existingTransfer(order)) ?? (await transferToSeller(order, amountMinor));
  faultPoint("release:after-transfer");
  await markReleased(order.id, { transferId: transfer.transferId }, clock);
}

export async function refundOrder(orderId: string, amountMinor: number, refundNo: number, clock: Clock = systemClock): Promise<void> {
  const order = await Order.findByPk(orderId);
  if (!order) return;
  const refund = (await existingRefund(order, refundNo)) ?? (await refundBuyer(order, amountMinor, refundNo));
  faultPoint("refund:after-refund");
  await markRefunded(order.id, { refundId: refund.refundId, amountMinor: refund.amountMinor }, clock);
}
