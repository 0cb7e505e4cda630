// Processes one recorded payment event (the 'payment-event' job). Bodies follow once ORDERS'
// transitions land.
export async function processPaymentEvent(eventId: string): Promise<void> {
  void eventId;
}
