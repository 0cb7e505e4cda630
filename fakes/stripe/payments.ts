import { chargeCardNumber, testPaymentMethodNumber, type Card, type Outcome } from "./cards";
import { StripeFakeError, invalid, noSuch } from "./errors";
import { publicView, randomToken, type StripeObject } from "./store";
import { snapshot, type Ctx } from "./context";
import { settleCharge } from "./money-movements";

// The money core shared by the PaymentIntents API and the hosted payment page: payment methods,
// charges, authorisation, capture, cancellation and the 7-day expiry of uncaptured holds.

const HOLD_SECONDS = 7 * 24 * 3600; // card-not-present, customer-initiated (the provider's docs: "Place a hold on a payment method")
const CANCELABLE = ["requires_payment_method", "requires_capture", "requires_confirmation", "requires_action", "processing"];

// Smallest chargeable amounts in minor units (docs.stripe.com/currencies, from memory).
const MINIMUM: Record<string, number> = { usd: 50, eur: 50, gbp: 30, chf: 50, cad: 50, aud: 50, sek: 300, dkk: 250, nok: 300, pln: 200 };

export function checkAmount(amount: number, currency: string, param = "amount"): void {
  const min = MINIMUM[currency] ?? 50;
  if (amount < min) {
    throw new StripeFakeError(400, "invalid_request_error", `Amount must be at least ${min} ${currency} minor units`, {
      code: "amount_too_small",
      param,
    });
  }
  if (amount > 99_999_999) {
    throw new StripeFakeError(400, "invalid_request_error", "Amount must be no more than 99,999,999 minor units", {
      code: "amount_too_large",
      param,
    });
  }
}

export interface NewPaymentIntent {
  amount: number;
  currency: string;
  capture_method: "automatic" | "automatic_async" | "manual";
  metadata: Record<string, string>;
  description: string | null;
  transfer_group: string | null;
  receipt_email: string | null;
  transfer_data: { destination: string; amount?: number } | null;
  application_fee_amount: number | null;
}

export function createPaymentIntent(ctx: Ctx, fields: NewPaymentIntent, payment_method: string | null = null): StripeObject {
  checkAmount(fields.amount, fields.currency);
  const id = ctx.store.newId("pi");
  const pi = ctx.store.insert({
    id,
    object: "payment_intent",
    ...fields,
    amount_capturable: 0,
    amount_received: 0,
    canceled_at: null,
    cancellation_reason: null,
    client_secret: `${id}_secret_${randomToken(25)}`,
    confirmation_method: "automatic",
    created: ctx.store.now(),
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    next_action: null,
    payment_method,
    payment_method_types: ["card"],
    status: payment_method ? "requires_confirmation" : "requires_payment_method",
  });
  ctx.emit("payment_intent.created", pi);
  return pi;
}

export function createPaymentMethod(
  ctx: Ctx,
  card: Card,
  exp: { month: number; year: number },
  billing: { email?: string | null; name?: string | null } = {},
): StripeObject {
  return ctx.store.insert({
    id: ctx.store.newId("pm"),
    object: "payment_method",
    type: "card",
    billing_details: { email: billing.email ?? null, name: billing.name ?? null },
    card: { brand: card.brand, last4: card.last4, funding: card.funding, exp_month: exp.month, exp_year: exp.year, country: "US" },
    created: ctx.store.now(),
    livemode: false,
    _outcome: null as Outcome | null,
  });
}

/** A PaymentMethod id given to the API: a stored one, or one of Stripe's test ids such as pm_card_visa. */
export function resolvePaymentMethod(ctx: Ctx, id: string, param = "payment_method"): StripeObject {
  const stored = ctx.store.get(id);
  if (stored?.object === "payment_method") return stored;
  const number = testPaymentMethodNumber(id);
  if (!number) throw noSuch("PaymentMethod", id, param);
  const check = chargeCardNumber(number);
  if ("error" in check) throw invalid(check.error, param);
  const pm = createPaymentMethod(ctx, check.card, { month: 12, year: new Date().getUTCFullYear() + 3 });
  pm._outcome = check.outcome;
  return pm;
}

/**
 * Charges the payment method for the intent. On a decline the intent goes back to
 * requires_payment_method and the Stripe card error is returned (the API answers it with 402).
 */
export function attemptPayment(ctx: Ctx, pi: StripeObject, pm: StripeObject, outcome: Outcome): StripeFakeError | null {
  if (!["requires_payment_method", "requires_confirmation"].includes(pi.status)) {
    throw invalid(`This PaymentIntent's status is ${pi.status}; it cannot be confirmed.`, undefined, "payment_intent_unexpected_state");
  }
  const now = ctx.store.now();
  const manual = pi.capture_method === "manual";
  const charge = ctx.store.insert({
    id: ctx.store.newId("ch"),
    object: "charge",
    amount: pi.amount,
    amount_captured: 0,
    amount_refunded: 0,
    balance_transaction: null,
    billing_details: pm.billing_details,
    captured: false,
    created: now,
    currency: pi.currency,
    description: pi.description,
    failure_code: outcome.ok ? null : outcome.code,
    failure_message: outcome.ok ? null : outcome.message,
    livemode: false,
    metadata: { ...pi.metadata },
    outcome: outcome.ok
      ? { network_status: "approved_by_network", type: "authorized", seller_message: "Payment complete.", risk_level: "normal" }
      : {
          network_status: "declined_by_network",
          type: "issuer_declined",
          reason: outcome.decline_code ?? outcome.code,
          seller_message: "The bank did not return any further details with this decline.",
        },
    paid: outcome.ok,
    payment_intent: pi.id,
    payment_method: pm.id,
    payment_method_details: {
      type: "card",
      card: { ...pm.card, ...(manual && outcome.ok ? { capture_before: now + HOLD_SECONDS } : {}) },
    },
    receipt_email: pi.receipt_email,
    refunded: false,
    status: outcome.ok ? "succeeded" : "failed",
    transfer_group: pi.transfer_group,
  });
  const before = snapshot(pi, ["status", "amount_capturable", "amount_received", "latest_charge", "last_payment_error", "payment_method"]);
  pi.payment_method = pm.id;
  pi.latest_charge = charge.id;
  if (!outcome.ok) {
    pi.status = "requires_payment_method";
    pi.last_payment_error = {
      type: "card_error",
      code: outcome.code,
      decline_code: outcome.decline_code,
      message: outcome.message,
      charge: charge.id,
      payment_method: publicView(pm),
    };
    ctx.store.changed();
    ctx.emit("charge.failed", charge);
    ctx.emit("payment_intent.payment_failed", pi, before);
    return new StripeFakeError(402, "card_error", outcome.message, {
      code: outcome.code,
      decline_code: outcome.decline_code,
      ...(outcome.param ? { param: outcome.param } : {}),
      charge: charge.id,
      payment_intent: publicView(pi),
      payment_method: publicView(pm),
    });
  }
  pi.last_payment_error = null;
  if (manual) {
    pi.status = "requires_capture";
    pi.amount_capturable = pi.amount;
  } else {
    pi.status = "succeeded";
    pi.amount_received = pi.amount;
    charge.captured = true;
    charge.amount_captured = pi.amount;
    settleCharge(ctx, charge, pi);
  }
  ctx.store.changed();
  ctx.emit("charge.succeeded", charge);
  ctx.emit(manual ? "payment_intent.amount_capturable_updated" : "payment_intent.succeeded", pi, before);
  return null;
}

export function capturePaymentIntent(ctx: Ctx, pi: StripeObject, amountToCapture?: number): StripeObject {
  expireHold(ctx, pi);
  if (pi.status !== "requires_capture") {
    throw invalid(
      `This PaymentIntent could not be captured because it has a status of ${pi.status}. Only a PaymentIntent with one of the following statuses may be captured: requires_capture.`,
      undefined,
      "payment_intent_unexpected_state",
    );
  }
  const amount = amountToCapture ?? pi.amount_capturable;
  if (amount > pi.amount_capturable) {
    throw invalid(
      `The amount to capture (${amount}) exceeds the capturable amount (${pi.amount_capturable}).`,
      "amount_to_capture",
      "amount_too_large",
    );
  }
  const charge = ctx.store.find(pi.latest_charge, "charge", "charge");
  const before = snapshot(pi, ["status", "amount_capturable", "amount_received"]);
  pi.status = "succeeded";
  pi.amount_received = amount;
  pi.amount_capturable = 0;
  charge.captured = true;
  charge.amount_captured = amount;
  settleCharge(ctx, charge, pi);
  ctx.store.changed();
  ctx.emit("charge.captured", charge);
  ctx.emit("payment_intent.succeeded", pi, before);
  return pi;
}

export function cancelPaymentIntent(ctx: Ctx, pi: StripeObject, reason: string | null): StripeObject {
  if (!CANCELABLE.includes(pi.status)) {
    throw invalid(
      `You cannot cancel this PaymentIntent because it has a status of ${pi.status}. Only a PaymentIntent with one of the following statuses may be canceled: ${CANCELABLE.join(", ")}.`,
      undefined,
      "payment_intent_unexpected_state",
    );
  }
  releaseAndCancel(ctx, pi, reason);
  return pi;
}

function releaseAndCancel(ctx: Ctx, pi: StripeObject, reason: string | null): void {
  const before = snapshot(pi, ["status", "amount_capturable", "canceled_at", "cancellation_reason"]);
  if (pi.status === "requires_capture") {
    // Releasing a hold creates no Refund object; the charge shows the released amount as refunded.
    const charge = ctx.store.get(pi.latest_charge);
    if (charge) {
      charge.amount_refunded = charge.amount;
      charge.refunded = true;
    }
  }
  pi.status = "canceled";
  pi.amount_capturable = 0;
  pi.canceled_at = ctx.store.now();
  pi.cancellation_reason = reason;
  ctx.store.changed();
  ctx.emit("payment_intent.canceled", pi, before);
}

/** An uncaptured hold lapses after its capture_before time, as a card network's would. */
export function expireHold(ctx: Ctx, pi: StripeObject): void {
  if (pi.status !== "requires_capture") return;
  const charge = ctx.store.get(pi.latest_charge);
  const deadline = charge?.payment_method_details?.card?.capture_before;
  if (deadline && ctx.store.now() > deadline) releaseAndCancel(ctx, pi, "automatic");
}
