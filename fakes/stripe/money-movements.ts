import { StripeFakeError, invalid } from "./errors";
import type { Params } from "./form";
import { P } from "./params";
import { publicView, type StripeObject } from "./store";
import { route, type Ctx, type Route } from "./context";
import { listOf } from "./payment-intents";
import { addBalanceTransaction, availableOnFrom, balanceOf } from "./balance";

// Refunds, transfers to connected accounts (separate charges and transfers, linked by
// transfer_group, or tied to their charge by source_transaction), the automatic transfer and
// application fee of a destination charge, and the balance transactions each of them makes.

/** A captured charge's funds enter the platform balance, pending until available_on; a destination
 *  charge then sends its share to the connected account at once and keeps the application fee. */
export function settleCharge(ctx: Ctx, charge: StripeObject, pi: StripeObject): void {
  if (charge.balance_transaction) return;
  const availableOn = availableOnFrom(ctx.store.now());
  charge.balance_transaction = addBalanceTransaction(ctx, {
    owner: null,
    amount: charge.amount_captured,
    currency: charge.currency,
    type: "charge",
    source: charge.id,
    description: charge.description,
    availableOn,
  }).id;
  const destination = pi.transfer_data?.destination as string | undefined;
  if (!destination) return;
  const fee = Math.min(pi.application_fee_amount ?? 0, charge.amount_captured);
  const share = pi.transfer_data.amount ?? charge.amount_captured - fee;
  const transfer = transferFromCharge(ctx, {
    amount: share,
    currency: charge.currency,
    destination,
    source: charge,
    group: pi.transfer_group,
  });
  charge.transfer = transfer.id;
  charge.destination = destination;
  if (fee > 0) {
    const appFee = ctx.store.insert({
      id: ctx.store.newId("fee"),
      object: "application_fee",
      account: destination,
      amount: fee,
      amount_refunded: 0,
      balance_transaction: null as string | null,
      charge: charge.id,
      created: ctx.store.now(),
      currency: charge.currency,
      livemode: false,
      originating_transaction: charge.id,
      refunded: false,
    });
    charge.application_fee = appFee.id;
    charge.application_fee_amount = fee;
    ctx.emit("application_fee.created", appFee);
  }
  ctx.store.changed();
}

function transferFromCharge(
  ctx: Ctx,
  t: {
    amount: number;
    currency: string;
    destination: string;
    source: StripeObject | null;
    group: string | null;
    description?: string | null;
    metadata?: Record<string, string>;
  },
): StripeObject {
  const sourceTxn = t.source ? ctx.store.get(t.source.balance_transaction) : undefined;
  const transfer = ctx.store.insert({
    id: ctx.store.newId("tr"),
    object: "transfer",
    amount: t.amount,
    amount_reversed: 0,
    balance_transaction: null as string | null,
    created: ctx.store.now(),
    currency: t.currency,
    description: t.description ?? null,
    destination: t.destination,
    destination_payment: ctx.store.newId("py"),
    livemode: false,
    metadata: t.metadata ?? {},
    reversals: { object: "list", data: [], has_more: false, url: "" },
    reversed: false,
    source_transaction: t.source?.id ?? null,
    transfer_group: t.group,
  });
  transfer.reversals.url = `/v1/transfers/${transfer.id}/reversals`;
  transfer.balance_transaction = addBalanceTransaction(ctx, {
    owner: null,
    amount: -t.amount,
    currency: t.currency,
    type: "transfer",
    source: transfer.id,
  }).id;
  // On the connected account the money is pending for as long as the charge it came from is.
  addBalanceTransaction(ctx, {
    owner: t.destination,
    amount: t.amount,
    currency: t.currency,
    type: "payment",
    source: transfer.destination_payment,
    availableOn: sourceTxn?.available_on,
  });
  ctx.emit("transfer.created", transfer);
  return transfer;
}

function createRefund(ctx: Ctx, params: Params): StripeObject {
  const p = new P(params, ["payment_intent", "charge", "amount", "reason", "metadata", "instructions_email"]);
  const piId = p.str("payment_intent");
  const chargeId = p.str("charge");
  if (!piId && !chargeId) throw invalid("One of charge or payment_intent is required.", "payment_intent", "parameter_missing");
  let charge: StripeObject;
  if (piId) {
    const pi = ctx.store.find(piId, "payment_intent", "payment_intent", "payment_intent");
    if (pi.status !== "succeeded") {
      throw invalid(
        `This PaymentIntent (${pi.id}) does not have a successful charge to refund${pi.status === "requires_capture" ? "; cancel it to release the hold" : ""}.`,
        "payment_intent",
        "charge_not_refundable",
      );
    }
    charge = ctx.store.find(pi.latest_charge, "charge", "charge");
  } else {
    charge = ctx.store.find(chargeId!, "charge", "charge", "charge");
  }
  if (!charge.captured) throw invalid(`Charge ${charge.id} has not been captured.`, "charge", "charge_not_refundable");
  const remaining = charge.amount_captured - charge.amount_refunded;
  if (remaining <= 0) {
    throw new StripeFakeError(400, "invalid_request_error", `Charge ${charge.id} has already been refunded.`, {
      code: "charge_already_refunded",
    });
  }
  const amount = p.int("amount", { min: 1 }) ?? remaining;
  if (amount > remaining) {
    throw invalid(`Refund amount (${amount}) is greater than unrefunded amount on charge (${remaining})`, "amount", "amount_too_large");
  }
  const refund = ctx.store.insert({
    id: ctx.store.newId("re"),
    object: "refund",
    amount,
    balance_transaction: null as string | null,
    charge: charge.id,
    created: ctx.store.now(),
    currency: charge.currency,
    metadata: p.metadata(),
    payment_intent: charge.payment_intent,
    reason: p.oneOf("reason", ["duplicate", "fraudulent", "requested_by_customer"] as const) ?? null,
    status: "succeeded",
  });
  refund.balance_transaction = addBalanceTransaction(ctx, {
    owner: null,
    amount: -amount,
    currency: charge.currency,
    type: "refund",
    source: refund.id,
  }).id;
  const before = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
  charge.amount_refunded += amount;
  charge.refunded = charge.amount_refunded >= charge.amount_captured;
  ctx.store.changed();
  ctx.emit("refund.created", refund);
  ctx.emit("charge.refunded", charge, before);
  return refund;
}

function createTransfer(ctx: Ctx, params: Params): StripeObject {
  const p = new P(params, ["amount", "currency", "destination", "transfer_group", "source_transaction", "description", "metadata"]);
  const amount = p.int("amount", { required: true, min: 1 })!;
  const currency = p.currency("currency", { required: true })!;
  const destination = ctx.store.find(p.str("destination", { required: true })!, "account", "account", "destination");
  if (destination.capabilities?.transfers !== "active") {
    throw invalid(
      "Your destination account needs to have at least one of the following capabilities enabled: transfers, crypto_transfers, legacy_payments",
      "destination",
      "insufficient_capabilities_for_transfer",
    );
  }
  const sourceId = p.str("source_transaction");
  if (sourceId) {
    const source = ctx.store.find(sourceId, "charge", "charge", "source_transaction");
    if (source.currency !== currency)
      throw invalid("The currency of source_transaction's balance transaction must match the transfer currency", "currency");
    const used = ctx.store
      .all("transfer")
      .filter((t) => t.source_transaction === sourceId)
      .reduce((s, t) => s + t.amount - t.amount_reversed, 0);
    // Allowed while the charge's funds are pending; never beyond what is left of it after refunds.
    const left = source.amount_captured - source.amount_refunded - used;
    if (!source.captured) throw invalid(`Charge ${sourceId} has not been captured.`, "source_transaction");
    if (amount > left) {
      throw invalid(
        `Transfer amount (${amount}) exceeds what remains of source_transaction ${sourceId} (${left}).`,
        "amount",
        "amount_too_large",
      );
    }
  } else if ((balanceOf(ctx, null).available[currency] ?? 0) < amount) {
    throw new StripeFakeError(400, "invalid_request_error", "You have insufficient available funds in your Stripe account.", {
      code: "balance_insufficient",
    });
  }
  return transferFromCharge(ctx, {
    amount,
    currency,
    destination: destination.id,
    source: sourceId ? ctx.store.get(sourceId)! : null,
    group: p.str("transfer_group") ?? null,
    description: p.str("description") ?? null,
    metadata: p.metadata(),
  });
}

function reverseTransfer(ctx: Ctx, params: Params, id: string): StripeObject {
  const transfer = ctx.store.find(id, "transfer", "transfer");
  const p = new P(params, ["amount", "metadata", "description"]);
  const left = transfer.amount - transfer.amount_reversed;
  const amount = p.int("amount", { min: 1 }) ?? left;
  if (left <= 0) throw invalid(`Transfer ${id} has already been fully reversed.`, undefined, "transfer_already_reversed");
  if (amount > left)
    throw invalid(`Reversal amount (${amount}) is greater than what remains of the transfer (${left}).`, "amount", "amount_too_large");
  const reversal = {
    id: ctx.store.newId("trr"),
    object: "transfer_reversal",
    amount,
    created: ctx.store.now(),
    currency: transfer.currency,
    metadata: p.metadata(),
    transfer: transfer.id,
  };
  const before = { amount_reversed: transfer.amount_reversed, reversed: transfer.reversed };
  transfer.amount_reversed += amount;
  transfer.reversed = transfer.amount_reversed >= transfer.amount;
  transfer.reversals.data.unshift(reversal);
  addBalanceTransaction(ctx, { owner: null, amount, currency: transfer.currency, type: "transfer_refund", source: reversal.id });
  addBalanceTransaction(ctx, {
    owner: transfer.destination,
    amount: -amount,
    currency: transfer.currency,
    type: "payment_refund",
    source: reversal.id,
  });
  ctx.store.changed();
  ctx.emit(transfer.reversed ? "transfer.reversed" : "transfer.updated", transfer, before);
  return reversal;
}

export const moneyMovementRoutes: Route[] = [
  route("POST", "/v1/refunds", (ctx, params) => publicView(createRefund(ctx, params))),
  route("GET", "/v1/refunds", (ctx, params) => listOf(ctx, params, "refund", "/v1/refunds", ["payment_intent", "charge"])),
  route("GET", "/v1/refunds/:id", (ctx, _params, [id]) => publicView(ctx.store.find(id, "refund", "refund"))),
  route("POST", "/v1/transfers", (ctx, params) => publicView(createTransfer(ctx, params))),
  route("GET", "/v1/transfers", (ctx, params) => listOf(ctx, params, "transfer", "/v1/transfers", ["destination", "transfer_group"])),
  route("GET", "/v1/transfers/:id", (ctx, _params, [id]) => publicView(ctx.store.find(id, "transfer", "transfer"))),
  route("POST", "/v1/transfers/:id/reversals", (ctx, params, [id]) => reverseTransfer(ctx, params, id)),
];
