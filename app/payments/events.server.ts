import type Stripe from "stripe";
import { sequelize } from "~/db.server";
import { PaymentEvent } from "~/models/payment-event.server";
import { enqueue, QUEUES } from "~/services/jobs.server";

// A verified webhook event is stored once by its id and its processing queued in the same
// transaction: a redelivery finds the row and queues nothing, and a crash loses neither.

export async function recordPaymentEvent(event: Stripe.Event): Promise<{ duplicate: boolean }> {
  return sequelize.transaction(async (transaction) => {
    const { duplicate } = await PaymentEvent.record(event, transaction);
    if (!duplicate) {
      await enqueue(QUEUES.paymentEvent, { eventId: event.id }, { transaction, singletonKey: `payment-event:${event.id}` });
    }
    return { duplicate };
  });
}
