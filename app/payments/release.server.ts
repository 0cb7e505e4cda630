// 'order-release' and 'order-refund': provider call with the order's idempotency key, then the DB
// write. Bodies follow once ORDERS' transitions land.
export async function releaseOrder(orderId: string): Promise<void> {
  void orderId;
}

export async function refundOrder(orderId: string, amountMinor: number, n: number): Promise<void> {
  void orderId;
  void amountMinor;
  void n;
}
