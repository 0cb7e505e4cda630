import type Stripe from "stripe";
import { Order } from "~/models/index.server";
import { PaymentEvent } from "~/models/payment-event.server";
import { HttpError } from "~/http/errors.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import { lapseReservation, markFunded, markRefunded, markReleased } from "~/orders/transitions.server";
import { payments } from "~/services/payments.server";
import { syncPayoutAccount } from "./payouts.server";
import { faultPoint } from "./faults.server";

// The 'payment-event' job: one recorded webhook event, acted on once. The event only says where to
// look: the object is read afresh from the provider, so a stale or out-of-order delivery acts on the
// present state, and every transition it calls records each provider id once. A redirect from the
// hosted page never reaches here; only a signed event can fund an order.

type Log = (line: string) => void;

export async function processPaymentEvent(eventId: string, clock: Clock = systemClock, log: Log = console.warn): Promise<void> {
  const row = await PaymentEvent.findByPk(eventId);
  if (!row || row.processedAt) return;
  const event = row.payload;
  try {
    await act(event, clock);
  } catch (error) {
    // The order's state refuses it (a late or duplicate effect): nothing to do, and retrying changes nothing.
    unlessRefused(error);
    log(`[payments] ${event.type} ${event.id} left as it is: ${(error as Error).message}`);
  }
  await PaymentEvent.update({ processedAt: clock.now() }, { where: { eventId, processedAt: null } });
}

async function act(event: Stripe.Event, clock: Clock): Promise<void> {
  switch (event.type) {
    case "checkout.session.completed":
    case "checkout.session.async_payment_succeeded":
      return sessionPaid(event.data.object.id, event.id, clock);
    case "checkout.session.expired":
    case "checkout.session.async_payment_failed":
      return sessionEnded(event.data.object, clock);
    case "refund.created":
    case "refund.updated":
      return refundSeen(event.data.object, clock);
    case "charge.refunded":
      return chargeRefunded(event.data.object, clock);
    case "transfer.created":
      return transferSeen(event.data.object, clock);
    case "account.updated":
      await syncPayoutAccount(event.data.object.id);
      return;
    default:
      // payment_intent.payment_failed and the like: the buyer may try another card on the same page;
      // the reservation lapses at its own time or when the session expires.
      return;
  }
}

const orderIdOf = (object: { metadata?: Stripe.Metadata | null; client_reference_id?: string | null }) =>
  object.metadata?.order_id ?? object.client_reference_id ?? null;

async function sessionPaid(sessionId: string, eventId: string, clock: Clock): Promise<void> {
  const session = await payments().checkout.sessions.retrieve(sessionId, { expand: ["payment_intent"] });
  faultPoint("event:after-provider");
  if (session.payment_status !== "paid") return; // an asynchronous method still on its way
  const orderId = orderIdOf(session);
  const pi = session.payment_intent as Stripe.PaymentIntent | null;
  if (!orderId || !pi || !(await Order.findByPk(orderId))) return;
  const chargeId = typeof pi.latest_charge === "string" ? pi.latest_charge : (pi.latest_charge?.id ?? null);
  if (!chargeId) return;
  // markFunded funds a reserved order, and records then refunds in whole one that lapsed meanwhile.
  await markFunded(
    orderId,
    {
      paymentIntentId: pi.id,
      chargeId,
      amountMinor: session.amount_total ?? pi.amount,
      currency: session.currency ?? pi.currency,
      eventId,
    },
    clock,
  );
}

async function sessionEnded(stale: Stripe.Checkout.Session, clock: Clock): Promise<void> {
  const session = await payments().checkout.sessions.retrieve(stale.id);
  if (session.status === "complete" && session.payment_status === "paid") return; // paid after all
  const orderId = orderIdOf(session);
  const order = orderId ? await Order.findByPk(orderId) : null;
  if (!order || order.state !== "reserved" || order.checkoutSessionId !== session.id) return;
  // The session ends no earlier than the reservation (checkoutExpiresAt); before that, the deadline job lapses it.
  if (clock.now() < order.reservedUntil) return;
  await lapseReservation(order.id, clock);
}

async function refundSeen(stale: Stripe.Refund, clock: Clock): Promise<void> {
  const refund = await payments().refunds.retrieve(stale.id);
  const orderId = refund.metadata?.order_id;
  if (!orderId || refund.status !== "succeeded" || !(await Order.findByPk(orderId))) return;
  await markRefunded(orderId, { refundId: refund.id, amountMinor: refund.amount }, clock);
}

async function chargeRefunded(stale: Stripe.Charge, clock: Clock): Promise<void> {
  const refunds = await payments().refunds.list({ charge: stale.id, limit: 100 });
  for (const refund of refunds.data.reverse()) await refundSeen(refund, clock).catch(unlessRefused);
}

function unlessRefused(error: unknown): void {
  if (!(error instanceof HttpError) || error.code !== "order_state") throw error;
}

async function transferSeen(stale: Stripe.Transfer, clock: Clock): Promise<void> {
  const orderId = stale.metadata?.order_id;
  const order = orderId ? await Order.findByPk(orderId) : null;
  if (!order || order.transferId === stale.id) return;
  await markReleased(order.id, { transferId: stale.id }, clock);
}
